// Drawing templates and their import. Unit conversions follow CSS Values and Units Level 3
// (REFERENCES.md "Exchange formats": 1 in = 96 px, 1 mm = 3.7795276 px; older editors used 90 px
// per inch, 1 mm = 3.5433071 px). SVG coordinate rules (viewBox, preserveAspectRatio, transform
// lists) follow the SVG 2 specification, "Coordinate Systems, Transformations and Units".
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { drawingTemplate, importDrawing, parseTransform, templateContent } from '../../shared/engine/canvas.js';
import { parseDesign, parseDesignText } from '../../shared/engine/design.js';
import type { Polygon2, ResolvedDesign, Ring } from '../../shared/engine/model.js';
import { polygonArea } from '../../shared/engine/polygons.js';
import { expectClose } from './support.js';

const PX_PER_MM = 96 / 25.4; // CSS Values and Units Level 3
const PX90_PER_MM = 90 / 25.4;

function fixture(name: string): ResolvedDesign {
  const r = parseDesignText(readFileSync(new URL(`../fixtures/designs/${name}.json`, import.meta.url), 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}

/** Each vertex of `a` has a vertex of `b` within tol and vice versa (rings may start anywhere). */
function expectSameRings(a: readonly Ring[], b: readonly Ring[], tol: number): void {
  expect(a.length).toBe(b.length);
  const near = (p: readonly number[], ring: Ring) => Math.min(...ring.map((q) => Math.hypot(p[0] - q[0], p[1] - q[1])));
  for (const ra of a) {
    const rb = b.reduce((best, r) => (near(ra[0], r) < near(ra[0], best) ? r : best), b[0]);
    expect(ra.length).toBe(rb.length);
    for (const p of ra) expect(near(p, rb), `vertex (${p[0]}, ${p[1]})`).toBeLessThanOrEqual(tol);
    for (const p of rb) expect(near(p, ra)).toBeLessThanOrEqual(tol);
  }
}
const ringsOf = (p: Polygon2): Ring[] => [p.outer, ...p.holes];

describe('templateContent', () => {
  // O cube plates: the envelope is the cube |x|, |y|, |z| ≤ 50; on the face z = 50 its outline is
  // the square ±50, and the four side faces meet it at right angles along x = ±50, y = ±50; the
  // opposite face is parallel and leaves no trace. Page: ±(50 + max(20, 100/4)) = ±75 → ±80.
  it('the cube face: square outline, four joint lines, page ±80 mm', () => {
    const c = templateContent(fixture('o-cube-plates'), 'faces');
    expect(c.page).toEqual({ left: -80, top: 80, width: 160, height: 160 });
    expect(c.envelope!.length).toBe(4);
    for (const p of c.envelope!) expect([Math.abs(p[0]), Math.abs(p[1])].map((v) => Math.round(v * 1e6) / 1e6)).toEqual([50, 50]);
    expect(c.traces.length).toBe(4);
    for (const t of c.traces) {
      expect(t.perpendicular).toBe(true);
      expectClose(t.angleDeg, 90, 1e-9);
      // Each runs across the page along x = ±50 or y = ±50.
      const along = Math.abs(t.from[0] - t.to[0]) < 1e-9 ? 0 : 1;
      expectClose(Math.abs(t.from[along]), 50, 1e-9);
      expectClose(Math.hypot(t.to[0] - t.from[0], t.to[1] - t.from[1]), 160, 1e-9);
    }
  });

  // D4 fins on x = 30 (frame x = world y, frame y = world z): the deck z = 0 leaves the joint line
  // y = 0; the fins y = ±30 leave x = ±30; the fin x = −30 is parallel. The deck passes through
  // the centre, so there is no envelope, and the page is the motif ±60 × ±20 plus 30 mm.
  it('the D4 fin: three joint lines, no envelope (a family through the centre), page from the motif', () => {
    const c = templateContent(fixture('d4-fins-deck'), 'fins');
    expect(c.envelope).toBeNull();
    expect(c.envelopeNote).toMatch(/deck/);
    expect(c.page).toEqual({ left: -90, top: 50, width: 180, height: 100 });
    const lines = c.traces.map((t) => (Math.abs(t.from[0] - t.to[0]) < 1e-9 ? `x=${Math.round(t.from[0])}` : `y=${Math.round(t.from[1])}`)).sort();
    expect(lines).toEqual(['x=-30', 'x=30', 'y=0']);
    expect(c.traces.every((t) => t.perpendicular)).toBe(true);
  });

  it('throws a CanvasError naming the families for an unknown family', () => {
    expect(() => templateContent(fixture('o-cube-plates'), 'nope')).toThrow(/unknown family "nope".*"faces"/);
  });
});

describe('drawingTemplate', () => {
  const svg = drawingTemplate(fixture('o-cube-plates'), 'faces');
  it('is sized in millimetres with a matching viewBox', () => {
    expect(svg).toMatch(/width="160mm" height="160mm" viewBox="-80 -80 160 160"/);
  });
  it('has a motif layer and four joint lines', () => {
    expect(svg).toMatch(/<g id="motif" data-planewright-layer="motif"/);
    expect(svg.match(/class="joint-line"/g)?.length).toBe(4);
  });
  it('imports back to the existing motif exactly', () => {
    const r = importDrawing(svg);
    expect(r.ok).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), ringsOf(fixture('o-cube-plates').motifs[0].polygon), 1e-6);
  });
  it('is the same text for the same design', () => {
    expect(drawingTemplate(fixture('o-cube-plates'), 'faces')).toBe(svg);
  });
});

describe('importDrawing', () => {
  const page = { left: -80, top: 80, width: 160, height: 160 };
  // A motif in the frame (mm, y up): an irregular pentagon with a triangular hole.
  const motif: Ring[] = [
    [[-30, -20], [35, -25], [40, 15], [5, 42], [-28, 20]],
    [[0, 0], [8, 12], [12, -3]],
  ];

  /** The motif as a vector editor in pixel units would write it (see each call for the variant). */
  function editorFile(pxPerMm: number, widthAttr: (mm: number) => string, tx: number, ty: number, rotateDeg: number): string {
    const c = Math.cos((rotateDeg * Math.PI) / 180);
    const s = Math.sin((rotateDeg * Math.PI) / 180);
    const toLocal = ([x, y]: readonly number[]) => {
      // frame → page mm → px → undo the layer's translate, then the inner group's rotate.
      const X = (x - page.left) * pxPerMm - tx;
      const Y = (page.top - y) * pxPerMm - ty;
      return [c * X + s * Y, -s * X + c * Y];
    };
    const d = motif
      .map((ring) => {
        const pts = ring.map(toLocal);
        // Relative commands after the first point, as editors often write.
        return `M ${pts[0][0]},${pts[0][1]} ` + pts.slice(1).map((p, i) => `l ${p[0] - pts[i][0]},${p[1] - pts[i][1]}`).join(' ') + ' z';
      })
      .join(' ');
    const wpx = page.width * pxPerMm;
    const hpx = page.height * pxPerMm;
    return `<?xml version="1.0" encoding="UTF-8" standalone="no"?>
<!-- re-saved by a vector editor -->
<svg xmlns="http://www.w3.org/2000/svg" width="${widthAttr(page.width)}" height="${widthAttr(page.height)}" viewBox="0 0 ${wpx} ${hpx}" data-planewright-page="-80 80 160 160">
  <defs><path id="unused" d="M 0 0 L 1 1"/></defs>
  <g id="grid"><path d="M 0 0 H 10"/></g>
  <g id="motif" data-planewright-layer="motif" transform="translate(${tx},${ty})">
    <title>motif</title>
    <g transform="rotate(${rotateDeg})"><path d="${d}" style="fill:none;stroke:#000"/></g>
  </g>
</svg>`;
  }

  it('round trip: a motif drawn in px with a viewBox, a translated layer and a rotated group comes back within 0.01 mm', () => {
    const r = importDrawing(editorFile(PX_PER_MM, (mm) => `${mm}mm`, 12.5, -40, 30));
    expect(r.ok, JSON.stringify(!r.ok && r.errors)).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), motif, 0.01);
  });

  it('round trip with width and height in unitless px at 96 per inch (CSS Values and Units Level 3)', () => {
    const r = importDrawing(editorFile(PX_PER_MM, (mm) => `${mm * PX_PER_MM}`, 0, 0, 0));
    expect(r.ok).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), motif, 0.01);
  });

  it('catches a file saved at 90 px per inch and read as 96 (CSS Values and Units Level 3: 1 in = 96 px)', () => {
    // The old convention: user units and unitless width at 90 px/in. Read at 96 the page would be
    // 160 × 90/96 = 150 mm wide and the motif 6.25 % too small; the recorded page size catches it.
    const r = importDrawing(editorFile(PX90_PER_MM, (mm) => `${mm * PX90_PER_MM}`, 0, 0, 0));
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors[0]).toMatch(/150\.00 × 150\.00 mm/);
      expect(r.errors[0]).toMatch(/90 pixels per inch/);
    }
  });

  it('reads a 90 px-per-inch file correctly when its width says millimetres', () => {
    // width="160mm" with a 90-dpi viewBox: the viewBox scale makes 1 user unit = 25.4/90 mm.
    const r = importDrawing(editorFile(PX90_PER_MM, (mm) => `${mm}mm`, 3, 4, 0));
    expect(r.ok).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), motif, 0.01);
  });

  it('uses the page given in the options when the file lost its record', () => {
    const text = editorFile(PX_PER_MM, (mm) => `${mm}mm`, 0, 0, 0).replace(/ data-planewright-page="[^"]*"/, '');
    const r = importDrawing(text, { page });
    expect(r.ok).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), motif, 0.01);
  });

  it('without a page record reads user units as the frame (y flipped), scaled by width/viewBox', () => {
    // 4 in wide over a 384-unit viewBox: 1 unit = 1 px = 25.4/96 mm. A 96 × 48 unit rect at (0, 0)
    // spans x 0 … 25.4 mm and y 0 … −12.7 mm (SVG y down is frame y up, negated).
    const text = '<svg xmlns="http://www.w3.org/2000/svg" width="4in" height="4in" viewBox="0 0 384 384"><g id="motif"><rect x="0" y="0" width="96" height="48"/></g></svg>';
    const r = importDrawing(text);
    expect(r.ok).toBe(true);
    if (r.ok) {
      expectClose(polygonArea(r.polygon), 25.4 * 12.7, 1e-9);
      const ys = r.polygon.outer.map((p) => p[1]);
      expectClose(Math.min(...ys), -12.7, 1e-9);
    }
  });

  it.each([
    ['cm', '16cm', 1],
    ['in', `${160 / 25.4}in`, 1],
    ['pt', `${(160 / 25.4) * 72}pt`, 1],
    ['pc', `${(160 / 25.4) * 6}pc`, 1],
  ])('honours width in %s', (_, w) => {
    const r = importDrawing(editorFile(PX_PER_MM, () => w, 0, 0, 0).replace(/height="[^"]*"/, `height="${w}"`));
    expect(r.ok, JSON.stringify(!r.ok && r.errors)).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), motif, 0.01);
  });

  it('reads circles, ellipses, rounded rects and polygons', () => {
    const text = (shape: string) => `<svg xmlns="http://www.w3.org/2000/svg" width="100mm" height="100mm" viewBox="0 0 100 100"><g id="motif">${shape}</g></svg>`;
    const area = (shape: string) => {
      const r = importDrawing(text(shape));
      if (!r.ok) throw new Error(r.errors.join('; '));
      return polygonArea(r.polygon);
    };
    const circle = area('<circle cx="50" cy="50" r="20"/>');
    expect(circle).toBeLessThanOrEqual(Math.PI * 400);
    expect(circle).toBeGreaterThan(Math.PI * 400 - 2 * Math.PI * 20 * 0.05);
    expect(area('<ellipse cx="50" cy="50" rx="20" ry="10"/>')).toBeGreaterThan(Math.PI * 200 - 2 * Math.PI * 20 * 0.05);
    // Rounded rect 40 × 20 with r = 5: 800 − (4 − π)·25.
    const rr = area('<rect x="10" y="10" width="40" height="20" rx="5"/>');
    expect(rr).toBeLessThanOrEqual(800 - (4 - Math.PI) * 25);
    expect(rr).toBeGreaterThan(800 - (4 - Math.PI) * 25 - 2 * Math.PI * 5 * 0.05);
    expect(area('<polygon points="0,0 30,0 30,10"/>')).toBeCloseTo(150, 9);
    expect(area('<g transform="matrix(2 0 0 2 0 0)"><polygon points="0,0 30,0 30,10"/></g>')).toBeCloseTo(600, 9);
    expect(area('<polygon points="0,0 30,0 30,10" transform="skewX(45)"/>')).toBeCloseTo(150, 9);
  });

  it.each([
    ['not SVG', 'hello', /not an SVG/],
    ['broken XML', '<svg><g></svg', /not well-formed|motif layer|could not/],
    ['no motif layer', '<svg width="10mm" height="10mm" viewBox="0 0 10 10"><path d="M0 0 L1 0 L1 1 Z"/></svg>', /no motif layer/],
    ['an empty motif layer', '<svg width="10mm" height="10mm" viewBox="0 0 10 10"><g id="motif"></g></svg>', /empty/],
    ['an open path', '<svg width="10mm" height="10mm" viewBox="0 0 10 10"><g id="motif"><path d="M0 0 L5 0 L5 5"/></g></svg>', /open/],
    ['a percentage width', '<svg width="100%" height="100%"><g id="motif"><rect width="1" height="1"/></g></svg>', /percentage/],
    ['a bad transform', '<svg width="10mm" height="10mm" viewBox="0 0 10 10"><g id="motif" transform="spin(3)"><rect width="1" height="1"/></g></svg>', /spin/],
    ['a use element', '<svg width="10mm" height="10mm" viewBox="0 0 10 10"><g id="motif"><use href="#a"/></g></svg>', /use element/],
    ['two outlines apart', '<svg width="10mm" height="10mm" viewBox="0 0 10 10"><g id="motif"><rect width="1" height="1"/><rect x="5" width="1" height="1"/></g></svg>', /separate closed outlines/],
    ['no size at all', '<svg><g id="motif"><rect width="1" height="1"/></g></svg>', /size is unknown/],
  ])('when the drawing has %s', (_, text, msg) => {
    const r = importDrawing(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.join(' ')).toMatch(msg);
  });

  it('skips hidden shapes', () => {
    const r = importDrawing('<svg width="10mm" height="10mm" viewBox="0 0 10 10"><g id="motif"><rect width="2" height="2"/><rect x="5" width="1" height="1" style="display:none"/></g></svg>');
    expect(r.ok && polygonArea(r.polygon)).toBeCloseTo(4, 9);
  });

  it('imports the template of a design whose motif came from an svgPath back to the same polygon', () => {
    const r0 = parseDesign({
      format: 'planewright/design@1', title: 't', symmetry: 'O', material: { name: 'm', thickness: 3 },
      families: [{ id: 'f', axis: 3, offset: 60 }],
      motifs: [{ id: 'm', family: 'f', svgPath: 'M -20 -10 C -20 30 20 30 20 -10 Z' }],
    });
    if (!r0.ok) throw new Error();
    const r = importDrawing(drawingTemplate(r0.design, 'f'));
    expect(r.ok).toBe(true);
    if (r.ok) expectSameRings(ringsOf(r.polygon), ringsOf(r0.design.motifs[0].polygon), 1e-4);
  });
});

describe('parseTransform', () => {
  it('composes a list right to left (SVG 2 transform lists)', () => {
    const m = parseTransform('translate(10, 0) scale(2)');
    // (1, 1) → scale → (2, 2) → translate → (12, 2)
    expect([m[0] * 1 + m[2] * 1 + m[4], m[1] * 1 + m[3] * 1 + m[5]]).toEqual([12, 2]);
  });
  it('rotates about a centre', () => {
    const m = parseTransform('rotate(90 10 10)');
    expectClose(m[0] * 20 + m[2] * 10 + m[4], 10, 1e-12);
    expectClose(m[1] * 20 + m[3] * 10 + m[5], 20, 1e-12);
  });
});
