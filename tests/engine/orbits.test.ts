// Plane orbits checked against the face forms of the point groups: International Tables for
// Crystallography Vol. A, ch. 10.1 (Table 10.1.4.3 for the icosahedral groups); Wikipedia
// "Icosahedral symmetry", "Octahedral symmetry", "Tetrahedral symmetry" (REFERENCES.md
// "Rotation groups", last column). The property tests check invariants every orbit must keep
// (orbit–stabiliser theorem; the motif lands on the plane the element sends it to).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalNormal, getGroup } from '../../shared/engine/groups.js';
import { apply } from '../../shared/engine/mat3.js';
import { toWorld } from '../../shared/engine/frames.js';
import { applyMat2, planeOrbit } from '../../shared/engine/orbits.js';
import type { Vec3 } from '../../shared/engine/vec.js';

const OFFSET = 80;
/** A direction fixed by no rotation of T, O, I, D<n> or C<n> in the canonical orientation. */
const GENERIC: Vec3 = [0.2134, 0.5378, 0.8163];

const size = (group: string, normal: Vec3, offset = OFFSET) => planeOrbit(getGroup(group), normal, offset).planes.length;
const bySize = (group: string, fold: number) => size(group, canonicalNormal(getGroup(group), fold));

describe('planeOrbit', () => {
  describe('orbit sizes at a non-zero offset (International Tables Vol. A ch. 10.1)', () => {
    it('T: ⟂3-fold 4, ⟂2-fold 6, generic 12', () => {
      expect(bySize('T', 3)).toBe(4);
      expect(bySize('T', 2)).toBe(6);
      expect(size('T', GENERIC)).toBe(12);
    });

    it('T: the opposite normals of the ⟂3-fold planes are a second orbit of 4, disjoint from the first', () => {
      const g = getGroup('T');
      const n = canonicalNormal(g, 3);
      const a = planeOrbit(g, n, OFFSET).planes.map((p) => p.frame.normal);
      const b = planeOrbit(g, [-n[0], -n[1], -n[2]], OFFSET).planes.map((p) => p.frame.normal);
      expect(b).toHaveLength(4);
      for (const p of a) for (const q of b) expect(Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2])).toBeGreaterThan(0.1);
    });

    it('O: 6, 8, 12; generic 24', () => {
      expect([bySize('O', 4), bySize('O', 3), bySize('O', 2), size('O', GENERIC)]).toEqual([6, 8, 12, 24]);
    });

    it('I: 12, 20, 30; generic 60', () => {
      expect([bySize('I', 5), bySize('I', 3), bySize('I', 2), size('I', GENERIC)]).toEqual([12, 20, 30, 60]);
    });

    it.each([1, 2, 3, 7, 12])('C%i: ⟂axis 1, generic n', (n) => {
      expect(size(`C${n}`, [0, 0, 1])).toBe(1);
      expect(size(`C${n}`, GENERIC)).toBe(n);
    });

    it.each([3, 4, 5, 6, 9])('D%i: ⟂main axis 2, ⟂2-fold axis n, generic 2n', (n) => {
      expect(bySize(`D${n}`, n)).toBe(2);
      expect(bySize(`D${n}`, 2)).toBe(n);
      expect(size(`D${n}`, GENERIC)).toBe(2 * n);
    });
  });

  describe('when the offset is 0 (FORMAT.md §2: n and −n are one plane)', () => {
    it('the six cube planes of O become three planes through the centre, half the images flipped', () => {
      const orbit = planeOrbit(getGroup('O'), [0, 0, 1], 0);
      expect(orbit.planes).toHaveLength(3);
      expect(orbit.images.filter((im) => im.flips)).toHaveLength(12);
    });

    it('T keeps 4 planes for a 3-fold normal, because −n is not in the orbit of n', () => {
      expect(planeOrbit(getGroup('T'), [1, 1, 1], 0).planes).toHaveLength(4);
    });
  });

  const groupArb = fc.constantFrom('T', 'O', 'I', 'C1', 'C5', 'D2', 'D3', 'D6', 'D10');
  const normalArb = fc
    .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }))
    .filter(([x, y, z]) => Math.hypot(x, y, z) > 1e-2);
  // Include the special directions (axes) as well as random ones.
  const directionArb = fc.oneof(
    normalArb,
    groupArb.chain((g) => fc.constantFrom(...getGroup(g).axes.map((a) => a.direction).concat([GENERIC]))),
  );
  const offsetArb = fc.oneof(fc.constant(0), fc.double({ min: 1, max: 500, noNaN: true }));

  it('orbit size divides the group order, and stabiliser size × orbit size = order', () => {
    fc.assert(
      fc.property(groupArb, directionArb, offsetArb, (name, normal, offset) => {
        const g = getGroup(name);
        const orbit = planeOrbit(g, normal, offset);
        return g.order % orbit.planes.length === 0 && orbit.stabiliser.length * orbit.planes.length === g.order;
      }),
      { numRuns: 300 },
    );
  });

  it('each image puts the motif where the group element sends it', () => {
    fc.assert(
      fc.property(groupArb, normalArb, offsetArb, fc.tuple(fc.double({ min: -100, max: 100, noNaN: true }), fc.double({ min: -100, max: 100, noNaN: true })), (name, normal, offset, p) => {
        const g = getGroup(name);
        const orbit = planeOrbit(g, normal, offset);
        const rep = orbit.planes[0].frame;
        return orbit.images.every((im) => {
          const expected = apply(g.elements[im.element].matrix, toWorld(rep, p));
          const got = toWorld(orbit.planes[im.plane].frame, applyMat2(im.map, p));
          // Normals within planeOrbit's direction tolerance (1e-7 per component) are one plane, so a
          // normal that close to an axis lands on the stored plane, off by at most that angle.
          const reach = offset + Math.hypot(p[0], p[1]);
          return Math.hypot(expected[0] - got[0], expected[1] - got[1], expected[2] - got[2]) < 1e-9 * (1 + offset) + 2e-7 * reach;
        });
      }),
      { numRuns: 100 },
    );
  });

  it('every image map is orthogonal, reversing orientation exactly when it flips', () => {
    const orbit = planeOrbit(getGroup('I'), [1, 1, 1], 0);
    for (const im of orbit.images) {
      const [a, b, c, d] = im.map;
      expect(Math.abs(a * a + c * c - 1)).toBeLessThan(1e-12);
      expect(Math.abs(a * b + c * d)).toBeLessThan(1e-12);
      expect(Math.sign(a * d - b * c)).toBe(im.flips ? -1 : 1);
    }
  });

  it('the stabiliser of a 5-fold plane of I is the cyclic group of 5 rotations about that axis', () => {
    const g = getGroup('I');
    const n = canonicalNormal(g, 5);
    const orbit = planeOrbit(g, n, OFFSET);
    expect(orbit.stabiliser).toHaveLength(5);
    for (const k of orbit.stabiliser) {
      const m = apply(g.elements[k].matrix, n);
      expect(Math.hypot(m[0] - n[0], m[1] - n[1], m[2] - n[2])).toBeLessThan(1e-12);
    }
  });
});
