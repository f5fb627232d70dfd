import { useEffect, useRef, type ReactNode } from 'react';
import type { Pinup, PinupEntry } from '../../../../shared/api/critique.js';
import { Button } from '../../../components/ui/button.js';
import { PinupStateBadge } from './pinup-state-badge.js';

export type PresentationAction = 'next' | 'previous' | 'next-pin' | 'previous-pin' | 'exit';

/** Elements where keys belong to the control (typing a reply, choosing in a list). */
function ownsKeys(target: EventTarget | null): boolean {
  if (!target || typeof (target as Element).closest !== 'function') return false;
  const el = target as HTMLElement;
  return Boolean(el.closest('input, textarea, select, [contenteditable=""], [contenteditable="true"], [role="listbox"], [role="slider"], [data-own-keys]'));
}

/**
 * What a key does in presentation mode: → and ← step through the entries, ↓ and ↑ through the
 * current entry's open pins, Escape leaves. Keys typed into a field (or pressed with a modifier)
 * do nothing here, so replying to a pin stays possible.
 */
export function presentationKeyAction(event: Pick<KeyboardEvent, 'key' | 'target' | 'altKey' | 'ctrlKey' | 'metaKey' | 'shiftKey' | 'defaultPrevented'>): PresentationAction | null {
  if (event.defaultPrevented || event.altKey || event.ctrlKey || event.metaKey || event.shiftKey) return null;
  if (ownsKeys(event.target)) return null;
  switch (event.key) {
    case 'ArrowRight':
      return 'next';
    case 'ArrowLeft':
      return 'previous';
    case 'ArrowDown':
      return 'next-pin';
    case 'ArrowUp':
      return 'previous-pin';
    case 'Escape':
      return 'exit';
    default:
      return null;
  }
}

/** The entries of a session in running order. */
export function orderedEntries(pinup: Pick<Pinup, 'entries'>): PinupEntry[] {
  return [...pinup.entries].sort((a, b) => a.position - b.position);
}

/** Clamps a 1-based position read from the address (`?entry=3`) to the entries there are. */
export function entryIndexFrom(raw: string | null, count: number): number {
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1 || count === 0) return 0;
  return Math.min(n, count) - 1;
}

export interface StagePin {
  id: number;
  number: number;
  /** A few words shown in the stepper ("Fabrication · rib-03"). */
  label: string;
}

/**
 * Presentation mode's frame: the session's title, the entry's participant and position ("3 of
 * 8"), Previous and Next, the open-pin stepper of the entry, and the model given as `children`.
 * Keys work anywhere on the page (see {@link presentationKeyAction}).
 */
export function PresentationStage({
  pinup,
  index,
  onIndexChange,
  pins,
  pinIndex,
  onPinIndexChange,
  onExit,
  children,
}: {
  pinup: Pinup;
  index: number;
  onIndexChange: (index: number) => void;
  /** Open pins of the current entry in order; null while they load or when they cannot be had. */
  pins: StagePin[] | null;
  /** Index into `pins`, or null when no pin is selected (the whole model). */
  pinIndex: number | null;
  onPinIndexChange: (index: number | null) => void;
  onExit: () => void;
  children: ReactNode;
}) {
  const entries = orderedEntries(pinup);
  const count = entries.length;
  const entry = entries[index];
  const headingRef = useRef<HTMLHeadingElement>(null);

  // The latest values for the key handler, which is attached once.
  const live = useRef({ index, count, pins, pinIndex, onIndexChange, onPinIndexChange, onExit });
  live.current = { index, count, pins, pinIndex, onIndexChange, onPinIndexChange, onExit };

  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      const action = presentationKeyAction(event);
      if (!action) return;
      const s = live.current;
      event.preventDefault();
      if (action === 'exit') s.onExit();
      else if (action === 'next' && s.index < s.count - 1) s.onIndexChange(s.index + 1);
      else if (action === 'previous' && s.index > 0) s.onIndexChange(s.index - 1);
      else if (action === 'next-pin' && s.pins?.length) s.onPinIndexChange(s.pinIndex === null ? 0 : Math.min(s.pinIndex + 1, s.pins.length - 1));
      else if (action === 'previous-pin' && s.pins?.length && s.pinIndex !== null) s.onPinIndexChange(s.pinIndex === 0 ? null : s.pinIndex - 1);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, []);

  // A new entry is announced by moving focus to its heading.
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      return;
    }
    headingRef.current?.focus();
  }, [index]);

  const pin = pins && pinIndex !== null ? pins[pinIndex] : null;

  return (
    <div className="flex min-h-screen flex-col bg-paper">
      <header className="flex flex-wrap items-center justify-between gap-3 border-b border-rule bg-paper-raised px-4 py-3 sm:px-6">
        <div className="min-w-0 space-y-0.5">
          <p className="flex items-center gap-2 font-mono text-xs uppercase tracking-[0.14em] text-ink-soft">
            <span className="truncate">{pinup.title}</span>
            <PinupStateBadge state={pinup.state} />
          </p>
          <h1 ref={headingRef} tabIndex={-1} className="text-2xl font-semibold outline-none focus-visible:outline-2 focus-visible:outline-accent">
            {entry ? entry.participant.name : 'No entries'}
            {entry?.latestRevision ? <span className="ml-3 text-base font-normal text-ink-soft">revision {entry.latestRevision.number}</span> : null}
          </h1>
          {entry ? (
            <p className="text-sm text-ink-soft">
              {entry.critics.length ? `Critics: ${entry.critics.map((c) => c.name).join(', ')}` : 'No critics assigned'} · {entry.openPins} open, {entry.resolvedPins} resolved
            </p>
          ) : null}
        </div>
        <nav aria-label="Running order" className="flex flex-wrap items-center gap-2">
          <Button variant="secondary" onClick={() => onIndexChange(index - 1)} disabled={index <= 0} aria-keyshortcuts="ArrowLeft">
            <span aria-hidden="true">←</span> Previous entry
          </Button>
          <p className="min-w-20 text-center font-mono text-sm" aria-live="polite" aria-atomic="true">
            {count ? `${index + 1} of ${count}` : '0 of 0'}
          </p>
          <Button variant="secondary" onClick={() => onIndexChange(index + 1)} disabled={index >= count - 1} aria-keyshortcuts="ArrowRight">
            Next entry <span aria-hidden="true">→</span>
          </Button>
          <Button variant="quiet" onClick={onExit} aria-keyshortcuts="Escape">
            Leave presentation
          </Button>
        </nav>
      </header>

      {entry ? (
        <div className="flex flex-wrap items-center gap-3 border-b border-rule/70 px-4 py-2 text-sm sm:px-6" aria-label="Open pins of this entry" role="group">
          {pins === null ? (
            <span className="text-ink-soft">Loading the pins…</span>
          ) : pins.length === 0 ? (
            <span className="text-ink-soft">No open pins on this revision.</span>
          ) : (
            <>
              <Button variant="secondary" size="sm" onClick={() => onPinIndexChange(pinIndex === null || pinIndex === 0 ? null : pinIndex - 1)} disabled={pinIndex === null} aria-keyshortcuts="ArrowUp">
                Previous pin
              </Button>
              <span aria-live="polite" aria-atomic="true" className="font-mono">
                {pin ? `Pin ${pin.number} · ${pinIndex! + 1} of ${pins.length} open` : `${pins.length} open ${pins.length === 1 ? 'pin' : 'pins'} · whole model`}
              </span>
              {pin ? <span className="text-ink-soft">{pin.label}</span> : null}
              <Button
                variant="secondary"
                size="sm"
                onClick={() => onPinIndexChange(pinIndex === null ? 0 : pinIndex + 1)}
                disabled={pinIndex !== null && pinIndex >= pins.length - 1}
                aria-keyshortcuts="ArrowDown"
              >
                Next pin
              </Button>
            </>
          )}
          <span className="ml-auto font-mono text-xs text-ink-soft">Keys: ← → entries · ↑ ↓ pins · Esc leaves</span>
        </div>
      ) : null}

      <main id="main" tabIndex={-1} className="flex-1 px-4 py-4 outline-none sm:px-6">
        {children}
      </main>
    </div>
  );
}
