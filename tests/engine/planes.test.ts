// Perpendicular planes of the families (FORMAT.md §6 `planes`). Expected values are derived on
// paper below from the canonical axes of FORMAT.md §1; the orbit sizes come from International
// Tables for Crystallography Vol. A ch. 10.1 (REFERENCES.md "Rotation groups"), the grouping of the
// fifteen 2-fold axes of I into five orthogonal triples from Coxeter, Regular Polytopes pp. 49–50
// (the five cubes inscribed in a dodecahedron).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { AxisFoldError, getGroup } from '../../shared/engine/groups.js';
import { PlanesError, analyseNormals, analysePlanes } from '../../shared/engine/planes.js';
import type { Vec3 } from '../../shared/engine/vec.js';

const run = (g: string, folds: number[]) => analysePlanes(getGroup(g), folds);

describe('analysePlanes', () => {
  it('O 4-fold: the six cube planes, each square to the four around it: 12 pairs, 1 component', () => {
    // ±x is perpendicular to ±y and ±z: 6 planes × 4 partners / 2 = 12; every plane links to every other through a third.
    expect(run('O', [4])).toEqual({
      group: 'O',
      order: 24,
      families: [{ axis: 4, planes: 6 }],
      perpendicularPairs: 12,
      pairsByFamily: { '4-4': 12 },
      components: 1,
    });
  });

  it('I 2-fold: 30 planes in five groups of six (one group per cube of the five-cube compound): 60 pairs, 5 components', () => {
    // The 2-fold axes of I perpendicular to z are the 2-fold axes with z-component 0; in the canonical
    // orientation those are x and y only (the other twelve are the cyclic permutations of
    // (±φ, ±1/φ, ±1)/2, no zero entry). So each 2-fold line is square to exactly two others, the lines
    // fall into 5 orthogonal triples (Coxeter pp. 49–50: the five cubes' face normals), and each plane
    // is square to 4 planes: 30 × 4 / 2 = 60 pairs; planes of different triples never link: 5 components.
    expect(run('I', [2])).toEqual({
      group: 'I',
      order: 60,
      families: [{ axis: 2, planes: 30 }],
      perpendicularPairs: 60,
      pairsByFamily: { '2-2': 60 },
      components: 5,
    });
  });

  it('I 5-, 3- and 2-fold together: 2-5 120, 2-3 120, 2-2 60, and no other family pair square', () => {
    // A 5-fold line's stabiliser is D5: its five half-turn axes lie square to it, so each of the 12
    // 5-fold planes meets 5 lines × 2 planes = 10 2-fold planes: 120 (the FORMAT.md §6 example).
    // A 3-fold line's stabiliser is D3: 3 square 2-fold lines, 20 × 6 = 120.
    // 5–5 (63.43°), 3–3 (41.81°, 70.53°) and 5–3 line angles are never 90°: the dot products of the
    // canonical axes (0, ±1, ±φ)… with (±1, ±1, ±1) and (0, ±1/φ, ±φ)… are ±1 ± φ, ±φ², ±1/φ ± φ², never 0.
    const r = run('I', [5, 3, 2]);
    expect(r.families).toEqual([
      { axis: 5, planes: 12 },
      { axis: 3, planes: 20 },
      { axis: 2, planes: 30 },
    ]);
    expect(r.pairsByFamily).toEqual({ '2-2': 60, '2-3': 120, '2-5': 120, '3-3': 0, '3-5': 0, '5-5': 0 });
    expect(r.perpendicularPairs).toBe(300);
    // The 5 triples are now tied together through the 5- and 3-fold planes.
    expect(r.components).toBe(1);
  });

  it('O 4-, 3- and 2-fold: 4-4 12, 2-4 24, 2-3 48, 2-2 12, none with 3-3 or 3-4', () => {
    // z ⟂ (1, ±1, 0): 6 planes × 4 = 24. (1,1,1) ⟂ (1,−1,0), (0,1,−1), (1,0,−1): 8 × 6 = 48.
    // (1,1,0) ⟂ (1,−1,0) only among the 2-fold lines: 12 × 2 / 2 = 12. (1,1,1)·(±1,±1,±1) is odd; (1,1,1)·z = 1.
    const r = run('O', [4, 3, 2]);
    expect(r.pairsByFamily).toEqual({ '2-2': 12, '2-3': 48, '2-4': 24, '3-3': 0, '3-4': 0, '4-4': 12 });
    expect(r.perpendicularPairs).toBe(96);
    expect(r.components).toBe(1);
    expect(r.families.map((f) => f.planes)).toEqual([6, 8, 12]);
  });

  it('T 3-fold: four planes, none square to another, so four components; 2-fold links nothing to them', () => {
    // (1,1,1)·(1,−1,−1) = −1 and so on; (1,1,1)·z = 1. The three 2-fold axes are mutually square: 6 × 4 / 2 = 12.
    const r = run('T', [3, 2]);
    expect(r.families).toEqual([
      { axis: 3, planes: 4 },
      { axis: 2, planes: 6 },
    ]);
    expect(r.pairsByFamily).toEqual({ '2-2': 12, '2-3': 0, '3-3': 0 });
    expect(r.components).toBe(4 + 1);
  });

  it.each([
    [4, 4],
    [6, 0],
    [8, 8],
    [5, 0],
  ])('D%i 2-fold: the planes at 360°/n steps are square to each other exactly when 4 divides n (%i pairs)', (n, pairs) => {
    // The orbit of x is the n directions at 2πk/n; two are square when 2π(k−j)/n = ±π/2, possible only when 4 | n,
    // and then each plane has two partners: n × 2 / 2 = n.
    const r = run(`D${n}`, [n, 2]);
    expect(r.families).toEqual([
      { axis: n, planes: 2 },
      { axis: 2, planes: n },
    ]);
    expect(r.pairsByFamily[`2-2`]).toBe(pairs);
    // Both main-axis planes are square to every 2-fold plane.
    expect(r.pairsByFamily[`2-${n}`]).toBe(2 * n);
    expect(r.pairsByFamily[`${n}-${n}`]).toBe(0);
    expect(r.components).toBe(1);
  });

  it('sorts keys by fold as numbers (D12: "2-12", not "12-2")', () => {
    expect(Object.keys(run('D12', [12, 2]).pairsByFamily)).toEqual(['2-2', '2-12', '12-12']);
  });

  it('C5: one plane, nothing square, one component', () => {
    expect(run('C5', [5])).toMatchObject({ perpendicularPairs: 0, components: 1, families: [{ axis: 5, planes: 1 }] });
  });

  it('when a fold is missing from the group, or repeated, or none is given, it says so', () => {
    expect(() => run('I', [4])).toThrow(AxisFoldError);
    expect(() => run('I', [2, 2])).toThrow(PlanesError);
    expect(() => run('I', [2, 2])).toThrow(/twice/);
    expect(() => run('I', [])).toThrow(PlanesError);
  });
});

describe('analyseNormals', () => {
  it('a family of O on (1, 2, 0) meets the cube planes and itself at right angles', () => {
    // The O-orbit of (1,2,0) is all 24 signed permutations. Each cube plane is square to the 8 with a 0
    // in its place: 6 × 8 = 48. (1,2,0) is square to (2,−1,0) and (−2,1,0) only: 24 × 2 / 2 = 24.
    const r = analyseNormals(getGroup('O'), [
      { id: 'cap', normal: [0, 0, 1] },
      { id: 'fin', normal: [1, 2, 0] },
    ]);
    expect(r.families).toEqual([
      { id: 'cap', planes: 6 },
      { id: 'fin', planes: 24 },
    ]);
    expect(r.pairsByFamily).toEqual({ 'cap-cap': 12, 'cap-fin': 48, 'fin-fin': 24 });
    expect(r.perpendicularPairs).toBe(84);
    expect(r.components).toBe(1);
    expect(r.meetsSquare).toEqual({ cap: ['cap', 'fin'], fin: ['cap', 'fin'] });
  });

  it('a generic direction of I meets nothing at right angles', () => {
    const r = analyseNormals(getGroup('I'), [
      { id: 'free', normal: [0.2134, 0.5378, 0.8163] },
      { id: 'ribs', normal: [0, 0, 1] },
    ]);
    expect(r.pairsByFamily['free-ribs']).toBe(0);
    expect(r.meetsSquare.free).toEqual([]);
  });

  it('rejects a zero or non-finite normal and a repeated id', () => {
    const g = getGroup('O');
    expect(() => analyseNormals(g, [{ id: 'a', normal: [0, 0, 0] }])).toThrow(PlanesError);
    expect(() => analyseNormals(g, [{ id: 'a', normal: [0, Number.NaN, 1] }])).toThrow(PlanesError);
    expect(() => analyseNormals(g, [{ id: 'a', normal: [0, 0, 1] }, { id: 'a', normal: [1, 0, 0] }])).toThrow(/twice/);
  });

  it('counts add up: pairs by family sum to the total, and every family is square to the same families both ways', () => {
    const dir = fc
      .tuple(fc.integer({ min: -3, max: 3 }), fc.integer({ min: -3, max: 3 }), fc.integer({ min: -3, max: 3 }))
      .filter(([x, y, z]) => x !== 0 || y !== 0 || z !== 0) as fc.Arbitrary<Vec3>;
    fc.assert(
      fc.property(fc.constantFrom('T', 'O', 'I', 'D4', 'D6', 'C3'), fc.array(dir, { minLength: 1, maxLength: 3 }), (g, normals) => {
        const fams = normals.map((normal, k) => ({ id: `f${k}`, normal }));
        const r = analyseNormals(getGroup(g), fams);
        expect(Object.values(r.pairsByFamily).reduce((a, b) => a + b, 0)).toBe(r.perpendicularPairs);
        for (const a of fams) for (const b of r.meetsSquare[a.id]) expect(r.meetsSquare[b]).toContain(a.id);
        const planes = r.families.reduce((a, f) => a + f.planes, 0);
        expect(r.components).toBeGreaterThanOrEqual(1);
        expect(r.components).toBeLessThanOrEqual(planes);
        for (const f of r.families) expect(getGroup(g).order % f.planes).toBe(0);
      }),
      { numRuns: 100 },
    );
  });
});
