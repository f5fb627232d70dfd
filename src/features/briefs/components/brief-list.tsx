import { Link } from 'react-router-dom';
import type { Brief } from '../../../../shared/api/briefs.js';
import { AuditStateBadge } from '../../../components/ui/audit-state-badge.js';
import { formatDateTime, formatTimeLeft } from '../../../lib/format.js';
import { BriefStateBadge } from './brief-state-badge.js';
import { describeGroup } from './brief-words.js';

/** The briefs of a studio, newest deadline last; each links to its page. */
export function BriefList({ briefs, canManage }: { briefs: Brief[]; canManage: boolean }) {
  const order = { published: 0, draft: 1, closed: 2 } as const;
  const sorted = [...briefs].sort((a, b) => order[a.state] - order[b.state] || a.deadline.localeCompare(b.deadline));
  return (
    <ul className="divide-y divide-rule/80 rounded-lg border border-rule bg-paper-raised" aria-label="Briefs">
      {sorted.map((b) => (
        <li key={b.id} className="flex flex-wrap items-center justify-between gap-x-6 gap-y-2 px-4 py-3">
          <div className="min-w-0 space-y-1">
            <div className="flex flex-wrap items-center gap-2">
              <Link to={`/briefs/${b.id}`} className="text-base font-semibold">
                {b.title}
              </Link>
              <BriefStateBadge state={b.state} />
            </div>
            <p className="text-sm text-ink-soft">
              {b.constraints.allowedGroups.map(describeGroup).join(', ')}
              {b.material ? ` · ${b.material.name}` : ''}
            </p>
          </div>
          <div className="flex flex-wrap items-center gap-3 text-sm">
            {b.mySubmission?.auditState ? (
              <span className="inline-flex items-center gap-1.5">
                Your revision {b.mySubmission.latestRevision ?? '—'} <AuditStateBadge state={b.mySubmission.auditState} />
              </span>
            ) : null}
            <span className="text-right">
              <span className="block font-mono text-xs text-ink-soft">Deadline {formatDateTime(b.deadline)}</span>
              {b.state === 'published' ? <span className="block text-xs">{formatTimeLeft(b.deadline)}</span> : null}
            </span>
            {canManage ? (
              <span className="flex gap-2">
                <Link to={`/briefs/${b.id}/edit`} className="text-sm" aria-label={`Edit ${b.title}`}>
                  Edit
                </Link>
                {b.state !== 'draft' ? (
                  <Link to={`/briefs/${b.id}/submissions`} className="text-sm" aria-label={`Submissions to ${b.title}`}>
                    Submissions
                  </Link>
                ) : null}
              </span>
            ) : null}
          </div>
        </li>
      ))}
    </ul>
  );
}
