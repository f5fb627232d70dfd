/**
 * Convex hull of points in a plane's 2-D frame (Andrew's monotone chain), used by the sheet
 * estimate for minimum-area rectangles and exact fit tests.
 */
import type { Vec2 } from './vec.js';

/**
 * The convex hull of `points`, counter-clockwise, starting at the lowest-x (then lowest-y) point,
 * without repeated or collinear vertices.
 *
 * Edge cases: an empty input gives `[]`; a single point (or all points equal) gives that one
 * point; collinear input gives its two extreme points. Non-finite coordinates are the caller's
 * to reject (the design is validated before it reaches the engine).
 */
export function convexHull(points: readonly Vec2[]): Vec2[] {
  const pts = points.slice().sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const n = pts.length;
  if (n <= 1) return pts;
  const lower: Vec2[] = [];
  for (let i = 0; i < n; i++) {
    const p = pts[i];
    while (lower.length >= 2 && turn(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: Vec2[] = [];
  for (let i = n - 1; i >= 0; i--) {
    const p = pts[i];
    while (upper.length >= 2 && turn(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  const hull = lower.concat(upper);
  // All points equal: both chains collapse onto the same point.
  if (hull.length === 2 && hull[0][0] === hull[1][0] && hull[0][1] === hull[1][1]) return [hull[0]];
  return hull;
}

/** Twice the signed area of the triangle o, a, b: positive when o → a → b turns left. */
function turn(o: Vec2, a: Vec2, b: Vec2): number {
  return (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
}
