// Helpers shared by the engine tests: tolerance comparisons that say what differed, and a few
// outside-source constructions (vertex lists of named solids) used by more than one file.
import { expect } from 'vitest';
import type { Vec3 } from '../../shared/engine/vec.js';

/** Asserts |actual − expected| ≤ tol, with both numbers and the tolerance in the message. */
export function expectClose(actual: number, expected: number, tol = 1e-9, what = 'value'): void {
  const ok = Number.isFinite(actual) && Math.abs(actual - expected) <= tol;
  expect(ok, `${what}: expected ${expected} ± ${tol}, got ${actual}`).toBe(true);
}

/** Asserts two vectors agree component by component within tol. */
export function expectVecClose(actual: readonly number[], expected: readonly number[], tol = 1e-9, what = 'vector'): void {
  expect(actual.length, `${what}: length`).toBe(expected.length);
  const worst = Math.max(...actual.map((a, k) => Math.abs(a - expected[k])));
  expect(worst <= tol, `${what}: expected [${expected.join(', ')}] ± ${tol}, got [${actual.join(', ')}]`).toBe(true);
}

/** Asserts two unordered point sets are the same within tol (each point of one has a partner in the other). */
export function expectSamePointSet(actual: readonly Vec3[], expected: readonly Vec3[], tol = 1e-6, what = 'points'): void {
  expect(actual.length, `${what}: count`).toBe(expected.length);
  const used = new Set<number>();
  for (const p of expected) {
    const k = actual.findIndex((q, i) => !used.has(i) && Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) <= tol);
    expect(k >= 0, `${what}: no point near [${p.join(', ')}]`).toBe(true);
    used.add(k);
  }
}

/** φ = (1 + √5) / 2, written out here so tests do not take it from the code under test. */
export const PHI = (1 + Math.sqrt(5)) / 2;

/** Every sign combination of the non-zero entries of p. */
export function signs(p: Vec3): Vec3[] {
  const out: Vec3[] = [[p[0], p[1], p[2]]];
  for (let k = 0; k < 3; k++) {
    if (p[k] === 0) continue;
    for (const q of [...out]) {
      const r: [number, number, number] = [q[0], q[1], q[2]];
      r[k] = -r[k];
      out.push(r);
    }
  }
  return out;
}

/** The three cyclic permutations (even permutations) of p. */
export function cyclic(p: Vec3): Vec3[] {
  return [
    [p[0], p[1], p[2]],
    [p[2], p[0], p[1]],
    [p[1], p[2], p[0]],
  ];
}

/** All sign changes of all cyclic permutations of each generator, deduplicated. */
export function evenPermsWithSigns(...gens: Vec3[]): Vec3[] {
  const out: Vec3[] = [];
  for (const g of gens) {
    for (const c of cyclic(g)) {
      for (const s of signs(c)) if (!out.some((q) => Math.hypot(q[0] - s[0], q[1] - s[1], q[2] - s[2]) < 1e-12)) out.push(s);
    }
  }
  return out;
}

/** Largest x·n̂ over the points: the offset of the supporting plane with unit normal n̂. */
export function supportOffset(points: readonly Vec3[], n: Vec3): number {
  const len = Math.hypot(...n);
  return Math.max(...points.map((p) => (p[0] * n[0] + p[1] * n[1] + p[2] * n[2]) / len));
}

/**
 * fast-check options for expensive properties: a failing property may shrink for a long time,
 * so cap each run (generation plus shrinking) and report the interruption as a failure.
 */
export const PROPERTY_LIMITS = { interruptAfterTimeLimit: 60_000, markInterruptAsFailure: true } as const;
