/**
 * Pair pruning for the contact search (FORMAT.md §3): which pieces could possibly touch, found
 * with world-space bounding boxes in a uniform grid, so the exact chord tests run only on pairs
 * whose padded boxes overlap.
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

/** Most cells per axis; beyond it the grid would cost more than it saves. */
const MAX_CELLS_PER_AXIS = 64;

/**
 * Every unordered pair {i, j} (i < j) whose boxes overlap, as a flat array `[i, j, i, j, …]`
 * sorted by i, then j. Uses a uniform grid whose cell is the mean box extent (at most
 * {@link MAX_CELLS_PER_AXIS} cells per axis), so the cost grows with the number of near pairs
 * rather than with n². Inverted (empty) boxes and non-finite boxes pair with nothing. With fewer
 * than two boxes the result is empty.
 */
export function overlappingPairs(boxes: Float64Array): Int32Array {
  const n = Math.floor(boxes.length / BOX_STRIDE);
  if (n < 2) return new Int32Array(0);
  let gx0 = Infinity, gy0 = Infinity, gz0 = Infinity, gx1 = -Infinity, gy1 = -Infinity, gz1 = -Infinity;
  let extentSum = 0;
  let valid = 0;
  const ok = new Uint8Array(n);
  for (let i = 0; i < n; i++) {
    const o = i * BOX_STRIDE;
    const ex = boxes[o + 3] - boxes[o], ey = boxes[o + 4] - boxes[o + 1], ez = boxes[o + 5] - boxes[o + 2];
    if (!(ex >= 0 && ey >= 0 && ez >= 0) || !Number.isFinite(ex + ey + ez)) continue;
    ok[i] = 1;
    valid++;
    extentSum += Math.max(ex, ey, ez);
    if (boxes[o] < gx0) gx0 = boxes[o];
    if (boxes[o + 1] < gy0) gy0 = boxes[o + 1];
    if (boxes[o + 2] < gz0) gz0 = boxes[o + 2];
    if (boxes[o + 3] > gx1) gx1 = boxes[o + 3];
    if (boxes[o + 4] > gy1) gy1 = boxes[o + 4];
    if (boxes[o + 5] > gz1) gz1 = boxes[o + 5];
  }
  if (valid < 2) return new Int32Array(0);
  const span = Math.max(gx1 - gx0, gy1 - gy0, gz1 - gz0);
  let cell = Math.max(extentSum / valid, span / MAX_CELLS_PER_AXIS, 1e-9);
  if (!(cell > 0)) cell = 1;
  const nx = Math.max(1, Math.ceil((gx1 - gx0) / cell) + 1);
  const ny = Math.max(1, Math.ceil((gy1 - gy0) / cell) + 1);
  const nz = Math.max(1, Math.ceil((gz1 - gz0) / cell) + 1);
  const cells = nx * ny * nz;
  // Counting sort of (cell, piece) memberships into one flat array.
  const counts = new Int32Array(cells + 1);
  const range = new Int32Array(n * 6);
  for (let i = 0; i < n; i++) {
    if (!ok[i]) continue;
    const o = i * BOX_STRIDE, r = i * 6;
    range[r] = Math.min(nx - 1, Math.floor((boxes[o] - gx0) / cell));
    range[r + 1] = Math.min(ny - 1, Math.floor((boxes[o + 1] - gy0) / cell));
    range[r + 2] = Math.min(nz - 1, Math.floor((boxes[o + 2] - gz0) / cell));
    range[r + 3] = Math.min(nx - 1, Math.floor((boxes[o + 3] - gx0) / cell));
    range[r + 4] = Math.min(ny - 1, Math.floor((boxes[o + 4] - gy0) / cell));
    range[r + 5] = Math.min(nz - 1, Math.floor((boxes[o + 5] - gz0) / cell));
    for (let cz = range[r + 2]; cz <= range[r + 5]; cz++)
      for (let cy = range[r + 1]; cy <= range[r + 4]; cy++)
        for (let cx = range[r]; cx <= range[r + 3]; cx++) counts[(cz * ny + cy) * nx + cx + 1]++;
  }
  for (let c = 0; c < cells; c++) counts[c + 1] += counts[c];
  const members = new Int32Array(counts[cells]);
  const fill = counts.slice(0, cells);
  for (let i = 0; i < n; i++) {
    if (!ok[i]) continue;
    const r = i * 6;
    for (let cz = range[r + 2]; cz <= range[r + 5]; cz++)
      for (let cy = range[r + 1]; cy <= range[r + 4]; cy++)
        for (let cx = range[r]; cx <= range[r + 3]; cx++) members[fill[(cz * ny + cy) * nx + cx]++] = i;
  }
  // Pieces are inserted in index order, so each cell's list is sorted; for piece i, visit the
  // members after it in each of its cells and stamp them so a pair is reported once.
  const stamp = new Int32Array(n).fill(-1);
  let out = new Int32Array(Math.max(16, n * 8));
  let len = 0;
  const neighbours: number[] = [];
  for (let i = 0; i < n; i++) {
    if (!ok[i]) continue;
    const r = i * 6;
    neighbours.length = 0;
    for (let cz = range[r + 2]; cz <= range[r + 5]; cz++)
      for (let cy = range[r + 1]; cy <= range[r + 4]; cy++)
        for (let cx = range[r]; cx <= range[r + 3]; cx++) {
          const c = (cz * ny + cy) * nx + cx;
          for (let k = counts[c + 1] - 1; k >= counts[c]; k--) {
            const j = members[k];
            if (j <= i) break;
            if (stamp[j] === i) continue;
            stamp[j] = i;
            if (boxesOverlap(boxes, i, j)) neighbours.push(j);
          }
        }
    neighbours.sort((a, b) => a - b);
    if (len + neighbours.length * 2 > out.length) {
      const grown = new Int32Array(Math.max(out.length * 2, len + neighbours.length * 2));
      grown.set(out);
      out = grown;
    }
    for (const j of neighbours) {
      out[len++] = i;
      out[len++] = j;
    }
  }
  return out.slice(0, len);
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
