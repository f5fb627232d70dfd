// @vitest-environment jsdom
import { afterEach, describe, expect, it, vi } from 'vitest';
import { useState } from 'react';
import { act, cleanup, fireEvent, render, screen } from '@testing-library/react';
import type { Pinup } from '../../shared/api/critique.js';
import { entryIndexFrom, orderedEntries, presentationKeyAction, PresentationStage, type StagePin } from '../../src/features/pinups/components/presentation-stage.js';

const entry = (position: number, submissionId: number, name: string) => ({
  position,
  submissionId,
  participant: { id: submissionId + 100, name },
  latestRevision: { id: submissionId * 10, number: 1 },
  critics: submissionId === 21 ? [{ id: 5, name: 'Juno Pell' }] : [],
  openPins: submissionId === 21 ? 2 : 0,
  resolvedPins: 0,
});

// Entries stored out of order: the stage must follow `position`.
const pinup: Pinup = {
  id: 4,
  briefId: 2,
  briefTitle: 'Octahedral lamp',
  studioId: 1,
  title: 'Final pin-up',
  startsAt: '2026-05-04T12:00:00.000Z',
  durationMinutes: 90,
  room: 'Loft',
  state: 'running',
  createdBy: { id: 2, name: 'Wren Halloway' },
  entries: [entry(2, 22, 'Ilse Marrow'), entry(1, 21, 'Oda Finch'), entry(3, 23, 'Bram Tolley')],
};

const pins: StagePin[] = [
  { id: 70, number: 2, label: 'Structure · rib-03' },
  { id: 71, number: 5, label: 'Fabrication · ring-01' },
];

function Harness({ onExit, withPins = pins }: { onExit: () => void; withPins?: StagePin[] | null }) {
  const [index, setIndex] = useState(0);
  const [pinIndex, setPinIndex] = useState<number | null>(null);
  return (
    <PresentationStage
      pinup={pinup}
      index={index}
      onIndexChange={(i) => {
        setIndex(i);
        setPinIndex(null);
      }}
      pins={withPins}
      pinIndex={pinIndex}
      onPinIndexChange={setPinIndex}
      onExit={onExit}
    >
      <label>
        Reply
        <textarea />
      </label>
    </PresentationStage>
  );
}

const key = (k: string, target: EventTarget = document.body) => {
  const e = new KeyboardEvent('keydown', { key: k, bubbles: true, cancelable: true });
  act(() => {
    target.dispatchEvent(e);
  });
  return e;
};

afterEach(cleanup);

describe('presentation keys', () => {
  it('maps arrows and Escape, and leaves keys typed into a field alone', () => {
    const body = document.body;
    expect(presentationKeyAction({ key: 'ArrowRight', target: body, altKey: false, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: false })).toBe('next');
    expect(presentationKeyAction({ key: 'ArrowLeft', target: body, altKey: false, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: false })).toBe('previous');
    expect(presentationKeyAction({ key: 'ArrowDown', target: body, altKey: false, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: false })).toBe('next-pin');
    expect(presentationKeyAction({ key: 'Escape', target: body, altKey: false, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: false })).toBe('exit');
    const input = document.createElement('textarea');
    expect(presentationKeyAction({ key: 'Escape', target: input, altKey: false, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: false })).toBeNull();
    // The model viewer steps through pieces with the arrows and marks the key handled.
    expect(presentationKeyAction({ key: 'ArrowRight', target: body, altKey: false, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: true })).toBeNull();
    expect(presentationKeyAction({ key: 'ArrowRight', target: body, altKey: true, ctrlKey: false, metaKey: false, shiftKey: false, defaultPrevented: false })).toBeNull();
  });

  it('reads the entry from the address, clamped to the entries there are', () => {
    expect(entryIndexFrom(null, 3)).toBe(0);
    expect(entryIndexFrom('2', 3)).toBe(1);
    expect(entryIndexFrom('9', 3)).toBe(2);
    expect(entryIndexFrom('0', 3)).toBe(0);
    expect(entryIndexFrom('x', 3)).toBe(0);
    expect(orderedEntries(pinup).map((e) => e.participant.name)).toEqual(['Oda Finch', 'Ilse Marrow', 'Bram Tolley']);
  });
});

describe('PresentationStage', () => {
  it('steps through the entries in running order with the buttons and the arrow keys', () => {
    render(<Harness onExit={vi.fn()} />);
    expect(screen.getByRole('heading', { level: 1 }).textContent).toContain('Oda Finch');
    expect(screen.getByText('1 of 3')).toBeTruthy();
    expect(screen.getByText('Critics: Juno Pell · 2 open, 0 resolved')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Previous entry' })).toHaveProperty('disabled', true);
    fireEvent.click(screen.getByRole('button', { name: 'Next entry' }));
    expect(screen.getByText('2 of 3')).toBeTruthy();
    expect(screen.getByRole('heading', { level: 1 }).textContent).toContain('Ilse Marrow');
    expect(screen.getByText('No critics assigned · 0 open, 0 resolved')).toBeTruthy();
    key('ArrowRight');
    expect(screen.getByText('3 of 3')).toBeTruthy();
    key('ArrowRight');
    expect(screen.getByText('3 of 3')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Next entry' })).toHaveProperty('disabled', true);
    key('ArrowLeft');
    expect(screen.getByText('2 of 3')).toBeTruthy();
  });

  it('steps through the open pins of the entry, from the whole model to the last pin and back', () => {
    render(<Harness onExit={vi.fn()} />);
    expect(screen.getByText('2 open pins · whole model')).toBeTruthy();
    key('ArrowDown');
    expect(screen.getByText('Pin 2 · 1 of 2 open')).toBeTruthy();
    expect(screen.getByText('Structure · rib-03')).toBeTruthy();
    fireEvent.click(screen.getByRole('button', { name: 'Next pin' }));
    expect(screen.getByText('Pin 5 · 2 of 2 open')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Next pin' })).toHaveProperty('disabled', true);
    key('ArrowUp');
    key('ArrowUp');
    expect(screen.getByText('2 open pins · whole model')).toBeTruthy();
    // A new entry starts on the whole model again.
    key('ArrowDown');
    key('ArrowRight');
    expect(screen.getByText('2 open pins · whole model')).toBeTruthy();
  });

  it('says when an entry has no open pins or they are loading', () => {
    const { unmount } = render(<Harness onExit={vi.fn()} withPins={[]} />);
    expect(screen.getByText('No open pins on this revision.')).toBeTruthy();
    unmount();
    render(<Harness onExit={vi.fn()} withPins={null} />);
    expect(screen.getByText('Loading the pins…')).toBeTruthy();
  });

  it('leaves with Escape, but not while someone types in a field', () => {
    const onExit = vi.fn();
    render(<Harness onExit={onExit} />);
    const box = screen.getByLabelText('Reply');
    box.focus();
    key('Escape', box);
    key('ArrowRight', box);
    expect(onExit).not.toHaveBeenCalled();
    expect(screen.getByText('1 of 3')).toBeTruthy();
    key('Escape');
    expect(onExit).toHaveBeenCalledTimes(1);
    fireEvent.click(screen.getByRole('button', { name: 'Leave presentation' }));
    expect(onExit).toHaveBeenCalledTimes(2);
  });
});
