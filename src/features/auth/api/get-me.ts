import { queryOptions, useQuery, useSuspenseQuery } from '@tanstack/react-query';
import type { SessionUser } from '../../../../shared/api/auth.js';
import { api, isApiError } from '../../../lib/api-client.js';
import { authKeys } from './keys.js';

/** `GET /api/auth/me`; a 401 means "signed out" and resolves to null. */
export async function getMe(signal?: AbortSignal): Promise<SessionUser | null> {
  try {
    return await api.get<SessionUser>('/api/auth/me', signal);
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });
}

/** The signed-in person or null; suspends only on the very first load (loaders prefetch it). */
export function useMe() {
  return useSuspenseQuery(meQueryOptions());
}

/** Non-suspending variant for places that must render while the session is unknown. */
export function useMeQuery() {
  return useQuery(meQueryOptions());
}
