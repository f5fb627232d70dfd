/**
 * Which planes of the chosen families can meet at right angles (FORMAT.md §6 `planes`).
 *
 * Every family is taken at a non-zero offset, so a plane and its opposite (normals n and −n) are
 * two planes. A pair of planes is perpendicular when their unit normals have |n·m| ≤
 * {@link PERPENDICULAR_TOL}; planes linked through such pairs form components.
 */
import { type RotationGroup, canonicalNormal } from './groups.js';
import { planeOrbit } from './orbits.js';
import { UNIT_TOL } from './tolerance.js';
import { type Vec3, dot, normalize } from './vec.js';

/**
 * Largest |n·m| of two unit normals that still counts as perpendicular. Orbit normals come out of
 * products of rotation matrices accurate to about 1e-12, so this is far above the noise and far
 * below any real angle (cos 89.9999° ≈ 1.7e-6).
 */
export const PERPENDICULAR_TOL = UNIT_TOL * 1e3;

/** FORMAT.md §6 `planes` document. */
export interface PlanesAnalysis {
  readonly group: string;
  readonly order: number;
  /** One entry per requested family, in the order given. */
  readonly families: { axis: number; planes: number }[];
  /** Unordered pairs of planes (over all families) with perpendicular normals. */
  readonly perpendicularPairs: number;
  /** `"a-b"` with a ≤ b (by fold) → number of perpendicular pairs between those families. */
  readonly pairsByFamily: Record<string, number>;
  /** Connected groups of planes under perpendicularity; a plane with no partner is its own group. */
  readonly components: number;
}

/** A family for {@link analyseNormals}: a label and any non-zero normal. */
export interface NormalFamily {
  readonly id: string;
  readonly normal: Vec3;
}

/** Result of {@link analyseNormals}: as {@link PlanesAnalysis}, with families named by id. */
export interface NormalsAnalysis {
  readonly group: string;
  readonly order: number;
  readonly families: { id: string; planes: number }[];
  readonly perpendicularPairs: number;
  /** `"a-b"` with family a listed no later than b → pairs; every requested pair has a key, 0 included. */
  readonly pairsByFamily: Record<string, number>;
  readonly components: number;
  /** For each family, the families (by id, itself included) that have a plane square to one of its planes. */
  readonly meetsSquare: Record<string, string[]>;
}

/** Error for a request the analysis cannot answer: no families, a repeated one, a zero normal. */
export class PlanesError extends Error {
  override readonly name = 'PlanesError';
}

class UnionFind {
  private readonly parent: number[];
  constructor(n: number) {
    this.parent = Array.from({ length: n }, (_, i) => i);
  }
  find(i: number): number {
    let r = i;
    while (this.parent[r] !== r) r = this.parent[r];
    while (this.parent[i] !== r) {
      const next = this.parent[i];
      this.parent[i] = r;
      i = next;
    }
    return r;
  }
  union(a: number, b: number): void {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent[Math.max(ra, rb)] = Math.min(ra, rb);
  }
  count(): number {
    let c = 0;
    for (let i = 0; i < this.parent.length; i++) if (this.find(i) === i) c++;
    return c;
  }
}

/**
 * Perpendicularity of the orbits of explicit normals under `group`, each at a non-zero offset.
 * Keys of `pairsByFamily` are `"<id a>-<id b>"` with a listed no later than b in `families`;
 * every such pair of requested families has a key, 0 when none of their planes are square.
 * Two families with the same orbit (e.g. n and a rotated copy of n) are still counted separately.
 * Throws {@link PlanesError} for an empty list, a repeated id or a zero / non-finite normal.
 */
export function analyseNormals(group: RotationGroup, families: readonly NormalFamily[]): NormalsAnalysis {
  if (families.length === 0) throw new PlanesError('no families given: name at least one family');
  const seen = new Set<string>();
  for (const f of families) {
    if (seen.has(f.id)) throw new PlanesError(`family ${f.id} is listed twice`);
    seen.add(f.id);
    if (!f.normal.every(Number.isFinite) || !(Math.hypot(...f.normal) > 0)) {
      throw new PlanesError(`family ${f.id}: the normal must be a non-zero vector of numbers`);
    }
  }
  const normals: Vec3[] = [];
  const owner: number[] = [];
  const counts = families.map((f, k) => {
    // Offset 1 stands for "any non-zero offset": only the normals matter.
    const orbit = planeOrbit(group, normalize(f.normal), 1);
    for (const p of orbit.planes) {
      normals.push(p.frame.normal);
      owner.push(k);
    }
    return orbit.planes.length;
  });
  const pairKey = (a: number, b: number) => `${families[Math.min(a, b)].id}-${families[Math.max(a, b)].id}`;
  const pairsByFamily: Record<string, number> = {};
  for (let a = 0; a < families.length; a++) for (let b = a; b < families.length; b++) pairsByFamily[pairKey(a, b)] = 0;
  const uf = new UnionFind(normals.length);
  let total = 0;
  for (let i = 0; i < normals.length; i++) {
    for (let j = i + 1; j < normals.length; j++) {
      if (Math.abs(dot(normals[i], normals[j])) <= PERPENDICULAR_TOL) {
        total++;
        pairsByFamily[pairKey(owner[i], owner[j])]++;
        uf.union(i, j);
      }
    }
  }
  const meetsSquare: Record<string, string[]> = {};
  families.forEach((f, a) => {
    meetsSquare[f.id] = families.filter((_, b) => pairsByFamily[pairKey(a, b)] > 0).map((g) => g.id);
  });
  return {
    group: group.name,
    order: group.order,
    families: families.map((f, k) => ({ id: f.id, planes: counts[k] })),
    perpendicularPairs: total,
    pairsByFamily,
    components: uf.count(),
    meetsSquare,
  };
}

/**
 * FORMAT.md §6 `planes`: the families square to the group's `folds`-fold axes (canonical normals
 * of FORMAT.md §1), at a non-zero offset. `pairsByFamily` has a key `"a-b"` (a ≤ b, compared as
 * numbers) for every pair of requested folds, 0 included. Throws `AxisFoldError` (from
 * `groups.ts`) for a fold the group lacks and {@link PlanesError} for no folds or a repeated fold.
 */
export function analysePlanes(group: RotationGroup, folds: readonly number[]): PlanesAnalysis {
  if (folds.length === 0) throw new PlanesError('no families given: name at least one fold, e.g. --family 2');
  const seen = new Set<number>();
  for (const f of folds) {
    if (seen.has(f)) throw new PlanesError(`fold ${f} is listed twice`);
    seen.add(f);
  }
  const fams = folds.map((fold) => ({ id: String(fold), normal: canonicalNormal(group, fold) }));
  const r = analyseNormals(group, fams);
  const pairsByFamily: Record<string, number> = {};
  const keys: [number, number, number][] = [];
  for (const [key, n] of Object.entries(r.pairsByFamily)) {
    const [a, b] = key.split('-').map(Number);
    keys.push([Math.min(a, b), Math.max(a, b), n]);
  }
  keys.sort((x, y) => x[0] - y[0] || x[1] - y[1]);
  for (const [a, b, n] of keys) pairsByFamily[`${a}-${b}`] = n;
  return {
    group: r.group,
    order: r.order,
    families: folds.map((axis, k) => ({ axis, planes: r.families[k].planes })),
    perpendicularPairs: r.perpendicularPairs,
    pairsByFamily,
    components: r.components,
  };
}
