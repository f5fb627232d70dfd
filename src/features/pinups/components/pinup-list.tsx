import { Link } from 'react-router-dom';
import type { Pinup } from '../../../../shared/api/critique.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { formatDuration, formatPinupTime } from './pinup-words.js';
import { PinupStateBadge } from './pinup-state-badge.js';

/** The brief's pin-up sessions, soonest first: time in local time, room, state, entries. */
export function PinupList({ pinups, emptyHint }: { pinups: Pinup[]; emptyHint?: string }) {
  if (pinups.length === 0) {
    return <EmptyState title="No pin-ups scheduled">{emptyHint ?? 'When the instructor schedules a critique session for this brief it is listed here.'}</EmptyState>;
  }
  const sorted = [...pinups].sort((a, b) => Date.parse(a.startsAt) - Date.parse(b.startsAt) || a.id - b.id);
  return (
    <ul className="divide-y divide-rule rounded-lg border border-rule bg-paper-raised" aria-label="Pin-ups">
      {sorted.map((p) => (
        <li key={p.id} className="flex flex-wrap items-center justify-between gap-3 px-4 py-3">
          <div className="space-y-0.5">
            <Link to={`/pinups/${p.id}`} className="font-medium">
              {p.title}
            </Link>
            <p className="text-sm text-ink-soft">
              <time dateTime={p.startsAt}>{formatPinupTime(p)}</time>
              <span className="sr-only"> ({formatDuration(p.durationMinutes)})</span>
              {p.room ? <span> · {p.room}</span> : null}
              <span>
                {' '}
                · {p.entries.length} {p.entries.length === 1 ? 'entry' : 'entries'}
              </span>
            </p>
          </div>
          <PinupStateBadge state={p.state} />
        </li>
      ))}
    </ul>
  );
}
