import { useId, useState, type ReactNode } from 'react';
import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type ColumnFiltersState,
  type FilterFn,
  type SortingState,
} from '@tanstack/react-table';
import { cn } from './cn.js';

// One shared empty state: a fresh `[]` per render would make the table reset and render again.
const NO_FILTERS: ColumnFiltersState = [];

// A row matches when one of its cells contains every typed word (any order, any case).
const containsAllWords: FilterFn<unknown> = (row, columnId, filterValue) => {
  const words = String(filterValue ?? '')
    .toLowerCase()
    .split(/\s+/)
    .filter(Boolean);
  if (words.length === 0) return true;
  const value = row.getValue<unknown>(columnId);
  const text = (Array.isArray(value) ? value.join(' ') : String(value ?? '')).toLowerCase();
  return words.every((w) => text.includes(w));
};

export interface DataTableProps<T> {
  data: T[];
  columns: ColumnDef<T, any>[];
  /** Names the table for assistive technology (visually hidden caption). */
  caption: string;
  /** Label of the filter box; omit to hide the box. */
  filterLabel?: string;
  filterPlaceholder?: string;
  initialSorting?: SortingState;
  getRowId?: (row: T) => string;
  emptyMessage?: string;
  /**
   * Filters held by the caller (its own controls, e.g. severity checkboxes), applied with each
   * column's `filterFn`; shown above the table through `toolbar`.
   */
  columnFilters?: ColumnFiltersState;
  toolbar?: ReactNode;
}

function SortMark({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 10 14" className={cn('h-3.5 w-2.5', direction ? 'text-accent' : 'text-ink-faint')}>
      <path d="M5 1 9 6H1z" fill={direction === 'asc' ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth="1" />
      <path d="M5 13 1 8h8z" fill={direction === 'desc' ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth="1" />
    </svg>
  );
}

/** A sortable, filterable table over TanStack Table; columns decide what sorts. */
export function DataTable<T>({
  data,
  columns,
  caption,
  filterLabel,
  filterPlaceholder,
  initialSorting = [],
  getRowId,
  emptyMessage = 'Nothing to show yet.',
  columnFilters,
  toolbar,
}: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState('');
  const filterId = useId();

  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter, columnFilters: columnFilters ?? NO_FILTERS },
    onSortingChange: setSorting,
    onGlobalFilterChange: setGlobalFilter,
    globalFilterFn: containsAllWords as FilterFn<T>,
    getColumnCanGlobalFilter: (column) => column.columnDef.enableGlobalFilter !== false && column.accessorFn !== undefined,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getRowId: getRowId ? (row) => getRowId(row) : undefined,
  });

  const rows = table.getRowModel().rows;
  const total = data.length;

  return (
    <div className="space-y-3">
      {filterLabel || toolbar ? (
        <div className="flex flex-wrap items-end justify-between gap-3">
          {toolbar}
          {filterLabel ? (
            <div className="w-full max-w-xs space-y-1">
              <label htmlFor={filterId} className="block text-sm font-medium">
                {filterLabel}
              </label>
              <input
                id={filterId}
                type="search"
                value={globalFilter}
                placeholder={filterPlaceholder}
                onChange={(e) => setGlobalFilter(e.target.value)}
                className="block w-full rounded-md border border-rule-strong bg-paper-raised px-3 py-1.5 text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent"
              />
            </div>
          ) : null}
          <p className="font-mono text-xs text-ink-soft" aria-live="polite">
            {rows.length === total ? `${total} ${total === 1 ? 'row' : 'rows'}` : `${rows.length} of ${total} rows`}
          </p>
        </div>
      ) : null}
      <div className="overflow-x-auto rounded-lg border border-rule bg-paper-raised">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead className="bg-paper-sunk/70">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const canSort = header.column.getCanSort();
                  const sorted = header.column.getIsSorted();
                  const label = header.isPlaceholder ? null : flexRender(header.column.columnDef.header, header.getContext());
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : canSort ? 'none' : undefined}
                      className="whitespace-nowrap border-b border-rule px-3 py-2 font-mono text-xs font-medium uppercase tracking-wide text-ink-soft"
                    >
                      {canSort ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1.5 rounded-sm uppercase hover:text-ink focus-visible:outline-2 focus-visible:outline-accent"
                        >
                          {label}
                          <SortMark direction={sorted} />
                        </button>
                      ) : (
                        label
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.length === 0 ? (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-8 text-center text-ink-soft">
                  {total === 0 ? emptyMessage : 'No rows match the filter.'}
                </td>
              </tr>
            ) : (
              rows.map((row) => (
                <tr key={row.id} className="border-b border-rule/70 last:border-b-0 hover:bg-paper/60">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2.5 align-middle">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>
    </div>
  );
}
