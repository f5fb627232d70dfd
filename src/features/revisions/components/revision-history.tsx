import { Link } from 'react-router-dom';
import type { HistoryEntry } from '../../../../shared/api/revisions.js';
import { AuditStateBadge } from '../../../components/ui/audit-state-badge.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { formatDateTime } from '../../../lib/format.js';

const FIGURE_WORDS: Record<string, string> = {
  errors: 'errors',
  warnings: 'warnings',
  components: 'components',
  joints: 'joints',
  sheets: 'sheets',
  pieces: 'pieces',
};

const count = (n: number, word: string) => `${n} ${word}${n === 1 ? '' : 's'}`;

function Change({ change }: { change: HistoryEntry['changes'][number] }) {
  return (
    <li className="flex items-center gap-1.5">
      <span aria-hidden="true" className={change.better ? 'text-signal-ok' : 'text-signal-error'}>
        {change.better ? '▲' : '▼'}
      </span>
      <span>
        <span className="font-medium">{change.better ? 'Better' : 'Worse'}:</span> {FIGURE_WORDS[change.figure] ?? change.figure} {change.from ?? '—'} → {change.to ?? '—'}
      </span>
    </li>
  );
}

/** Each revision's figures and what changed from the one before, newest first. */
export function RevisionHistory({ entries, currentRevisionId }: { entries: HistoryEntry[]; currentRevisionId?: number }) {
  if (entries.length === 0) return <EmptyState title="No revisions yet" />;
  const newestFirst = [...entries].reverse();
  return (
    <ol className="space-y-3" aria-label="Revision history">
      {newestFirst.map((e) => (
        <li key={e.revisionId} className="rounded-md border border-rule bg-paper/50 px-4 py-3" aria-current={e.revisionId === currentRevisionId ? 'page' : undefined}>
          <div className="flex flex-wrap items-center gap-x-3 gap-y-1">
            <Link to={`/revisions/${e.revisionId}`} className="font-semibold">
              Revision {e.number}
            </Link>
            {e.revisionId === currentRevisionId ? <span className="font-mono text-xs text-ink-soft">(this one)</span> : null}
            <AuditStateBadge state={e.auditState} />
            <span className="font-mono text-xs text-ink-soft">{formatDateTime(e.createdAt)}</span>
          </div>
          {e.figures ? (
            <p className="mt-1 font-mono text-xs text-ink-soft">
              {[
                count(e.figures.errors, 'error'),
                count(e.figures.warnings, 'warning'),
                count(e.figures.pieces, 'piece'),
                count(e.figures.components, 'component'),
                ...(e.figures.sheets !== null ? [count(e.figures.sheets, 'sheet')] : []),
              ].join(' · ')}
            </p>
          ) : null}
          {e.changes.length > 0 ? (
            <ul className="mt-2 space-y-0.5 text-sm">
              {e.changes.map((c) => (
                <Change key={c.figure} change={c} />
              ))}
            </ul>
          ) : null}
          {e.fixedCodes.length > 0 ? (
            <p className="mt-1 text-sm">
              Fixed: {e.fixedCodes.map((c) => <code key={c} className="mr-1 font-mono text-xs">{c}</code>)}
            </p>
          ) : null}
          {e.newCodes.length > 0 ? (
            <p className="mt-1 text-sm">
              New: {e.newCodes.map((c) => <code key={c} className="mr-1 font-mono text-xs">{c}</code>)}
            </p>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
