import type { GlobalRole, StudioRole } from '../../../shared/api/roles.js';
import { cn } from './cn.js';

export type AnyRole = StudioRole | GlobalRole;

// Labels live here rather than being imported from shared/api/roles.ts at run time, so the first
// page does not pull zod into its bundle; the Record type keeps them in step with the role lists.
export const ROLE_LABELS: Record<AnyRole, string> = {
  instructor: 'Instructor',
  critic: 'Critic',
  participant: 'Participant',
  admin: 'Admin',
  technician: 'Technician',
};

// Each role has its own mark and its own outline, so roles differ by text and shape, never by
// colour alone.
const MARKS: Record<AnyRole, string> = {
  instructor: 'M2 2h8v8H2z', // filled square
  critic: 'M6 1.2 10.8 6 6 10.8 1.2 6z', // diamond
  participant: 'M6 1.5a4.5 4.5 0 1 1 0 9a4.5 4.5 0 1 1 0-9z', // circle
  admin: 'M6 1.5 10.8 10H1.2z', // triangle
  technician: 'M6 1.2v9.6M1.2 6h9.6', // cross
};

const FILLED: Record<AnyRole, boolean> = {
  instructor: true,
  critic: false,
  participant: false,
  admin: true,
  technician: false,
};

const FRAME: Record<AnyRole, string> = {
  instructor: 'rounded-sm border-ink bg-ink text-paper-raised',
  critic: 'rounded-sm border-dashed border-ink-soft bg-paper-raised text-ink',
  participant: 'rounded-full border-rule-strong bg-paper-raised text-ink',
  admin: 'rounded-none border-accent-strong bg-accent-wash text-accent-strong',
  technician: 'rounded-none border-double border-[3px] border-ink-soft bg-paper-raised text-ink py-px',
};

export function RoleBadge({ role, className }: { role: AnyRole; className?: string }) {
  return (
    <span
      data-role={role}
      className={cn(
        'inline-flex items-center gap-1.5 border px-2 py-0.5 text-xs font-medium leading-5 whitespace-nowrap',
        FRAME[role],
        className,
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 shrink-0">
        <path
          d={MARKS[role]}
          fill={FILLED[role] ? 'currentColor' : 'none'}
          stroke="currentColor"
          strokeWidth={FILLED[role] ? 0 : role === 'technician' ? 2.2 : 1.4}
          strokeLinejoin="round"
        />
      </svg>
      {ROLE_LABELS[role]}
    </span>
  );
}

/** A neutral badge (invitation states and the like) — text first, a shape only as a hint. */
export function StateBadge({ children, tone = 'neutral' }: { children: string; tone?: 'neutral' | 'ok' | 'warn' }) {
  return (
    <span
      className={cn(
        'inline-flex items-center rounded-sm border px-2 py-0.5 font-mono text-xs leading-5',
        tone === 'ok' && 'border-signal-ok text-signal-ok bg-signal-ok-wash',
        tone === 'warn' && 'border-signal-error text-signal-error bg-signal-error-wash',
        tone === 'neutral' && 'border-rule-strong text-ink-soft bg-paper-raised',
      )}
    >
      {children}
    </span>
  );
}
