// @vitest-environment jsdom
import { useState } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { FindingsTable, type FindingRow } from '../../src/features/revisions/components/findings-table.js';

const findings: FindingRow[] = [
  { code: 'short-joint', severity: 'warning', message: 'The joint between rib-01 and cap-02 is 4.1 mm long.', pieces: ['rib-01', 'cap-02'] },
  { code: 'coplanar-merge', severity: 'info', message: 'Images of cap were unioned on 12 planes.', pieces: ['cap-01'] },
  { code: 'disconnected', severity: 'error', message: 'The pieces form 2 separate groups.', pieces: Array.from({ length: 12 }, (_, i) => `keel-${String(i + 1).padStart(2, '0')}`) },
  { code: 'short-joint', severity: 'warning', message: 'The joint between rib-03 and cap-04 is 3.0 mm long.', pieces: ['rib-03', 'cap-04'] },
];

function renderTable(data = findings) {
  render(<FindingsTable findings={data} />);
  return screen.getByRole('table', { name: 'Findings of the audit' });
}
const codes = (table: HTMLElement) =>
  within(table)
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[1].textContent);

afterEach(cleanup);

describe('FindingsTable', () => {
  it('lists errors first, then warnings, then info, each with its severity in words', () => {
    const table = renderTable();
    expect(codes(table)).toEqual(['disconnected', 'short-joint', 'short-joint', 'coplanar-merge']);
    const firstRow = within(table).getAllByRole('row')[1];
    expect(within(firstRow).getAllByRole('cell')[0].textContent).toBe('Error');
  });

  it('reverses the severity order when its header is pressed again', () => {
    const table = renderTable();
    const header = within(table).getByRole('columnheader', { name: /Severity/ });
    fireEvent.click(within(header).getByRole('button'));
    expect(header.getAttribute('aria-sort')).toBe('descending');
    expect(codes(table)[0]).toBe('coplanar-merge');
  });

  it('hides a severity when its box is cleared and says how many rows remain', () => {
    const table = renderTable();
    fireEvent.click(screen.getByRole('checkbox', { name: /Warning/ }));
    expect(codes(table)).toEqual(['disconnected', 'coplanar-merge']);
    expect(screen.getByText('2 of 4 rows')).toBeTruthy();
  });

  it('filters by code from the codes present', () => {
    const table = renderTable();
    const select = screen.getByLabelText('Code');
    const options = within(select).getAllByRole('option').map((o) => o.textContent);
    expect(options).toEqual(['All codes', 'coplanar-merge', 'disconnected', 'short-joint']);
    fireEvent.change(select, { target: { value: 'short-joint' } });
    expect(codes(table)).toEqual(['short-joint', 'short-joint']);
  });

  it('finds findings by a piece id typed into the search box', () => {
    const table = renderTable();
    fireEvent.change(screen.getByLabelText('Find pieces or words'), { target: { value: 'cap-04' } });
    expect(codes(table)).toEqual(['short-joint']);
    expect(within(table).getByText(/rib-03, cap-04/)).toBeTruthy();
  });

  it('names every piece of a finding, folding a long list behind its count', () => {
    const table = renderTable();
    const row = within(table).getAllByRole('row')[1];
    expect(row.textContent).toContain('keel-01, keel-02');
    expect(within(row).getByText('and 4 more')).toBeTruthy();
    expect(row.textContent).toContain('keel-12');
  });

  it('says so when the audit found nothing', () => {
    renderTable([]);
    expect(screen.getByText('No findings: the audit found nothing to change.')).toBeTruthy();
  });

  it('without a handler there is no column for the model', () => {
    const table = renderTable();
    expect(within(table).queryAllByRole('button', { name: /Show on model/ })).toHaveLength(0);
  });

  it('with a handler each finding with pieces gets a button named by its code; pressing it hands over that finding and marks it', () => {
    const chosen: FindingRow[] = [];
    function Harness() {
      const [selected, setSelected] = useState<FindingRow | null>(null);
      return (
        <FindingsTable
          findings={[...findings, { code: 'no-pieces', severity: 'info', message: 'Nothing to point at.', pieces: [] }]}
          selectedFinding={selected}
          onSelectFinding={(f) => {
            chosen.push(f);
            setSelected(f);
          }}
        />
      );
    }
    render(<Harness />);
    const table = screen.getByRole('table', { name: 'Findings of the audit' });
    const buttons = within(table).getAllByRole('button', { name: /^Show on model:/ });
    // Four findings name pieces; the fifth names none and gets no button.
    expect(buttons).toHaveLength(4);
    const button = within(table).getByRole('button', { name: 'Show on model: disconnected, 12 pieces' });
    expect(button.getAttribute('aria-pressed')).toBe('false');
    fireEvent.click(button);
    expect(chosen.map((f) => f.code)).toEqual(['disconnected']);
    expect(chosen[0].pieces).toHaveLength(12);
    const pressed = within(table).getByRole('button', { name: 'Show on model: disconnected, 12 pieces' });
    expect(pressed.getAttribute('aria-pressed')).toBe('true');
    expect(pressed.textContent).toBe('Shown on model');
    // Sorting and the other rows are unchanged by the choice.
    expect(codes(table)).toEqual(['disconnected', 'short-joint', 'short-joint', 'coplanar-merge', 'no-pieces']);
    expect(within(table).getByRole('button', { name: 'Show on model: coplanar-merge, 1 piece' }).getAttribute('aria-pressed')).toBe('false');
  });
});
