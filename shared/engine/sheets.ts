/**
 * How many sheets a design needs (FORMAT.md §4 `piece-exceeds-sheet`, `sheet-limit-exceeded`;
 * §5 `sheets`): each piece's minimum-area bounding rectangle, an exact any-rotation fit test,
 * and a rectangle-nesting estimate with maxrects-packer.
 *
 * Conventions used throughout:
 * - Kerf is counted once per dimension: the laser removes kerf/2 on each side of the cut line,
 *   so an outline of nominal width w takes w + kerf of material in every direction.
 * - The part gap (default {@link DEFAULT_PART_GAP}) is kept between the kerf-inflated outlines
 *   of neighbouring parts and between a part and the sheet edge.
 */
import { MaxRectsPacker, PACKING_LOGIC } from 'maxrects-packer';
import type { Finding, Piece, Ring, SheetEstimate, Template } from './model.js';
import { convexHull } from './hull2.js';
import { polygonArea, signedArea } from './polygons.js';
import type { Vec2 } from './vec.js';

/**
 * Gap kept between parts and from the sheet edge, in mm. Common practice, no source: enough for
 * the sheet to stay rigid between cuts and for heat to spread on ~3 mm stock.
 */
export const DEFAULT_PART_GAP = 3;

/** A rectangle in a plane's 2-D frame. */
export interface MinRect {
  /** Length of the longer side (width ≥ height). */
  readonly width: number;
  readonly height: number;
  /** Direction of the longer side, radians from the frame's x axis, in [0, π). */
  readonly angle: number;
  /** Centre of the rectangle in frame coordinates. */
  readonly center: Vec2;
}

/**
 * The minimum-area rectangle enclosing `ring` (any point set; holes never matter), by convex hull
 * and rotating calipers: the optimum has one side flush with a hull edge, so each hull edge is
 * tried once with three calipers advancing monotonically (O(n log n) overall).
 *
 * Convention: `width` ≥ `height`, `angle` is the direction of the `width` side in [0, π).
 * Edge cases: no points → all zero; one distinct point → a 0 × 0 rectangle at it; collinear
 * points → a `length × 0` rectangle along the line. Among rectangles of equal area the first hull
 * edge wins, so a square reports the angle of its first edge.
 */
export function minAreaRect(ring: Ring): MinRect {
  return calipers(convexHull(ring)).rect;
}

/** Rotating calipers over a counter-clockwise hull: the minimum-area rectangle and the minimum width. */
function calipers(h: readonly Vec2[]): { rect: MinRect; minWidth: number } {
  if (h.length === 0) return { rect: { width: 0, height: 0, angle: 0, center: [0, 0] }, minWidth: 0 };
  if (h.length === 1) return { rect: { width: 0, height: 0, angle: 0, center: [h[0][0], h[0][1]] }, minWidth: 0 };
  if (h.length === 2) {
    const dx = h[1][0] - h[0][0];
    const dy = h[1][1] - h[0][1];
    const rect: MinRect = {
      width: Math.hypot(dx, dy),
      height: 0,
      angle: normAngle(Math.atan2(dy, dx)),
      center: [(h[0][0] + h[1][0]) / 2, (h[0][1] + h[1][1]) / 2],
    };
    return { rect, minWidth: 0 };
  }
  const n = h.length;
  let best = Infinity;
  let minWidth = Infinity;
  let out: MinRect = { width: 0, height: 0, angle: 0, center: [0, 0] };
  let jMax = 0;
  let jMin = 0;
  let k = 0;
  for (let i = 0; i < n; i++) {
    const a = h[i];
    const b = h[(i + 1) % n];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (len === 0) continue;
    const ex = (b[0] - a[0]) / len;
    const ey = (b[1] - a[1]) / len;
    // Inward normal of a counter-clockwise hull edge.
    const nx = -ey;
    const ny = ex;
    const pe = (p: Vec2): number => p[0] * ex + p[1] * ey;
    const pn = (p: Vec2): number => (p[0] - a[0]) * nx + (p[1] - a[1]) * ny;
    if (i === 0) {
      for (let q = 1; q < n; q++) {
        if (pe(h[q]) > pe(h[jMax])) jMax = q;
        if (pe(h[q]) < pe(h[jMin])) jMin = q;
        if (pn(h[q]) > pn(h[k])) k = q;
      }
    } else {
      for (let s = 0; s < n && pe(h[(jMax + 1) % n]) >= pe(h[jMax]); s++) jMax = (jMax + 1) % n;
      for (let s = 0; s < n && pn(h[(k + 1) % n]) >= pn(h[k]); s++) k = (k + 1) % n;
      for (let s = 0; s < n && pe(h[(jMin + 1) % n]) <= pe(h[jMin]); s++) jMin = (jMin + 1) % n;
    }
    const hiE = pe(h[jMax]);
    const loE = pe(h[jMin]);
    const across = pn(h[k]);
    const along = hiE - loE;
    const area = along * across;
    minWidth = Math.min(minWidth, across);
    if (!(area >= best - 1e-12 * Math.max(1, best))) {
      best = area;
      const mid = (hiE + loE) / 2;
      const off = a[0] * nx + a[1] * ny + across / 2;
      const center: Vec2 = [ex * mid + nx * off, ey * mid + ny * off];
      out =
        along >= across
          ? { width: along, height: across, angle: normAngle(Math.atan2(ey, ex)), center }
          : { width: across, height: along, angle: normAngle(Math.atan2(ny, nx)), center };
    }
  }
  return { rect: out, minWidth };
}

/**
 * The rotation at which the outline `ring`, grown by kerf/2 on every side, fits a sheet of
 * `sheet[0] × sheet[1]` mm, or `undefined` when it fits in no rotation. The returned angle θ
 * (radians, in [0, π)) is the frame direction to lay along the sheet's first side.
 *
 * Exact, not sampled: the extents of the convex hull along d(θ) and d(θ + 90°) are single
 * sinusoids between the angles where a support vertex changes, so each such interval is solved
 * in closed form. This finds diagonal fits too (a long thin piece across a square sheet).
 * Touching exactly (w + kerf = W) counts as fitting, within 1e-9 mm. An empty outline fits.
 */
export function fitRotation(ring: Ring, sheet: readonly [number, number], kerf: number): number | undefined {
  const hull = convexHull(ring);
  const W = sheet[0] - kerf;
  const H = sheet[1] - kerf;
  if (hull.length === 0) return W >= 0 && H >= 0 ? 0 : undefined;
  if (W < -FIT_EPS || H < -FIT_EPS) return undefined;
  const { rect, minWidth } = calipers(hull);
  if (rect.width <= W + FIT_EPS && rect.height <= H + FIT_EPS) return rect.angle;
  if (rect.width <= H + FIT_EPS && rect.height <= W + FIT_EPS) return normAngle(rect.angle + Math.PI / 2);
  // No orientation can beat the hull's smallest width or its area.
  if (minWidth > Math.min(W, H) + FIT_EPS) return undefined;
  if (signedArea(hull) > W * H + FIT_EPS) return undefined;

  const n = hull.length;
  const breaks: number[] = [0, Math.PI];
  for (let i = 0; i < n; i++) {
    const a = hull[i];
    const b = hull[(i + 1) % n];
    const alpha = Math.atan2(-(b[0] - a[0]), b[1] - a[1]); // outward normal (ey, −ex)
    breaks.push(modPi(alpha), modPi(alpha - Math.PI / 2));
  }
  breaks.sort((x, y) => x - y);
  for (let s = 0; s + 1 < breaks.length; s++) {
    const t0 = breaks[s];
    const t1 = breaks[s + 1];
    if (t1 - t0 < 1e-15) continue;
    const tm = (t0 + t1) / 2;
    // Extent along d(θ): (p_max − p_min)·d(θ); along d(θ + π/2): (q_max − q_min)·(−sin θ, cos θ).
    const [pMax, pMin] = supports(hull, Math.cos(tm), Math.sin(tm));
    const [qMax, qMin] = supports(hull, -Math.sin(tm), Math.cos(tm));
    const ax = hull[pMax][0] - hull[pMin][0];
    const ay = hull[pMax][1] - hull[pMin][1];
    const bx = hull[qMax][0] - hull[qMin][0];
    const by = hull[qMax][1] - hull[qMin][1];
    // width(θ) = ax cos θ + ay sin θ;  height(θ) = by cos θ − bx sin θ.
    const f = feasible(ax, ay, W + FIT_EPS, t0, t1);
    if (f.length === 0) continue;
    const g = feasible(by, -bx, H + FIT_EPS, t0, t1);
    for (const [f0, f1] of f) {
      for (const [g0, g1] of g) {
        const lo = Math.max(f0, g0);
        const hi = Math.min(f1, g1);
        if (lo <= hi) return normAngle((lo + hi) / 2);
      }
    }
  }
  return undefined;
}

/**
 * True when a `width × height` rectangle, grown by the kerf, fits a `sheet` in some rotation
 * (axis-aligned either way round, or diagonally; see {@link fitRotation}). Kerf is counted once
 * per dimension (kerf/2 each side of the cut). Zero-sized rectangles fit any sheet ≥ kerf.
 */
export function fitsSheet(rect: { readonly width: number; readonly height: number }, sheet: readonly [number, number], kerf: number): boolean {
  const w = rect.width;
  const h = rect.height;
  return fitRotation([[0, 0], [w, 0], [w, h], [0, h]], sheet, kerf) !== undefined;
}

export interface SheetOptions {
  /** Sheet size in mm, [W, H]. */
  readonly sheet: readonly [number, number];
  /** Kerf in mm (≥ 0). */
  readonly kerf: number;
  /** Gap between parts and from the sheet edge in mm; default {@link DEFAULT_PART_GAP}. */
  readonly partGap?: number;
  /** The brief's limit on sheets; `sheet-limit-exceeded` when the estimate needs more. */
  readonly maxSheets?: number;
}

export interface SheetResult {
  /** Undefined only when the options themselves are unusable (a finding says why). */
  readonly estimate: SheetEstimate | undefined;
  readonly findings: Finding[];
}

/**
 * A nesting estimate: every piece is replaced by its minimum-area rectangle grown by the kerf and
 * the part gap, one rectangle per piece (each template's rectangle `count` times). Each template
 * first fills whole sheets in its best grid (90° turns allowed, two-block layouts); what is left
 * of all templates is tiled into blocks of at most a quarter sheet and packed into sheets with
 * maxrects-packer (bins kept at the sheet size, `pot: false`). Real nesting of outlines does
 * better, so for irregular pieces the count errs on the high side; it never counts a sheet as
 * enough when the rectangles do not fit it.
 *
 * - `count` is the number of sheets used; `utilization` is the summed real area of the nested
 *   pieces (outline minus holes) over count × W × H, to 3 decimals (0 when nothing is nested).
 * - A piece whose rectangle fits the sheet only without the edge gap, or only at an angle other
 *   than 0°/90° to its minimum-area rectangle (a diagonal fit), takes a sheet of its own.
 * - `piece-exceeds-sheet` (error, one finding per template): the piece fits in no rotation even
 *   with no gap; it is left out of the estimate and the message says so.
 * - `sheet-limit-exceeded` (error) when `maxSheets` is given and `count` exceeds it.
 * - `sheet-options-invalid` (error) and no estimate when the sheet is not two positive finite
 *   sizes, the kerf or gap is negative or not finite, or `maxSheets` is not a positive integer.
 * Pieces are grouped by `piece.template`; a piece whose template index is missing from
 * `templates` is measured on its own. Cost: one grid per template plus one packer run (four
 * when at most 150 rectangles remain); 1,200 pieces in 20 templates take about 25 ms.
 */
export function estimateSheets(pieces: readonly Piece[], templates: readonly Template[], options: SheetOptions): SheetResult {
  const problem = optionsProblem(options);
  if (problem) {
    return { estimate: undefined, findings: [{ code: 'sheet-options-invalid', severity: 'error', message: problem, pieces: [] }] };
  }
  const [W, H] = [options.sheet[0], options.sheet[1]];
  const kerf = options.kerf;
  const gap = options.partGap ?? DEFAULT_PART_GAP;
  const findings: Finding[] = [];

  const groups = groupByTemplate(pieces, templates);
  const binW = W - gap;
  const binH = H - gap;
  const rest: Remainder[] = [];
  let solo = 0;
  let full = 0;
  let nestedArea = 0;
  for (const g of groups) {
    const rect = minAreaRect(g.representative.polygon.outer);
    const w = rect.width + kerf;
    const h = rect.height + kerf;
    const area = g.members.reduce((sum, p) => sum + Math.max(0, polygonArea(p.polygon)), 0);
    const orthogonal = (w <= W + FIT_EPS && h <= H + FIT_EPS) || (w <= H + FIT_EPS && h <= W + FIT_EPS);
    const fits = orthogonal || fitRotation(g.representative.polygon.outer, [W, H], kerf) !== undefined;
    if (!fits) {
      findings.push({
        code: 'piece-exceeds-sheet',
        severity: 'error',
        message:
          `${describe(g.members.map((p) => p.id))} ${g.members.length === 1 ? 'needs' : 'each need'} ` +
          `${mm(w)} × ${mm(h)} mm of material (smallest enclosing rectangle, kerf included) and ` +
          `${g.members.length === 1 ? 'fits' : 'fit'} the ${mm(W)} × ${mm(H)} mm sheet in no rotation, ` +
          `so ${g.members.length === 1 ? 'it is' : 'they are'} left out of the sheet estimate. ` +
          'Shrink the motif or choose a larger sheet.',
        pieces: g.members.map((p) => p.id),
      });
      continue;
    }
    nestedArea += area;
    const iw = w + gap;
    const ih = h + gap;
    const perSheet = gridCapacity(iw, ih, binW, binH);
    if (perSheet === 0) {
      // Fits the bare sheet but not inside the edge gap, or only diagonally: a sheet each.
      solo += g.members.length;
      continue;
    }
    // Whole sheets of one template in a grid; the remainder is nested with the other templates.
    const sheetsFull = Math.floor(g.members.length / perSheet);
    full += sheetsFull;
    const left = g.members.length - sheetsFull * perSheet;
    if (left > 0) rest.push({ template: g.index, width: iw, height: ih, copies: left, perSheet });
  }

  const count = full + solo + packRest(rest, binW, binH);
  const utilization = count > 0 ? Math.round((nestedArea / (count * W * H)) * 1000) / 1000 : 0;
  if (options.maxSheets !== undefined && count > options.maxSheets) {
    findings.push({
      code: 'sheet-limit-exceeded',
      severity: 'error',
      message:
        `The nesting estimate needs ${count} sheets of ${mm(W)} × ${mm(H)} mm and the brief allows ` +
        `${options.maxSheets}. Make pieces smaller or fewer, or ask for a larger sheet ` +
        `(the estimate packs each piece's enclosing rectangle with ${mm(gap)} mm between parts).`,
      pieces: [],
    });
  }
  return { estimate: { size: [W, H], count, utilization }, findings };
}

const FIT_EPS = 1e-9;

interface Remainder {
  readonly template: number;
  /** One copy's rectangle, kerf and gap included. */
  readonly width: number;
  readonly height: number;
  /** Copies left after the template's whole sheets. */
  readonly copies: number;
  /** How many copies fit one sheet in a grid. */
  readonly perSheet: number;
}

/** A template's last short row goes to the packer part by part up to this many parts. */
const LOOSE_PARTS = 8;

/** Above this many rectangles only one packer run is made (each run costs O(n²) or more). */
const MULTI_RUN_LIMIT = 150;

/**
 * Sheets needed for the templates' remainders. One template left: its grid. Otherwise copies of a
 * template are first tiled into blocks of at most a quarter sheet, the last block as many full
 * rows as needed (a grid of identical parts is what a person would lay out, and it keeps the
 * packer's input to a few blocks per template), then packed with
 * maxrects-packer; with few blocks, the best of runs with and without 90° turns and with both of
 * its sorting rules (its greedy choice of a turn can waste a sheet).
 */
function packRest(rest: readonly Remainder[], binW: number, binH: number): number {
  if (rest.length === 0) return 0;
  if (rest.length === 1) return Math.ceil(rest[0].copies / rest[0].perSheet);
  const items: { width: number; height: number; x: number; y: number; data: number }[] = [];
  for (const r of rest) {
    const [p, q, nx, ny] = block(r.width, r.height, binW / 2, binH / 2);
    const per = nx * ny;
    const blocks = Math.floor(r.copies / per);
    for (let k = 0; k < blocks; k++) items.push({ width: nx * p, height: ny * q, x: 0, y: 0, data: r.template });
    // What is left: full rows of the same grid as one block, then the last few parts one by
    // one (or, when that row is long, as a short row counted as if full).
    const left = r.copies - blocks * per;
    const rows = Math.floor(left / nx);
    if (rows > 0) items.push({ width: nx * p, height: rows * q, x: 0, y: 0, data: r.template });
    const single = left - rows * nx;
    if (single > LOOSE_PARTS) items.push({ width: single * p, height: q, x: 0, y: 0, data: r.template });
    else for (let k = 0; k < single; k++) items.push({ width: p, height: q, x: 0, y: 0, data: r.template });
  }
  const variants: [boolean, PACKING_LOGIC][] = [
    [true, PACKING_LOGIC.MAX_AREA],
    [false, PACKING_LOGIC.MAX_AREA],
    [true, PACKING_LOGIC.MAX_EDGE],
    [false, PACKING_LOGIC.MAX_EDGE],
  ];
  let best = Infinity;
  for (const [allowRotation, logic] of items.length > MULTI_RUN_LIMIT ? variants.slice(0, 1) : variants) {
    const packer = new MaxRectsPacker(binW, binH, 0, { smart: false, pot: false, square: false, allowRotation, logic });
    // The packer sorts and mutates what it is given: hand it fresh copies.
    packer.addArray(items.map((it) => ({ ...it })) as never[]);
    best = Math.min(best, packer.bins.length);
  }
  return best;
}

/**
 * The largest grid of a × b parts (either way round) within maxW × maxH, at least 1 × 1:
 * [part width, part height, columns, rows].
 */
function block(a: number, b: number, maxW: number, maxH: number): [number, number, number, number] {
  let out: [number, number, number, number] = [a, b, 1, 1];
  for (const [p, q] of [
    [a, b],
    [b, a],
  ]) {
    const nx = Math.floor((maxW + FIT_EPS) / p);
    const ny = Math.floor((maxH + FIT_EPS) / q);
    if (nx * ny > out[2] * out[3]) out = [p, q, nx, ny];
  }
  return out;
}

/**
 * How many a × b rectangles fit a W × H field with 90° turns, over the two-block layouts: some
 * columns (or rows) in one orientation and the leftover strip filled in the other. Exact for
 * one-orientation grids; a good lower bound otherwise.
 */
function gridCapacity(a: number, b: number, W: number, H: number): number {
  const fit = (len: number, size: number): number => (size > 0 ? Math.floor((len + FIT_EPS) / size) : 0);
  let best = 0;
  for (const [p, q] of [
    [a, b],
    [b, a],
  ]) {
    const nx = fit(W, p);
    const ny = fit(H, q);
    for (let i = 0; i <= nx; i++) best = Math.max(best, i * ny + fit(W - i * p, q) * fit(H, p));
    for (let j = 0; j <= ny; j++) best = Math.max(best, j * nx + fit(W, q) * fit(H - j * q, p));
  }
  return best;
}

interface PieceGroup {
  readonly index: number;
  readonly representative: Piece;
  readonly members: readonly Piece[];
}

function groupByTemplate(pieces: readonly Piece[], templates: readonly Template[]): PieceGroup[] {
  const byId = new Map(pieces.map((p) => [p.id, p]));
  const byTemplate = new Map<number, Piece[]>();
  const loose: Piece[] = [];
  const known = new Set(templates.map((t) => t.index));
  for (const p of pieces) {
    if (!known.has(p.template)) {
      loose.push(p);
      continue;
    }
    const list = byTemplate.get(p.template);
    if (list) list.push(p);
    else byTemplate.set(p.template, [p]);
  }
  const groups: PieceGroup[] = [];
  for (const t of templates) {
    const members = byTemplate.get(t.index);
    if (!members || members.length === 0) continue;
    groups.push({ index: t.index, representative: byId.get(t.representative) ?? members[0], members });
  }
  let next = groups.reduce((m, g) => Math.max(m, g.index + 1), 0);
  for (const p of loose) groups.push({ index: next++, representative: p, members: [p] });
  return groups;
}

function optionsProblem(o: SheetOptions): string | undefined {
  const s = o.sheet;
  if (!Array.isArray(s) || s.length !== 2 || !s.every((v) => Number.isFinite(v) && v > 0)) {
    return 'constraints.sheet must be two positive sizes in millimetres, such as [600, 400].';
  }
  if (!Number.isFinite(o.kerf) || o.kerf < 0) return 'material.kerf must be a number of millimetres, 0 or more.';
  if (o.partGap !== undefined && (!Number.isFinite(o.partGap) || o.partGap < 0)) {
    return 'The part gap must be a number of millimetres, 0 or more.';
  }
  if (o.maxSheets !== undefined && (!Number.isInteger(o.maxSheets) || o.maxSheets < 1)) {
    return 'constraints.maxSheets must be a whole number of sheets, 1 or more.';
  }
  return undefined;
}

/** Indices of the hull vertices with the largest and smallest projection on (dx, dy). */
function supports(h: readonly Vec2[], dx: number, dy: number): [number, number] {
  let hi = 0;
  let lo = 0;
  let vHi = -Infinity;
  let vLo = Infinity;
  for (let i = 0; i < h.length; i++) {
    const v = h[i][0] * dx + h[i][1] * dy;
    if (v > vHi) {
      vHi = v;
      hi = i;
    }
    if (v < vLo) {
      vLo = v;
      lo = i;
    }
  }
  return [hi, lo];
}

/** The parts of [t0, t1] where p cos θ + q sin θ ≤ c, as closed intervals. */
function feasible(p: number, q: number, c: number, t0: number, t1: number): [number, number][] {
  const r = Math.hypot(p, q);
  if (r <= c) return [[t0, t1]];
  if (c < -r) return [];
  const phi = Math.atan2(q, p);
  const a = Math.acos(c / r);
  // Infeasible: θ within a of φ (mod 2π). Remove every copy that can touch [t0, t1].
  let parts: [number, number][] = [[t0, t1]];
  for (let k = -2; k <= 2; k++) {
    const lo = phi + 2 * Math.PI * k - a;
    const hi = phi + 2 * Math.PI * k + a;
    const next: [number, number][] = [];
    for (const [s0, s1] of parts) {
      if (hi <= s0 || lo >= s1) next.push([s0, s1]);
      else {
        if (lo > s0) next.push([s0, lo]);
        if (hi < s1) next.push([hi, s1]);
      }
    }
    parts = next;
  }
  return parts;
}

function modPi(a: number): number {
  const m = a % Math.PI;
  return m < 0 ? m + Math.PI : m;
}

function normAngle(a: number): number {
  const m = modPi(a);
  return m >= Math.PI - 1e-15 ? 0 : m;
}

/** Millimetres with at most one decimal, no trailing ".0". */
function mm(x: number): string {
  return String(Math.round(x * 10) / 10);
}

function describe(ids: readonly string[]): string {
  if (ids.length === 1) return `Piece ${ids[0]}`;
  if (ids.length <= 4) return `Pieces ${ids.slice(0, -1).join(', ')} and ${ids[ids.length - 1]}`;
  return `The ${ids.length} congruent pieces ${ids[0]}, ${ids[1]}, … ${ids[ids.length - 1]}`;
}
