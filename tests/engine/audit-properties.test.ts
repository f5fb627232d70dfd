// Invariants of the audit under the symmetry it is built on (fast-check, bounded runs):
// - drawing each family's motifs on another plane of its orbit (the motif carried there by the
//   orbit's image map, the family given by that plane's explicit normal) is the same design, so
//   no figure of the audit changes — this covers rotating the whole design by one group element
//   (the same element for every family) and moving one motif alone;
// - symmetric input gives symmetric output: every piece of a motif has the same joints.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { type FullAuditReport, audit } from '../../shared/engine/audit.js';
import { parseDesign } from '../../shared/engine/design.js';
import { getGroup } from '../../shared/engine/groups.js';
import type { ResolvedDesign } from '../../shared/engine/model.js';
import { planeOrbit } from '../../shared/engine/orbits.js';

const GROUPS = ['T', 'O', 'I', 'D4', 'D5'] as const;
const FOLDS: Record<(typeof GROUPS)[number], number[]> = { T: [3, 2], O: [4, 3, 2], I: [5, 3, 2], D4: [4, 2], D5: [5, 2] };

interface Spec {
  group: (typeof GROUPS)[number];
  families: { fold: number; offset: number }[];
  motifs: { family: number; x: number; y: number; w: number; h: number; skew: number }[];
}

const specArb: fc.Arbitrary<Spec> = fc.constantFrom(...GROUPS).chain((group) =>
  fc.record({
    group: fc.constant(group),
    families: fc.array(fc.record({ fold: fc.constantFrom(...FOLDS[group]), offset: fc.integer({ min: 30, max: 80 }) }), { minLength: 1, maxLength: 2 }),
    motifs: fc.array(
      fc.record({
        family: fc.integer({ min: 0, max: 1 }),
        x: fc.double({ min: -70, max: 50, noNaN: true }),
        y: fc.double({ min: -70, max: 50, noNaN: true }),
        w: fc.double({ min: 8, max: 60, noNaN: true }),
        h: fc.double({ min: 8, max: 60, noNaN: true }),
        skew: fc.double({ min: -10, max: 10, noNaN: true }),
      }),
      { minLength: 1, maxLength: 3 },
    ),
  }),
);

function parallelogram(x: number, y: number, w: number, h: number, skew: number): number[][] {
  return [[x, y], [x + w, y], [x + w + skew, y + h], [x + skew, y + h]];
}

function toDesign(spec: Spec): ResolvedDesign {
  const families = spec.families.map((f, i) => ({ id: `f${i}`, axis: f.fold, offset: f.offset }));
  const r = parseDesign({
    format: 'planewright/design@1',
    title: 'property',
    symmetry: spec.group,
    material: { name: 'Birch plywood', thickness: 3, kerf: 0.15 },
    families,
    motifs: spec.motifs.map((m, i) => ({
      id: `m${i}`,
      family: families[m.family % families.length].id,
      // A parallelogram (convex, never self-intersecting). The odd shifts keep shrinking away from
      // exactly degenerate placements (a corner on the symmetry axis, an edge through it), where
      // rounding noise alone decides whether copies touch at one point.
      outline: parallelogram(m.x + 0.1234567, m.y + 0.2345671, m.w + 0.0345678, m.h + 0.0456781, m.skew + 0.0567812),
    })),
  });
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.design;
}

/**
 * The same design with family f drawn on the plane that group element elements[f] sends its
 * representative plane to: explicit normal of that plane, every motif carried by the image map.
 */
function redraw(design: ResolvedDesign, elements: readonly number[]): ResolvedDesign {
  const group = getGroup(design.symmetry);
  const maps = new Map<string, readonly number[]>();
  const families = design.families.map((f, i) => {
    const orbit = planeOrbit(group, f.normal, f.offset);
    const image = orbit.images[elements[i % elements.length] % group.order];
    maps.set(f.id, image.map);
    return { ...f, axis: null, normal: orbit.planes[image.plane].frame.normal };
  });
  const motifs = design.motifs.map((m) => {
    const t = maps.get(m.family)!;
    const mapRing = (ring: readonly (readonly [number, number])[]) => ring.map(([x, y]) => [t[0] * x + t[1] * y, t[2] * x + t[3] * y] as const);
    return { ...m, polygon: { outer: mapRing(m.polygon.outer), holes: m.polygon.holes.map(mapRing) } };
  });
  return { ...design, families, motifs };
}

type Row = [string, number, number];

/** The report's figures that do not depend on how pieces are numbered. */
function figures(r: FullAuditReport) {
  return {
    pieces: r.pieces,
    templates: r.templates,
    summary: r.summary,
    components: r.components,
    groupSizes: r.groups.map((g) => g.length),
    // Per code and severity, how many distinct pieces are flagged: independent of how the
    // checks group repeated findings.
    findings: Object.fromEntries(
      [...new Set(r.findings.map((f) => `${f.code}/${f.severity}`))].sort().map((k) => [
        k,
        new Set(r.findings.filter((f) => `${f.code}/${f.severity}` === k).flatMap((f) => f.pieces)).size,
      ]),
    ),
  };
}

/** Joints as (kind, length, angle), sorted, for a comparison with a tolerance. */
function jointRows(r: FullAuditReport, motif?: string): Row[] {
  const motifOf = (id: string) => id.slice(0, id.lastIndexOf('-'));
  return r.joints
    .filter((j) => motif === undefined || motifOf(j.a) === motif || motifOf(j.b) === motif)
    .map((j): Row => [j.kind, j.length, j.angleDeg])
    .sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : a[1] - b[1] || a[2] - b[2]));
}

function expectSameRows(a: Row[], b: Row[]): void {
  expect(a.map((x) => x[0])).toEqual(b.map((x) => x[0]));
  for (let i = 0; i < a.length; i++) {
    expect(Math.abs(a[i][1] - b[i][1])).toBeLessThan(1e-6);
    expect(Math.abs(a[i][2] - b[i][2])).toBeLessThan(1e-6);
  }
}

describe('audit under the group', () => {
  it('rotating the whole design by a group element changes no audit figure', () => {
    fc.assert(
      fc.property(specArb, fc.nat(59), (spec, g) => {
        const d = toDesign(spec);
        const a = audit(d, { nesting: false });
        const b = audit(redraw(d, [g]), { nesting: false });
        expect(figures(b)).toEqual(figures(a));
        expectSameRows(jointRows(b), jointRows(a));
      }),
      { numRuns: 25 },
    );
  });

  it("a motif's joints are the same whichever plane of its orbit it is drawn on", () => {
    fc.assert(
      fc.property(specArb, fc.array(fc.nat(59), { minLength: 2, maxLength: 2 }), (spec, elements) => {
        const d = toDesign(spec);
        const a = audit(d, { nesting: false });
        const b = audit(redraw(d, elements), { nesting: false });
        expect(figures(b)).toEqual(figures(a));
        for (const m of d.motifs) expectSameRows(jointRows(b, m.id), jointRows(a, m.id));
      }),
      { numRuns: 25 },
    );
  });

  it('symmetric input gives symmetric output: every piece of a motif has the same joints', () => {
    fc.assert(
      fc.property(specArb, (spec) => {
        const r = audit(toDesign(spec), { nesting: false });
        const motifOf = (id: string) => id.slice(0, id.lastIndexOf('-'));
        const byPiece = new Map<string, Row[]>();
        for (const j of r.joints) {
          for (const [self, other] of [[j.a, j.b], [j.b, j.a]]) {
            const role = j.kind === 'mortise-and-tenon' ? (j.tenon === self ? '/tenon' : '/mortise') : '';
            const list = byPiece.get(self) ?? [];
            list.push([`${j.kind}${role}>${motifOf(other)}`, j.length, j.angleDeg]);
            byPiece.set(self, list);
          }
        }
        const pieceIds = r.groups.flat();
        const rowsOf = (id: string): Row[] =>
          (byPiece.get(id) ?? []).sort((a, b) => (a[0] < b[0] ? -1 : a[0] > b[0] ? 1 : a[1] - b[1] || a[2] - b[2]));
        const first = new Map<string, string>();
        for (const id of pieceIds) {
          const m = motifOf(id);
          const ref = first.get(m);
          if (ref === undefined) first.set(m, id);
          else expectSameRows(rowsOf(id), rowsOf(ref));
        }
      }),
      { numRuns: 25 },
    );
  });
});
