// The rotation groups checked against published values. Sources (REFERENCES.md "Rotation groups"):
// International Tables for Crystallography Vol. A, ch. 10.1; H.S.M. Coxeter, Regular Polytopes
// (3rd ed. 1973); Wikipedia "Icosahedral symmetry", "Octahedral symmetry", "Tetrahedral symmetry".
// Rotations are also compared with three.js (an independent implementation from the registry).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as THREE from 'three';
import { AxisFoldError, GroupNameError, canonicalNormal, folds, getGroup, parseGroupName } from '../../shared/engine/groups.js';
import { type Mat3, apply, determinant, maxDifference, multiply, rotation, transpose } from '../../shared/engine/mat3.js';
import type { Vec3 } from '../../shared/engine/vec.js';
import { PHI, cyclic, expectClose, signs } from './support.js';

const countBy = (xs: readonly number[]) => {
  const m: Record<number, number> = {};
  for (const x of xs) m[x] = (m[x] ?? 0) + 1;
  return m;
};

/** Row-major 3×3 of a three.js Matrix4 (which stores column-major). */
function fromThree(m: THREE.Matrix4): Mat3 {
  const e = m.elements;
  return [e[0], e[4], e[8], e[1], e[5], e[9], e[2], e[6], e[10]];
}

/** Angle in degrees between the lines along a and b (in [0°, 90°]). */
function lineAngleDeg(a: Vec3, b: Vec3): number {
  const c = Math.abs(a[0] * b[0] + a[1] * b[1] + a[2] * b[2]);
  const s = Math.hypot(a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]);
  return (Math.atan2(s, c) * 180) / Math.PI;
}

function distinctAngles(group: string, foldA: number, foldB: number): number[] {
  const g = getGroup(group);
  const as = g.axes.filter((a) => a.fold === foldA);
  const bs = g.axes.filter((a) => a.fold === foldB);
  const out: number[] = [];
  for (const a of as) {
    for (const b of bs) {
      if (a === b) continue;
      const t = lineAngleDeg(a.direction, b.direction);
      if (!out.some((x) => Math.abs(x - t) < 1e-6)) out.push(t);
    }
  }
  return out.sort((x, y) => x - y);
}

describe('getGroup', () => {
  describe('order (International Tables Vol. A ch. 10.1; Coxeter, Regular Polytopes)', () => {
    it.each([
      ['T', 12],
      ['O', 24],
      ['I', 60],
    ])('%s has order %i', (name, order) => {
      expect(getGroup(name).order).toBe(order);
      expect(getGroup(name).elements).toHaveLength(order);
    });

    it.each([1, 2, 3, 5, 6, 12, 120])('C%i has order n and D%i order 2n', (n) => {
      expect(getGroup(`C${n}`).order).toBe(n);
      if (n >= 2) expect(getGroup(`D${n}`).order).toBe(2 * n);
    });
  });

  describe('axes by fold (International Tables Vol. A ch. 10.1; Wikipedia symmetry articles)', () => {
    it.each([
      ['I', { 5: 6, 3: 10, 2: 15 }],
      ['O', { 4: 3, 3: 4, 2: 6 }],
      ['T', { 3: 4, 2: 3 }],
      ['D2', { 2: 3 }],
      ['D5', { 5: 1, 2: 5 }],
      ['D6', { 6: 1, 2: 6 }],
      ['C7', { 7: 1 }],
    ])('%s has axes %o', (name, expected) => {
      expect(countBy(getGroup(name).axes.map((a) => a.fold))).toEqual(expected);
    });

    it('C1 has no axis at all', () => {
      expect(getGroup('C1').axes).toEqual([]);
    });
  });

  describe('elements by order (same sources)', () => {
    it.each([
      ['I', { 1: 1, 5: 24, 3: 20, 2: 15 }],
      ['O', { 1: 1, 4: 6, 3: 8, 2: 9 }],
      ['T', { 1: 1, 3: 8, 2: 3 }],
    ])('%s has elements %o', (name, expected) => {
      expect(countBy(getGroup(name).elements.map((e) => e.order))).toEqual(expected);
    });
  });

  describe('canonical orientation (FORMAT.md §1)', () => {
    it('I has its 5-fold axes through (0, ±1, ±φ) and cyclic permutations, 3-fold through (±1, ±1, ±1), 2-fold along x, y, z', () => {
      const g = getGroup('I');
      const hasAxis = (fold: number, d: Vec3) => g.axes.some((a) => a.fold === fold && lineAngleDeg(a.direction, d) < 1e-6);
      for (const p of cyclic([0, 1, PHI])) for (const s of signs(p)) expect(hasAxis(5, s)).toBe(true);
      for (const s of signs([1, 1, 1])) expect(hasAxis(3, s)).toBe(true);
      for (const d of [[1, 0, 0], [0, 1, 0], [0, 0, 1]] as Vec3[]) expect(hasAxis(2, d)).toBe(true);
    });

    it('O has 4-fold coordinate axes and 2-fold axes through (±1, ±1, 0); D<n> has x as a 2-fold axis and z as main axis', () => {
      const o = getGroup('O');
      for (const d of [[1, 0, 0], [0, 1, 0], [0, 0, 1]] as Vec3[]) expect(o.axes.some((a) => a.fold === 4 && lineAngleDeg(a.direction, d) < 1e-6)).toBe(true);
      expect(o.axes.some((a) => a.fold === 2 && lineAngleDeg(a.direction, [1, -1, 0]) < 1e-6)).toBe(true);
      const d7 = getGroup('D7');
      expect(d7.axes.some((a) => a.fold === 7 && lineAngleDeg(a.direction, [0, 0, 1]) < 1e-6)).toBe(true);
      expect(d7.axes.some((a) => a.fold === 2 && lineAngleDeg(a.direction, [1, 0, 0]) < 1e-6)).toBe(true);
    });
  });

  describe('angles between axes (REFERENCES.md list; Coxeter, Regular Polytopes; Wikipedia "Icosahedral symmetry")', () => {
    it('every two 5-fold axes of I meet at 63.4349488° (arctan 2)', () => {
      const a = distinctAngles('I', 5, 5);
      expect(a).toHaveLength(1);
      expectClose(a[0], 63.4349488, 1e-6, '5–5');
      expectClose(a[0], (Math.atan(2) * 180) / Math.PI, 1e-9, '5–5 = arctan 2');
    });

    it('3-fold axes of I meet at 41.8103149° and 70.5287794°', () => {
      const a = distinctAngles('I', 3, 3);
      expect(a).toHaveLength(2);
      expectClose(a[0], 41.8103149, 1e-6, '3–3 small');
      expectClose(a[1], 70.5287794, 1e-6, '3–3 large');
    });

    it('2-fold axes of I meet at 36°, 60°, 72° and 90°', () => {
      const a = distinctAngles('I', 2, 2);
      expect(a).toHaveLength(4);
      [36, 60, 72, 90].forEach((x, k) => expectClose(a[k], x, 1e-6, `2–2 #${k}`));
    });

    it.each([
      ['I', 5, 3, 37.3773681],
      ['I', 5, 2, 31.7174744],
      ['I', 3, 2, 20.9051574],
      ['O', 4, 3, 54.7356103],
      ['O', 4, 2, 45],
      ['O', 3, 2, 35.2643897],
    ])('in %s the nearest %i-fold and %i-fold axes are %f° apart', (g, a, b, deg) => {
      expectClose(distinctAngles(g, a, b)[0], deg, 1e-6, `${a}–${b}`);
    });
  });

  describe('elements', () => {
    it.each(['T', 'O', 'I', 'D5', 'C6'])('every element of %s is a proper rotation (RᵀR = I, det 1)', (name) => {
      for (const e of getGroup(name).elements) {
        expect(maxDifference(multiply(transpose(e.matrix), e.matrix), [1, 0, 0, 0, 1, 0, 0, 0, 1])).toBeLessThan(1e-12);
        expectClose(determinant(e.matrix), 1, 1e-12, 'det');
      }
    });

    it.each(['T', 'O', 'I', 'D6'])('each element of %s is the three.js rotation about its axis by its angle (up to the sense of the axis)', (name) => {
      for (const e of getGroup(name).elements) {
        if (!e.axis) continue;
        const axis = new THREE.Vector3(...e.axis);
        const plus = fromThree(new THREE.Matrix4().makeRotationAxis(axis, e.angle));
        const minus = fromThree(new THREE.Matrix4().makeRotationAxis(axis, -e.angle));
        expect(Math.min(maxDifference(plus, e.matrix), maxDifference(minus, e.matrix))).toBeLessThan(1e-9);
      }
    });

    it('the angle of an element of order k is 2πj/k with j and k coprime', () => {
      const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
      for (const e of getGroup('I').elements) {
        if (!e.axis) continue;
        const j = (e.angle * e.order) / (2 * Math.PI);
        expectClose(j, Math.round(j), 1e-9, 'j');
        expect(gcd(Math.round(j), e.order)).toBe(1);
      }
    });

    it.each(['T', 'O', 'I', 'D4', 'D9', 'C5'])('closure: the product of any two elements of %s is an element', (name) => {
      const g = getGroup(name);
      fc.assert(
        fc.property(fc.nat(g.order - 1), fc.nat(g.order - 1), (i, j) => {
          const p = multiply(g.elements[i].matrix, g.elements[j].matrix);
          return g.elements.some((e) => maxDifference(e.matrix, p) < 1e-9);
        }),
        { numRuns: 200 },
      );
    });
  });
});

describe('rotation (mat3) against three.js', () => {
  const axisArb = fc
    .tuple(fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }), fc.double({ min: -1, max: 1, noNaN: true }))
    .filter(([x, y, z]) => Math.hypot(x, y, z) > 1e-3);
  const angleArb = fc.double({ min: -2 * Math.PI, max: 2 * Math.PI, noNaN: true });

  it('matches Matrix4.makeRotationAxis for random axes and angles', () => {
    fc.assert(
      fc.property(axisArb, angleArb, (axis, angle) => {
        const ours = rotation(axis, angle);
        const theirs = fromThree(new THREE.Matrix4().makeRotationAxis(new THREE.Vector3(...axis).normalize(), angle));
        return maxDifference(ours, theirs) < 1e-12;
      }),
    );
  });

  it('rotates vectors as Quaternion.setFromAxisAngle does', () => {
    fc.assert(
      fc.property(axisArb, angleArb, axisArb, (axis, angle, v) => {
        const q = new THREE.Quaternion().setFromAxisAngle(new THREE.Vector3(...axis).normalize(), angle);
        const w = new THREE.Vector3(...v).applyQuaternion(q);
        const ours = apply(rotation(axis, angle), v);
        return Math.abs(ours[0] - w.x) < 1e-12 && Math.abs(ours[1] - w.y) < 1e-12 && Math.abs(ours[2] - w.z) < 1e-12;
      }),
    );
  });

  it('is right-handed: a quarter turn about z takes x to y', () => {
    const r = apply(rotation([0, 0, 1], Math.PI / 2), [1, 0, 0]);
    expect(Math.hypot(r[0], r[1] - 1, r[2])).toBeLessThan(1e-15);
  });
});

describe('parseGroupName', () => {
  it.each(['', 'X', 'C0', 'D1', 'D0', 'c3', 'C3 ', 'C-2', 'C121', 'D2.5', 'Ih', 'C03'])('rejects %j with a message naming what is accepted', (name) => {
    expect(() => parseGroupName(name)).toThrow(GroupNameError);
  });

  it('accepts C1, C120, D2, T, O, I', () => {
    expect(parseGroupName('C1')).toEqual({ kind: 'C', n: 1 });
    expect(parseGroupName('C120')).toEqual({ kind: 'C', n: 120 });
    expect(parseGroupName('D2')).toEqual({ kind: 'D', n: 2 });
    for (const k of ['T', 'O', 'I']) expect(parseGroupName(k)).toEqual({ kind: k });
  });
});

describe('canonicalNormal', () => {
  it('gives the FORMAT.md §1 table normals', () => {
    const n = Math.hypot(1, PHI);
    const i5 = canonicalNormal(getGroup('I'), 5);
    expect(Math.hypot(i5[0], i5[1] - 1 / n, i5[2] - PHI / n)).toBeLessThan(1e-12);
    const o2 = canonicalNormal(getGroup('O'), 2);
    expect(Math.hypot(o2[0] - Math.SQRT1_2, o2[1] - Math.SQRT1_2, o2[2])).toBeLessThan(1e-12);
    expect(canonicalNormal(getGroup('D5'), 2)).toEqual([1, 0, 0]);
  });

  it('every canonical normal lies along an axis of that fold', () => {
    for (const name of ['I', 'O', 'T', 'D3', 'D8', 'C4']) {
      const g = getGroup(name);
      for (const f of folds(g)) {
        const n = canonicalNormal(g, f);
        expect(g.axes.some((a) => a.fold === f && lineAngleDeg(a.direction, n) < 1e-6), `${name} fold ${f}`).toBe(true);
      }
    }
  });

  it('rejects a fold the group lacks, naming the folds it has', () => {
    expect(() => canonicalNormal(getGroup('I'), 4)).toThrow(AxisFoldError);
    expect(() => canonicalNormal(getGroup('I'), 4)).toThrow(/5, 3, 2/);
    expect(() => canonicalNormal(getGroup('T'), 4)).toThrow(AxisFoldError);
    expect(() => canonicalNormal(getGroup('C5'), 2)).toThrow(AxisFoldError);
  });
});
