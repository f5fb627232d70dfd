/**
 * Payloads of /api/studios/:studioId/briefs and /api/briefs: a brief's text, constraints, dates,
 * late policy and rubric; its changelog; the instructor's submissions table.
 *
 * Routes of the studio workflow (who may call them in brackets):
 * - `GET /api/materials` → Material[] (signed in); `POST /api/materials`, `PATCH|DELETE
 *   /api/materials/:materialId` (admin; DELETE answers 409 while a brief uses the material).
 * - `GET /api/studios/:studioId/briefs` → Brief[] (members; drafts only to instructors);
 *   `POST /api/studios/:studioId/briefs` → 201 Brief (instructor).
 * - `GET /api/briefs/:briefId` → Brief; `PATCH /api/briefs/:briefId`, `POST …/publish`,
 *   `POST …/close` → Brief (instructor); `GET …/changes` → BriefChange[];
 *   `GET …/templates/:familyId` → SVG attachment (drawing template).
 * - `GET /api/briefs/:briefId/submissions?state=&hasErrors=&late=` → SubmissionRow[] (instructors
 *   all; critics those assigned; participants their own, or all once the gallery is open);
 *   `GET …/export` → CSV (instructor); `POST …/reaudit` → { queued } (instructor).
 * - `POST /api/briefs/:briefId/revisions` (multipart or JSON, participant) → 201 RevisionDetail.
 * - `GET /api/submissions/:submissionId` → Submission; `GET …/history` → HistoryEntry[];
 *   `PUT …/critics` → Submission (instructor).
 * - `GET /api/revisions/:revisionId` → RevisionDetail; `GET …/audit` → Audit (for polling);
 *   `POST …/retry` → Audit (owner or instructor, only when failed, else 409);
 *   `GET …/files/:fileId` → the stored bytes; `GET …/templates/:familyId` → SVG attachment.
 * - `GET|PUT /api/me/notifications` → NotificationSettings (signed in).
 */
import { z } from 'zod';
import { sheetSizeSchema } from './materials.js';

/** A rotation group's Schoenflies name as FORMAT.md §1 allows it: `C<n>` (n ≥ 1), `D<n>` (n ≥ 2), `T`, `O`, `I`. */
export const groupNameSchema = z
  .string()
  .trim()
  .regex(/^(C[1-9]\d*|D([2-9]|[1-9]\d+)|T|O|I)$/, 'must be a rotation group: C<n>, D<n> (n ≥ 2), T, O or I');

/**
 * A rule a design's family must match: the plane given by `axis` (a fold of the group's axes) or
 * by an explicit `normal`, with the offset inside `[offsetMin, offsetMax]` (mm). `group` limits
 * the rule to designs of that group (absent: any allowed group). Exactly one of axis and normal.
 * Normals match when they point the same way within the brief's angle tolerance (n and −n match).
 */
export const familyRuleSchema = z
  .object({
    group: groupNameSchema.optional(),
    axis: z.number().int('must be a whole number (the fold of an axis)').min(1, 'must be at least 1').optional(),
    normal: z.tuple([z.number(), z.number(), z.number()]).optional(),
    offsetMin: z.number().min(0, 'must be 0 or more').max(10_000, 'may be at most 10000 mm'),
    offsetMax: z.number().min(0, 'must be 0 or more').max(10_000, 'may be at most 10000 mm'),
  })
  .refine((f) => (f.axis === undefined) !== (f.normal === undefined), { message: 'Give exactly one of axis or normal', path: ['axis'] })
  .refine((f) => f.normal === undefined || Math.hypot(...f.normal) > 1e-9, { message: 'must not be the zero vector', path: ['normal'] })
  .refine((f) => f.offsetMin <= f.offsetMax, { message: 'must not be smaller than offsetMin', path: ['offsetMax'] });
export type FamilyRule = z.infer<typeof familyRuleSchema>;

/**
 * What a design must meet. A family is allowed when it matches a required or an allowed rule;
 * with both lists empty any family is allowed. Every required rule must be matched by some family
 * (else the finding `required-family-missing`). `sheet`, `maxSheets`, `angleToleranceDeg` and
 * `minJointLength` override the design's own constraints; the catalogue material's thickness and
 * kerf override the design's material.
 */
export const briefConstraintsSchema = z.object({
  allowedGroups: z.array(groupNameSchema).min(1, 'Allow at least one group').max(20, 'Allow at most 20 groups'),
  requiredFamilies: z.array(familyRuleSchema).max(20, 'At most 20 rules').default([]),
  allowedFamilies: z.array(familyRuleSchema).max(20, 'At most 20 rules').default([]),
  materialId: z.number().int().positive('Choose a material from the catalogue'),
  sheet: sheetSizeSchema,
  maxSheets: z.number().int('must be a whole number').min(1, 'must be at least 1').max(1000, 'may be at most 1000'),
  angleToleranceDeg: z.number().gt(0, 'must be greater than 0').max(10, 'may be at most 10 degrees').default(0.5),
  /** Absent: twice the material thickness (FORMAT.md §4). */
  minJointLength: z.number().min(0, 'must be 0 or more').max(1000, 'may be at most 1000 mm').optional(),
  pieceCount: z
    .object({ min: z.number().int().min(0, 'must be 0 or more'), max: z.number().int().min(1, 'must be at least 1').max(100_000) })
    .refine((p) => p.min <= p.max, { message: 'must not be smaller than min', path: ['max'] })
    .optional(),
});
export type BriefConstraints = z.infer<typeof briefConstraintsSchema>;
export type BriefConstraintsInput = z.input<typeof briefConstraintsSchema>;

/** What happens to a revision uploaded after the deadline. */
export const LATE_POLICIES = ['accept', 'accept-marked-late', 'refuse'] as const;
export const latePolicySchema = z.enum(LATE_POLICIES);
export type LatePolicy = z.infer<typeof latePolicySchema>;

/** One level of a rubric criterion: a score, a short label and what the work looks like there. */
export const rubricLevelSchema = z.object({
  score: z.number().min(0, 'must be 0 or more').max(1000),
  label: z.string().trim().min(1, 'Enter a label').max(80),
  descriptor: z.string().trim().max(1000).default(''),
});

/** One rubric criterion; weights are relative (they need not add up to 1 or 100). */
export const rubricCriterionSchema = z.object({
  id: z.string().trim().regex(/^[A-Za-z0-9_-]{1,40}$/, 'Use 1–40 letters, digits, "_" or "-"'),
  criterion: z.string().trim().min(1, 'Name the criterion').max(200),
  weight: z.number().gt(0, 'must be greater than 0').max(1000),
  levels: z.array(rubricLevelSchema).min(1, 'Give at least one level').max(10),
});
export type RubricCriterion = z.infer<typeof rubricCriterionSchema>;

const isoDate = z.iso.datetime({ offset: true, error: 'must be a date and time such as 2026-05-01T17:00:00Z' });

/** The critique (pin-up) window, both ends ISO date-times; null when not planned yet. */
export const critiqueWindowSchema = z
  .object({ opensAt: isoDate, closesAt: isoDate })
  .refine((w) => Date.parse(w.opensAt) <= Date.parse(w.closesAt), { message: 'must not be before opensAt', path: ['closesAt'] });

const rubricSchema = z
  .array(rubricCriterionSchema)
  .max(30, 'At most 30 criteria')
  .refine((r) => new Set(r.map((c) => c.id)).size === r.length, 'Criterion ids must be unique');

/** `POST /api/studios/:studioId/briefs` (instructor): a new brief starts as a draft. */
export const createBriefBodySchema = z.object({
  title: z.string().trim().min(1, 'Enter a title').max(200, 'Use at most 200 characters'),
  /** Markdown; shown without raw HTML. */
  body: z.string().max(50_000, 'Use at most 50000 characters').default(''),
  constraints: briefConstraintsSchema,
  deadline: isoDate,
  latePolicy: latePolicySchema.default('accept-marked-late'),
  critiqueWindow: critiqueWindowSchema.nullable().default(null),
  rubric: rubricSchema.default([]),
});
export type CreateBriefBody = z.input<typeof createBriefBodySchema>;

/**
 * `PATCH /api/briefs/:briefId` (instructor): any subset, plus `galleryOpen` (participants of the
 * studio then see each other's submissions). Changing a published brief's constraints writes a
 * changelog entry and re-audits every submission's latest revision.
 */
export const updateBriefBodySchema = z
  .object({
    title: createBriefBodySchema.shape.title,
    body: z.string().max(50_000, 'Use at most 50000 characters'),
    constraints: briefConstraintsSchema,
    deadline: isoDate,
    latePolicy: latePolicySchema,
    critiqueWindow: critiqueWindowSchema.nullable(),
    rubric: rubricSchema,
    galleryOpen: z.boolean(),
  })
  .partial();
export type UpdateBriefBody = z.input<typeof updateBriefBodySchema>;

export const BRIEF_STATES = ['draft', 'published', 'closed'] as const;
export const briefStateSchema = z.enum(BRIEF_STATES);
export type BriefState = z.infer<typeof briefStateSchema>;

export const AUDIT_STATES = ['queued', 'running', 'done', 'failed'] as const;
/** queued → running → done | failed. */
export const auditStateSchema = z.enum(AUDIT_STATES);
export type AuditState = z.infer<typeof auditStateSchema>;

/** The catalogue material a brief names, as shown with it. */
export const briefMaterialSchema = z.object({ id: z.number(), name: z.string(), thickness: z.number(), kerf: z.number() });

/** A brief as the API answers it. */
export const briefSchema = z.object({
  id: z.number(),
  studioId: z.number(),
  title: z.string(),
  body: z.string(),
  constraints: briefConstraintsSchema,
  material: briefMaterialSchema.nullable(),
  deadline: z.string(),
  latePolicy: latePolicySchema,
  critiqueWindow: z.object({ opensAt: z.string(), closesAt: z.string() }).nullable(),
  rubric: z.array(rubricCriterionSchema),
  state: briefStateSchema,
  galleryOpen: z.boolean(),
  createdAt: z.string(),
  updatedAt: z.string(),
  publishedAt: z.string().nullable(),
  closedAt: z.string().nullable(),
  /** The caller's own submission to this brief (participants), else null. */
  mySubmission: z
    .object({ id: z.number(), latestRevision: z.number().nullable(), auditState: auditStateSchema.nullable() })
    .nullable(),
  /** Families a drawing template can be downloaded for (`GET …/templates/:familyId`). */
  templateFamilies: z.array(z.object({ id: z.string(), label: z.string() })),
});
export type Brief = z.infer<typeof briefSchema>;

/** One changelog entry of a brief: who changed what, when, in plain sentences. */
export const briefChangeSchema = z.object({
  id: z.number(),
  briefId: z.number(),
  at: z.string(),
  by: z.object({ id: z.number().nullable(), name: z.string() }),
  /** One line, e.g. "Changed the constraints: maximum sheets 4 → 3." */
  summary: z.string(),
  /** One sentence per changed field. */
  details: z.array(z.string()),
  /** How many latest revisions were queued for a fresh audit because of this change. */
  reaudited: z.number(),
});
export type BriefChange = z.infer<typeof briefChangeSchema>;

/** `GET /api/briefs/:briefId/submissions` filters (query strings). */
export const submissionsQuerySchema = z.object({
  state: auditStateSchema.optional(),
  hasErrors: z.enum(['true', 'false']).optional(),
  late: z.enum(['true', 'false']).optional(),
});
export type SubmissionsQuery = z.infer<typeof submissionsQuerySchema>;

/** Critique state of a submission; issue 5 fills in the states after `not-started`. */
export const critiqueStateSchema = z.enum(['not-started', 'in-progress', 'released']);

/** One row of the submissions table of a brief. */
export const submissionRowSchema = z.object({
  submissionId: z.number(),
  participant: z.object({ id: z.number(), name: z.string(), email: z.string() }),
  revisions: z.number(),
  latestRevision: z.object({ id: z.number(), number: z.number(), createdAt: z.string() }).nullable(),
  auditState: auditStateSchema.nullable(),
  errors: z.number().nullable(),
  warnings: z.number().nullable(),
  pieces: z.number().nullable(),
  components: z.number().nullable(),
  sheets: z.number().nullable(),
  /** The latest revision came in after the deadline (accept-marked-late). */
  late: z.boolean(),
  critiqueState: critiqueStateSchema,
  critics: z.array(z.object({ id: z.number(), name: z.string() })),
});
export type SubmissionRow = z.infer<typeof submissionRowSchema>;

/** `PUT /api/submissions/:submissionId/critics` (instructor): the critics assigned, replacing the list. */
export const assignCriticsBodySchema = z.object({ userIds: z.array(z.number().int().positive()).max(50) });

/** Answer of `POST /api/briefs/:briefId/reaudit`. */
export const reauditResultSchema = z.object({ queued: z.number() });
