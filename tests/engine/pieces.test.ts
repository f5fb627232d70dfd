// Motifs → pieces → templates (FORMAT.md §2). The expected counts and areas are worked out by
// hand for each fixture (tests/fixtures/designs); see the comment above each describe block.
// The placement check is independent of the implementation: it maps the motif into the world
// with each contributing group element's matrix and asks that the image lies on the piece.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseDesign, parseDesignText } from '../../shared/engine/design.js';
import { getGroup } from '../../shared/engine/groups.js';
import { apply } from '../../shared/engine/mat3.js';
import { planeFrame, toFrame, toWorld } from '../../shared/engine/frames.js';
import { planeOrbit } from '../../shared/engine/orbits.js';
import { buildPieces, createPieceBuilder } from '../../shared/engine/pieces.js';
import { det2, locateInPolygon, locateInRing, polygonArea, transformPolygon } from '../../shared/engine/polygons.js';
import type { ResolvedDesign } from '../../shared/engine/model.js';
import { expectClose } from './support.js';

function fixture(name: string): ResolvedDesign {
  const r = parseDesignText(readFileSync(new URL(`../fixtures/designs/${name}.json`, import.meta.url), 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}

function design(doc: Record<string, unknown>): ResolvedDesign {
  const r = parseDesign({ format: 'planewright/design@1', title: 't', material: { name: 'm', thickness: 3 }, ...doc });
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}

/** Every contributing element's image of the motif lies on (inside or on the boundary of) its piece. */
function expectImagesOnPieces(d: ResolvedDesign): void {
  const group = getGroup(d.symmetry);
  const { pieces } = buildPieces(d);
  for (const p of pieces) {
    const motif = d.motifs.find((m) => m.id === p.motif)!;
    const family = d.families.find((f) => f.id === p.family)!;
    const rep = planeFrame(family.normal, family.offset);
    for (const e of p.elements) {
      const g = group.elements[e].matrix;
      for (const q of motif.polygon.outer) {
        const w = apply(g, toWorld(rep, q));
        // On the piece's plane …
        const n = p.frame.normal;
        expectClose(w[0] * n[0] + w[1] * n[1] + w[2] * n[2], p.frame.offset, 1e-6, `${p.id} plane`);
        // … and on the piece.
        expect(locateInPolygon(toFrame(p.frame, w), p.polygon, 1e-6), `${p.id} element ${e}`).not.toBe('outside');
      }
    }
  }
}

describe('buildPieces', () => {
  // D4, deck on z = 0 (offset 0: one plane, all 8 elements, square is D4-symmetric → one piece);
  // fins on x = 30 and its images y = 30, x = −30, y = −30 (4 planes, stabiliser {1, π about the
  // normal}; the 120 × 40 rectangle is symmetric under the half turn → 4 pieces of 2 elements).
  describe('the D4 fin-and-deck fixture', () => {
    const d = fixture('d4-fins-deck');
    const b = buildPieces(d);
    it('has 1 deck piece and 4 fins', () => {
      expect(b.pieces.map((p) => p.id)).toEqual(['deck-01', 'fin-01', 'fin-02', 'fin-03', 'fin-04']);
    });
    it('collapses the duplicate images: the deck holds all 8 elements, each fin 2', () => {
      expect(b.pieces[0].elements).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
      for (const p of b.pieces.slice(1)) expect(p.elements.length).toBe(2);
      expect(b.pieces.slice(1).flatMap((p) => p.elements).sort()).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
      expect(b.findings).toEqual([]);
    });
    it('puts the fins on the planes x = ±30 and y = ±30', () => {
      const normals = b.pieces.slice(1).map((p) => p.frame.normal.map((x) => Math.round(x * 30)).join(','));
      expect(normals.sort()).toEqual(['-30,0,0', '0,-30,0', '0,30,0', '30,0,0']);
      for (const p of b.pieces.slice(1)) expect(p.frame.offset).toBe(30);
    });
    it('has two templates: the deck once and the fin four times', () => {
      expect(b.templates.map((t) => [t.representative, t.count])).toEqual([['deck-01', 1], ['fin-01', 4]]);
      expect(b.pieces.map((p) => p.template)).toEqual([0, 1, 1, 1, 1]);
      expect(polygonArea(b.pieces[1].polygon)).toBeCloseTo(4800, 9);
    });
    it('places every contributing image on its piece', () => expectImagesOnPieces(d));
  });

  // O, faces ⟂ 4-fold axes at 50: 6 planes, stabiliser C4; a centred 100 × 100 square is
  // 4-fold symmetric, so 6 pieces of 4 elements each, one template.
  it('the O cube-plate fixture gives 6 plates of 4 elements, one template of 6', () => {
    const b = buildPieces(fixture('o-cube-plates'));
    expect(b.pieces.length).toBe(6);
    for (const p of b.pieces) expect(p.elements.length).toBe(4);
    expect(b.templates).toEqual([{ index: 0, representative: 'plate-01', pieces: b.pieces.map((p) => p.id), count: 6 }]);
    expect(b.findings).toEqual([]);
  });

  // The arm [0, 60] × [−10, 10] turned by the C4 stabiliser makes a plus sign: a 20 × 20 centre
  // plus four 50 × 20 arms = 400 + 4000 = 4400 mm², one region per face → 6 merged pieces.
  describe('the O cross fixture (overlapping images)', () => {
    const d = fixture('o-cross-merge');
    const b = buildPieces(d);
    it('unions the four arms into one plus-shaped piece per face, 4400 mm² each', () => {
      expect(b.pieces.length).toBe(6);
      for (const p of b.pieces) expectClose(polygonArea(p.polygon), 4400, 1e-6, p.id);
      expect(b.templates.length).toBe(1);
    });
    it('reports one coplanar-merge info naming the motif and its pieces', () => {
      expect(b.findings.length).toBe(1);
      const f = b.findings[0];
      expect(f.code).toBe('coplanar-merge');
      expect(f.severity).toBe('info');
      expect(f.pieces).toEqual(['arm-01', 'arm-02', 'arm-03', 'arm-04', 'arm-05', 'arm-06']);
      expect(f.message).toMatch(/"arm"/);
      expect(f.message).toMatch(/arm-01/);
    });
    it('places every contributing image on its piece', () => expectImagesOnPieces(d));
  });

  // The tab [20, 40] × [−5, 5] turned by C4 gives four disjoint copies per face: 24 pieces of one
  // element, all congruent, and nothing merged.
  describe('the O tabs fixture (disjoint images on one plane)', () => {
    const d = fixture('o-tabs-apart');
    const b = buildPieces(d);
    it('makes each copy its own piece, numbered plane by plane', () => {
      expect(b.pieces.length).toBe(24);
      expect(b.pieces[0].id).toBe('tab-01');
      expect(b.pieces[0].elements).toEqual([0]);
      expect(new Set(b.pieces.slice(0, 4).map((p) => p.plane))).toEqual(new Set([0]));
      expect(b.pieces[4].plane).toBe(1);
      expect(b.findings).toEqual([]);
      expect(b.templates.map((t) => t.count)).toEqual([24]);
    });
    it('places every contributing image on its piece', () => expectImagesOnPieces(d));
  });

  // I: ribs ⟂ 2-fold axes (15 lines → 30 planes at offset 120) and caps ⟂ 5-fold axes (12 planes).
  // The rib (80 × 20 with a centred hole) is symmetric under the half turn; the cap circle is
  // symmetric under C5 up to its flattening, which must still count as a duplicate.
  it('the I fixture gives 30 ribs and 12 caps, two templates, no merge', () => {
    const b = buildPieces(fixture('i-two-families'));
    expect(b.pieces.filter((p) => p.motif === 'rib').length).toBe(30);
    expect(b.pieces.filter((p) => p.motif === 'cap').length).toBe(12);
    for (const p of b.pieces) expect(p.elements.length).toBe(p.motif === 'rib' ? 2 : 5);
    expect(b.templates.map((t) => t.count)).toEqual([30, 12]);
    expect(b.findings).toEqual([]);
  });

  // D4 on z = 0 with an L away from every axis: 4 turns and 4 half turns about horizontal axes
  // (mirrors in the plane) give 8 disjoint copies; a flat part can be turned over, so 1 template.
  it('counts mirror images as one template (a part can be flipped)', () => {
    const d = design({
      symmetry: 'D4',
      families: [{ id: 'deck', axis: 4, offset: 0 }],
      motifs: [{ id: 'ell', family: 'deck', outline: [[20, 4], [32, 4], [32, 7], [23, 7], [23, 14], [20, 14]] }],
    });
    const b = buildPieces(d);
    expect(b.pieces.length).toBe(8);
    expect(b.pieces.filter((p) => det2(p.map) < 0).length).toBe(4);
    expect(b.templates.map((t) => t.count)).toEqual([8]);
    expectImagesOnPieces(d);
  });

  it('groups congruent pieces of different motifs into one template', () => {
    // A 10 × 4 tab away from the axes, on the O 4-fold faces (6 planes × 4 disjoint copies) and,
    // turned by 90°, on the 3-fold faces (8 planes × 3 disjoint copies): all 48 are congruent.
    const tab = [[30, -2], [40, -2], [40, 2], [30, 2]];
    const d = design({
      symmetry: 'O',
      families: [{ id: 'q', axis: 4, offset: 50 }, { id: 't', axis: 3, offset: 60 }],
      motifs: [{ id: 'a', family: 'q', outline: tab }, { id: 'b', family: 't', outline: tab.map(([x, y]) => [y, x]) }],
    });
    const b = buildPieces(d);
    expect(b.pieces.length).toBe(48);
    expect(b.templates.map((t) => t.count)).toEqual([48]);
  });

  it('keeps motifs of one family apart even where they overlap (no union across motifs)', () => {
    const sq = [[-10, -10], [10, -10], [10, 10], [-10, 10]];
    const d = design({
      symmetry: 'C2',
      families: [{ id: 'f', normal: [1, 0, 0], offset: 20 }],
      motifs: [{ id: 'a', family: 'f', outline: sq }, { id: 'b', family: 'f', outline: sq.map(([x, y]) => [x + 5, y]) }],
    });
    const b = buildPieces(d);
    expect(b.pieces.map((p) => p.id)).toEqual(['a-01', 'a-02', 'b-01', 'b-02']);
    expect(b.findings).toEqual([]);
  });

  it('pads piece numbers to three digits when a motif has 100 or more pieces', () => {
    const d = design({
      symmetry: 'C120',
      families: [{ id: 'f', normal: [1, 0, 0.3], offset: 40 }],
      motifs: [{ id: 'p', family: 'f', outline: [[-1, -1], [1, -1], [1, 1], [-1, 1]] }],
    });
    const ids = buildPieces(d).pieces.map((p) => p.id);
    expect(ids.length).toBe(120);
    expect(ids[0]).toBe('p-001');
    expect(ids[119]).toBe('p-120');
  });

  it('gives each piece a unique id and the first element’s map', () => {
    const d = fixture('i-two-families');
    const b = buildPieces(d);
    expect(new Set(b.pieces.map((p) => p.id)).size).toBe(b.pieces.length);
    const group = getGroup(d.symmetry);
    for (const p of b.pieces) {
      const f = d.families.find((x) => x.id === p.family)!;
      const orbit = planeOrbit(group, f.normal, f.offset);
      expect(p.map).toEqual(orbit.images[p.elements[0]].map);
      expect(orbit.images[p.elements[0]].plane).toBe(p.plane);
    }
  });
});

describe('buildPieces near a symmetry axis', () => {
  // D5, plane z = −71 (the 5-fold family drawn on its second plane), a 25 × 8 strip whose corner
  // lies 0.26 mm from the axis. The five turns overlap around the axis and leave a small opening
  // there. polygon-clipping 0.15 failed on these five images as computed ("Unable to complete
  // output ring"), so the builder fell back to separate pieces with a coplanar-merge warning.
  const outline = [
    [0.18493635059400734, -0.18989951923654363],
    [-7.561887687019445, -24.032172325192988],
    [0.07246054223776177, -26.572425719626384],
    [7.819284579851214, -2.73015291366994],
  ];
  const d = design({ symmetry: 'D5', families: [{ id: 'f', normal: [0, 0, -1], offset: 71 }], motifs: [{ id: 'm', family: 'f', outline }] });
  const b = buildPieces(d);

  it('unions the five turns into one piece per plane, with the opening around the axis as a hole', () => {
    expect(b.findings.map((f) => `${f.code}/${f.severity}`)).toEqual(['coplanar-merge/info']);
    expect(b.pieces.map((p) => p.elements.length)).toEqual([5, 5]);
    expect(b.pieces[0].polygon.holes.length).toBe(1);
    expect(locateInPolygon([0, 0], b.pieces[0].polygon)).toBe('outside');
    expect(b.templates.map((t) => t.count)).toEqual([2]);
  });

  it('has the area of the five strips counted once (checked by sampling a 0.2 mm grid)', () => {
    const group = getGroup('D5');
    const orbit = planeOrbit(group, d.families[0].normal, 71);
    const rings = orbit.images.filter((im) => im.plane === 0).map((im) => transformPolygon(d.motifs[0].polygon, im.map).outer);
    let hits = 0;
    for (let x = -30; x < 30; x += 0.2) for (let y = -30; y < 30; y += 0.2) if (rings.some((r) => locateInRing([x + 0.1, y + 0.1], r, 0) === 'inside')) hits++;
    expectClose(polygonArea(b.pieces[0].polygon), hits * 0.04, 0.01 * hits * 0.04);
  });

  it('places every contributing image on its piece', () => expectImagesOnPieces(d));
});

describe('createPieceBuilder', () => {
  it('reuses unchanged motifs and rebuilds only the edited one, with the same answer as buildPieces', () => {
    const d = fixture('i-two-families');
    const builder = createPieceBuilder();
    builder.build(d);
    expect(builder.stats).toEqual({ built: 2, reused: 0 });
    const edited: ResolvedDesign = {
      ...d,
      motifs: d.motifs.map((m) => (m.id === 'rib' ? { ...m, polygon: { outer: m.polygon.outer.map(([x, y]) => [x * 1.1, y] as const), holes: m.polygon.holes } } : m)),
    };
    const again = builder.build(edited);
    expect(builder.stats).toEqual({ built: 1, reused: 1 });
    const fresh = buildPieces(edited);
    expect(again.pieces.map((p) => [p.id, p.template, polygonArea(p.polygon)])).toEqual(fresh.pieces.map((p) => [p.id, p.template, polygonArea(p.polygon)]));
    expect(again.templates).toEqual(fresh.templates);
    expectClose(polygonArea(again.pieces[0].polygon), 88 * 20 - 40, 1e-9);
  });
  it('rebuilds a motif when its family is renamed, so its pieces name the new family', () => {
    const d = fixture('o-cube-plates');
    const builder = createPieceBuilder();
    builder.build(d);
    const id = `${d.families[0].id}-renamed`;
    const renamed: ResolvedDesign = { ...d, families: [{ ...d.families[0], id }], motifs: d.motifs.map((m) => ({ ...m, family: id })) };
    const again = builder.build(renamed);
    expect(builder.stats).toEqual({ built: 1, reused: 0 });
    expect(new Set(again.pieces.map((p) => p.family))).toEqual(new Set([id]));
  });
  it('rebuilds a motif when its family offset changes', () => {
    const d = fixture('o-cube-plates');
    const builder = createPieceBuilder();
    builder.build(d);
    builder.build({ ...d, families: [{ ...d.families[0], offset: 60 }] });
    expect(builder.stats).toEqual({ built: 1, reused: 0 });
  });
});
