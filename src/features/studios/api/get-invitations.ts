import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Invitation } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `GET /api/studios/:studioId/invitations` (instructor). */
export function getInvitations(studioId: number, signal?: AbortSignal): Promise<Invitation[]> {
  return api.get<Invitation[]>(`/api/studios/${studioId}/invitations`, signal);
}

export function invitationsQueryOptions(studioId: number) {
  return queryOptions({
    queryKey: studioKeys.invitations(studioId),
    queryFn: ({ signal }) => getInvitations(studioId, signal),
  });
}

export function useInvitations(studioId: number, enabled = true) {
  return useQuery({ ...invitationsQueryOptions(studioId), enabled });
}
