import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { Studio } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `GET /api/studios/:studioId`. */
export function getStudio(studioId: number, signal?: AbortSignal): Promise<Studio> {
  return api.get<Studio>(`/api/studios/${studioId}`, signal);
}

export function studioQueryOptions(studioId: number) {
  return queryOptions({
    queryKey: studioKeys.detail(studioId),
    queryFn: ({ signal }) => getStudio(studioId, signal),
  });
}

export function useStudio(studioId: number) {
  return useSuspenseQuery(studioQueryOptions(studioId));
}
