/**
 * The one place where the engine's tolerances live (FORMAT.md §1 "Tolerance").
 *
 * Lengths are millimetres; two points closer than {@link LENGTH_TOL} are one point.
 * Angles are radians inside the engine; {@link ANGLE_TOL} is the default comparison.
 */

/** Lengths closer than this (mm) are equal; edges and faces smaller than this vanish. */
export const LENGTH_TOL = 1e-3;

/** Angles closer than this (radians) are equal, unless a constraint sets a coarser tolerance. */
export const ANGLE_TOL = 1e-6;

/** Tolerance for comparing unit vectors and rotation matrices entry by entry (dimensionless). */
export const UNIT_TOL = 1e-9;

/** Shortest joint segment that counts as a joint (mm), FORMAT.md §3. */
export const MIN_JOINT_SEGMENT = 0.1;

/** Absolute comparison: |a − b| ≤ tol. */
export function equals(a: number, b: number, tol: number = LENGTH_TOL): boolean {
  return Math.abs(a - b) <= tol;
}

/** Exact comparison, spelled out so a reader sees it is meant. */
export function exactEquals(a: number, b: number): boolean {
  return a === b;
}

/**
 * Relative comparison for values whose scale varies: |a − b| ≤ tol · max(1, |a|, |b|).
 * Below magnitude 1 it degrades to an absolute comparison, so zero compares sanely.
 */
export function relEquals(a: number, b: number, tol: number = UNIT_TOL): boolean {
  return Math.abs(a - b) <= tol * Math.max(1, Math.abs(a), Math.abs(b));
}

export const DEG = Math.PI / 180;

/** Radians to degrees, for the edges of the engine (reports and command line). */
export function toDegrees(rad: number): number {
  return rad / DEG;
}

/** Degrees to radians. */
export function toRadians(deg: number): number {
  return deg * DEG;
}
