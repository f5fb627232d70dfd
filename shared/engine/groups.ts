/**
 * The finite rotation groups in the canonical orientation of FORMAT.md §1, built by closure
 * from generators and deduplicated with a tolerance.
 */
import { type Mat3, IDENTITY, multiply, rotation, maxDifference, axisAngle } from './mat3.js';
import { type Vec3, canonicalSign, sameLine, normalize } from './vec.js';

/** The golden ratio φ = (1 + √5) / 2. */
export const PHI = (1 + Math.sqrt(5)) / 2;

/** Largest n accepted for C<n> and D<n>: beyond it a drawing has no use for the symmetry. */
export const MAX_CYCLIC_ORDER = 120;

export type GroupKind = 'C' | 'D' | 'T' | 'O' | 'I';

export interface GroupName {
  readonly kind: GroupKind;
  /** n for C<n> and D<n>; absent for T, O, I. */
  readonly n?: number;
}

/** One rotation of a group. */
export interface GroupElement {
  readonly index: number;
  readonly matrix: Mat3;
  /** Smallest k ≥ 1 with gᵏ = identity. */
  readonly order: number;
  /** Unit axis with canonical sign, or null for the identity. */
  readonly axis: Vec3 | null;
  /** Rotation angle about `axis` in radians, in [0, π] for the unsigned magnitude. */
  readonly angle: number;
}

/** A rotation axis of the group: a line through the centre and its fold. */
export interface GroupAxis {
  readonly fold: number;
  /** Unit direction with canonical sign (first non-zero component positive). */
  readonly direction: Vec3;
}

export interface RotationGroup {
  readonly name: string;
  readonly kind: GroupKind;
  readonly n?: number;
  readonly order: number;
  /** Elements in a fixed order; element 0 is the identity. */
  readonly elements: readonly GroupElement[];
  /** Every rotation axis, sorted by fold descending, then by direction. */
  readonly axes: readonly GroupAxis[];
}

/** Error for a group name the engine does not know; the message says what is accepted. */
export class GroupNameError extends Error {}

/**
 * Parses a Schoenflies name of a rotation group: `C<n>` (n ≥ 1), `D<n>` (n ≥ 2), `T`, `O`, `I`.
 * Throws {@link GroupNameError} on anything else, including n above {@link MAX_CYCLIC_ORDER}.
 */
export function parseGroupName(name: string): GroupName {
  if (name === 'T' || name === 'O' || name === 'I') return { kind: name };
  const m = /^([CD])([1-9][0-9]*)$/.exec(name);
  if (!m) {
    throw new GroupNameError(`unknown symmetry group "${name}": use C<n> (n ≥ 1), D<n> (n ≥ 2), T, O or I`);
  }
  const kind = m[1] as 'C' | 'D';
  const n = Number(m[2]);
  if (kind === 'D' && n < 2) throw new GroupNameError('D<n> needs n ≥ 2 (D1 is the same group as C2; write C2)');
  if (n > MAX_CYCLIC_ORDER) throw new GroupNameError(`${kind}${n}: n may be at most ${MAX_CYCLIC_ORDER}`);
  return { kind, n };
}

function generators(g: GroupName): Mat3[] {
  const z: Vec3 = [0, 0, 1];
  switch (g.kind) {
    case 'C':
      return [rotation(z, (2 * Math.PI) / g.n!)];
    case 'D':
      return [rotation(z, (2 * Math.PI) / g.n!), rotation([1, 0, 0], Math.PI)];
    case 'T':
      return [rotation(z, Math.PI), rotation([1, 1, 1], (2 * Math.PI) / 3)];
    case 'O':
      return [rotation(z, Math.PI / 2), rotation([1, 1, 1], (2 * Math.PI) / 3)];
    case 'I':
      return [rotation(z, Math.PI), rotation([1, 1, 1], (2 * Math.PI) / 3), rotation([0, 1, PHI], (2 * Math.PI) / 5)];
  }
}

const MATRIX_TOL = 1e-7;

/** Snaps entries within 1e-12 of 0, ±½, ±1 so repeated products do not drift. */
function tidy(m: Mat3): Mat3 {
  const out = m.map((x) => {
    for (const t of [0, 0.5, -0.5, 1, -1]) if (Math.abs(x - t) < 1e-12) return t;
    return x;
  });
  return out as unknown as Mat3;
}

function elementOrder(m: Mat3): number {
  let p = m;
  for (let k = 1; k <= 2 * MAX_CYCLIC_ORDER + 1; k++) {
    if (maxDifference(p, IDENTITY) < MATRIX_TOL) return k;
    p = multiply(p, m);
  }
  throw new Error('element of infinite order: the generators do not close');
}

/** Closure of a set of generators under multiplication, breadth first from the identity. */
export function closeGroup(gens: readonly Mat3[], limit = 4 * MAX_CYCLIC_ORDER): Mat3[] {
  const found: Mat3[] = [IDENTITY];
  const key = (m: Mat3) => m.map((x) => Math.round(x * 1e6)).join(',');
  const buckets = new Map<string, Mat3>([[key(IDENTITY), IDENTITY]]);
  const isKnown = (m: Mat3): boolean => {
    const k = key(m);
    const hit = buckets.get(k);
    if (hit && maxDifference(hit, m) < MATRIX_TOL) return true;
    // A value near a rounding boundary may land in a neighbouring bucket: fall back to a scan.
    return found.some((f) => maxDifference(f, m) < MATRIX_TOL);
  };
  for (let i = 0; i < found.length; i++) {
    for (const g of gens) {
      const p = tidy(multiply(g, found[i]));
      if (!isKnown(p)) {
        found.push(p);
        buckets.set(key(p), p);
        if (found.length > limit) throw new Error('group closure exceeded its size limit');
      }
    }
  }
  return found;
}

const cache = new Map<string, RotationGroup>();

/**
 * The rotation group named `name` (see {@link parseGroupName}), memoised. Elements are listed
 * breadth first from the identity over the generators, so their order is stable between runs.
 */
export function getGroup(name: string): RotationGroup {
  const hit = cache.get(name);
  if (hit) return hit;
  const parsed = parseGroupName(name);
  const mats = closeGroup(generators(parsed));
  const elements: GroupElement[] = mats.map((matrix, index) => {
    const { axis, angle } = axisAngle(matrix);
    return { index, matrix, order: elementOrder(matrix), axis: axis ? canonicalSign(axis) : null, angle };
  });
  const axes: { fold: number; direction: Vec3 }[] = [];
  for (const e of elements) {
    if (!e.axis) continue;
    const existing = axes.find((a) => sameLine(a.direction, e.axis!, 1e-6));
    if (existing) existing.fold = Math.max(existing.fold, e.order);
    else axes.push({ fold: e.order, direction: e.axis });
  }
  axes.sort((a, b) => b.fold - a.fold || b.direction[0] - a.direction[0] || b.direction[1] - a.direction[1] || b.direction[2] - a.direction[2]);
  const group: RotationGroup = {
    name,
    kind: parsed.kind,
    ...(parsed.n !== undefined ? { n: parsed.n } : {}),
    order: elements.length,
    elements,
    axes,
  };
  cache.set(name, group);
  return group;
}

/** The distinct folds of the group's axes, descending (e.g. I → [5, 3, 2]). */
export function folds(group: RotationGroup): number[] {
  return [...new Set(group.axes.map((a) => a.fold))].sort((a, b) => b - a);
}

/** Error for an `axis` fold that the group does not have. */
export class AxisFoldError extends Error {}

/**
 * The canonical normal of the family square to the group's `fold`-fold axis (FORMAT.md §1
 * table), as a unit vector. For D2, whose three axes are all 2-fold, `2` means the main axis z.
 * For C1 (no axis at all) fold 1 names z. Throws {@link AxisFoldError} for a fold the group lacks.
 */
export function canonicalNormal(group: RotationGroup, fold: number): Vec3 {
  const raw = canonicalNormalRaw(group, fold);
  if (!raw) {
    const have = folds(group);
    throw new AxisFoldError(
      `group ${group.name} has no ${fold}-fold axis` + (have.length ? ` (it has ${have.join(', ')})` : ' (C1 has only fold 1)'),
    );
  }
  return normalize(raw);
}

function canonicalNormalRaw(group: RotationGroup, fold: number): Vec3 | null {
  switch (group.kind) {
    case 'I':
      return fold === 5 ? [0, 1, PHI] : fold === 3 ? [1, 1, 1] : fold === 2 ? [0, 0, 1] : null;
    case 'O':
      return fold === 4 ? [0, 0, 1] : fold === 3 ? [1, 1, 1] : fold === 2 ? [1, 1, 0] : null;
    case 'T':
      return fold === 3 ? [1, 1, 1] : fold === 2 ? [0, 0, 1] : null;
    case 'C':
      return fold === group.n ? [0, 0, 1] : null;
    case 'D':
      return fold === group.n ? [0, 0, 1] : fold === 2 ? [1, 0, 0] : null;
  }
}
