/**
 * Auditing a design against a brief (pure, synchronous; runs in the worker and at seed time).
 *
 * The brief wins over the document: the catalogue material's thickness and kerf replace the
 * design's (a warning `material-replaced` says which values changed), and the brief's sheet,
 * maximum sheets, angle tolerance and minimum joint length override the design's constraints.
 * Then the brief's own findings are added (FORMAT.md §4 "a brief adds its own"):
 * - `group-not-allowed` (error): the design's group is not one the brief allows.
 * - `family-not-allowed` (error): a family matches neither a required nor an allowed rule (with
 *   both lists empty every family is allowed).
 * - `required-family-missing` (error): no family matches a required rule.
 * - `piece-count-out-of-range` (error): the number of pieces is outside the brief's range.
 * A family matches a rule when the rule's group (if any) is the design's, the offset lies in the
 * rule's range (0.001 mm tolerance), and some rotation of the design's group carries the family's
 * normal onto the rule's direction or its opposite, within the brief's angle tolerance: a family
 * drawn by an explicit normal on a 2-fold plane of I counts as the 2-fold family.
 */
import type { BriefConstraints, FamilyRule } from '../../shared/api/briefs.js';
import type { AuditFigures } from '../../shared/api/revisions.js';
import { audit, type FullAuditReport } from '../../shared/engine/audit.js';
import { parseDesign } from '../../shared/engine/design.js';
import { canonicalNormal, getGroup, type RotationGroup } from '../../shared/engine/groups.js';
import { apply } from '../../shared/engine/mat3.js';
import type { Finding, ResolvedDesign, ResolvedFamily } from '../../shared/engine/model.js';
import { LENGTH_TOL } from '../../shared/engine/tolerance.js';
import { dot, normalize, type Vec3 } from '../../shared/engine/vec.js';

export interface BriefMaterial {
  name: string;
  thickness: number;
  kerf: number;
}

export interface BriefAuditInput {
  /** The design document as stored (parsed JSON). */
  design: unknown;
  constraints: BriefConstraints;
  material: BriefMaterial;
}

export interface BriefAuditReport extends FullAuditReport {
  /** The limits the audit ran with (the brief's). */
  readonly limits: { sheet: readonly [number, number]; maxSheets: number; angleToleranceDeg: number; minJointLength: number | null };
  readonly material: BriefMaterial;
}

export type BriefAuditResult = { ok: true; report: BriefAuditReport; figures: AuditFigures } | { ok: false; error: string };

const SEVERITY_ORDER = { error: 0, warning: 1, info: 2 } as const;

/** The design document with the brief's material in place of its own. */
export function withBriefMaterial(doc: unknown, material: BriefMaterial): { doc: unknown; replaced: string[] } {
  if (typeof doc !== 'object' || doc === null || Array.isArray(doc)) return { doc, replaced: [] };
  const d = doc as Record<string, unknown>;
  const own = (typeof d.material === 'object' && d.material !== null ? d.material : {}) as Record<string, unknown>;
  const replaced: string[] = [];
  if (own.thickness !== material.thickness) replaced.push(`thickness ${String(own.thickness ?? 'missing')} → ${material.thickness} mm`);
  if ((own.kerf ?? 0) !== material.kerf) replaced.push(`kerf ${String(own.kerf ?? 0)} → ${material.kerf} mm`);
  return { doc: { ...d, material: { name: material.name, thickness: material.thickness, kerf: material.kerf } }, replaced };
}

function ruleDirection(rule: FamilyRule, group: RotationGroup): Vec3 | null {
  if (rule.normal) return normalize(rule.normal);
  try {
    return canonicalNormal(group, rule.axis!);
  } catch {
    return null;
  }
}

/** Does `family` of a design under `group` match `rule`? */
export function familyMatches(family: ResolvedFamily, rule: FamilyRule, group: RotationGroup, angleToleranceDeg: number): boolean {
  if (rule.group !== undefined && rule.group !== group.name) return false;
  if (family.offset < rule.offsetMin - LENGTH_TOL || family.offset > rule.offsetMax + LENGTH_TOL) return false;
  const target = ruleDirection(rule, group);
  if (!target) return false;
  const cosTol = Math.cos((angleToleranceDeg * Math.PI) / 180);
  return group.elements.some((g) => Math.abs(dot(apply(g.matrix, family.normal), target)) >= cosTol - 1e-12);
}

function describeRule(rule: FamilyRule): string {
  const dir = rule.axis !== undefined ? `square to a ${rule.axis}-fold axis` : `with normal (${rule.normal!.join(', ')})`;
  const range = rule.offsetMin === rule.offsetMax ? `at ${rule.offsetMin} mm` : `at ${rule.offsetMin}–${rule.offsetMax} mm from the centre`;
  return `planes ${dir}${rule.group ? ` of ${rule.group}` : ''} ${range}`;
}

function describeFamily(f: ResolvedFamily): string {
  const dir = f.axis !== null ? `square to the ${f.axis}-fold axis` : `with normal (${f.normal.map((x) => +x.toFixed(4)).join(', ')})`;
  return `family "${f.id}" (${dir}, offset ${f.offset} mm)`;
}

/** The brief's own findings on a resolved design and its report. */
export function briefFindings(design: ResolvedDesign, report: FullAuditReport, c: BriefConstraints): Finding[] {
  const out: Finding[] = [];
  const piecesOf = (familyId: string) => pieceIdsOfFamily(report, design, familyId);
  if (!c.allowedGroups.includes(design.symmetry)) {
    out.push({
      code: 'group-not-allowed',
      severity: 'error',
      message: `The design uses the group ${design.symmetry}, but this brief allows ${listOr(c.allowedGroups)}.`,
      pieces: [],
    });
  }
  let group: RotationGroup | null = null;
  try {
    group = getGroup(design.symmetry);
  } catch {
    group = null;
  }
  if (group) {
    const rules = [...c.requiredFamilies, ...c.allowedFamilies];
    if (rules.length > 0) {
      for (const f of design.families) {
        if (!rules.some((r) => familyMatches(f, r, group!, c.angleToleranceDeg))) {
          out.push({
            code: 'family-not-allowed',
            severity: 'error',
            message: `The brief does not allow ${describeFamily(f)}. Allowed: ${rules.map(describeRule).join('; ')}.`,
            pieces: piecesOf(f.id),
          });
        }
      }
    }
    for (const r of c.requiredFamilies) {
      if (!design.families.some((f) => familyMatches(f, r, group!, c.angleToleranceDeg))) {
        out.push({
          code: 'required-family-missing',
          severity: 'error',
          message: `The brief requires a family of ${describeRule(r)}; the design has none.`,
          pieces: [],
        });
      }
    }
  }
  if (c.pieceCount && (report.pieces < c.pieceCount.min || report.pieces > c.pieceCount.max)) {
    out.push({
      code: 'piece-count-out-of-range',
      severity: 'error',
      message: `The design has ${report.pieces} pieces; the brief asks for ${c.pieceCount.min}–${c.pieceCount.max}.`,
      pieces: [],
    });
  }
  return out;
}

function pieceIdsOfFamily(report: FullAuditReport, design: ResolvedDesign, familyId: string): string[] {
  const motifs = new Set(design.motifs.filter((m) => m.family === familyId).map((m) => m.id));
  const ids = new Set<string>();
  for (const group of report.groups) for (const id of group) if (motifs.has(id.replace(/-\d+$/, ''))) ids.add(id);
  return [...ids].sort();
}

function listOr(items: readonly string[]): string {
  return items.length <= 1 ? (items[0] ?? 'none') : `${items.slice(0, -1).join(', ')} or ${items[items.length - 1]}`;
}

/** Counts for tables and the history. */
export function figuresOf(report: FullAuditReport): AuditFigures {
  const count = (s: string) => report.findings.filter((f) => f.severity === s).length;
  return {
    errors: count('error'),
    warnings: count('warning'),
    infos: count('info'),
    pieces: report.pieces,
    components: report.components,
    joints: report.summary.joints,
    sheets: report.sheets?.count ?? null,
    ok: report.ok,
  };
}

/**
 * Audits a stored design document against a brief. Never throws: a document the engine refuses
 * (which upload validation should have caught) comes back as `{ ok: false, error }` naming the
 * first problems.
 */
export function auditAgainstBrief(input: BriefAuditInput): BriefAuditResult {
  const { doc, replaced } = withBriefMaterial(input.design, input.material);
  const parsed = parseDesign(doc);
  if (!parsed.ok) {
    const first = parsed.errors.slice(0, 3).map((e) => `${e.path || '(document)'}: ${e.message}`).join('; ');
    return { ok: false, error: `The design could not be read: ${first}.` };
  }
  const c = input.constraints;
  const base = audit(parsed.design, {
    sheet: c.sheet,
    maxSheets: c.maxSheets,
    angleToleranceDeg: c.angleToleranceDeg,
    ...(c.minJointLength !== undefined ? { minJointLength: c.minJointLength } : {}),
  });
  const extra = briefFindings(parsed.design, base, c);
  if (replaced.length > 0) {
    extra.push({
      code: 'material-replaced',
      severity: 'warning',
      message: `The brief's material is ${input.material.name}; the audit used its values instead of the design's (${replaced.join(', ')}).`,
      pieces: [],
    });
  }
  const findings = [...base.findings, ...extra].sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity]);
  const report: BriefAuditReport = {
    ...base,
    ok: !findings.some((f) => f.severity === 'error'),
    findings,
    limits: { sheet: c.sheet, maxSheets: c.maxSheets, angleToleranceDeg: c.angleToleranceDeg, minJointLength: c.minJointLength ?? null },
    material: input.material,
  };
  return { ok: true, report, figures: figuresOf(report) };
}
