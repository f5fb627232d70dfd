/**
 * 3 × 3 rotation matrices, row-major in a flat tuple of nine numbers.
 */
import { type Vec3, normalize } from './vec.js';

export type Mat3 = readonly [number, number, number, number, number, number, number, number, number];

export const IDENTITY: Mat3 = [1, 0, 0, 0, 1, 0, 0, 0, 1];

/** Product a · b (apply b first, then a). */
export function multiply(a: Mat3, b: Mat3): Mat3 {
  return [
    a[0] * b[0] + a[1] * b[3] + a[2] * b[6], a[0] * b[1] + a[1] * b[4] + a[2] * b[7], a[0] * b[2] + a[1] * b[5] + a[2] * b[8],
    a[3] * b[0] + a[4] * b[3] + a[5] * b[6], a[3] * b[1] + a[4] * b[4] + a[5] * b[7], a[3] * b[2] + a[4] * b[5] + a[5] * b[8],
    a[6] * b[0] + a[7] * b[3] + a[8] * b[6], a[6] * b[1] + a[7] * b[4] + a[8] * b[7], a[6] * b[2] + a[7] * b[5] + a[8] * b[8],
  ];
}

/** m · v. */
export function apply(m: Mat3, v: Vec3): Vec3 {
  return [
    m[0] * v[0] + m[1] * v[1] + m[2] * v[2],
    m[3] * v[0] + m[4] * v[1] + m[5] * v[2],
    m[6] * v[0] + m[7] * v[1] + m[8] * v[2],
  ];
}

/** The transpose, which is the inverse of a rotation. */
export function transpose(m: Mat3): Mat3 {
  return [m[0], m[3], m[6], m[1], m[4], m[7], m[2], m[5], m[8]];
}

/** Rotation by `angle` radians about `axis` (any non-zero vector), right-handed (Rodrigues). */
export function rotation(axis: Vec3, angle: number): Mat3 {
  const [x, y, z] = normalize(axis);
  const c = Math.cos(angle);
  const s = Math.sin(angle);
  const t = 1 - c;
  return [
    t * x * x + c, t * x * y - s * z, t * x * z + s * y,
    t * x * y + s * z, t * y * y + c, t * y * z - s * x,
    t * x * z - s * y, t * y * z + s * x, t * z * z + c,
  ];
}

/** Largest absolute difference between entries. */
export function maxDifference(a: Mat3, b: Mat3): number {
  let d = 0;
  for (let i = 0; i < 9; i++) d = Math.max(d, Math.abs(a[i] - b[i]));
  return d;
}

/** Determinant (1 for a proper rotation). */
export function determinant(m: Mat3): number {
  return (
    m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6])
  );
}

/**
 * Axis and angle of a rotation. The angle is in [0, π]; the axis is a unit vector, or null
 * for the identity. At angle π the axis sign is arbitrary and comes from the largest diagonal term.
 */
export function axisAngle(m: Mat3): { axis: Vec3 | null; angle: number } {
  const cosA = Math.min(1, Math.max(-1, (m[0] + m[4] + m[8] - 1) / 2));
  const ax = m[7] - m[5];
  const ay = m[2] - m[6];
  const az = m[3] - m[1];
  const sin2 = Math.hypot(ax, ay, az); // = 2 sin(angle)
  const angle = Math.atan2(sin2 / 2, cosA);
  if (angle < 1e-9) return { axis: null, angle: 0 };
  if (sin2 > 1e-6) return { axis: normalize([ax, ay, az]), angle };
  // Half turn: R = 2 a aᵀ − I, so the column of (R + I) with the largest diagonal is along a.
  const d = [m[0], m[4], m[8]];
  const k = d[0] >= d[1] && d[0] >= d[2] ? 0 : d[1] >= d[2] ? 1 : 2;
  const col: Vec3 = [m[k] + (k === 0 ? 1 : 0), m[3 + k] + (k === 1 ? 1 : 0), m[6 + k] + (k === 2 ? 1 : 0)];
  return { axis: normalize(col), angle };
}
