// Pin anchoring (shared/engine/pins.ts) on real designs built with parseDesign and buildPieces.
// The expected answers come from constructions independent of the code under test:
// - a pin's world point is found again by casting a ray at the slab the viewer draws (the
//   scene's template geometry placed by the instance matrix; ray–triangle intersection written
//   out here), and must lie on the slab face half a thickness off the plane;
// - an orbit copy of a pin must sit where the group's rotation carries the original point in
//   space: for pieces made by elements g and h, copy = g·h⁻¹·(original) — rotations carry slab
//   faces onto slab faces, so this fixes the side too, including on planes through the centre
//   that are reached turned over (the mirrored 2-D maps);
// - carry-over is checked on edited copies of one design where the answer is known by
//   construction (motif removed, outline shrunk, offset moved, normal tilted).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseDesign } from '../../shared/engine/design.js';
import { signedDistance, toFrame, toWorld } from '../../shared/engine/frames.js';
import { getGroup } from '../../shared/engine/groups.js';
import { apply, transpose } from '../../shared/engine/mat3.js';
import type { Piece, ResolvedDesign } from '../../shared/engine/model.js';
import { buildPieces } from '../../shared/engine/pieces.js';
import { type PinAnchor, type PinSide, anchorAt, carryPin, orbitAnchors, pinWorldPosition } from '../../shared/engine/pins.js';
import { locateInPolygon } from '../../shared/engine/polygons.js';
import { type Scene, sceneOfDesign } from '../../shared/engine/scene.js';
import type { Vec2, Vec3 } from '../../shared/engine/vec.js';
import { expectClose, expectVecClose } from './support.js';

type Doc = Record<string, any>;

const readDoc = (url: URL): Doc => JSON.parse(readFileSync(url, 'utf8')) as Doc;
const fixtureDoc = (name: string) => readDoc(new URL(`../fixtures/designs/${name}.json`, import.meta.url));
const demoDoc = (name: string) => readDoc(new URL(`../../server/seed/designs/${name}.json`, import.meta.url));

function resolve(doc: unknown): ResolvedDesign {
  const r = parseDesign(doc);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}
const piecesOf = (doc: unknown): Piece[] => [...buildPieces(resolve(doc)).pieces];
const clone = (d: Doc): Doc => JSON.parse(JSON.stringify(d)) as Doc;

/** A point well inside a piece: the first of a few candidates (centroid of the outline's vertices, then towards each vertex) that is inside. */
function insidePoint(p: Piece): Vec2 {
  const ring = p.polygon.outer;
  const c: Vec2 = [ring.reduce((s, q) => s + q[0], 0) / ring.length, ring.reduce((s, q) => s + q[1], 0) / ring.length];
  const candidates: Vec2[] = [c, ...ring.map((q): Vec2 => [c[0] + 0.5 * (q[0] - c[0]), c[1] + 0.5 * (q[1] - c[1])]), ...ring.map((q): Vec2 => [c[0] + 0.9 * (q[0] - c[0]), c[1] + 0.9 * (q[1] - c[1])])];
  const found = candidates.find((q) => locateInPolygon(q, p.polygon, 1e-6) === 'inside');
  if (!found) throw new Error(`no inside point found for ${p.id}`);
  return found;
}

/** Nearest hit of a ray on the slab the scene draws for `piece`, or null (Möller–Trumbore per triangle). */
function castAtPiece(scene: Scene, piece: string, origin: Vec3, dir: Vec3): Vec3 | null {
  for (const mesh of scene.meshes) {
    const inst = mesh.instances.find((i) => i.piece === piece);
    if (!inst) continue;
    const m = inst.matrix;
    const P = mesh.geometry.positions;
    const world = (k: number): Vec3 => {
      const x = P[3 * k], y = P[3 * k + 1], z = P[3 * k + 2];
      return [m[0] * x + m[4] * y + m[8] * z + m[12], m[1] * x + m[5] * y + m[9] * z + m[13], m[2] * x + m[6] * y + m[10] * z + m[14]];
    };
    let best = Infinity;
    const I = mesh.geometry.indices;
    for (let t = 0; t < I.length; t += 3) {
      const a = world(I[t]), b = world(I[t + 1]), c = world(I[t + 2]);
      const e1: Vec3 = [b[0] - a[0], b[1] - a[1], b[2] - a[2]];
      const e2: Vec3 = [c[0] - a[0], c[1] - a[1], c[2] - a[2]];
      const p: Vec3 = [dir[1] * e2[2] - dir[2] * e2[1], dir[2] * e2[0] - dir[0] * e2[2], dir[0] * e2[1] - dir[1] * e2[0]];
      const det = e1[0] * p[0] + e1[1] * p[1] + e1[2] * p[2];
      if (Math.abs(det) < 1e-12) continue;
      const s: Vec3 = [origin[0] - a[0], origin[1] - a[1], origin[2] - a[2]];
      const u = (s[0] * p[0] + s[1] * p[1] + s[2] * p[2]) / det;
      if (u < -1e-9 || u > 1 + 1e-9) continue;
      const q: Vec3 = [s[1] * e1[2] - s[2] * e1[1], s[2] * e1[0] - s[0] * e1[2], s[0] * e1[1] - s[1] * e1[0]];
      const v = (dir[0] * q[0] + dir[1] * q[1] + dir[2] * q[2]) / det;
      if (v < -1e-9 || u + v > 1 + 1e-9) continue;
      const d = (e2[0] * q[0] + e2[1] * q[1] + e2[2] * q[2]) / det;
      if (d > 1e-9 && d < best) best = d;
    }
    return best === Infinity ? null : [origin[0] + dir[0] * best, origin[1] + dir[1] * best, origin[2] + dir[2] * best];
  }
  return null;
}

const norm3 = (v: Vec3): Vec3 => {
  const l = Math.hypot(v[0], v[1], v[2]);
  return [v[0] / l, v[1] / l, v[2] / l];
};

/** Four squares on the plane x = 0 under D2: the plane is reached turned over by two of the four rotations. */
const throughCentreDoc = (): Doc => ({
  format: 'planewright/design@1',
  title: 'Quarter tiles',
  symmetry: 'D2',
  material: { name: 'Birch plywood', thickness: 3 },
  families: [{ id: 'mid', normal: [1, 0, 0], offset: 0 }],
  motifs: [{ id: 'tile', family: 'mid', outline: [[30, 10], [50, 10], [50, 30], [30, 30]] }],
});

describe('anchorAt and pinWorldPosition', () => {
  for (const [name, doc] of [
    ['keel lantern (I)', demoDoc('i-keel-lantern')],
    ['fin table (D4, a family through the centre)', fixtureDoc('d4-fins-deck')],
    ['quarter tiles (D2, mirrored maps)', throughCentreDoc()],
  ] as const) {
    it(`${name}: every piece's pin, on either side, is found again on the same piece after a re-render`, () => {
      const t = resolve(doc).material.thickness;
      const pieces = piecesOf(doc);
      // A re-render: the scene built afresh from the same document.
      const scene = sceneOfDesign(resolve(clone(doc)));
      expect(scene.pieceCount).toBe(pieces.length);
      for (const p of pieces) {
        const point = insidePoint(p);
        for (const side of [1, -1] as PinSide[]) {
          const w = pinWorldPosition(p.frame, { point, side }, t);
          // On the slab face: half a thickness off the plane, over the point.
          expectClose(signedDistance(p.frame, w), (side * t) / 2, 1e-9, `${p.id} side ${side}: distance from the plane`);
          expectVecClose(toFrame(p.frame, w), point, 1e-9, `${p.id}: frame point`);
          // The viewer's slab for this piece has its face there: a ray from outside hits it at w.
          for (const tilt of [0, 0.4]) {
            const dir = norm3([-side * p.frame.normal[0] + tilt * p.frame.u[0], -side * p.frame.normal[1] + tilt * p.frame.u[1], -side * p.frame.normal[2] + tilt * p.frame.u[2]]);
            const origin: Vec3 = [w[0] - 40 * dir[0], w[1] - 40 * dir[1], w[2] - 40 * dir[2]];
            const hit = castAtPiece(scene, p.id, origin, dir);
            expect(hit, `${p.id}: the ray hits the drawn slab`).not.toBeNull();
            expectVecClose(hit!, w, 1e-4, `${p.id} side ${side} tilt ${tilt}: hit point`);
            const back = anchorAt(p, hit!);
            expect(back.piece).toBe(p.id);
            expect(back.side).toBe(side);
            expectVecClose(back.point, point, 1e-4, `${p.id}: anchored point`);
          }
        }
      }
    });
  }

  it('a point inside the slab counts for the side it is nearer to', () => {
    const p = piecesOf(fixtureDoc('o-cube-plates'))[0];
    const mid = toWorld(p.frame, [0, 0]);
    const nudge = (d: number): Vec3 => [mid[0] + d * p.frame.normal[0], mid[1] + d * p.frame.normal[1], mid[2] + d * p.frame.normal[2]];
    expect(anchorAt(p, nudge(0.1)).side).toBe(1);
    expect(anchorAt(p, nudge(-0.1)).side).toBe(-1);
  });
});

describe('orbitAnchors', () => {
  /** Checks the copies of a pin on `own` against the group's rotations (see the file header). */
  function checkOrbit(doc: Doc, own: Piece, pieces: Piece[], side: PinSide): PinAnchor[] {
    const design = resolve(doc);
    const group = getGroup(design.symmetry);
    const t = design.material.thickness;
    const point = insidePoint(own);
    const copies = orbitAnchors(pieces, { piece: own.id, point, side });
    expect(copies[0]).toEqual({ piece: own.id, point, side });
    const ofMotif = pieces.filter((p) => p.motif === own.motif);
    expect(new Set(copies.map((c) => c.piece)).size, 'one copy per piece').toBe(copies.length);
    expect(copies.map((c) => c.piece).sort(), 'a copy on every piece of the motif').toEqual(ofMotif.map((p) => p.id).sort());
    const original = pinWorldPosition(own.frame, { point, side }, t);
    const hInverse = transpose(group.elements[own.elements[0]].matrix);
    for (const c of copies) {
      const p = pieces.find((q) => q.id === c.piece)!;
      const g = group.elements[p.elements[0]].matrix;
      const expected = apply(g, apply(hInverse, original));
      expectVecClose(pinWorldPosition(p.frame, c, t), expected, 1e-6, `copy on ${p.id}`);
      expect(locateInPolygon(c.point, p.polygon, 1e-6), `copy on ${p.id} lies on the piece`).not.toBe('outside');
      // Back to the same motif point: the piece's map carries the motif frame into the piece's.
      const m = p.map;
      const motifPoint: Vec2 = [m[0] * c.point[0] + m[2] * c.point[1], m[1] * c.point[0] + m[3] * c.point[1]];
      const o = own.map;
      expectVecClose(motifPoint, [o[0] * point[0] + o[2] * point[1], o[1] * point[0] + o[3] * point[1]], 1e-9, `motif point from ${p.id}`);
    }
    return copies;
  }

  it('keel lantern (I): a pin on any piece has a copy on all of its motif’s pieces, where the rotations put it', () => {
    const doc = demoDoc('i-keel-lantern');
    const pieces = piecesOf(doc);
    const motifs = [...new Set(pieces.map((p) => p.motif))];
    for (const motif of motifs) {
      const ofMotif = pieces.filter((p) => p.motif === motif);
      // From the first piece and from one further along the orbit, on both sides.
      for (const own of [ofMotif[0], ofMotif[Math.floor(ofMotif.length / 2)]]) for (const side of [1, -1] as PinSide[]) checkOrbit(doc, own, pieces, side);
    }
  });

  it('quarter tiles (D2, plane through the centre): the mirrored copies change side', () => {
    const doc = throughCentreDoc();
    const pieces = piecesOf(doc);
    expect(pieces).toHaveLength(4);
    const dets = pieces.map((p) => Math.sign(p.map[0] * p.map[3] - p.map[1] * p.map[2]));
    expect(dets.filter((d) => d < 0), 'two pieces are reached turned over').toHaveLength(2);
    for (const own of pieces) {
      const copies = checkOrbit(doc, own, pieces, 1);
      const ownMirrored = own.map[0] * own.map[3] - own.map[1] * own.map[2] < 0;
      for (const c of copies) {
        const p = pieces.find((q) => q.id === c.piece)!;
        const mirrored = p.map[0] * p.map[3] - p.map[1] * p.map[2] < 0;
        expect(c.side, `side of the copy on ${p.id}`).toBe(mirrored === ownMirrored ? 1 : -1);
      }
    }
  });

  it('fin table (D4): deck and fins, both sides', () => {
    const doc = fixtureDoc('d4-fins-deck');
    const pieces = piecesOf(doc);
    for (const own of pieces) for (const side of [1, -1] as PinSide[]) checkOrbit(doc, own, pieces, side);
  });

  it('merged pieces (arms that join into a cross on each face of a cube)', () => {
    const doc = fixtureDoc('o-cross-merge');
    const pieces = piecesOf(doc);
    expect(pieces.length).toBe(6);
    for (const own of pieces) checkOrbit(doc, own, pieces, 1);
  });

  it('an unknown piece gives no copies', () => {
    expect(orbitAnchors(piecesOf(fixtureDoc('o-cube-plates')), { piece: 'nope-01', point: [0, 0], side: 1 })).toEqual([]);
  });
});

describe('carryPin', () => {
  const base = () => fixtureDoc('d4-fins-deck');
  const fin = (pieces: Piece[]) => pieces.find((p) => p.motif === 'fin')!;

  it('same design: every pin is carried to the same piece, point and side', () => {
    for (const doc of [base(), demoDoc('i-keel-lantern'), throughCentreDoc()]) {
      const from = piecesOf(doc);
      const to = piecesOf(clone(doc));
      for (const p of from) {
        for (const side of [1, -1] as PinSide[]) {
          const anchor: PinAnchor = { piece: p.id, point: insidePoint(p), side };
          expect(carryPin(from, to, anchor)).toEqual({ carried: true, anchor });
        }
      }
    }
  });

  it('motif removed: motif-gone, naming the motif', () => {
    const doc = base();
    const next = clone(doc);
    next.motifs = next.motifs.filter((m: Doc) => m.id !== 'fin');
    const from = piecesOf(doc);
    const r = carryPin(from, piecesOf(next), { piece: fin(from).id, point: insidePoint(fin(from)), side: 1 });
    expect(r.carried).toBe(false);
    if (r.carried) return;
    expect(r.reason).toBe('motif-gone');
    expect(r.message).toContain('fin');
  });

  it('outline shrunk away from the point: point-off-piece; a point still on it is carried', () => {
    const doc = base();
    const next = clone(doc);
    // The fin was 120 × 40; now 60 × 40: its frame point (50, 0) is off it, (10, 0) still on it.
    next.motifs.find((m: Doc) => m.id === 'fin').outline = [[-30, -20], [30, -20], [30, 20], [-30, 20]];
    const from = piecesOf(doc);
    const to = piecesOf(next);
    const f = fin(from);
    // Frame points of the piece for the motif points (50, 0) and (10, 0).
    const at = (x: number): Vec2 => [f.map[0] * x, f.map[2] * x];
    const off = carryPin(from, to, { piece: f.id, point: at(50), side: -1 });
    expect(off).toMatchObject({ carried: false, reason: 'point-off-piece' });
    const still = carryPin(from, to, { piece: f.id, point: at(10), side: -1 });
    expect(still).toEqual({ carried: true, anchor: { piece: f.id, point: at(10), side: -1 } });
    // Just outside the new edge, within the tolerance, still counts as on it.
    const edge = carryPin(from, to, { piece: f.id, point: at(30.3), side: 1 });
    expect(edge.carried).toBe(true);
  });

  it('family offset changed: still carried, same frame point and side, the world point moved along the normal', () => {
    const doc = base();
    const next = clone(doc);
    next.families.find((f: Doc) => f.id === 'fins').offset = 36;
    const from = piecesOf(doc);
    const to = piecesOf(next);
    for (const p of from.filter((q) => q.motif === 'fin')) {
      const anchor: PinAnchor = { piece: p.id, point: insidePoint(p), side: 1 };
      const r = carryPin(from, to, anchor);
      expect(r).toEqual({ carried: true, anchor });
      const moved = to.find((q) => q.id === p.id)!;
      const a = pinWorldPosition(p.frame, anchor, 3);
      const b = pinWorldPosition(moved.frame, anchor, 3);
      expectVecClose([b[0] - a[0], b[1] - a[1], b[2] - a[2]], [6 * p.frame.normal[0], 6 * p.frame.normal[1], 6 * p.frame.normal[2]], 1e-9, `${p.id} moved`);
    }
  });

  it('family normal changed: plane-gone', () => {
    const doc = base();
    const next = clone(doc);
    const fins = next.families.find((f: Doc) => f.id === 'fins');
    delete fins.axis;
    // Tilted a few degrees from the 2-fold axis the fins stood on.
    const from = piecesOf(doc);
    const n = fin(from).frame.normal;
    fins.normal = [n[0] + 0.1 * n[1], n[1] - 0.1 * n[0], n[2] + 0.05];
    const to = piecesOf(next);
    expect(to.filter((p) => p.motif === 'fin').length).toBeGreaterThan(0);
    const r = carryPin(from, to, { piece: fin(from).id, point: insidePoint(fin(from)), side: 1 });
    expect(r).toMatchObject({ carried: false, reason: 'plane-gone' });
    // The deck did not change: its pins still carry over.
    const deck = from.find((p) => p.motif === 'deck')!;
    expect(carryPin(from, to, { piece: deck.id, point: insidePoint(deck), side: 1 }).carried).toBe(true);
  });

  it('a piece the old revision does not hold: piece-unknown', () => {
    const from = piecesOf(base());
    expect(carryPin(from, from, { piece: 'ghost-01', point: [0, 0], side: 1 })).toMatchObject({ carried: false, reason: 'piece-unknown' });
  });
});
