import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button.js';
import { InlineSelect } from '../../../components/ui/field.js';

/** A submission that can be put in the running order. */
export interface RunningOrderOption {
  submissionId: number;
  participantName: string;
  /** Latest revision number, or null when the participant has not uploaded one. */
  latestRevision: number | null;
}

/** Moves the item at `index` by `delta` places (−1 up, +1 down); out of range: unchanged. */
export function moveItem<T>(list: readonly T[], index: number, delta: number): T[] {
  const to = index + delta;
  if (index < 0 || index >= list.length || to < 0 || to >= list.length) return [...list];
  const next = [...list];
  const [item] = next.splice(index, 1);
  next.splice(to, 0, item);
  return next;
}

/**
 * The running order of a session as a numbered list with move up, move down and remove buttons
 * (no dragging needed), and a chooser that adds a submission at the end. Controlled: `value` is
 * the submission ids in order. After a move the moved row's button keeps focus.
 */
export function RunningOrderEditor({
  value,
  onChange,
  options,
  error,
  labelId,
}: {
  value: number[];
  onChange: (ids: number[]) => void;
  options: RunningOrderOption[];
  error?: string;
  /** Id of the element that names this control (the form's legend). */
  labelId?: string;
}) {
  const byId = new Map(options.map((o) => [o.submissionId, o]));
  const left = options.filter((o) => !value.includes(o.submissionId)).sort((a, b) => a.participantName.localeCompare(b.participantName));
  const [choice, setChoice] = useState('');
  const chooserId = useId();
  const chosen = left.some((o) => String(o.submissionId) === choice) ? choice : (left[0] ? String(left[0].submissionId) : '');
  const name = (id: number) => byId.get(id)?.participantName ?? `Submission ${id}`;

  const move = (index: number, delta: number) => {
    const id = value[index];
    onChange(moveItem(value, index, delta));
    // Keep the keyboard on the moved row: the same button, or the other one once it reaches an end.
    requestAnimationFrame(() => {
      const row = document.querySelector(`[data-order-row="${id}"]`);
      const same = row?.querySelector<HTMLButtonElement>(`[data-move="${delta < 0 ? 'up' : 'down'}"]:not(:disabled)`);
      (same ?? row?.querySelector<HTMLButtonElement>(`[data-move="${delta < 0 ? 'down' : 'up'}"]`))?.focus();
    });
  };

  return (
    <div className="space-y-3" aria-labelledby={labelId} role="group">
      {value.length === 0 ? (
        <p className="rounded-md border border-dashed border-rule-strong px-3 py-3 text-sm text-ink-soft">
          No entries chosen: the session takes every submission with a revision, in the participants’ name order.
        </p>
      ) : (
        <ol className="divide-y divide-rule rounded-md border border-rule bg-paper-raised" aria-label="Running order">
          {value.map((id, i) => {
            const option = byId.get(id);
            return (
              <li key={id} data-order-row={id} className="flex flex-wrap items-center justify-between gap-2 px-3 py-2">
                <span className="flex items-baseline gap-3">
                  <span className="w-6 text-right font-mono text-xs text-ink-soft">{i + 1}.</span>
                  <span>
                    <span className="font-medium">{name(id)}</span>
                    <span className="ml-2 text-xs text-ink-soft">{option?.latestRevision ? `revision ${option.latestRevision}` : 'no revision yet'}</span>
                  </span>
                </span>
                <span className="flex gap-1">
                  <Button variant="secondary" size="sm" data-move="up" disabled={i === 0} aria-label={`Move ${name(id)} up`} onClick={() => move(i, -1)}>
                    <span aria-hidden="true">↑</span> Up
                  </Button>
                  <Button
                    variant="secondary"
                    size="sm"
                    data-move="down"
                    disabled={i === value.length - 1}
                    aria-label={`Move ${name(id)} down`}
                    onClick={() => move(i, 1)}
                  >
                    <span aria-hidden="true">↓</span> Down
                  </Button>
                  <Button variant="quiet" size="sm" aria-label={`Remove ${name(id)} from the running order`} onClick={() => onChange(value.filter((v) => v !== id))}>
                    Remove
                  </Button>
                </span>
              </li>
            );
          })}
        </ol>
      )}
      {error ? (
        <p className="flex items-start gap-1.5 text-sm text-signal-error">
          <span aria-hidden="true" className="mt-[0.3rem] inline-block size-2 shrink-0 rotate-45 bg-signal-error" />
          <span>{error}</span>
        </p>
      ) : null}
      {left.length > 0 ? (
        <div className="flex flex-wrap items-end gap-2">
          <div className="space-y-1">
            <label htmlFor={chooserId} className="block text-sm font-medium">
              Add a submission
            </label>
            <InlineSelect id={chooserId} value={chosen} onChange={(e) => setChoice(e.target.value)}>
              {left.map((o) => (
                <option key={o.submissionId} value={o.submissionId}>
                  {o.participantName}
                  {o.latestRevision ? ` (revision ${o.latestRevision})` : ' (no revision yet)'}
                </option>
              ))}
            </InlineSelect>
          </div>
          <Button variant="secondary" size="sm" disabled={!chosen} onClick={() => chosen && onChange([...value, Number(chosen)])}>
            Add to the running order
          </Button>
          <Button
            variant="quiet"
            size="sm"
            onClick={() => onChange([...value, ...left.filter((o) => o.latestRevision !== null).map((o) => o.submissionId)])}
            disabled={!left.some((o) => o.latestRevision !== null)}
          >
            Add all with a revision
          </Button>
        </div>
      ) : options.length === 0 ? (
        <p className="text-sm text-ink-soft">This brief has no submissions yet.</p>
      ) : null}
    </div>
  );
}
