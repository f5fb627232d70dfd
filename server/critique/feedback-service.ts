/**
 * Rubric feedback: each scorer's sheet (an assigned critic, an instructor or an admin: their own
 * sheet, replaced whole), the instructor's final mark and summary, and the release.
 *
 * Who sees what: instructors and admins every sheet and the mark; a critic their own sheet (and
 * the mark and summary once released); the participant nothing but `released: false` until the
 * release, then the final mark, the summary and every sheet with the scorers' names.
 *
 * `weighted` = Σ weight · score / (the criterion's highest level score) ÷ Σ weight × 100, over the
 * criteria scored (a criterion whose levels all score 0 is left out); rounded to 0.01.
 */
import type { Feedback as FeedbackDto, PutFeedbackBody, PutScoresBody, ScoreSheet as ScoreSheetDto, CriterionScore } from '../../shared/api/critique.js';
import { putFeedbackBodySchema, putScoresBodySchema } from '../../shared/api/critique.js';
import { rubricCriterionSchema, type RubricCriterion } from '../../shared/api/briefs.js';
import type { AppContext } from '../context.js';
import { fromSqlDate, rawDb, sqlDate, whenNoTransaction } from '../db/raw.js';
import { ConflictError, NotFoundError, UnprocessableError } from '../http/errors.js';
import { can, type Actor, type Resource } from '../policy/policy.js';
import { critiqueMails } from './mails.js';
import { peopleOf } from './people.js';

/** The weighted score out of 100 of `scores` against `rubric`, or null when no criterion counts. */
export function weightedScore(rubric: readonly RubricCriterion[], scores: readonly Pick<CriterionScore, 'criterion' | 'score'>[]): number | null {
  let num = 0;
  let den = 0;
  for (const s of scores) {
    const c = rubric.find((r) => r.id === s.criterion);
    if (!c) continue;
    const max = Math.max(...c.levels.map((l) => l.score));
    if (!(max > 0)) continue;
    num += (c.weight * s.score) / max;
    den += c.weight;
  }
  if (den === 0) return null;
  return Math.round(((num / den) * 100) * 100) / 100;
}

interface SubmissionFacts {
  id: number;
  brief_id: number;
  studio_id: number;
  participant_id: number;
  rubric: string;
}

export function feedbackService(ctx: AppContext) {
  const db = rawDb(ctx.dataSource);
  const mails = critiqueMails(ctx);

  function facts(submissionId: number): SubmissionFacts & { rubricList: RubricCriterion[] } {
    const s = db
      .prepare('SELECT s.id, s.brief_id, b.studio_id, s.participant_id, b.rubric FROM submissions s JOIN briefs b ON b.id = s.brief_id WHERE s.id = ?')
      .get(submissionId) as SubmissionFacts | undefined;
    if (!s) throw new NotFoundError('There is no submission with this id.');
    return { ...s, rubricList: rubricCriterionSchema.array().parse(JSON.parse(s.rubric)) };
  }

  function sheetsOf(submissionId: number, studioId: number, rubric: RubricCriterion[]): (ScoreSheetDto & { scorerId: number })[] {
    const people = peopleOf(db, studioId);
    const rows = db.prepare('SELECT scorer_id, scores, updated_at FROM score_sheets WHERE submission_id = ?').all(submissionId) as { scorer_id: number; scores: string; updated_at: string }[];
    return rows
      .map((r) => {
        const scores = JSON.parse(r.scores) as CriterionScore[];
        return {
          scorerId: r.scorer_id,
          scorer: { ...people.person(r.scorer_id), role: people.role(r.scorer_id) },
          scores,
          weighted: weightedScore(rubric, scores),
          updatedAt: fromSqlDate(r.updated_at)!.toISOString(),
        };
      })
      .sort((a, b) => a.scorer.name.localeCompare(b.scorer.name) || a.scorerId - b.scorerId);
  }

  function view(actor: Actor, submissionId: number, resource: Resource): FeedbackDto {
    const s = facts(submissionId);
    const f = db.prepare('SELECT final_mark, summary, released_at FROM feedback WHERE submission_id = ?').get(submissionId) as
      | { final_mark: number | null; summary: string; released_at: string | null }
      | undefined;
    const released = f?.released_at != null;
    const marker = can(actor, 'feedback.mark', resource);
    const scorer = can(actor, 'feedback.score', resource);
    const all = sheetsOf(submissionId, s.studio_id, s.rubricList);
    const owner = resource.ownerId === actor.id && !marker && !scorer;
    const sheets = marker ? all : owner ? (released ? all : []) : all.filter((x) => x.scorerId === actor.id);
    const showMark = marker || released;
    return {
      submissionId,
      rubric: s.rubricList.map((c) => ({ id: c.id, criterion: c.criterion, weight: c.weight, levels: c.levels.map((l) => ({ score: l.score, label: l.label, descriptor: l.descriptor })) })),
      sheets: sheets.map(({ scorerId: _scorerId, ...rest }) => rest),
      finalMark: showMark ? (f?.final_mark ?? null) : null,
      summary: showMark ? (f?.summary ?? '') : '',
      released,
      releasedAt: released ? fromSqlDate(f!.released_at)!.toISOString() : null,
      canScore: scorer,
      canMark: marker,
    };
  }

  return {
    view,

    /** Replaces the caller's own sheet (an empty list removes it). */
    async putScores(actor: Actor, submissionId: number, input: PutScoresBody, resource: Resource): Promise<FeedbackDto> {
      const body = putScoresBodySchema.parse(input);
      const s = facts(submissionId);
      const seen = new Set<string>();
      body.scores.forEach((sc, i) => {
        const c = s.rubricList.find((r) => r.id === sc.criterion);
        if (!c) {
          const why = s.rubricList.length ? `the rubric has no criterion ${sc.criterion} (it has ${s.rubricList.map((r) => r.id).join(', ')})` : 'this brief has no rubric';
          throw new UnprocessableError(`Check body.scores.${i}.criterion: ${why}.`, { [`body.scores.${i}.criterion`]: why });
        }
        if (seen.has(sc.criterion)) {
          throw new UnprocessableError(`Check body.scores.${i}.criterion: ${sc.criterion} is scored twice.`, { [`body.scores.${i}.criterion`]: `${sc.criterion} is scored twice` });
        }
        seen.add(sc.criterion);
        const levels = c.levels.map((l) => l.score);
        if (!levels.includes(sc.score)) {
          const why = `must be one of the levels of ${c.criterion}: ${levels.join(', ')}`;
          throw new UnprocessableError(`Check body.scores.${i}.score: ${why}.`, { [`body.scores.${i}.score`]: why });
        }
      });
      const now = sqlDate(ctx.clock.now());
      await whenNoTransaction(db);
      db.transaction(() => {
        if (body.scores.length === 0) {
          db.prepare('DELETE FROM score_sheets WHERE submission_id = ? AND scorer_id = ?').run(submissionId, actor.id);
          return;
        }
        db.prepare(
          `INSERT INTO score_sheets (submission_id, scorer_id, scores, updated_at) VALUES (?, ?, ?, ?)
             ON CONFLICT (submission_id, scorer_id) DO UPDATE SET scores = excluded.scores, updated_at = excluded.updated_at`,
        ).run(submissionId, actor.id, JSON.stringify(body.scores), now);
      })();
      return view(actor, submissionId, resource);
    },

    /** The instructor's final mark and summary. */
    async putFeedback(actor: Actor, submissionId: number, input: PutFeedbackBody, resource: Resource): Promise<FeedbackDto> {
      const body = putFeedbackBodySchema.parse(input);
      facts(submissionId);
      const cur = db.prepare('SELECT released_at FROM feedback WHERE submission_id = ?').get(submissionId) as { released_at: string | null } | undefined;
      if (cur?.released_at != null && body.finalMark === null) {
        throw new ConflictError('This feedback is released; it keeps a final mark (change it, do not clear it).', 'feedback_released');
      }
      const now = sqlDate(ctx.clock.now());
      db.prepare(
        `INSERT INTO feedback (submission_id, final_mark, summary, released_at, updated_at) VALUES (?, ?, ?, NULL, ?)
           ON CONFLICT (submission_id) DO UPDATE SET final_mark = excluded.final_mark, summary = excluded.summary, updated_at = excluded.updated_at`,
      ).run(submissionId, body.finalMark, body.summary, now);
      return view(actor, submissionId, resource);
    },

    /** Releases the feedback (needs a final mark) and mails the participant once. */
    async release(actor: Actor, submissionId: number, resource: Resource): Promise<FeedbackDto> {
      facts(submissionId);
      const cur = db.prepare('SELECT final_mark, released_at FROM feedback WHERE submission_id = ?').get(submissionId) as { final_mark: number | null; released_at: string | null } | undefined;
      if (!cur || cur.final_mark === null) throw new ConflictError('Set a final mark before releasing the feedback.', 'final_mark_missing');
      if (cur.released_at === null) {
        db.prepare('UPDATE feedback SET released_at = ?, updated_at = ? WHERE submission_id = ? AND released_at IS NULL').run(sqlDate(ctx.clock.now()), sqlDate(ctx.clock.now()), submissionId);
      }
      await mails.feedbackReleased(submissionId);
      return view(actor, submissionId, resource);
    },
  };
}

