// Hostile and random input for every reader of participant files: each must return a result or
// issues with messages — never throw, never hang. Runs are bounded (numRuns, sizes) so the file
// stays fast; a per-call time limit catches runaway work on one input.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { parseDesign, parseDesignText } from '../../shared/engine/design.js';
import { importDrawing } from '../../shared/engine/canvas.js';
import { parseDxf } from '../../shared/engine/dxf.js';
import { flattenSvgPath } from '../../shared/engine/svg-path.js';
import { buildPieces } from '../../shared/engine/pieces.js';

const SLOW_MS = 2000;

/** Calls f, asserts it did not throw, finished in time and answered with a well-formed result. */
function expectAnswer(f: () => { ok: boolean; errors?: readonly unknown[] }): void {
  const t = performance.now();
  let r: { ok: boolean; errors?: readonly unknown[] };
  try {
    r = f();
  } catch (e) {
    throw new Error(`threw: ${e instanceof Error ? e.stack : String(e)}`);
  }
  expect(performance.now() - t).toBeLessThan(SLOW_MS);
  expect(typeof r.ok).toBe('boolean');
  if (!r.ok) {
    expect(Array.isArray(r.errors) && r.errors.length > 0).toBe(true);
    for (const e of r.errors!) {
      const message = typeof e === 'string' ? e : (e as { message: unknown }).message;
      expect(typeof message).toBe('string');
      expect((message as string).length).toBeGreaterThan(0);
    }
  }
}

const weirdNumber = fc.oneof(
  fc.double(),
  fc.constantFrom(0, -0, 1e300, -1e300, 1e-300, 5e-324, 1e308, Number.MAX_SAFE_INTEGER, 10000, 10000.0001),
  fc.constantFrom('NaN', 'Infinity', '-Infinity', '1e999', '', '0x10') as fc.Arbitrary<unknown>,
  fc.integer({ min: -20000, max: 20000 }),
);
const point = fc.tuple(weirdNumber, weirdNumber);
const niceCoord = fc.integer({ min: -50, max: 50 });
const nicePoint = fc.tuple(niceCoord, niceCoord);

/** Degenerate rings: repeated points, collinear runs, bow-ties, spikes, touching vertices. */
const degenerateRing = fc.oneof(
  fc.array(nicePoint, { minLength: 0, maxLength: 12 }),
  nicePoint.chain((p) => fc.constant([p, p, p, p])),
  fc.integer({ min: 3, max: 10 }).map((n) => Array.from({ length: n }, (_, i) => [i, 2 * i])),
  fc.constant([[0, 0], [10, 0], [0, 10], [10, 10]]),
  fc.constant([[0, 0], [10, 0], [10, 10], [5, 0], [0, 10]]),
  fc.constant([[0, 0], [10, 0], [20, 0], [10, 0], [10, 10]]),
  fc.constant([[0, 0], [1e-300, 0], [0, 1e-300]]),
  fc.constant([[0, 0], [1e300, 0], [0, 1e300]]),
  fc.array(point, { minLength: 0, maxLength: 8 }),
);

function designWith(motif: Record<string, unknown>, extra: Record<string, unknown> = {}) {
  return {
    format: 'planewright/design@1',
    title: 'fuzz',
    symmetry: 'O',
    material: { name: 'm', thickness: 3 },
    families: [{ id: 'f', axis: 4, offset: 50 }],
    motifs: [{ id: 'm', family: 'f', ...motif }],
    ...extra,
  };
}

describe('parseDesign under random input', () => {
  it('answers for arbitrary JSON values', () => {
    fc.assert(fc.property(fc.jsonValue({ maxDepth: 4 }), (v) => expectAnswer(() => parseDesign(v))), { numRuns: 300 });
  });
  it('answers for arbitrary values in every field of a valid design', () => {
    const keys = ['format', 'title', 'symmetry', 'material', 'families', 'motifs', 'constraints'];
    fc.assert(
      fc.property(fc.constantFrom(...keys), fc.anything({ maxDepth: 3 }), (k, v) => expectAnswer(() => parseDesign({ ...designWith({ outline: [[0, 0], [1, 0], [0, 1]] }), [k]: v }))),
      { numRuns: 300 },
    );
  });
  it('answers for degenerate outlines and holes, and builds pieces whenever it accepts one', () => {
    fc.assert(
      fc.property(degenerateRing, fc.array(degenerateRing, { maxLength: 2 }), (outline, holes) => {
        const r = parseDesign(designWith({ outline, holes }));
        expectAnswer(() => r);
        if (r.ok) {
          const b = buildPieces(r.design);
          expect(b.pieces.length).toBeGreaterThan(0);
        }
      }),
      { numRuns: 400 },
    );
  });
  it('answers for random normals and offsets', () => {
    fc.assert(
      fc.property(fc.tuple(weirdNumber, weirdNumber, weirdNumber), weirdNumber, (normal, offset) =>
        expectAnswer(() => parseDesign({ ...designWith({ outline: [[0, 0], [1, 0], [0, 1]] }), families: [{ id: 'f', normal, offset }] })),
      ),
      { numRuns: 200 },
    );
  });
});

describe('parseDesignText under random input', () => {
  it('answers for arbitrary strings', () => {
    fc.assert(fc.property(fc.string({ maxLength: 200 }), (s) => expectAnswer(() => parseDesignText(s))), { numRuns: 300 });
  });
  it('answers for valid JSON with a character dropped or changed', () => {
    const text = JSON.stringify(designWith({ outline: [[0, 0], [10, 0], [10, 10], [0, 10]] }));
    fc.assert(
      fc.property(fc.nat({ max: text.length - 1 }), fc.string({ maxLength: 2 }), (at, put) => expectAnswer(() => parseDesignText(text.slice(0, at) + put + text.slice(at + 1)))),
      { numRuns: 300 },
    );
  });
});

const pathCommand = fc.oneof(
  fc.constantFrom('M', 'm', 'L', 'l', 'H', 'h', 'V', 'v', 'C', 'c', 'S', 's', 'Q', 'q', 'T', 't', 'A', 'a', 'Z', 'z'),
  fc.constantFrom('0', '1', '-5', '1e300', '1e-300', 'NaN', '.5', '1.2.3', ',', ' ', '9999', '-9999'),
);
const pathString = fc.array(pathCommand, { maxLength: 40 }).map((parts) => parts.join(' '));

describe('flattenSvgPath under random input', () => {
  it('answers for random token soups', () => {
    fc.assert(fc.property(pathString, (d) => expectAnswer(() => flattenSvgPath(d))), { numRuns: 500 });
  });
  it('answers for random well-formed arcs and curves', () => {
    const n = fc.double({ min: -9000, max: 9000, noNaN: true });
    fc.assert(
      fc.property(n, n, n, n, n, n, fc.boolean(), fc.boolean(), (a, b, c, d, e, f, l, s) =>
        expectAnswer(() => flattenSvgPath(`M ${a} ${b} A ${c} ${d} ${e} ${l ? 1 : 0} ${s ? 1 : 0} ${e} ${f} C ${a} ${c} ${d} ${f} ${b} ${e} Q ${c} ${a} ${a} ${b} Z`)),
      ),
      { numRuns: 300 },
    );
  });
});

describe('importDrawing under random input', () => {
  const attr = fc.oneof(fc.constantFrom('10mm', '1in', '100', '100%', '-5', 'abc', '1e400mm', '0', ''), fc.string({ maxLength: 6 }));
  const shape = fc.oneof(
    pathString.map((d) => `<path d="${d}"/>`),
    fc.tuple(attr, attr, attr, attr).map(([x, y, w, h]) => `<rect x="${x}" y="${y}" width="${w}" height="${h}"/>`),
    fc.tuple(attr, attr).map(([c, r]) => `<circle cx="${c}" cy="0" r="${r}"/>`),
    fc.string({ maxLength: 20 }).map((p) => `<polygon points="${p.replace(/"/g, '')}"/>`),
    fc.constantFrom('<use href="#x"/>', '<line x1="0" y1="0" x2="1" y2="1"/>', '<g transform="rotate(45) scale(1e300)"><rect width="1" height="1"/></g>', '<text>hi</text>'),
  );
  it('answers for random documents built from SVG pieces', () => {
    fc.assert(
      fc.property(attr, attr, fc.option(fc.constantFrom('0 0 100 100', '0 0 0 0', 'a b c d', '0 0 100'), { nil: undefined }), fc.array(shape, { maxLength: 4 }), (w, h, vb, shapes) => {
        const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${w}" height="${h}"${vb ? ` viewBox="${vb}"` : ''}><g id="motif">${shapes.join('')}</g></svg>`;
        expectAnswer(() => importDrawing(svg));
      }),
      { numRuns: 300 },
    );
  });
  it('answers for arbitrary text and broken XML', () => {
    fc.assert(
      fc.property(fc.oneof(fc.string({ maxLength: 200 }), fc.string({ maxLength: 100 }).map((s) => `<svg>${s}`), fc.string({ maxLength: 100 }).map((s) => `<svg width="1mm" height="1mm"><g id="motif">${s}</g></svg>`)), (s) =>
        expectAnswer(() => importDrawing(s)),
      ),
      { numRuns: 300 },
    );
  });
});

describe('parseDxf under random input', () => {
  const groupLine = fc.oneof(
    fc.constantFrom('0', 'SECTION', 'ENDSEC', 'ENTITIES', 'HEADER', 'EOF', 'LWPOLYLINE', 'LINE', 'ARC', 'CIRCLE', 'POLYLINE', 'VERTEX', 'SEQEND', '$INSUNITS', '2', '8', '9', '10', '20', '40', '42', '50', '51', '70', '90'),
    fc.double().map(String),
    fc.string({ maxLength: 6 }),
  );
  it('answers for random group-code streams that start like DXF', () => {
    fc.assert(
      fc.property(fc.array(groupLine, { maxLength: 60 }), (lines) => expectAnswer(() => parseDxf(['0', 'SECTION', '2', 'ENTITIES', ...lines].join('\n')))),
      { numRuns: 400 },
    );
  });
  it('answers for arbitrary text', () => {
    fc.assert(fc.property(fc.string({ maxLength: 200 }), (s) => expectAnswer(() => parseDxf(s))), { numRuns: 200 });
  });
});
