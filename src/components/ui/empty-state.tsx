import type { ReactNode } from 'react';

export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-rule-strong bg-paper-raised/70 px-6 py-10 text-center">
      <svg aria-hidden="true" viewBox="0 0 48 32" className="mx-auto mb-3 h-8 w-12 text-ink-faint">
        <path d="M4 24 24 30 44 24 24 18Z M24 4v26 M24 4l12 4v16" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinejoin="round" />
      </svg>
      <p className="font-semibold text-ink">{title}</p>
      {children ? <div className="mx-auto mt-2 max-w-prose text-sm text-ink-soft">{children}</div> : null}
      {action ? <div className="mt-4 flex justify-center">{action}</div> : null}
    </div>
  );
}
