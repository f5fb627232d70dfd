import type { ColumnDef } from '@tanstack/react-table';
import { Link } from 'react-router-dom';
import type { SubmissionRow, SubmissionsQuery } from '../../../../shared/api/briefs.js';
import { AuditStateBadge } from '../../../components/ui/audit-state-badge.js';
import { DataTable } from '../../../components/ui/data-table.js';
import { RevisionThumbnail } from '../../../components/ui/revision-thumbnail.js';
import { MarkedBadge } from '../../../components/ui/marked-badge.js';
import { formatDateTime } from '../../../lib/format.js';

const CRITIQUE_WORDS: Record<SubmissionRow['critiqueState'], string> = {
  'not-started': 'Not started',
  'in-progress': 'In progress',
  released: 'Released',
};

const numberOrDash = (n: number | null) => (n === null ? '—' : n);

// Shape as well as colour: an open ring (nothing yet), a half ring (critics at work), a tick (released).
const CRITIQUE_MARKS: Record<SubmissionRow['critiqueState'], React.ReactNode> = {
  'not-started': <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.4" />,
  'in-progress': (
    <>
      <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.4" />
      <path d="M6 1.8a4.2 4.2 0 0 1 0 8.4z" fill="currentColor" />
    </>
  ),
  released: <path d="M2 6.4 4.8 9.2 10.2 2.8" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />,
};

const CRITIQUE_FRAMES: Record<SubmissionRow['critiqueState'], string> = {
  'not-started': 'border-rule-strong text-ink-soft bg-paper-raised',
  'in-progress': 'border-accent text-accent-strong bg-accent-wash',
  released: 'border-signal-ok text-signal-ok bg-signal-ok-wash',
};

/** The critique state of a submission as text with a mark. */
export function CritiqueStateBadge({ state }: { state: SubmissionRow['critiqueState'] }) {
  return (
    <MarkedBadge data-critique-state={state} frame={CRITIQUE_FRAMES[state]} mark={CRITIQUE_MARKS[state]}>
      <span>
        <span className="sr-only">Critique </span>
        {CRITIQUE_WORDS[state]}
      </span>
    </MarkedBadge>
  );
}

const columns: ColumnDef<SubmissionRow, any>[] = [
  {
    id: 'picture',
    header: 'Picture',
    enableSorting: false,
    enableGlobalFilter: false,
    cell: ({ row }) => {
      const r = row.original.latestRevision;
      return r ? <RevisionThumbnail revisionId={r.id} alt={`Revision ${r.number} of ${row.original.participant.name}`} /> : <span className="text-ink-soft">—</span>;
    },
  },
  {
    id: 'participant',
    accessorFn: (r) => `${r.participant.name} ${r.participant.email}`,
    header: 'Participant',
    sortingFn: (a, b) => a.original.participant.name.localeCompare(b.original.participant.name),
    cell: ({ row }) => (
      <span>
        <span className="block font-medium">{row.original.participant.name}</span>
        <span className="block font-mono text-xs text-ink-soft">{row.original.participant.email}</span>
      </span>
    ),
  },
  {
    id: 'revision',
    accessorFn: (r) => r.latestRevision?.number ?? 0,
    header: 'Latest revision',
    enableGlobalFilter: false,
    cell: ({ row }) => {
      const r = row.original.latestRevision;
      return r ? (
        <span>
          <Link to={`/revisions/${r.id}`} aria-label={`Revision ${r.number} of ${row.original.participant.name}`}>
            Revision {r.number}
          </Link>
          <span className="block font-mono text-xs text-ink-soft">{formatDateTime(r.createdAt)}</span>
        </span>
      ) : (
        <span className="text-ink-soft">None yet</span>
      );
    },
  },
  {
    id: 'audit',
    accessorFn: (r) => r.auditState ?? '',
    header: 'Audit',
    cell: ({ row }) => (row.original.auditState ? <AuditStateBadge state={row.original.auditState} /> : <span className="text-ink-soft">—</span>),
  },
  { id: 'errors', accessorFn: (r) => r.errors ?? -1, header: 'Errors', enableGlobalFilter: false, cell: ({ row }) => <span className={row.original.errors ? 'font-mono font-semibold text-signal-error' : 'font-mono'}>{numberOrDash(row.original.errors)}</span> },
  { id: 'warnings', accessorFn: (r) => r.warnings ?? -1, header: 'Warnings', enableGlobalFilter: false, cell: ({ row }) => <span className="font-mono">{numberOrDash(row.original.warnings)}</span> },
  { id: 'pieces', accessorFn: (r) => r.pieces ?? -1, header: 'Pieces', enableGlobalFilter: false, cell: ({ row }) => <span className="font-mono">{numberOrDash(row.original.pieces)}</span> },
  { id: 'sheets', accessorFn: (r) => r.sheets ?? -1, header: 'Sheets', enableGlobalFilter: false, cell: ({ row }) => <span className="font-mono">{numberOrDash(row.original.sheets)}</span> },
  {
    id: 'late',
    accessorFn: (r) => (r.late ? 'late' : ''),
    header: 'Late',
    cell: ({ row }) => (row.original.late ? <span className="rounded-sm border border-ink-soft px-1.5 font-mono text-xs">late</span> : <span className="text-ink-soft">on time</span>),
  },
  {
    id: 'critique',
    accessorFn: (r) => CRITIQUE_WORDS[r.critiqueState],
    header: 'Critique',
    cell: ({ row }) => (
      <span className="space-y-1">
        <CritiqueStateBadge state={row.original.critiqueState} />
        {row.original.critics.length ? <span className="block text-xs text-ink-soft">{row.original.critics.map((c) => c.name).join(', ')}</span> : <span className="block text-xs text-ink-soft">No critics assigned</span>}
        <Link to={`/submissions/${row.original.submissionId}/feedback`} className="block text-xs" aria-label={`Feedback on ${row.original.participant.name}`}>
          Feedback
        </Link>
      </span>
    ),
  },
];

const selectClasses =
  'block h-8 rounded-md border border-rule-strong bg-paper-raised py-1 pl-2 pr-1 text-sm focus-visible:outline-2 focus-visible:outline-accent';

/** The filters the server applies: audit state, errors, late. */
export function SubmissionFilters({ filters, onChange }: { filters: SubmissionsQuery; onChange: (filters: SubmissionsQuery) => void }) {
  return (
    <div className="flex flex-wrap items-end gap-4">
      <label className="space-y-1 text-sm font-medium">
        <span className="block">Audit state</span>
        <select className={selectClasses} value={filters.state ?? ''} onChange={(e) => onChange({ ...filters, state: (e.target.value || undefined) as SubmissionsQuery['state'] })}>
          <option value="">Any</option>
          <option value="queued">Queued</option>
          <option value="running">Running</option>
          <option value="done">Done</option>
          <option value="failed">Failed</option>
        </select>
      </label>
      <label className="space-y-1 text-sm font-medium">
        <span className="block">Errors</span>
        <select className={selectClasses} value={filters.hasErrors ?? ''} onChange={(e) => onChange({ ...filters, hasErrors: (e.target.value || undefined) as SubmissionsQuery['hasErrors'] })}>
          <option value="">Any</option>
          <option value="true">With errors</option>
          <option value="false">Without errors</option>
        </select>
      </label>
      <label className="space-y-1 text-sm font-medium">
        <span className="block">Lateness</span>
        <select className={selectClasses} value={filters.late ?? ''} onChange={(e) => onChange({ ...filters, late: (e.target.value || undefined) as SubmissionsQuery['late'] })}>
          <option value="">Any</option>
          <option value="true">Late</option>
          <option value="false">On time</option>
        </select>
      </label>
    </div>
  );
}

export function SubmissionsTable({ rows, toolbar }: { rows: SubmissionRow[]; toolbar?: React.ReactNode }) {
  return (
    <DataTable
      data={rows}
      columns={columns}
      caption="Submissions"
      toolbar={toolbar}
      filterLabel="Find a participant"
      filterPlaceholder="name or e-mail"
      initialSorting={[{ id: 'participant', desc: false }]}
      getRowId={(r) => String(r.submissionId)}
      emptyMessage="No submissions match. Participants appear here once they upload a revision."
    />
  );
}
