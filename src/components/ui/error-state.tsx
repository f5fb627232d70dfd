import type { ReactNode } from 'react';
import { isApiError } from '../../lib/api-client.js';
import { Button } from './button.js';

/** Turns any thrown value into a sentence a person can act on; never a stack trace. */
export function describeError(error: unknown): string {
  if (isApiError(error)) return error.message;
  return 'Something went wrong in the app. Reload the page; if it happens again, tell the maker-space staff what you were doing.';
}

export function ErrorState({
  title = 'This could not be loaded',
  error,
  onRetry,
  children,
}: {
  title?: string;
  error?: unknown;
  onRetry?: () => void;
  children?: ReactNode;
}) {
  return (
    <div role="alert" className="rounded-lg border border-signal-error/60 bg-signal-error-wash/60 px-5 py-4">
      <p className="font-semibold text-signal-error">{title}</p>
      {error !== undefined ? <p className="mt-1 text-sm text-ink">{describeError(error)}</p> : null}
      {children ? <div className="mt-2 text-sm text-ink">{children}</div> : null}
      {onRetry ? (
        <Button variant="secondary" size="sm" className="mt-3" onClick={onRetry}>
          Try again
        </Button>
      ) : null}
    </div>
  );
}
