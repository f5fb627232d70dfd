import type { PinState } from '../../../../shared/api/critique.js';
import { cn } from '../../../components/ui/cn.js';

/**
 * A pin's state as text with its own mark, matching the markers on the model: a filled round
 * head while open, a square with a tick once resolved.
 */
export function PinStateBadge({ state, className }: { state: PinState; className?: string }) {
  return (
    <span
      data-pin-state={state}
      className={cn(
        'inline-flex items-center gap-1 border px-1.5 py-0.5 text-xs font-medium leading-4 whitespace-nowrap',
        state === 'open' ? 'rounded-full border-accent bg-accent-wash text-accent-strong' : 'rounded-sm border-ink-soft bg-paper-raised text-ink-soft',
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 shrink-0">
        {state === 'open' ? (
          <circle cx="6" cy="6" r="4.2" fill="currentColor" />
        ) : (
          <>
            <rect x="1.5" y="1.5" width="9" height="9" rx="1" fill="none" stroke="currentColor" strokeWidth="1.3" />
            <path d="M3.4 6.2 5.2 8 8.6 4" fill="none" stroke="currentColor" strokeWidth="1.4" strokeLinecap="round" strokeLinejoin="round" />
          </>
        )}
      </svg>
      {state === 'open' ? 'Open' : 'Resolved'}
    </span>
  );
}

/** Marks a pin that stayed on this revision because its piece changed in the next. */
export function OutdatedBadge() {
  return <span className="inline-flex items-center rounded-sm border border-dashed border-ink-soft px-1.5 py-0.5 font-mono text-xs leading-4 text-ink-soft">outdated</span>;
}

/** The pin's number in the marker's shape (round while open, square once resolved). */
export function PinNumber({ number, state }: { number: number; state: PinState }) {
  return (
    <span
      aria-hidden="true"
      className={cn(
        'inline-flex size-6 shrink-0 items-center justify-center border-2 font-mono text-xs font-semibold',
        state === 'open' ? 'rounded-full border-accent bg-accent text-white' : 'rounded-[3px] border-ink-soft bg-paper-raised text-ink',
      )}
    >
      {number}
    </span>
  );
}
