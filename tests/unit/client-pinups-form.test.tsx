// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, waitFor, within } from '@testing-library/react';
import type { Pinup } from '../../shared/api/critique.js';
import { PinupForm, pinupFormDefaults, pinupFormSchema, type PinupFormOutput } from '../../src/features/pinups/components/pinup-form.js';
import { moveItem, type RunningOrderOption } from '../../src/features/pinups/components/running-order-editor.js';
import { ApiError } from '../../src/lib/api-client.js';

// Invented participants of an invented studio.
const options: RunningOrderOption[] = [
  { submissionId: 11, participantName: 'Oda Finch', latestRevision: 2 },
  { submissionId: 12, participantName: 'Ilse Marrow', latestRevision: 1 },
  { submissionId: 13, participantName: 'Bram Tolley', latestRevision: null },
];

function saved(values: PinupFormOutput): Pinup {
  return {
    id: 5,
    briefId: 3,
    briefTitle: 'Icosahedral lantern',
    studioId: 1,
    title: values.title,
    startsAt: values.startsAt,
    durationMinutes: values.durationMinutes,
    room: values.room,
    state: 'scheduled',
    createdBy: { id: 2, name: 'Wren Halloway' },
    entries: values.submissionIds.map((id, i) => ({ position: i + 1, submissionId: id, participant: { id: 100 + i, name: `P${i}` }, latestRevision: null, critics: [], openPins: 0, resolvedPins: 0 })),
  };
}

afterEach(cleanup);

describe('moveItem', () => {
  it('moves one item up or down and leaves the list alone at its ends', () => {
    expect(moveItem([1, 2, 3], 2, -1)).toEqual([1, 3, 2]);
    expect(moveItem([1, 2, 3], 0, 1)).toEqual([2, 1, 3]);
    expect(moveItem([1, 2, 3], 0, -1)).toEqual([1, 2, 3]);
    expect(moveItem([1, 2, 3], 2, 1)).toEqual([1, 2, 3]);
  });
});

describe('pinupFormSchema', () => {
  it('turns the local start into an ISO instant', () => {
    const r = pinupFormSchema.safeParse({ title: 'Mid-brief', startsAt: '2026-05-04T14:00', durationMinutes: 90, room: 'Workshop 2', submissionIds: [12, 11] });
    expect(r.success).toBe(true);
    expect(r.data!.startsAt).toBe(new Date('2026-05-04T14:00').toISOString());
    expect(r.data!.submissionIds).toEqual([12, 11]);
  });

  it('names each field that is wrong', () => {
    const r = pinupFormSchema.safeParse({ title: ' ', startsAt: '', durationMinutes: 5, room: '', submissionIds: [11, 11] });
    const found = Object.fromEntries((r.error?.issues ?? []).map((i) => [i.path.join('.'), i.message]));
    expect(found).toEqual({
      title: 'Enter a title',
      startsAt: 'Choose a date and time',
      durationMinutes: 'At least 10 minutes',
      submissionIds: 'A submission appears at most once',
    });
  });

  it('fills an edit from the session, in running order and in local time', () => {
    const pinup = saved({ title: 'Final', startsAt: '2026-05-04T12:30:00.000Z', durationMinutes: 60, room: 'Loft', submissionIds: [13, 11] });
    pinup.entries.reverse();
    const d = pinupFormDefaults(pinup);
    expect(d.submissionIds).toEqual([13, 11]);
    expect(new Date(d.startsAt).toISOString()).toBe('2026-05-04T12:30:00.000Z');
  });
});

describe('PinupForm', () => {
  it('builds the running order with buttons only and sends it with the start as ISO', async () => {
    const onSave = vi.fn(async (v: PinupFormOutput) => saved(v));
    render(<PinupForm options={options} onSave={onSave} submitLabel="Schedule pin-up" ariaLabel="Schedule a pin-up" />);
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Mid-brief pin-up' } });
    fireEvent.change(screen.getByLabelText('Starts'), { target: { value: '2026-05-04T14:00' } });
    fireEvent.change(screen.getByLabelText('Duration (minutes)'), { target: { value: '45' } });
    fireEvent.change(screen.getByLabelText('Room'), { target: { value: 'Workshop 2' } });

    // The chooser lists people by name; add two, then a third, then reorder and remove.
    const chooser = screen.getByLabelText('Add a submission');
    fireEvent.change(chooser, { target: { value: '12' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add to the running order' }));
    fireEvent.change(screen.getByLabelText('Add a submission'), { target: { value: '11' } });
    fireEvent.click(screen.getByRole('button', { name: 'Add to the running order' }));
    fireEvent.click(screen.getByRole('button', { name: 'Add to the running order' }));
    const order = () => within(screen.getByRole('list', { name: 'Running order' })).getAllByRole('listitem').map((li) => li.textContent ?? '');
    expect(order().map((t) => t.split(/revision|no revision/)[0])).toEqual(['1.Ilse Marrow', '2.Oda Finch', '3.Bram Tolley']);
    expect(screen.getByRole('button', { name: 'Move Ilse Marrow up' })).toHaveProperty('disabled', true);
    fireEvent.click(screen.getByRole('button', { name: 'Move Bram Tolley up' }));
    fireEvent.click(screen.getByRole('button', { name: 'Move Ilse Marrow down' }));
    fireEvent.click(screen.getByRole('button', { name: 'Remove Oda Finch from the running order' }));
    expect(order().map((t) => t.split(/revision|no revision/)[0])).toEqual(['1.Bram Tolley', '2.Ilse Marrow']);

    fireEvent.click(screen.getByRole('button', { name: 'Schedule pin-up' }));
    await waitFor(() => expect(onSave).toHaveBeenCalledTimes(1));
    expect(onSave.mock.calls[0][0]).toEqual({
      title: 'Mid-brief pin-up',
      startsAt: new Date('2026-05-04T14:00').toISOString(),
      durationMinutes: 45,
      room: 'Workshop 2',
      submissionIds: [13, 12],
    });
    expect(await screen.findByText('Scheduled “Mid-brief pin-up” with 2 entries.')).toBeTruthy();
  });

  it('says what is wrong at each field and sends nothing', async () => {
    const onSave = vi.fn(async (v: PinupFormOutput) => saved(v));
    render(<PinupForm options={options} onSave={onSave} submitLabel="Schedule pin-up" ariaLabel="Schedule a pin-up" />);
    fireEvent.change(screen.getByLabelText('Duration (minutes)'), { target: { value: '' } });
    fireEvent.change(screen.getByLabelText('Starts'), { target: { value: '' } });
    fireEvent.click(screen.getByRole('button', { name: 'Schedule pin-up' }));
    expect(await screen.findByText('Enter a title')).toBeTruthy();
    expect(screen.getByText('Choose a date and time')).toBeTruthy();
    expect(screen.getByText('Enter a number')).toBeTruthy();
    expect(screen.getByLabelText('Title').getAttribute('aria-invalid')).toBe('true');
    expect(onSave).not.toHaveBeenCalled();
  });

  it('puts the server’s field message at its field and states the refusal', async () => {
    const onSave = vi.fn(async () => {
      throw new ApiError(422, 'validation_failed', 'Some of the values were not accepted.', { 'body.room': 'That room is closed for refitting' });
    });
    render(<PinupForm options={options} onSave={onSave} submitLabel="Schedule pin-up" ariaLabel="Schedule a pin-up" />);
    fireEvent.change(screen.getByLabelText('Title'), { target: { value: 'Final crit' } });
    fireEvent.change(screen.getByLabelText('Room'), { target: { value: 'Annex' } });
    fireEvent.click(screen.getByRole('button', { name: 'Schedule pin-up' }));
    expect(await screen.findByText('That room is closed for refitting')).toBeTruthy();
    expect(screen.getByRole('status').textContent).toContain('Some of the values were not accepted.');
  });

  it('says an empty running order takes every submission with a revision', () => {
    render(<PinupForm options={options} onSave={vi.fn()} submitLabel="Schedule pin-up" ariaLabel="Schedule a pin-up" />);
    expect(screen.getByText(/the session takes every submission with a revision/)).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Add all with a revision' }));
    expect(within(screen.getByRole('list', { name: 'Running order' })).getAllByRole('listitem')).toHaveLength(2);
  });
});
