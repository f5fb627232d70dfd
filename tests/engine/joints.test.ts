// Joint search (FORMAT.md §3) on hand-made pieces whose answers are worked out on paper below.
//
// Frames (FORMAT.md §1): for normal z the frame is (x, y) = (world x, world y); for normal x it
// is (world y, world z); for normal y it is (−world x, world z). The helper takes outlines in
// world coordinates on the plane and converts them, so each case reads as 3-D geometry.
//
// Reach: a piece counts inside the band |h| ≤ t/2 of the other plane, so its chord on the line L
// is the projection onto L of its part within t/2 of the other plane.
import { describe, expect, it } from 'vitest';
import { contactPad, findJoints, jointsBetween, pairJoints, preparePiece, jointContext } from '../../shared/engine/joints.js';
import { planeFrame, toFrame } from '../../shared/engine/frames.js';
import { overlappingPairs, overlappingPairsBrute } from '../../shared/engine/spatial.js';
import type { Piece } from '../../shared/engine/model.js';
import type { Vec2, Vec3 } from '../../shared/engine/vec.js';

function signedArea(r: readonly Vec2[]): number {
  let a = 0;
  for (let i = 0; i < r.length; i++) {
    const p = r[i], q = r[(i + 1) % r.length];
    a += p[0] * q[1] - q[0] * p[1];
  }
  return a / 2;
}

/** A piece on the plane n·x = offset, outline given as world points lying on that plane. */
function piece(id: string, normal: Vec3, offset: number, outer: Vec3[], holes: Vec3[][] = []): Piece {
  const frame = planeFrame(normal, offset);
  const ring = (pts: Vec3[], ccw: boolean): Vec2[] => {
    const r = pts.map((p) => toFrame(frame, p) as Vec2);
    return (signedArea(r) > 0) === ccw ? r : r.reverse();
  };
  return {
    id, motif: id.split('-')[0], family: 'f', plane: 0, frame,
    polygon: { outer: ring(outer, true), holes: holes.map((h) => ring(h, false)) },
    elements: [0], map: [1, 0, 0, 1], template: 0,
  };
}

const X: Vec3 = [1, 0, 0];
const Y: Vec3 = [0, 1, 0];
const Z: Vec3 = [0, 0, 1];

/** Rectangle in the plane z = 0: x ∈ [x0, x1], y ∈ [y0, y1]. */
const inZ = (id: string, x0: number, x1: number, y0: number, y1: number): Piece =>
  piece(id, Z, 0, [[x0, y0, 0], [x1, y0, 0], [x1, y1, 0], [x0, y1, 0]]);
/** Polygon in the plane x = 0 from (y, z) points. */
const inX = (id: string, pts: [number, number][], holes: [number, number][][] = []): Piece =>
  piece(id, X, 0, pts.map(([y, z]) => [0, y, z]), holes.map((h) => h.map(([y, z]) => [0, y, z] as Vec3)));
const rectX = (id: string, y0: number, y1: number, z0: number, z1: number): Piece =>
  inX(id, [[y0, z0], [y1, z0], [y1, z1], [y0, z1]]);

const T3 = { thickness: 3 };

function close(a: Vec3, b: Vec3, tol = 1e-6): boolean {
  return Math.abs(a[0] - b[0]) <= tol && Math.abs(a[1] - b[1]) <= tol && Math.abs(a[2] - b[2]) <= tol;
}

describe('jointsBetween', () => {
  it('when two unit squares cross at their middles, both straddle and each owns both ends: cross-lap', () => {
    // A: x, z ∈ [−0.5, 0.5] in y = 0; B: y, z ∈ [−0.5, 0.5] in x = 0; t = 0.2 so the band is
    // |x| ≤ 0.1 on A and |y| ≤ 0.1 on B. L is the z axis, d = nA × nB = y × x = −z, so s = −z.
    // Both chords are s ∈ [−0.5, 0.5]; the segment is the whole 1 mm; both pieces cross the
    // other plane by 0.5 on each side (straddle); both ends belong to both → cross-lap. The slot
    // rule for shared ends: A takes the end along nA × nB (s = 0.5 → z = −0.5).
    const a = piece('a-01', Y, 0, [[-0.5, 0, -0.5], [0.5, 0, -0.5], [0.5, 0, 0.5], [-0.5, 0, 0.5]]);
    const b = rectX('b-01', -0.5, 0.5, -0.5, 0.5);
    const [j, ...rest] = jointsBetween(a, b, { thickness: 0.2 });
    expect(rest).toHaveLength(0);
    expect(j.kind).toBe('cross-lap');
    expect(j.length).toBeCloseTo(1, 6);
    expect(j.angleDeg).toBe(90);
    expect(j.orthogonal).toBe(true);
    expect(close(j.from, [0, 0, 0.5])).toBe(true);
    expect(close(j.to, [0, 0, -0.5])).toBe(true);
    const slotA = j.slots.find((s) => s.piece === 'a-01')!;
    const slotB = j.slots.find((s) => s.piece === 'b-01')!;
    expect(close(slotA.from, [0, 0, 0]) && close(slotA.to, [0, 0, -0.5])).toBe(true);
    expect(close(slotB.from, [0, 0, 0.5]) && close(slotB.to, [0, 0, 0])).toBe(true);
  });

  it('when two plates overlap part-way along the line (a plus), each end belongs to a different piece: cross-lap', () => {
    // A in y = 0: x ∈ [−50, 50], z ∈ [0, 100]; B in x = 0: y ∈ [−50, 50], z ∈ [−60, 40].
    // L = z axis, s = −z. A's chord z ∈ [0, 100] (s ∈ [−100, 0]), B's z ∈ [−60, 40]
    // (s ∈ [−40, 60]); S = s ∈ [−40, 0], 40 mm. s0 = −40 is B's end (z = 40, B's top edge),
    // s1 = 0 is A's end (z = 0, A's bottom edge). A is slotted from z = 0 up to z = 20, B from
    // z = 40 down to z = 20: the two half slots add up to the 40 mm crossing.
    const a = piece('a-01', Y, 0, [[-50, 0, 0], [50, 0, 0], [50, 0, 100], [-50, 0, 100]]);
    const b = rectX('b-01', -50, 50, -60, 40);
    const js = jointsBetween(a, b, T3);
    expect(js).toHaveLength(1);
    const j = js[0];
    expect(j.kind).toBe('cross-lap');
    expect(j.length).toBeCloseTo(40, 6);
    const slotA = j.slots.find((s) => s.piece === 'a-01')!;
    const slotB = j.slots.find((s) => s.piece === 'b-01')!;
    expect(close(slotA.from, [0, 0, 20]) && close(slotA.to, [0, 0, 0])).toBe(true);
    expect(close(slotB.from, [0, 0, 40]) && close(slotB.to, [0, 0, 20])).toBe(true);
  });

  it('when a small tab passes through the middle of a big plate: through-slot in the plate', () => {
    // A: plate z = 0, x, y ∈ [−100, 100]. B: tab in x = 0, y ∈ [−10, 10], z ∈ [−20, 20].
    // L = y axis (d = z × x = y). A's chord y ∈ [−100, 100], B's (|z| ≤ 1.5) y ∈ [−10, 10];
    // S = [−10, 10], 20 mm, both ends B's only: B is inner. Both straddle. B's half z > 0 is the
    // rectangle y ∈ [−10, 10], z ∈ (0, 20]: moved straight along z (slope 0) every point lands in
    // [−10, 10] → through-slot, slot cut in A over the whole segment.
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), rectX('b-01', -10, 10, -20, 20), T3);
    expect(js).toHaveLength(1);
    expect(js[0].kind).toBe('through-slot');
    expect(js[0].length).toBeCloseTo(20, 6);
    expect(js[0].slots).toHaveLength(1);
    expect(js[0].slots[0].piece).toBe('a-01');
    expect(close(js[0].slots[0].from, [0, -10, 0]) && close(js[0].slots[0].to, [0, 10, 0])).toBe(true);
  });

  it('when the inner piece is a parallelogram slanted at 1/2, it passes along its slant: through-slot', () => {
    // B in x = 0 from (y, z): (−15, −20), (−5, −20), (15, 20), (5, 20); its sides are
    // y = −15 + (z + 20)/2 and y = −5 + (z + 20)/2, so at z = 0 it spans y ∈ [−5, 5], and within
    // the band |z| ≤ 1.5 (+0.001) it spans y ∈ [−5.7505, 5.7505] (chord, 11.501 mm). Straight
    // along z fails (the top corners (15, 20) fall outside), but moving along the slant,
    // s − k·w with k ∈ [(15 − 5.7505)/20, (5 + 5.7505)/20] = [0.4625, 0.5375] maps every point
    // of the upper half into the slot → through-slot.
    const b = inX('b-01', [[-15, -20], [-5, -20], [15, 20], [5, 20]]);
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), b, T3);
    expect(js).toHaveLength(1);
    expect(js[0].kind).toBe('through-slot');
    expect(js[0].length).toBeCloseTo(11.501, 6);
  });

  it('when the inner piece is wider than the slot on both sides (flanged waist): locked-crossing', () => {
    // B in x = 0: waist y ∈ [−5, 5] for z ∈ [−10, 10], flanges y ∈ [−15, 15] for 10 ≤ |z| ≤ 20.
    // Chord (|z| ≤ 1.5) y ∈ [−5, 5], inside the plate's [−100, 100]; B inner, both straddle.
    // Upper half: corner (15, 20) needs 15 − 20k ≤ 5 → k ≥ 0.5; corner (−15, 20) needs
    // −15 − 20k ≥ −5 → k ≤ −0.5: no k. Lower half the same by symmetry → locked-crossing.
    const b = inX('b-01', [[-15, -20], [15, -20], [15, -10], [5, -10], [5, 10], [15, 10], [15, 20], [-15, 20], [-15, 10], [-5, 10], [-5, -10], [-15, -10]]);
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), b, T3);
    expect(js).toHaveLength(1);
    expect(js[0].kind).toBe('locked-crossing');
    expect(js[0].slots).toEqual([]);
  });

  it('when a ring crosses a plate, each half of the ring spans both rims: two locked-crossings', () => {
    // B: square ring in x = 0, outer y, z ∈ [−20, 20], hole y, z ∈ [−10, 10]. Its chord is
    // y ∈ [−20, −10] ∪ [10, 20]: two 10 mm segments, each inside the plate's chord. The upper
    // half-ring is one region bordering L on both rims, so it cannot go through one rim's slot;
    // same below → both segments are locked-crossing.
    const b = inX('b-01', [[-20, -20], [20, -20], [20, 20], [-20, 20]], [[[-10, -10], [-10, 10], [10, 10], [10, -10]]]);
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), b, T3);
    expect(js.map((j) => j.kind)).toEqual(['locked-crossing', 'locked-crossing']);
    expect(js.map((j) => j.length)).toEqual([10, 10]);
  });

  it('when an H stands in a plate with only its two legs crossing: each leg passes its own slot', () => {
    // B: H in x = 0, legs y ∈ [−20, −10] and [10, 20] for z ∈ [−20, 20], crossbar y ∈ [−10, 10]
    // for z ∈ [−15, −5], so L (z = 0) cuts only the legs: chord [−20, −10] ∪ [10, 20].
    // Upper side: each leg top is its own region, bordering L only in its own slot; straight
    // along z it stays in the slot → two through-slots. (The lower side, joined by the crossbar,
    // would fail; one side suffices.)
    const b = inX('b-01', [[-20, -20], [-10, -20], [-10, -15], [10, -15], [10, -20], [20, -20], [20, 20], [10, 20], [10, -5], [-10, -5], [-10, 20], [-20, 20]]);
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), b, T3);
    expect(js.map((j) => j.kind)).toEqual(['through-slot', 'through-slot']);
  });

  it('when two plates meet edge to edge along the line: corner', () => {
    // A: z = 0, x ∈ [0, 100], y ∈ [0, 50] (edge x = 0 on L); B: x = 0, y ∈ [0, 50], z ∈ [0, 80]
    // (edge z = 0 on L). Chords both y ∈ [0, 50]; each stays on one side of the other plane →
    // corner, 50 mm, no slots.
    const js = jointsBetween(inZ('a-01', 0, 100, 0, 50), rectX('b-01', 0, 50, 0, 80), T3);
    expect(js).toHaveLength(1);
    expect(js[0].kind).toBe('corner');
    expect(js[0].length).toBeCloseTo(50, 6);
    expect(js[0].slots).toEqual([]);
  });

  it('when an edge stands on a face: mortise-and-tenon, tenon on the standing piece', () => {
    // A: plate z = 0, x, y ∈ [−100, 100]; B: x = 0, y ∈ [−20, 20], z ∈ [0, 60]. B's chord
    // y ∈ [−20, 20] inside A's; A straddles, B is on its boundary → mortise-and-tenon with the
    // tenon on B and the mortise (slot) in A over [−20, 20].
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), rectX('b-01', -20, 20, 0, 60), T3);
    expect(js).toHaveLength(1);
    expect(js[0].kind).toBe('mortise-and-tenon');
    expect(js[0].tenon).toBe('b-01');
    expect(js[0].length).toBeCloseTo(40, 6);
    expect(js[0].slots.map((s) => s.piece)).toEqual(['a-01']);
  });

  it('when the standing edge rests on the plate face (t/2 away) it still reaches; 0.1 mm further it does not', () => {
    // The face of a 3 mm plate is 1.5 mm from its mid-surface: an edge at z = 1.5 is within
    // reach, at z = 1.6 it is not.
    const plate = inZ('a-01', -100, 100, -100, 100);
    expect(jointsBetween(plate, rectX('b-01', -20, 20, 1.5, 60), T3).map((j) => j.kind)).toEqual(['mortise-and-tenon']);
    expect(jointsBetween(plate, rectX('b-01', -20, 20, 1.6, 60), T3)).toEqual([]);
  });

  it('when the planes meet at 60°: a joint that is not orthogonal', () => {
    // B: normal (sin 60°, 0, cos 60°) through the centre; its frame u is the y axis, so the
    // square x, y ∈ [−20, 20] of its frame crosses L (the y axis) over y ∈ [−20, 20].
    // θ = acos(|nA·nB|) = acos(0.5) = 60°. B's chord lies inside the plate's and it passes
    // straight through → through-slot, 40 mm, orthogonal false.
    const nB: Vec3 = [Math.sin(Math.PI / 3), 0, Math.cos(Math.PI / 3)];
    const f = planeFrame(nB, 0);
    const b: Piece = { ...inZ('b-01', 0, 1, 0, 1), frame: f, polygon: { outer: [[-20, -20], [20, -20], [20, 20], [-20, 20]], holes: [] } };
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), b, T3);
    expect(js).toHaveLength(1);
    expect(js[0].angleDeg).toBeCloseTo(60, 6);
    expect(js[0].orthogonal).toBe(false);
    expect(js[0].length).toBeCloseTo(40, 6);
  });

  it('when the angle is 89.6° it is orthogonal at the default 0.5° and not at 0.3°', () => {
    const tilt = (0.4 * Math.PI) / 180;
    const f = planeFrame([Math.cos(tilt), 0, Math.sin(tilt)], 0);
    const b: Piece = { ...inZ('b-01', 0, 1, 0, 1), frame: f, polygon: { outer: [[-20, -20], [20, -20], [20, 20], [-20, 20]], holes: [] } };
    const plate = inZ('a-01', -100, 100, -100, 100);
    const [j] = jointsBetween(plate, b, T3);
    expect(j.angleDeg).toBeCloseTo(89.6, 6);
    expect(j.orthogonal).toBe(true);
    expect(jointsBetween(plate, b, { thickness: 3, angleToleranceDeg: 0.3 })[0].orthogonal).toBe(false);
  });

  it('when a concave piece meets the line twice: two joints', () => {
    // B: an upside-down U in x = 0 whose legs y ∈ [−30, −20] and [20, 30] stand on the plate at
    // z = 0; the bridge is at z ∈ [30, 50]. Chord: [−30, −20] ∪ [20, 30] → two 10 mm
    // mortise-and-tenon joints, tenon on B.
    const b = inX('b-01', [[-30, 0], [-20, 0], [-20, 30], [20, 30], [20, 0], [30, 0], [30, 50], [-30, 50]]);
    const js = jointsBetween(inZ('a-01', -100, 100, -100, 100), b, T3);
    expect(js.map((j) => [j.kind, j.length, j.tenon])).toEqual([
      ['mortise-and-tenon', 10, 'b-01'],
      ['mortise-and-tenon', 10, 'b-01'],
    ]);
  });

  it('when the common segment is 0.05 mm there is no joint; at 0.2 mm there is', () => {
    // A: z = 0, y ∈ [0, 100]; B: x = 0, y ∈ [−50, 0.05]: chords overlap on [0, 0.05], which is
    // not longer than 0.1 mm. With B reaching y = 0.2 the overlap is 0.2 mm → one joint.
    const plate = inZ('a-01', -100, 100, 0, 100);
    expect(jointsBetween(plate, rectX('b-01', -50, 0.05, -20, 20), T3)).toEqual([]);
    const js = jointsBetween(plate, rectX('b-01', -50, 0.2, -20, 20), T3);
    expect(js).toHaveLength(1);
    expect(js[0].length).toBeCloseTo(0.2, 6);
  });

  it('when the chords touch at a single point there is no joint', () => {
    // A's chord y ∈ [0, 100], B's y ∈ [−50, 0]: S = {0}.
    expect(jointsBetween(inZ('a-01', -100, 100, 0, 100), rectX('b-01', -50, 0, -20, 20), T3)).toEqual([]);
  });

  it('when the planes are parallel there is no joint, even when they overlap', () => {
    const a = inZ('a-01', -10, 10, -10, 10);
    const b = { ...inZ('b-01', -10, 10, -10, 10), frame: planeFrame(Z, 1) };
    expect(jointsBetween(a, b, T3)).toEqual([]);
  });

  it('when a piece stops short of the other plane there is no joint', () => {
    expect(jointsBetween(inZ('a-01', -100, 100, -100, 100), rectX('b-01', -20, 20, 5, 60), T3)).toEqual([]);
  });

  it('does not depend on which piece comes first, apart from naming', () => {
    const a = inZ('a-01', -100, 100, -100, 100), b = rectX('b-01', -20, 20, 0, 60);
    const ab = jointsBetween(a, b, T3), ba = jointsBetween(b, a, T3);
    expect(ba.map((j) => [j.kind, j.length, j.tenon])).toEqual(ab.map((j) => [j.kind, j.length, j.tenon]));
  });

  it('rejects a thickness that is not positive', () => {
    expect(() => jointContext({ thickness: 0 })).toThrow(RangeError);
  });
});

describe('pairJoints', () => {
  it('appends to the output list and returns the count', () => {
    const out: import('../../shared/engine/model.js').Joint[] = [];
    const ctx = jointContext(T3);
    const n = pairJoints(preparePiece(inZ('a-01', -100, 100, -100, 100)), preparePiece(rectX('b-01', -20, 20, 0, 60)), ctx, out);
    expect(n).toBe(1);
    expect(out).toHaveLength(1);
  });
});

describe('findJoints', () => {
  it('finds the same joints as testing every pair, on a random scatter of plates', () => {
    // A pseudo-random scatter of axis-aligned plates; the grid pruning must lose no pair.
    let seed = 7;
    const rnd = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const pieces: Piece[] = [];
    for (let i = 0; i < 60; i++) {
      const axis = [X, Y, Z][i % 3];
      const off = Math.round(rnd() * 200 - 100);
      const c = [rnd() * 200 - 100, rnd() * 200 - 100];
      const w = 10 + rnd() * 60, h = 10 + rnd() * 60;
      const frame = planeFrame(axis, off);
      pieces.push({
        id: `p-${String(i).padStart(2, '0')}`, motif: 'p', family: 'f', plane: i, frame,
        polygon: { outer: [[c[0] - w, c[1] - h], [c[0] + w, c[1] - h], [c[0] + w, c[1] + h], [c[0] - w, c[1] + h]], holes: [] },
        elements: [0], map: [1, 0, 0, 1], template: 0,
      });
    }
    const fast = findJoints(pieces, T3);
    const brute: string[] = [];
    for (let i = 0; i < pieces.length; i++)
      for (let j = i + 1; j < pieces.length; j++)
        for (const jt of jointsBetween(pieces[i], pieces[j], T3)) brute.push(`${jt.a}|${jt.b}|${jt.kind}|${jt.length}`);
    expect(fast.length).toBeGreaterThan(10);
    expect(fast.map((jt) => `${jt.a}|${jt.b}|${jt.kind}|${jt.length}`)).toEqual(brute);
  });

  it('when planes meet at 20°, grows the pruning boxes enough to keep a contact the reach rule makes', () => {
    // A: z = 0, x ∈ [−50, −3]; B: through the y axis at 20° to A (normal (−sin 20°, 0, cos 20°)),
    // covering in-plane distances w ∈ [3, 50] from the y axis on the +x side, y ∈ [−10, 10].
    // Each edge is 3 · sin 20° = 1.03 mm from the other plane (< t/2 = 1.5): both reach L over
    // y ∈ [−10, 10]. Their boxes grown by t/2 do not overlap (A ends at x = −1.5, B starts at
    // x = 3 cos 20° − 1.5 = 1.32), so a pad of t/2 alone would lose this 20 mm contact; the pad
    // t / (2 sin 20°) = 4.39 mm keeps it.
    const a = inZ('a-01', -50, -3, -10, 10);
    const s20 = Math.sin((20 * Math.PI) / 180), c20 = Math.cos((20 * Math.PI) / 180);
    const w = (d: number, y: number): Vec3 => [d * c20, y, d * s20];
    const b = piece('b-01', [-s20, 0, c20], 0, [w(3, -10), w(50, -10), w(50, 10), w(3, 10)]);
    const found = findJoints([a, b], T3);
    expect(found).toHaveLength(1);
    expect(found[0].angleDeg).toBeCloseTo(20, 6);
    expect(found[0].length).toBeCloseTo(20, 6);
    expect(contactPad([a, b], 1.5)).toBeCloseTo(1.5 / s20 + 0.001, 9);
  });

  it('is empty for fewer than two pieces', () => {
    expect(findJoints([], T3)).toEqual([]);
    expect(findJoints([inZ('a-01', 0, 1, 0, 1)], T3)).toEqual([]);
  });
});

describe('overlappingPairs', () => {
  it('finds exactly the overlapping pairs that testing every pair finds, sorted, skipping empty boxes', () => {
    let seed = 11;
    const rnd = (): number => ((seed = (seed * 16807) % 2147483647) / 2147483647);
    const n = 300;
    const boxes = new Float64Array(n * 6);
    for (let i = 0; i < n; i++) {
      for (let k = 0; k < 3; k++) {
        const lo = rnd() * 500, size = rnd() * 60;
        boxes[i * 6 + k] = lo;
        boxes[i * 6 + 3 + k] = lo + size;
      }
    }
    boxes[6 * 7 + 3] = boxes[6 * 7] - 1; // inverted: pairs with nothing
    const fast = Array.from(overlappingPairs(boxes));
    const brute = Array.from(overlappingPairsBrute(boxes));
    expect(brute.length).toBeGreaterThan(100);
    expect(fast).toEqual(brute);
    expect(fast.some((v, k) => k % 2 === 0 && (v === 7 || fast[k + 1] === 7))).toBe(false);
  });
});
