/**
 * Fabrication checks on cut pieces (FORMAT.md §4): `slab-clash`, `mortise-splits-piece`,
 * `slot-near-edge` and `thin-feature`. Booleans and offsets run on clipper2-js paths at 1 µm
 * resolution (the contract's length tolerance).
 *
 * Work is shared where the geometry is shared: `thin-feature` looks at one representative per
 * template (congruent pieces have the same outline); the slot checks look at every piece but
 * compute once per distinct configuration (outline plus slots, compared in the motif's own frame
 * through `piece.map`), so symmetric copies cost a hash each and are reported together in one
 * finding that lists every affected piece.
 */
import { Clipper, FillRule, PointInPolygonResult, type Path64, type Paths64, type Point64 } from './clipper.js';
import { frameToFrame, toFrame, toWorld } from './frames.js';
import type { Finding, Joint, JointKind, Piece, Polygon2, Ring, Template } from './model.js';
import { bounds, locateInPolygon, polygonArea, segmentDistance } from './polygons.js';
import { LENGTH_TOL } from './tolerance.js';
import { type Vec2, canonicalSign, dot } from './vec.js';

/** Material as the checks need it (mm). */
export interface FabricationMaterial {
  readonly thickness: number;
  readonly kerf: number;
}

export interface FabricationOptions {
  /** The templates, so `thin-feature` measures each template's own representative. */
  readonly templates?: readonly Template[];
}

/**
 * Smallest overlap (mm²) that counts as a clash or a separated part: a 0.1 mm × 0.01 mm sliver is
 * below what a laser bed resolves.
 */
export const MIN_REGION_AREA = 1e-3;

/**
 * A lost region of the opening counts as a thin feature from this many thickness² of area.
 * The opening also rounds every convex corner: a 90° corner loses 0.21 t², 60° 0.69 t², 45°
 * 1.24 t², 30° 2.42 t² (r²(cot(θ/2) − (π − θ)/2)). 2 t² keeps corners of 35° and wider quiet and
 * reports sharper points, which are fragile. Common practice, no source: the threshold is ours.
 */
export const THIN_AREA_FACTOR = 2;

/**
 * All fabrication findings for `pieces` and their `joints` (the joints' `slots` say where material
 * is removed). Messages name the pieces, the lengths and what to change. Findings for congruent
 * situations are merged: one finding lists every piece it applies to.
 *
 * - `slab-clash` (error): two pieces on parallel planes (normals equal or opposite) whose
 *   mid-planes are closer than the thickness and whose outlines, projected onto one plane,
 *   overlap by more than {@link MIN_REGION_AREA}. Pieces of one motif on one plane are skipped
 *   (their images were unioned into pieces). Pairs are pruned by plane direction and offset.
 * - `mortise-splits-piece` (error): the piece minus its slots (each a rectangle as wide as the
 *   thickness on the slot segment, pushed past the edge where the slot starts at the edge) falls
 *   into more than one region; the message names the slots that do it alone, if any.
 * - `slot-near-edge` (warning): a closed slot (neither end on the piece's boundary) closer than
 *   one thickness to the outline or a hole (common practice, no source). Open slots — a cross-lap
 *   from the edge — are not measured: they start at the edge by design.
 * - `thin-feature` (warning): see {@link thinRegions}.
 *
 * Edge cases: a non-positive or non-finite thickness gives no findings (the design validator
 * rejects it first); slots naming unknown pieces and zero-length slots are ignored.
 */
export function checkFabrication(
  pieces: readonly Piece[],
  joints: readonly Joint[],
  material: FabricationMaterial,
  options: FabricationOptions = {},
): Finding[] {
  const t = material.thickness;
  if (!(t > 0) || !Number.isFinite(t)) return [];
  return [...slabClashes(pieces, t), ...slotFindings(pieces, joints, t), ...thinFindings(pieces, t, options.templates)];
}

// ---------------------------------------------------------------------------------------------
// clipper2-js paths

const SCALE = 1000;
const SCALE2 = SCALE * SCALE;

function ringPath(r: Ring, ccw: boolean): Path64 {
  const path = r.map((p) => ({ x: Math.round(p[0] * SCALE), y: Math.round(p[1] * SCALE) }));
  if (Clipper.area(path as Path64) > 0 !== ccw) path.reverse();
  return path as Path64;
}

/** Outline counter-clockwise, holes clockwise: material on the left of every ring. */
function polygonPaths(p: Polygon2): Paths64 {
  return [ringPath(p.outer, true), ...p.holes.map((h) => ringPath(h, false))] as Paths64;
}

const areaMm2 = (p: Path64): number => Clipper.area(p) / SCALE2;

/** One connected region of a boolean result, in mm. */
interface Region {
  readonly area: number;
  readonly perimeter: number;
  readonly box: [number, number, number, number];
}

/**
 * Groups a flat boolean result (outers positive, holes negative, as clipper2-js returns them)
 * into regions: each hole joins the smallest outer that contains it. (The library's PolyTree
 * output came back empty in 1.2.4, so the nesting is rebuilt here.)
 */
function regionsOf(paths: Paths64): Region[] {
  const outers = paths.filter((p) => Clipper.area(p) > 0);
  const holes = paths.filter((p) => Clipper.area(p) < 0);
  const area = outers.map(areaMm2);
  const perimeter = outers.map(pathLength);
  for (const h of holes) {
    let best = -1;
    for (let k = 0; k < outers.length; k++) {
      if (best >= 0 && area[k] >= area[best]) continue;
      if (Clipper.pointInPolygon(h[0] as Point64, outers[k]) !== PointInPolygonResult.IsOutside) best = k;
    }
    if (best < 0) continue;
    area[best] += areaMm2(h);
    perimeter[best] += pathLength(h);
  }
  return outers.map((p, k) => ({ area: area[k], perimeter: perimeter[k], box: pathBox(p) }));
}

function pathLength(p: Path64): number {
  let s = 0;
  for (let i = 0, j = p.length - 1; i < p.length; j = i++) s += Math.hypot(p[i].x - p[j].x, p[i].y - p[j].y);
  return s / SCALE;
}

function pathBox(p: Path64): [number, number, number, number] {
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const q of p) {
    x0 = Math.min(x0, q.x);
    y0 = Math.min(y0, q.y);
    x1 = Math.max(x1, q.x);
    y1 = Math.max(y1, q.y);
  }
  return [x0 / SCALE, y0 / SCALE, x1 / SCALE, y1 / SCALE];
}

// ---------------------------------------------------------------------------------------------
// slab-clash

interface Clash {
  readonly a: Piece;
  readonly b: Piece;
  readonly distance: number;
  readonly overlap: number;
}

interface SlabEntry {
  readonly piece: Piece;
  /** Signed offset along the group's direction. */
  readonly s: number;
  /** Bounding box of the outline projected into the group's reference frame. */
  readonly box: [number, number, number, number];
}

function slabClashes(pieces: readonly Piece[], t: number): Finding[] {
  const groups = new Map<string, { ref: Piece; entries: SlabEntry[] }>();
  for (const p of pieces) {
    const c = canonicalSign(p.frame.normal, 1e-9);
    // Directions equal within ~1e-6 share a key; exact symmetric copies never straddle a cell.
    const key = `${Math.round(c[0] * 1e6)},${Math.round(c[1] * 1e6)},${Math.round(c[2] * 1e6)}`;
    let g = groups.get(key);
    if (!g) {
      g = { ref: p, entries: [] };
      groups.set(key, g);
    }
    const box = p.frame === g.ref.frame ? bounds([p.polygon.outer]) : ringBoxIn(p, g.ref.frame);
    g.entries.push({ piece: p, s: dot(p.frame.origin, c), box });
  }
  const clashes: Clash[] = [];
  const reach = t - LENGTH_TOL;
  // Overlap areas by configuration: symmetric copies of a pair are computed once.
  const cache = new Map<string, number>();
  for (const { entries: g } of groups.values()) {
    if (g.length < 2) continue;
    g.sort((x, y) => x.s - y.s);
    for (let i = 0; i < g.length; i++) {
      for (let j = i + 1; j < g.length && g[j].s - g[i].s < reach; j++) {
        const a = g[i].piece;
        const b = g[j].piece;
        const d = g[j].s - g[i].s;
        if (d <= LENGTH_TOL && a.motif === b.motif) continue;
        const [ax0, ay0, ax1, ay1] = g[i].box;
        const [bx0, by0, bx1, by1] = g[j].box;
        if (bx0 >= ax1 || ax0 >= bx1 || by0 >= ay1 || ay0 >= by1) continue;
        const key = `${shapeHash(a)}|${shapeHash(b)}|${Math.round(d * 1000)}|${placementKey(a, b)}`;
        let overlap = cache.get(key);
        if (overlap === undefined) {
          const bInA = (r: Ring): Vec2[] => r.map((q) => toFrame(a.frame, toWorld(b.frame, q)));
          overlap = overlapArea(a.polygon, { outer: bInA(b.polygon.outer), holes: b.polygon.holes.map(bInA) });
          cache.set(key, overlap);
        }
        if (overlap > MIN_REGION_AREA) clashes.push({ a, b, distance: d, overlap });
      }
    }
  }
  // One finding per congruent situation: same templates, same gap, same overlap.
  const merged = new Map<string, Clash[]>();
  for (const c of clashes) {
    const [ta, tb] = [c.a.template, c.b.template].sort((x, y) => x - y);
    const key = `${ta}|${tb}|${Math.round(c.distance * 100)}|${Math.round(c.overlap)}`;
    const list = merged.get(key);
    if (list) list.push(c);
    else merged.set(key, [c]);
  }
  const findings: Finding[] = [];
  for (const list of merged.values()) {
    const c = list[0];
    const where =
      c.distance <= LENGTH_TOL
        ? `${c.a.id} and ${c.b.id} lie on the same plane`
        : `${c.a.id} and ${c.b.id} lie on parallel planes ${mm(c.distance)} mm apart, less than the ${mm(t)} mm material,`;
    const more = list.length > 1 ? ` The same holds for ${list.length - 1} more ${list.length === 2 ? 'pair' : 'pairs'} in the same position: ${pairList(list.slice(1))}.` : '';
    findings.push({
      code: 'slab-clash',
      severity: 'error',
      message:
        `${where} and their outlines overlap by about ${mm(c.overlap)} mm², so the two parts would occupy the same space. ` +
        `Change a family offset so the planes are at least ${mm(t)} mm apart, or trim the outlines so they no longer overlap.${more}`,
      pieces: unique(list.flatMap((x) => [x.a.id, x.b.id])),
    });
  }
  return findings;
}

/** Area (mm²) where two polygons in one frame overlap. */
function overlapArea(a: Polygon2, b: Polygon2): number {
  let s = 0;
  for (const p of Clipper.Intersect(polygonPaths(a), polygonPaths(b), FillRule.NonZero)) s += areaMm2(p);
  return s;
}

/** Two 32-bit running hashes over integers: 64 bits, so unrelated shapes do not collide in practice. */
class Hash {
  private h1 = 0x811c9dc5;
  private h2 = 0x01000193;
  add(v: number): void {
    this.h1 = Math.imul(this.h1 ^ v, 16777619);
    this.h2 = Math.imul(this.h2 + v, 2246822519) ^ (this.h2 >>> 13);
  }
  toString(): string {
    return `${this.h1 >>> 0}:${this.h2 >>> 0}`;
  }
}

const shapeHashes = new WeakMap<Piece, string>();

/**
 * Hash of a piece's polygon mapped back into its motif's frame (inverse of `piece.map`, which is
 * orthogonal) at 0.01 mm, independent of where each ring starts, of its direction and of the
 * order of the holes: congruent copies of one image hash alike. Cached per piece object.
 */
function shapeHash(p: Piece): string {
  let h = shapeHashes.get(p);
  if (h !== undefined) return h;
  const m = p.map;
  const ringHash = (ring: Ring): string => {
    const n = ring.length;
    const xs = new Array<number>(n);
    const ys = new Array<number>(n);
    let area = 0;
    for (let i = 0; i < n; i++) {
      xs[i] = Math.round((m[0] * ring[i][0] + m[2] * ring[i][1]) * 100);
      ys[i] = Math.round((m[1] * ring[i][0] + m[3] * ring[i][1]) * 100);
    }
    let start = 0;
    for (let i = 0; i < n; i++) {
      const j = (i + 1) % n;
      area += xs[i] * ys[j] - xs[j] * ys[i];
      if (xs[i] < xs[start] || (xs[i] === xs[start] && ys[i] < ys[start])) start = i;
    }
    const step = area >= 0 ? 1 : n - 1;
    const hash = new Hash();
    hash.add(n);
    for (let k = 0, i = start; k < n; k++, i = (i + step) % n) {
      hash.add(xs[i]);
      hash.add(ys[i]);
    }
    return hash.toString();
  };
  h = `${p.template}|${p.motif}|${ringHash(p.polygon.outer)}|${p.polygon.holes.map(ringHash).sort().join(',')}`;
  shapeHashes.set(p, h);
  return h;
}

/**
 * Where b sits relative to a, in a's motif frame: the map from b's motif-frame coordinates to
 * a's (linear part and shift), rounded. Equal for every symmetric copy of the pair.
 */
function placementKey(a: Piece, b: Piece): string {
  // L: b's frame → a's frame (parallel planes: an isometry of the plane), τ its shift.
  const [l0, l1, l2, l3, t0, t1] = frameToFrame(b.frame, a.frame);
  const [a0, a1, a2, a3] = a.map;
  const [b0, b1, b2, b3] = b.map;
  // M = Aᵀ · L · B,  τ' = Aᵀ · τ.
  const lb0 = l0 * b0 + l1 * b2;
  const lb1 = l0 * b1 + l1 * b3;
  const lb2 = l2 * b0 + l3 * b2;
  const lb3 = l2 * b1 + l3 * b3;
  const m0 = Math.round((a0 * lb0 + a2 * lb2) * 1e6);
  const m1 = Math.round((a0 * lb1 + a2 * lb3) * 1e6);
  const m2 = Math.round((a1 * lb0 + a3 * lb2) * 1e6);
  const m3 = Math.round((a1 * lb1 + a3 * lb3) * 1e6);
  return `${m0},${m1},${m2},${m3}|${Math.round((a0 * t0 + a2 * t1) * 100)},${Math.round((a1 * t0 + a3 * t1) * 100)}`;
}

/** Box of `p`'s outline seen in the frame `ref` of a parallel plane (the outline projected). */
function ringBoxIn(p: Piece, ref: Piece['frame']): [number, number, number, number] {
  const [l0, l1, l2, l3, t0, t1] = frameToFrame(p.frame, ref);
  let x0 = Infinity;
  let y0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  for (const q of p.polygon.outer) {
    const x = l0 * q[0] + l1 * q[1] + t0;
    const y = l2 * q[0] + l3 * q[1] + t1;
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
  }
  return [x0, y0, x1, y1];
}

function pairList(list: readonly Clash[]): string {
  const shown = list.slice(0, 6).map((c) => `${c.a.id}–${c.b.id}`);
  return list.length > 6 ? `${shown.join(', ')} and ${list.length - 6} more` : shown.join(', ');
}

// ---------------------------------------------------------------------------------------------
// Slots: mortise-splits-piece and slot-near-edge

/** One slot in a piece's frame. */
export interface PieceSlot {
  readonly partner: string;
  readonly kind: JointKind;
  readonly from: Vec2;
  readonly to: Vec2;
  /** True where that end lies on (or beyond) the piece's boundary: the slot opens there. */
  readonly openFrom: boolean;
  readonly openTo: boolean;
}

/** Ends within this distance (mm) of the boundary are on it. */
const EDGE_TOL = 10 * LENGTH_TOL;

/**
 * The slots the joints cut into `piece`, in its frame, with which ends open onto its boundary.
 * Slot segments are projected onto the piece's plane; zero-length slots are dropped.
 */
export function pieceSlots(piece: Piece, joints: readonly Joint[]): PieceSlot[] {
  return withOpenEnds(piece, rawSlots(piece, joints));
}

type RawSlot = Omit<PieceSlot, 'openFrom' | 'openTo'>;

function rawSlots(piece: Piece, joints: readonly Joint[]): RawSlot[] {
  const out: RawSlot[] = [];
  const { origin: o, u, v } = piece.frame;
  for (const j of joints) {
    for (const s of j.slots) {
      if (s.piece !== piece.id) continue;
      const fx = s.from[0] - o[0];
      const fy = s.from[1] - o[1];
      const fz = s.from[2] - o[2];
      const tx = s.to[0] - o[0];
      const ty = s.to[1] - o[1];
      const tz = s.to[2] - o[2];
      const from: Vec2 = [fx * u[0] + fy * u[1] + fz * u[2], fx * v[0] + fy * v[1] + fz * v[2]];
      const to: Vec2 = [tx * u[0] + ty * u[1] + tz * u[2], tx * v[0] + ty * v[1] + tz * v[2]];
      const dx = to[0] - from[0];
      const dy = to[1] - from[1];
      if (dx * dx + dy * dy <= LENGTH_TOL * LENGTH_TOL) continue;
      out.push({ partner: j.a === piece.id ? j.b : j.a, kind: j.kind, from, to });
    }
  }
  return out;
}

function withOpenEnds(piece: Piece, slots: readonly RawSlot[]): PieceSlot[] {
  return slots.map((s) => ({
    ...s,
    openFrom: locateInPolygon(s.from, piece.polygon, EDGE_TOL) !== 'inside',
    openTo: locateInPolygon(s.to, piece.polygon, EDGE_TOL) !== 'inside',
  }));
}

/**
 * The material a slot removes: a rectangle `width` wide centred on the segment. An open end is
 * pushed past the boundary far enough that both corners of the rectangle clear the edge it
 * crosses, (width/2)/tan(angle to that edge) + 0.05 mm, at most 2.5 × width, so a slot that
 * meets the edge at a slant leaves no burr of material at its mouth and the boolean sees a clean
 * crossing rather than a point contact.
 */
export function slotRectangle(polygon: Polygon2, slot: PieceSlot, width: number): Vec2[] {
  const dx = slot.to[0] - slot.from[0];
  const dy = slot.to[1] - slot.from[1];
  const len = Math.hypot(dx, dy);
  const ux = dx / len;
  const uy = dy / len;
  const back = slot.openFrom ? clearance(polygon, slot.from, ux, uy, width) : 0;
  const ahead = slot.openTo ? clearance(polygon, slot.to, ux, uy, width) : 0;
  const h = width / 2;
  const a: Vec2 = [slot.from[0] - ux * back, slot.from[1] - uy * back];
  const b: Vec2 = [slot.to[0] + ux * ahead, slot.to[1] + uy * ahead];
  return [
    [a[0] + uy * h, a[1] - ux * h],
    [b[0] + uy * h, b[1] - ux * h],
    [b[0] - uy * h, b[1] + ux * h],
    [a[0] - uy * h, a[1] + ux * h],
  ];
}

function clearance(polygon: Polygon2, p: Vec2, ux: number, uy: number, width: number): number {
  // The edge nearest the end (ties: the one met at the shallowest angle) sets the extension.
  let best = Infinity;
  let sin = 1;
  for (const ring of [polygon.outer, ...polygon.holes]) {
    for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
      const d = segmentDistance(p, p, ring[j], ring[i]);
      if (d > best + EDGE_TOL) continue;
      const ex = ring[i][0] - ring[j][0];
      const ey = ring[i][1] - ring[j][1];
      const el = Math.hypot(ex, ey);
      if (el === 0) continue;
      const s = Math.abs(ux * ey - uy * ex) / el;
      if (d < best - EDGE_TOL) {
        best = d;
        sin = s;
      } else sin = Math.min(sin, s);
    }
  }
  const cos = Math.sqrt(Math.max(0, 1 - sin * sin));
  return Math.min(2.5 * width, (width / 2) * (cos / Math.max(sin, 1e-9)) + 0.05);
}

interface SlotVerdict {
  /** Separate regions left after cutting every slot (1 when the piece holds together). */
  readonly regions: number;
  readonly areas: readonly number[];
  /** Slots that split the piece on their own. */
  readonly alone: readonly number[];
  /** Closed slots too close to the boundary: slot index, distance, which boundary. */
  readonly near: readonly { slot: number; distance: number; ring: number }[];
}

function judgeSlots(polygon: Polygon2, slots: readonly PieceSlot[], t: number): SlotVerdict {
  const subject = polygonPaths(polygon);
  const rects = slots.map((s) => ringPath(slotRectangle(polygon, s, t), true));
  const parts = (clip: Paths64): number[] =>
    Clipper.Difference(subject, clip, FillRule.NonZero)
      .map(areaMm2)
      .filter((a) => a > MIN_REGION_AREA);
  const areas = parts(rects as Paths64).sort((x, y) => y - x);
  const alone: number[] = [];
  if (areas.length > 1) {
    // Only a slot open at both ends can split a piece by itself without touching a hole or
    // doubling back; the others are reported together.
    rects.forEach((r, k) => {
      if (slots[k].openFrom && slots[k].openTo && parts([r] as Paths64).length > 1) alone.push(k);
    });
  }
  const near: { slot: number; distance: number; ring: number }[] = [];
  slots.forEach((s, k) => {
    if (s.openFrom || s.openTo) return;
    const rect = slotRectangle(polygon, s, t);
    const rings = [polygon.outer, ...polygon.holes];
    let distance = Infinity;
    let which = -1;
    rings.forEach((ring, r) => {
      const d = rectRingDistance(rect, ring);
      if (d < distance) {
        distance = d;
        which = r - 1;
      }
    });
    if (distance < t - LENGTH_TOL) near.push({ slot: k, distance, ring: which });
  });
  return { regions: Math.max(1, areas.length), areas, alone, near };
}

function rectRingDistance(rect: readonly Vec2[], ring: Ring): number {
  let d = Infinity;
  for (let i = 0; i < 4; i++) {
    const a = rect[i];
    const b = rect[(i + 1) % 4];
    for (let k = 0, l = ring.length - 1; k < ring.length; l = k++) d = Math.min(d, segmentDistance(a, b, ring[l], ring[k]));
  }
  return d;
}

function slotFindings(pieces: readonly Piece[], joints: readonly Joint[], t: number): Finding[] {
  // Configurations keyed by geometry in the motif's frame; pieces in one entry are congruent
  // with their slots, so one verdict serves them all.
  const configs = new Map<string, { pieces: Piece[]; slots: PieceSlot[]; verdict: SlotVerdict }>();
  const bySlots = new Map<string, Joint[]>();
  for (const j of joints) {
    for (const s of j.slots) {
      const list = bySlots.get(s.piece);
      if (list) {
        if (list[list.length - 1] !== j) list.push(j);
      } else bySlots.set(s.piece, [j]);
    }
  }
  for (const p of pieces) {
    const own = bySlots.get(p.id);
    if (!own) continue;
    const raw = rawSlots(p, own);
    if (raw.length === 0) continue;
    const key = configKey(p, raw);
    const entry = configs.get(key);
    if (entry) entry.pieces.push(p);
    else {
      const slots = withOpenEnds(p, raw);
      configs.set(key, { pieces: [p], slots, verdict: judgeSlots(p.polygon, slots, t) });
    }
  }
  const findings: Finding[] = [];
  for (const { pieces: group, slots, verdict } of configs.values()) {
    const p = group[0];
    const others = group.length > 1 ? ` The same holds for ${group.length - 1} congruent ${group.length === 2 ? 'piece' : 'pieces'}: ${idList(group.slice(1).map((q) => q.id))}.` : '';
    if (verdict.regions > 1) {
      const culprits =
        verdict.alone.length > 0
          ? `the ${verdict.alone.map((k) => slotName(slots[k])).join(' and the ')} ${verdict.alone.length === 1 ? 'cuts' : 'each cut'} right through it`
          : `its slots together (${slots.map(slotName).join(', ')}) cut right through it`;
      findings.push({
        code: 'mortise-splits-piece',
        severity: 'error',
        message:
          `${p.id} would fall apart into ${verdict.regions} parts (${verdict.areas.map((a) => `${mm(a)} mm²`).join(', ')}): ${culprits}. ` +
          `Shorten or move the joint so at least ${mm(t)} mm of material stays around the slot, or widen the piece there.${others}`,
        pieces: group.map((q) => q.id),
      });
    }
    if (verdict.near.length > 0) {
      const items = verdict.near.map(
        (n) =>
          // Below 0.05 mm the rounded figure would read "0 mm from": say what it means instead.
          `the ${slotName(slots[n.slot])} ${n.distance < 0.05 ? 'reaches' : `is ${mm(n.distance)} mm from`} ${n.ring < 0 ? 'the outline' : `hole ${n.ring + 1}`}`,
      );
      findings.push({
        code: 'slot-near-edge',
        severity: 'warning',
        message:
          `In ${p.id} ${items.join('; ')}, less than one material thickness (${mm(t)} mm; common practice, no source), ` +
          `so the edge may crack or burn through. Move the joint inward or enlarge the piece there.${others}`,
        pieces: group.map((q) => q.id),
      });
    }
  }
  return findings;
}

function slotName(s: PieceSlot): string {
  const what = s.kind === 'mortise-and-tenon' ? 'mortise' : s.kind === 'cross-lap' ? 'cross-lap slot' : 'slot';
  const len = Math.hypot(s.to[0] - s.from[0], s.to[1] - s.from[1]);
  return `${what} for the joint with ${s.partner} (${mm(len)} mm long)`;
}

/**
 * A key equal for two pieces whose outline and slots coincide once mapped back into the motif's
 * frame (through the inverse of `piece.map`, an orthogonal matrix), at 0.01 mm. Equal keys mean
 * congruent situations; a piece whose first contributing element differs only gets its own key.
 */
function configKey(p: Piece, slots: readonly RawSlot[]): string {
  const m = p.map;
  const hashes: number[] = [];
  for (const s of slots) {
    const ax = Math.round((m[0] * s.from[0] + m[2] * s.from[1]) * 100);
    const ay = Math.round((m[1] * s.from[0] + m[3] * s.from[1]) * 100);
    const bx = Math.round((m[0] * s.to[0] + m[2] * s.to[1]) * 100);
    const by = Math.round((m[1] * s.to[0] + m[3] * s.to[1]) * 100);
    const forward = ax < bx || (ax === bx && ay <= by);
    let h = 0x811c9dc5;
    for (const v of forward ? [ax, ay, bx, by] : [bx, by, ax, ay]) h = Math.imul(h ^ v, 16777619);
    hashes.push(Math.imul(h ^ KIND_CODE[s.kind], 16777619) >>> 0);
  }
  hashes.sort((x, y) => x - y);
  const all = new Hash();
  for (const h of hashes) all.add(h);
  return `${shapeHash(p)}|${slots.length}|${all.toString()}`;
}

const KIND_CODE: Record<JointKind, number> = { corner: 1, 'mortise-and-tenon': 2, 'cross-lap': 3, 'through-slot': 4, 'locked-crossing': 5 };

// ---------------------------------------------------------------------------------------------
// thin-feature

/** A part of a piece that a disc of radius `thickness` cannot reach. */
export interface ThinRegion {
  /** mm². */
  readonly area: number;
  /** Width of the rectangle with the same area and perimeter (mm): about the strip's width. */
  readonly width: number;
  /** Centre of its bounding box in the piece's frame. */
  readonly center: Vec2;
}

/** Overlap (mm) of the opening past the outline, see {@link thinRegions}. */
const SEAM = 0.01;

/** Angle step (radians) for the arcs of an offset: the arc sags by at most 1.4 % of its radius. */
const ARC_STEP = (12 * Math.PI) / 180;

/**
 * Parts of `polygon` narrower than 2 × `thickness`, by a morphological opening with a disc of
 * radius r = thickness: inset by r, outset by r, and keep what the opening removed. A strip
 * narrower than 2r vanishes in the inset and does not come back; a wider part comes back whole
 * except for its convex corners, which the disc rounds off. Lost regions of at least
 * {@link THIN_AREA_FACTOR} × r² are returned, largest first.
 *
 * A convex outline without holes is settled first without booleans: when the whole opening
 * removes less than the threshold (Steiner formula on the exact inset), nothing is reported.
 *
 * Method: each offset is built as the raw offset ring (edges moved by r, arcs at the joins that
 * open, the original vertex at the joins that close) and cleaned by a clipper2-js union with
 * the positive fill rule — what a polygon offsetter does inside. (clipper2-js 1.2.4's own
 * `InflatePaths` returns wrong outlines here, even for a rectangle.) Limits: the width is an
 * estimate (exact for a rectangular strip); a region is reported once however long it is; very
 * sharp points (under about 35°) count as thin; the arcs are polygons, so strips within about
 * 1.5 % of 2r can go either way.
 */
export function thinRegions(polygon: Polygon2, thickness: number): ThinRegion[] {
  const minArea = THIN_AREA_FACTOR * thickness * thickness;
  if (polygon.holes.length === 0 && convexLoss(polygon.outer, thickness) < minArea) return [];
  const r = thickness * SCALE;
  const subject = polygonPaths(polygon);
  const inset = offsetPaths(subject, -r);
  // The outset goes 0.01 mm further than the inset came in, so the opening overlaps the outline
  // where they coincide: lost corners that would touch along a zero-width seam stay apart.
  const opened = inset.length > 0 ? offsetPaths(inset, r + SEAM * SCALE) : ([] as unknown as Paths64);
  const lost = regionsOf(Clipper.Difference(subject, opened, FillRule.NonZero));
  return lost
    .filter((g) => g.area >= minArea)
    .map((g) => {
      const half = g.perimeter / 2;
      const disc = half * half - 4 * g.area;
      const width = disc >= 0 ? (half - Math.sqrt(disc)) / 2 : Math.sqrt(g.area);
      return {
        area: g.area,
        width: Math.min(width, 2 * thickness),
        center: [(g.box[0] + g.box[2]) / 2, (g.box[1] + g.box[3]) / 2] as Vec2,
      };
    })
    .sort((a, b) => b.area - a.area);
}

/**
 * For a convex ring, the total area its opening by a disc of radius r removes, exactly, without
 * booleans: the inset E is the intersection of the edges' half-planes moved in by r, and by the
 * Steiner formula the opening E ⊕ disc has area(E) + r·perimeter(E) + πr². Infinity for a
 * non-convex ring or an empty inset (the caller then runs the general method).
 */
function convexLoss(ring: Ring, r: number): number {
  const n = ring.length;
  if (n < 3) return Infinity;
  let area = 0;
  for (let i = 0; i < n; i++) {
    const a = ring[i];
    const b = ring[(i + 1) % n];
    area += a[0] * b[1] - b[0] * a[1];
  }
  const ccw = area > 0 ? 1 : -1;
  for (let i = 0; i < n; i++) {
    const a = ring[(i + n - 1) % n];
    const b = ring[i];
    const c = ring[(i + 1) % n];
    if (ccw * ((b[0] - a[0]) * (c[1] - b[1]) - (b[1] - a[1]) * (c[0] - b[0])) < -1e-12) return Infinity;
  }
  let inset: Vec2[] = ring.slice();
  for (let i = 0; i < n && inset.length > 0; i++) {
    const a = ring[i];
    const b = ring[(i + 1) % n];
    const len = Math.hypot(b[0] - a[0], b[1] - a[1]);
    if (len === 0) continue;
    // Inward normal (material on the left for ccw = 1); keep points at least r inside the edge.
    const nx = (-(b[1] - a[1]) / len) * ccw;
    const ny = ((b[0] - a[0]) / len) * ccw;
    const side = (p: Vec2): number => (p[0] - a[0]) * nx + (p[1] - a[1]) * ny - r;
    const next: Vec2[] = [];
    for (let k = 0; k < inset.length; k++) {
      const p = inset[k];
      const q = inset[(k + 1) % inset.length];
      const sp = side(p);
      const sq = side(q);
      if (sp >= 0) next.push(p);
      if ((sp >= 0) !== (sq >= 0)) {
        const t = sp / (sp - sq);
        next.push([p[0] + (q[0] - p[0]) * t, p[1] + (q[1] - p[1]) * t]);
      }
    }
    inset = next;
  }
  if (inset.length < 3) return Infinity;
  let eArea = 0;
  let ePerim = 0;
  for (let k = 0; k < inset.length; k++) {
    const p = inset[k];
    const q = inset[(k + 1) % inset.length];
    eArea += p[0] * q[1] - q[0] * p[1];
    ePerim += Math.hypot(q[0] - p[0], q[1] - p[1]);
  }
  return Math.abs(area) / 2 - (Math.abs(eArea) / 2 + r * ePerim + Math.PI * r * r);
}

function offsetPaths(paths: Paths64, delta: number): Paths64 {
  const raw = paths.map((p) => rawOffset(p, delta)).filter((p) => p.length >= 3);
  return Clipper.Union(raw as Paths64, undefined, FillRule.Positive);
}

/** The raw offset of one ring with material on its left, by `delta` (> 0 outward). */
function rawOffset(path: Path64, delta: number): Path64 {
  const p: { x: number; y: number }[] = [];
  for (const q of path) {
    const last = p[p.length - 1];
    if (!last || last.x !== q.x || last.y !== q.y) p.push(q);
  }
  while (p.length > 1 && p[0].x === p[p.length - 1].x && p[0].y === p[p.length - 1].y) p.pop();
  const n = p.length;
  const out: { x: number; y: number }[] = [];
  if (n < 3) return out as Path64;
  const nx = new Float64Array(n);
  const ny = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = p[i];
    const b = p[(i + 1) % n];
    const len = Math.hypot(b.x - a.x, b.y - a.y);
    nx[i] = (b.y - a.y) / len; // right-hand normal: outward when material is on the left
    ny[i] = -(b.x - a.x) / len;
  }
  const sign = Math.sign(delta);
  const radius = Math.abs(delta);
  for (let i = 0; i < n; i++) {
    const b = p[i];
    const j = (i + n - 1) % n;
    out.push({ x: Math.round(b.x + delta * nx[j]), y: Math.round(b.y + delta * ny[j]) });
    const turn = nx[j] * ny[i] - ny[j] * nx[i];
    if (turn * delta > 0) {
      const a0 = Math.atan2(sign * ny[j], sign * nx[j]);
      let sweep = Math.atan2(sign * ny[i], sign * nx[i]) - a0;
      if (sweep > Math.PI) sweep -= 2 * Math.PI;
      else if (sweep < -Math.PI) sweep += 2 * Math.PI;
      const steps = Math.ceil(Math.abs(sweep) / ARC_STEP);
      for (let k = 1; k < steps; k++) {
        const a = a0 + (sweep * k) / steps;
        out.push({ x: Math.round(b.x + radius * Math.cos(a)), y: Math.round(b.y + radius * Math.sin(a)) });
      }
    } else {
      out.push({ x: b.x, y: b.y });
    }
    out.push({ x: Math.round(b.x + delta * nx[i]), y: Math.round(b.y + delta * ny[i]) });
  }
  return out as Path64;
}

function thinFindings(pieces: readonly Piece[], t: number, templates: readonly Template[] | undefined): Finding[] {
  const members = new Map<number, Piece[]>();
  for (const p of pieces) {
    const list = members.get(p.template);
    if (list) list.push(p);
    else members.set(p.template, [p]);
  }
  const repId = new Map((templates ?? []).map((tp) => [tp.index, tp.representative]));
  const findings: Finding[] = [];
  for (const [index, list] of members) {
    const rep = list.find((p) => p.id === repId.get(index)) ?? list[0];
    if (polygonArea(rep.polygon) <= 0) continue;
    const regions = thinRegions(rep.polygon, t);
    if (regions.length === 0) continue;
    const parts = regions.map((g) => `about ${mm(g.width)} mm wide around (${mm(g.center[0])}, ${mm(g.center[1])}), ${mm(g.area)} mm²`);
    const others = list.length > 1 ? ` The same holds for its ${list.length - 1} congruent ${list.length === 2 ? 'copy' : 'copies'}: ${idList(list.filter((p) => p !== rep).map((p) => p.id))}.` : '';
    findings.push({
      code: 'thin-feature',
      severity: 'warning',
      message:
        `${rep.id} has ${regions.length === 1 ? 'a part' : `${regions.length} parts`} narrower than twice the material thickness ` +
        `(${mm(2 * t)} mm; common practice, no source): ${parts.join('; ')} (coordinates in the piece's drawing frame). ` +
        `Such parts break or warp; widen them to at least ${mm(2 * t)} mm or remove them.${others}`,
      pieces: [rep.id, ...list.filter((p) => p !== rep).map((p) => p.id)],
    });
  }
  return findings;
}

// ---------------------------------------------------------------------------------------------

/** Millimetres with at most one decimal, no trailing ".0". */
function mm(x: number): string {
  const v = Math.round(x * 10) / 10;
  return String(Object.is(v, -0) ? 0 : v);
}

function unique(ids: readonly string[]): string[] {
  return [...new Set(ids)];
}

function idList(ids: readonly string[]): string {
  return ids.length > 8 ? `${ids.slice(0, 8).join(', ')} and ${ids.length - 8} more` : ids.join(', ');
}

