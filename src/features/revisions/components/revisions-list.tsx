import { Link } from 'react-router-dom';
import type { RevisionSummary } from '../../../../shared/api/revisions.js';
import { AuditStateBadge } from '../../../components/ui/audit-state-badge.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { formatDateTime } from '../../../lib/format.js';

function figuresText(r: RevisionSummary): string {
  if (!r.figures) return '';
  const f = r.figures;
  return `${f.errors} ${f.errors === 1 ? 'error' : 'errors'}, ${f.warnings} ${f.warnings === 1 ? 'warning' : 'warnings'}`;
}

/** A participant's revisions to one brief, newest first, each with its audit state. */
export function RevisionsList({ revisions }: { revisions: RevisionSummary[] }) {
  if (revisions.length === 0) {
    return <EmptyState title="No revisions yet">Upload your first revision below; its audit starts at once.</EmptyState>;
  }
  return (
    <ul className="divide-y divide-rule/80 rounded-lg border border-rule bg-paper-raised" aria-label="Your revisions">
      {[...revisions].reverse().map((r) => (
        <li key={r.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-2.5">
          <span className="flex flex-wrap items-center gap-2">
            <Link to={`/revisions/${r.id}`} className="font-semibold">
              Revision {r.number}
            </Link>
            <span className="text-sm text-ink-soft">{r.title}</span>
            {r.late ? <span className="rounded-sm border border-ink-soft px-1.5 font-mono text-xs">late</span> : null}
          </span>
          <span className="flex flex-wrap items-center gap-3">
            <AuditStateBadge state={r.auditState} detail={r.auditState === 'done' ? figuresText(r) : undefined} />
            <span className="font-mono text-xs text-ink-soft">{formatDateTime(r.createdAt)}</span>
          </span>
        </li>
      ))}
    </ul>
  );
}
