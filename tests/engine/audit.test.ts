// The audit report (FORMAT.md §5) on small designs whose answers are worked out by hand below.
import { describe, expect, it } from 'vitest';
import { audit, auditDocument, createAuditor, effectiveLimits } from '../../shared/engine/audit.js';
import { parseDesign } from '../../shared/engine/design.js';
import type { ResolvedDesign } from '../../shared/engine/model.js';

type Doc = Record<string, unknown>;

function design(doc: Doc): ResolvedDesign {
  const r = parseDesign(doc);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}

const base = (over: Doc): Doc => ({
  format: 'planewright/design@1',
  title: 'test',
  symmetry: 'C1',
  material: { name: 'Birch plywood', thickness: 3, kerf: 0.15 },
  ...over,
});

const square = (h: number): number[][] => [[-h, -h], [h, -h], [h, h], [-h, h]];
const rect = (x0: number, x1: number, y0: number, y1: number): number[][] => [[x0, y0], [x1, y0], [x1, y1], [x0, y1]];

/** Regular n-gon of radius r (invariant under rotations by multiples of 360°/n about its centre). */
const ngon = (n: number, r: number): number[][] =>
  Array.from({ length: n }, (_, k) => [r * Math.cos((2 * Math.PI * k) / n), r * Math.sin((2 * Math.PI * k) / n)]);

describe('audit', () => {
  it('when six squares make a cube under O: 6 pieces, 12 corner joints, one component', () => {
    // A cube has 6 faces and 12 edges (CRC Standard Mathematical Tables, regular polyhedra; also
    // REFERENCES.md). Square 100 × 100 motifs on the 4-fold planes at offset 50 meet edge to edge
    // along every cube edge: 12 corners of 100 mm at 90°.
    const r = audit(design(base({
      symmetry: 'O',
      families: [{ id: 'face', axis: 4, offset: 50 }],
      motifs: [{ id: 'sq', family: 'face', outline: square(50) }],
    })));
    expect(r.pieces).toBe(6);
    expect(r.order).toBe(24);
    expect(r.summary).toEqual({
      joints: 12, orthogonal: 12, nonOrthogonal: 0,
      byKind: { corner: 12, 'mortise-and-tenon': 0, 'cross-lap': 0, 'through-slot': 0, 'locked-crossing': 0 },
    });
    expect(r.joints.every((j) => Math.abs(j.length - 100) < 1e-6)).toBe(true);
    expect(r.components).toBe(1);
    expect(r.ok).toBe(true);
    expect(r.findings).toEqual([]);
    expect(r.sheets).toBeUndefined();
  });

  it('has exactly the keys of FORMAT.md §5 (plus groups), with sheets when a sheet size is known', () => {
    const r = audit(design(base({
      symmetry: 'O',
      families: [{ id: 'face', axis: 4, offset: 50 }],
      motifs: [{ id: 'sq', family: 'face', outline: square(50) }],
      constraints: { sheet: [600, 400] },
    })));
    expect(Object.keys(r).sort()).toEqual(['components', 'findings', 'group', 'groups', 'joints', 'ok', 'order', 'pieces', 'sheets', 'summary', 'templates']);
    expect(r.sheets?.size).toEqual([600, 400]);
    expect(Object.keys(r.joints[0]).sort()).toEqual(['a', 'angleDeg', 'b', 'from', 'kind', 'length', 'orthogonal', 'slots', 'to']);
  });

  it('when a standing rib is 4 mm long on a 3 mm plate: a short-joint warning, still ok', () => {
    // C1: plate z = 0, 100 × 100; rib on x = 0 with frame (y, z): y ∈ [−2, 2], z ∈ [0, 40]. Its
    // bottom edge stands on the plate → mortise-and-tenon of 4 mm < 2 × 3 mm → short-joint.
    const doc = base({
      families: [{ id: 'plate', normal: [0, 0, 1], offset: 0 }, { id: 'rib', normal: [1, 0, 0], offset: 0 }],
      motifs: [
        { id: 'plate', family: 'plate', outline: square(50) },
        { id: 'rib', family: 'rib', outline: rect(-2, 2, 0, 40) },
      ],
    });
    const r = audit(design(doc));
    expect(r.summary.byKind['mortise-and-tenon']).toBe(1);
    expect(r.joints[0].tenon).toBe('rib-01');
    const short = r.findings.filter((f) => f.code === 'short-joint');
    expect(short.map((f) => f.severity)).toEqual(['warning']);
    expect(short[0].message).toContain('4.00 mm');
    expect(short[0].pieces).toEqual(['plate-01', 'rib-01']);
    // The 4 mm rib is also narrower than 2 × thickness: the fabrication check's warning.
    expect(r.findings.map((f) => f.code)).toContain('thin-feature');
    expect(r.ok).toBe(true);
    expect(r.components).toBe(1);
    // The option overrides the default minimum (2 × thickness).
    expect(audit(design(doc), { minJointLength: 3 }).findings.map((f) => f.code)).not.toContain('short-joint');
  });

  it('when two pieces are far apart: disconnected, listing both groups', () => {
    const r = audit(design(base({
      families: [{ id: 'a', normal: [0, 0, 1], offset: 0 }, { id: 'b', normal: [0, 0, 1], offset: 100 }],
      motifs: [{ id: 'low', family: 'a', outline: square(10) }, { id: 'high', family: 'b', outline: square(10) }],
    })));
    expect(r.components).toBe(2);
    expect(r.groups).toEqual([['high-01'], ['low-01']]);
    const f = r.findings.find((x) => x.code === 'disconnected')!;
    expect(f.severity).toBe('error');
    expect(f.message).toContain('2 groups of 1 piece each');
    expect(r.ok).toBe(false);
  });

  it('when five posts meet a deck at 72°: one non-orthogonal finding for the whole orbit', () => {
    // C5: the deck (5-fold plane z = 0) is a regular 20-gon of radius 100, invariant under the
    // group, so its five images collapse into one piece. Posts: normal n = (cos 18°, 0, sin 18°)
    // through the centre; θ = acos(|n·z|) = acos(sin 18°) = 72°. The post's frame has u = world
    // y and v = (−sin 18°, 0, cos 18°), so the motif x ∈ [10, 30], y ∈ [−20, 20] crosses the
    // deck along world y ∈ [10, 30]: one 20 mm joint per post, 5 posts, all alike.
    const s = Math.sin(Math.PI / 10), c = Math.cos(Math.PI / 10);
    const doc = base({
      symmetry: 'C5',
      families: [{ id: 'deck', axis: 5, offset: 0 }, { id: 'posts', normal: [c, 0, s], offset: 0 }],
      motifs: [{ id: 'deck', family: 'deck', outline: ngon(20, 100) }, { id: 'post', family: 'posts', outline: rect(10, 30, -20, 20) }],
    });
    const r = audit(design(doc));
    expect(r.pieces).toBe(6);
    expect(r.summary.joints).toBe(5);
    expect(r.summary.nonOrthogonal).toBe(5);
    for (const j of r.joints) {
      expect(j.angleDeg).toBeCloseTo(72, 6);
      // The post's sides x = 10 and x = 30 are square to L, so the band adds nothing: 20 mm.
      expect(j.length).toBeCloseTo(20, 6);
    }
    const non = r.findings.filter((f) => f.code === 'non-orthogonal-contact');
    expect(non).toHaveLength(1);
    expect(non[0].message).toMatch(/deck-01 meets post-0\d at 72\.0°, not 90°/);
    expect(non[0].message).toContain('5 joints between deck and post pieces');
    expect(non[0].pieces).toEqual(['deck-01', 'post-01', 'post-02', 'post-03', 'post-04', 'post-05']);
    // Non-orthogonal joints do not connect: 6 groups.
    expect(r.components).toBe(6);
    expect(r.ok).toBe(false);
    // The deck's five images are exact duplicates, which collapse without a coplanar-merge note.
    expect(r.findings.map((f) => f.code)).toEqual(['non-orthogonal-contact', 'disconnected']);
  });

  it('when the posts are square to the deck: five through-slots, one component, ok', () => {
    // Posts on x = 0 (normal (1, 0, 0)): θ = 90°; each post crosses the deck (y ∈ [−20, 20] of its
    // frame), its chord [10, 30] lies inside the deck's, and it passes straight down → through-slot.
    const r = audit(design(base({
      symmetry: 'C5',
      families: [{ id: 'deck', axis: 5, offset: 0 }, { id: 'posts', normal: [1, 0, 0], offset: 0 }],
      motifs: [{ id: 'deck', family: 'deck', outline: ngon(20, 100) }, { id: 'post', family: 'posts', outline: rect(10, 30, -20, 20) }],
    })));
    expect(r.summary.byKind['through-slot']).toBe(5);
    expect(r.components).toBe(1);
    expect(r.ok).toBe(true);
    expect(r.joints.every((j) => j.slots.length === 1 && j.slots[0].piece === 'deck-01')).toBe(true);
  });

  it('lets the option angle tolerance win over the constraint', () => {
    // A post tilted 0.4° from square: 89.6°; the constraint's 0.3° rejects it, the option's 0.5° accepts.
    const t = (0.4 * Math.PI) / 180;
    const doc = base({
      families: [{ id: 'deck', normal: [0, 0, 1], offset: 0 }, { id: 'posts', normal: [Math.cos(t), 0, Math.sin(t)], offset: 0 }],
      motifs: [{ id: 'deck', family: 'deck', outline: square(100) }, { id: 'post', family: 'posts', outline: rect(10, 30, -20, 20) }],
      constraints: { angleToleranceDeg: 0.3 },
    });
    expect(audit(design(doc)).findings.map((f) => f.code)).toContain('non-orthogonal-contact');
    expect(audit(design(doc), { angleToleranceDeg: 0.5 }).ok).toBe(true);
  });

  it('when a ring crosses a plate: two locked-crossing joints in one finding, which do not connect', () => {
    const doc = base({
      families: [{ id: 'plate', normal: [0, 0, 1], offset: 0 }, { id: 'ring', normal: [1, 0, 0], offset: 0 }],
      motifs: [
        { id: 'plate', family: 'plate', outline: square(100) },
        { id: 'ring', family: 'ring', outline: square(20), holes: [square(10)] },
      ],
    });
    const r = audit(design(doc));
    expect(r.summary.byKind['locked-crossing']).toBe(2);
    const locked = r.findings.filter((f) => f.code === 'locked-crossing');
    expect(locked).toHaveLength(1);
    expect(locked[0].message).toContain('2 joints');
    expect(r.components).toBe(2);
  });

  it('when there are no motifs: no pieces, no components, ok', () => {
    const r = audit(design(base({ families: [{ id: 'a', normal: [0, 0, 1], offset: 0 }], motifs: [] })));
    expect(r.pieces).toBe(0);
    expect(r.components).toBe(0);
    expect(r.ok).toBe(true);
  });

  it('when there are no motifs but a sheet size: sheets is present, 0 sheets (FORMAT.md §5)', () => {
    const r = audit(design(base({ families: [{ id: 'a', normal: [0, 0, 1], offset: 0 }], motifs: [], constraints: { sheet: [600, 400] } })));
    expect(r.sheets).toEqual({ size: [600, 400], count: 0, utilization: 0 });
  });
});

describe('effectiveLimits', () => {
  it('takes options first, then constraints, then the defaults', () => {
    const d = design(base({ families: [{ id: 'a', normal: [0, 0, 1], offset: 0 }], motifs: [], constraints: { sheet: [600, 400], maxSheets: 3 } }));
    expect(effectiveLimits(d)).toEqual({ sheet: [600, 400], maxSheets: 3, angleToleranceDeg: 0.5, minJointLength: 6, nesting: true, fabrication: true });
    expect(effectiveLimits(d, { sheet: [300, 200], maxSheets: 1, angleToleranceDeg: 1, minJointLength: 2, nesting: false, fabrication: false })).toEqual({
      sheet: [300, 200], maxSheets: 1, angleToleranceDeg: 1, minJointLength: 2, nesting: false, fabrication: false,
    });
  });
});

describe('auditDocument', () => {
  it('when the document is invalid: the issues with their field paths, no report', () => {
    const r = auditDocument(base({ families: [{ id: 'a', axis: 7, offset: 10 }], motifs: [] }));
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.some((e) => e.path.startsWith('families[0]'))).toBe(true);
  });

  it('when an option is unusable: an issue naming the option, no report', () => {
    const doc = base({ families: [{ id: 'a', normal: [0, 0, 1], offset: 0 }], motifs: [{ id: 'm', family: 'a', outline: square(10) }] });
    const r = auditDocument(doc, { angleToleranceDeg: Number.NaN, sheet: [600, -1], maxSheets: 0.5, minJointLength: -2 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.path)).toEqual(['options.sheet', 'options.maxSheets', 'options.angleToleranceDeg', 'options.minJointLength']);
    expect(auditDocument(doc, { angleToleranceDeg: 1, sheet: [600, 400], maxSheets: 2, minJointLength: 0 }).ok).toBe(true);
  });

  it('when the document is valid: the report', () => {
    const r = auditDocument(base({ families: [{ id: 'a', normal: [0, 0, 1], offset: 0 }], motifs: [{ id: 'm', family: 'a', outline: square(10) }] }));
    expect(r.ok && r.report.pieces).toBe(1);
  });
});

describe('createAuditor', () => {
  const doc = (ribTop: number, extra = false): Doc => base({
    symmetry: 'D4',
    families: [{ id: 'deck', axis: 4, offset: 0 }, { id: 'fins', axis: 2, offset: 30 }],
    motifs: [
      { id: 'deck', family: 'deck', outline: square(50) },
      { id: 'fin', family: 'fins', outline: rect(-60, 60, -20, ribTop) },
      ...(extra ? [{ id: 'tab', family: 'fins', outline: rect(-5, 5, -40, -15) }] : []),
    ],
    constraints: { sheet: [600, 400] },
  });

  it('gives what a fresh audit gives, edit after edit (changed, added, removed, restored motifs)', () => {
    const auditor = createAuditor();
    for (const d of [doc(20), doc(25), doc(25, true), doc(20, true), doc(20), doc(20)]) {
      const resolved = design(d);
      expect(auditor.audit(resolved)).toEqual(audit(resolved));
    }
  });

  it('gives what a fresh audit gives when only the options change', () => {
    const auditor = createAuditor();
    const d = design(doc(20));
    auditor.audit(d);
    expect(auditor.audit(d, { angleToleranceDeg: 5, minJointLength: 50 })).toEqual(audit(d, { angleToleranceDeg: 5, minJointLength: 50 }));
    expect(auditor.audit({ ...d, material: { ...d.material, thickness: 6 } })).toEqual(audit({ ...d, material: { ...d.material, thickness: 6 } }));
  });
});
