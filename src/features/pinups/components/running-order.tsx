import { Link } from 'react-router-dom';
import type { PinupEntry } from '../../../../shared/api/critique.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { RevisionThumbnail } from '../../../components/ui/revision-thumbnail.js';
import { CriticsPicker, type CriticOption } from './critics-picker.js';

/**
 * A session's running order as a table: position, picture, participant, latest revision, open
 * and resolved pins, critics (with a picker for the instructor) and a link to the feedback.
 */
export function RunningOrder({
  entries,
  critics,
  onAssignCritics,
  presentHref,
}: {
  entries: PinupEntry[];
  /** The studio's critics; given with `onAssignCritics` to the instructor only. */
  critics?: CriticOption[];
  onAssignCritics?: (submissionId: number, userIds: number[]) => Promise<unknown>;
  /** Link to presentation mode at an entry (1-based position in the order). */
  presentHref?: (position: number) => string;
}) {
  if (entries.length === 0) {
    return <EmptyState title="The running order is empty">No submission is in this session that you may see.</EmptyState>;
  }
  const sorted = [...entries].sort((a, b) => a.position - b.position);
  return (
    <div className="overflow-x-auto rounded-lg border border-rule bg-paper-raised">
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">Running order</caption>
        <thead className="bg-paper-sunk/70">
          <tr>
            {['#', 'Picture', 'Participant', 'Latest revision', 'Pins', 'Critics', 'Feedback'].map((h) => (
              <th key={h} scope="col" className="whitespace-nowrap border-b border-rule px-3 py-2 font-mono text-xs font-medium uppercase tracking-wide text-ink-soft">
                {h === '#' ? <span aria-label="Position">#</span> : h}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {sorted.map((e, i) => (
            <tr key={e.submissionId} className="border-b border-rule/70 align-top last:border-b-0">
              <td className="px-3 py-2.5 font-mono text-xs text-ink-soft">{i + 1}</td>
              <td className="px-3 py-2.5">
                {e.latestRevision ? (
                  <RevisionThumbnail revisionId={e.latestRevision.id} alt={`Revision ${e.latestRevision.number} of ${e.participant.name}`} />
                ) : (
                  <span className="text-ink-soft">—</span>
                )}
              </td>
              <td className="px-3 py-2.5">
                <span className="font-medium">{e.participant.name}</span>
                {presentHref ? (
                  <Link to={presentHref(i + 1)} className="block text-xs" aria-label={`Present ${e.participant.name}`}>
                    Present from here
                  </Link>
                ) : null}
              </td>
              <td className="px-3 py-2.5">
                {e.latestRevision ? (
                  <Link to={`/revisions/${e.latestRevision.id}`} aria-label={`Revision ${e.latestRevision.number} of ${e.participant.name}`}>
                    Revision {e.latestRevision.number}
                  </Link>
                ) : (
                  <span className="text-ink-soft">None yet</span>
                )}
              </td>
              <td className="whitespace-nowrap px-3 py-2.5 font-mono">
                <span>{e.openPins} open</span>
                <span className="block text-xs text-ink-soft">{e.resolvedPins} resolved</span>
              </td>
              <td className="min-w-48 px-3 py-2.5">
                {critics && onAssignCritics ? (
                  <CriticsPicker
                    participantName={e.participant.name}
                    critics={critics}
                    assigned={e.critics}
                    onSave={(ids) => onAssignCritics(e.submissionId, ids)}
                  />
                ) : e.critics.length ? (
                  e.critics.map((c) => c.name).join(', ')
                ) : (
                  <span className="text-ink-soft">None assigned</span>
                )}
              </td>
              <td className="px-3 py-2.5">
                <Link to={`/submissions/${e.submissionId}/feedback`} aria-label={`Feedback on ${e.participant.name}`}>
                  Feedback
                </Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
