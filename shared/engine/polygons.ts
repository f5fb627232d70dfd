/**
 * Planar polygons in a plane's 2-D frame: area and orientation, clean-up, point location,
 * segment tests with tolerance, validity with readable messages, union (through
 * `polygon-clipping`) and congruence up to rotation and reflection (a flat part can be flipped).
 *
 * Lengths are millimetres and compared at {@link LENGTH_TOL} unless a caller passes a tolerance.
 */
import polygonClipping from 'polygon-clipping';
import type { Mat2 } from './orbits.js';
import type { Polygon2, Ring } from './model.js';
import type { Vec2 } from './vec.js';
import { LENGTH_TOL } from './tolerance.js';

/**
 * Signed area of a ring (shoelace formula): positive when counter-clockwise in a y-up frame.
 * Rings with fewer than 3 points have area 0. Coordinates are taken relative to the first point
 * so large offsets do not cost precision.
 */
export function signedArea(ring: Ring): number {
  const n = ring.length;
  if (n < 3) return 0;
  const ox = ring[0][0];
  const oy = ring[0][1];
  let s = 0;
  for (let i = 1; i < n - 1; i++) {
    const ax = ring[i][0] - ox;
    const ay = ring[i][1] - oy;
    const bx = ring[i + 1][0] - ox;
    const by = ring[i + 1][1] - oy;
    s += ax * by - ay * bx;
  }
  return s / 2;
}

/** Absolute area of a polygon with holes (outer area minus the holes' areas). */
export function polygonArea(p: Polygon2): number {
  let a = Math.abs(signedArea(p.outer));
  for (const h of p.holes) a -= Math.abs(signedArea(h));
  return a;
}

/** Length of the closed ring's boundary, closing edge included. */
export function perimeter(ring: Ring): number {
  let s = 0;
  const n = ring.length;
  for (let i = 0; i < n; i++) {
    const a = ring[i];
    const b = ring[(i + 1) % n];
    s += Math.hypot(b[0] - a[0], b[1] - a[1]);
  }
  return s;
}

/** Axis-aligned bounds `[minX, minY, maxX, maxY]` of the rings; `[0, 0, 0, 0]` when empty. */
export function bounds(rings: readonly Ring[]): [number, number, number, number] {
  let minX = Infinity;
  let minY = Infinity;
  let maxX = -Infinity;
  let maxY = -Infinity;
  for (const r of rings) {
    for (const p of r) {
      if (p[0] < minX) minX = p[0];
      if (p[0] > maxX) maxX = p[0];
      if (p[1] < minY) minY = p[1];
      if (p[1] > maxY) maxY = p[1];
    }
  }
  return minX <= maxX ? [minX, minY, maxX, maxY] : [0, 0, 0, 0];
}

/**
 * The ring without points closer than `tol` to the previously kept point, and without a last
 * point that repeats the first (rings are implicitly closed). Returns a new array; a ring that
 * collapses entirely keeps its first point.
 */
export function removeNearDuplicates(ring: Ring, tol: number = LENGTH_TOL): Vec2[] {
  const out: Vec2[] = [];
  for (const p of ring) {
    const last = out[out.length - 1];
    if (last && Math.hypot(p[0] - last[0], p[1] - last[1]) < tol) continue;
    out.push(p);
  }
  while (out.length > 1) {
    const a = out[0];
    const b = out[out.length - 1];
    if (Math.hypot(a[0] - b[0], a[1] - b[1]) < tol) out.pop();
    else break;
  }
  return out;
}

/**
 * The ring without vertices that lie within `tol` of the line through their neighbours
 * (collinear points and zero-width spikes). Used before congruence tests, where union output
 * may carry extra points along straight edges.
 */
export function removeCollinear(ring: Ring, tol: number = LENGTH_TOL): Vec2[] {
  let pts = ring.slice();
  for (let pass = 0; pass < 8 && pts.length > 3; pass++) {
    const keep: Vec2[] = [];
    const n = pts.length;
    let removed = 0;
    for (let i = 0; i < n; i++) {
      const prev = keep.length ? keep[keep.length - 1] : pts[n - 1];
      const next = pts[(i + 1) % n];
      if (n - removed > 3 && pointSegmentDistance(pts[i], prev, next) <= tol) {
        removed++;
        continue;
      }
      keep.push(pts[i]);
    }
    if (removed === 0) break;
    pts = keep;
  }
  return pts;
}

function reversed(ring: Ring): Vec2[] {
  return ring.slice().reverse();
}

/** The ring counter-clockwise (`ccw` true) or clockwise, reversing it when needed. */
export function orientRing(ring: Ring, ccw: boolean): Ring {
  const a = signedArea(ring);
  return (a > 0) === ccw || a === 0 ? ring : reversed(ring);
}

/** The polygon with its outer ring counter-clockwise and every hole clockwise (model.ts convention). */
export function normalizePolygon(p: Polygon2): Polygon2 {
  return { outer: orientRing(p.outer, true), holes: p.holes.map((h) => orientRing(h, false)) };
}

/** Determinant of a 2 × 2 map: negative when it mirrors. */
export function det2(m: Mat2): number {
  return m[0] * m[3] - m[1] * m[2];
}

/**
 * The image of a polygon under a linear 2 × 2 map (and an optional translation), with ring
 * orientation restored when the map mirrors (det < 0), so the result keeps the outer-CCW,
 * holes-CW convention.
 */
export function transformPolygon(p: Polygon2, m: Mat2, tx = 0, ty = 0): Polygon2 {
  const mirror = det2(m) < 0;
  const map = (r: Ring): Vec2[] => {
    const n = r.length;
    const out = new Array<Vec2>(n);
    for (let i = 0; i < n; i++) {
      const q = r[mirror ? n - 1 - i : i];
      out[i] = [m[0] * q[0] + m[1] * q[1] + tx, m[2] * q[0] + m[3] * q[1] + ty];
    }
    return out;
  };
  return { outer: map(p.outer), holes: p.holes.map(map) };
}

/** Distance from point p to the segment ab (a degenerate segment is a point). */
export function pointSegmentDistance(p: Vec2, a: Vec2, b: Vec2): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const l2 = dx * dx + dy * dy;
  let t = l2 > 0 ? ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2 : 0;
  if (t < 0) t = 0;
  else if (t > 1) t = 1;
  return Math.hypot(p[0] - a[0] - t * dx, p[1] - a[1] - t * dy);
}

function orient(a: Vec2, b: Vec2, c: Vec2): number {
  return (b[0] - a[0]) * (c[1] - a[1]) - (b[1] - a[1]) * (c[0] - a[0]);
}

/**
 * Smallest distance between the segments ab and cd: 0 when they cross, otherwise the least of
 * the four end-point-to-segment distances. Degenerate segments are treated as points.
 */
export function segmentDistance(a: Vec2, b: Vec2, c: Vec2, d: Vec2): number {
  const o1 = orient(a, b, c);
  const o2 = orient(a, b, d);
  const o3 = orient(c, d, a);
  const o4 = orient(c, d, b);
  if (((o1 > 0 && o2 < 0) || (o1 < 0 && o2 > 0)) && ((o3 > 0 && o4 < 0) || (o3 < 0 && o4 > 0))) return 0;
  return Math.min(pointSegmentDistance(c, a, b), pointSegmentDistance(d, a, b), pointSegmentDistance(a, c, d), pointSegmentDistance(b, c, d));
}

/**
 * True when the segments ab and cd cross or come within `tol` of each other (touching, a shared
 * end point and collinear overlap all count).
 */
export function segmentsIntersect(a: Vec2, b: Vec2, c: Vec2, d: Vec2, tol: number = LENGTH_TOL): boolean {
  if (Math.max(a[0], b[0]) + tol < Math.min(c[0], d[0]) || Math.max(c[0], d[0]) + tol < Math.min(a[0], b[0])) return false;
  if (Math.max(a[1], b[1]) + tol < Math.min(c[1], d[1]) || Math.max(c[1], d[1]) + tol < Math.min(a[1], b[1])) return false;
  return segmentDistance(a, b, c, d) <= tol;
}

/** Where a point lies relative to a ring or polygon. */
export type PointLocation = 'inside' | 'outside' | 'boundary';

/**
 * Locates p relative to a closed ring (either orientation): `boundary` when within `tol` of an
 * edge, else `inside`/`outside` by the even-odd crossing rule. Allocation-free.
 */
export function locateInRing(p: Vec2, ring: Ring, tol: number = LENGTH_TOL): PointLocation {
  const n = ring.length;
  const x = p[0];
  const y = p[1];
  let inside = false;
  for (let i = 0, j = n - 1; i < n; j = i++) {
    const a = ring[j];
    const b = ring[i];
    if (pointSegmentDistance(p, a, b) <= tol) return 'boundary';
    if (a[1] > y !== b[1] > y) {
      const xCross = a[0] + ((y - a[1]) * (b[0] - a[0])) / (b[1] - a[1]);
      if (x < xCross) inside = !inside;
    }
  }
  return inside ? 'inside' : 'outside';
}

/** Locates p relative to a polygon with holes; a hole's boundary is the polygon's boundary. */
export function locateInPolygon(p: Vec2, poly: Polygon2, tol: number = LENGTH_TOL): PointLocation {
  const o = locateInRing(p, poly.outer, tol);
  if (o !== 'inside') return o;
  for (const h of poly.holes) {
    const l = locateInRing(p, h, tol);
    if (l === 'boundary') return 'boundary';
    if (l === 'inside') return 'outside';
  }
  return 'inside';
}

/** One problem found by {@link validatePolygon}. */
export interface PolygonProblem {
  /** -1 for the outer ring, else the hole's index. */
  readonly ring: number;
  /** Index of the first vertex of the offending edge in that ring, or -1 for the ring as a whole. */
  readonly index: number;
  /** For crossings and touches: the other edge's ring and first vertex. */
  readonly otherRing?: number;
  readonly otherIndex?: number;
  /** What is wrong, with the place as coordinates (no point numbers: callers add their own). */
  readonly message: string;
}

const fmt = (v: number): string => (Math.abs(v) < 5e-4 ? '0' : String(Number(v.toFixed(3))));
/** A point as `(x, y)` rounded to 0.001 mm, for messages. */
export const fmtPoint = (p: Vec2): string => `(${fmt(p[0])}, ${fmt(p[1])})`;

const ringName = (r: number): string => (r < 0 ? 'the outline' : `hole ${r + 1}`);

/**
 * Checks that a polygon can be cut: every ring has at least 3 distinct points and a non-zero
 * area; no edge crosses, touches or folds back onto another edge of any ring (a self-touching
 * outline, a bow-tie, a zero-width spike and a hole touching the outline all fail); every hole
 * lies strictly inside the outline and outside every other hole. Rings should already be free
 * of near-duplicate points ({@link removeNearDuplicates}). Returns at most `limit` problems,
 * empty when the polygon is valid. Runs a sweep over edges sorted by x, so typical outlines of
 * thousands of points check in well under quadratic time.
 */
export function validatePolygon(poly: Polygon2, tol: number = LENGTH_TOL, limit = 5): PolygonProblem[] {
  const problems: PolygonProblem[] = [];
  const rings: Ring[] = [poly.outer, ...poly.holes];
  for (let r = 0; r < rings.length; r++) {
    const ring = rings[r];
    if (ring.length < 3) {
      problems.push({ ring: r - 1, index: -1, message: `${ringName(r - 1)} has ${ring.length} distinct point${ring.length === 1 ? '' : 's'}; it needs at least 3` });
    } else if (collinear(ring, tol)) {
      problems.push({ ring: r - 1, index: -1, message: `${ringName(r - 1)} encloses no area (its points lie on one line)` });
    }
  }
  if (problems.length) return problems.slice(0, limit);

  // Edges as flat arrays: ring, index, endpoints.
  let total = 0;
  for (const r of rings) total += r.length;
  const er = new Int32Array(total);
  const ei = new Int32Array(total);
  const minX = new Float64Array(total);
  const order = new Int32Array(total);
  let k = 0;
  for (let r = 0; r < rings.length; r++) {
    const ring = rings[r];
    for (let i = 0; i < ring.length; i++) {
      const a = ring[i];
      const b = ring[(i + 1) % ring.length];
      er[k] = r;
      ei[k] = i;
      minX[k] = Math.min(a[0], b[0]);
      order[k] = k;
      k++;
    }
  }
  order.sort((p, q) => minX[p] - minX[q]);
  const seg = (e: number): [Vec2, Vec2] => {
    const ring = rings[er[e]];
    return [ring[ei[e]], ring[(ei[e] + 1) % ring.length]];
  };
  const report = (e: number, f: number, at: Vec2, what: string): void => {
    const re = er[e] - 1;
    const rf = er[f] - 1;
    if (re === rf) {
      const [i, j] = ei[e] < ei[f] ? [ei[e], ei[f]] : [ei[f], ei[e]];
      problems.push({ ring: re, index: i, otherRing: re, otherIndex: j, message: `${ringName(re)} ${what} itself near ${fmtPoint(at)}` });
    } else {
      const [hi, lo] = re > rf ? [e, f] : [f, e];
      problems.push({
        ring: er[hi] - 1,
        index: ei[hi],
        otherRing: er[lo] - 1,
        otherIndex: ei[lo],
        message: `${ringName(er[hi] - 1)} ${what} ${ringName(er[lo] - 1)} near ${fmtPoint(at)}`,
      });
    }
  };
  outer: for (let oi = 0; oi < total; oi++) {
    const e = order[oi];
    const [a, b] = seg(e);
    const maxX = Math.max(a[0], b[0]) + tol;
    for (let oj = oi + 1; oj < total; oj++) {
      const f = order[oj];
      if (minX[f] > maxX) break;
      const [c, d] = seg(f);
      if (Math.max(a[1], b[1]) + tol < Math.min(c[1], d[1]) || Math.max(c[1], d[1]) + tol < Math.min(a[1], b[1])) continue;
      if (er[e] === er[f]) {
        const n = rings[er[e]].length;
        const isNext = (ei[e] + 1) % n === ei[f]; // e = a→b, f = b→d
        const isPrev = (ei[f] + 1) % n === ei[e]; // f = c→a, e = a→b
        if (isNext || isPrev) {
          // Adjacent edges share one vertex; they must not fold back onto each other.
          const fold = (isNext && foldsBack(a, b, d, tol)) || (isPrev && foldsBack(c, a, b, tol));
          if (fold) report(e, f, isNext ? b : a, 'folds back on');
          if (problems.length >= limit) break outer;
          continue;
        }
      }
      if (segmentDistance(a, b, c, d) <= tol) {
        const cross = segmentDistance(a, b, c, d) === 0 && !touchesAtEnd(a, b, c, d, tol);
        report(e, f, closestPoint(a, b, c, d), cross ? 'crosses' : 'touches');
        if (problems.length >= limit) break outer;
      }
    }
  }
  if (problems.length) return problems.slice(0, limit);

  for (let h = 0; h < poly.holes.length; h++) {
    const hole = poly.holes[h];
    if (locateInRing(hole[0], poly.outer, tol) !== 'inside') {
      problems.push({ ring: h, index: -1, message: `hole ${h + 1} is not inside the outline` });
      continue;
    }
    for (let g = 0; g < poly.holes.length; g++) {
      if (g !== h && locateInRing(hole[0], poly.holes[g], tol) !== 'outside') {
        problems.push({ ring: h, index: -1, message: `hole ${h + 1} lies inside hole ${g + 1}` });
        break;
      }
    }
    if (problems.length >= limit) break;
  }
  return problems.slice(0, limit);
}

/** True when every point of the ring lies within `tol` of one line. */
function collinear(ring: Ring, tol: number): boolean {
  const a = ring[0];
  let far = a;
  let best = 0;
  for (const p of ring) {
    const d = Math.hypot(p[0] - a[0], p[1] - a[1]);
    if (d > best) {
      best = d;
      far = p;
    }
  }
  if (best <= tol) return true;
  const dx = (far[0] - a[0]) / best;
  const dy = (far[1] - a[1]) / best;
  for (const p of ring) if (Math.abs((p[0] - a[0]) * dy - (p[1] - a[1]) * dx) > tol) return false;
  return true;
}

/** Edges p→q and q→r fold back when either far end lies on the other edge. */
function foldsBack(p: Vec2, q: Vec2, r: Vec2, tol: number): boolean {
  return pointSegmentDistance(r, p, q) <= tol || pointSegmentDistance(p, q, r) <= tol;
}

function touchesAtEnd(a: Vec2, b: Vec2, c: Vec2, d: Vec2, tol: number): boolean {
  return pointSegmentDistance(a, c, d) <= tol || pointSegmentDistance(b, c, d) <= tol || pointSegmentDistance(c, a, b) <= tol || pointSegmentDistance(d, a, b) <= tol;
}

function closestPoint(a: Vec2, b: Vec2, c: Vec2, d: Vec2): Vec2 {
  const cand: [number, Vec2][] = [
    [pointSegmentDistance(c, a, b), c],
    [pointSegmentDistance(d, a, b), d],
    [pointSegmentDistance(a, c, d), a],
    [pointSegmentDistance(b, c, d), b],
  ];
  const o1 = orient(a, b, c);
  const o2 = orient(a, b, d);
  if (o1 !== o2 && segmentDistance(a, b, c, d) === 0 && o1 - o2 !== 0) {
    const t = o1 / (o1 - o2);
    return [c[0] + t * (d[0] - c[0]), c[1] + t * (d[1] - c[1])];
  }
  cand.sort((x, y) => x[0] - y[0]);
  return cand[0][1];
}

/** Result of {@link assemblePolygon}. */
export type AssembleResult = { ok: true; polygon: Polygon2 } | { ok: false; errors: string[] };

/**
 * Builds one polygon with holes from loose closed rings (the subpaths of an SVG path, the
 * closed shapes of a DXF file or a drawing's motif layer), by containment rather than drawing
 * order: the ring of largest area is the outline and every other ring must lie inside it and
 * becomes a hole. Several rings side by side are an error (a motif is one outline), as is a ring
 * inside a hole (an island: draw it as its own motif). Near-duplicate points are removed,
 * orientation normalised, and the result validated with {@link validatePolygon}.
 */
export function assemblePolygon(rings: readonly Ring[], tol: number = LENGTH_TOL): AssembleResult {
  const clean = rings.map((r) => removeNearDuplicates(r, tol)).filter((r) => r.length > 0);
  if (clean.length === 0) return { ok: false, errors: ['no closed outline found'] };
  let best = 0;
  let bestArea = -1;
  for (let i = 0; i < clean.length; i++) {
    const a = Math.abs(signedArea(clean[i]));
    if (a > bestArea) {
      bestArea = a;
      best = i;
    }
  }
  const outer = clean[best];
  const holes = clean.filter((_, i) => i !== best);
  const errors: string[] = [];
  for (let i = 0; i < holes.length && errors.length < 5; i++) {
    const h = holes[i];
    if (h.length >= 3 && outer.length >= 3 && locateInRing(h[0], outer, tol) === 'outside' && h.every((p) => locateInRing(p, outer, tol) === 'outside')) {
      errors.push(
        `found ${clean.length} separate closed outlines (one near ${fmtPoint(h[0])} lies outside the largest); a motif is one outline, optionally with holes inside it`,
      );
    }
  }
  if (errors.length) return { ok: false, errors };
  const polygon = normalizePolygon({ outer, holes });
  const problems = validatePolygon(polygon, tol);
  if (problems.length) return { ok: false, errors: problems.map((p) => p.message) };
  return { ok: true, polygon };
}

/** Result of {@link unionPolygons}: connected regions, or a message when the union failed. */
export type UnionResult = { ok: true; regions: Polygon2[] } | { ok: false; message: string };

/**
 * Grids (mm) the union input is snapped to, finest first. `polygon-clipping` 0.15 can fail to
 * close an output ring when two inputs carry coordinates that should be equal but differ in the
 * last bits (rotated copies of one motif meeting near a symmetry axis); snapping makes them
 * equal. Every grid is far below {@link LENGTH_TOL}, so a coarser retry never changes a cut.
 */
const UNION_GRIDS = [1e-9, 1e-7, 1e-6, 1e-5] as const;

function snapRing(r: Ring, g: number): [number, number][] {
  const out: [number, number][] = [];
  for (const q of r) {
    const x = Math.round(q[0] / g) * g;
    const y = Math.round(q[1] / g) * g;
    const last = out[out.length - 1];
    if (last && last[0] === x && last[1] === y) continue;
    out.push([x, y]);
  }
  while (out.length > 1 && out[0][0] === out[out.length - 1][0] && out[0][1] === out[out.length - 1][1]) out.pop();
  return out;
}

/**
 * Union of polygons with holes; each connected region of the result is one polygon (outer CCW,
 * holes CW, no repeated closing point). Polygons that merely touch at an edge merge into one
 * region. The input is snapped to a 1e-9 mm grid first (coordinates that agree to rounding
 * become equal), and on a failure of `polygon-clipping` the union is retried on coarser grids
 * up to 1e-5 mm; only if every grid fails is `{ ok: false }` returned (never a throw).
 */
export function unionPolygons(polys: readonly Polygon2[]): UnionResult {
  if (polys.length === 0) return { ok: true, regions: [] };
  let message = '';
  for (const g of UNION_GRIDS) {
    const geoms: [number, number][][][] = [];
    for (const p of polys) {
      const outer = snapRing(p.outer, g);
      if (outer.length >= 3) geoms.push([outer, ...p.holes.map((r) => snapRing(r, g)).filter((r) => r.length >= 3)]);
    }
    if (geoms.length === 0) return { ok: true, regions: [] };
    try {
      const [first, ...rest] = geoms;
      const out = polygonClipping.union(first, ...rest);
      const regions: Polygon2[] = [];
      for (const poly of out) {
        const rings = poly.map((r) => removeNearDuplicates(r.map((q) => [q[0], q[1]] as Vec2)));
        if (rings.length === 0 || rings[0].length < 3) continue;
        regions.push(normalizePolygon({ outer: rings[0], holes: rings.slice(1).filter((r) => r.length >= 3) }));
      }
      return { ok: true, regions };
    } catch (e) {
      message = e instanceof Error ? e.message : String(e);
    }
  }
  return { ok: false, message };
}

/**
 * True when the two polygons are the same point set within `tol` (same rings up to the start
 * vertex; holes in any order). Both should be normalised. Used to collapse exact duplicate
 * images on one plane.
 */
export function samePolygon(a: Polygon2, b: Polygon2, tol: number = LENGTH_TOL): boolean {
  if (a.holes.length !== b.holes.length || !sameRing(a.outer, b.outer, tol)) return false;
  const used = new Array<boolean>(b.holes.length).fill(false);
  for (const h of a.holes) {
    let found = false;
    for (let j = 0; j < b.holes.length; j++) {
      if (!used[j] && sameRing(h, b.holes[j], tol)) {
        used[j] = true;
        found = true;
        break;
      }
    }
    if (!found) return false;
  }
  return true;
}

function sameRing(a: Ring, b: Ring, tol: number): boolean {
  const n = a.length;
  if (n !== b.length) return false;
  if (n === 0) return true;
  const a0 = a[0];
  for (let k = 0; k < n; k++) {
    if (Math.abs(b[k][0] - a0[0]) > tol || Math.abs(b[k][1] - a0[1]) > tol) continue;
    let ok = true;
    for (let i = 1; i < n && ok; i++) {
      const p = a[i];
      const q = b[(k + i) % n];
      ok = Math.abs(p[0] - q[0]) <= tol && Math.abs(p[1] - q[1]) <= tol;
    }
    if (ok) return true;
  }
  return false;
}

/** A rigid map of the plane: p ↦ m·p + (tx, ty); m orthogonal (det ±1). */
export interface Rigid2 {
  readonly m: Mat2;
  readonly tx: number;
  readonly ty: number;
}

/**
 * The candidate rigid maps that could carry ring `A` onto ring `B` (both with at least two
 * points): A's first edge is paired with every edge of B whose length matches within 2·`tol`, in
 * B's direction (a rotation) and against it (a reflection, since a flat part can be turned over).
 * Each candidate says which vertex `k` of B the point A[0] lands on and whether it mirrors, so a
 * caller verifies the remaining vertices in order (A[i] ↦ B[k ± i]) or by any test of its own.
 */
export function* edgePairingMaps(A: Ring, B: Ring, tol: number): Generator<{ map: Rigid2; k: number; mirror: boolean }> {
  const n = B.length;
  const a0 = A[0];
  const a1 = A[1];
  const dx = a1[0] - a0[0];
  const dy = a1[1] - a0[1];
  const l2 = dx * dx + dy * dy;
  const len = Math.sqrt(l2);
  if (!(l2 > 0)) return;
  for (let mirror = 0; mirror < 2; mirror++) {
    for (let k = 0; k < n; k++) {
      const q0 = B[k];
      const q1 = B[mirror ? (k - 1 + n) % n : (k + 1) % n];
      const ex = q1[0] - q0[0];
      const ey = q1[1] - q0[1];
      if (Math.abs(Math.hypot(ex, ey) - len) > 2 * tol) continue;
      // Map x ↦ R·F·(x − a0) + q0, F = identity or the mirror y ↦ −y, R sends F·d to e.
      const fdy = mirror ? -dy : dy;
      const c = (dx * ex + fdy * ey) / l2;
      const s = (dx * ey - fdy * ex) / l2;
      const sy = mirror ? -1 : 1;
      const m: Mat2 = [c, -s * sy, s, c * sy];
      const map: Rigid2 = { m, tx: q0[0] - (m[0] * a0[0] + m[1] * a0[1]), ty: q0[1] - (m[2] * a0[0] + m[3] * a0[1]) };
      yield { map, k, mirror: mirror === 1 };
    }
  }
}

/** Simplified shape data used by {@link congruent}; compute once per polygon and reuse. */
export interface CongruenceKey {
  readonly polygon: Polygon2;
  readonly area: number;
  readonly perimeter: number;
  readonly scale: number;
}

/** Precomputes the data {@link congruent} compares (collinear points dropped, area, perimeter). */
export function congruenceKey(p: Polygon2, tol: number = LENGTH_TOL): CongruenceKey {
  const polygon = normalizePolygon({ outer: removeCollinear(p.outer, tol), holes: p.holes.map((h) => removeCollinear(h, tol)) });
  const b = bounds([polygon.outer]);
  return { polygon, area: polygonArea(polygon), perimeter: perimeter(polygon.outer), scale: Math.max(b[2] - b[0], b[3] - b[1]) };
}

/**
 * True when two polygons with holes are congruent: equal up to a rotation, a translation and,
 * since a flat part can be turned over, a reflection. Vertices must match within `tol`
 * (never tighter than 1e-9 of the shape's size, so large shapes tolerate round-off); collinear
 * points along an edge are ignored. Accepts polygons or precomputed {@link congruenceKey}s.
 */
export function congruent(a: Polygon2 | CongruenceKey, b: Polygon2 | CongruenceKey, tol: number = LENGTH_TOL): boolean {
  const ka = 'perimeter' in a ? a : congruenceKey(a, tol);
  const kb = 'perimeter' in b ? b : congruenceKey(b, tol);
  const t = Math.max(tol, 1e-9 * Math.max(ka.scale, kb.scale));
  const pa = ka.polygon;
  const pb = kb.polygon;
  const n = pa.outer.length;
  if (n !== pb.outer.length || pa.holes.length !== pb.holes.length) return false;
  if (Math.abs(ka.perimeter - kb.perimeter) > 2 * n * t) return false;
  if (Math.abs(ka.area - kb.area) > 2 * t * (ka.perimeter + kb.perimeter)) return false;
  const A = pa.outer;
  const B = pb.outer;
  for (const { map, k, mirror } of edgePairingMaps(A, B, t)) {
    const { m, tx, ty } = map;
    let ok = true;
    for (let i = 2; i < n && ok; i++) {
      const p = A[i];
      const q = B[mirror ? (k - i + n * 2) % n : (k + i) % n];
      const x = m[0] * p[0] + m[1] * p[1] + tx;
      const y = m[2] * p[0] + m[3] * p[1] + ty;
      ok = Math.abs(x - q[0]) <= t && Math.abs(y - q[1]) <= t;
    }
    if (!ok) continue;
    if (pa.holes.length === 0) return true;
    const moved = transformPolygon({ outer: [], holes: pa.holes }, m, tx, ty);
    if (samePolygon({ outer: [], holes: moved.holes }, { outer: [], holes: pb.holes }, t)) return true;
  }
  return false;
}

/**
 * True when every vertex of each polygon lies within `tol` of the other's boundary (and the hole
 * structure matches): the two are the same shape up to `tol`, whatever their vertices. Used to
 * collapse images that differ only by curve flattening (a circle flattened to 46 chords, turned
 * by 72°, is the same cut). Cost is near-linear: edges are bucketed in a grid.
 */
export function nearlySamePolygon(a: Polygon2, b: Polygon2, tol: number): boolean {
  if (a.holes.length !== b.holes.length) return false;
  const ba = bounds([a.outer]);
  const bb = bounds([b.outer]);
  for (let i = 0; i < 4; i++) if (Math.abs(ba[i] - bb[i]) > tol) return false;
  if (Math.abs(polygonArea(a) - polygonArea(b)) > 2 * tol * (perimeter(a.outer) + perimeter(b.outer))) return false;
  if (!ringsClose(a.outer, b.outer, tol) || !ringsClose(b.outer, a.outer, tol)) return false;
  const used = new Array<boolean>(b.holes.length).fill(false);
  for (const h of a.holes) {
    const j = b.holes.findIndex((g, k) => !used[k] && ringsClose(h, g, tol) && ringsClose(g, h, tol));
    if (j < 0) return false;
    used[j] = true;
  }
  return true;
}

/** Every vertex of `r` within `tol` of some edge of `s`. */
function ringsClose(r: Ring, s: Ring, tol: number): boolean {
  const m = s.length;
  const [x0, y0, x1, y1] = bounds([s]);
  const cells = Math.max(1, Math.min(256, Math.ceil(Math.sqrt(m))));
  const cw = Math.max((x1 - x0) / cells, tol, 1e-9);
  const ch = Math.max((y1 - y0) / cells, tol, 1e-9);
  const grid = new Map<number, number[]>();
  const cell = (v: number, o: number, w: number) => Math.max(0, Math.min(cells - 1, Math.floor((v - o) / w)));
  for (let i = 0; i < m; i++) {
    const p = s[i];
    const q = s[(i + 1) % m];
    const cx0 = cell(Math.min(p[0], q[0]) - tol, x0, cw);
    const cx1 = cell(Math.max(p[0], q[0]) + tol, x0, cw);
    const cy0 = cell(Math.min(p[1], q[1]) - tol, y0, ch);
    const cy1 = cell(Math.max(p[1], q[1]) + tol, y0, ch);
    for (let cx = cx0; cx <= cx1; cx++) {
      for (let cy = cy0; cy <= cy1; cy++) {
        const k = cx * cells + cy;
        const list = grid.get(k);
        if (list) list.push(i);
        else grid.set(k, [i]);
      }
    }
  }
  for (const p of r) {
    if (p[0] < x0 - tol || p[0] > x1 + tol || p[1] < y0 - tol || p[1] > y1 + tol) return false;
    const list = grid.get(cell(p[0], x0, cw) * cells + cell(p[1], y0, ch));
    if (!list || !list.some((i) => pointSegmentDistance(p, s[i], s[(i + 1) % m]) <= tol)) return false;
  }
  return true;
}
