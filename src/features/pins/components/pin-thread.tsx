import { useId, useState } from 'react';
import { PIN_CATEGORIES, PIN_CATEGORY_LABELS, type Pin, type PinCategory, type PinState } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { describeError } from '../../../components/ui/error-state.js';
import { MarkdownView } from '../../../components/ui/markdown-view.js';
import { ROLE_LABELS, type AnyRole } from '../../../components/ui/role-badge.js';
import { formatDateTime } from '../../../lib/format.js';
import { useReplyToPin } from '../api/reply-to-pin.js';
import { useUpdatePin } from '../api/update-pin.js';
import { CommentBox } from './comment-box.js';
import { OutdatedBadge, PinNumber, PinStateBadge } from './pin-badges.js';

export interface PinThreadProps {
  pin: Pin;
  /** The revision the page shows (the cache the thread's changes go to). */
  revisionId: number;
  canReply: boolean;
  canResolve: boolean;
  canChangeCategory: boolean;
  /** Flies the model to the view the pin was placed from. */
  onShowView?: () => void;
  onClose(): void;
}

function roleLabel(role: string): string {
  return ROLE_LABELS[role as AnyRole] ?? role;
}

/**
 * One pin's thread: every comment as markdown (raw HTML never rendered) with author, role and
 * time; a reply box; Resolve or Reopen; and the category for its author or an instructor.
 */
export function PinThread({ pin, revisionId, canReply, canResolve, canChangeCategory, onShowView, onClose }: PinThreadProps) {
  const reply = useReplyToPin(revisionId);
  const update = useUpdatePin(revisionId);
  const [problem, setProblem] = useState<string | null>(null);
  const categoryId = useId();
  const headingId = useId();
  const saving = pin.id < 0;
  const change = (c: { state?: PinState; category?: PinCategory }) => {
    setProblem(null);
    update.mutate({ pinId: pin.id, change: c }, { onError: (e) => setProblem(describeError(e)) });
  };
  return (
    <section aria-labelledby={headingId} className="space-y-3 rounded-md border border-rule bg-paper px-3 py-3 text-sm" data-testid="pin-thread">
      <div className="flex items-start justify-between gap-2">
        <h3 id={headingId} className="flex flex-wrap items-center gap-2 font-semibold">
          <PinNumber number={pin.number} state={pin.state} />
          <span>
            Pin {pin.number}: {PIN_CATEGORY_LABELS[pin.category]}
          </span>
          <PinStateBadge state={pin.state} />
          {pin.outdated ? <OutdatedBadge /> : null}
        </h3>
        <Button variant="quiet" size="sm" onClick={onClose} aria-label={`Close the thread of pin ${pin.number}`}>
          Close
        </Button>
      </div>
      <p className="text-ink-soft">
        On <span className="font-mono text-ink">{pin.anchor.piece}</span>
        {pin.scope === 'orbit' ? ' and every piece of its orbit' : ''}, placed on revision {pin.placedOnRevision.number || '…'} by {pin.author.name}.
        {pin.resolvedBy && pin.state === 'resolved' ? ` Resolved by ${pin.resolvedBy.name}.` : ''}
      </p>
      {pin.outdated ? (
        <p className="rounded-md border border-dashed border-ink-soft px-2 py-1.5 text-ink-soft">
          Outdated: this pin stayed on this revision because its piece changed in the next.{pin.outdatedReason ? ` ${pin.outdatedReason}` : ''}
        </p>
      ) : null}
      {onShowView ? (
        <Button variant="secondary" size="sm" onClick={onShowView}>
          Show the pin's view
        </Button>
      ) : null}
      <ol className="space-y-3" aria-label={`Comments on pin ${pin.number}`}>
        {pin.comments.map((c) => (
          <li key={c.id} className="space-y-1 border-l-2 border-rule-strong pl-3">
            <p className="flex flex-wrap items-baseline gap-x-2 text-xs text-ink-soft">
              <span className="font-semibold text-ink">{c.author.name}</span>
              <span>{roleLabel(c.author.role)}</span>
              <time dateTime={c.createdAt}>{formatDateTime(c.createdAt)}</time>
            </p>
            <MarkdownView source={c.body} className="text-sm" />
          </li>
        ))}
      </ol>
      {saving ? <p className="text-ink-soft">Saving the pin…</p> : null}
      {!saving && (canResolve || canChangeCategory) ? (
        <div className="flex flex-wrap items-end gap-3">
          {canResolve ? (
            pin.state === 'open' ? (
              <Button variant="secondary" size="sm" pending={update.isPending} onClick={() => change({ state: 'resolved' })}>
                Resolve
              </Button>
            ) : (
              <Button variant="secondary" size="sm" pending={update.isPending} onClick={() => change({ state: 'open' })}>
                Reopen
              </Button>
            )
          ) : null}
          {canChangeCategory ? (
            <label htmlFor={categoryId} className="flex items-center gap-2">
              <span>Category</span>
              <select
                id={categoryId}
                value={pin.category}
                disabled={update.isPending}
                onChange={(e) => change({ category: e.target.value as PinCategory })}
                className="h-8 rounded-md border border-rule-strong bg-paper-raised py-1 pl-2 pr-1 text-sm focus-visible:outline-2 focus-visible:outline-offset-1 focus-visible:outline-accent"
              >
                {PIN_CATEGORIES.map((c) => (
                  <option key={c} value={c}>
                    {PIN_CATEGORY_LABELS[c]}
                  </option>
                ))}
              </select>
            </label>
          ) : null}
        </div>
      ) : null}
      <div aria-live="polite">{problem ? <p className="text-signal-error">{problem}</p> : null}</div>
      {!saving && canReply ? (
        <CommentBox
          label={`Reply to pin ${pin.number}`}
          submitLabel="Send reply"
          pendingLabel="Sending…"
          pending={reply.isPending}
          onSubmit={(body) => reply.mutateAsync({ pinId: pin.id, body })}
        />
      ) : null}
    </section>
  );
}
