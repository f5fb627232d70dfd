import type { PinupState } from '../../../../shared/api/critique.js';
import { MarkedBadge } from '../../../components/ui/marked-badge.js';

export const PINUP_STATE_LABELS: Readonly<Record<PinupState, string>> = {
  scheduled: 'Scheduled',
  running: 'Running',
  finished: 'Finished',
};

// Shape as well as colour: a dashed ring (to come), a filled dot (now), a tick (over).
function Mark({ state }: { state: PinupState }) {
  switch (state) {
    case 'scheduled':
      return <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.4" strokeDasharray="2 1.6" />;
    case 'running':
      return (
        <>
          <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.4" />
          <circle cx="6" cy="6" r="2.2" fill="currentColor" />
        </>
      );
    case 'finished':
      return <path d="M2 6.4 4.8 9.2 10.2 2.8" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />;
  }
}

const FRAMES: Record<PinupState, string> = {
  scheduled: 'border-dashed border-ink-soft text-ink-soft bg-paper-raised',
  running: 'border-solid border-accent text-accent-strong bg-accent-wash',
  finished: 'border-solid border-signal-ok text-signal-ok bg-signal-ok-wash',
};

/** A pin-up's state as text with a mark of its own. */
export function PinupStateBadge({ state, className }: { state: PinupState; className?: string }) {
  return (
    <MarkedBadge data-pinup-state={state} frame={FRAMES[state]} mark={<Mark state={state} />} className={className}>
      {PINUP_STATE_LABELS[state]}
    </MarkedBadge>
  );
}
