import { cn } from './cn.js';
import { MarkedBadge } from './marked-badge.js';

export type AuditStateName = 'queued' | 'running' | 'done' | 'failed';

const LABELS: Record<AuditStateName, string> = {
  queued: 'Queued',
  running: 'Running',
  done: 'Done',
  failed: 'Failed',
};

// Each state has its own mark (empty ring, half-filled ring, tick, cross) and its own frame
// (dashed, dotted, solid, double), so the state reads from text and shape, not colour alone.
function Mark({ state }: { state: AuditStateName }) {
  switch (state) {
    case 'queued':
      return <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.4" strokeDasharray="2 1.6" />;
    case 'running':
      return (
        <g className="origin-center motion-safe:animate-spin [animation-duration:2.4s]">
          <circle cx="6" cy="6" r="4.2" fill="none" stroke="currentColor" strokeWidth="1.4" />
          <path d="M6 1.8a4.2 4.2 0 0 1 0 8.4z" fill="currentColor" />
        </g>
      );
    case 'done':
      return <path d="M2 6.4 4.8 9.2 10.2 2.8" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />;
    case 'failed':
      return <path d="M2.5 2.5 9.5 9.5M9.5 2.5 2.5 9.5" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />;
  }
}

const FRAMES: Record<AuditStateName, string> = {
  queued: 'border-dashed border-ink-soft text-ink-soft bg-paper-raised',
  running: 'border-dotted border-accent text-accent-strong bg-accent-wash',
  done: 'border-solid border-signal-ok text-signal-ok bg-signal-ok-wash',
  failed: 'border-double border-[3px] py-px border-signal-error text-signal-error bg-signal-error-wash',
};

/**
 * The audit's state as text with a mark: queued → running → done / failed. `detail` adds a short
 * figure after the state ("3 errors"). The label is announced politely when it changes.
 */
export function AuditStateBadge({ state, detail, className }: { state: AuditStateName; detail?: string; className?: string }) {
  return (
    <MarkedBadge data-audit-state={state} frame={FRAMES[state]} mark={<Mark state={state} />} className={className}>
      <span>
        <span className="sr-only">Audit </span>
        {LABELS[state]}
        {detail ? <span className="font-normal"> · {detail}</span> : null}
      </span>
    </MarkedBadge>
  );
}

export type SeverityName = 'error' | 'warning' | 'info';

const SEVERITY_LABELS: Record<SeverityName, string> = { error: 'Error', warning: 'Warning', info: 'Info' };

const SEVERITY_MARKS: Record<SeverityName, { d: string; filled: boolean }> = {
  error: { d: 'M6 1.2 10.8 6 6 10.8 1.2 6z', filled: true }, // solid diamond
  warning: { d: 'M6 1.5 10.8 10H1.2z', filled: false }, // open triangle
  info: { d: 'M6 1.8a4.2 4.2 0 1 1 0 8.4a4.2 4.2 0 1 1 0-8.4z', filled: false }, // open ring
};

const SEVERITY_FRAMES: Record<SeverityName, string> = {
  error: 'border-signal-error text-signal-error bg-signal-error-wash',
  warning: 'border-ink-soft text-ink bg-paper-sunk',
  info: 'border-rule-strong text-ink-soft bg-paper-raised',
};

export function severityLabel(severity: SeverityName): string {
  return SEVERITY_LABELS[severity];
}

/** A finding's severity as text with a mark of its own (solid diamond, open triangle, open ring). */
export function SeverityBadge({ severity, className }: { severity: SeverityName; className?: string }) {
  const mark = SEVERITY_MARKS[severity];
  return (
    <span
      data-severity={severity}
      className={cn('inline-flex items-center gap-1.5 rounded-sm border px-1.5 py-0.5 text-xs font-medium leading-4 whitespace-nowrap', SEVERITY_FRAMES[severity], className)}
    >
      <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 shrink-0">
        <path d={mark.d} fill={mark.filled ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth={mark.filled ? 0 : 1.4} strokeLinejoin="round" />
      </svg>
      {SEVERITY_LABELS[severity]}
    </span>
  );
}
