// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { Feedback, PutScoresBody, ScoreSheet } from '../../shared/api/critique.js';
import { ScoreSheetForm } from '../../src/features/feedback/components/score-sheet-form.js';
import { ScoreSheets } from '../../src/features/feedback/components/score-sheets.js';
import { formatWeighted, weightedScore } from '../../src/features/feedback/components/weighted.js';

// An invented three-criterion rubric (weights 3, 2, 1; levels 1–3).
const rubric: Feedback['rubric'] = [
  {
    id: 'structure',
    criterion: 'Structure and joints',
    weight: 3,
    levels: [
      { score: 1, label: 'Loose', descriptor: 'Parts do not hold each other.' },
      { score: 2, label: 'Holds', descriptor: 'One structure, a few fragile joints.' },
      { score: 3, label: 'Sound', descriptor: 'Every joint square and long enough.' },
    ],
  },
  {
    id: 'light',
    criterion: 'Light and form',
    weight: 2,
    levels: [
      { score: 1, label: 'Unresolved', descriptor: '' },
      { score: 2, label: 'Considered', descriptor: 'Openings follow the families.' },
      { score: 3, label: 'Striking', descriptor: '' },
    ],
  },
  { id: 'economy', criterion: 'Material economy', weight: 1, levels: [{ score: 1, label: 'Wasteful', descriptor: '' }, { score: 2, label: 'Lean', descriptor: '' }] },
];

const feedbackWith = (sheets: ScoreSheet[]): Feedback => ({
  submissionId: 7,
  rubric,
  sheets,
  finalMark: null,
  summary: '',
  released: false,
  releasedAt: null,
  canScore: true,
  canMark: false,
});

afterEach(cleanup);

describe('weightedScore', () => {
  it('weights each score as a share of its top level over the criteria scored (worked by hand)', () => {
    // structure 3/3 (weight 3) and light 2/3 (weight 2): (3·1 + 2·⅔) / 5 = 13/15 → 86.67
    expect(weightedScore(rubric, [{ criterion: 'structure', score: 3 }, { criterion: 'light', score: 2 }])).toBeCloseTo(86.667, 2);
    // all three: (3·1 + 2·⅔ + 1·½) / 6 = 29/36 → 80.56
    expect(weightedScore(rubric, [{ criterion: 'structure', score: 3 }, { criterion: 'light', score: 2 }, { criterion: 'economy', score: 1 }])).toBeCloseTo(80.556, 2);
    // a criterion named by its text instead of its id counts the same
    expect(weightedScore(rubric, [{ criterion: 'Material economy', score: 2 }])).toBe(100);
    expect(weightedScore(rubric, [])).toBeNull();
    expect(weightedScore(rubric, [{ criterion: 'unknown', score: 2 }])).toBeNull();
    expect(formatWeighted(86.6667)).toBe('86.7 / 100');
    expect(formatWeighted(null)).toBe('—');
  });
});

describe('ScoreSheetForm', () => {
  it('shows each criterion’s levels with their descriptors as a radio group and previews the weighted figure', async () => {
    const onSave = vi.fn(async (body: PutScoresBody) =>
      feedbackWith([{ scorer: { id: 5, name: 'Juno Pell', role: 'critic' }, scores: body.scores.map((s) => ({ ...s, comment: s.comment ?? '' })), weighted: 86.7, updatedAt: '2026-05-04T12:00:00.000Z' }]),
    );
    render(<ScoreSheetForm rubric={rubric} sheet={undefined} scorerId={5} onSave={onSave} />);
    const structure = screen.getByRole('group', { name: 'Level for Structure and joints' });
    expect(within(structure).getAllByRole('radio')).toHaveLength(3);
    expect(within(structure).getByText('Every joint square and long enough.')).toBeTruthy();
    expect(screen.getByText('—', { selector: 'output' })).toBeTruthy();

    fireEvent.click(within(structure).getByRole('radio', { name: /Sound/ }));
    fireEvent.click(within(screen.getByRole('group', { name: 'Level for Light and form' })).getByRole('radio', { name: /Considered/ }));
    expect(screen.getByText('86.7 / 100', { selector: 'output' })).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Comment on Structure and joints'), { target: { value: 'Joints are long enough everywhere.' } });
    fireEvent.click(screen.getByRole('button', { name: 'Save scores' }));

    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1));
    expect(onSave.mock.calls[0][0]).toEqual({
      scores: [
        { criterion: 'structure', score: 3, comment: 'Joints are long enough everywhere.' },
        { criterion: 'light', score: 2, comment: '' },
      ],
    });
    expect(await screen.findByText(/Scores saved \(2 of 3 criteria\); weighted 86.7 \/ 100/)).toBeTruthy();
  });

  it('refuses a comment without a level and an empty sheet, naming the criterion', async () => {
    const onSave = vi.fn();
    render(<ScoreSheetForm rubric={rubric} sheet={undefined} scorerId={5} onSave={onSave} />);
    fireEvent.click(screen.getByRole('button', { name: 'Save scores' }));
    expect(await screen.findByText('Pick a level for at least one criterion')).toBeTruthy();
    fireEvent.change(screen.getByLabelText('Comment on Light and form'), { target: { value: 'Shadows?' } });
    fireEvent.click(within(screen.getByRole('group', { name: 'Level for Material economy' })).getByRole('radio', { name: /Lean/ }));
    fireEvent.click(screen.getByRole('button', { name: 'Save scores' }));
    const light = screen.getByRole('group', { name: 'Level for Light and form' });
    expect(await within(light).findByText('Pick a level to go with the comment')).toBeTruthy();
    expect(onSave).not.toHaveBeenCalled();
  });

  it('starts from the saved sheet and a level can be cleared', () => {
    const sheet: ScoreSheet = {
      scorer: { id: 5, name: 'Juno Pell', role: 'critic' },
      scores: [{ criterion: 'economy', score: 2, comment: 'Nests well.' }],
      weighted: 100,
      updatedAt: '2026-05-04T12:00:00.000Z',
    };
    render(<ScoreSheetForm rubric={rubric} sheet={sheet} scorerId={5} onSave={vi.fn()} />);
    const economy = screen.getByRole('group', { name: 'Level for Material economy' });
    expect(within(economy).getByRole<HTMLInputElement>('radio', { name: /Lean/ }).checked).toBe(true);
    expect(screen.getByLabelText<HTMLTextAreaElement>('Comment on Material economy').value).toBe('Nests well.');
    fireEvent.click(within(economy).getByRole('button', { name: 'Clear the level for Material economy' }));
    expect(within(economy).getByRole<HTMLInputElement>('radio', { name: /Lean/ }).checked).toBe(false);
  });
});

describe('ScoreSheets', () => {
  it('puts every scorer’s sheet side by side with the weighted figure at the foot', () => {
    render(
      <ScoreSheets
        rubric={rubric}
        sheets={[
          { scorer: { id: 5, name: 'Juno Pell', role: 'critic' }, scores: [{ criterion: 'structure', score: 2, comment: 'Two joints are short.' }], weighted: 66.7, updatedAt: '2026-05-04T12:00:00.000Z' },
          { scorer: { id: 2, name: 'Wren Halloway', role: 'instructor' }, scores: [{ criterion: 'structure', score: 3, comment: '' }, { criterion: 'light', score: 1, comment: '' }], weighted: 73.3, updatedAt: '2026-05-04T13:00:00.000Z' },
        ]}
      />,
    );
    const headers = screen.getAllByRole('columnheader').map((h) => h.textContent);
    expect(headers[1]).toContain('Juno Pell');
    expect(headers[2]).toContain('Wren Halloway');
    const structure = screen.getByRole('row', { name: /Structure and joints/ });
    expect(within(structure).getAllByRole('cell').map((c) => c.textContent)).toEqual(['Holds (2)Two joints are short.', 'Sound (3)']);
    const light = screen.getByRole('row', { name: /Light and form/ });
    expect(within(light).getAllByRole('cell').map((c) => c.textContent)).toEqual(['Not scored', 'Unresolved (1)']);
    const foot = screen.getByRole('row', { name: /Weighted/ });
    expect(within(foot).getAllByRole('cell').map((c) => c.textContent)).toEqual(['66.7 / 100', '73.3 / 100']);
  });
});
