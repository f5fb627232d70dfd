import type { CriterionScore, Feedback } from '../../../../shared/api/critique.js';

export type Rubric = Feedback['rubric'];

/** The criterion a score belongs to: matched by the criterion's id, or by its name. */
export function criterionOf(rubric: Rubric, score: Pick<CriterionScore, 'criterion'>): Rubric[number] | undefined {
  return rubric.find((c) => c.id === score.criterion) ?? rubric.find((c) => c.criterion === score.criterion);
}

/**
 * Weighted figure out of 100 over the criteria scored: each score as a fraction of its
 * criterion's top level, averaged with the criteria's weights. Criteria left unscored do not
 * count; with none scored the figure is null. (The project's own rule; the server's figure on a
 * saved sheet is the one that counts, this previews it while choosing.)
 */
export function weightedScore(rubric: Rubric, scores: ReadonlyArray<Pick<CriterionScore, 'criterion' | 'score'>>): number | null {
  let sum = 0;
  let weights = 0;
  for (const s of scores) {
    const c = criterionOf(rubric, s);
    if (!c || c.levels.length === 0) continue;
    const top = Math.max(...c.levels.map((l) => l.score));
    if (!(top > 0)) continue;
    sum += c.weight * (s.score / top);
    weights += c.weight;
  }
  return weights > 0 ? (100 * sum) / weights : null;
}

/** A weighted figure as text: "72.5 / 100", or a dash. */
export function formatWeighted(value: number | null): string {
  return value === null ? '—' : `${(Math.round(value * 10) / 10).toLocaleString('en-GB')} / 100`;
}

/** The level a score names, for showing a saved sheet ("Sound (3)"). */
export function levelText(rubric: Rubric, score: Pick<CriterionScore, 'criterion' | 'score'>): string {
  const level = criterionOf(rubric, score)?.levels.find((l) => l.score === score.score);
  return level ? `${level.label} (${score.score})` : String(score.score);
}
