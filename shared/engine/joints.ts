/**
 * Contacts and joints between pieces (FORMAT.md §3).
 *
 * Pieces are mid-surfaces. For two pieces A, B on non-parallel planes, L is the line where the
 * planes meet. Each piece is rewritten in coordinates (s, w): s along L (the same parameter for
 * both pieces), w across L inside the piece's own plane. A point at w lies |w|·sin θ from the
 * other plane, so "within thickness/2 of the other plane" is the band |w| ≤ r, r = t / (2 sin θ).
 * A piece's chord is the projection onto L of its part inside that band — the set of points of L
 * the piece reaches — as closed intervals. The joints are the connected parts of the
 * intersection of the two chords longer than {@link MIN_JOINT_SEGMENT}.
 *
 * The hot path works on flat typed arrays in module-level scratch buffers: no tuples are made
 * per edge or per pair, only the joints found.
 */
import type { Joint, JointKind, JointSlot, Piece } from './model.js';
import { LENGTH_TOL, MIN_JOINT_SEGMENT } from './tolerance.js';
import type { Vec3 } from './vec.js';
import { overlappingPairs, pieceBoxes } from './spatial.js';

/** Default angle tolerance for "orthogonal" in degrees (FORMAT.md §3). */
export const DEFAULT_ANGLE_TOLERANCE_DEG = 0.5;

/** Planes whose normals are closer than this (sine of the angle) are parallel: no joint here. */
export const PARALLEL_SIN = 1e-6;

/** Options of the joint search. */
export interface JointOptions {
  /** Material thickness in mm (> 0): sets the reach t/2 of every piece. */
  readonly thickness: number;
  /** |90° − θ| at most this counts as orthogonal; default {@link DEFAULT_ANGLE_TOLERANCE_DEG}. */
  readonly angleToleranceDeg?: number;
}

/**
 * A piece in the flat form the joint search reads: frame as numbers, every ring's points in
 * one pair of arrays, and a bounding circle in its plane (centre in world coordinates).
 * Build once per piece with {@link preparePiece} and reuse across audits (it is immutable).
 */
export interface PreparedPiece {
  readonly piece: Piece;
  readonly nx: number; readonly ny: number; readonly nz: number;
  readonly offset: number;
  readonly ox: number; readonly oy: number; readonly oz: number;
  readonly ux: number; readonly uy: number; readonly uz: number;
  readonly vx: number; readonly vy: number; readonly vz: number;
  /** Frame coordinates of every ring's points, rings one after another (outer first). */
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  /** ringStart[k] is the first point of ring k; ringStart[rings] = number of points. */
  readonly ringStart: Int32Array;
  readonly rings: number;
  /** Centre (world) and radius of a circle in the plane holding the outer ring. */
  readonly cx: number; readonly cy: number; readonly cz: number;
  readonly radius: number;
}

/**
 * The flat form of `piece` (see {@link PreparedPiece}). Rings with fewer than three points are
 * dropped; a piece left with none takes part in no joint.
 */
export function preparePiece(piece: Piece): PreparedPiece {
  const rings = [piece.polygon.outer, ...piece.polygon.holes].filter((r) => r.length >= 3);
  const total = rings.reduce((n, r) => n + r.length, 0);
  const xs = new Float64Array(total);
  const ys = new Float64Array(total);
  const ringStart = new Int32Array(rings.length + 1);
  let k = 0;
  rings.forEach((ring, i) => {
    ringStart[i] = k;
    for (const p of ring) {
      xs[k] = p[0];
      ys[k] = p[1];
      k++;
    }
  });
  ringStart[rings.length] = k;
  let x0 = Infinity, y0 = Infinity, x1 = -Infinity, y1 = -Infinity;
  const outerEnd = rings.length ? ringStart[1] : 0;
  for (let i = 0; i < outerEnd; i++) {
    if (xs[i] < x0) x0 = xs[i];
    if (xs[i] > x1) x1 = xs[i];
    if (ys[i] < y0) y0 = ys[i];
    if (ys[i] > y1) y1 = ys[i];
  }
  const mx = outerEnd ? (x0 + x1) / 2 : 0;
  const my = outerEnd ? (y0 + y1) / 2 : 0;
  let radius = outerEnd ? 0 : -1;
  for (let i = 0; i < outerEnd; i++) radius = Math.max(radius, Math.hypot(xs[i] - mx, ys[i] - my));
  const f = piece.frame;
  return {
    piece,
    nx: f.normal[0], ny: f.normal[1], nz: f.normal[2],
    offset: f.offset,
    ox: f.origin[0], oy: f.origin[1], oz: f.origin[2],
    ux: f.u[0], uy: f.u[1], uz: f.u[2],
    vx: f.v[0], vy: f.v[1], vz: f.v[2],
    xs, ys, ringStart, rings: rings.length,
    cx: f.origin[0] + mx * f.u[0] + my * f.v[0],
    cy: f.origin[1] + mx * f.u[1] + my * f.v[1],
    cz: f.origin[2] + mx * f.u[2] + my * f.v[2],
    radius,
  };
}

// ---------------------------------------------------------------------------------------------
// Scratch buffers, grown on demand. The engine is synchronous, so one set serves every call.

let SA = new Float64Array(64), WA = new Float64Array(64), SB = new Float64Array(64), WB = new Float64Array(64);
let IA = new Float64Array(64), IB = new Float64Array(64);
let LO = new Float64Array(64), HI = new Float64Array(64), CP = new Float64Array(64), CM = new Float64Array(64);

function ensureVertexScratch(n: number): void {
  if (SA.length >= n && SB.length >= n) return;
  const m = Math.max(n, SA.length * 2);
  SA = new Float64Array(m); WA = new Float64Array(m); SB = new Float64Array(m); WB = new Float64Array(m);
}

function ensureEdgeScratch(n: number): void {
  // A piece with n points has n edges: at most n raw intervals, n crossings per band line,
  // and after pairing at most 2n intervals before merging.
  const need = 2 * n + 8;
  if (LO.length >= need) return;
  const m = Math.max(need, LO.length * 2);
  LO = new Float64Array(m); HI = new Float64Array(m); CP = new Float64Array(m); CM = new Float64Array(m);
  IA = new Float64Array(2 * m); IB = new Float64Array(2 * m);
}

/** Writes the (s, w) coordinates of `p`'s points for the line through (px, py, pz) along d. */
function toLineCoords(
  p: PreparedPiece,
  px: number, py: number, pz: number,
  dx: number, dy: number, dz: number,
  S: Float64Array, W: Float64Array,
): void {
  // Across-direction in p's plane: wdir = d × n, so that w grows towards the other plane's +side
  // for piece A (d = nA × nB) and towards its −side for piece B; the band is symmetric either way.
  const wx = dy * p.nz - dz * p.ny, wy = dz * p.nx - dx * p.nz, wz = dx * p.ny - dy * p.nx;
  const su = p.ux * dx + p.uy * dy + p.uz * dz, sv = p.vx * dx + p.vy * dy + p.vz * dz;
  const wu = p.ux * wx + p.uy * wy + p.uz * wz, wv = p.vx * wx + p.vy * wy + p.vz * wz;
  const rx = p.ox - px, ry = p.oy - py, rz = p.oz - pz;
  const s0 = rx * dx + ry * dy + rz * dz, w0 = rx * wx + ry * wy + rz * wz;
  const xs = p.xs, ys = p.ys, n = xs.length;
  for (let i = 0; i < n; i++) {
    S[i] = s0 + xs[i] * su + ys[i] * sv;
    W[i] = w0 + xs[i] * wu + ys[i] * wv;
  }
}

/**
 * The chord of a piece: the projection onto L of its part inside the band |w| ≤ R, as merged
 * closed intervals written to `out` ([lo0, hi0, lo1, hi1, …]); returns the interval count.
 * The projection of (polygon ∩ band) is the union of the projections of its boundary: the
 * polygon's edges clipped to the band, and the polygon's own chords along the band lines w = ±R.
 */
function chordOf(p: PreparedPiece, S: Float64Array, W: Float64Array, R: number, out: Float64Array): number {
  let m = 0, np = 0, nm = 0;
  const rs = p.ringStart;
  for (let r = 0; r < p.rings; r++) {
    const start = rs[r], end = rs[r + 1];
    let s1 = S[end - 1], w1 = W[end - 1];
    for (let k = start; k < end; k++) {
      const s2 = S[k], w2 = W[k];
      if (!((w1 > R && w2 > R) || (w1 < -R && w2 < -R))) {
        let t0 = 0, t1 = 1;
        const dw = w2 - w1;
        if (dw !== 0) {
          let ta = (-R - w1) / dw, tb = (R - w1) / dw;
          if (ta > tb) { const x = ta; ta = tb; tb = x; }
          if (ta > t0) t0 = ta;
          if (tb < t1) t1 = tb;
        }
        if (t0 <= t1) {
          const sa = s1 + t0 * (s2 - s1), sb = s1 + t1 * (s2 - s1);
          if (sa <= sb) { LO[m] = sa; HI[m] = sb; } else { LO[m] = sb; HI[m] = sa; }
          m++;
        }
      }
      if ((w1 > R) !== (w2 > R)) CP[np++] = s1 + ((R - w1) / (w2 - w1)) * (s2 - s1);
      if ((w1 > -R) !== (w2 > -R)) CM[nm++] = s1 + ((-R - w1) / (w2 - w1)) * (s2 - s1);
      s1 = s2; w1 = w2;
    }
  }
  if (np > 1) {
    sortPrefix(CP, np);
    for (let k = 0; k + 1 < np; k += 2) { LO[m] = CP[k]; HI[m] = CP[k + 1]; m++; }
  }
  if (nm > 1) {
    sortPrefix(CM, nm);
    for (let k = 0; k + 1 < nm; k += 2) { LO[m] = CM[k]; HI[m] = CM[k + 1]; m++; }
  }
  if (m === 0) return 0;
  // The union depends only on the multisets of starts and ends, so sort them separately and sweep;
  // gaps up to LENGTH_TOL close (points closer than that are one point).
  sortPrefix(LO, m);
  sortPrefix(HI, m);
  let count = 0, i = 0, j = 0, active = 0, lo = 0;
  while (j < m) {
    if (i < m && LO[i] <= HI[j] + LENGTH_TOL) {
      if (active === 0) lo = LO[i];
      active++;
      i++;
    } else {
      active--;
      if (active === 0) {
        out[2 * count] = lo;
        out[2 * count + 1] = HI[j];
        count++;
      }
      j++;
    }
  }
  return count;
}

/** Sorts a[0..n) ascending in place: insertion sort for the short runs the hot loop sees. */
function sortPrefix(a: Float64Array, n: number): void {
  if (n > 24) {
    a.subarray(0, n).sort();
    return;
  }
  for (let i = 1; i < n; i++) {
    const x = a[i];
    let j = i - 1;
    while (j >= 0 && a[j] > x) {
      a[j + 1] = a[j];
      j--;
    }
    a[j + 1] = x;
  }
}

const BOUNDARY = 1;
const STRADDLE = 2;

/**
 * Whether the piece straddles the other plane at parameter `sm` on L: its cross-section across
 * L there, restricted to the runs that reach the band, extends beyond the band on both sides.
 */
function sideAt(p: PreparedPiece, S: Float64Array, W: Float64Array, sm: number, R: number): number {
  let n = 0;
  const rs = p.ringStart;
  for (let r = 0; r < p.rings; r++) {
    const start = rs[r], end = rs[r + 1];
    let s1 = S[end - 1], w1 = W[end - 1];
    for (let k = start; k < end; k++) {
      const s2 = S[k], w2 = W[k];
      if ((s1 > sm) !== (s2 > sm)) CP[n++] = w1 + ((sm - s1) / (s2 - s1)) * (w2 - w1);
      s1 = s2; w1 = w2;
    }
  }
  if (n < 2) return BOUNDARY;
  sortPrefix(CP, n);
  let lo = Infinity, hi = -Infinity;
  for (let k = 0; k + 1 < n; k += 2) {
    const a = CP[k], b = CP[k + 1];
    if (b >= -R && a <= R) {
      if (a < lo) lo = a;
      if (b > hi) hi = b;
    }
  }
  return lo < -R && hi > R ? STRADDLE : BOUNDARY;
}

/**
 * Whether the part of a straddling piece on one side of the other plane can pass through the
 * closed slot [s0, s1] in one straight motion within its own plane (FORMAT.md §3 through-slot).
 * A motion direction not parallel to L is a slope k: a point (s, w) travels to L at s − k·w.
 * For each side, the pieces of (polygon ∩ that half-plane) whose border on L lies in the slot
 * must all map into [s0, s1] for one k; a piece of the half that also borders L outside the
 * slot (a ring, or a U whose arms pass elsewhere) cannot pass that way. Vertex constraints
 * give an interval of k; the side is feasible when the interval is non-empty.
 */
function canPassThrough(p: PreparedPiece, S: Float64Array, W: Float64Array, s0: number, s1: number): boolean {
  return passesOnSide(p, S, W, s0, s1, 1) || passesOnSide(p, S, W, s0, s1, -1);
}

function passesOnSide(p: PreparedPiece, S: Float64Array, W: Float64Array, s0: number, s1: number, sigma: number): boolean {
  const eps = LENGTH_TOL;
  const crossS: number[] = [];
  const arcVerts: number[][] = [];
  const arcEnds: number[] = []; // entry crossing, exit crossing per arc
  const rs = p.ringStart;
  for (let r = 0; r < p.rings; r++) {
    const start = rs[r], end = rs[r + 1], n = end - start;
    let k0 = -1;
    for (let k = start; k < end; k++) if (!(sigma * W[k] > eps)) { k0 = k; break; }
    if (k0 < 0) {
      if (r === 0) return false; // the whole piece lies on this side: it does not straddle
      continue; // a hole wholly on this side borders nothing on L
    }
    let current: number[] | null = null;
    let entry = -1;
    for (let step = 1; step <= n; step++) {
      const prev = start + ((k0 - start + step - 1) % n);
      const k = start + ((k0 - start + step) % n);
      const inPrev = sigma * W[prev] > eps, inK = sigma * W[k] > eps;
      if (!inPrev && inK) {
        entry = crossS.length;
        crossS.push(crossingS(S, W, prev, k));
        current = [];
      }
      if (inK) current!.push(k);
      if (inPrev && !inK) {
        const exit = crossS.length;
        crossS.push(crossingS(S, W, prev, k));
        arcVerts.push(current!);
        arcEnds.push(entry, exit);
        current = null;
      }
    }
  }
  const nc = crossS.length;
  if (nc === 0) return false;
  const parent = Array.from({ length: nc }, (_, i) => i);
  const find = (x: number): number => {
    while (parent[x] !== x) { parent[x] = parent[parent[x]]; x = parent[x]; }
    return x;
  };
  const union = (a: number, b: number): void => { parent[find(a)] = find(b); };
  for (let a = 0; a < arcVerts.length; a++) union(arcEnds[2 * a], arcEnds[2 * a + 1]);
  const order = Array.from({ length: nc }, (_, i) => i).sort((a, b) => crossS[a] - crossS[b]);
  for (let k = 0; k + 1 < nc; k += 2) union(order[k], order[k + 1]);
  const lo = s0 - eps, hi = s1 + eps;
  const adjacent = new Set<number>();
  for (let c = 0; c < nc; c++) if (crossS[c] >= lo && crossS[c] <= hi) adjacent.add(find(c));
  if (adjacent.size === 0) return false;
  for (let c = 0; c < nc; c++) if (adjacent.has(find(c)) && (crossS[c] < lo || crossS[c] > hi)) return false;
  let kLo = -Infinity, kHi = Infinity;
  for (let a = 0; a < arcVerts.length; a++) {
    if (!adjacent.has(find(arcEnds[2 * a]))) continue;
    for (const v of arcVerts[a]) {
      const w = sigma * W[v];
      // s − k'·w within [lo, hi] with k' = σk; the sign of k is free, so solve for k' directly.
      const a1 = (S[v] - hi) / w, a2 = (S[v] - lo) / w;
      if (a1 > kLo) kLo = a1;
      if (a2 < kHi) kHi = a2;
    }
  }
  return kLo <= kHi + 1e-12 * Math.max(1, Math.abs(kLo), Math.abs(kHi));
}

function crossingS(S: Float64Array, W: Float64Array, i: number, j: number): number {
  const dw = W[j] - W[i];
  let t = dw === 0 ? 0 : -W[i] / dw;
  if (t < 0) t = 0;
  else if (t > 1) t = 1;
  return S[i] + t * (S[j] - S[i]);
}

const round6 = (x: number): number => Math.round(x * 1e6) / 1e6 + 0;

/** Per-search constants, computed once from {@link JointOptions}. */
export interface JointContext {
  readonly half: number;
  readonly angleToleranceDeg: number;
}

/** The constants of a search; throws RangeError on a thickness that is not a positive number. */
export function jointContext(options: JointOptions): JointContext {
  if (!(options.thickness > 0) || !Number.isFinite(options.thickness)) throw new RangeError('thickness must be a positive number of mm');
  const tol = options.angleToleranceDeg ?? DEFAULT_ANGLE_TOLERANCE_DEG;
  if (!(tol >= 0) || !Number.isFinite(tol)) throw new RangeError('angleToleranceDeg must be a non-negative number');
  return { half: options.thickness / 2, angleToleranceDeg: tol };
}

/**
 * Appends to `out` the joints between two prepared pieces, in increasing order along
 * L = nA × nB, and returns how many were added. Nothing is added when the planes are parallel
 * (sin θ < {@link PARALLEL_SIN}), when either piece cannot reach the other's plane within t/2,
 * when the chords only touch at a point, or when every common segment is 0.1 mm or shorter.
 * Joint `a` is piece A, `b` piece B; lengths, angles and points are rounded to 1e-6.
 */
export function pairJoints(A: PreparedPiece, B: PreparedPiece, ctx: JointContext, out: Joint[]): number {
  if (A.rings === 0 || B.rings === 0) return 0;
  const cosRaw = A.nx * B.nx + A.ny * B.ny + A.nz * B.nz;
  const ex = A.ny * B.nz - A.nz * B.ny, ey = A.nz * B.nx - A.nx * B.nz, ez = A.nx * B.ny - A.ny * B.nx;
  const sin2 = ex * ex + ey * ey + ez * ez;
  const sin = Math.sqrt(sin2);
  if (sin < PARALLEL_SIN) return 0;
  const half = ctx.half;
  // Bounding circles: each piece must come within t/2 of the other's plane.
  const hA = A.cx * B.nx + A.cy * B.ny + A.cz * B.nz - B.offset;
  if (Math.abs(hA) > A.radius * sin + half + LENGTH_TOL) return 0;
  const hB = B.cx * A.nx + B.cy * A.ny + B.cz * A.nz - A.offset;
  if (Math.abs(hB) > B.radius * sin + half + LENGTH_TOL) return 0;
  const dx = ex / sin, dy = ey / sin, dz = ez / sin;
  // Point of L: (oA (nB × e) + oB (e × nA)) / |e|².
  const bex = B.ny * ez - B.nz * ey, bey = B.nz * ex - B.nx * ez, bez = B.nx * ey - B.ny * ex;
  const eax = ey * A.nz - ez * A.ny, eay = ez * A.nx - ex * A.nz, eaz = ex * A.ny - ey * A.nx;
  const px = (A.offset * bex + B.offset * eax) / sin2;
  const py = (A.offset * bey + B.offset * eay) / sin2;
  const pz = (A.offset * bez + B.offset * eaz) / sin2;
  const R = half / sin + LENGTH_TOL;
  ensureVertexScratch(Math.max(A.xs.length, B.xs.length));
  ensureEdgeScratch(Math.max(A.xs.length, B.xs.length));
  toLineCoords(A, px, py, pz, dx, dy, dz, SA, WA);
  const na = chordOf(A, SA, WA, R, IA);
  if (na === 0) return 0;
  toLineCoords(B, px, py, pz, dx, dy, dz, SB, WB);
  const nb = chordOf(B, SB, WB, R, IB);
  if (nb === 0) return 0;
  const theta = (Math.atan2(sin, Math.abs(cosRaw)) * 180) / Math.PI;
  const orthogonal = Math.abs(90 - theta) <= ctx.angleToleranceDeg;
  const angleDeg = round6(theta);
  let added = 0;
  let i = 0, j = 0;
  while (i < na && j < nb) {
    const a0 = IA[2 * i], a1 = IA[2 * i + 1], b0 = IB[2 * j], b1 = IB[2 * j + 1];
    const s0 = a0 > b0 ? a0 : b0, s1 = a1 < b1 ? a1 : b1;
    // Decide on the reported (rounded) length, so a joint reported as 0.1 mm is never kept and
    // symmetric copies, which differ only by rounding noise, decide alike.
    if (round6(s1 - s0) > MIN_JOINT_SEGMENT) {
      out.push(makeJoint(A, B, a0, a1, b0, b1, s0, s1, R, px, py, pz, dx, dy, dz, angleDeg, orthogonal));
      added++;
    }
    if (a1 < b1) i++;
    else j++;
  }
  return added;
}

function pointAt(px: number, py: number, pz: number, dx: number, dy: number, dz: number, s: number): Vec3 {
  return [round6(px + s * dx), round6(py + s * dy), round6(pz + s * dz)];
}

function makeJoint(
  A: PreparedPiece, B: PreparedPiece,
  a0: number, a1: number, b0: number, b1: number, s0: number, s1: number, R: number,
  px: number, py: number, pz: number, dx: number, dy: number, dz: number,
  angleDeg: number, orthogonal: boolean,
): Joint {
  const sm = (s0 + s1) / 2;
  const sideA = sideAt(A, SA, WA, sm, R);
  const sideB = sideAt(B, SB, WB, sm, R);
  const idA = A.piece.id, idB = B.piece.id;
  const from = pointAt(px, py, pz, dx, dy, dz, s0), to = pointAt(px, py, pz, dx, dy, dz, s1);
  let kind: JointKind;
  let tenon: string | undefined;
  let slots: JointSlot[];
  if (sideA === BOUNDARY && sideB === BOUNDARY) {
    kind = 'corner';
    slots = [];
  } else if (sideA === BOUNDARY || sideB === BOUNDARY) {
    kind = 'mortise-and-tenon';
    tenon = sideA === BOUNDARY ? idA : idB;
    slots = [{ piece: sideA === BOUNDARY ? idB : idA, from, to }];
  } else {
    const e0A = Math.abs(s0 - a0) <= LENGTH_TOL, e1A = Math.abs(s1 - a1) <= LENGTH_TOL;
    const e0B = Math.abs(s0 - b0) <= LENGTH_TOL, e1B = Math.abs(s1 - b1) <= LENGTH_TOL;
    if ((e0A && e1B) || (e0B && e1A)) {
      kind = 'cross-lap';
      // Each piece is slotted from the end it owns. When both ends belong to both pieces, each
      // piece P takes the end lying along n_P × n_other (A takes s1): a rule that turns with the
      // design, so every piece of an orbit is slotted alike.
      const aTakesStart = e0A && e1B && !(e0B && e1A);
      const mid = pointAt(px, py, pz, dx, dy, dz, sm);
      slots = aTakesStart
        ? [{ piece: idA, from, to: mid }, { piece: idB, from: mid, to }]
        : [{ piece: idA, from: mid, to }, { piece: idB, from, to: mid }];
    } else {
      const innerIsA = e0A && e1A;
      const inner = innerIsA ? A : B;
      const pass = canPassThrough(inner, innerIsA ? SA : SB, innerIsA ? WA : WB, s0, s1);
      kind = pass ? 'through-slot' : 'locked-crossing';
      slots = pass ? [{ piece: innerIsA ? idB : idA, from, to }] : [];
    }
  }
  const length = round6(s1 - s0);
  if (tenon !== undefined) return { a: idA, b: idB, kind, angleDeg, length, orthogonal, from, to, tenon, slots };
  return { a: idA, b: idB, kind, angleDeg, length, orthogonal, from, to, slots };
}

/**
 * The joints between two pieces (see {@link pairJoints}); a convenience for tests and one-off
 * checks. Throws RangeError when the thickness is not positive.
 */
export function jointsBetween(a: Piece, b: Piece, options: JointOptions): Joint[] {
  const out: Joint[] = [];
  pairJoints(preparePiece(a), preparePiece(b), jointContext(options), out);
  return out;
}

/**
 * How far bounding boxes must be grown so that box pruning never loses a contact: for two
 * planes at angle θ, a contact point of A and one of B at the same place on L lie within
 * r = t / (2 sin θ) of a common point, so boxes grown by the largest r over the pairs of
 * distinct, non-parallel plane directions among `pieces` overlap whenever the pieces touch.
 * t/2 (+ {@link LENGTH_TOL}) when every pair of planes is square (or there is one direction).
 */
export function contactPad(pieces: readonly Piece[], half: number): number {
  const dirs: number[] = [];
  const seen = new Set<string>();
  for (const p of pieces) {
    let [x, y, z] = p.frame.normal;
    // One entry per line (n and −n alike), to 1e-9.
    if (x < -1e-12 || (Math.abs(x) <= 1e-12 && (y < -1e-12 || (Math.abs(y) <= 1e-12 && z < 0)))) { x = -x; y = -y; z = -z; }
    const key = `${Math.round(x * 1e9)},${Math.round(y * 1e9)},${Math.round(z * 1e9)}`;
    if (seen.has(key)) continue;
    seen.add(key);
    dirs.push(x, y, z);
  }
  let minSin = 1;
  for (let i = 0; i < dirs.length; i += 3) {
    for (let j = i + 3; j < dirs.length; j += 3) {
      const cx = dirs[i + 1] * dirs[j + 2] - dirs[i + 2] * dirs[j + 1];
      const cy = dirs[i + 2] * dirs[j] - dirs[i] * dirs[j + 2];
      const cz = dirs[i] * dirs[j + 1] - dirs[i + 1] * dirs[j];
      const sin = Math.sqrt(cx * cx + cy * cy + cz * cz);
      if (sin >= PARALLEL_SIN && sin < minSin) minSin = sin;
    }
  }
  return half / minSin + LENGTH_TOL;
}

/**
 * Every joint among `pieces` (FORMAT.md §3). Pairs are pruned with bounding boxes grown by
 * {@link contactPad} (sweep and prune, {@link overlappingPairs}) before the exact chord test; pairs are visited
 * with i < j in the given order, so a joint's `a` comes before its `b` in `pieces`, and the
 * result is ordered by (a, b) position, then along the joint line. Empty for fewer than two
 * pieces. Throws RangeError when the thickness is not positive.
 */
export function findJoints(pieces: readonly Piece[], options: JointOptions): Joint[] {
  const ctx = jointContext(options);
  const prepared = pieces.map(preparePiece);
  const pairs = overlappingPairs(pieceBoxes(pieces, contactPad(pieces, ctx.half)));
  const out: Joint[] = [];
  for (let k = 0; k < pairs.length; k += 2) pairJoints(prepared[pairs[k]], prepared[pairs[k + 1]], ctx, out);
  return out;
}
