import type { BriefState } from '../../../../shared/api/briefs.js';
import { cn } from '../../../components/ui/cn.js';
import { BRIEF_STATE_LABELS } from './brief-words.js';

// Draft: dashed outline sheet; published: solid sheet; closed: sheet with a bar across.
const MARKS: Record<BriefState, { d: string; filled: boolean }> = {
  draft: { d: 'M2.5 1.5h7v9h-7z', filled: false },
  published: { d: 'M2.5 1.5h7v9h-7z', filled: true },
  closed: { d: 'M2.5 1.5h7v9h-7zM1 6h10', filled: false },
};

const FRAMES: Record<BriefState, string> = {
  draft: 'border-dashed border-ink-soft text-ink-soft bg-paper-raised',
  published: 'border-accent text-accent-strong bg-accent-wash',
  closed: 'border-ink text-ink bg-paper-sunk',
};

export function BriefStateBadge({ state, className }: { state: BriefState; className?: string }) {
  const mark = MARKS[state];
  return (
    <span data-brief-state={state} className={cn('inline-flex items-center gap-1.5 rounded-sm border px-2 py-0.5 text-xs font-medium leading-5', FRAMES[state], className)}>
      <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 shrink-0">
        <path d={mark.d} fill={mark.filled ? 'currentColor' : 'none'} stroke="currentColor" strokeWidth="1.3" strokeDasharray={state === 'draft' ? '2 1.4' : undefined} />
      </svg>
      {BRIEF_STATE_LABELS[state]}
    </span>
  );
}
