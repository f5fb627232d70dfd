/**
 * DXF import of a motif outline: closed rings in millimetres, or messages.
 *
 * Parsing is `dxf-parser`'s synchronous parser (pure JavaScript; its stream reader, which would
 * need Node streams, is not used). Read here:
 * - LWPOLYLINE and POLYLINE (2-D), with bulges flattened as circular arcs to within 0.05 mm;
 *   closed when flagged closed or when the last vertex returns to the first.
 * - CIRCLE (a ring), ARC and LINE (and open polylines and elliptical arcs) joined end to end into
 *   closed rings; ends closer than {@link DXF_JOIN_TOL} meet. An open chain or a branch is an
 *   error naming where.
 * - ELLIPSE, full or partial.
 * - Entities in object coordinates mirrored by an extrusion direction of (0, 0, −1) are mirrored
 *   back (x → −x), as the DXF arbitrary-axis rule gives for that direction.
 * - Text, dimensions, points and hatches are ignored; SPLINE and INSERT (block references) are
 *   errors asking the participant to convert or explode them.
 * - `$INSUNITS`: 0 (unitless) is read as millimetres — the project's choice, since laser work is
 *   metric here and a unitless file has no better guess; 1 inches, 4 millimetres, 5 centimetres,
 *   6 metres (AutoCAD INSUNITS reference, REFERENCES.md); 2 feet (from memory, same table). Any
 *   other value is an error naming it.
 */
import DxfParser from 'dxf-parser';
import type { Vec2 } from './vec.js';
import { type AssembleResult, assemblePolygon, fmtPoint } from './polygons.js';
import { CHORD_TOL } from './svg-path.js';

/** Ends of lines and arcs closer than this (mm) are joined. CAD exports round coordinates. */
export const DXF_JOIN_TOL = 0.01;
/** Largest DXF text accepted (characters). */
export const MAX_DXF_CHARS = 10 * 1024 * 1024;
const MAX_POINTS = 20_000;
const MAX_COORD = 1e6;

/** Millimetres per drawing unit for the supported `$INSUNITS` codes. */
export const INSUNITS_MM: Readonly<Record<number, { name: string; mm: number }>> = {
  0: { name: 'unitless (read as millimetres)', mm: 1 },
  1: { name: 'inches', mm: 25.4 },
  2: { name: 'feet', mm: 304.8 },
  4: { name: 'millimetres', mm: 1 },
  5: { name: 'centimetres', mm: 10 },
  6: { name: 'metres', mm: 1000 },
};

export interface DxfOptions {
  /** Read only entities on this layer (exact name). */
  readonly layer?: string;
  /** Chord error bound for arcs and bulges, mm (default 0.05). */
  readonly tolerance?: number;
}

export type DxfResult =
  | { ok: true; rings: Vec2[][]; units: string; mmPerUnit: number }
  | { ok: false; errors: string[] };

interface Pt {
  x: number;
  y: number;
  z?: number;
  bulge?: number;
}

class DxfInputError extends Error {}

/**
 * Reads the closed outlines of a DXF drawing, in millimetres (see the module comment for what is
 * read). Never throws: malformed text, unsupported entities, open chains and absurd sizes come
 * back as `{ ok: false, errors }`.
 */
export function parseDxf(text: string, options: DxfOptions = {}): DxfResult {
  try {
    return parseDxfUnsafe(text, options);
  } catch (e) {
    if (e instanceof DxfInputError) return { ok: false, errors: [e.message] };
    return { ok: false, errors: [`the DXF file could not be read (${e instanceof Error ? e.message : String(e)})`] };
  }
}

function parseDxfUnsafe(text: string, options: DxfOptions): DxfResult {
  if (typeof text !== 'string') return { ok: false, errors: ['the DXF file must be text'] };
  if (text.length > MAX_DXF_CHARS) return { ok: false, errors: [`the DXF file is larger than ${MAX_DXF_CHARS / 1024 / 1024} MB`] };
  if (!/(^|\n)\s*0\s*\r?\n\s*SECTION/.test(text)) return { ok: false, errors: ['this is not a DXF file (no SECTION found)'] };
  if (text.startsWith('AutoCAD Binary DXF')) return { ok: false, errors: ['this is a binary DXF file; export it as ASCII (text) DXF'] };
  // Every other line is a group code (an integer); checking first keeps the parser from logging.
  const lines = text.split(/\r\n|\r|\n/);
  for (let i = 0; i + 1 < lines.length; i += 2) {
    const code = lines[i].trim();
    if (!/^-?\d{1,4}$/.test(code)) return { ok: false, errors: [`line ${i + 1} should hold a group code (a whole number) but reads "${code.slice(0, 20)}"; the DXF file is damaged`] };
    if (code === '0' && lines[i + 1].trim() === 'EOF') break;
  }
  const tol = options.tolerance ?? CHORD_TOL;
  const parsed = new DxfParser().parseSync(text) as { header?: Record<string, unknown>; entities?: unknown[] } | null;
  if (!parsed || !Array.isArray(parsed.entities)) return { ok: false, errors: ['the DXF file has no ENTITIES section'] };
  const code = parsed.header?.['$INSUNITS'];
  const unitCode = code === undefined ? 0 : Number(code);
  const unit = INSUNITS_MM[unitCode];
  if (!unit) return { ok: false, errors: [`$INSUNITS ${String(code)} is not supported; save the file in millimetres, centimetres, metres or inches`] };
  const s = unit.mm;

  const rings: Vec2[][] = [];
  const chains: Vec2[][] = [];
  const errors: string[] = [];
  let points = 0;
  const count = (n: number) => {
    points += n;
    if (points > MAX_POINTS) throw new DxfInputError(`the DXF outlines flatten to more than ${MAX_POINTS} points; simplify the drawing`);
  };
  const num = (v: unknown, what: string): number => {
    const n = typeof v === 'number' ? v : Number.NaN;
    if (!Number.isFinite(n) || Math.abs(n * s) > MAX_COORD) throw new DxfInputError(`a ${what} has a missing or out-of-range number`);
    return n;
  };
  const ignored = new Set(['TEXT', 'MTEXT', 'DIMENSION', 'POINT', 'HATCH', 'ATTDEF', 'ATTRIB', 'SOLID', '3DFACE', 'VIEWPORT']);
  let used = 0;

  for (const raw of parsed.entities) {
    const e = raw as Record<string, unknown>;
    if (options.layer !== undefined && e.layer !== options.layer) continue;
    const type = String(e.type);
    const mirror = extrusionZ(e) < 0 ? -1 : 1;
    const P = (x: number, y: number): Vec2 => [mirror * x * s, y * s];
    switch (type) {
      case 'LWPOLYLINE':
      case 'POLYLINE': {
        const vs = (Array.isArray(e.vertices) ? e.vertices : []) as Pt[];
        if (vs.length < 2) break;
        const closed = e.shape === true;
        const pts: Vec2[] = [];
        const n = vs.length;
        const segs = closed ? n : n - 1;
        for (let i = 0; i < segs; i++) {
          const a = vs[i];
          const b = vs[(i + 1) % n];
          const ax = num(a.x, type + ' vertex');
          const ay = num(a.y, type + ' vertex');
          const bx = num(b.x, type + ' vertex');
          const by = num(b.y, type + ' vertex');
          if (i === 0) pts.push(P(ax, ay));
          const bulge = typeof a.bulge === 'number' && Number.isFinite(a.bulge) ? a.bulge : 0;
          if (bulge !== 0) {
            const arc = bulgePoints(ax, ay, bx, by, bulge, tol / s);
            count(arc.length / 2);
            for (let k = 0; k < arc.length; k += 2) pts.push(P(arc[k], arc[k + 1]));
          } else pts.push(P(bx, by));
          count(1);
        }
        if (closed) {
          pts.pop();
          rings.push(pts);
        } else chains.push(pts);
        used++;
        break;
      }
      case 'CIRCLE': {
        const c = e.center as Pt | undefined;
        const cx = num(c?.x, 'CIRCLE centre');
        const cy = num(c?.y, 'CIRCLE centre');
        const r = num(e.radius, 'CIRCLE radius');
        if (!(r > 0)) throw new DxfInputError(`a CIRCLE at ${fmtPoint([cx * s, cy * s])} has radius ${r}`);
        const pts = arcPolyline(cx, cy, r, 0, 2 * Math.PI, tol / s);
        pts.length -= 2; // the last point repeats the first
        count(pts.length / 2);
        const ring: Vec2[] = [];
        for (let k = 0; k < pts.length; k += 2) ring.push(P(pts[k], pts[k + 1]));
        rings.push(ring);
        used++;
        break;
      }
      case 'ARC': {
        const c = e.center as Pt | undefined;
        const cx = num(c?.x, 'ARC centre');
        const cy = num(c?.y, 'ARC centre');
        const r = num(e.radius, 'ARC radius');
        const a0 = num(e.startAngle, 'ARC angle');
        let a1 = num(e.endAngle, 'ARC angle');
        while (a1 <= a0) a1 += 2 * Math.PI; // DXF arcs run counter-clockwise from start to end.
        if (!(r > 0)) break;
        const pts = arcPolyline(cx, cy, r, a0, a1 - a0, tol / s);
        count(pts.length / 2);
        const chain: Vec2[] = [];
        for (let k = 0; k < pts.length; k += 2) chain.push(P(pts[k], pts[k + 1]));
        chains.push(chain);
        used++;
        break;
      }
      case 'LINE': {
        const vs = (Array.isArray(e.vertices) ? e.vertices : []) as Pt[];
        if (vs.length < 2) break;
        chains.push([P(num(vs[0].x, 'LINE end'), num(vs[0].y, 'LINE end')), P(num(vs[1].x, 'LINE end'), num(vs[1].y, 'LINE end'))]);
        count(2);
        used++;
        break;
      }
      case 'ELLIPSE': {
        const c = e.center as Pt | undefined;
        const m = e.majorAxisEndPoint as Pt | undefined;
        const cx = num(c?.x, 'ELLIPSE centre');
        const cy = num(c?.y, 'ELLIPSE centre');
        const mx = num(m?.x, 'ELLIPSE axis');
        const my = num(m?.y, 'ELLIPSE axis');
        const ratio = num(e.axisRatio, 'ELLIPSE ratio');
        const t0 = typeof e.startAngle === 'number' ? e.startAngle : 0;
        let t1 = typeof e.endAngle === 'number' ? e.endAngle : 2 * Math.PI;
        while (t1 <= t0) t1 += 2 * Math.PI;
        const full = Math.abs(t1 - t0 - 2 * Math.PI) < 1e-9;
        const rmax = Math.hypot(mx, my);
        if (!(rmax > 0) || !(ratio > 0)) break;
        const n = Math.max(8, Math.ceil((t1 - t0) * Math.sqrt(rmax / (8 * (tol / s)))));
        count(n);
        if (n > MAX_POINTS) throw new DxfInputError('an ELLIPSE needs too many points');
        const pts: Vec2[] = [];
        for (let i = 0; i <= (full ? n - 1 : n); i++) {
          const t = t0 + ((t1 - t0) * i) / n;
          // minor axis = ratio · (major turned by +90°)
          pts.push(P(cx + Math.cos(t) * mx - Math.sin(t) * ratio * my, cy + Math.cos(t) * my + Math.sin(t) * ratio * mx));
        }
        if (full) rings.push(pts);
        else chains.push(pts);
        used++;
        break;
      }
      case 'SPLINE':
        errors.push('the drawing has a SPLINE; convert splines to polylines or arcs before exporting');
        break;
      case 'INSERT':
        errors.push(`the drawing has a block reference (INSERT${typeof e.name === 'string' ? ` of "${e.name}"` : ''}); explode blocks before exporting`);
        break;
      default:
        if (!ignored.has(type)) errors.push(`the drawing has a ${type} entity, which cannot be read as an outline`);
    }
  }
  if (errors.length) return { ok: false, errors: [...new Set(errors)] };
  const joined = joinChains(chains);
  if (!joined.ok) return joined;
  rings.push(...joined.rings);
  if (rings.length === 0) {
    return { ok: false, errors: [used === 0 ? `the drawing has no lines, arcs, circles or polylines${options.layer !== undefined ? ` on layer "${options.layer}"` : ''}` : 'the drawing has no closed outline'] };
  }
  return { ok: true, rings, units: unit.name, mmPerUnit: s };
}

function extrusionZ(e: Record<string, unknown>): number {
  if (typeof e.extrusionDirectionZ === 'number') return e.extrusionDirectionZ;
  const d = e.extrusionDirection as Pt | undefined;
  return d && typeof d.z === 'number' ? d.z : 1;
}

/** Points of a circular arc after its start, end included: flat [x, y, …]. */
function arcPolyline(cx: number, cy: number, r: number, start: number, sweep: number, tol: number): number[] {
  const n = Math.max(1, Math.ceil(Math.abs(sweep) * Math.sqrt(r / (8 * tol))));
  if (n > MAX_POINTS) throw new DxfInputError('an arc needs too many points to flatten');
  const out: number[] = [];
  for (let i = 0; i <= n; i++) {
    const t = start + (sweep * i) / n;
    out.push(cx + r * Math.cos(t), cy + r * Math.sin(t));
  }
  return out;
}

/**
 * Points of the bulged segment a → b after a, b included. The bulge is tan(θ/4) of the included
 * angle θ, positive counter-clockwise (DXF group code 42).
 */
function bulgePoints(ax: number, ay: number, bx: number, by: number, bulge: number, tol: number): number[] {
  const dx = bx - ax;
  const dy = by - ay;
  const c = Math.hypot(dx, dy);
  if (c === 0) return [];
  const theta = 4 * Math.atan(bulge);
  const h = (c / 2) / Math.tan(theta / 2);
  const cx = (ax + bx) / 2 - (dy / c) * h;
  const cy = (ay + by) / 2 + (dx / c) * h;
  const r = Math.hypot(ax - cx, ay - cy);
  const start = Math.atan2(ay - cy, ax - cx);
  const pts = arcPolyline(cx, cy, r, start, theta, tol);
  pts.splice(0, 2);
  pts[pts.length - 2] = bx;
  pts[pts.length - 1] = by;
  return pts;
}

/** Joins open chains end to end into closed rings. */
function joinChains(chains: Vec2[][]): { ok: true; rings: Vec2[][] } | { ok: false; errors: string[] } {
  const tol = DXF_JOIN_TOL;
  const cell = (v: number) => Math.floor(v / tol);
  const grid = new Map<string, { chain: number; end: 0 | 1 }[]>();
  const keyOf = (p: Vec2) => `${cell(p[0])},${cell(p[1])}`;
  chains.forEach((c, i) => {
    for (const end of [0, 1] as const) {
      const p = end === 0 ? c[0] : c[c.length - 1];
      const k = keyOf(p);
      const list = grid.get(k);
      if (list) list.push({ chain: i, end });
      else grid.set(k, [{ chain: i, end }]);
    }
  });
  const near = (p: Vec2, skip: number): { chain: number; end: 0 | 1 }[] => {
    const out: { chain: number; end: 0 | 1 }[] = [];
    const x = cell(p[0]);
    const y = cell(p[1]);
    for (let i = -1; i <= 1; i++) {
      for (let j = -1; j <= 1; j++) {
        for (const h of grid.get(`${x + i},${y + j}`) ?? []) {
          if (h.chain === skip || used[h.chain]) continue;
          const c = chains[h.chain];
          const q = h.end === 0 ? c[0] : c[c.length - 1];
          if (Math.hypot(p[0] - q[0], p[1] - q[1]) <= tol) out.push(h);
        }
      }
    }
    return out;
  };
  const used = new Array<boolean>(chains.length).fill(false);
  const rings: Vec2[][] = [];
  const errors: string[] = [];
  for (let i = 0; i < chains.length && errors.length < 5; i++) {
    if (used[i]) continue;
    used[i] = true;
    const ring = chains[i].slice();
    for (;;) {
      const end = ring[ring.length - 1];
      if (ring.length > 2 && Math.hypot(end[0] - ring[0][0], end[1] - ring[0][1]) <= tol) {
        ring.pop();
        rings.push(ring);
        break;
      }
      const next = near(end, -1);
      if (next.length === 0) {
        errors.push(`the lines and arcs starting near ${fmtPoint(ring[0])} stop near ${fmtPoint(end)} without closing (mm)`);
        break;
      }
      if (next.length > 1) {
        errors.push(`the lines and arcs branch near ${fmtPoint(end)} (mm): more than two ends meet there`);
        break;
      }
      const h = next[0];
      used[h.chain] = true;
      const c = chains[h.chain];
      const add = h.end === 0 ? c.slice(1) : c.slice(0, -1).reverse();
      ring.push(...add);
    }
  }
  return errors.length ? { ok: false, errors } : { ok: true, rings };
}

/**
 * A DXF drawing → one motif polygon (millimetres): {@link parseDxf}, then the rings sorted by
 * containment as for SVG ({@link assemblePolygon}: the largest is the outline, the others holes).
 */
export function dxfToPolygon(text: string, options: DxfOptions = {}): AssembleResult {
  const r = parseDxf(text, options);
  if (!r.ok) return r;
  return assemblePolygon(r.rings);
}
