import type { BriefChange } from '../../../../shared/api/briefs.js';
import { EmptyState } from '../../../components/ui/empty-state.js';
import { formatDateTime } from '../../../lib/format.js';

/** What changed in a published brief, who changed it, and how many revisions were audited again. */
export function BriefChangelog({ changes }: { changes: BriefChange[] }) {
  if (changes.length === 0) {
    return <EmptyState title="No changes since publishing">Changes to a published brief are listed here for everyone in the studio.</EmptyState>;
  }
  return (
    <ol className="space-y-3" aria-label="Changelog">
      {changes.map((c) => (
        <li key={c.id} className="rounded-md border border-rule bg-paper/50 px-4 py-3">
          <p className="font-medium">{c.summary}</p>
          <p className="font-mono text-xs text-ink-soft">
            {formatDateTime(c.at)} · {c.by.name}
            {c.reaudited > 0 ? ` · ${c.reaudited} ${c.reaudited === 1 ? 'revision' : 'revisions'} audited again` : ''}
          </p>
          {c.details.length > 0 ? (
            <ul className="mt-2 list-disc space-y-0.5 pl-5 text-sm">
              {c.details.map((d, i) => (
                <li key={i}>{d}</li>
              ))}
            </ul>
          ) : null}
        </li>
      ))}
    </ol>
  );
}
