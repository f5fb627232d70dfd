/**
 * Small 3-D and 2-D vector helpers on plain tuples. Pure; every function returns a new tuple.
 * Hot loops elsewhere inline these on numbers instead of allocating.
 */
import { UNIT_TOL } from './tolerance.js';

export type Vec3 = readonly [number, number, number];
export type Vec2 = readonly [number, number];

export const add = (a: Vec3, b: Vec3): Vec3 => [a[0] + b[0], a[1] + b[1], a[2] + b[2]];
export const sub = (a: Vec3, b: Vec3): Vec3 => [a[0] - b[0], a[1] - b[1], a[2] - b[2]];
export const scale = (a: Vec3, s: number): Vec3 => [a[0] * s, a[1] * s, a[2] * s];
export const dot = (a: Vec3, b: Vec3): number => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
export const cross = (a: Vec3, b: Vec3): Vec3 => [
  a[1] * b[2] - a[2] * b[1],
  a[2] * b[0] - a[0] * b[2],
  a[0] * b[1] - a[1] * b[0],
];
export const norm = (a: Vec3): number => Math.hypot(a[0], a[1], a[2]);
export const dist = (a: Vec3, b: Vec3): number => Math.hypot(a[0] - b[0], a[1] - b[1], a[2] - b[2]);
/** Adds s·b to a. */
export const addScaled = (a: Vec3, b: Vec3, s: number): Vec3 => [a[0] + b[0] * s, a[1] + b[1] * s, a[2] + b[2] * s];

/**
 * Unit vector along a. Throws on a zero (or non-finite) vector: callers validate input
 * at the edge, so reaching this with one is a programming error.
 */
export function normalize(a: Vec3): Vec3 {
  const n = norm(a);
  if (!(n > 0) || !Number.isFinite(n)) throw new RangeError('cannot normalise a zero or non-finite vector');
  return [a[0] / n, a[1] / n, a[2] / n];
}

/** True when the unit vectors a and b are the same direction within `tol` per component. */
export function sameDirection(a: Vec3, b: Vec3, tol: number = UNIT_TOL * 1e3): boolean {
  return Math.abs(a[0] - b[0]) <= tol && Math.abs(a[1] - b[1]) <= tol && Math.abs(a[2] - b[2]) <= tol;
}

/** True when the unit vectors a and b lie on one line (a = ±b). */
export function sameLine(a: Vec3, b: Vec3, tol: number = UNIT_TOL * 1e3): boolean {
  return sameDirection(a, b, tol) || sameDirection(a, scale(b, -1), tol);
}

/**
 * The representative of the line through a with a fixed sign: the first component whose
 * magnitude exceeds `tol` is positive. Used to name axes and offset-0 planes stably.
 */
export function canonicalSign(a: Vec3, tol = 1e-9): Vec3 {
  for (let i = 0; i < 3; i++) {
    if (Math.abs(a[i]) > tol) return a[i] > 0 ? a : scale(a, -1);
  }
  return a;
}

/** Angle between two vectors in radians, in [0, π], robust near 0 and π (atan2 form). */
export function angleBetween(a: Vec3, b: Vec3): number {
  return Math.atan2(norm(cross(a, b)), dot(a, b));
}

export const add2 = (a: Vec2, b: Vec2): Vec2 => [a[0] + b[0], a[1] + b[1]];
export const sub2 = (a: Vec2, b: Vec2): Vec2 => [a[0] - b[0], a[1] - b[1]];
export const dot2 = (a: Vec2, b: Vec2): number => a[0] * b[0] + a[1] * b[1];
export const cross2 = (a: Vec2, b: Vec2): number => a[0] * b[1] - a[1] * b[0];
export const dist2 = (a: Vec2, b: Vec2): number => Math.hypot(a[0] - b[0], a[1] - b[1]);
