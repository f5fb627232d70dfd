import { useId, useMemo, useState } from 'react';
import type { ColumnDef, ColumnFiltersState, FilterFn, SortingFn } from '@tanstack/react-table';
import { SeverityBadge, type SeverityName } from '../../../components/ui/audit-state-badge.js';
import { DataTable } from '../../../components/ui/data-table.js';

export interface FindingRow {
  code: string;
  severity: SeverityName;
  message: string;
  pieces: readonly string[];
}

const SEVERITIES: readonly SeverityName[] = ['error', 'warning', 'info'];
const RANK: Record<SeverityName, number> = { error: 0, warning: 1, info: 2 };
const PLURAL: Record<SeverityName, [string, string]> = {
  error: ['error', 'errors'],
  warning: ['warning', 'warnings'],
  info: ['info finding', 'info findings'],
};

const bySeverity: SortingFn<FindingRow> = (a, b) => RANK[a.original.severity] - RANK[b.original.severity];
const inSet: FilterFn<FindingRow> = (row, columnId, value: readonly string[] | undefined) =>
  !value || value.includes(String(row.getValue(columnId)));

const SHOWN_PIECES = 8;

/** The pieces a finding names; long lists fold away behind their count. */
export function PieceList({ pieces }: { pieces: readonly string[] }) {
  if (pieces.length === 0) return <span className="text-ink-faint">—</span>;
  const head = pieces.slice(0, SHOWN_PIECES);
  const rest = pieces.slice(SHOWN_PIECES);
  return (
    <span className="font-mono text-xs">
      {head.join(', ')}
      {rest.length > 0 ? (
        <details className="mt-1">
          <summary className="cursor-pointer text-accent">and {rest.length} more</summary>
          <span className="block pt-1">{rest.join(', ')}</span>
        </details>
      ) : null}
    </span>
  );
}

const columns: ColumnDef<FindingRow, any>[] = [
  {
    id: 'severity',
    accessorKey: 'severity',
    header: 'Severity',
    sortingFn: bySeverity,
    filterFn: inSet,
    enableGlobalFilter: false,
    cell: ({ row }) => <SeverityBadge severity={row.original.severity} />,
  },
  {
    id: 'code',
    accessorKey: 'code',
    header: 'Code',
    filterFn: inSet,
    cell: ({ row }) => <code className="whitespace-nowrap font-mono text-xs">{row.original.code}</code>,
  },
  { id: 'message', accessorKey: 'message', header: 'What to change', enableSorting: false, cell: ({ row }) => <span className="block min-w-64">{row.original.message}</span> },
  {
    id: 'pieces',
    accessorFn: (f) => f.pieces.join(' '),
    header: 'Pieces',
    sortingFn: (a, b) => a.original.pieces.length - b.original.pieces.length,
    cell: ({ row }) => <PieceList pieces={row.original.pieces} />,
  },
];

/** The last column when findings can be shown on the model: a button per finding with pieces. */
function showColumn(onSelect: (finding: FindingRow) => void, selected: FindingRow | null): ColumnDef<FindingRow, any> {
  return {
    id: 'show',
    header: 'Model',
    enableSorting: false,
    enableGlobalFilter: false,
    cell: ({ row }) => {
      const f = row.original;
      if (f.pieces.length === 0) return <span className="text-ink-faint">—</span>;
      const shown = f === selected;
      return (
        <button
          type="button"
          aria-pressed={shown}
          aria-label={`Show on model: ${f.code}, ${f.pieces.length} ${f.pieces.length === 1 ? 'piece' : 'pieces'}`}
          onClick={() => onSelect(f)}
          className={`whitespace-nowrap rounded-md border px-2 py-1 text-xs focus-visible:outline-2 focus-visible:outline-accent ${
            shown ? 'border-accent bg-accent text-paper' : 'border-rule-strong bg-paper-raised text-ink hover:border-accent'
          }`}
        >
          {shown ? 'Shown on model' : 'Show on model'}
        </button>
      );
    },
  };
}

export interface FindingsTableProps {
  findings: readonly FindingRow[];
  caption?: string;
  /** When given, each finding with pieces gets a "Show on model" button that calls this. */
  onSelectFinding?: (finding: FindingRow) => void;
  /** The finding shown on the model (compared by identity with an entry of `findings`). */
  selectedFinding?: FindingRow | null;
}

/**
 * The audit's findings: sortable by severity, code and number of pieces; filtered by severity
 * (check boxes with counts), by code, and by words (piece ids, message text). With
 * `onSelectFinding`, a last column offers to show each finding's pieces on the model.
 */
export function FindingsTable({ findings, caption = 'Findings of the audit', onSelectFinding, selectedFinding = null }: FindingsTableProps) {
  const [severities, setSeverities] = useState<SeverityName[]>([...SEVERITIES]);
  const [code, setCode] = useState('');
  const codeId = useId();
  const data = useMemo(() => [...findings], [findings]);
  const tableColumns = useMemo(() => (onSelectFinding ? [...columns, showColumn(onSelectFinding, selectedFinding)] : columns), [onSelectFinding, selectedFinding]);
  const counts = useMemo(() => {
    const c: Record<SeverityName, number> = { error: 0, warning: 0, info: 0 };
    for (const f of findings) c[f.severity] += 1;
    return c;
  }, [findings]);
  const codes = useMemo(() => [...new Set(findings.map((f) => f.code))].sort(), [findings]);

  // Memoised: a new filter array on every render makes the table reset its page index and
  // render again, without end.
  const columnFilters = useMemo(() => {
    const filters: ColumnFiltersState = [];
    if (severities.length < SEVERITIES.length) filters.push({ id: 'severity', value: severities });
    if (code) filters.push({ id: 'code', value: [code] });
    return filters;
  }, [severities, code]);

  const toggle = (s: SeverityName) =>
    setSeverities((current) => (current.includes(s) ? current.filter((x) => x !== s) : SEVERITIES.filter((x) => x === s || current.includes(x))));

  const toolbar = (
    <div className="flex flex-wrap items-end gap-x-6 gap-y-3">
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium">Severity</legend>
        <div className="flex flex-wrap gap-3 pt-1">
          {SEVERITIES.map((s) => (
            <label key={s} className="inline-flex items-center gap-1.5 text-sm">
              <input type="checkbox" checked={severities.includes(s)} onChange={() => toggle(s)} className="size-4 accent-accent" />
              <SeverityBadge severity={s} />
              <span className="font-mono text-xs text-ink-soft">
                {counts[s]} <span className="sr-only">{PLURAL[s][counts[s] === 1 ? 0 : 1]}</span>
              </span>
            </label>
          ))}
        </div>
      </fieldset>
      <div className="space-y-1">
        <label htmlFor={codeId} className="block text-sm font-medium">
          Code
        </label>
        <select
          id={codeId}
          value={code}
          onChange={(e) => setCode(e.target.value)}
          className="block h-8 rounded-md border border-rule-strong bg-paper-raised py-1 pl-2 pr-1 text-sm focus-visible:outline-2 focus-visible:outline-accent"
        >
          <option value="">All codes</option>
          {codes.map((c) => (
            <option key={c} value={c}>
              {c}
            </option>
          ))}
        </select>
      </div>
    </div>
  );

  return (
    <DataTable
      data={data}
      columns={tableColumns}
      caption={caption}
      toolbar={toolbar}
      filterLabel="Find pieces or words"
      filterPlaceholder="rib-03"
      columnFilters={columnFilters}
      initialSorting={[{ id: 'severity', desc: false }]}
      emptyMessage="No findings: the audit found nothing to change."
    />
  );
}
