// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { MemoryRouter } from 'react-router-dom';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { Pinup, PinupEntry } from '../../shared/api/critique.js';
import { ConfirmAction } from '../../src/components/ui/confirm-action.js';
import { PinupList } from '../../src/features/pinups/components/pinup-list.js';
import { formatDuration, formatPinupTime } from '../../src/features/pinups/components/pinup-words.js';
import { RunningOrder } from '../../src/features/pinups/components/running-order.js';
import { ApiError } from '../../src/lib/api-client.js';

const entries: PinupEntry[] = [
  { position: 2, submissionId: 8, participant: { id: 31, name: 'Ilse Marrow' }, latestRevision: null, critics: [], openPins: 0, resolvedPins: 0 },
  { position: 1, submissionId: 7, participant: { id: 30, name: 'Oda Finch' }, latestRevision: { id: 44, number: 3 }, critics: [{ id: 5, name: 'Juno Pell' }], openPins: 4, resolvedPins: 2 },
];
const critics = [
  { id: 5, name: 'Juno Pell' },
  { id: 6, name: 'Tamsin Reede' },
];

const session = (over: Partial<Pinup>): Pinup => ({
  id: 1,
  briefId: 2,
  briefTitle: 'Lantern',
  studioId: 1,
  title: 'Session',
  startsAt: '2026-05-04T12:00:00.000Z',
  durationMinutes: 90,
  room: '',
  state: 'scheduled',
  createdBy: { id: 2, name: 'Wren Halloway' },
  entries: [],
  ...over,
});

afterEach(cleanup);

describe('RunningOrder', () => {
  it('lists the entries by position with picture, revision link, pin counts, critics and feedback link', () => {
    render(
      <MemoryRouter>
        <RunningOrder entries={entries} presentHref={(n) => `/pinups/1/present?entry=${n}`} />
      </MemoryRouter>,
    );
    const rows = screen.getAllByRole('row').slice(1);
    expect(rows.map((r) => within(r).getAllByRole('cell')[2].textContent)).toEqual(['Oda FinchPresent from here', 'Ilse MarrowPresent from here']);
    const first = within(rows[0]);
    const img = first.getByRole('img', { name: 'Revision 3 of Oda Finch' });
    expect(img.getAttribute('src')).toBe('/api/revisions/44/thumbnail');
    expect(img.getAttribute('loading')).toBe('lazy');
    expect(img.getAttribute('width')).toBe('48');
    expect(first.getByRole('link', { name: 'Revision 3 of Oda Finch' }).getAttribute('href')).toBe('/revisions/44');
    expect(first.getByText('4 open')).toBeTruthy();
    expect(first.getByText('2 resolved')).toBeTruthy();
    expect(first.getByText('Juno Pell')).toBeTruthy();
    expect(first.getByRole('link', { name: 'Feedback on Oda Finch' }).getAttribute('href')).toBe('/submissions/7/feedback');
    expect(first.getByRole('link', { name: 'Present Oda Finch' }).getAttribute('href')).toBe('/pinups/1/present?entry=1');
    expect(within(rows[1]).getByText('None yet')).toBeTruthy();
    expect(within(rows[1]).getByText('None assigned')).toBeTruthy();
  });

  it('shows a placeholder of the same size when the picture fails to load', () => {
    render(
      <MemoryRouter>
        <RunningOrder entries={entries} />
      </MemoryRouter>,
    );
    fireEvent.error(screen.getByRole('img', { name: 'Revision 3 of Oda Finch' }));
    const missing = screen.getByRole('img', { name: 'Revision 3 of Oda Finch (no picture yet)' });
    expect(missing.getAttribute('data-thumbnail')).toBe('missing');
    expect(missing.className).toContain('size-12');
  });

  it('lets the instructor change an entry’s critics and saves the whole list', async () => {
    const onAssign = vi.fn(async () => undefined);
    render(
      <MemoryRouter>
        <RunningOrder entries={entries} critics={critics} onAssignCritics={onAssign} />
      </MemoryRouter>,
    );
    const group = screen.getByRole('group', { name: 'Critics of Oda Finch' });
    const save = within(group).getByRole('button', { name: 'Save critics of Oda Finch' });
    expect(save).toHaveProperty('disabled', true);
    fireEvent.click(within(group).getByLabelText('Tamsin Reede'));
    fireEvent.click(within(group).getByLabelText('Juno Pell'));
    fireEvent.click(save);
    await waitFor(() => expect(onAssign).toHaveBeenCalledWith(7, [6]));
    expect(await within(group).findByText('Critics of Oda Finch saved.')).toBeTruthy();
  });

  it('shows the server’s refusal in its words', async () => {
    const onAssign = vi.fn(async () => {
      throw new ApiError(422, 'validation_failed', 'Only critics of this studio can be assigned.');
    });
    render(
      <MemoryRouter>
        <RunningOrder entries={entries} critics={critics} onAssignCritics={onAssign} />
      </MemoryRouter>,
    );
    const group = screen.getByRole('group', { name: 'Critics of Ilse Marrow' });
    fireEvent.click(within(group).getByLabelText('Juno Pell'));
    fireEvent.click(within(group).getByRole('button', { name: 'Save critics of Ilse Marrow' }));
    expect(await within(group).findByText('Only critics of this studio can be assigned.')).toBeTruthy();
  });
});

describe('PinupList', () => {
  it('lists sessions soonest first with local time, room and state, and says when there are none', () => {
    const { unmount } = render(
      <MemoryRouter>
        <PinupList
          pinups={[
            session({ id: 2, title: 'Final', startsAt: '2026-06-01T09:00:00.000Z', state: 'scheduled', room: 'Loft' }),
            session({ id: 1, title: 'Mid-brief', startsAt: '2026-05-04T12:00:00.000Z', state: 'finished', entries }),
          ]}
        />
      </MemoryRouter>,
    );
    const items = screen.getAllByRole('listitem');
    expect(items.map((li) => within(li).getByRole('link').textContent)).toEqual(['Mid-brief', 'Final']);
    expect(within(items[0]).getByText('Finished')).toBeTruthy();
    expect(within(items[0]).getByRole('link').getAttribute('href')).toBe('/pinups/1');
    expect(items[0].textContent).toContain('2 entries');
    expect(items[1].textContent).toContain('Loft');
    expect(items[0].querySelector('time')?.textContent).toBe(formatPinupTime({ startsAt: '2026-05-04T12:00:00.000Z', durationMinutes: 90 }));
    unmount();
    render(
      <MemoryRouter>
        <PinupList pinups={[]} />
      </MemoryRouter>,
    );
    expect(screen.getByText('No pin-ups scheduled')).toBeTruthy();
  });

  it('writes durations and a span in local time', () => {
    expect(formatDuration(45)).toBe('45 minutes');
    expect(formatDuration(60)).toBe('1 hour');
    expect(formatDuration(135)).toBe('2 hours 15 minutes');
    const start = new Date(2026, 4, 4, 14, 0);
    expect(formatPinupTime({ startsAt: start.toISOString(), durationMinutes: 90 })).toMatch(/4 May 2026.*14:00–15:30$/);
  });
});

describe('ConfirmAction', () => {
  it('asks before acting, and Cancel or Escape does nothing', async () => {
    const onConfirm = vi.fn(async () => undefined);
    render(<ConfirmAction label="Delete pin-up" question="Delete “Final”?" confirmLabel="Yes, delete" onConfirm={onConfirm} />);
    fireEvent.click(screen.getByRole('button', { name: 'Delete pin-up' }));
    expect(screen.getByRole('group', { name: 'Delete “Final”?' })).toBeTruthy();
    expect(document.activeElement).toBe(screen.getByRole('button', { name: 'Cancel' }));
    fireEvent.keyDown(screen.getByRole('button', { name: 'Cancel' }), { key: 'Escape' });
    expect(screen.queryByRole('group')).toBeNull();
    expect(onConfirm).not.toHaveBeenCalled();
    fireEvent.click(screen.getByRole('button', { name: 'Delete pin-up' }));
    fireEvent.click(screen.getByRole('button', { name: 'Yes, delete' }));
    await waitFor(() => expect(onConfirm).toHaveBeenCalledTimes(1));
  });
});
