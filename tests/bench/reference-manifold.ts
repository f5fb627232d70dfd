// Reference contact search with a solid-modelling kernel (manifold-3d, from the registry): every
// piece becomes a slab of the material thickness, and two pieces touch when their slabs intersect
// with a volume above a tiny epsilon. Used by the benchmark to check the engine's contact set and
// to show what the mid-surface method saves.
//
// Consistency with the reach rule of FORMAT.md §3. Take the cross-section of two planes at angle θ
// square to their common line L, with oblique coordinates P = x·wA + y·wB (wA, wB: the in-plane
// directions of A and B square to L). A point a = x·wA of A's mid-line is within t/2 of B's plane
// exactly when |x| ≤ r = t / (2 sin θ), and likewise for B. So "both reach L at this place" is
// exactly "the point x·wA + y·wB lies in A's mid-surface swept along wB by ±r, and in B's swept
// along wA by ±r". For θ = 90° the sweep along wB is the ordinary slab (wB = ±nA, r = t/2); for
// other angles the slabs are sheared prisms built for the pair. With these slabs a positive
// intersection volume means a positive length of L where both pieces reach — the engine's rule —
// and the reference also asks for one connected part of the intersection to span more than
// 0.1 mm along L (the engine's minimum joint length). Contacts of zero measure (an edge exactly
// t/2 away) count for the engine and not here; generic designs avoid them.
import Module from 'manifold-3d';
import type { Piece } from '../../shared/engine/model.js';
import { contactPad } from '../../shared/engine/joints.js';
import { overlappingPairs, pieceBoxes } from '../../shared/engine/spatial.js';

type Wasm = Awaited<ReturnType<typeof Module>>;
type Manifold = InstanceType<Wasm['Manifold']>;

let wasmPromise: Promise<Wasm> | undefined;

/** The manifold-3d module, loaded and set up once. */
export function loadManifold(): Promise<Wasm> {
  wasmPromise ??= (async () => {
    const wasm = await Module();
    wasm.setup();
    return wasm;
  })();
  return wasmPromise;
}

/** Volumes at or below this (mm³) count as no intersection. */
export const VOLUME_EPS = 1e-6;

export interface ReferenceResult {
  /** Touching pairs as "a|b" with a before b in the piece list. */
  readonly pairs: Set<string>;
  /** Candidate pairs tested after box pruning (parallel pairs excluded). */
  readonly tested: number;
}

/**
 * Slab of `piece`: its polygon (outer ring and holes) extruded over [−r, r] along the unit
 * direction e (not in the piece's plane), placed in the world.
 */
function slab(wasm: Wasm, piece: Piece, e: readonly number[], r: number): Manifold {
  const cs = new wasm.CrossSection([piece.polygon.outer, ...piece.polygon.holes].map((ring) => ring.map((p) => [p[0], p[1]] as [number, number])), 'EvenOdd');
  const f = piece.frame;
  const raw = cs.extrude(1);
  cs.delete();
  // Column-major 4 × 4: x → u, y → v, z → 2r·e, translation origin − r·e.
  // A left-handed (u, v, e) frame would turn the mesh inside out; sweep along −e instead
  // (the sweep is symmetric, so the solid is the same).
  const det = f.u[0] * (f.v[1] * e[2] - f.v[2] * e[1]) - f.u[1] * (f.v[0] * e[2] - f.v[2] * e[0]) + f.u[2] * (f.v[0] * e[1] - f.v[1] * e[0]);
  const s = det < 0 ? -1 : 1;
  const m: number[] = [
    f.u[0], f.u[1], f.u[2], 0,
    f.v[0], f.v[1], f.v[2], 0,
    2 * r * s * e[0], 2 * r * s * e[1], 2 * r * s * e[2], 0,
    f.origin[0] - r * s * e[0], f.origin[1] - r * s * e[1], f.origin[2] - r * s * e[2], 1,
  ];
  const placed = raw.transform(m as never);
  raw.delete();
  return placed;
}

/** Joints shorter than this along L do not count (FORMAT.md §3); the reference applies it too. */
const MIN_SEGMENT = 0.1;

/**
 * True when the intersection has volume above {@link VOLUME_EPS} and one of its connected parts
 * spans more than 0.1 mm along the line direction d (the same minimum as the engine).
 */
function longEnough(x: Manifold, d: readonly number[]): boolean {
  if (!(x.volume() > VOLUME_EPS)) return false;
  const parts = x.decompose();
  let long = false;
  for (const part of parts) {
    if (!long && part.volume() > VOLUME_EPS) {
      const mesh = part.getMesh();
      const np = mesh.numProp, v = mesh.vertProperties;
      let lo = Infinity, hi = -Infinity;
      for (let i = 0; i < v.length; i += np) {
        const s = v[i] * d[0] + v[i + 1] * d[1] + v[i + 2] * d[2];
        if (s < lo) lo = s;
        if (s > hi) hi = s;
      }
      long = hi - lo > MIN_SEGMENT;
    }
    part.delete();
  }
  return long;
}

/**
 * Touching pairs of `pieces` by slab intersection, after the same box pruning as the engine.
 * Every manifold made is deleted before returning.
 */
export function referenceTouchingPairs(wasm: Wasm, pieces: readonly Piece[], thickness: number): ReferenceResult {
  const half = thickness / 2;
  const pairs = overlappingPairs(pieceBoxes(pieces, contactPad(pieces, half)));
  const square: (Manifold | undefined)[] = new Array(pieces.length);
  const result = new Set<string>();
  let tested = 0;
  const squareSlab = (i: number): Manifold => (square[i] ??= slab(wasm, pieces[i], pieces[i].frame.normal, half));
  try {
    for (let k = 0; k < pairs.length; k += 2) {
      const A = pieces[pairs[k]], B = pieces[pairs[k + 1]];
      const na = A.frame.normal, nb = B.frame.normal;
      const cx = na[1] * nb[2] - na[2] * nb[1], cy = na[2] * nb[0] - na[0] * nb[2], cz = na[0] * nb[1] - na[1] * nb[0];
      const sin = Math.hypot(cx, cy, cz);
      if (sin < 1e-6) continue; // parallel: never a joint (FORMAT.md §3)
      tested++;
      const cos = na[0] * nb[0] + na[1] * nb[1] + na[2] * nb[2];
      const d = [cx / sin, cy / sin, cz / sin];
      let touching: boolean;
      if (Math.abs(cos) < 1e-12) {
        const x = squareSlab(pairs[k]).intersect(squareSlab(pairs[k + 1]));
        touching = longEnough(x, d);
        x.delete();
      } else {
        // wA = d × nA, wB = d × nB with d = (nA × nB)/sin.
        const wA = [d[1] * na[2] - d[2] * na[1], d[2] * na[0] - d[0] * na[2], d[0] * na[1] - d[1] * na[0]];
        const wB = [d[1] * nb[2] - d[2] * nb[1], d[2] * nb[0] - d[0] * nb[2], d[0] * nb[1] - d[1] * nb[0]];
        const r = half / sin;
        const sa = slab(wasm, A, wB, r), sb = slab(wasm, B, wA, r);
        const x = sa.intersect(sb);
        touching = longEnough(x, d);
        x.delete();
        sa.delete();
        sb.delete();
      }
      if (touching) result.add(`${A.id}|${B.id}`);
    }
  } finally {
    for (const m of square) m?.delete();
  }
  return { pairs: result, tested };
}
