/**
 * Payloads of revisions, submissions and audits: the upload form's fields, a revision with its
 * audit, a submission's revisions and the history of figures across them.
 */
import { z } from 'zod';
import { auditStateSchema } from './briefs.js';

/**
 * Upload limits (bytes) enforced by the server; the client checks them before sending. Larger
 * files are refused with 413 naming the limit; at most `files` files per request.
 */
export const UPLOAD_LIMITS = {
  design: 2 * 1024 * 1024,
  outline: 1024 * 1024,
  photo: 8 * 1024 * 1024,
  files: 10,
} as const;

/** Roles of the files stored with a revision. */
export const FILE_ROLES = ['design', 'outline', 'drawing', 'photo', 'thumbnail'] as const;
export const fileRoleSchema = z.enum(FILE_ROLES);
export type FileRole = z.infer<typeof fileRoleSchema>;

/**
 * One family of the upload form (the `families` field, a JSON array): the plane by `axis` (fold)
 * or `normal`, and its offset in mm.
 */
export const formFamilySchema = z
  .object({
    id: z.string().regex(/^[A-Za-z0-9_][A-Za-z0-9_.-]{0,63}$/, 'must be 1–64 letters, digits, "_", "." or "-"'),
    axis: z.number().int().min(1).optional(),
    normal: z.tuple([z.number(), z.number(), z.number()]).optional(),
    offset: z.number().min(0, 'must be 0 or more').max(10_000),
  })
  .refine((f) => (f.axis === undefined) !== (f.normal === undefined), { message: 'Give exactly one of axis or normal', path: ['axis'] });

/**
 * One motif of the upload form (the `motifs` field, a JSON array): its id, its family, and `file`,
 * the name of the multipart file field carrying its outline — an SVG outline, a DXF outline or a
 * filled-in drawing template (the server tells them apart by content, not by name).
 */
export const formMotifSchema = z.object({
  id: z.string().regex(/^[A-Za-z0-9_][A-Za-z0-9_.-]{0,63}$/, 'must be 1–64 letters, digits, "_", "." or "-"'),
  family: z.string().min(1),
  file: z.string().min(1, 'Name the file field of the outline').max(100),
});

/**
 * `POST /api/briefs/:briefId/revisions` as `multipart/form-data`. Either a file field `design`
 * (a design document, JSON) or the form: text fields `group`, `families` (JSON array of
 * {@link formFamilySchema}), `motifs` (JSON array of {@link formMotifSchema}), optional `title`,
 * plus one file per motif under the field it names. Optional file fields `photos` (JPEG or PNG,
 * stored without metadata, with a 320 px wide thumbnail). A JSON body
 * `{ design: <document> }` is accepted too. Errors: 400/422 naming the field (`body.families[1].offset`,
 * `files.outline-rib`, `design.motifs[0].outline`), 413 naming the limit.
 */
export const revisionFormFieldsSchema = z.object({
  title: z.string().trim().min(1).max(200).optional(),
  group: z.string().trim().min(1, 'Choose a group'),
  families: z.array(formFamilySchema).min(1, 'Add at least one family').max(20),
  motifs: z.array(formMotifSchema).max(10),
});
export type RevisionFormFields = z.infer<typeof revisionFormFieldsSchema>;

/** A finding as the audit report carries it (FORMAT.md §4). */
export const findingSchema = z.object({
  code: z.string(),
  severity: z.enum(['error', 'warning', 'info']),
  message: z.string(),
  pieces: z.array(z.string()),
});
export type FindingDto = z.infer<typeof findingSchema>;

/**
 * The audit report (FORMAT.md §5) plus `groups` and `brief` (what the brief's own checks found).
 * Loose: more keys may be present.
 */
export const auditReportSchema = z.looseObject({
  ok: z.boolean(),
  group: z.string(),
  order: z.number(),
  pieces: z.number(),
  templates: z.number(),
  joints: z.array(z.looseObject({ a: z.string(), b: z.string(), kind: z.string(), angleDeg: z.number(), length: z.number(), orthogonal: z.boolean() })),
  summary: z.object({ joints: z.number(), orthogonal: z.number(), nonOrthogonal: z.number(), byKind: z.record(z.string(), z.number()) }),
  components: z.number(),
  findings: z.array(findingSchema),
  sheets: z.object({ size: z.tuple([z.number(), z.number()]), count: z.number(), utilization: z.number() }).optional(),
});
export type AuditReportDto = z.infer<typeof auditReportSchema>;

/** An audit of one revision; `report` is set when `state` is done, `error` when failed. */
export const auditSchema = z.object({
  id: z.number(),
  state: auditStateSchema,
  attempts: z.number(),
  /** A sentence for the participant when the audit failed, else null. */
  error: z.string().nullable(),
  queuedAt: z.string(),
  startedAt: z.string().nullable(),
  finishedAt: z.string().nullable(),
  report: auditReportSchema.nullable(),
});
export type Audit = z.infer<typeof auditSchema>;

/** Counts of one audit, null until it is done. */
export const auditFiguresSchema = z.object({
  errors: z.number(),
  warnings: z.number(),
  infos: z.number(),
  pieces: z.number(),
  components: z.number(),
  joints: z.number(),
  sheets: z.number().nullable(),
  ok: z.boolean(),
});
export type AuditFigures = z.infer<typeof auditFiguresSchema>;

/** A revision in a list. */
export const revisionSummarySchema = z.object({
  id: z.number(),
  number: z.number(),
  source: z.enum(['file', 'form']),
  title: z.string(),
  late: z.boolean(),
  createdAt: z.string(),
  auditState: auditStateSchema,
  figures: auditFiguresSchema.nullable(),
});
export type RevisionSummary = z.infer<typeof revisionSummarySchema>;

/** A stored file of a revision; `url` downloads it (same permissions as the revision). */
export const revisionFileSchema = z.object({
  id: z.number(),
  role: fileRoleSchema,
  originalName: z.string(),
  mediaType: z.string(),
  size: z.number(),
  sha256: z.string(),
  url: z.string(),
});
export type RevisionFile = z.infer<typeof revisionFileSchema>;

/** `GET /api/revisions/:revisionId`: the revision, its design document, files and audit. */
export const revisionDetailSchema = revisionSummarySchema.extend({
  submissionId: z.number(),
  briefId: z.number(),
  studioId: z.number(),
  participant: z.object({ id: z.number(), name: z.string() }),
  /** The design document as stored (FORMAT.md §1), with the brief's material applied. */
  design: z.unknown(),
  files: z.array(revisionFileSchema),
  audit: auditSchema,
  /** Families a drawing template can be downloaded for (`GET …/templates/:familyId`). */
  templateFamilies: z.array(z.object({ id: z.string(), label: z.string() })),
});
export type RevisionDetail = z.infer<typeof revisionDetailSchema>;

/** `GET /api/submissions/:submissionId`. */
export const submissionSchema = z.object({
  id: z.number(),
  briefId: z.number(),
  studioId: z.number(),
  participant: z.object({ id: z.number(), name: z.string() }),
  createdAt: z.string(),
  revisions: z.array(revisionSummarySchema),
  critics: z.array(z.object({ id: z.number(), name: z.string() })),
});
export type Submission = z.infer<typeof submissionSchema>;

/** One figure that changed from the previous revision; `better` says which way is good. */
export const figureChangeSchema = z.object({
  figure: z.enum(['errors', 'warnings', 'components', 'joints', 'sheets', 'pieces']),
  from: z.number().nullable(),
  to: z.number().nullable(),
  better: z.boolean(),
});

/** `GET /api/submissions/:submissionId/history`: one entry per revision, oldest first. */
export const historyEntrySchema = z.object({
  revisionId: z.number(),
  number: z.number(),
  createdAt: z.string(),
  auditState: auditStateSchema,
  figures: auditFiguresSchema.nullable(),
  /** Finding codes that appeared and disappeared since the previous revision. */
  newCodes: z.array(z.string()),
  fixedCodes: z.array(z.string()),
  changes: z.array(figureChangeSchema),
});
export type HistoryEntry = z.infer<typeof historyEntrySchema>;
