/**
 * From motifs to pieces and templates (FORMAT.md §2).
 *
 * Every group element maps a motif onto a plane of its family's orbit. Images on the same plane
 * are one sheet region: exact duplicates collapse, the rest are unioned, and each connected
 * region is one piece. Congruent pieces (across all motifs, reflections allowed since a flat part
 * can be turned over) share one template.
 *
 * Choices where FORMAT.md is silent:
 * - Images of *different* motifs on the same plane are never unioned: each motif's regions are its
 *   own pieces (a participant names and edits motifs separately; their overlap is the audit's
 *   business, not a silent merge).
 * - The union on a plane is computed once, on the representative plane, and carried to every other
 *   plane of the orbit by the map of the first element that reaches it: the images on plane k are
 *   exactly h·(images on plane 0) for that element h, so every plane's regions are congruent copies.
 * - Region order on every plane is the order on the representative plane, sorted by the smallest
 *   contributing element there (so `<motif>-01` contains the motif itself). Pieces are numbered
 *   plane by plane in orbit order, then by region.
 * - Images that coincide within the 0.05 mm flattening tolerance count as exact duplicates (a circle
 *   centred on a 5-fold axis, flattened to chords, turned by 72°, is still the same cut); the
 *   first image's outline is kept.
 * - Images that touch along an edge also merge into one region; that, too, is reported as
 *   `coplanar-merge` (one info finding per motif, naming its merged pieces).
 * - If the polygon library fails on a degenerate union, the distinct images are kept as separate
 *   pieces and a `coplanar-merge` warning says so (never an exception).
 */
import { type RotationGroup, getGroup } from './groups.js';
import type { Finding, Piece, Polygon2, ResolvedDesign, ResolvedFamily, ResolvedMotif, Template } from './model.js';
import { type Mat2, type PlaneOrbit, planeOrbit } from './orbits.js';
import {
  type CongruenceKey,
  bounds,
  congruenceKey,
  congruent,
  locateInPolygon,
  nearlySamePolygon,
  samePolygon,
  transformPolygon,
  unionPolygons,
} from './polygons.js';
import { CHORD_TOL } from './svg-path.js';
import { LENGTH_TOL } from './tolerance.js';

/** What {@link buildPieces} returns. */
export interface PieceBuild {
  readonly pieces: Piece[];
  readonly templates: Template[];
  readonly findings: Finding[];
}

/** A piece before templates are assigned. */
type BasePiece = Omit<Piece, 'template'>;

/** Everything about one motif that does not depend on the other motifs (cached by the builder). */
interface MotifBuild {
  readonly key: string;
  readonly pieces: readonly BasePiece[];
  /** Regions on the representative plane, in region order. */
  readonly regions: readonly Polygon2[];
  /** Per region: true when it holds one distinct image of the motif (nothing was merged). */
  readonly plain: readonly boolean[];
  /** Region index of each piece, parallel to `pieces`. */
  readonly regionOf: readonly number[];
  readonly findings: readonly Finding[];
  /** Congruence data per region, filled lazily. */
  readonly keys: (CongruenceKey | undefined)[];
}

const MAP_TOL = 1e-6;

function pieceId(motif: string, k: number, width: number): string {
  return `${motif}-${String(k).padStart(width, '0')}`;
}

function mapsEqual(a: Mat2, b: Mat2): boolean {
  return Math.abs(a[0] - b[0]) <= MAP_TOL && Math.abs(a[1] - b[1]) <= MAP_TOL && Math.abs(a[2] - b[2]) <= MAP_TOL && Math.abs(a[3] - b[3]) <= MAP_TOL;
}

/** Transpose-times: Mᵀ·N for orthogonal M (its inverse). */
function invTimes(m: Mat2, n: Mat2): Mat2 {
  return [m[0] * n[0] + m[2] * n[2], m[0] * n[1] + m[2] * n[3], m[1] * n[0] + m[3] * n[2], m[1] * n[1] + m[3] * n[3]];
}

function motifKey(group: RotationGroup, family: ResolvedFamily, motif: ResolvedMotif): string {
  const p = motif.polygon;
  const ring = (r: readonly (readonly [number, number])[]) => r.map((q) => `${q[0]},${q[1]}`).join(';');
  // The family id is in the key because every piece carries it (a renamed family must not
  // leave pieces naming the old one).
  return `${group.name}|${family.id}|${family.normal.join(',')}|${family.offset}|${motif.id}|${ring(p.outer)}|${p.holes.map(ring).join('|')}`;
}

function buildMotif(orbit: PlaneOrbit, family: ResolvedFamily, motif: ResolvedMotif, key: string): MotifBuild {
  const findings: Finding[] = [];
  // Distinct images on the representative plane.
  const stab = orbit.images.filter((im) => im.plane === 0);
  const distinct: { polygon: Polygon2; elements: number[]; maps: Mat2[] }[] = [];
  for (const im of stab) {
    const poly = transformPolygon(motif.polygon, im.map);
    const same = distinct.find((d) => samePolygon(d.polygon, poly)) ?? distinct.find((d) => nearlySamePolygon(d.polygon, poly, CHORD_TOL));
    if (same) {
      same.elements.push(im.element);
      same.maps.push(im.map);
    } else distinct.push({ polygon: poly, elements: [im.element], maps: [im.map] });
  }
  // Regions on the representative plane and which distinct images each holds.
  let regions: Polygon2[];
  let members: number[][];
  let unionFailed = false;
  if (distinct.length === 1 || boxesApart(distinct.map((d) => d.polygon))) {
    // Images whose boxes are apart neither overlap nor touch: each is its own region, exactly
    // what the union would return, without its cost.
    regions = distinct.map((d) => d.polygon);
    members = distinct.map((_, j) => [j]);
  } else {
    const u = unionPolygons(distinct.map((d) => d.polygon));
    if (u.ok && u.regions.length > 0) {
      regions = u.regions;
      members = regions.map(() => []);
      distinct.forEach((d, j) => {
        const p = d.polygon.outer[0];
        let r = regions.findIndex((reg) => locateInPolygon(p, reg) === 'inside');
        if (r < 0) r = regions.findIndex((reg) => locateInPolygon(p, reg) !== 'outside');
        members[r < 0 ? 0 : r].push(j);
      });
    } else {
      unionFailed = true;
      regions = distinct.map((d) => d.polygon);
      members = distinct.map((_, j) => [j]);
    }
  }
  // Region order: by the smallest contributing element.
  const firstElement = (r: number) => Math.min(...members[r].flatMap((j) => distinct[j].elements));
  const order = regions.map((_, r) => r).filter((r) => members[r].length > 0);
  order.sort((a, b) => firstElement(a) - firstElement(b));
  regions = order.map((r) => regions[r]);
  members = order.map((r) => members[r]);
  const regionOfDistinct = new Array<number>(distinct.length).fill(0);
  members.forEach((js, r) => js.forEach((j) => (regionOfDistinct[j] = r)));
  const plain = members.map((js) => js.length === 1);

  // Carry the regions to every plane of the orbit.
  const byPlane: number[][] = orbit.planes.map(() => []);
  for (const im of orbit.images) byPlane[im.plane].push(im.element);
  const total = orbit.planes.length * regions.length;
  const width = Math.max(2, String(total).length);
  const pieces: BasePiece[] = [];
  const regionOf: number[] = [];
  for (const plane of orbit.planes) {
    const elems = byPlane[plane.index];
    const h = orbit.images[elems[0]];
    const regionElements: number[][] = regions.map(() => []);
    for (const e of elems) {
      const rel = invTimes(h.map, orbit.images[e].map);
      let j = distinct.findIndex((d) => d.maps.some((m) => mapsEqual(m, rel)));
      if (j < 0) j = 0;
      regionElements[regionOfDistinct[j]].push(e);
    }
    regions.forEach((region, r) => {
      const elements = regionElements[r].sort((a, b) => a - b);
      const first = elements.length ? elements[0] : elems[0];
      pieces.push({
        id: pieceId(motif.id, pieces.length + 1, width),
        motif: motif.id,
        family: family.id,
        plane: plane.index,
        frame: plane.frame,
        polygon: plane.index === 0 ? region : transformPolygon(region, h.map),
        elements,
        map: orbit.images[first].map,
      });
      regionOf.push(r);
    });
  }

  const merged = pieces.filter((_, k) => !plain[regionOf[k]]).map((p) => p.id);
  if (unionFailed) {
    findings.push({
      code: 'coplanar-merge',
      severity: 'warning',
      message:
        `Images of motif "${motif.id}" overlap on their planes but could not be unioned (the outline is numerically degenerate there); ` +
        `they are kept as separate pieces. Move the motif slightly off its plane's symmetry axes or simplify it.`,
      pieces: pieces.map((p) => p.id),
    });
  } else if (merged.length) {
    const copies = Math.max(...members.map((js) => js.length));
    findings.push({
      code: 'coplanar-merge',
      severity: 'info',
      message:
        `Copies of motif "${motif.id}" overlap or touch on the same plane and were unioned into one piece each ` +
        `(up to ${copies} copies per piece): ${listIds(merged)}. Check the merged outline is what you meant to cut.`,
      pieces: merged,
    });
  }
  return { key, pieces, regions, plain, regionOf, findings, keys: regions.map(() => undefined) };
}

/** True when the bounding boxes of the polygons are pairwise more than 2 × LENGTH_TOL apart. */
function boxesApart(polys: readonly Polygon2[]): boolean {
  const boxes = polys.map((p) => bounds([p.outer]));
  const gap = 2 * LENGTH_TOL;
  for (let i = 0; i < boxes.length; i++) {
    const a = boxes[i];
    for (let j = i + 1; j < boxes.length; j++) {
      const b = boxes[j];
      if (a[2] + gap >= b[0] && b[2] + gap >= a[0] && a[3] + gap >= b[1] && b[3] + gap >= a[1]) return false;
    }
  }
  return true;
}

function listIds(ids: readonly string[], max = 12): string {
  return ids.length <= max ? ids.join(', ') : `${ids.slice(0, max).join(', ')} and ${ids.length - max} more`;
}

/**
 * An incremental piece builder: `build(design)` gives the same answer as {@link buildPieces}, but
 * reuses the pieces of every motif whose inputs (group, family id, normal and offset, motif id and
 * polygon) are unchanged since the previous call, so editing one motif rebuilds only its pieces.
 * Templates are regrouped on every call (cheap: one congruence test per distinct region shape).
 * `stats` counts motifs built and reused by the last call.
 */
export interface PieceBuilder {
  build(design: ResolvedDesign, group?: RotationGroup): PieceBuild;
  /** Forgets every cached motif. */
  clear(): void;
  readonly stats: { built: number; reused: number };
}

/** Creates a {@link PieceBuilder} with an empty cache. */
export function createPieceBuilder(): PieceBuilder {
  let cache = new Map<string, MotifBuild>();
  const stats = { built: 0, reused: 0 };
  return {
    stats,
    clear() {
      cache = new Map();
    },
    build(design, group = getGroup(design.symmetry)) {
      stats.built = 0;
      stats.reused = 0;
      const next = new Map<string, MotifBuild>();
      const families = new Map(design.families.map((f) => [f.id, f]));
      const builds: MotifBuild[] = [];
      for (const motif of design.motifs) {
        const family = families.get(motif.family);
        if (!family) continue;
        const key = motifKey(group, family, motif);
        let b = cache.get(motif.id);
        if (b && b.key === key) stats.reused++;
        else {
          b = buildMotif(orbitOf(group, family), family, motif, key);
          stats.built++;
        }
        next.set(motif.id, b);
        builds.push(b);
      }
      cache = next;
      return assemble(builds);
    },
  };
}

// Orbits depend only on (group, normal, offset); a small memo shared by all builders.
const orbitMemo = new Map<string, PlaneOrbit>();
const ORBIT_MEMO_SIZE = 64;

function orbitOf(group: RotationGroup, family: ResolvedFamily): PlaneOrbit {
  const key = `${group.name}|${family.normal.join(',')}|${family.offset}`;
  let orbit = orbitMemo.get(key);
  if (!orbit) {
    orbit = planeOrbit(group, family.normal, family.offset);
    if (orbitMemo.size >= ORBIT_MEMO_SIZE) orbitMemo.delete(orbitMemo.keys().next().value!);
    orbitMemo.set(key, orbit);
  }
  return orbit;
}

function assemble(builds: readonly MotifBuild[]): PieceBuild {
  // Template shapes: the motif itself for plain regions, the region for merged ones.
  interface Shape {
    key: CongruenceKey;
    template: number;
  }
  const shapes: Shape[] = [];
  const templatePieces: string[][] = [];
  const findings: Finding[] = [];
  const pieces: Piece[] = [];
  const templateOf = (poly: () => CongruenceKey): number => {
    const k = poly();
    for (const s of shapes) if (congruent(s.key, k)) return s.template;
    const t = templatePieces.length;
    templatePieces.push([]);
    shapes.push({ key: k, template: t });
    return t;
  };
  for (const b of builds) {
    const regionTemplate = b.regions.map((region, r) => templateOf(() => (b.keys[r] ??= congruenceKey(region))));
    b.pieces.forEach((p, k) => {
      const template = regionTemplate[b.regionOf[k]];
      templatePieces[template].push(p.id);
      pieces.push({ ...p, template });
    });
    findings.push(...b.findings);
  }
  const templates: Template[] = templatePieces.map((ids, index) => ({ index, representative: ids[0], pieces: ids, count: ids.length }));
  return { pieces, templates, findings };
}

/**
 * Pieces, templates and `coplanar-merge` findings of a resolved design (FORMAT.md §2); see the
 * module comment for the choices made. A motif whose family is missing (impossible after
 * {@link parseDesign}) is skipped. Pieces are listed motif by motif in design order; template
 * indices follow first appearance. Pure and deterministic.
 */
export function buildPieces(design: ResolvedDesign, group: RotationGroup = getGroup(design.symmetry)): PieceBuild {
  return createPieceBuilder().build(design, group);
}
