/**
 * The envelope: the convex solid bounded by the chosen families of planes (DESIGN.md "envelope",
 * FORMAT.md §6 `envelope`). It is the intersection of the half-spaces {x : x·n̂ ≤ d} over every
 * plane of every family's orbit.
 *
 * Method: start from a cube far larger than any sculpture and clip it by each half-space in turn,
 * keeping the solid as a list of faces (vertex loops) over one pool of vertices; each cut's new
 * face is built from the rim edges of its neighbours, so the surface stays closed. Topology is
 * decided at rounding precision; FORMAT.md §1 "Tolerance" is applied once at the end: planes whose
 * normals agree within {@link ANGLE_TOL} are one direction, vertices joined by an edge shorter than
 * {@link LENGTH_TOL} are one (so edges and faces smaller than that vanish), and points left on a
 * straight edge are dropped. Vertices are then moved onto their face planes' meeting point. When a
 * face of the starting cube survives, the planes do not close a solid.
 */
import type { RotationGroup } from './groups.js';
import { type PlaneFrame, planeFrame } from './frames.js';
import { planeOrbit } from './orbits.js';
import { ANGLE_TOL, LENGTH_TOL, toDegrees } from './tolerance.js';
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

/**
 * The envelope as a polyhedron. Vertices lie on their face planes to rounding (~1e-12 mm), except
 * where edges shorter than the length tolerance were merged: such a vertex usually lies within
 * twice the tolerance of each of its planes, and up to about three times it where two planes meet
 * at ~1e-5 rad far from the centre (the topology stays closed either way).
 */
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
  /** Name used in messages as "family <id>" (e.g. a design's family id); defaults to its 1-based position. */
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

/** Squared chord between unit normals below which they are one direction (angle < ANGLE_TOL). */
const SAME_DIRECTION = ANGLE_TOL * ANGLE_TOL;

interface WorkFace {
  /** Index of the bounding plane in the working list, or -1 for the starting cube. */
  plane: number;
  family: number;
  normal: Vec3;
  offset: number;
  verts: number[];
}

/** Vertex store: flat coordinates, one id per vertex. */
class VertexPool {
  readonly xyz: number[] = [];

  get size(): number {
    return this.xyz.length / 3;
  }

  add(x: number, y: number, z: number): number {
    this.xyz.push(x, y, z);
    return this.size - 1;
  }

  point(id: number): Vec3 {
    return [this.xyz[3 * id], this.xyz[3 * id + 1], this.xyz[3 * id + 2]];
  }

  set(id: number, p: Vec3): void {
    this.xyz[3 * id] = p[0];
    this.xyz[3 * id + 1] = p[1];
    this.xyz[3 * id + 2] = p[2];
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

function dedupeLoop(verts: readonly number[]): number[] {
  const out: number[] = [];
  for (const v of verts) if (out[out.length - 1] !== v) out.push(v);
  while (out.length > 1 && out[0] === out[out.length - 1]) out.pop();
  return out;
}

/**
 * Rounding allowance of a signed distance n·p − d: a few hundred units in the last place of the
 * magnitudes involved. Topology is decided this finely, so that nearly coincident planes still
 * cut consistently; the length tolerance is applied once, at the end ({@link collapseShortEdges}).
 */
const ROUNDING = 1e-10;

/**
 * Per-vertex scratch of one envelope computation, indexed by vertex id and reused across cuts
 * (a cut marks the entries it wrote with its own stamp), so cuts do not allocate per-vertex maps.
 */
class Scratch {
  s = new Float64Array(256);
  side = new Int8Array(256);
  seen = new Int32Array(256);
  cap = new Int32Array(256);
  stamp = 0;

  fit(n: number): void {
    if (n <= this.s.length) return;
    const size = Math.max(n, 2 * this.s.length);
    const s = new Float64Array(size);
    const side = new Int8Array(size);
    const seen = new Int32Array(size);
    const cap = new Int32Array(size);
    s.set(this.s);
    side.set(this.side);
    seen.set(this.seen);
    cap.set(this.cap);
    Object.assign(this, { s, side, seen, cap });
  }
}

/** Key of an unordered vertex pair, as a number (ids stay far below 2^26). */
const pairKey = (a: number, b: number) => (a < b ? a * 67108864 + b : b * 67108864 + a);

/** Clips the solid by {x : x·n ≤ d}. Returns the new face list (the input is not changed). */
function clip(pool: VertexPool, faces: readonly WorkFace[], plane: EnvelopePlane, index: number, sc: Scratch): WorkFace[] {
  const [nx, ny, nz] = plane.normal;
  const d = plane.offset;
  const stamp = ++sc.stamp;
  sc.fit(pool.size);
  // side: −1 inside, 0 on the plane, +1 outside.
  let outside = false;
  const x = pool.xyz;
  for (const f of faces) {
    for (const id of f.verts) {
      if (sc.seen[id] === stamp) continue;
      sc.seen[id] = stamp;
      const px = x[3 * id];
      const py = x[3 * id + 1];
      const pz = x[3 * id + 2];
      const v = nx * px + ny * py + nz * pz - d;
      const eps = ROUNDING * (Math.abs(px) + Math.abs(py) + Math.abs(pz) + d);
      sc.s[id] = v;
      const k = v > eps ? 1 : v < -eps ? -1 : 0;
      sc.side[id] = k;
      if (k > 0) outside = true;
    }
  }
  if (!outside) return faces as WorkFace[];

  const cut = new Map<number, number>();
  const capIds: number[] = [];
  const addCap = (id: number) => {
    sc.fit(id + 1);
    if (sc.cap[id] !== stamp) {
      sc.cap[id] = stamp;
      capIds.push(id);
    }
  };
  const crossing = (a: number, b: number): number => {
    const key = pairKey(a, b);
    const hit = cut.get(key);
    if (hit !== undefined) return hit;
    const i = Math.min(a, b);
    const j = Math.max(a, b);
    const t = sc.s[i] / (sc.s[i] - sc.s[j]);
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
    let changed = false;
    for (const id of vs) if (sc.side[id] > 0) changed = true;
    if (!changed) {
      for (const id of vs) if (sc.side[id] === 0) addCap(id);
      next.push(f);
      continue;
    }
    const out: number[] = [];
    for (let k = 0; k < vs.length; k++) {
      const a = vs[k];
      const b = vs[(k + 1) % vs.length];
      const ka = sc.side[a];
      const kb = sc.side[b];
      if (ka <= 0) {
        out.push(a);
        if (ka === 0) addCap(a);
      }
      if (ka * kb < 0) {
        const m = crossing(a, b);
        out.push(m);
        addCap(m);
      }
    }
    const loop = dedupeLoop(out);
    if (loop.length >= 3) next.push({ ...f, verts: loop });
  }
  if (capIds.length >= 3) {
    const loop = rimLoop(next, sc, stamp) ?? orderAround(pool, capIds, plane.normal);
    if (loop.length >= 3) next.push({ plane: index, family: plane.family, normal: plane.normal, offset: plane.offset, verts: loop });
  }
  return next;
}

/**
 * The cap of a cut as one loop of existing edges: the edges on the cutting plane that only one
 * remaining face uses are the rim of the part cut away, and the cap runs along them the other way.
 * Building the cap from the neighbours' own edges keeps the surface closed even where the cutting
 * plane is nearly parallel to a face. Returns null when the rim is not one simple loop (then the
 * caller orders the points by angle instead). On-plane vertices are those with `sc.cap === stamp`.
 */
function rimLoop(faces: readonly WorkFace[], sc: Scratch, stamp: number): number[] | null {
  const uses = new Map<number, number>();
  const directed: number[] = [];
  for (const f of faces) {
    const vs = f.verts;
    for (let k = 0; k < vs.length; k++) {
      const a = vs[k];
      const b = vs[(k + 1) % vs.length];
      if (sc.cap[a] !== stamp || sc.cap[b] !== stamp) continue;
      const key = pairKey(a, b);
      uses.set(key, (uses.get(key) ?? 0) + 1);
      directed.push(a, b);
    }
  }
  const step = new Map<number, number>();
  for (let k = 0; k < directed.length; k += 2) {
    const a = directed[k];
    const b = directed[k + 1];
    if (uses.get(pairKey(a, b)) !== 1) continue;
    if (step.has(b)) return null;
    step.set(b, a);
  }
  if (step.size < 3) return step.size === 0 ? [] : null;
  const start = step.keys().next().value as number;
  const loop: number[] = [start];
  for (let v = step.get(start); v !== start; v = step.get(v)) {
    if (v === undefined || loop.length > step.size) return null;
    loop.push(v);
  }
  return loop.length === step.size ? loop : null;
}

class UnionFind {
  private readonly parent = new Map<number, number>();
  find(i: number): number {
    let r = i;
    for (let p = this.parent.get(r); p !== undefined && p !== r; p = this.parent.get(r)) r = p;
    this.parent.set(i, r);
    return r;
  }
  union(a: number, b: number): void {
    const ra = this.find(a);
    const rb = this.find(b);
    if (ra !== rb) this.parent.set(Math.max(ra, rb), Math.min(ra, rb));
  }
}

/**
 * Applies the length tolerance: the ends of every edge shorter than `tol` become one vertex (at
 * the member that best fits all their planes), so edges and faces smaller than the tolerance
 * vanish. Then drops what no longer bounds anything: faces left with fewer than three vertices, and vertices on fewer than three
 * faces (points on a straight edge).
 */
function collapseShortEdges(pool: VertexPool, faces: readonly WorkFace[], tol: number): WorkFace[] {
  const uf = new UnionFind();
  const t2 = tol * tol;
  for (const f of faces) {
    for (let k = 0; k < f.verts.length; k++) {
      const a = f.verts[k];
      const b = f.verts[(k + 1) % f.verts.length];
      const dx = pool.xyz[3 * a] - pool.xyz[3 * b];
      const dy = pool.xyz[3 * a + 1] - pool.xyz[3 * b + 1];
      const dz = pool.xyz[3 * a + 2] - pool.xyz[3 * b + 2];
      if (dx * dx + dy * dy + dz * dz < t2) uf.union(a, b);
    }
  }
  const members = new Map<number, number[]>();
  for (const f of faces) {
    for (const v of f.verts) {
      const r = uf.find(v);
      const list = members.get(r);
      if (!list) members.set(r, [v]);
      else if (!list.includes(v)) list.push(v);
    }
  }
  // Each merged vertex goes where one of its members was: the member nearest to every face
  // plane of the cluster (each member lies exactly on its own planes, so this keeps the worst
  // distance to the planes below the cluster's size, and usually far below it).
  const planesOf = new Map<number, WorkFace[]>();
  for (const f of faces) {
    for (const v of f.verts) {
      const r = uf.find(v);
      if ((members.get(r)?.length ?? 0) < 2) continue;
      const list = planesOf.get(r) ?? planesOf.set(r, []).get(r)!;
      if (!list.includes(f)) list.push(f);
    }
  }
  for (const [r, list] of members) {
    if (list.length < 2) continue;
    const fs = planesOf.get(r)!;
    let best = list[0];
    let bestResidual = Infinity;
    for (const v of list) {
      const p = pool.point(v);
      let worst = 0;
      for (const f of fs) worst = Math.max(worst, Math.abs(dot(p, f.normal) - f.offset));
      if (worst < bestResidual) {
        bestResidual = worst;
        best = v;
      }
    }
    pool.set(r, pool.point(best));
  }
  let current = faces.map((f) => ({ ...f, verts: dedupeLoop(f.verts.map((v) => uf.find(v))) })).filter((f) => f.verts.length >= 3);
  for (let pass = 0; pass < 16; pass++) {
    const count = new Map<number, number>();
    for (const f of current) for (const v of f.verts) count.set(v, (count.get(v) ?? 0) + 1);
    let removed = false;
    const next: WorkFace[] = [];
    for (const f of current) {
      const verts = dedupeLoop(f.verts.filter((v) => count.get(v)! >= 3));
      if (verts.length !== f.verts.length) removed = true;
      if (verts.length < 3) {
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

/**
 * Moves each vertex onto the least-squares meeting point of its face planes, which undoes the
 * rounding of repeated clipping (coordinates then agree with the planes to ~1e-12 mm) and places
 * a vertex merged from a cluster of short edges where its planes best meet. A vertex whose planes
 * are too close to parallel to fix a point, whose fix would move it farther than 10 × `tol`, or
 * would not bring it nearer its planes, stays where it is.
 */
function polishVertices(pool: VertexPool, faces: readonly WorkFace[], tol: number): void {
  const planesOf = new Map<number, WorkFace[]>();
  for (const f of faces) for (const v of f.verts) (planesOf.get(v) ?? planesOf.set(v, []).get(v)!).push(f);
  for (const [v, fs] of planesOf) {
    // Normal equations AᵀA x = Aᵀd.
    let a00 = 0, a01 = 0, a02 = 0, a11 = 0, a12 = 0, a22 = 0, b0 = 0, b1 = 0, b2 = 0;
    for (const f of fs) {
      const [nx, ny, nz] = f.normal;
      a00 += nx * nx; a01 += nx * ny; a02 += nx * nz; a11 += ny * ny; a12 += ny * nz; a22 += nz * nz;
      b0 += nx * f.offset; b1 += ny * f.offset; b2 += nz * f.offset;
    }
    const c00 = a11 * a22 - a12 * a12;
    const c01 = a02 * a12 - a01 * a22;
    const c02 = a01 * a12 - a02 * a11;
    const det = a00 * c00 + a01 * c01 + a02 * c02;
    if (!(det > 1e-9 * fs.length ** 3)) continue;
    const c11 = a00 * a22 - a02 * a02;
    const c12 = a01 * a02 - a00 * a12;
    const c22 = a00 * a11 - a01 * a01;
    const p: Vec3 = [(c00 * b0 + c01 * b1 + c02 * b2) / det, (c01 * b0 + c11 * b1 + c12 * b2) / det, (c02 * b0 + c12 * b1 + c22 * b2) / det];
    const q = pool.point(v);
    const residual = (x: Vec3) => Math.max(...fs.map((f) => Math.abs(dot(x, f.normal) - f.offset)));
    if (Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) <= 10 * tol && residual(p) <= residual(q)) pool.set(v, p);
  }
}

function boxFaces(pool: VertexPool, half: number): WorkFace[] {
  const ids: number[] = [];
  for (const x of [-half, half]) for (const y of [-half, half]) for (const z of [-half, half]) ids.push(pool.add(x, y, z));
  const faces: WorkFace[] = [];
  for (let axis = 0; axis < 3; axis++) {
    for (const sign of [-1, 1]) {
      const normal: Vec3 = [axis === 0 ? sign : 0, axis === 1 ? sign : 0, axis === 2 ? sign : 0];
      const on = ids.filter((id) => pool.xyz[3 * id + axis] * sign > 0);
      faces.push({ plane: -1, family: BOX_FAMILY, normal, offset: half, verts: orderAround(pool, on, normal) });
    }
  }
  return faces;
}

/** What is wrong with a bounding offset, or null when it can bound a solid. */
function offsetProblem(offset: number): string | null {
  if (!Number.isFinite(offset)) return `the offset must be a finite number of mm, got ${offset}`;
  if (offset < -LENGTH_TOL) return `offset ${offset} is negative: an offset is a distance from the centre; give one greater than 0.001 mm`;
  if (offset <= LENGTH_TOL) {
    return `offset ${offset} puts its planes through the centre, so they cannot bound a solid; give it an offset greater than 0.001 mm`;
  }
  return null;
}

function describeFamilies(names: readonly string[]): string {
  if (names.length === 0) return 'no families';
  if (names.length === 1) return `the family ${names[0]}`;
  return `the families ${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
}

/**
 * The envelope of explicit planes: the intersection of {x : x·n̂ ≤ offset} over `planes`.
 *
 * Edge cases: planes whose normals agree within {@link ANGLE_TOL} count as one direction, and only
 * the nearest of them bounds (with offsets within {@link LENGTH_TOL}, the first listed owns the
 * face); a plane whose whole face lies within {@link LENGTH_TOL} of a neighbouring face's plane is
 * that plane (no sliver face at almost 180°); a redundant plane that only touches the solid at a vertex or along an edge makes no
 * face; a cut whose new edges are all shorter than {@link LENGTH_TOL} leaves nothing behind
 * (its vertices merge back into one). Throws {@link EnvelopeError} when a plane has offset ≤ {@link LENGTH_TOL}, a NaN
 * or a zero normal, when there are no planes, and when the planes do not close a solid (or the
 * solid reaches farther than {@link ENVELOPE_REACH} × the largest offset from the centre).
 * `familyNames[k]` names family k in messages.
 */
export function envelopeOfPlanes(planes: readonly EnvelopePlane[], familyNames: readonly string[] = []): Envelope {
  const nameOf = (k: number) => familyNames[k] ?? String(k + 1);
  if (planes.length === 0) throw new EnvelopeError('no planes given: an envelope needs families of planes with offsets > 0');
  const unit: EnvelopePlane[] = [];
  let reach = 0;
  for (const p of planes) {
    const problem = offsetProblem(p.offset);
    if (problem) throw new EnvelopeError(`family ${nameOf(p.family)}: ${problem}`);
    if (!p.normal.every(Number.isFinite) || !(Math.hypot(...p.normal) > 0)) {
      throw new EnvelopeError(`family ${nameOf(p.family)}: the normal must be a non-zero vector of numbers`);
    }
    const n = normalize(p.normal);
    reach = Math.max(reach, p.offset);
    // Normals within the angle tolerance are one direction: only the nearest such plane bounds.
    let same = -1;
    for (let k = 0; k < unit.length && same < 0; k++) {
      const q = unit[k].normal;
      const dx = q[0] - n[0];
      const dy = q[1] - n[1];
      const dz = q[2] - n[2];
      if (dx * dx + dy * dy + dz * dz < SAME_DIRECTION) same = k;
    }
    if (same < 0) unit.push({ normal: n, offset: p.offset, family: p.family });
    else if (p.offset < unit[same].offset - LENGTH_TOL) unit[same] = { normal: n, offset: p.offset, family: p.family };
  }
  let active = unit;
  for (let pass = 0; ; pass++) {
    const pool = new VertexPool();
    let faces = boxFaces(pool, reach * ENVELOPE_REACH);
    const scratch = new Scratch();
    active.forEach((p, k) => {
      faces = clip(pool, faces, p, k, scratch);
    });
    faces = collapseShortEdges(pool, faces, LENGTH_TOL);
    if (faces.length < 4 || faces.some((f) => f.family === BOX_FAMILY)) {
      const used = [...new Set(planes.map((p) => p.family))].sort((a, b) => a - b).map(nameOf);
      throw new EnvelopeError(
        `${describeFamilies(used)} do${used.length === 1 ? 'es' : ''} not enclose a solid: add a family whose planes close it`,
      );
    }
    const drop = pass < 4 ? withinToleranceOfNeighbour(pool, faces, LENGTH_TOL) : new Set<number>();
    if (drop.size === 0) {
      polishVertices(pool, faces, LENGTH_TOL);
      return assemble(pool, faces);
    }
    active = active.filter((_, k) => !drop.has(k));
  }
}

/**
 * Planes whose whole face lies within `tol` of the plane of a neighbouring face: within the
 * tolerance they are that plane, and their face would only show as a sliver meeting it at almost
 * 180°. Smaller faces give way to larger ones; a face that gives way is not itself kept for another.
 */
function withinToleranceOfNeighbour(pool: VertexPool, faces: readonly WorkFace[], tol: number): Set<number> {
  const byEdge = new Map<number, number[]>();
  faces.forEach((f, fi) => {
    for (let k = 0; k < f.verts.length; k++) {
      const key = pairKey(f.verts[k], f.verts[(k + 1) % f.verts.length]);
      (byEdge.get(key) ?? byEdge.set(key, []).get(key)!).push(fi);
    }
  });
  const area = faces.map((f) => faceArea(pool, f.verts));
  const lies = (f: WorkFace, g: WorkFace) =>
    f.verts.every((v) => Math.abs(dot(pool.point(v), g.normal) - g.offset) <= tol);
  const order = faces.map((_, k) => k).sort((a, b) => area[a] - area[b] || faces[b].plane - faces[a].plane);
  const dropped = new Set<number>();
  const drop = new Set<number>();
  for (const fi of order) {
    const f = faces[fi];
    const neighbours = new Set<number>();
    for (let k = 0; k < f.verts.length; k++) {
      for (const gi of byEdge.get(pairKey(f.verts[k], f.verts[(k + 1) % f.verts.length])) ?? []) if (gi !== fi) neighbours.add(gi);
    }
    for (const gi of neighbours) {
      if (dropped.has(gi) || faces[gi].plane < 0) continue;
      if (lies(f, faces[gi])) {
        dropped.add(fi);
        drop.add(f.plane);
        break;
      }
    }
  }
  return drop;
}

/** Area of a face loop (Newell's formula). */
function faceArea(pool: VertexPool, verts: readonly number[]): number {
  let ax = 0;
  let ay = 0;
  let az = 0;
  for (let k = 0; k < verts.length; k++) {
    const p = pool.point(verts[k]);
    const q = pool.point(verts[(k + 1) % verts.length]);
    ax += (p[1] - q[1]) * (p[2] + q[2]);
    ay += (p[2] - q[2]) * (p[0] + q[0]);
    az += (p[0] - q[0]) * (p[1] + q[1]);
  }
  return Math.hypot(ax, ay, az) / 2;
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
  const names = families.map((f, k) => f.id ?? String(k + 1));
  if (families.length === 0) throw new EnvelopeError('no families given: an envelope needs at least one family with an offset > 0');
  const planes: EnvelopePlane[] = [];
  families.forEach((f, k) => {
    if (!f.normal.every(Number.isFinite) || !(Math.hypot(...f.normal) > 0)) {
      throw new EnvelopeError(`family ${names[k]}: the normal must be a non-zero vector of numbers`);
    }
    const problem = offsetProblem(f.offset);
    if (problem) throw new EnvelopeError(`family ${names[k]}: ${problem}`);
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
