/**
 * Pair pruning for the contact search (FORMAT.md §3): which pieces could possibly touch, found
 * with world-space bounding boxes (sweep and prune), so the exact chord tests run only on pairs
 * whose padded boxes overlap; the exact test then starts with a bounding-circle check.
 *
 * Boxes are flat `Float64Array`s of six numbers per piece (minX, minY, minZ, maxX, maxY, maxZ);
 * pairs come back flat as well (`[i0, j0, i1, j1, …]` with i < j), so the hot loops allocate
 * nothing per pair.
 */
import type { Piece } from './model.js';

/** Six numbers per box: minX, minY, minZ, maxX, maxY, maxZ. */
export const BOX_STRIDE = 6;

/**
 * Writes the world-space bounding box of `piece`'s outline, grown by `pad` on every side, into
 * `out` at `offset`. Holes lie inside the outline, so only the outer ring is read. A piece with
 * an empty outline gets an inverted box that overlaps nothing.
 */
export function writePieceBox(piece: Piece, pad: number, out: Float64Array, offset: number): void {
  const f = piece.frame;
  let x0 = Infinity, y0 = Infinity, z0 = Infinity, x1 = -Infinity, y1 = -Infinity, z1 = -Infinity;
  const ox = f.origin[0], oy = f.origin[1], oz = f.origin[2];
  const ux = f.u[0], uy = f.u[1], uz = f.u[2], vx = f.v[0], vy = f.v[1], vz = f.v[2];
  for (const p of piece.polygon.outer) {
    const x = ox + p[0] * ux + p[1] * vx;
    const y = oy + p[0] * uy + p[1] * vy;
    const z = oz + p[0] * uz + p[1] * vz;
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
    if (z < z0) z0 = z;
    if (z > z1) z1 = z;
  }
  out[offset] = x0 - pad;
  out[offset + 1] = y0 - pad;
  out[offset + 2] = z0 - pad;
  out[offset + 3] = x1 + pad;
  out[offset + 4] = y1 + pad;
  out[offset + 5] = z1 + pad;
}

/** Bounding boxes of all `pieces`, each grown by `pad` (see {@link writePieceBox}). */
export function pieceBoxes(pieces: readonly Piece[], pad: number): Float64Array {
  const out = new Float64Array(pieces.length * BOX_STRIDE);
  for (let i = 0; i < pieces.length; i++) writePieceBox(pieces[i], pad, out, i * BOX_STRIDE);
  return out;
}

/** True when boxes i and j of `boxes` overlap or touch (closed boxes). */
export function boxesOverlap(boxes: Float64Array, i: number, j: number): boolean {
  const a = i * BOX_STRIDE, b = j * BOX_STRIDE;
  return (
    boxes[a] <= boxes[b + 3] && boxes[b] <= boxes[a + 3] &&
    boxes[a + 1] <= boxes[b + 4] && boxes[b + 1] <= boxes[a + 4] &&
    boxes[a + 2] <= boxes[b + 5] && boxes[b + 2] <= boxes[a + 5]
  );
}

/**
 * Every unordered pair {i, j} (i < j) whose boxes overlap, as a flat array `[i, j, i, j, …]`
 * sorted by i, then j. Sweep and prune: boxes sorted by their lower end on the axis where the
 * boxes spread most, each compared only with the boxes that start before it ends, so the cost
 * grows with n log n plus the number of near pairs, not with n². (A uniform grid was tried
 * first; on shells of plates, whose boxes are large and crowd a few cells, the sweep was about
 * six times faster.) Inverted (empty) boxes and non-finite boxes pair with nothing. With fewer
 * than two boxes the result is empty.
 */
export function overlappingPairs(boxes: Float64Array): Int32Array {
  const n = Math.floor(boxes.length / BOX_STRIDE);
  if (n < 2) return new Int32Array(0);
  const valid: number[] = [];
  let lo0 = Infinity, lo1 = Infinity, lo2 = Infinity, hi0 = -Infinity, hi1 = -Infinity, hi2 = -Infinity;
  for (let i = 0; i < n; i++) {
    const o = i * BOX_STRIDE;
    const ex = boxes[o + 3] - boxes[o], ey = boxes[o + 4] - boxes[o + 1], ez = boxes[o + 5] - boxes[o + 2];
    if (!(ex >= 0 && ey >= 0 && ez >= 0) || !Number.isFinite(ex + ey + ez)) continue;
    valid.push(i);
    const cx = boxes[o] + boxes[o + 3], cy = boxes[o + 1] + boxes[o + 4], cz = boxes[o + 2] + boxes[o + 5];
    if (cx < lo0) lo0 = cx;
    if (cx > hi0) hi0 = cx;
    if (cy < lo1) lo1 = cy;
    if (cy > hi1) hi1 = cy;
    if (cz < lo2) lo2 = cz;
    if (cz > hi2) hi2 = cz;
  }
  if (valid.length < 2) return new Int32Array(0);
  const sx = hi0 - lo0, sy = hi1 - lo1, sz = hi2 - lo2;
  const axis = sx >= sy && sx >= sz ? 0 : sy >= sz ? 1 : 2;
  const m = valid.length;
  // Sort by the lower end on the sweep axis (index in the low bits keeps it a numeric sort).
  const starts = new Float64Array(m);
  for (let k = 0; k < m; k++) starts[k] = boxes[valid[k] * BOX_STRIDE + axis];
  const order = Array.from({ length: m }, (_, k) => valid[k]);
  const byStart = Array.from({ length: m }, (_, k) => k).sort((a, b) => starts[a] - starts[b] || valid[a] - valid[b]);
  for (let k = 0; k < m; k++) order[k] = valid[byStart[k]];
  const a1 = (axis + 1) % 3, a2 = (axis + 2) % 3;
  let lowI = new Int32Array(Math.max(16, m * 8));
  let highJ = new Int32Array(lowI.length);
  let len = 0;
  const perLow = new Int32Array(n + 1);
  for (let p = 0; p < m; p++) {
    const i = order[p], o = i * BOX_STRIDE;
    const end = boxes[o + 3 + axis];
    const p1 = boxes[o + a1], q1 = boxes[o + 3 + a1], p2 = boxes[o + a2], q2 = boxes[o + 3 + a2];
    for (let q = p + 1; q < m; q++) {
      const j = order[q], b = j * BOX_STRIDE;
      if (boxes[b + axis] > end) break;
      if (boxes[b + a1] <= q1 && p1 <= boxes[b + 3 + a1] && boxes[b + a2] <= q2 && p2 <= boxes[b + 3 + a2]) {
        if (len === lowI.length) {
          const gi = new Int32Array(len * 2), gj = new Int32Array(len * 2);
          gi.set(lowI);
          gj.set(highJ);
          lowI = gi;
          highJ = gj;
        }
        const lo = i < j ? i : j;
        lowI[len] = lo;
        highJ[len] = i < j ? j : i;
        perLow[lo + 1]++;
        len++;
      }
    }
  }
  // Counting sort by the lower index, then each (short) run of partners by insertion sort.
  for (let i = 0; i < n; i++) perLow[i + 1] += perLow[i];
  const fill = perLow.slice(0, n);
  const partners = new Int32Array(len);
  for (let k = 0; k < len; k++) partners[fill[lowI[k]]++] = highJ[k];
  const out = new Int32Array(2 * len);
  for (let i = 0; i < n; i++) {
    const from = perLow[i], to = perLow[i + 1];
    for (let k = from + 1; k < to; k++) {
      const x = partners[k];
      let q = k - 1;
      while (q >= from && partners[q] > x) {
        partners[q + 1] = partners[q];
        q--;
      }
      partners[q + 1] = x;
    }
    for (let k = from; k < to; k++) {
      out[2 * k] = i;
      out[2 * k + 1] = partners[k];
    }
  }
  return out;
}

/** The same pairs as {@link overlappingPairs} by testing every pair; for tests and small inputs. */
export function overlappingPairsBrute(boxes: Float64Array): Int32Array {
  const n = Math.floor(boxes.length / BOX_STRIDE);
  const out: number[] = [];
  for (let i = 0; i < n; i++) {
    const o = i * BOX_STRIDE;
    if (!(boxes[o + 3] >= boxes[o] && boxes[o + 4] >= boxes[o + 1] && boxes[o + 5] >= boxes[o + 2])) continue;
    if (!Number.isFinite(boxes[o] + boxes[o + 1] + boxes[o + 2] + boxes[o + 3] + boxes[o + 4] + boxes[o + 5])) continue;
    for (let j = i + 1; j < n; j++) {
      const p = j * BOX_STRIDE;
      if (!(boxes[p + 3] >= boxes[p] && boxes[p + 4] >= boxes[p + 1] && boxes[p + 5] >= boxes[p + 2])) continue;
      if (!Number.isFinite(boxes[p] + boxes[p + 1] + boxes[p + 2] + boxes[p + 3] + boxes[p + 4] + boxes[p + 5])) continue;
      if (boxesOverlap(boxes, i, j)) out.push(i, j);
    }
  }
  return Int32Array.from(out);
}
