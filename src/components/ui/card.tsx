import type { HTMLAttributes, ReactNode } from 'react';
import { cn } from './cn.js';

export function Card({ className, ...rest }: HTMLAttributes<HTMLElement>) {
  return (
    <section
      className={cn('rounded-lg border border-rule bg-paper-raised/95 p-5 shadow-[0_1px_0_rgb(31_42_51/0.06)] sm:p-6', className)}
      {...rest}
    />
  );
}

/** Heading row of a card: the title (an h2 unless told) with optional actions on the right. */
export function CardHeader({
  title,
  description,
  actions,
  level = 2,
  id,
}: {
  title: ReactNode;
  description?: ReactNode;
  actions?: ReactNode;
  level?: 2 | 3;
  id?: string;
}) {
  const Heading = level === 2 ? 'h2' : 'h3';
  return (
    <div className="mb-4 flex flex-wrap items-start justify-between gap-3">
      <div className="space-y-1">
        <Heading id={id} className="text-lg font-semibold">
          {title}
        </Heading>
        {description ? <p className="text-sm text-ink-soft">{description}</p> : null}
      </div>
      {actions ? <div className="flex flex-wrap items-center gap-2">{actions}</div> : null}
    </div>
  );
}
