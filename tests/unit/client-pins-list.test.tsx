// @vitest-environment jsdom
import { useState } from 'react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { PinList } from '../../src/features/pins/components/pin-list.js';
import { ALL_PINS, type PinFilters, filterPins, firstWords, newActivity, pinLabel } from '../../src/features/pins/components/pin-words.js';
import { CRITIC, PARTICIPANT, comment, pin } from './client-pins-fixtures.test.js';

afterEach(cleanup);

const pins = [
  pin({ id: 1, category: 'structure', comments: [comment(1, 'The **keel** joint at the top is loose.'), comment(2, 'Agreed'), comment(3, 'Fixed in r3')] }),
  pin({ id: 2, category: 'fabrication', state: 'resolved', anchor: { piece: 'keel-12', point: [0, 0], side: -1 }, comments: [comment(4, 'Kerf too wide')] }),
  pin({ id: 3, category: 'form', scope: 'orbit', outdated: true, anchor: { piece: 'panel-02', point: [1, 1], side: 1 } }),
];

function Harness({ onSelect = () => {}, initial = ALL_PINS, data = pins, empty = 'No pins yet.' }: { onSelect?: (id: number) => void; initial?: PinFilters; data?: typeof pins; empty?: string }) {
  const [filters, setFilters] = useState(initial);
  const [selected, setSelected] = useState<number | null>(null);
  return (
    <PinList
      pins={data}
      filters={filters}
      onFiltersChange={setFilters}
      selectedId={selected}
      onSelect={(p) => {
        setSelected(p.id);
        onSelect(p.id);
      }}
      emptyMessage={empty}
    />
  );
}

const rows = () => within(screen.getByTestId('pin-list')).getAllByRole('button');

describe('PinList', () => {
  it('shows number, category, state, piece, first words and reply count for each pin', () => {
    render(<Harness />);
    const [first, second, third] = rows();
    expect(first.textContent).toContain('1');
    expect(first.textContent).toContain('Structure');
    expect(first.textContent).toContain('Open');
    expect(first.textContent).toContain('panel-05');
    expect(first.textContent).toContain('The keel joint at the top is loose.');
    expect(first.textContent).toContain('2 replies');
    expect(second.textContent).toContain('Resolved');
    expect(second.textContent).toContain('keel-12');
    expect(second.textContent).toContain('0 replies');
    expect(third.textContent).toContain('panel-02 + orbit');
    expect(third.textContent).toContain('outdated');
    expect(first.getAttribute('aria-label')).toBe('Pin 1: open, Structure, on panel-05. 2 replies.');
  });

  it('filters by state with counts, and by category', () => {
    render(<Harness />);
    fireEvent.click(screen.getByLabelText('Resolved (1)'));
    expect(rows().map((r) => r.getAttribute('data-pin-id'))).toEqual(['2']);
    fireEvent.click(screen.getByLabelText('Open (2)'));
    expect(rows().map((r) => r.getAttribute('data-pin-id'))).toEqual(['1', '3']);
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'form' } });
    expect(rows().map((r) => r.getAttribute('data-pin-id'))).toEqual(['3']);
    fireEvent.change(screen.getByLabelText('Category'), { target: { value: 'brief' } });
    expect(screen.getByText('No pins match the filters.')).toBeTruthy();
  });

  it('marks the pressed pin as selected and reports it', () => {
    const onSelect = vi.fn();
    render(<Harness onSelect={onSelect} />);
    fireEvent.click(rows()[1]);
    expect(onSelect).toHaveBeenCalledWith(2);
    expect(rows()[1].getAttribute('aria-pressed')).toBe('true');
    expect(rows()[0].getAttribute('aria-pressed')).toBe('false');
  });

  it('says what to expect when there are no pins at all', () => {
    render(<Harness data={[]} empty="No comments yet; critics' pins appear here." />);
    expect(screen.getByText("No comments yet; critics' pins appear here.")).toBeTruthy();
    expect(screen.queryByTestId('pin-list')).toBeNull();
  });
});

describe('pin words', () => {
  it('firstWords drops markdown marks, raw tags and link targets, and cuts long text', () => {
    expect(firstWords('**Bold** _claim_ with [a link](javascript:alert(1)) and <img src=x onerror=alert(1)> end')).toBe('Bold claim with a link and end');
    expect(firstWords('one two three four five', 3)).toBe('one two three…');
    expect(firstWords('')).toBe('');
  });

  it('filterPins keeps the order and applies state and category together', () => {
    expect(filterPins(pins, { state: 'open', category: '' }).map((p) => p.id)).toEqual([1, 3]);
    expect(filterPins(pins, { state: 'all', category: 'fabrication' }).map((p) => p.id)).toEqual([2]);
    expect(filterPins(pins, { state: 'resolved', category: 'form' })).toEqual([]);
  });

  it('pinLabel names state, category, piece and orbit in words', () => {
    expect(pinLabel(pins[2])).toBe('Pin 3: open, outdated, Form, on panel-02 and its orbit');
  });
});

describe('newActivity', () => {
  const before = [pin({ id: 1, comments: [comment(10, 'a')] })];
  it('counts pins and replies others added, in words', () => {
    const after = [
      pin({ id: 1, comments: [comment(10, 'a'), comment(11, 'b', PARTICIPANT), comment(12, 'c', PARTICIPANT)] }),
      pin({ id: 2, author: { id: PARTICIPANT.id, name: PARTICIPANT.name } }),
    ];
    expect(newActivity(before, after, CRITIC.id)).toBe('1 new pin and 2 new replies');
  });

  it('leaves out what the person added themselves and optimistic entries', () => {
    const after = [pin({ id: 1, comments: [comment(10, 'a'), comment(11, 'mine', CRITIC)] }), pin({ id: 2 }), pin({ id: -4, author: { id: 99, name: 'x' } })];
    expect(newActivity(before, after, CRITIC.id)).toBeNull();
  });
});
