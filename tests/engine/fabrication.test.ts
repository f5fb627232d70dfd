import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { convexHull } from '../../shared/engine/hull2.js';
import { checkFabrication, pieceSlots, slotRectangle, thinRegions } from '../../shared/engine/fabrication.js';
import { planeFrame, toWorld } from '../../shared/engine/frames.js';
import type { Joint, JointKind, Piece, Polygon2 } from '../../shared/engine/model.js';
import type { Mat2 } from '../../shared/engine/orbits.js';
import type { Vec2, Vec3 } from '../../shared/engine/vec.js';

const MATERIAL = { thickness: 3, kerf: 0.2 };
const box = (x0: number, y0: number, x1: number, y1: number): Vec2[] => [
  [x0, y0],
  [x1, y0],
  [x1, y1],
  [x0, y1],
];
const circle = (r: number, n = 96, cw = false): Vec2[] =>
  Array.from({ length: n }, (_, k) => {
    const a = ((cw ? -1 : 1) * 2 * Math.PI * k) / n;
    return [r * Math.cos(a), r * Math.sin(a)];
  });

interface PieceSpec {
  id: string;
  outer: Vec2[];
  holes?: Vec2[][];
  normal?: Vec3;
  offset?: number;
  motif?: string;
  template?: number;
  map?: Mat2;
}
function piece(s: PieceSpec): Piece {
  return {
    id: s.id,
    motif: s.motif ?? s.id.replace(/-\d+$/, ''),
    family: 'f',
    plane: 0,
    frame: planeFrame(s.normal ?? [0, 0, 1], s.offset ?? 0),
    polygon: { outer: s.outer, holes: s.holes ?? [] },
    elements: [0],
    map: s.map ?? [1, 0, 0, 1],
    template: s.template ?? 0,
  };
}
/** A joint that slots `target` along the world segment from → to (plane z = 0: world x, y = frame x, y). */
function slotJoint(target: string, partner: string, kind: JointKind, from: Vec2, to: Vec2): Joint {
  const f: Vec3 = [from[0], from[1], 0];
  const t: Vec3 = [to[0], to[1], 0];
  return { a: target, b: partner, kind, angleDeg: 90, length: Math.hypot(to[0] - from[0], to[1] - from[1]), orthogonal: true, from: f, to: t, slots: [{ piece: target, from: f, to: t }] };
}
const codes = (pieces: Piece[], joints: Joint[] = []): string[] => checkFabrication(pieces, joints, MATERIAL).map((f) => f.code);

describe('checkFabrication: slab-clash', () => {
  const a = piece({ id: 'rib-01', outer: box(0, 0, 100, 100), offset: 50 });

  it('when parallel plates 2 mm apart overlap in 3 mm material, reports a clash with the gap and the overlap', () => {
    const b = piece({ id: 'cap-01', outer: box(50, 0, 150, 100), offset: 52 });
    const f = checkFabrication([a, b], [], MATERIAL);
    expect(f).toHaveLength(1);
    expect(f[0].code).toBe('slab-clash');
    expect(f[0].severity).toBe('error');
    expect(f[0].pieces).toEqual(['rib-01', 'cap-01']);
    expect(f[0].message).toContain('2 mm apart');
    expect(f[0].message).toContain('5000 mm²'); // the 50 × 100 mm strip both outlines cover
    expect(f[0].message).toContain('at least 3 mm apart');
  });

  it('when the plates are 5 mm apart, reports nothing', () => {
    expect(codes([a, piece({ id: 'cap-01', outer: box(50, 0, 150, 100), offset: 55 })])).toEqual([]);
  });

  it('when the outlines do not overlap or only touch, reports nothing', () => {
    expect(codes([a, piece({ id: 'cap-01', outer: box(200, 0, 300, 100), offset: 52 })])).toEqual([]);
    expect(codes([a, piece({ id: 'cap-01', outer: box(100, 0, 200, 100), offset: 52 })])).toEqual([]);
  });

  it('when the normals are opposite, compares the planes as the same direction', () => {
    // z = 1 and z = −1: 2 mm apart. B's frame runs x backwards, so its [0, 100] is world x ∈ [−100, 0].
    const up = piece({ id: 'rib-01', outer: box(-50, 0, 50, 100), normal: [0, 0, 1], offset: 1 });
    const down = piece({ id: 'cap-01', outer: box(0, 0, 100, 100), normal: [0, 0, -1], offset: 1 });
    const f = checkFabrication([up, down], [], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['slab-clash']);
    expect(f[0].message).toContain('5000 mm²');
  });

  it('on one plane, reports pieces of different motifs and skips pieces of one motif', () => {
    const other = piece({ id: 'cap-01', outer: box(50, 50, 150, 150), offset: 50 });
    const f = checkFabrication([a, other], [], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['slab-clash']);
    expect(f[0].message).toContain('same plane');
    const sameMotif = piece({ id: 'rib-02', outer: box(50, 50, 150, 150), offset: 50 });
    expect(codes([a, sameMotif])).toEqual([]);
  });

  it('merges congruent clashes into one finding that lists every piece', () => {
    const pieces = [
      piece({ id: 'rib-01', outer: box(0, 0, 100, 100), offset: 50, template: 0 }),
      piece({ id: 'cap-01', outer: box(50, 0, 150, 100), offset: 52, template: 1 }),
      piece({ id: 'rib-02', outer: box(0, 0, 100, 100), normal: [1, 0, 0], offset: 50, template: 0 }),
      piece({ id: 'cap-02', outer: box(50, 0, 150, 100), normal: [1, 0, 0], offset: 52, template: 1 }),
    ];
    const f = checkFabrication(pieces, [], MATERIAL);
    expect(f).toHaveLength(1);
    expect(f[0].pieces).toEqual(['rib-01', 'cap-01', 'rib-02', 'cap-02']);
    expect(f[0].message).toContain('1 more pair');
  });
});

describe('checkFabrication: mortise-splits-piece', () => {
  const plate = piece({ id: 'rib-01', outer: box(0, 0, 100, 50) });

  it('when a mortise runs across the whole width, reports the piece cut in two', () => {
    const j = slotJoint('rib-01', 'cap-03', 'mortise-and-tenon', [50, 0], [50, 50]);
    const f = checkFabrication([plate], [j], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['mortise-splits-piece']);
    expect(f[0].pieces).toEqual(['rib-01']);
    // 100 mm minus the 3 mm slot leaves two 48.5 × 50 mm halves.
    expect(f[0].message).toContain('2 parts (2425 mm², 2425 mm²)');
    expect(f[0].message).toContain('mortise for the joint with cap-03 (50 mm long)');
  });

  it('when a cross-lap slot goes half way, the piece holds together', () => {
    const j = slotJoint('rib-01', 'cap-03', 'cross-lap', [50, 0], [50, 25]);
    expect(codes([plate], [j])).toEqual([]);
  });

  it('when two slots from opposite edges meet, reports them together', () => {
    const j1 = slotJoint('rib-01', 'cap-03', 'cross-lap', [50, 0], [50, 30]);
    const j2 = slotJoint('rib-01', 'cap-04', 'cross-lap', [50, 50], [50, 20]);
    const f = checkFabrication([plate], [j1, j2], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['mortise-splits-piece']);
    expect(f[0].message).toContain('together');
  });

  it('when a slot crosses the edges at 30°, cuts the piece in two', () => {
    // From (10, 0) at 30° to the bottom edge up to the top edge y = 50 at x = 10 + 50·√3.
    const j = slotJoint('rib-01', 'cap-03', 'through-slot', [10, 0], [10 + 50 * Math.sqrt(3), 50]);
    expect(codes([plate], [j])).toEqual(['mortise-splits-piece']);
  });
});

describe('checkFabrication: slot-near-edge', () => {
  const plate = piece({ id: 'rib-01', outer: box(0, 0, 100, 50), holes: [box(40, 25, 60, 40).reverse()] });

  it('when a closed slot is 1 mm from the edge, warns with the distance', () => {
    // Centre line at y = 2.5, 3 mm wide: the slot spans y ∈ [1, 4], 1 mm above the bottom edge.
    const j = slotJoint('rib-01', 'cap-03', 'through-slot', [20, 2.5], [80, 2.5]);
    const f = checkFabrication([plate], [j], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['slot-near-edge']);
    expect(f[0].severity).toBe('warning');
    expect(f[0].message).toContain('is 1 mm from the outline');
  });

  it('measures the distance to a hole too', () => {
    // Slot spans y ∈ [21, 24]; the hole starts at y = 25.
    const j = slotJoint('rib-01', 'cap-03', 'mortise-and-tenon', [45, 22.5], [55, 22.5]);
    const f = checkFabrication([plate], [j], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['slot-near-edge']);
    expect(f[0].message).toContain('is 1 mm from hole 1');
  });

  it('when a closed slot reaches the edge, says so rather than "0 mm"', () => {
    // Centre line at y = 1.5, 3 mm wide: the slot spans y ∈ [0, 3] and touches the bottom edge.
    const j = slotJoint('rib-01', 'cap-03', 'through-slot', [20, 1.5], [80, 1.5]);
    const f = checkFabrication([plate], [j], MATERIAL).filter((x) => x.code === 'slot-near-edge');
    expect(f.length).toBe(1);
    expect(f[0].message).toContain('(60 mm long) reaches the outline');
    expect(f[0].message).not.toContain(' 0 mm from');
  });

  it('when a closed slot keeps a thickness of material all round, says nothing', () => {
    expect(codes([plate], [slotJoint('rib-01', 'cap-03', 'through-slot', [20, 10], [80, 10])])).toEqual([]);
  });

  it('does not measure a slot that opens onto the edge', () => {
    expect(codes([plate], [slotJoint('rib-01', 'cap-03', 'cross-lap', [2.5, 0], [2.5, 20])])).toEqual([]);
  });

  it('merges congruent pieces into one finding, comparing them in the motif frame', () => {
    // rib-02 is the same motif on the plane x = 0, turned a quarter in its frame (map = 90°).
    const turn: Mat2 = [0, -1, 1, 0];
    const apply = (q: Vec2): Vec2 => [turn[0] * q[0] + turn[1] * q[1], turn[2] * q[0] + turn[3] * q[1]];
    const copy = piece({
      id: 'rib-02',
      outer: plate.polygon.outer.map(apply),
      holes: plate.polygon.holes.map((h) => h.map(apply)),
      normal: [1, 0, 0],
      map: turn,
    });
    const world = (q: Vec2): Vec3 => toWorld(copy.frame, apply(q));
    const j1 = slotJoint('rib-01', 'cap-03', 'through-slot', [20, 2.5], [80, 2.5]);
    const j2: Joint = { ...j1, a: 'rib-02', b: 'cap-04', from: world([20, 2.5]), to: world([80, 2.5]), slots: [{ piece: 'rib-02', from: world([20, 2.5]), to: world([80, 2.5]) }] };
    const f = checkFabrication([plate, copy], [j1, j2], MATERIAL);
    expect(f).toHaveLength(1);
    expect(f[0].pieces).toEqual(['rib-01', 'rib-02']);
    expect(f[0].message).toContain('1 congruent piece: rib-02');
  });
});

describe('pieceSlots and slotRectangle', () => {
  it('marks the ends on the boundary as open and pushes the rectangle past a square edge by 0.05 mm', () => {
    const p = piece({ id: 'rib-01', outer: box(0, 0, 100, 50) });
    const [s] = pieceSlots(p, [slotJoint('rib-01', 'cap-03', 'cross-lap', [50, 0], [50, 25])]);
    expect(s.openFrom).toBe(true);
    expect(s.openTo).toBe(false);
    const r = slotRectangle(p.polygon, s, 3);
    const ys = r.map((q) => q[1]);
    const xs = r.map((q) => q[0]);
    expect(Math.min(...ys)).toBeCloseTo(-0.05, 9);
    expect(Math.max(...ys)).toBeCloseTo(25, 9);
    expect(Math.min(...xs)).toBeCloseTo(48.5, 9);
    expect(Math.max(...xs)).toBeCloseTo(51.5, 9);
  });

  it('pushes an open end far enough that both corners clear an edge met at 30°', () => {
    const p = piece({ id: 'rib-01', outer: box(0, 0, 100, 50) });
    const [s] = pieceSlots(p, [slotJoint('rib-01', 'cap-03', 'through-slot', [10, 0], [10 + 50 * Math.sqrt(3), 50])]);
    const r = slotRectangle(p.polygon, s, 3);
    // Corners at the start end are r[0] and r[3]; at the far end r[1] and r[2].
    expect(Math.max(r[0][1], r[3][1])).toBeLessThanOrEqual(0);
    expect(Math.min(r[1][1], r[2][1])).toBeGreaterThanOrEqual(50);
  });
});

describe('thinRegions', () => {
  it('finds a 100 × 4 mm strip of 3 mm stock thin all over', () => {
    const r = thinRegions({ outer: box(0, 0, 100, 4), holes: [] }, 3);
    expect(r).toHaveLength(1);
    expect(r[0].area).toBeCloseTo(400, 3);
    expect(r[0].width).toBeCloseTo(4, 3);
  });

  it('finds nothing thin in a 100 × 10 mm plate (its rounded corners lose 0.21 t² each)', () => {
    expect(thinRegions({ outer: box(0, 0, 100, 10), holes: [] }, 3)).toEqual([]);
  });

  it('in a T with a 4 mm stem, reports the stem only', () => {
    const t: Polygon2 = {
      outer: [[-30, 0], [-2, 0], [-2, -30], [2, -30], [2, 0], [30, 0], [30, 10], [-30, 10]],
      holes: [],
    };
    const r = thinRegions(t, 3);
    expect(r).toHaveLength(1);
    // The stem is 4 × 30 = 120 mm²; the bar's disc reaches a little way into its top.
    expect(r[0].area).toBeGreaterThan(110);
    expect(r[0].area).toBeLessThanOrEqual(120);
    expect(Math.abs(r[0].center[0])).toBeLessThan(0.01);
    expect(r[0].center[1]).toBeLessThan(-14);
    expect(r[0].width).toBeGreaterThan(3.8);
    expect(r[0].width).toBeLessThanOrEqual(4.01);
  });

  it('finds a 4 mm ring thin and a 10 mm ring not', () => {
    const narrow = thinRegions({ outer: circle(50), holes: [circle(46, 96, true)] }, 3);
    expect(narrow).toHaveLength(1);
    // π (50² − 46²) ≈ 1206 mm² for true circles; the 96-gons are 0.2 % smaller.
    expect(narrow[0].area).toBeGreaterThan(1195);
    expect(narrow[0].area).toBeLessThan(1207);
    expect(thinRegions({ outer: circle(50), holes: [circle(40, 96, true)] }, 3)).toEqual([]);
  });

  it('finds a narrow neck between two wide lobes', () => {
    // Two 40 × 40 squares joined by a 20 mm long, 4 mm wide bridge.
    const dumbbell: Polygon2 = {
      outer: [[0, 0], [40, 0], [40, 18], [60, 18], [60, 0], [100, 0], [100, 40], [60, 40], [60, 22], [40, 22], [40, 40], [0, 40]],
      holes: [],
    };
    const r = thinRegions(dumbbell, 3);
    expect(r).toHaveLength(1);
    expect(r[0].center[0]).toBeCloseTo(50, 1);
    expect(r[0].center[1]).toBeCloseTo(20, 1);
  });
});

describe('thinRegions on convex outlines', () => {
  it('agrees with the boolean opening (run on the same outline with a 0.01 mm pin-hole at its centre)', () => {
    const coord = fc.integer({ min: -40_000, max: 40_000 }).map((v) => v / 1000);
    // Twelve points at radius 7 keep a disc of radius 6.7 inside: room for 3 mm discs on either
    // side of the pin-hole at the centre, which forces the boolean method and changes the opening
    // only around itself, by slivers.
    const ringOfPoints: Vec2[] = Array.from({ length: 12 }, (_, k) => [7 * Math.cos((k * Math.PI) / 6), 7 * Math.sin((k * Math.PI) / 6)]);
    const hull = fc.array(fc.tuple(coord, coord), { minLength: 1, maxLength: 8 }).map((p) => convexHull([...ringOfPoints, ...(p as Vec2[])]));
    const pin = box(-0.005, -0.005, 0.005, 0.005).reverse();
    fc.assert(
      fc.property(hull, (h) => {
        const fast = thinRegions({ outer: h, holes: [] }, 3);
        const full = thinRegions({ outer: h, holes: [pin] }, 3);
        expect(fast.length).toBe(full.length);
        fast.forEach((r, k) => expect(Math.abs(r.area - full[k].area)).toBeLessThan(0.5));
      }),
      { numRuns: 40 },
    );
  });
});

describe('checkFabrication: thin-feature', () => {
  it('reports once per template and lists every congruent piece', () => {
    const strips = ['rib-01', 'rib-02', 'rib-03'].map((id) => piece({ id, outer: box(0, 0, 100, 4) }));
    const f = checkFabrication(strips, [], MATERIAL);
    expect(f.map((x) => x.code)).toEqual(['thin-feature']);
    expect(f[0].pieces).toEqual(['rib-01', 'rib-02', 'rib-03']);
    expect(f[0].message).toContain('about 4 mm wide');
    expect(f[0].message).toContain('6 mm');
  });

  it('takes the template representative when templates are given', () => {
    const strips = ['rib-01', 'rib-02'].map((id) => piece({ id, outer: box(0, 0, 100, 4) }));
    const f = checkFabrication(strips, [], MATERIAL, { templates: [{ index: 0, representative: 'rib-02', pieces: ['rib-01', 'rib-02'], count: 2 }] });
    expect(f[0].pieces[0]).toBe('rib-02');
  });

  it('when the thickness is not positive, reports nothing rather than failing', () => {
    expect(checkFabrication([piece({ id: 'rib-01', outer: box(0, 0, 100, 4) })], [], { thickness: 0, kerf: 0 })).toEqual([]);
  });
});
