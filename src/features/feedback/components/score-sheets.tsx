import type { ScoreSheet } from '../../../../shared/api/critique.js';
import { ROLE_LABELS } from '../../../components/ui/role-badge.js';
import { formatDateTime } from '../../../lib/format.js';
import { criterionOf, formatWeighted, levelText, type Rubric } from './weighted.js';

function roleWord(role: string): string {
  return (ROLE_LABELS as Record<string, string>)[role] ?? role;
}

/**
 * Every score sheet side by side: one column per scorer, one row per criterion (level and
 * comment), the weighted figure at the foot. Read-only.
 */
export function ScoreSheets({ rubric, sheets, caption = 'Score sheets side by side' }: { rubric: Rubric; sheets: ScoreSheet[]; caption?: string }) {
  if (sheets.length === 0) return <p className="text-sm text-ink-soft">No one has scored this submission yet.</p>;
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-paper-raised">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">{caption}</caption>
        <thead className="bg-paper-sunk/70">
          <tr>
            <th scope="col" className="border-b border-rule px-3 py-2 font-mono text-xs font-medium uppercase tracking-wide text-ink-soft">
              Criterion
            </th>
            {sheets.map((s) => (
              <th key={s.scorer.id} scope="col" className="border-b border-rule px-3 py-2 align-bottom">
                <span className="block font-medium">{s.scorer.name}</span>
                <span className="block font-mono text-xs font-normal text-ink-soft">
                  {roleWord(s.scorer.role)} · {formatDateTime(s.updatedAt)}
                </span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rubric.map((c) => (
            <tr key={c.id} className="border-b border-rule/70 align-top">
              <th scope="row" className="w-48 px-3 py-2.5 font-medium">
                {c.criterion}
                <span className="block font-mono text-xs font-normal text-ink-soft">weight {c.weight}</span>
              </th>
              {sheets.map((s) => {
                const score = s.scores.find((x) => criterionOf(rubric, x)?.id === c.id);
                return (
                  <td key={s.scorer.id} className="px-3 py-2.5">
                    {score ? (
                      <>
                        <span className="font-medium">{levelText(rubric, score)}</span>
                        {score.comment ? <span className="mt-1 block whitespace-pre-line text-ink-soft">{score.comment}</span> : null}
                      </>
                    ) : (
                      <span className="text-ink-soft">Not scored</span>
                    )}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr className="bg-paper-sunk/40">
            <th scope="row" className="px-3 py-2.5 font-medium">
              Weighted
            </th>
            {sheets.map((s) => (
              <td key={s.scorer.id} className="px-3 py-2.5 font-mono font-semibold">
                {formatWeighted(s.weighted)}
              </td>
            ))}
          </tr>
        </tfoot>
      </table>
    </div>
  );
}
