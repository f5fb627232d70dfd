/**
 * The envelope: the convex solid bounded by the chosen families of planes (DESIGN.md "envelope",
 * FORMAT.md §6 `envelope`). It is the intersection of the half-spaces {x : x·n̂ ≤ d} over every
 * plane of every family's orbit.
 *
 * Method: start from a cube far larger than any sculpture and clip it by each half-space in turn,
 * keeping the solid as a list of faces (vertex loops) over one pool of vertices. Lengths follow
 * FORMAT.md §1 "Tolerance": a vertex within {@link LENGTH_TOL} of a plane is on it, vertices closer
 * than that are one, and faces that shrink below it vanish. When a face of the starting cube
 * survives, the planes do not close a solid.
 */
import type { RotationGroup } from './groups.js';
import { type PlaneFrame, planeFrame } from './frames.js';
import { planeOrbit } from './orbits.js';
import { LENGTH_TOL, toDegrees } from './tolerance.js';
import { type Vec2, type Vec3, angleBetween, dot, normalize } from './vec.js';

/** One bounding plane {x : x·normal = offset}; the solid lies on the side x·normal ≤ offset. */
export interface EnvelopePlane {
  /** Unit outward normal (normalised again on input, so any non-zero vector is accepted). */
  readonly normal: Vec3;
  /** Distance from the centre, > 0. */
  readonly offset: number;
  /** Index of the family the plane belongs to (carried onto the face it makes). */
  readonly family: number;
}

/** One face of the envelope. */
export interface EnvelopeFace {
  /** Index of the family whose plane carries the face (the first one when families coincide). */
  readonly family: number;
  /** Unit outward normal of the face plane. */
  readonly normal: Vec3;
  /** Distance of the face plane from the centre. */
  readonly offset: number;
  /** Indices into {@link Envelope.vertices}, counter-clockwise seen from outside. */
  readonly vertices: number[];
}

/** The envelope as a polyhedron. */
export interface Envelope {
  readonly vertices: Vec3[];
  /** Unordered vertex pairs, each with i < j. */
  readonly edges: [number, number][];
  readonly faces: EnvelopeFace[];
  /** Number of sides → number of faces with that many sides, e.g. `{ "5": 12 }`. */
  readonly faceSides: Record<string, number>;
  /** The distinct interior dihedral angles in degrees, rounded to 3 decimals, ascending. */
  readonly dihedralDeg: number[];
}

/** A family for {@link envelopeOfFamilies}: a plane whose orbit under the group bounds the solid. */
export interface EnvelopeFamily {
  /** Any non-zero vector. */
  readonly normal: Vec3;
  /** Distance from the centre; must be > {@link LENGTH_TOL}. */
  readonly offset: number;
  /** Name used in messages (e.g. the family id or "5-fold"); defaults to "family <k>". */
  readonly id?: string;
}

/**
 * Input error of the envelope: a family that cannot bound a solid (offset 0, negative, NaN, zero
 * normal) or planes that leave the solid open. The message names the family and the fix.
 */
export class EnvelopeError extends Error {
  override readonly name = 'EnvelopeError';
}

/**
 * Half-size of the starting cube as a multiple of the largest offset. A solid reaching farther
 * than this from the centre is treated as open: such an envelope has no use on a laser bed, and a
 * bound keeps the arithmetic well inside double precision.
 */
export const ENVELOPE_REACH = 1e5;

const BOX_FAMILY = -1;

interface WorkFace {
  family: number;
  normal: Vec3;
  offset: number;
  verts: number[];
}

/** Vertex pool that merges points closer than `tol` (spatial hash with cells of size tol). */
class VertexPool {
  readonly xyz: number[] = [];
  private readonly cells = new Map<string, number[]>();
  constructor(private readonly tol: number) {}

  get size(): number {
    return this.xyz.length / 3;
  }

  add(x: number, y: number, z: number): number {
    const t = this.tol;
    const cx = Math.floor(x / t);
    const cy = Math.floor(y / t);
    const cz = Math.floor(z / t);
    const t2 = t * t;
    for (let dx = -1; dx <= 1; dx++) {
      for (let dy = -1; dy <= 1; dy++) {
        for (let dz = -1; dz <= 1; dz++) {
          const ids = this.cells.get(`${cx + dx},${cy + dy},${cz + dz}`);
          if (!ids) continue;
          for (const id of ids) {
            const ex = this.xyz[3 * id] - x;
            const ey = this.xyz[3 * id + 1] - y;
            const ez = this.xyz[3 * id + 2] - z;
            if (ex * ex + ey * ey + ez * ez < t2) return id;
          }
        }
      }
    }
    const id = this.size;
    this.xyz.push(x, y, z);
    const key = `${cx},${cy},${cz}`;
    const list = this.cells.get(key);
    if (list) list.push(id);
    else this.cells.set(key, [id]);
    return id;
  }

  point(id: number): Vec3 {
    return [this.xyz[3 * id], this.xyz[3 * id + 1], this.xyz[3 * id + 2]];
  }
}

/**
 * Orders points that lie on the boundary of a convex polygon in the plane with unit normal n,
 * counter-clockwise seen from the side n points to. Collinear boundary points are kept in place.
 */
function orderAround(pool: VertexPool, ids: readonly number[], n: Vec3): number[] {
  const f = planeFrame(n, 0);
  let cx = 0;
  let cy = 0;
  const pts = ids.map((id) => {
    const p = pool.point(id);
    const x = dot(p, f.u);
    const y = dot(p, f.v);
    cx += x;
    cy += y;
    return { id, x, y };
  });
  cx /= pts.length;
  cy /= pts.length;
  return pts
    .map((p) => ({ id: p.id, a: Math.atan2(p.y - cy, p.x - cx) }))
    .sort((a, b) => a.a - b.a)
    .map((p) => p.id);
}

function dedupeLoop(verts: number[]): number[] {
  const out: number[] = [];
  for (const v of verts) if (out[out.length - 1] !== v) out.push(v);
  while (out.length > 1 && out[0] === out[out.length - 1]) out.pop();
  return out;
}

/** Clips the solid by {x : x·n ≤ d}. Returns the new face list (the input is not changed). */
function clip(pool: VertexPool, faces: readonly WorkFace[], plane: { normal: Vec3; offset: number; family: number }, eps: number): WorkFace[] {
  const [nx, ny, nz] = plane.normal;
  const d = plane.offset;
  const s = new Map<number, number>();
  let outside = false;
  for (const f of faces) {
    for (const id of f.verts) {
      if (s.has(id)) continue;
      const v = nx * pool.xyz[3 * id] + ny * pool.xyz[3 * id + 1] + nz * pool.xyz[3 * id + 2] - d;
      s.set(id, v);
      if (v > eps) outside = true;
    }
  }
  if (!outside) return faces as WorkFace[];

  const cut = new Map<string, number>();
  const capIds = new Set<number>();
  const crossing = (a: number, b: number): number => {
    const [i, j] = a < b ? [a, b] : [b, a];
    const key = `${i},${j}`;
    const hit = cut.get(key);
    if (hit !== undefined) return hit;
    const si = s.get(i)!;
    const sj = s.get(j)!;
    const t = si / (si - sj);
    const x = pool.xyz;
    const id = pool.add(
      x[3 * i] + t * (x[3 * j] - x[3 * i]),
      x[3 * i + 1] + t * (x[3 * j + 1] - x[3 * i + 1]),
      x[3 * i + 2] + t * (x[3 * j + 2] - x[3 * i + 2]),
    );
    cut.set(key, id);
    return id;
  };

  const next: WorkFace[] = [];
  for (const f of faces) {
    const vs = f.verts;
    const out: number[] = [];
    let changed = false;
    for (let k = 0; k < vs.length; k++) {
      const a = vs[k];
      const b = vs[(k + 1) % vs.length];
      const sa = s.get(a)!;
      const sb = s.get(b)!;
      if (sa <= eps) {
        out.push(a);
        if (sa >= -eps) capIds.add(a);
      } else changed = true;
      if ((sa < -eps && sb > eps) || (sa > eps && sb < -eps)) {
        const m = crossing(a, b);
        out.push(m);
        capIds.add(m);
      }
    }
    const loop = changed ? dedupeLoop(out) : out;
    if (loop.length >= 3) next.push(changed ? { ...f, verts: loop } : f);
  }
  if (capIds.size >= 3) {
    next.push({ family: plane.family, normal: plane.normal, offset: plane.offset, verts: orderAround(pool, [...capIds], plane.normal) });
  }
  return next;
}

/** Twice the area of a face loop, from Newell's normal, and its longest chord from vertex 0. */
function faceWidth(pool: VertexPool, verts: readonly number[]): number {
  let ax = 0;
  let ay = 0;
  let az = 0;
  let diameter = 0;
  const p0 = pool.point(verts[0]);
  for (let k = 0; k < verts.length; k++) {
    const p = pool.point(verts[k]);
    const q = pool.point(verts[(k + 1) % verts.length]);
    ax += (p[1] - q[1]) * (p[2] + q[2]);
    ay += (p[2] - q[2]) * (p[0] + q[0]);
    az += (p[0] - q[0]) * (p[1] + q[1]);
    diameter = Math.max(diameter, Math.hypot(p[0] - p0[0], p[1] - p0[1], p[2] - p0[2]));
  }
  const area = Math.hypot(ax, ay, az) / 2;
  return diameter > 0 ? area / diameter : 0;
}

/**
 * Removes what the tolerance says is not there: vertices on fewer than three faces (points on an
 * edge left by clipping), faces with fewer than three vertices, and faces narrower than tol.
 */
function tidyFaces(pool: VertexPool, faces: WorkFace[], tol: number): WorkFace[] {
  let current = faces;
  for (let pass = 0; pass < 8; pass++) {
    const count = new Map<number, number>();
    for (const f of current) for (const v of new Set(f.verts)) count.set(v, (count.get(v) ?? 0) + 1);
    let removed = false;
    const next: WorkFace[] = [];
    for (const f of current) {
      const verts = dedupeLoop(f.verts.filter((v) => count.get(v)! >= 3));
      if (verts.length !== f.verts.length) removed = true;
      if (verts.length < 3 || faceWidth(pool, verts) < tol) {
        removed = true;
        continue;
      }
      next.push(verts.length === f.verts.length ? f : { ...f, verts });
    }
    current = next;
    if (!removed) break;
  }
  return current;
}

function boxFaces(pool: VertexPool, half: number): WorkFace[] {
  const ids: number[] = [];
  for (const x of [-half, half]) for (const y of [-half, half]) for (const z of [-half, half]) ids.push(pool.add(x, y, z));
  const faces: WorkFace[] = [];
  for (let axis = 0; axis < 3; axis++) {
    for (const sign of [-1, 1]) {
      const normal: Vec3 = [axis === 0 ? sign : 0, axis === 1 ? sign : 0, axis === 2 ? sign : 0];
      const on = ids.filter((id) => pool.xyz[3 * id + axis] * sign > 0);
      faces.push({ family: BOX_FAMILY, normal, offset: half, verts: orderAround(pool, on, normal) });
    }
  }
  return faces;
}

function describeFamilies(names: readonly string[]): string {
  if (names.length === 0) return 'no families';
  if (names.length === 1) return `the family ${names[0]}`;
  return `the families ${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/**
 * The envelope of explicit planes: the intersection of {x : x·n̂ ≤ offset} over `planes`.
 *
 * Edge cases: duplicate planes (same normal and offset within tolerance) make one face, owned by
 * the first; a redundant plane that only touches the solid at a vertex or along an edge makes no
 * face; a plane cutting off less than {@link LENGTH_TOL} changes nothing; vertices closer than
 * that are merged. Throws {@link EnvelopeError} when a plane has offset ≤ {@link LENGTH_TOL}, a NaN
 * or a zero normal, when there are no planes, and when the planes do not close a solid (or the
 * solid reaches farther than {@link ENVELOPE_REACH} × the largest offset from the centre).
 * `familyNames[k]` names family k in messages.
 */
export function envelopeOfPlanes(planes: readonly EnvelopePlane[], familyNames: readonly string[] = []): Envelope {
  const nameOf = (k: number) => familyNames[k] ?? `family ${k + 1}`;
  if (planes.length === 0) throw new EnvelopeError('no planes given: an envelope needs families of planes with offsets > 0');
  const unit: EnvelopePlane[] = [];
  let reach = 0;
  for (const p of planes) {
    if (!Number.isFinite(p.offset)) throw new EnvelopeError(`${nameOf(p.family)}: the offset must be a number, got ${p.offset}`);
    if (!(p.offset > LENGTH_TOL)) {
      throw new EnvelopeError(
        `${nameOf(p.family)}: offset ${p.offset} — a plane at offset 0 (or less) passes through the centre ` +
          'and cannot bound a solid; give it an offset greater than 0.001 mm',
      );
    }
    if (!p.normal.every(Number.isFinite) || !(Math.hypot(...p.normal) > 0)) {
      throw new EnvelopeError(`${nameOf(p.family)}: the normal must be a non-zero vector of numbers`);
    }
    unit.push({ normal: normalize(p.normal), offset: p.offset, family: p.family });
    reach = Math.max(reach, p.offset);
  }
  const pool = new VertexPool(LENGTH_TOL);
  let faces = boxFaces(pool, reach * ENVELOPE_REACH);
  for (const p of unit) faces = clip(pool, faces, p, LENGTH_TOL);
  faces = tidyFaces(pool, faces, LENGTH_TOL);
  if (faces.length < 4 || faces.some((f) => f.family === BOX_FAMILY)) {
    const used = [...new Set(unit.map((p) => p.family))].sort((a, b) => a - b).map(nameOf);
    throw new EnvelopeError(
      `${describeFamilies(used)} do${used.length === 1 ? 'es' : ''} not enclose a solid: add a family whose planes close it`,
    );
  }
  return assemble(pool, faces);
}

function assemble(pool: VertexPool, faces: readonly WorkFace[]): Envelope {
  const index = new Map<number, number>();
  const vertices: Vec3[] = [];
  const outFaces: EnvelopeFace[] = faces.map((f) => ({
    family: f.family,
    normal: f.normal,
    offset: f.offset,
    vertices: f.verts.map((id) => {
      let k = index.get(id);
      if (k === undefined) {
        k = vertices.length;
        index.set(id, k);
        vertices.push(pool.point(id));
      }
      return k;
    }),
  }));
  const edgeFaces = new Map<string, number[]>();
  const edges: [number, number][] = [];
  outFaces.forEach((f, fi) => {
    const vs = f.vertices;
    for (let k = 0; k < vs.length; k++) {
      const a = vs[k];
      const b = vs[(k + 1) % vs.length];
      const key = a < b ? `${a},${b}` : `${b},${a}`;
      const list = edgeFaces.get(key);
      if (list) list.push(fi);
      else {
        edgeFaces.set(key, [fi]);
        edges.push(a < b ? [a, b] : [b, a]);
      }
    }
  });
  const faceSides: Record<string, number> = {};
  for (const f of outFaces) faceSides[String(f.vertices.length)] = (faceSides[String(f.vertices.length)] ?? 0) + 1;
  const angles = new Set<number>();
  for (const list of edgeFaces.values()) {
    if (list.length !== 2) continue;
    const between = angleBetween(outFaces[list[0]].normal, outFaces[list[1]].normal);
    angles.add(Math.round(toDegrees(Math.PI - between) * 1000) / 1000);
  }
  return { vertices, edges, faces: outFaces, faceSides, dihedralDeg: [...angles].sort((a, b) => a - b) };
}

/**
 * The envelope of a design's families: each family's plane is replicated over its orbit under
 * `group` ({@link planeOrbit}) and the solid is {@link envelopeOfPlanes} of all of them. Face
 * `family` indices point into `families`. Throws {@link EnvelopeError} naming the family for an
 * offset that is 0 (the planes pass through the centre), negative or not a number, for a zero
 * normal, and when the families do not enclose a solid.
 */
export function envelopeOfFamilies(group: RotationGroup, families: readonly EnvelopeFamily[]): Envelope {
  const names = families.map((f, k) => f.id ?? `family ${k + 1}`);
  if (families.length === 0) throw new EnvelopeError('no families given: an envelope needs at least one family with an offset > 0');
  const planes: EnvelopePlane[] = [];
  families.forEach((f, k) => {
    if (!f.normal.every(Number.isFinite) || !(Math.hypot(...f.normal) > 0)) {
      throw new EnvelopeError(`${names[k]}: the normal must be a non-zero vector of numbers`);
    }
    if (!(f.offset > LENGTH_TOL)) {
      throw new EnvelopeError(
        Number.isNaN(f.offset)
          ? `${names[k]}: the offset must be a number`
          : `${names[k]}: offset ${f.offset} — its planes pass through the centre or behind it and cannot bound a solid; ` +
              'give it an offset greater than 0.001 mm',
      );
    }
    for (const p of planeOrbit(group, f.normal, f.offset).planes) planes.push({ normal: p.frame.normal, offset: f.offset, family: k });
  });
  return envelopeOfPlanes(planes, names);
}

/**
 * The outline of the envelope cut by the plane of `frame`, as a convex polygon in that plane's
 * 2-D frame, counter-clockwise (x along u, y along v, seen from the side the normal points to).
 * When the plane is a face plane the outline is that face. Returns null when the plane misses
 * the solid or only touches it at a vertex or along an edge (no area wider than
 * {@link LENGTH_TOL}). Points closer than the tolerance are merged and collinear points dropped.
 */
export function sectionOutline(envelope: Envelope, frame: PlaneFrame): Vec2[] | null {
  const n = frame.normal;
  const s = envelope.vertices.map((p) => dot(p, n) - frame.offset);
  const pts: Vec2[] = [];
  const push = (p: Vec3) => {
    const x = dot([p[0] - frame.origin[0], p[1] - frame.origin[1], p[2] - frame.origin[2]], frame.u);
    const y = dot([p[0] - frame.origin[0], p[1] - frame.origin[1], p[2] - frame.origin[2]], frame.v);
    pts.push([x, y]);
  };
  envelope.vertices.forEach((p, k) => {
    if (Math.abs(s[k]) <= LENGTH_TOL) push(p);
  });
  for (const [i, j] of envelope.edges) {
    if ((s[i] < -LENGTH_TOL && s[j] > LENGTH_TOL) || (s[i] > LENGTH_TOL && s[j] < -LENGTH_TOL)) {
      const t = s[i] / (s[i] - s[j]);
      const a = envelope.vertices[i];
      const b = envelope.vertices[j];
      push([a[0] + t * (b[0] - a[0]), a[1] + t * (b[1] - a[1]), a[2] + t * (b[2] - a[2])]);
    }
  }
  const hull = convexHull2(pts, LENGTH_TOL);
  if (hull.length < 3) return null;
  let area2 = 0;
  let diameter = 0;
  for (let k = 0; k < hull.length; k++) {
    const p = hull[k];
    const q = hull[(k + 1) % hull.length];
    area2 += p[0] * q[1] - q[0] * p[1];
    diameter = Math.max(diameter, Math.hypot(p[0] - hull[0][0], p[1] - hull[0][1]));
  }
  return area2 / 2 / diameter >= LENGTH_TOL ? hull : null;
}

/**
 * Convex hull of 2-D points, counter-clockwise, without collinear points (monotone chain).
 * Points closer than `tol` count as one; a point within `tol` of the line of its neighbours is dropped.
 */
export function convexHull2(points: readonly Vec2[], tol: number = LENGTH_TOL): Vec2[] {
  const sorted = [...points].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const uniq: Vec2[] = [];
  for (const p of sorted) {
    if (!uniq.some((q) => Math.hypot(p[0] - q[0], p[1] - q[1]) < tol)) uniq.push(p);
  }
  if (uniq.length < 3) return uniq;
  // A turn counts only when the middle point is farther than tol from the chord of its neighbours.
  const turnsLeft = (o: Vec2, a: Vec2, b: Vec2) => {
    const c = (a[0] - o[0]) * (b[1] - o[1]) - (a[1] - o[1]) * (b[0] - o[0]);
    return c > tol * Math.hypot(b[0] - o[0], b[1] - o[1]);
  };
  const chain = (pts: Vec2[]) => {
    const h: Vec2[] = [];
    for (const p of pts) {
      while (h.length >= 2 && !turnsLeft(h[h.length - 2], h[h.length - 1], p)) h.pop();
      h.push(p);
    }
    h.pop();
    return h;
  };
  return [...chain(uniq), ...chain([...uniq].reverse())];
}
