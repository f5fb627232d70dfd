import type { HTMLAttributes, ReactNode } from 'react';
import { cn } from './cn.js';

/**
 * A state as words with a small mark beside them (a 12 × 12 SVG drawn in the text colour), in a
 * frame whose colour and border style the caller picks, so a state reads from text and shape,
 * not colour alone. Extra attributes (e.g. `data-audit-state`) go on the frame.
 */
export function MarkedBadge({ frame, mark, className, children, ...rest }: { frame: string; mark: ReactNode; children: ReactNode } & HTMLAttributes<HTMLSpanElement>) {
  return (
    <span {...rest} className={cn('inline-flex items-center gap-1.5 rounded-sm border px-2 py-0.5 text-xs font-medium leading-5 whitespace-nowrap', frame, className)}>
      <svg aria-hidden="true" viewBox="0 0 12 12" className="size-3 shrink-0">
        {mark}
      </svg>
      {children}
    </span>
  );
}
