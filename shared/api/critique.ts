/**
 * Payloads of the critique: pins on a revision's model with their threads, pin-up sessions that
 * walk through submissions, and rubric feedback (critics' scores, the instructor's final mark,
 * released to the participant).
 *
 * A pin is anchored to a piece of one revision: the point in the piece's own 2-D frame, the side
 * of the slab it sits on (+1 along the plane's normal, −1 against it) and the camera the author
 * looked through. It carries over to the next revision while the piece still exists (same motif
 * and orbit position, and the point still on the piece); otherwise it stays on its last revision
 * marked outdated.
 */
import { z } from 'zod';

/** What a pin is about. */
export const PIN_CATEGORIES = ['structure', 'fabrication', 'form', 'brief'] as const;
export const pinCategorySchema = z.enum(PIN_CATEGORIES);
export type PinCategory = z.infer<typeof pinCategorySchema>;

export const PIN_CATEGORY_LABELS: Readonly<Record<PinCategory, string>> = {
  structure: 'Structure',
  fabrication: 'Fabrication',
  form: 'Form',
  brief: 'Brief',
};

export const PIN_STATES = ['open', 'resolved'] as const;
export const pinStateSchema = z.enum(PIN_STATES);
export type PinState = z.infer<typeof pinStateSchema>;

/** `piece`: the one piece clicked; `orbit`: every piece of its motif (faint markers on the copies). */
export const PIN_SCOPES = ['piece', 'orbit'] as const;
export const pinScopeSchema = z.enum(PIN_SCOPES);
export type PinScope = z.infer<typeof pinScopeSchema>;

const finite = z.number().finite();
const vec3 = z.tuple([finite, finite, finite]);

/** Where the author looked from: camera position and target in world mm. */
export const cameraViewSchema = z.object({ position: vec3, target: vec3 });
export type CameraView = z.infer<typeof cameraViewSchema>;

/** A pin's place on a piece (FORMAT.md piece ids such as `rib-03`). */
export const pinAnchorSchema = z.object({
  piece: z.string().trim().min(1, 'Name the piece').max(130),
  /** The point in the piece's own 2-D frame (mm). */
  point: z.tuple([finite, finite]),
  side: z.union([z.literal(1), z.literal(-1)]),
});
export type PinAnchorInput = z.infer<typeof pinAnchorSchema>;

/** Markdown of one comment: shown without raw HTML. */
export const commentBodySchema = z.string().trim().min(1, 'Write a comment').max(10_000, 'Use at most 10000 characters');

/** `POST /api/revisions/:revisionId/pins` (instructor or assigned critic). */
export const createPinBodySchema = z.object({
  anchor: pinAnchorSchema,
  scope: pinScopeSchema.default('piece'),
  category: pinCategorySchema,
  camera: cameraViewSchema,
  body: commentBodySchema,
});
export type CreatePinBody = z.input<typeof createPinBodySchema>;

/** `POST /api/pins/:pinId/comments`: a reply in the thread. */
export const createCommentBodySchema = z.object({ body: commentBodySchema });
export type CreateCommentBody = z.infer<typeof createCommentBodySchema>;

/** `PATCH /api/pins/:pinId`: resolve or reopen; change the category (author or instructor). */
export const updatePinBodySchema = z
  .object({ state: pinStateSchema.optional(), category: pinCategorySchema.optional() })
  .refine((b) => b.state !== undefined || b.category !== undefined, 'Give a state or a category');
export type UpdatePinBody = z.infer<typeof updatePinBodySchema>;

const person = z.object({ id: z.number(), name: z.string() });

export const pinCommentSchema = z.object({
  id: z.number(),
  author: person.extend({ role: z.string() }),
  body: z.string(),
  createdAt: z.string(),
});
export type PinComment = z.infer<typeof pinCommentSchema>;

/**
 * A pin as seen on one revision. `anchor` is where it sits on that revision (it may differ from
 * where it was first placed only by the piece's id staying the same). `number` counts the pins of
 * a submission from 1 in the order they were placed. `outdated`: the pin did not carry over to a
 * later revision (its piece is gone or changed), so it lives on here.
 */
export const pinSchema = z.object({
  id: z.number(),
  number: z.number(),
  submissionId: z.number(),
  /** The revision it was placed on and the one it is shown on now. */
  placedOnRevision: z.object({ id: z.number(), number: z.number() }),
  revisionId: z.number(),
  anchor: pinAnchorSchema,
  scope: pinScopeSchema,
  category: pinCategorySchema,
  state: pinStateSchema,
  camera: cameraViewSchema,
  author: person,
  createdAt: z.string(),
  /** Time of the last comment or state change: what "new" is measured against. */
  updatedAt: z.string(),
  resolvedBy: person.nullable(),
  outdated: z.boolean(),
  /** Why the pin did not carry over (a sentence), when `outdated`; the server always sends it (null otherwise). */
  outdatedReason: z.string().nullable().optional(),
  comments: z.array(pinCommentSchema),
});
export type Pin = z.infer<typeof pinSchema>;

/**
 * `GET /api/revisions/:revisionId/pins`: the pins shown on that revision, oldest first, and how
 * many stayed behind on earlier revisions as outdated. `version` changes whenever anything in
 * the list changes, so a poller compares it before re-rendering.
 */
export const revisionPinsSchema = z.object({
  revisionId: z.number(),
  pins: z.array(pinSchema),
  outdatedEarlier: z.array(z.object({ revisionId: z.number(), revisionNumber: z.number(), count: z.number() })),
  canPin: z.boolean(),
  version: z.string(),
});
export type RevisionPins = z.infer<typeof revisionPinsSchema>;

// ---------------------------------------------------------------------------------------------
// Pin-up sessions

const isoDate = z.iso.datetime({ offset: true, error: 'must be a date and time such as 2026-05-01T17:00:00Z' });

export const PINUP_STATES = ['scheduled', 'running', 'finished'] as const;
export const pinupStateSchema = z.enum(PINUP_STATES);
export type PinupState = z.infer<typeof pinupStateSchema>;

/**
 * `POST /api/briefs/:briefId/pinups` (instructor): a critique session. `submissionIds` is the
 * running order (each a submission of this brief, no repeats; empty means every submission with a
 * revision, in the participants' name order).
 */
export const createPinupBodySchema = z.object({
  title: z.string().trim().min(1, 'Enter a title').max(200, 'Use at most 200 characters'),
  startsAt: isoDate,
  durationMinutes: z.number().int().min(10, 'At least 10 minutes').max(600, 'At most 600 minutes').default(90),
  room: z.string().trim().max(200).default(''),
  submissionIds: z
    .array(z.number().int().positive())
    .max(200)
    .refine((ids) => new Set(ids).size === ids.length, 'A submission appears at most once')
    .default([]),
});
export type CreatePinupBody = z.input<typeof createPinupBodySchema>;

/** `PATCH /api/pinups/:pinupId` (instructor): any field, or the state (start, finish). */
export const updatePinupBodySchema = z.object({
  title: z.string().trim().min(1, 'Enter a title').max(200).optional(),
  startsAt: isoDate.optional(),
  durationMinutes: z.number().int().min(10).max(600).optional(),
  room: z.string().trim().max(200).optional(),
  submissionIds: z
    .array(z.number().int().positive())
    .max(200)
    .refine((ids) => new Set(ids).size === ids.length, 'A submission appears at most once')
    .optional(),
  state: pinupStateSchema.optional(),
});
export type UpdatePinupBody = z.infer<typeof updatePinupBodySchema>;

/** One submission in a pin-up's running order, with its latest revision and pin counts. */
export const pinupEntrySchema = z.object({
  position: z.number(),
  submissionId: z.number(),
  participant: person,
  latestRevision: z.object({ id: z.number(), number: z.number() }).nullable(),
  critics: z.array(person),
  openPins: z.number(),
  resolvedPins: z.number(),
});
export type PinupEntry = z.infer<typeof pinupEntrySchema>;

export const pinupSchema = z.object({
  id: z.number(),
  briefId: z.number(),
  briefTitle: z.string(),
  studioId: z.number(),
  title: z.string(),
  startsAt: z.string(),
  durationMinutes: z.number(),
  room: z.string(),
  state: pinupStateSchema,
  createdBy: person,
  /** Entries the caller may see (a critic: assigned ones; a participant: their own, or all when the gallery is open). */
  entries: z.array(pinupEntrySchema),
});
export type Pinup = z.infer<typeof pinupSchema>;

// ---------------------------------------------------------------------------------------------
// Rubric feedback

/** One criterion scored: the level's score (must be one of the criterion's levels) and a comment. */
export const criterionScoreSchema = z.object({
  criterion: z.string().min(1),
  score: z.number().min(0).max(1000),
  comment: z.string().trim().max(5000).default(''),
});
export type CriterionScore = z.infer<typeof criterionScoreSchema>;

/** `PUT /api/submissions/:submissionId/scores` (assigned critic or instructor): the caller's own scores, replacing them. */
export const putScoresBodySchema = z.object({ scores: z.array(criterionScoreSchema).max(30) });
export type PutScoresBody = z.input<typeof putScoresBodySchema>;

/** `PUT /api/submissions/:submissionId/feedback` (instructor): the final mark (0–100) and summary. */
export const putFeedbackBodySchema = z.object({
  finalMark: z.number().min(0, 'must be 0 or more').max(100, 'must be 100 or less').nullable(),
  summary: z.string().trim().max(10_000).default(''),
});
export type PutFeedbackBody = z.input<typeof putFeedbackBodySchema>;

export const scoreSheetSchema = z.object({
  scorer: person.extend({ role: z.string() }),
  scores: z.array(criterionScoreSchema),
  /** Weighted score out of 100 over the criteria scored (null when none). */
  weighted: z.number().nullable(),
  updatedAt: z.string(),
});
export type ScoreSheet = z.infer<typeof scoreSheetSchema>;

/**
 * `GET /api/submissions/:submissionId/feedback`. Instructors see every sheet; a critic sees their
 * own; the participant sees the instructor's final mark, summary and every sheet only once
 * released (before that: `released: false` and nothing else).
 */
export const feedbackSchema = z.object({
  submissionId: z.number(),
  rubric: z.array(z.object({ id: z.string(), criterion: z.string(), weight: z.number(), levels: z.array(z.object({ score: z.number(), label: z.string(), descriptor: z.string() })) })),
  sheets: z.array(scoreSheetSchema),
  finalMark: z.number().nullable(),
  summary: z.string(),
  released: z.boolean(),
  releasedAt: z.string().nullable(),
  /** What the caller may do here. */
  canScore: z.boolean(),
  canMark: z.boolean(),
});
export type Feedback = z.infer<typeof feedbackSchema>;
