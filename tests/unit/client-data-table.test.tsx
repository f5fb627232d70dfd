// @vitest-environment jsdom
import { afterEach, describe, expect, it } from 'vitest';
import type { ColumnDef } from '@tanstack/react-table';
import { cleanup, fireEvent, render, screen, within } from '@testing-library/react';
import { DataTable } from '../../src/components/ui/data-table.js';

interface Row {
  name: string;
  role: string;
  joined: string;
}
const rows: Row[] = [
  { name: 'Oskar Lindqvist', role: 'participant', joined: '2026-03-02' },
  { name: 'Ada Brenn', role: 'instructor', joined: '2026-01-15' },
  { name: 'Mira Castell', role: 'critic', joined: '2026-02-20' },
];
const columns: ColumnDef<Row>[] = [
  { accessorKey: 'name', header: 'Name' },
  { accessorKey: 'role', header: 'Role' },
  { accessorKey: 'joined', header: 'Joined', enableSorting: false, enableGlobalFilter: false },
];

function renderTable(data = rows) {
  render(<DataTable data={data} columns={columns} caption="People" filterLabel="Filter people" emptyMessage="Nobody here yet." />);
  return screen.getByRole('table', { name: 'People' });
}
const firstColumn = (table: HTMLElement) =>
  within(table)
    .getAllByRole('row')
    .slice(1)
    .map((row) => within(row).getAllByRole('cell')[0].textContent);

afterEach(cleanup);

describe('DataTable', () => {
  it('sorts by a column when its header button is pressed, and reverses on the second press', () => {
    const table = renderTable();
    const nameHeader = within(table).getByRole('columnheader', { name: /Name/ });
    expect(nameHeader.getAttribute('aria-sort')).toBe('none');
    fireEvent.click(within(nameHeader).getByRole('button'));
    expect(firstColumn(table)).toEqual(['Ada Brenn', 'Mira Castell', 'Oskar Lindqvist']);
    expect(nameHeader.getAttribute('aria-sort')).toBe('ascending');
    fireEvent.click(within(nameHeader).getByRole('button'));
    expect(firstColumn(table)).toEqual(['Oskar Lindqvist', 'Mira Castell', 'Ada Brenn']);
    expect(nameHeader.getAttribute('aria-sort')).toBe('descending');
  });

  it('offers no sort button on a column that does not sort', () => {
    const table = renderTable();
    const joinedHeader = within(table).getByRole('columnheader', { name: 'Joined' });
    expect(within(joinedHeader).queryByRole('button')).toBeNull();
    expect(joinedHeader.hasAttribute('aria-sort')).toBe(false);
  });

  it('filters rows by every typed word, in any case, across the filterable columns', () => {
    const table = renderTable();
    fireEvent.change(screen.getByLabelText('Filter people'), { target: { value: 'CRITIC' } });
    expect(firstColumn(table)).toEqual(['Mira Castell']);
    fireEvent.change(screen.getByLabelText('Filter people'), { target: { value: 'brenn ada' } });
    expect(firstColumn(table)).toEqual(['Ada Brenn']);
    expect(screen.getByText('1 of 3 rows')).toBeTruthy();
  });

  it('when the filter matches nothing, says so rather than showing an empty grid', () => {
    renderTable();
    fireEvent.change(screen.getByLabelText('Filter people'), { target: { value: '2026-01' } });
    expect(screen.getByText('No rows match the filter.')).toBeTruthy();
  });

  it('when there are no rows at all, shows the empty message', () => {
    renderTable([]);
    expect(screen.getByText('Nobody here yet.')).toBeTruthy();
  });
});
