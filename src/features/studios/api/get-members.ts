import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Member } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `GET /api/studios/:studioId/members`. */
export function getMembers(studioId: number, signal?: AbortSignal): Promise<Member[]> {
  return api.get<Member[]>(`/api/studios/${studioId}/members`, signal);
}

export function membersQueryOptions(studioId: number) {
  return queryOptions({
    queryKey: studioKeys.members(studioId),
    queryFn: ({ signal }) => getMembers(studioId, signal),
  });
}

/** Not suspending: a refused member list shows as a message in its card, not as a broken page. */
export function useMembers(studioId: number) {
  return useQuery(membersQueryOptions(studioId));
}
