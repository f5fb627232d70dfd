/**
 * Render data for the 3-D viewer: one slab geometry per template (the cutting shape extruded to
 * the material thickness, holes cut), one placement matrix per piece, and the joints as world
 * segments. Pure maths; the viewer only copies these arrays into GPU buffers.
 *
 * Choices (the project's own):
 * - A template's geometry is built in its representative piece's own 2-D frame: x, y in the plane
 *   frame, z along the plane normal, centred on the mid-surface (z from −t/2 to +t/2).
 * - A piece is placed by the congruence map from the representative's polygon onto the piece's
 *   polygon (a rotation or reflection plus a translation), lifted into the piece's frame. When the
 *   2-D map mirrors, the slab's z is reversed too: the slab is symmetric about its mid-surface,
 *   so the 3-D placement stays a proper rotation and triangle winding stays outward.
 * - Every placement is checked by mapping the representative's vertices and comparing them with
 *   the piece's (within {@link PLACEMENT_TOL}); a piece no map is found for gets a geometry of its
 *   own (never a wrong placement, never an exception).
 */
import earcut from 'earcut';
import type { PlaneFrame } from './frames.js';
import { toWorld } from './frames.js';
import type { JointKind, Piece, Polygon2, Ring, ResolvedDesign, Template } from './model.js';
import type { Mat2 } from './orbits.js';
import { buildPieces } from './pieces.js';
import { det2, edgePairingMaps, nearlySamePolygon, normalizePolygon, removeCollinear, samePolygon, signedArea, transformPolygon, type Rigid2 } from './polygons.js';
import type { Vec2, Vec3 } from './vec.js';

/** Vertices of a mapped representative must land this close (mm) on the piece's vertices. */
export const PLACEMENT_TOL = 1e-6;

/** A non-indexed-normal triangle mesh: 3 floats per vertex, 3 indices per triangle. */
export interface SlabGeometry {
  readonly positions: Float32Array;
  readonly normals: Float32Array;
  readonly indices: Uint32Array;
}

export type { Rigid2 };

/** One instance of a template geometry: a piece placed in the world. */
export interface SceneInstance {
  readonly piece: string;
  readonly motif: string;
  readonly template: number;
  /** Index of the piece's family in the design's family list. */
  readonly family: number;
  /** Column-major 4 × 4 matrix from the geometry's local frame to the world. */
  readonly matrix: Float64Array;
  /** Area centroid of the piece in the world. */
  readonly centroid: Vec3;
  /**
   * Unit direction from the scene's centre to the centroid, along which the exploded view pushes
   * the piece; [0, 0, 0] for a piece centred on the scene's centre (it stays put).
   */
  readonly explode: Vec3;
}

/** One slab geometry and the pieces drawn with it. */
export interface SceneMesh {
  /** The template this geometry cuts (several meshes share a template only after a fallback). */
  readonly template: number;
  /** The 2-D polygon the geometry was extruded from (local frame). */
  readonly outline: Polygon2;
  readonly geometry: SlabGeometry;
  readonly instances: readonly SceneInstance[];
}

/** The fields of a joint the viewer draws (the audit report's joints carry them). */
export interface JointInput {
  readonly a: string;
  readonly b: string;
  readonly kind: JointKind | string;
  readonly orthogonal: boolean;
  readonly angleDeg?: number;
  readonly length?: number;
  readonly from: Vec3;
  readonly to: Vec3;
}

/** A joint as a world segment. */
export interface SceneJoint {
  readonly index: number;
  readonly a: string;
  readonly b: string;
  readonly kind: string;
  readonly orthogonal: boolean;
  readonly locked: boolean;
  readonly angleDeg: number | null;
  readonly length: number;
  readonly from: Vec3;
  readonly to: Vec3;
}

/** Everything the viewer draws. */
export interface Scene {
  readonly meshes: readonly SceneMesh[];
  readonly joints: readonly SceneJoint[];
  readonly pieceCount: number;
  readonly templateCount: number;
  /** Family ids in design order (the `family` index of an instance points here). */
  readonly families: readonly string[];
  /** Bounding sphere of every piece outline. Radius 0 when there are no pieces. */
  readonly center: Vec3;
  readonly radius: number;
  readonly thickness: number;
}

/**
 * The slab of a polygon: the outline (with holes) extruded to `thickness`, centred on z = 0.
 * Caps are triangulated with earcut (each triangle turned to face outwards), side walls are one
 * quad of 4 own vertices per ring edge so every face is flat-shaded. The polygon is normalised
 * first (outer ring counter-clockwise, holes clockwise). A ring with fewer than 3 points and a
 * non-positive thickness give an empty geometry. Vertex count: 6 × (ring vertices).
 */
export function slabGeometry(polygon: Polygon2, thickness: number): SlabGeometry {
  const p = normalizePolygon(polygon);
  const rings: Ring[] = [p.outer, ...p.holes].filter((r) => r.length >= 3);
  if (!(thickness > 0) || rings.length === 0 || p.outer.length < 3) {
    return { positions: new Float32Array(0), normals: new Float32Array(0), indices: new Uint32Array(0) };
  }
  const h = thickness / 2;
  const n = rings.reduce((s, r) => s + r.length, 0);
  const positions = new Float32Array(n * 6 * 3);
  const normals = new Float32Array(n * 6 * 3);
  const indices: number[] = [];
  // Caps: vertices 0..n-1 on top (z = +h), n..2n-1 at the bottom.
  const flat: number[] = [];
  const holeIndices: number[] = [];
  for (let r = 0; r < rings.length; r++) {
    if (r > 0) holeIndices.push(flat.length / 2);
    for (const q of rings[r]) flat.push(q[0], q[1]);
  }
  for (let i = 0; i < n; i++) {
    const x = flat[2 * i];
    const y = flat[2 * i + 1];
    positions.set([x, y, h], 3 * i);
    normals.set([0, 0, 1], 3 * i);
    positions.set([x, y, -h], 3 * (n + i));
    normals.set([0, 0, -1], 3 * (n + i));
  }
  const tris = earcut(flat, holeIndices, 2);
  for (let t = 0; t < tris.length; t += 3) {
    let i0 = tris[t];
    let i1 = tris[t + 1];
    const i2 = tris[t + 2];
    const area = (flat[2 * i1] - flat[2 * i0]) * (flat[2 * i2 + 1] - flat[2 * i0 + 1]) - (flat[2 * i1 + 1] - flat[2 * i0 + 1]) * (flat[2 * i2] - flat[2 * i0]);
    if (area < 0) [i0, i1] = [i1, i0];
    indices.push(i0, i1, i2);
    indices.push(n + i0, n + i2, n + i1);
  }
  // Side walls.
  let v = 2 * n;
  for (const ring of rings) {
    const m = ring.length;
    for (let i = 0; i < m; i++) {
      const a = ring[i];
      const b = ring[(i + 1) % m];
      const dx = b[0] - a[0];
      const dy = b[1] - a[1];
      const len = Math.hypot(dx, dy) || 1;
      const nx = dy / len;
      const ny = -dx / len;
      positions.set([a[0], a[1], -h, b[0], b[1], -h, b[0], b[1], h, a[0], a[1], h], 3 * v);
      for (let k = 0; k < 4; k++) normals.set([nx, ny, 0], 3 * (v + k));
      indices.push(v, v + 1, v + 2, v, v + 2, v + 3);
      v += 4;
    }
  }
  return { positions, normals, indices: Uint32Array.from(indices) };
}

/**
 * Signed volume of a closed triangle mesh (sum of the signed tetrahedra with the origin);
 * positive when the triangles face outwards. An empty mesh has volume 0.
 */
export function meshVolume(g: SlabGeometry): number {
  const P = g.positions;
  let s = 0;
  for (let t = 0; t < g.indices.length; t += 3) {
    const a = 3 * g.indices[t];
    const b = 3 * g.indices[t + 1];
    const c = 3 * g.indices[t + 2];
    s +=
      P[a] * (P[b + 1] * P[c + 2] - P[b + 2] * P[c + 1]) -
      P[a + 1] * (P[b] * P[c + 2] - P[b + 2] * P[c]) +
      P[a + 2] * (P[b] * P[c + 1] - P[b + 1] * P[c]);
  }
  return s / 6;
}

function polygonScale(p: Polygon2): number {
  let s = 0;
  for (const q of p.outer) s = Math.max(s, Math.abs(q[0]), Math.abs(q[1]));
  return s;
}

function mapsOnto(from: Polygon2, to: Polygon2, r: Rigid2, tol: number): boolean {
  const moved = transformPolygon(from, r.m, r.tx, r.ty);
  if (moved.outer.length === to.outer.length && moved.holes.every((h, i) => to.holes[i] && h.length === to.holes[i].length)) {
    if (samePolygon(moved, to, tol)) return true;
  }
  return nearlySamePolygon(moved, to, tol);
}

/**
 * The rigid map (rotation or reflection, plus translation) that carries polygon `from` onto
 * polygon `to`, or null when they are not congruent within `tol` (relative to the size for very
 * large shapes). `hint`, when given, is tried first (cheap for pieces of one orbit). Candidates
 * pair the first edge of `from` with every edge of `to` in both directions (collinear points
 * ignored); each candidate is verified on every vertex, holes included.
 */
export function congruenceMap(from: Polygon2, to: Polygon2, tol: number = PLACEMENT_TOL, hint?: Rigid2): Rigid2 | null {
  const t = Math.max(tol, 1e-12 * Math.max(polygonScale(from), polygonScale(to)));
  if (from.holes.length !== to.holes.length) return null;
  if (hint && mapsOnto(from, to, hint, t)) return hint;
  const A = normalizePolygon({ outer: removeCollinear(from.outer, t), holes: [] }).outer;
  const B = normalizePolygon({ outer: removeCollinear(to.outer, t), holes: [] }).outer;
  const n = A.length;
  if (n < 3 || n !== B.length) return null;
  for (const { map } of edgePairingMaps(A, B, t)) if (mapsOnto(from, to, map, t)) return map;
  return null;
}

/**
 * The column-major 4 × 4 matrix that places geometry built in a template's local frame (x, y in
 * the representative's plane frame, z along its normal) onto a piece: the 2-D map `r` from the
 * representative's frame coordinates into the piece's, then the piece's frame into the world.
 * A mirroring map also reverses z, so the matrix is always a proper rigid motion (det +1).
 */
export function placementMatrix(frame: PlaneFrame, r: Rigid2): Float64Array {
  const { u, v, normal: nrm } = frame;
  const [a, b, c, d] = r.m;
  const flip = det2(r.m) < 0 ? -1 : 1;
  const o = toWorld(frame, [r.tx, r.ty]);
  const out = new Float64Array(16);
  for (let i = 0; i < 3; i++) {
    out[i] = a * u[i] + c * v[i];
    out[4 + i] = b * u[i] + d * v[i];
    out[8 + i] = flip * nrm[i];
    out[12 + i] = o[i];
  }
  out[15] = 1;
  return out;
}

/** Applies a column-major 4 × 4 matrix to a point. */
export function transformPoint(m: ArrayLike<number>, p: Vec3): Vec3 {
  return [
    m[0] * p[0] + m[4] * p[1] + m[8] * p[2] + m[12],
    m[1] * p[0] + m[5] * p[1] + m[9] * p[2] + m[13],
    m[2] * p[0] + m[6] * p[1] + m[10] * p[2] + m[14],
  ];
}

function centroid2(p: Polygon2): Vec2 {
  let a = 0;
  let cx = 0;
  let cy = 0;
  for (const ring of [p.outer, ...p.holes]) {
    const ra = signedArea(ring);
    if (ra === 0) continue;
    let sx = 0;
    let sy = 0;
    const n = ring.length;
    const o = ring[0];
    for (let i = 1; i < n - 1; i++) {
      const p1 = ring[i];
      const p2 = ring[i + 1];
      const ta = ((p1[0] - o[0]) * (p2[1] - o[1]) - (p1[1] - o[1]) * (p2[0] - o[0])) / 2;
      sx += ta * (o[0] + p1[0] + p2[0]) / 3;
      sy += ta * (o[1] + p1[1] + p2[1]) / 3;
    }
    a += ra;
    cx += sx;
    cy += sy;
  }
  if (Math.abs(a) < 1e-12) return p.outer[0] ?? [0, 0];
  return [cx / a, cy / a];
}

/** The 2-D map from a representative to a piece of the same orbit, guessed from their motif maps. */
function hintMap(rep: Piece, piece: Piece): Rigid2 | undefined {
  if (rep.motif !== piece.motif) return undefined;
  const r = rep.map;
  // r is orthogonal: its inverse is its transpose.
  const inv: Mat2 = [r[0], r[2], r[1], r[3]];
  const p = piece.map;
  const m: Mat2 = [p[0] * inv[0] + p[1] * inv[2], p[0] * inv[1] + p[1] * inv[3], p[2] * inv[0] + p[3] * inv[2], p[2] * inv[1] + p[3] * inv[3]];
  return { m, tx: 0, ty: 0 };
}

const IDENTITY_RIGID: Rigid2 = { m: [1, 0, 0, 1], tx: 0, ty: 0 };

/** Keeps the joints whose end points are finite 3-vectors (a stored report may lack them). */
export function usableJoints(joints: readonly unknown[]): JointInput[] {
  const isVec = (x: unknown): x is Vec3 => Array.isArray(x) && x.length === 3 && x.every((c) => typeof c === 'number' && Number.isFinite(c));
  const out: JointInput[] = [];
  for (const j of joints) {
    if (!j || typeof j !== 'object') continue;
    const o = j as Record<string, unknown>;
    if (typeof o.a !== 'string' || typeof o.b !== 'string' || typeof o.kind !== 'string' || !isVec(o.from) || !isVec(o.to)) continue;
    out.push({
      a: o.a,
      b: o.b,
      kind: o.kind,
      orthogonal: o.orthogonal !== false,
      ...(typeof o.angleDeg === 'number' ? { angleDeg: o.angleDeg } : {}),
      ...(typeof o.length === 'number' ? { length: o.length } : {}),
      from: o.from,
      to: o.to,
    });
  }
  return out;
}

/**
 * The scene of a design from its pieces and templates (as {@link buildPieces} gives them) and the
 * joints of its audit. Every piece appears exactly once; pieces of one template share one mesh
 * unless no congruence map onto the representative is found within {@link PLACEMENT_TOL} (then
 * the piece gets a mesh of its own, placed by the identity). Joints naming unknown pieces are kept
 * (they are drawn, just not selectable through a piece). No pieces give an empty scene, radius 0.
 */
export function buildScene(
  design: ResolvedDesign,
  build: { readonly pieces: readonly Piece[]; readonly templates: readonly Template[] },
  joints: readonly JointInput[] = [],
): Scene {
  const familyIds = design.families.map((f) => f.id);
  const familyIndex = new Map(familyIds.map((id, i) => [id, i]));
  const byId = new Map(build.pieces.map((p) => [p.id, p]));
  const t = design.material.thickness;
  const raw: { template: number; outline: Polygon2; geometry: SlabGeometry; instances: Omit<SceneInstance, 'explode'>[] }[] = [];
  const instanceOf = (piece: Piece, r: Rigid2): Omit<SceneInstance, 'explode'> => {
    const c = centroid2(piece.polygon);
    return {
      piece: piece.id,
      motif: piece.motif,
      template: piece.template,
      family: familyIndex.get(piece.family) ?? 0,
      matrix: placementMatrix(piece.frame, r),
      centroid: toWorld(piece.frame, c),
    };
  };
  for (const tpl of build.templates) {
    const rep = byId.get(tpl.representative);
    if (!rep) continue;
    const instances: Omit<SceneInstance, 'explode'>[] = [];
    for (const id of tpl.pieces) {
      const piece = byId.get(id);
      if (!piece) continue;
      const r = piece === rep ? IDENTITY_RIGID : congruenceMap(rep.polygon, piece.polygon, PLACEMENT_TOL, hintMap(rep, piece));
      if (r) instances.push(instanceOf(piece, r));
      else raw.push({ template: tpl.index, outline: piece.polygon, geometry: slabGeometry(piece.polygon, t), instances: [instanceOf(piece, IDENTITY_RIGID)] });
    }
    raw.push({ template: tpl.index, outline: rep.polygon, geometry: slabGeometry(rep.polygon, t), instances });
  }
  raw.sort((a, b) => a.template - b.template);
  // Bounding sphere: centre of the box of every outline vertex, radius to the farthest vertex.
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  const pts: Vec3[] = [];
  for (const p of build.pieces) {
    for (const q of p.polygon.outer) {
      const w = toWorld(p.frame, q);
      pts.push(w);
      for (let i = 0; i < 3; i++) {
        lo[i] = Math.min(lo[i], w[i]);
        hi[i] = Math.max(hi[i], w[i]);
      }
    }
  }
  const center: Vec3 = pts.length ? [(lo[0] + hi[0]) / 2, (lo[1] + hi[1]) / 2, (lo[2] + hi[2]) / 2] : [0, 0, 0];
  let radius = 0;
  for (const w of pts) radius = Math.max(radius, Math.hypot(w[0] - center[0], w[1] - center[1], w[2] - center[2]));
  if (pts.length) radius += t;
  const meshes: SceneMesh[] = raw.map((m) => ({
    ...m,
    instances: m.instances.map((inst) => {
      const d: Vec3 = [inst.centroid[0] - center[0], inst.centroid[1] - center[1], inst.centroid[2] - center[2]];
      const len = Math.hypot(d[0], d[1], d[2]);
      return { ...inst, explode: len > 1e-9 * Math.max(1, radius) ? [d[0] / len, d[1] / len, d[2] / len] : [0, 0, 0] };
    }),
  }));
  const sceneJoints: SceneJoint[] = joints.map((j, index) => ({
    index,
    a: j.a,
    b: j.b,
    kind: j.kind,
    orthogonal: j.orthogonal,
    locked: j.kind === 'locked-crossing',
    angleDeg: j.angleDeg ?? null,
    length: j.length ?? Math.hypot(j.to[0] - j.from[0], j.to[1] - j.from[1], j.to[2] - j.from[2]),
    from: j.from,
    to: j.to,
  }));
  return {
    meshes,
    joints: sceneJoints,
    pieceCount: build.pieces.length,
    templateCount: build.templates.length,
    families: familyIds,
    center,
    radius,
    thickness: t,
  };
}

/** {@link buildScene} with the pieces built from the design itself. */
export function sceneOfDesign(design: ResolvedDesign, joints: readonly JointInput[] = []): Scene {
  return buildScene(design, buildPieces(design), joints);
}

/** A sphere in the world (mm). */
export interface Sphere {
  readonly center: Vec3;
  readonly radius: number;
}

/**
 * The bounding sphere of some pieces of a scene, built like the scene's own: the centre of the
 * axis-aligned box of their outline vertices (each mesh's outline placed by the instance matrix),
 * the radius to the farthest of those vertices plus the material thickness (the slab faces lie
 * half a thickness off the outline). Ids the scene does not hold are ignored and a repeated id
 * counts once; `count` is the number of pieces found. Null when none of the ids is in the scene.
 */
export function piecesSphere(scene: Scene, pieces: Iterable<string>): (Sphere & { readonly count: number }) | null {
  const wanted = new Set(pieces);
  if (wanted.size === 0) return null;
  const lo = [Infinity, Infinity, Infinity];
  const hi = [-Infinity, -Infinity, -Infinity];
  const pts: Vec3[] = [];
  let count = 0;
  for (const mesh of scene.meshes) {
    for (const inst of mesh.instances) {
      if (!wanted.has(inst.piece)) continue;
      count++;
      for (const q of mesh.outline.outer) {
        const w = transformPoint(inst.matrix, [q[0], q[1], 0]);
        pts.push(w);
        for (let i = 0; i < 3; i++) {
          lo[i] = Math.min(lo[i], w[i]);
          hi[i] = Math.max(hi[i], w[i]);
        }
      }
    }
  }
  if (count === 0 || pts.length === 0) return null;
  const center: Vec3 = [(lo[0] + hi[0]) / 2, (lo[1] + hi[1]) / 2, (lo[2] + hi[2]) / 2];
  let radius = 0;
  for (const w of pts) radius = Math.max(radius, Math.hypot(w[0] - center[0], w[1] - center[1], w[2] - center[2]));
  return { center, radius: radius + scene.thickness, count };
}

/**
 * The connected groups of a stored report (`report.groups`, lists of piece ids) as far as they
 * can be read: anything that is not a list gives no groups, entries that are not lists are
 * skipped, ids that are not strings are dropped, and a group left empty is dropped.
 */
export function usableGroups(groups: unknown): string[][] {
  if (!Array.isArray(groups)) return [];
  const out: string[][] = [];
  for (const g of groups) {
    if (!Array.isArray(g)) continue;
    const ids = g.filter((x): x is string => typeof x === 'string');
    if (ids.length) out.push(ids);
  }
  return out;
}

/** Connected groups ranked for colouring: rank 0 is the largest. */
export interface GroupRanking {
  /** Rank of the group each piece is in. */
  readonly groupOf: ReadonlyMap<string, number>;
  /** Number of distinct pieces in each group, by rank (largest first). */
  readonly sizes: readonly number[];
}

/**
 * Ranks connected groups largest first (ties keep the given order) so rank 0 can take the calm
 * colour and every other rank a warm one. A piece listed in more than one group stays in the
 * first-ranked group that names it (it is not counted again); a repeated id within a group counts
 * once; a group that ends up with no piece of its own is dropped. No groups give empty results.
 */
export function rankGroups(groups: readonly (readonly string[])[]): GroupRanking {
  const order = groups.map((g, i) => ({ ids: [...new Set(g)], i })).sort((a, b) => b.ids.length - a.ids.length || a.i - b.i);
  const groupOf = new Map<string, number>();
  const sizes: number[] = [];
  for (const { ids } of order) {
    const own = ids.filter((id) => !groupOf.has(id));
    if (own.length === 0) continue;
    for (const id of own) groupOf.set(id, sizes.length);
    sizes.push(own.length);
  }
  return { groupOf, sizes };
}
