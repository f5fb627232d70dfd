import { cn } from './cn.js';

export type FormStatusValue = { kind: 'success' | 'error'; message: string } | null;

/**
 * The status line under a form. Always rendered (empty when idle) so screen readers announce
 * changes through the live region.
 */
export function FormStatus({ status, className }: { status: FormStatusValue; className?: string }) {
  return (
    <div aria-live="polite" role="status" className={cn('min-h-0 text-sm', className)}>
      {status ? (
        <p
          className={cn(
            'flex items-start gap-2 rounded-md border px-3 py-2',
            status.kind === 'success'
              ? 'border-signal-ok/50 bg-signal-ok-wash text-signal-ok'
              : 'border-signal-error/50 bg-signal-error-wash text-signal-error',
          )}
        >
          <span aria-hidden="true" className="font-mono font-semibold">
            {status.kind === 'success' ? '✓' : '!'}
          </span>
          <span className="text-ink">
            <span className="sr-only">{status.kind === 'success' ? 'Done: ' : 'Problem: '}</span>
            {status.message}
          </span>
        </p>
      ) : null}
    </div>
  );
}
