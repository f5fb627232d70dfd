import { queryOptions, replaceEqualDeep, useQuery } from '@tanstack/react-query';
import type { RevisionPins } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { pinKeys } from './keys.js';

/** How often the pins of an open revision page are asked for again (ms). */
export const PIN_POLL_MS = 5000;

/** `GET /api/revisions/:revisionId/pins`: the pins shown on that revision and who may add more. */
export function getRevisionPins(revisionId: number, signal?: AbortSignal): Promise<RevisionPins> {
  return api.get<RevisionPins>(`/api/revisions/${revisionId}/pins`, signal);
}

/**
 * Keeps the cached answer when the server's `version` is unchanged, so a poll that brings nothing
 * new re-renders nothing; otherwise shares the unchanged parts as TanStack Query does.
 */
export function keepSameVersion(previous: unknown, next: unknown): unknown {
  const p = previous as RevisionPins | undefined;
  const n = next as RevisionPins | undefined;
  if (p && n && typeof p.version === 'string' && p.version === n.version && p.revisionId === n.revisionId) return p;
  return replaceEqualDeep(previous, next);
}

export function revisionPinsQueryOptions(revisionId: number) {
  return queryOptions({
    queryKey: pinKeys.list(revisionId),
    queryFn: ({ signal }) => getRevisionPins(revisionId, signal),
    structuralSharing: keepSameVersion,
  });
}

/**
 * The pins of a revision. With `live`, asked again every {@link PIN_POLL_MS} while the page is
 * visible (TanStack Query pauses the interval in a hidden tab), so new pins and replies appear
 * without a reload.
 */
export function useRevisionPins(revisionId: number, live = true) {
  return useQuery({
    ...revisionPinsQueryOptions(revisionId),
    refetchInterval: live ? PIN_POLL_MS : false,
    refetchIntervalInBackground: false,
  });
}
