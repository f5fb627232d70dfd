/**
 * SVG path data → closed rings of points, curves flattened to a chord error bound.
 *
 * Parsing, relative → absolute and shorthand expansion come from `svgpath` (pure JavaScript, no
 * Node APIs); arcs and Bézier curves are flattened here so the error bound holds exactly:
 * every point of the true curve lies within the tolerance of the polyline.
 */
import svgpath from 'svgpath';
import type { Polygon2 } from './model.js';
import type { Vec2 } from './vec.js';
import { type AssembleResult, assemblePolygon, fmtPoint } from './polygons.js';
import { LENGTH_TOL } from './tolerance.js';

/** Largest distance between a curve and its flattened polyline (mm), FORMAT.md §1. */
export const CHORD_TOL = 0.05;

/** An affine map [a, b, c, d, e, f] acting as (x, y) → (a x + c y + e, b x + d y + f), as in SVG. */
export type Affine = readonly [number, number, number, number, number, number];

export interface FlattenOptions {
  /** Chord error bound in the output units (default {@link CHORD_TOL}). */
  readonly tolerance?: number;
  /** Affine map applied to the path before flattening (the tolerance holds after it). */
  readonly transform?: Affine;
  /** Give up once this many points have been produced in total (default 20,000). */
  readonly maxPoints?: number;
  /** Coordinates beyond ±this after the transform are an error (default 10,000). */
  readonly maxCoordinate?: number;
}

export type FlattenResult = { ok: true; rings: Vec2[][] } | { ok: false; errors: string[] };

/**
 * Flattens SVG path data (all commands M L H V C S Q T A Z, absolute and relative, implicit
 * repeats) into closed rings, one per subpath, with every curve within `tolerance` of its chords.
 *
 * - A subpath is closed by `Z`, or when its last point lies within 0.001 mm of its first; any
 *   other subpath that draws something is an error ("open"). A lone `M` draws nothing and is
 *   skipped; drawing after `Z` without a new `M` starts a new subpath at the closed one's start.
 * - Arcs follow SVG 2 implementation notes: zero radius → straight line, too-small radii are
 *   scaled up, equal end points draw nothing.
 * - Coordinates are used as given (for a motif they are the plane's frame, y up), so no flip.
 * - Non-finite or out-of-range coordinates, unparsable data and excessive point counts are
 *   errors with messages; the function never throws.
 */
export function flattenSvgPath(d: string, options: FlattenOptions = {}): FlattenResult {
  const tol = options.tolerance ?? CHORD_TOL;
  const maxPoints = options.maxPoints ?? 20_000;
  const maxCoord = options.maxCoordinate ?? 10_000;
  if (typeof d !== 'string') return { ok: false, errors: ['path data must be a string'] };
  if (!(tol > 0)) return { ok: false, errors: ['flattening tolerance must be positive'] };
  let segments: (string | number)[][];
  try {
    const p = svgpath(d);
    const err = (p as unknown as { err: string }).err;
    if (err) return { ok: false, errors: [`path data: ${err.replace(/^SvgPath:\s*/, '')}`] };
    if (options.transform) p.matrix(options.transform.slice());
    p.abs().unshort();
    segments = (p as unknown as { segments: (string | number)[][] }).segments;
  } catch (e) {
    return { ok: false, errors: [`path data could not be read: ${e instanceof Error ? e.message : String(e)}`] };
  }
  if (segments.length === 0) return { ok: false, errors: ['path data is empty'] };
  for (const s of segments) {
    for (let i = 1; i < s.length; i++) {
      const v = s[i] as number;
      if (!Number.isFinite(v)) return { ok: false, errors: [`path data has a non-finite number in a ${String(s[0])} command`] };
      const isCoord = s[0] !== 'A' || i >= 6 || i <= 2;
      if (isCoord && Math.abs(v) > maxCoord) {
        return { ok: false, errors: [`path data has a coordinate ${v} beyond ±${maxCoord} mm`] };
      }
    }
  }

  const rings: Vec2[][] = [];
  const errors: string[] = [];
  let current: Vec2[] | null = null;
  let startX = 0;
  let startY = 0;
  let x = 0;
  let y = 0;
  let total = 0;
  let subpath = 0;
  let tooMany = false;

  const push = (px: number, py: number): void => {
    current!.push([px, py]);
    total++;
    if (total > maxPoints) tooMany = true;
  };
  const ensure = (): void => {
    if (!current) {
      current = [[x, y]];
      startX = x;
      startY = y;
      subpath++;
      total++;
    }
  };
  const finish = (closed: boolean): void => {
    if (current && current.length > 1) {
      const first = current[0];
      const last = current[current.length - 1];
      const meets = Math.hypot(first[0] - last[0], first[1] - last[1]) < LENGTH_TOL;
      if (closed || meets) rings.push(current);
      else errors.push(`subpath ${subpath} is open: it starts at ${fmtPoint(first)} and ends at ${fmtPoint(last)} (close it with Z)`);
    }
    current = null;
  };

  for (const s of segments) {
    if (tooMany) break;
    const cmd = s[0] as string;
    const a = s as number[];
    switch (cmd) {
      case 'M':
        finish(false);
        x = a[1];
        y = a[2];
        ensure();
        break;
      case 'L':
        ensure();
        x = a[1];
        y = a[2];
        push(x, y);
        break;
      case 'H':
        ensure();
        x = a[1];
        push(x, y);
        break;
      case 'V':
        ensure();
        y = a[1];
        push(x, y);
        break;
      case 'C': {
        ensure();
        const m = Math.max(Math.hypot(x - 2 * a[1] + a[3], y - 2 * a[2] + a[4]), Math.hypot(a[1] - 2 * a[3] + a[5], a[2] - 2 * a[4] + a[6]));
        const n = steps(Math.sqrt((3 * m) / (4 * tol)));
        if (n > maxPoints) tooMany = true;
        for (let i = 1; i <= n && !tooMany; i++) {
          const t = i / n;
          const u = 1 - t;
          const b0 = u * u * u;
          const b1 = 3 * u * u * t;
          const b2 = 3 * u * t * t;
          const b3 = t * t * t;
          push(b0 * x + b1 * a[1] + b2 * a[3] + b3 * a[5], b0 * y + b1 * a[2] + b2 * a[4] + b3 * a[6]);
        }
        x = a[5];
        y = a[6];
        break;
      }
      case 'Q': {
        ensure();
        const m = Math.hypot(x - 2 * a[1] + a[3], y - 2 * a[2] + a[4]);
        const n = steps(Math.sqrt(m / (4 * tol)));
        if (n > maxPoints) tooMany = true;
        for (let i = 1; i <= n && !tooMany; i++) {
          const t = i / n;
          const u = 1 - t;
          push(u * u * x + 2 * u * t * a[1] + t * t * a[3], u * u * y + 2 * u * t * a[2] + t * t * a[4]);
        }
        x = a[3];
        y = a[4];
        break;
      }
      case 'A': {
        ensure();
        const pts = arcPoints(x, y, a[1], a[2], a[3], a[4] !== 0, a[5] !== 0, a[6], a[7], tol, maxPoints);
        if (pts === null) tooMany = true;
        else for (let i = 0; i < pts.length && !tooMany; i += 2) push(pts[i], pts[i + 1]);
        x = a[6];
        y = a[7];
        break;
      }
      case 'Z':
      case 'z':
        if (current) {
          finish(true);
          x = startX;
          y = startY;
        }
        break;
      default:
        errors.push(`path data has an unexpected command ${cmd}`);
    }
  }
  if (tooMany) return { ok: false, errors: [`path data flattens to more than ${maxPoints} points; simplify the drawing`] };
  finish(false);
  if (errors.length) return { ok: false, errors };
  if (rings.length === 0) return { ok: false, errors: ['path data draws no closed shape'] };
  return { ok: true, rings };
}

function steps(raw: number): number {
  if (!Number.isFinite(raw)) return Number.MAX_SAFE_INTEGER;
  return Math.max(1, Math.ceil(raw));
}

/**
 * Points after the start of an SVG elliptical arc, end point included, as a flat array
 * [x1, y1, x2, y2, …]; null when more than `maxPoints` would be needed.
 */
function arcPoints(
  x1: number,
  y1: number,
  rxIn: number,
  ryIn: number,
  phiDeg: number,
  large: boolean,
  sweep: boolean,
  x2: number,
  y2: number,
  tol: number,
  maxPoints: number,
): number[] | null {
  if (x1 === x2 && y1 === y2) return [];
  let rx = Math.abs(rxIn);
  let ry = Math.abs(ryIn);
  if (rx === 0 || ry === 0) return [x2, y2];
  const phi = (phiDeg * Math.PI) / 180;
  const cos = Math.cos(phi);
  const sin = Math.sin(phi);
  const dx2 = (x1 - x2) / 2;
  const dy2 = (y1 - y2) / 2;
  const x1p = cos * dx2 + sin * dy2;
  const y1p = -sin * dx2 + cos * dy2;
  const lambda = (x1p * x1p) / (rx * rx) + (y1p * y1p) / (ry * ry);
  if (lambda > 1) {
    const k = Math.sqrt(lambda);
    rx *= k;
    ry *= k;
  }
  const num = rx * rx * ry * ry - rx * rx * y1p * y1p - ry * ry * x1p * x1p;
  const den = rx * rx * y1p * y1p + ry * ry * x1p * x1p;
  let coef = den > 0 ? Math.sqrt(Math.max(0, num / den)) : 0;
  if (large === sweep) coef = -coef;
  const cxp = (coef * rx * y1p) / ry;
  const cyp = (-coef * ry * x1p) / rx;
  const cx = cos * cxp - sin * cyp + (x1 + x2) / 2;
  const cy = sin * cxp + cos * cyp + (y1 + y2) / 2;
  const ang = (ux: number, uy: number, vx: number, vy: number): number => Math.atan2(ux * vy - uy * vx, ux * vx + uy * vy);
  const theta1 = ang(1, 0, (x1p - cxp) / rx, (y1p - cyp) / ry);
  let dtheta = ang((x1p - cxp) / rx, (y1p - cyp) / ry, (-x1p - cxp) / rx, (-y1p - cyp) / ry);
  if (!sweep && dtheta > 0) dtheta -= 2 * Math.PI;
  else if (sweep && dtheta < 0) dtheta += 2 * Math.PI;
  // Uniform steps in the parameter: chord error ≤ h²/8 · max(rx, ry) (second-derivative bound).
  const n = steps(Math.abs(dtheta) * Math.sqrt(Math.max(rx, ry) / (8 * tol)));
  if (n > maxPoints) return null;
  const out = new Array<number>(2 * n);
  for (let i = 1; i < n; i++) {
    const t = theta1 + (dtheta * i) / n;
    const ex = rx * Math.cos(t);
    const ey = ry * Math.sin(t);
    out[2 * (i - 1)] = cx + cos * ex - sin * ey;
    out[2 * (i - 1) + 1] = cy + sin * ex + cos * ey;
  }
  // End exactly on the given end point.
  out[2 * (n - 1)] = x2;
  out[2 * (n - 1) + 1] = y2;
  return out;
}

/**
 * SVG path data → one motif polygon: flattens with {@link flattenSvgPath}, then assembles the
 * rings by containment ({@link assemblePolygon}): the subpath of largest area is the outline and
 * every other subpath must lie inside it and becomes a hole, whatever order they were drawn in
 * (vector editors do not keep a reliable order). Side-by-side subpaths are an error.
 */
export function svgPathToPolygon(d: string, options: FlattenOptions = {}): AssembleResult {
  const flat = flattenSvgPath(d, options);
  if (!flat.ok) return flat;
  return assemblePolygon(flat.rings);
}

/** SVG path data of a polygon (absolute M/L/Z per ring, coordinates as given, 4 decimals). */
export function polygonToPathData(p: Polygon2, digits = 4): string {
  const f = (v: number): string => String(Number(v.toFixed(digits)));
  return [p.outer, ...p.holes]
    .filter((r) => r.length > 0)
    .map((r) => 'M ' + r.map((q) => `${f(q[0])} ${f(q[1])}`).join(' L ') + ' Z')
    .join(' ');
}
