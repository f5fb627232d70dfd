/**
 * The audit (FORMAT.md §3–§5): pieces, joints by kind, connectivity, findings and the sheet
 * estimate of a validated design, as the report every caller (server worker, client, command
 * line) shows.
 *
 * Choices where FORMAT.md is silent (the project's own):
 * - Options override the design's `constraints` (a brief's limits win over the file's).
 * - Joints are listed by the position of their pieces in the piece list (a before b, as the
 *   pieces come from the builder: motif by motif), then along the joint line.
 * - Findings are ordered errors, warnings, infos; within a severity in the order the checks run.
 * - Repeated findings: a design under a group of order 60 repeats every problem up to 60 times.
 *   The joint findings (`non-orthogonal-contact`, `locked-crossing`, `short-joint`) are
 *   therefore grouped into classes of the same problem — the same code, the same pair of motifs,
 *   the same joint kind, and the same angle and length to 0.01 (° and mm) — which is exactly
 *   what a symmetry orbit of one joint looks like. Each class is one finding whose message names
 *   one example pair and the number of places, and whose `pieces` lists every piece involved.
 * - `short-joint` is raised only for joints that are otherwise good (orthogonal, not locked):
 *   the others already carry an error.
 * - `disconnected` lists every group with its size; its `pieces` are the pieces outside the
 *   largest group (the ones to connect). The report's extra key `groups` lists all groups.
 * - With `nesting: false` the sheet estimate (and the findings that need it) is skipped and
 *   `sheets` is absent, for live previews; by default it runs whenever a sheet size is known.
 */
import { getGroup } from './groups.js';
import type { AuditReport, Finding, Joint, JointKind, Piece, ResolvedDesign, Severity, Template } from './model.js';
import { JOINT_KINDS } from './model.js';
import { DEFAULT_ANGLE_TOLERANCE_DEG, type PreparedPiece, contactPad, jointContext, pairJoints, preparePiece } from './joints.js';
import { connectivity } from './connectivity.js';
import { overlappingPairs, pieceBoxes } from './spatial.js';
import { estimateSheets } from './sheets.js';
import { checkFabrication } from './fabrication.js';
import { createPieceBuilder } from './pieces.js';
import { parseDesign, type InputIssue } from './design.js';

/** What a caller may set; each overrides the design's own `constraints`. */
export interface AuditOptions {
  readonly sheet?: readonly [number, number];
  readonly maxSheets?: number;
  readonly angleToleranceDeg?: number;
  readonly minJointLength?: number;
  /** Run the sheet estimate when a sheet size is known (default true). */
  readonly nesting?: boolean;
  /**
   * Run the fabrication checks (slab clashes, splitting mortises, slots near edges, thin
   * features; default true). Off only for a quick live preview: the report then lacks them.
   */
  readonly fabrication?: boolean;
}

/** The limits an audit runs with, after options and constraints are combined. */
export interface EffectiveLimits {
  readonly sheet?: readonly [number, number];
  readonly maxSheets?: number;
  readonly angleToleranceDeg: number;
  readonly minJointLength: number;
  readonly nesting: boolean;
  readonly fabrication: boolean;
}

/** Options first, then the design's constraints, then the defaults of FORMAT.md §3–§4. */
export function effectiveLimits(design: ResolvedDesign, options: AuditOptions = {}): EffectiveLimits {
  const c = design.constraints ?? {};
  const sheet = options.sheet ?? c.sheet;
  const maxSheets = options.maxSheets ?? c.maxSheets;
  return {
    ...(sheet ? { sheet } : {}),
    ...(maxSheets !== undefined ? { maxSheets } : {}),
    angleToleranceDeg: options.angleToleranceDeg ?? c.angleToleranceDeg ?? DEFAULT_ANGLE_TOLERANCE_DEG,
    minJointLength: options.minJointLength ?? c.minJointLength ?? 2 * design.material.thickness,
    nesting: options.nesting ?? true,
    fabrication: options.fabrication ?? true,
  };
}

/** The report with the extra key this engine adds: every connected group of pieces. */
export interface FullAuditReport extends AuditReport {
  /** Connected groups under the joints that can be made, largest first (ids sorted). */
  readonly groups: readonly (readonly string[])[];
}

/**
 * Audits a validated design (FORMAT.md §5). Never throws for a design that {@link parseDesign}
 * accepted; an empty design (no motifs) gives 0 pieces, 0 components, ok = true and, when a sheet
 * size is known, `sheets` with 0 sheets (FORMAT.md §5: present whenever a sheet size is known). Equal to
 * `createAuditor().audit(design, options)`, which is the same computation with a cache.
 */
export function audit(design: ResolvedDesign, options: AuditOptions = {}): FullAuditReport {
  return createAuditor().audit(design, options);
}

/** Result of {@link auditDocument}. */
export type AuditDocumentResult = { ok: true; report: FullAuditReport } | { ok: false; errors: InputIssue[] };

/**
 * Validates a design document (parsed JSON) and audits it. Invalid input gives the issues of
 * {@link parseDesign} (each naming the field path), then those of {@link optionIssues} for the
 * caller's options, and no partial report. Never throws.
 */
export function auditDocument(json: unknown, options: AuditOptions = {}): AuditDocumentResult {
  const parsed = parseDesign(json);
  if (!parsed.ok) return { ok: false, errors: parsed.errors };
  const bad = optionIssues(options);
  if (bad.length) return { ok: false, errors: bad };
  try {
    return { ok: true, report: audit(parsed.design, options) };
  } catch (e) {
    return { ok: false, errors: [{ path: '', message: `the design could not be audited (${e instanceof Error ? e.message : String(e)})` }] };
  }
}

const isNum = (v: unknown): v is number => typeof v === 'number' && Number.isFinite(v);

/**
 * Problems with audit options given by a caller (command line, server), with the same limits as
 * the design's `constraints` (design.ts): `sheet` two sizes above 0 and at most 10,000 mm,
 * `maxSheets` a whole number from 1 to 1,000, `angleToleranceDeg` above 0 and at most 10,
 * `minJointLength` from 0 to 1,000 mm. Each issue names the option (path `options.<name>`).
 * Empty when every option given is usable; absent options are fine.
 */
export function optionIssues(options: AuditOptions): InputIssue[] {
  const issues: InputIssue[] = [];
  const { sheet, maxSheets, angleToleranceDeg: tol, minJointLength: minLen } = options;
  if (sheet !== undefined && !(Array.isArray(sheet) && sheet.length === 2 && sheet.every((v) => isNum(v) && v > 0 && v <= 10000))) {
    issues.push({ path: 'options.sheet', message: 'must be two sizes in millimetres above 0 and at most 10000, such as 600 × 400' });
  }
  if (maxSheets !== undefined && !(Number.isInteger(maxSheets) && maxSheets >= 1 && maxSheets <= 1000)) {
    issues.push({ path: 'options.maxSheets', message: 'must be a whole number of sheets from 1 to 1000' });
  }
  if (tol !== undefined && !(isNum(tol) && tol > 0 && tol <= 10)) {
    issues.push({ path: 'options.angleToleranceDeg', message: 'must be a number of degrees above 0 and at most 10' });
  }
  if (minLen !== undefined && !(isNum(minLen) && minLen >= 0 && minLen <= 1000)) {
    issues.push({ path: 'options.minJointLength', message: 'must be a length in millimetres from 0 to 1000' });
  }
  return issues;
}

/** An auditor that keeps work between calls; see {@link createAuditor}. */
export interface Auditor {
  /** Same result as {@link audit}; reuses pieces and joints of motifs that did not change. */
  audit(design: ResolvedDesign, options?: AuditOptions): FullAuditReport;
  /** Drops everything cached. */
  clear(): void;
}

interface MotifBlock {
  readonly key: string;
  /** Positions of the motif's pieces in the piece list. */
  readonly indices: readonly number[];
}

/**
 * An auditor with a cache for editing sessions: the joints between the pieces of two motifs
 * depend only on those two motifs (outline, family plane, group), the thickness and the angle
 * tolerance, so they are kept per ordered motif pair and recomputed only when one of the two
 * changes. The result is always equal to a fresh {@link audit} (the cache holds exactly what the
 * computation would produce, and the final ordering does not depend on what was cached). The
 * cache keeps the blocks of the last design audited, so it does not grow without bound.
 */
export function createAuditor(): Auditor {
  const builder = createPieceBuilder();
  let preparedByBlock = new Map<string, readonly PreparedPiece[]>();
  let joints = new Map<string, Joint[]>();

  return {
    clear(): void {
      builder.clear();
      preparedByBlock = new Map();
      joints = new Map();
    },
    audit(design: ResolvedDesign, options: AuditOptions = {}): FullAuditReport {
      const limits = effectiveLimits(design, options);
      const group = getGroup(design.symmetry);
      const built = builder.build(design, group);
      const pieces = built.pieces;
      const ctx = jointContext({ thickness: design.material.thickness, angleToleranceDeg: limits.angleToleranceDeg });

      // Blocks of pieces per motif, in piece order; prepared geometry is reused per block.
      const blocks = motifBlocks(design, pieces);
      const nextPrepared = new Map<string, readonly PreparedPiece[]>();
      const preparedAt: PreparedPiece[] = new Array(pieces.length);
      const blockOf = new Int32Array(pieces.length);
      blocks.forEach((b, k) => {
        let prep = preparedByBlock.get(b.key);
        if (!prep || prep.length !== b.indices.length) prep = b.indices.map((i) => preparePiece(pieces[i]));
        nextPrepared.set(b.key, prep);
        b.indices.forEach((i, n) => {
          blockOf[i] = k;
          preparedAt[i] = prep[n];
        });
      });
      preparedByBlock = nextPrepared;

      const pairs = overlappingPairs(pieceBoxes(pieces, contactPad(pieces, ctx.half)));
      // Bucket the pairs by (block of a, block of b) with a counting sort, oriented so a's block
      // comes first; pairs arrive sorted by (i, j), and the counting sort keeps that order.
      const nb = blocks.length;
      const counts = new Int32Array(nb * nb + 1);
      const np = pairs.length >> 1;
      const bucket = new Int32Array(np);
      for (let k = 0; k < np; k++) {
        const bi = blockOf[pairs[2 * k]], bj = blockOf[pairs[2 * k + 1]];
        const key = bi <= bj ? bi * nb + bj : bj * nb + bi;
        bucket[k] = key;
        counts[key + 1]++;
      }
      for (let c = 0; c < nb * nb; c++) counts[c + 1] += counts[c];
      const fill = counts.slice(0, nb * nb);
      const sortedPairs = new Int32Array(pairs.length);
      let swapped = false;
      for (let k = 0; k < np; k++) {
        const i = pairs[2 * k], j = pairs[2 * k + 1];
        const at = 2 * fill[bucket[k]]++;
        if (blockOf[i] > blockOf[j]) {
          sortedPairs[at] = j;
          sortedPairs[at + 1] = i;
          swapped = true;
        } else {
          sortedPairs[at] = i;
          sortedPairs[at + 1] = j;
        }
      }
      const nextJoints = new Map<string, Joint[]>();
      const lists: Joint[][] = [];
      const tag = `${design.material.thickness}\u0001${limits.angleToleranceDeg}`;
      for (let bi = 0; bi < nb; bi++) {
        for (let bj = bi; bj < nb; bj++) {
          const cacheKey = `${blocks[bi].key}\u0002${blocks[bj].key}\u0002${tag}`;
          let list = joints.get(cacheKey);
          if (!list) {
            list = [];
            const lo = counts[bi * nb + bj], hi = counts[bi * nb + bj + 1];
            // Pieces of one motif are contiguous in the builder's list, so the pairs are in piece
            // order already; a reordered list (swapped pairs) is sorted here.
            const order = swapped ? sortedRange(sortedPairs, lo, hi) : null;
            for (let k = lo; k < hi; k++) {
              const q = order ? order[k - lo] : k;
              pairJoints(preparedAt[sortedPairs[2 * q]], preparedAt[sortedPairs[2 * q + 1]], ctx, list);
            }
          }
          nextJoints.set(cacheKey, list);
          lists.push(list);
        }
      }
      joints = nextJoints;
      const all = orderJoints(lists, pieces);
      return assembleReport({
        design,
        groupName: group.name,
        order: group.order,
        pieces,
        templates: built.templates,
        joints: all,
        pieceFindings: built.findings,
        limits,
      });
    },
  };
}

/** Positions lo..hi of flat pairs, ordered by (a, b). */
function sortedRange(ps: Int32Array, lo: number, hi: number): number[] {
  const order = Array.from({ length: hi - lo }, (_, k) => lo + k);
  order.sort((x, y) => ps[2 * x] - ps[2 * y] || ps[2 * x + 1] - ps[2 * y + 1]);
  return order;
}

/**
 * All joints ordered by the positions of a, then b, in the piece list, keeping each pair's own
 * order along the joint line: a numeric sort of (pair key, running number).
 */
function orderJoints(lists: readonly (readonly Joint[])[], pieces: readonly Piece[]): Joint[] {
  const indexOf = new Map<string, number>();
  pieces.forEach((p, i) => indexOf.set(p.id, i));
  let total = 0;
  for (const l of lists) total += l.length;
  const flat: Joint[] = new Array(total);
  const keys = new Float64Array(total);
  const n = pieces.length;
  let k = 0;
  for (const l of lists) {
    for (const j of l) {
      flat[k] = j;
      // (a·n + b)·2²⁴ + k is exact in a double for n up to ~2·10⁴ pieces and 1.6·10⁷ joints.
      keys[k] = (indexOf.get(j.a)! * n + indexOf.get(j.b)!) * 16777216 + k;
      k++;
    }
  }
  keys.sort();
  const out: Joint[] = new Array(total);
  for (let q = 0; q < total; q++) out[q] = flat[keys[q] % 16777216];
  return out;
}

function motifBlocks(design: ResolvedDesign, pieces: readonly Piece[]): MotifBlock[] {
  const byMotif = new Map<string, number[]>();
  pieces.forEach((p, i) => {
    let list = byMotif.get(p.motif);
    if (!list) byMotif.set(p.motif, (list = []));
    list.push(i);
  });
  const families = new Map(design.families.map((f) => [f.id, f]));
  const motifs = new Map(design.motifs.map((m) => [m.id, m]));
  const blocks: MotifBlock[] = [];
  for (const [motif, indices] of byMotif) {
    const m = motifs.get(motif);
    const f = m ? families.get(m.family) : undefined;
    // The pieces of a motif depend only on the group, its family's plane and its outline; the
    // key also carries the piece ids and planes, so a change in the builder cannot go stale.
    const key = JSON.stringify([
      design.symmetry, f?.id, f?.normal, f?.offset, motif, m?.polygon,
      indices.map((i) => [pieces[i].id, pieces[i].plane, pieces[i].polygon.outer.length]),
    ]);
    blocks.push({ key, indices });
  }
  return blocks;
}

/** What {@link assembleReport} needs: the parts of an audit computed elsewhere. */
export interface ReportParts {
  readonly design: ResolvedDesign;
  readonly groupName: string;
  readonly order: number;
  readonly pieces: readonly Piece[];
  readonly templates: readonly Template[];
  readonly joints: readonly Joint[];
  /** Findings of the piece builder (coplanar merges and the like). */
  readonly pieceFindings: readonly Finding[];
  readonly limits: EffectiveLimits;
}

const SEVERITY_RANK: Record<Severity, number> = { error: 0, warning: 1, info: 2 };

/**
 * Puts a report together from pieces and joints: summary, components and groups, the joint
 * findings (grouped by class, see the module notes), the fabrication checks (`checkFabrication`:
 * slab clashes, mortises that split a piece, slots near an edge, thin features), the builder's
 * findings and the sheet estimate. `ok` is true exactly when no finding is an error.
 */
export function assembleReport(parts: ReportParts): FullAuditReport {
  const { design, pieces, joints, limits } = parts;
  const byKind = Object.fromEntries(JOINT_KINDS.map((k) => [k, 0])) as Record<JointKind, number>;
  let orthogonal = 0;
  for (const j of joints) {
    byKind[j.kind]++;
    if (j.orthogonal) orthogonal++;
  }
  const conn = connectivity(pieces.map((p) => p.id), joints);
  const motifOf = new Map(pieces.map((p) => [p.id, p.motif]));
  const findings: Finding[] = [
    ...jointFindings(joints, motifOf, limits, design.material.thickness),
    ...disconnectedFinding(conn.groups),
    ...(limits.fabrication ? checkFabrication(pieces, joints, design.material, { templates: parts.templates }) : []),
    ...parts.pieceFindings,
  ];
  let sheets: AuditReport['sheets'];
  if (limits.nesting && limits.sheet) {
    const result = estimateSheets(pieces, parts.templates, {
      sheet: limits.sheet,
      kerf: design.material.kerf,
      ...(limits.maxSheets !== undefined ? { maxSheets: limits.maxSheets } : {}),
    });
    if (result.estimate) sheets = result.estimate;
    findings.push(...result.findings);
  }
  const ordered = findings
    .map((f, i) => ({ f, i }))
    .sort((x, y) => SEVERITY_RANK[x.f.severity] - SEVERITY_RANK[y.f.severity] || x.i - y.i)
    .map((x) => x.f);
  return {
    ok: !ordered.some((f) => f.severity === 'error'),
    group: parts.groupName,
    order: parts.order,
    pieces: pieces.length,
    templates: parts.templates.length,
    joints,
    summary: { joints: joints.length, orthogonal, nonOrthogonal: joints.length - orthogonal, byKind },
    components: conn.components,
    groups: conn.groups,
    findings: ordered,
    ...(sheets ? { sheets } : {}),
  };
}

const fmt1 = (x: number): string => x.toFixed(1);
const fmtLen = (x: number): string => (Math.abs(x) < 10 ? x.toFixed(2) : x.toFixed(1));

const JOINT_CODES: readonly (readonly [string, Severity])[] = [
  ['non-orthogonal-contact', 'error'],
  ['locked-crossing', 'error'],
  ['short-joint', 'warning'],
];

interface JointClass {
  readonly code: string;
  readonly severity: Severity;
  readonly example: Joint;
  count: number;
  readonly pieces: Set<string>;
  readonly motifs: readonly [string, string];
}

/**
 * The joint findings, one per class of identical problems (same code, motif pair, kind, angle
 * and length to 0.01): `non-orthogonal-contact`, `locked-crossing`, `short-joint`.
 */
export function jointFindings(joints: readonly Joint[], motifOf: ReadonlyMap<string, string>, limits: EffectiveLimits, thickness: number): Finding[] {
  // Classes keyed by numbers (motif pair, code, kind; then angle and length in hundredths),
  // so the pass over every joint builds no strings.
  const motifIndex = new Map<string, number>();
  const motifNames: string[] = [];
  const motifNo = (id: string): number => {
    const m = motifOf.get(id) ?? id;
    let k = motifIndex.get(m);
    if (k === undefined) {
      k = motifNames.length;
      motifIndex.set(m, k);
      motifNames.push(m);
    }
    return k;
  };
  const kindNo = new Map(JOINT_KINDS.map((k, i) => [k, i]));
  const classes = new Map<number, Map<number, JointClass>>();
  const order: JointClass[] = [];
  const add = (code: number, j: Joint): void => {
    let ma = motifNo(j.a), mb = motifNo(j.b);
    if (motifNames[ma] > motifNames[mb]) { const x = ma; ma = mb; mb = x; }
    const outer = ((ma * 65536 + mb) * 4 + code) * 8 + kindNo.get(j.kind)!;
    const inner = Math.round(j.angleDeg * 100) * 2 ** 31 + Math.min(2 ** 31 - 1, Math.round(j.length * 100));
    let byFigure = classes.get(outer);
    if (!byFigure) classes.set(outer, (byFigure = new Map()));
    let c = byFigure.get(inner);
    if (!c) {
      const [codeName, severity] = JOINT_CODES[code];
      c = { code: codeName, severity, example: j, count: 0, pieces: new Set(), motifs: [motifNames[ma], motifNames[mb]] };
      byFigure.set(inner, c);
      order.push(c);
    }
    c.count++;
    c.pieces.add(j.a);
    c.pieces.add(j.b);
  };
  for (const j of joints) {
    if (!j.orthogonal) add(0, j);
    if (j.kind === 'locked-crossing') add(1, j);
    if (j.orthogonal && j.kind !== 'locked-crossing' && j.length < limits.minJointLength) add(2, j);
  }
  const out: Finding[] = [];
  for (const c of order) {
    const j = c.example;
    const where = c.count > 1 ? ` The same happens at ${c.count} joints between ${c.motifs[0]} and ${c.motifs[1]} pieces (all listed).` : '';
    let message: string;
    if (c.code === 'non-orthogonal-contact') {
      message =
        `${j.a} meets ${j.b} at ${fmt1(j.angleDeg)}°, not 90° (tolerance ±${limits.angleToleranceDeg}°), over ${fmtLen(j.length)} mm; ` +
        `a laser cuts square to the sheet, so this joint cannot be made.${where} ` +
        'Change the family normals so the planes are square to each other, or trim the motifs so these pieces no longer touch.';
    } else if (c.code === 'locked-crossing') {
      message =
        `${j.a} and ${j.b} pass through each other over ${fmtLen(j.length)} mm in a way flat parts cannot be assembled: ` +
        `neither can slide in from its edge, and neither fits through a slot in one straight motion.${where} ` +
        'Extend one piece to its edge along the crossing (a cross-lap), or narrow the crossing piece on one side to the slot length.';
    } else {
      message =
        `The ${j.kind} joint between ${j.a} and ${j.b} is ${fmtLen(j.length)} mm long, shorter than ${fmtLen(limits.minJointLength)} mm ` +
        `(${limits.minJointLength === 2 * thickness ? 'twice the material thickness' : 'the brief\'s minimum'}); it may not hold.${where} ` +
        'Lengthen the contact or add another joint between these pieces.';
    }
    out.push({ code: c.code, severity: c.severity, message, pieces: [...c.pieces].sort() });
  }
  return out;
}

function idList(ids: readonly string[], shown = 3): string {
  return ids.slice(0, shown).join(', ') + (ids.length > shown ? ', …' : '');
}

/** Groups described by size class: "1 group of 60 pieces (rib-01, …)", "12 groups of 1 piece (…)". */
function groupSummary(groups: readonly (readonly string[])[]): string {
  const bySize = new Map<number, (readonly string[])[]>();
  for (const g of groups) {
    let list = bySize.get(g.length);
    if (!list) bySize.set(g.length, (list = []));
    list.push(g);
  }
  return [...bySize.entries()]
    .map(([size, gs]) => {
      const unit = size === 1 ? 'piece' : 'pieces';
      if (gs.length === 1) return `1 group of ${size} ${unit} (${idList(gs[0])})`;
      const firsts = idList(gs.map((g) => g[0]));
      return `${gs.length} groups of ${size} ${unit} each (${size === 1 ? firsts : `one each starting ${firsts}`})`;
    })
    .join('; ');
}

/** The `disconnected` finding when there is more than one group; empty otherwise. */
export function disconnectedFinding(groups: readonly (readonly string[])[]): Finding[] {
  if (groups.length <= 1) return [];
  const message =
    `The pieces form ${groups.length} separate groups that no usable joint holds together: ` +
    `${groupSummary(groups)}. ` +
    'Add right-angle joints between the groups (contacts that are square and not locked), or remove the loose pieces.';
  return [{ code: 'disconnected', severity: 'error', message, pieces: groups.slice(1).flat().sort() }];
}
