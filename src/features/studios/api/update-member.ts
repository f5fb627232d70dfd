import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Member } from '../../../../shared/api/studios.js';
import type { StudioRole } from '../../../../shared/api/roles.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `PATCH /api/studios/:studioId/members/:userId` (instructor). */
export function updateMember(studioId: number, userId: number, role: StudioRole): Promise<Member> {
  return api.patch<Member>(`/api/studios/${studioId}/members/${userId}`, { role });
}

export function useUpdateMember(studioId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, role }: { userId: number; role: StudioRole }) => updateMember(studioId, userId, role),
    // The list carries the caller's own role per studio, which may be the one that changed.
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: studioKeys.detail(studioId) }),
        queryClient.invalidateQueries({ queryKey: studioKeys.lists() }),
      ]),
  });
}
