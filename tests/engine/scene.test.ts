// Render data for the viewer. The slab checks are worked out by hand (a prism of a rectangle has
// volume width × height × thickness and 6 vertices per outline point with flat-shaded walls).
// The placement check is independent of the scene code: every instance's matrix, applied to the
// template outline, must land on the piece's own world outline (toWorld of its polygon).
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseDesign, parseDesignText } from '../../shared/engine/design.js';
import { signedDistance, toWorld } from '../../shared/engine/frames.js';
import type { Polygon2, ResolvedDesign } from '../../shared/engine/model.js';
import { buildPieces } from '../../shared/engine/pieces.js';
import { audit } from '../../shared/engine/audit.js';
import { buildScene, congruenceMap, meshVolume, piecesSphere, rankGroups, type Scene, slabGeometry, transformPoint, usableGroups, usableJoints } from '../../shared/engine/scene.js';
import type { Vec3 } from '../../shared/engine/vec.js';
import { expectClose, expectSamePointSet, expectVecClose } from './support.js';

function load(url: URL): ResolvedDesign {
  const r = parseDesignText(readFileSync(url, 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}
const fixture = (name: string) => load(new URL(`../fixtures/designs/${name}.json`, import.meta.url));
const demo = (name: string) => load(new URL(`../../server/seed/designs/${name}.json`, import.meta.url));

const rect: Polygon2 = {
  outer: [
    [0, 0],
    [10, 0],
    [10, 20],
    [0, 20],
  ],
  holes: [],
};

describe('slabGeometry', () => {
  it('when the outline is a 10 × 20 rectangle: 24 vertices, 12 triangles, volume 10·20·t', () => {
    const g = slabGeometry(rect, 3);
    expect(g.positions.length / 3).toBe(24);
    expect(g.indices.length / 3).toBe(12);
    expectClose(meshVolume(g), 10 * 20 * 3, 1e-9, 'volume');
    const zs = new Set<number>();
    for (let i = 2; i < g.positions.length; i += 3) zs.add(g.positions[i]);
    expect([...zs].sort((a, b) => a - b)).toEqual([-1.5, 1.5]);
  });

  it('when the rectangle is given clockwise the volume stays positive', () => {
    const g = slabGeometry({ outer: [...rect.outer].reverse(), holes: [] }, 2);
    expectClose(meshVolume(g), 400, 1e-9, 'volume');
  });

  it('when the outline has a hole the hole is cut (volume loses the hole)', () => {
    const holed: Polygon2 = {
      outer: [
        [-10, -10],
        [10, -10],
        [10, 10],
        [-10, 10],
      ],
      holes: [
        [
          [-2, -3],
          [2, -3],
          [2, 3],
          [-2, 3],
        ],
      ],
    };
    const g = slabGeometry(holed, 4);
    expect(g.positions.length / 3).toBe(6 * 8);
    expectClose(meshVolume(g), (400 - 24) * 4, 1e-6, 'volume');
  });

  it('when the thickness is not positive the geometry is empty', () => {
    expect(slabGeometry(rect, 0).positions.length).toBe(0);
    expect(meshVolume(slabGeometry(rect, -1))).toBe(0);
  });
});

describe('congruenceMap', () => {
  it('when the target is an irregular quadrilateral mirrored and moved, the map mirrors and carries every vertex onto it', () => {
    const quad: Polygon2 = { outer: [[0, 0], [10, 0], [12, 20], [0, 15]], holes: [] };
    const mirror = ([x, y]: readonly [number, number]) => [-y + 5, -x + 7] as const;
    const to: Polygon2 = { outer: quad.outer.map(mirror).reverse(), holes: [] };
    const r = congruenceMap(quad, to);
    expect(r).not.toBeNull();
    expect(r!.m[0] * r!.m[3] - r!.m[1] * r!.m[2]).toBeLessThan(0);
    for (const q of quad.outer) {
      const [ex, ey] = mirror(q);
      expectClose(r!.m[0] * q[0] + r!.m[1] * q[1] + r!.tx, ex, 1e-9, 'x');
      expectClose(r!.m[2] * q[0] + r!.m[3] * q[1] + r!.ty, ey, 1e-9, 'y');
    }
  });

  it('when the shapes are not congruent there is no map', () => {
    const to: Polygon2 = { outer: rect.outer.map(([x, y]) => [x * 1.01, y] as const), holes: [] };
    expect(congruenceMap(rect, to)).toBeNull();
  });
});

/** Every instance's outline and holes, mapped to the world, land on its piece's world outline. */
function expectPlacementsExact(d: ResolvedDesign): void {
  const build = buildPieces(d);
  const scene = buildScene(d, build);
  const byId = new Map(build.pieces.map((p) => [p.id, p]));
  const seen = new Set<string>();
  for (const mesh of scene.meshes) {
    for (const inst of mesh.instances) {
      const piece = byId.get(inst.piece)!;
      seen.add(inst.piece);
      expect(inst.template).toBe(piece.template);
      const world = (ring: readonly (readonly [number, number])[]): Vec3[] => ring.map((q) => toWorld(piece.frame, q));
      const mapped = (ring: readonly (readonly [number, number])[], z = 0): Vec3[] => ring.map((q) => transformPoint(inst.matrix, [q[0], q[1], z]));
      expectSamePointSet(mapped(mesh.outline.outer), world(piece.polygon.outer), 1e-6, `${inst.piece} outline`);
      expectSamePointSet(mapped(mesh.outline.holes.flat()), world(piece.polygon.holes.flat()), 1e-6, `${inst.piece} holes`);
      // The caps lie half a thickness either side of the piece's plane.
      for (const p of mapped(mesh.outline.outer, d.material.thickness / 2)) expectClose(Math.abs(signedDistance(piece.frame, p)), d.material.thickness / 2, 1e-9, 'cap distance');
      // A proper rigid motion: det of the upper 3 × 3 is +1.
      const m = inst.matrix;
      const det = m[0] * (m[5] * m[10] - m[9] * m[6]) - m[4] * (m[1] * m[10] - m[9] * m[2]) + m[8] * (m[1] * m[6] - m[5] * m[2]);
      expectClose(det, 1, 1e-9, 'det');
    }
  }
  expect(seen.size).toBe(build.pieces.length);
  expect(scene.pieceCount).toBe(build.pieces.length);
  // Draw calls: one mesh per template unless a fallback was needed (none expected here).
  expect(scene.meshes.length).toBe(build.templates.length);
}

describe('buildScene', () => {
  it('when the design is the D4 fin table (deck at offset 0 is reached mirrored): every instance lands on its piece', () => {
    expectPlacementsExact(fixture('d4-fins-deck'));
  });

  it('when the design is the octahedral cube plates: every instance lands on its piece', () => {
    expectPlacementsExact(fixture('o-cube-plates'));
  });

  it('when the design is the octahedral cross merge (merged regions): every instance lands on its piece', () => {
    expectPlacementsExact(fixture('o-cross-merge'));
  });

  it('when the design is the demo facet lamp (holes): every instance lands on its piece', () => {
    expectPlacementsExact(demo('o-facet-lamp'));
  });

  it('when the design is the demo keel lantern (icosahedral): every instance lands on its piece', () => {
    expectPlacementsExact(demo('i-keel-lantern'));
  });

  it('when joints come from the audit they become world segments with kind and orthogonal flag', () => {
    const d = fixture('d4-fins-deck');
    const report = audit(d, { nesting: false, fabrication: false });
    const scene = buildScene(d, buildPieces(d), usableJoints(JSON.parse(JSON.stringify(report.joints)) as unknown[]));
    expect(scene.joints.length).toBe(report.joints.length);
    expect(scene.joints.length).toBeGreaterThan(0);
    scene.joints.forEach((j, i) => {
      expect(j.kind).toBe(report.joints[i].kind);
      expect(j.orthogonal).toBe(report.joints[i].orthogonal);
      expect(j.from).toEqual(report.joints[i].from);
      expect(j.locked).toBe(report.joints[i].kind === 'locked-crossing');
    });
  });

  it('when exploded, each piece moves along the unit direction from the centre to its centroid; the centred deck stays put', () => {
    const d = fixture('d4-fins-deck');
    const scene = buildScene(d, buildPieces(d));
    const all = scene.meshes.flatMap((m) => m.instances);
    const deck = all.filter((i) => i.motif === 'deck');
    expect(deck.length).toBeGreaterThan(0);
    for (const i of deck) expect(i.explode).toEqual([0, 0, 0]);
    for (const i of all.filter((x) => x.motif === 'fin')) {
      expectClose(Math.hypot(...i.explode), 1, 1e-12, 'unit');
      const c = i.centroid.map((v, k) => v - scene.center[k]);
      expectClose(i.explode[0] * c[0] + i.explode[1] * c[1] + i.explode[2] * c[2], Math.hypot(c[0], c[1], c[2]), 1e-9, 'along the centroid');
    }
  });

  it('when a stored joint lacks its end points it is left out', () => {
    expect(usableJoints([{ a: 'x', b: 'y', kind: 'corner', orthogonal: true }, null, { a: 'x', b: 'y', kind: 'corner', orthogonal: true, from: [0, 0, 0], to: [1, 0, 0] }])).toHaveLength(1);
  });

  it('when the design has no motifs the scene is empty with radius 0', () => {
    const r = parseDesign({ format: 'planewright/design@1', title: 't', symmetry: 'O', material: { name: 'm', thickness: 3 }, families: [{ id: 'f', axis: 4, offset: 10 }], motifs: [] });
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    const scene = buildScene(r.design, buildPieces(r.design));
    expect(scene.meshes).toHaveLength(0);
    expect(scene.radius).toBe(0);
  });
});

/** A column-major translation matrix. */
const translation = (x: number, y: number, z: number) => Float64Array.from([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, x, y, z, 1]);

describe('piecesSphere', () => {
  // Two 10 × 20 rectangles (thickness 2), one at the origin, one moved 100 mm along x: worked
  // out by hand, the box of the pair runs from (0, 0, 0) to (110, 20, 0).
  const handScene: Scene = {
    meshes: [
      {
        template: 0,
        outline: rect,
        geometry: slabGeometry(rect, 2),
        instances: [
          { piece: 'a-01', motif: 'a', template: 0, family: 0, matrix: translation(0, 0, 0), centroid: [5, 10, 0], explode: [0, 0, 0] },
          { piece: 'a-02', motif: 'a', template: 0, family: 0, matrix: translation(100, 0, 0), centroid: [105, 10, 0], explode: [0, 0, 0] },
        ],
      },
    ],
    joints: [],
    pieceCount: 2,
    templateCount: 1,
    families: ['f'],
    center: [0, 0, 0],
    radius: 0,
    thickness: 2,
  };

  it('when one piece is asked for: the centre of its rectangle, half its diagonal plus the thickness', () => {
    const s = piecesSphere(handScene, ['a-02'])!;
    expect(s.count).toBe(1);
    expectVecClose(s.center, [105, 10, 0], 1e-12, 'centre');
    expectClose(s.radius, Math.hypot(5, 10) + 2, 1e-12, 'radius');
  });

  it('when both pieces are asked for (one twice, plus an unknown id): the box of the pair, counted once each', () => {
    const s = piecesSphere(handScene, ['a-01', 'a-02', 'a-02', 'nope-01'])!;
    expect(s.count).toBe(2);
    expectVecClose(s.center, [55, 10, 0], 1e-12, 'centre');
    expectClose(s.radius, Math.hypot(55, 10) + 2, 1e-12, 'radius');
  });

  it('when no asked id is in the scene, or none is asked: null', () => {
    expect(piecesSphere(handScene, ['nope-01'])).toBeNull();
    expect(piecesSphere(handScene, [])).toBeNull();
  });

  it('when every piece of the demo keel lantern is asked for: the scene\'s own bounding sphere', () => {
    const d = demo('i-keel-lantern');
    const scene = buildScene(d, buildPieces(d));
    const ids = scene.meshes.flatMap((m) => m.instances.map((i) => i.piece));
    const s = piecesSphere(scene, ids)!;
    expect(s.count).toBe(scene.pieceCount);
    expectVecClose(s.center, scene.center, 1e-6, 'centre');
    expectClose(s.radius, scene.radius, 1e-6, 'radius');
    // A subset's sphere holds every outline vertex of its pieces, caps included (the pieces'
    // own world outlines from buildPieces, not the scene's matrices).
    const build = buildPieces(d);
    const chosen = build.pieces.slice(0, 3);
    const some = piecesSphere(scene, chosen.map((p) => p.id))!;
    expect(some.count).toBe(3);
    for (const p of chosen) {
      for (const q of p.polygon.outer) {
        const w = toWorld(p.frame, q);
        const dist = Math.hypot(w[0] - some.center[0], w[1] - some.center[1], w[2] - some.center[2]);
        expect(dist + d.material.thickness / 2).toBeLessThanOrEqual(some.radius + 1e-9);
      }
    }
  });
});

describe('usableGroups and rankGroups', () => {
  it('when a stored report\'s groups are malformed, only lists of ids are kept', () => {
    expect(usableGroups(undefined)).toEqual([]);
    expect(usableGroups('x')).toEqual([]);
    expect(usableGroups([['a', 3, 'b'], 'c', [], [null], ['d']])).toEqual([['a', 'b'], ['d']]);
  });

  it('when groups differ in size the largest gets rank 0 and ties keep their order', () => {
    const r = rankGroups([['x'], ['a', 'b', 'c'], ['y', 'z'], ['w', 'v']]);
    expect(r.sizes).toEqual([3, 2, 2, 1]);
    expect(r.groupOf.get('b')).toBe(0);
    expect(r.groupOf.get('y')).toBe(1);
    expect(r.groupOf.get('w')).toBe(2);
    expect(r.groupOf.get('x')).toBe(3);
  });

  it('when a piece is named twice it stays in the first-ranked group and is counted once', () => {
    const r = rankGroups([['a', 'a', 'b'], ['b']]);
    expect(r.sizes).toEqual([2]);
    expect(r.groupOf.get('b')).toBe(0);
    expect(rankGroups([]).sizes).toEqual([]);
  });

  it('when the demo half keels are audited: 20 groups of 4, every piece ranked once', () => {
    const d = demo('i-half-keels');
    const report = audit(d, { nesting: false, fabrication: false });
    const r = rankGroups(usableGroups(JSON.parse(JSON.stringify(report.groups)) as unknown));
    expect(r.sizes).toEqual(Array.from({ length: report.components }, () => 4));
    expect(r.groupOf.size).toBe(report.pieces);
  });
});
