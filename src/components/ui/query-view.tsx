import type { ReactNode } from 'react';
import type { UseQueryResult } from '@tanstack/react-query';
import { ErrorState } from './error-state.js';
import { Skeleton } from './spinner.js';

/** Loading placeholder of a list or table: a few grey bars and a spoken label. */
export function ListSkeleton({ label = 'Loading…', rows = 3 }: { label?: string; rows?: number }) {
  return (
    <div role="status" aria-live="polite" className="space-y-2">
      <span className="sr-only">{label}</span>
      <Skeleton className="h-8 w-60" />
      {Array.from({ length: rows }, (_, i) => (
        <Skeleton key={i} className="h-10 w-full" />
      ))}
    </div>
  );
}

/** The three states of a query in one place: loading, error with a retry, or the data. */
export function QueryView<T>({
  query,
  loadingLabel,
  errorTitle,
  children,
}: {
  query: UseQueryResult<T>;
  loadingLabel: string;
  errorTitle: string;
  children: (data: T) => ReactNode;
}) {
  if (query.isPending) return <ListSkeleton label={loadingLabel} />;
  if (query.isError) return <ErrorState title={errorTitle} error={query.error} onRetry={() => void query.refetch()} />;
  return <>{children(query.data)}</>;
}
