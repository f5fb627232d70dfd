/**
 * clipper2-js, with one repair, for every module of the engine that runs booleans on paths.
 *
 * clipper2-js 1.2.4 is a port of Clipper2 from C#, where points are value types. Its
 * `InternalClipper.getIntersectPoint` returns one of the segment's own end points when the
 * crossing lies at or beyond an end (t ≤ 0 or t ≥ 1), and `addNewIntersectNode` then moves
 * that point in place when it falls outside the current scanbeam. In C# that moves a copy; in
 * JavaScript it moves the vertex of the input path, so the rest of the sweep (and any later call
 * reusing the path) sees a different polygon. Found by the audit's property tests: the same piece
 * cut by the same slots fell apart into three parts in one orientation and held together in
 * another. The repair returns a copy, which is what the C# original does by value.
 *
 * Import Clipper from here, never from 'clipper2-js' directly (the lint rule says so).
 */
import { InternalClipper, Point64 } from 'clipper2-js';

interface IntersectResult {
  ip: Point64;
  success: boolean;
}

type GetIntersectPoint = (a: Point64, b: Point64, c: Point64, d: Point64) => IntersectResult;

const internal = InternalClipper as unknown as { getIntersectPoint: GetIntersectPoint & { copiesResult?: true } };

if (!internal.getIntersectPoint.copiesResult) {
  const original = internal.getIntersectPoint;
  const repaired: GetIntersectPoint & { copiesResult?: true } = (a, b, c, d) => {
    const r = original(a, b, c, d);
    return { ip: new Point64(r.ip.x, r.ip.y), success: r.success };
  };
  repaired.copiesResult = true;
  internal.getIntersectPoint = repaired;
}

export * from 'clipper2-js';
