/**
 * The 2-D frame of a plane (FORMAT.md §1 "The plane's 2-D frame").
 */
import { type Vec2, type Vec3, cross, dot, normalize, scale, sub } from './vec.js';

/** A plane with its drawing frame: origin = offset·n̂, x along u, y along v, u × v = n̂. */
export interface PlaneFrame {
  readonly normal: Vec3;
  readonly offset: number;
  readonly origin: Vec3;
  readonly u: Vec3;
  readonly v: Vec3;
}

/**
 * The frame of the plane with normal `normal` (any non-zero vector) at distance `offset` from
 * the centre. n̂ = normalize(normal); a = z unless n̂ is within 0.999 of ±z, then a = y;
 * v = normalize(a − (a·n̂) n̂); u = v × n̂. Seen from outside, looking along −n̂, x runs right, y up.
 */
export function planeFrame(normal: Vec3, offset: number): PlaneFrame {
  const n = normalize(normal);
  const a: Vec3 = Math.abs(n[2]) < 0.999 ? [0, 0, 1] : [0, 1, 0];
  const v = normalize(sub(a, scale(n, dot(a, n))));
  const u = cross(v, n);
  return { normal: n, offset, origin: scale(n, offset), u, v };
}

/** The 3-D point of frame coordinates (x, y). */
export function toWorld(f: PlaneFrame, p: Vec2): Vec3 {
  return [
    f.origin[0] + p[0] * f.u[0] + p[1] * f.v[0],
    f.origin[1] + p[0] * f.u[1] + p[1] * f.v[1],
    f.origin[2] + p[0] * f.u[2] + p[1] * f.v[2],
  ];
}

/** Frame coordinates of the orthogonal projection of a 3-D point onto the plane. */
export function toFrame(f: PlaneFrame, p: Vec3): Vec2 {
  const d = sub(p, f.origin);
  return [dot(d, f.u), dot(d, f.v)];
}

/** Signed distance of a 3-D point from the plane (positive on the side n̂ points to). */
export function signedDistance(f: PlaneFrame, p: Vec3): number {
  return dot(p, f.normal) - f.offset;
}

/**
 * The affine map from frame coordinates of `from` to frame coordinates of `to`, after projecting
 * onto `to`'s plane: (x, y) ↦ (l0·x + l1·y + t0, l2·x + l3·y + t1), returned as
 * [l0, l1, l2, l3, t0, t1]. For parallel planes the linear part is a rotation or a reflection.
 */
export function frameToFrame(from: PlaneFrame, to: PlaneFrame): readonly [number, number, number, number, number, number] {
  const ox = from.origin[0] - to.origin[0];
  const oy = from.origin[1] - to.origin[1];
  const oz = from.origin[2] - to.origin[2];
  return [
    dot(from.u, to.u),
    dot(from.v, to.u),
    dot(from.u, to.v),
    dot(from.v, to.v),
    ox * to.u[0] + oy * to.u[1] + oz * to.u[2],
    ox * to.v[0] + oy * to.v[1] + oz * to.v[2],
  ];
}
