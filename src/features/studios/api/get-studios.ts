import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { Studio } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `GET /api/studios` — the caller's studios (an admin gets every studio, with myRole null where not a member). */
export function getStudios(signal?: AbortSignal): Promise<Studio[]> {
  return api.get<Studio[]>('/api/studios', signal);
}

export function studiosQueryOptions() {
  return queryOptions({
    queryKey: studioKeys.list(),
    queryFn: ({ signal }) => getStudios(signal),
  });
}

export function useStudios() {
  return useSuspenseQuery(studiosQueryOptions());
}
