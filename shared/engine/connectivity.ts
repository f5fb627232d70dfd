/**
 * Connectivity of a design under the joints that can be made (FORMAT.md §3): orthogonal joints
 * that are not `locked-crossing`. Union–find over piece indices.
 */
import type { Joint } from './model.js';

/** True for a joint that holds the structure together: orthogonal and assemblable. */
export function canBeMade(joint: Pick<Joint, 'orthogonal' | 'kind'>): boolean {
  return joint.orthogonal && joint.kind !== 'locked-crossing';
}

/** The result of {@link connectivity}. */
export interface Connectivity {
  /** Number of connected groups; 0 when there are no pieces. */
  readonly components: number;
  /**
   * The groups: each a list of piece ids sorted by code point; groups ordered largest first,
   * ties by their first id. A piece with no usable joint is a group of one.
   */
  readonly groups: readonly (readonly string[])[];
}

/**
 * Groups the pieces `ids` by the joints that can be made ({@link canBeMade}). Joints naming a
 * piece not in `ids` are ignored (so a partial joint list cannot invent pieces); duplicate ids
 * count once.
 */
export function connectivity(ids: readonly string[], joints: readonly Joint[]): Connectivity {
  const index = new Map<string, number>();
  const names: string[] = [];
  for (const id of ids) {
    if (index.has(id)) continue;
    index.set(id, names.length);
    names.push(id);
  }
  const n = names.length;
  const parent = new Int32Array(n);
  for (let i = 0; i < n; i++) parent[i] = i;
  const find = (x: number): number => {
    while (parent[x] !== x) {
      parent[x] = parent[parent[x]];
      x = parent[x];
    }
    return x;
  };
  for (const j of joints) {
    if (!canBeMade(j)) continue;
    const a = index.get(j.a), b = index.get(j.b);
    if (a === undefined || b === undefined) continue;
    const ra = find(a), rb = find(b);
    if (ra !== rb) parent[ra] = rb;
  }
  const byRoot = new Map<number, string[]>();
  for (let i = 0; i < n; i++) {
    const r = find(i);
    let g = byRoot.get(r);
    if (!g) byRoot.set(r, (g = []));
    g.push(names[i]);
  }
  const groups = [...byRoot.values()].map((g) => g.sort(compareIds));
  groups.sort((x, y) => y.length - x.length || compareIds(x[0], y[0]));
  return { components: groups.length, groups };
}

function compareIds(a: string, b: string): number {
  return a < b ? -1 : a > b ? 1 : 0;
}
