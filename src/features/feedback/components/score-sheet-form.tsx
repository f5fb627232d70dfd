import { Controller, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { z } from 'zod';
import type { Feedback, PutScoresBody, ScoreSheet } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { FormStatus } from '../../../components/ui/form-status.js';
import { formErrorMap } from '../../../lib/form-numbers.js';
import { useSubmitStatus } from '../../../lib/use-submit-status.js';
import { criterionOf, formatWeighted, weightedScore, type Rubric } from './weighted.js';

/**
 * One row per criterion: the level picked (null: not scored) and a comment. A comment needs a
 * level; at least one criterion must be scored. The output is the `PUT …/scores` body with the
 * unscored criteria left out.
 */
export const scoreFormSchema = z
  .object({
    scores: z.array(
      z
        .object({
          criterion: z.string(),
          score: z.number().nullable(),
          comment: z.string().trim().max(5000, 'Use at most 5000 characters'),
        })
        .superRefine((s, ctx) => {
          if (s.score === null && s.comment) ctx.addIssue({ code: 'custom', path: ['score'], message: 'Pick a level to go with the comment' });
        }),
    ),
  })
  .refine((v) => v.scores.some((s) => s.score !== null), { message: 'Pick a level for at least one criterion', path: ['scores'] })
  .transform((v): PutScoresBody => ({ scores: v.scores.filter((s) => s.score !== null).map((s) => ({ criterion: s.criterion, score: s.score!, comment: s.comment })) }));

export type ScoreFormValues = z.input<typeof scoreFormSchema>;

/** The form's rows for `rubric`, filled from the caller's saved sheet when there is one. */
export function scoreFormDefaults(rubric: Rubric, sheet: ScoreSheet | undefined): ScoreFormValues {
  return {
    scores: rubric.map((c) => {
      const saved = sheet?.scores.find((s) => criterionOf(rubric, s)?.id === c.id);
      return { criterion: c.id, score: saved?.score ?? null, comment: saved?.comment ?? '' };
    }),
  };
}

/**
 * The caller's own score sheet: the rubric as a table, a radio group of levels (label, score and
 * descriptor visible) and a comment per criterion, the weighted figure as it stands, and Save.
 */
export function ScoreSheetForm({
  rubric,
  sheet,
  scorerId,
  onSave,
}: {
  rubric: Rubric;
  /** The caller's saved sheet, if any. */
  sheet: ScoreSheet | undefined;
  /** The signed-in person (whose sheet this is). */
  scorerId: number;
  onSave: (body: PutScoresBody) => Promise<Feedback>;
}) {
  const form = useForm<ScoreFormValues, unknown, PutScoresBody>({
    resolver: zodResolver(scoreFormSchema, { error: formErrorMap }),
    defaultValues: scoreFormDefaults(rubric, sheet),
  });
  const { control, register, handleSubmit, formState } = form;
  const { status, fail, succeed, clear } = useSubmitStatus(form);
  const scores = useWatch({ control, name: 'scores' });
  const weighted = weightedScore(
    rubric,
    (scores ?? []).filter((s) => s.score !== null).map((s) => ({ criterion: s.criterion, score: s.score! })),
  );
  const errors = formState.errors.scores as (typeof formState.errors.scores & { message?: string; root?: { message?: string } }) | undefined;
  const sheetError = errors?.message ?? errors?.root?.message;

  const onSubmit = handleSubmit(async (body) => {
    clear();
    try {
      const saved = await onSave(body);
      const mine = saved.sheets.find((s) => s.scorer.id === scorerId);
      succeed(`Scores saved (${body.scores.length} of ${rubric.length} ${rubric.length === 1 ? 'criterion' : 'criteria'})${mine ? `; weighted ${formatWeighted(mine.weighted)}` : ''}.`);
    } catch (error) {
      fail(error);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Your scores" className="space-y-4">
      <div className="overflow-x-auto rounded-lg border border-rule bg-paper-raised">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">Rubric: pick a level and comment on each criterion</caption>
          <thead className="bg-paper-sunk/70">
            <tr>
              {['Criterion', 'Level', 'Comment'].map((h) => (
                <th key={h} scope="col" className="border-b border-rule px-3 py-2 font-mono text-xs font-medium uppercase tracking-wide text-ink-soft">
                  {h}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {rubric.map((c, i) => {
              const rowError = errors?.[i];
              const scoreError = rowError?.score?.message;
              const commentError = rowError?.comment?.message;
              const commentId = `score-comment-${c.id}`;
              return (
                <tr key={c.id} className="border-b border-rule/70 align-top last:border-b-0">
                  <th scope="row" className="w-48 px-3 py-3 font-medium">
                    {c.criterion}
                    <span className="block font-mono text-xs font-normal text-ink-soft">weight {c.weight}</span>
                  </th>
                  <td className="px-3 py-3">
                    <Controller
                      control={control}
                      name={`scores.${i}.score`}
                      render={({ field }) => (
                        <fieldset aria-describedby={scoreError ? `score-error-${c.id}` : undefined} className="space-y-1.5">
                          <legend className="sr-only">Level for {c.criterion}</legend>
                          {c.levels.map((l) => (
                            <label key={l.score} className="flex cursor-pointer items-start gap-2 rounded-md border border-transparent px-1.5 py-1 has-[:checked]:border-accent has-[:checked]:bg-accent-wash">
                              <input
                                type="radio"
                                name={`level-${c.id}`}
                                value={l.score}
                                checked={field.value === l.score}
                                onChange={() => field.onChange(l.score)}
                                onBlur={field.onBlur}
                                className="mt-1 size-4 accent-accent focus-visible:outline-2 focus-visible:outline-accent"
                              />
                              <span>
                                <span className="font-medium">{l.label}</span> <span className="font-mono text-xs text-ink-soft">({l.score})</span>
                                {l.descriptor ? <span className="block text-xs text-ink-soft">{l.descriptor}</span> : null}
                              </span>
                            </label>
                          ))}
                          {field.value !== null ? (
                            <Button variant="quiet" size="sm" onClick={() => field.onChange(null)} aria-label={`Clear the level for ${c.criterion}`}>
                              Clear
                            </Button>
                          ) : null}
                          {scoreError ? (
                            <p id={`score-error-${c.id}`} className="text-sm text-signal-error">
                              {scoreError}
                            </p>
                          ) : null}
                        </fieldset>
                      )}
                    />
                  </td>
                  <td className="min-w-56 px-3 py-3">
                    <label htmlFor={commentId} className="sr-only">
                      Comment on {c.criterion}
                    </label>
                    <textarea
                      id={commentId}
                      rows={3}
                      aria-invalid={commentError ? true : undefined}
                      aria-describedby={commentError ? `${commentId}-error` : undefined}
                      className="block min-h-20 w-full rounded-md border border-rule-strong bg-paper-raised px-2 py-1.5 text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent aria-[invalid=true]:border-signal-error"
                      {...register(`scores.${i}.comment`)}
                    />
                    {commentError ? (
                      <p id={`${commentId}-error`} className="mt-1 text-sm text-signal-error">
                        {commentError}
                      </p>
                    ) : null}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-sm">
        Weighted: <output className="font-mono font-semibold" aria-live="polite">{formatWeighted(weighted)}</output>
        <span className="ml-2 text-ink-soft">over the criteria scored, each as a share of its top level</span>
      </p>
      {sheetError ? (
        <p className="text-sm text-signal-error" role="alert">
          {sheetError}
        </p>
      ) : null}
      <FormStatus status={status} />
      <Button type="submit" pending={formState.isSubmitting} pendingLabel="Saving…">
        Save scores
      </Button>
    </form>
  );
}
