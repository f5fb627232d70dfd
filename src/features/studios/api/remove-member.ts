import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `DELETE /api/studios/:studioId/members/:userId` (instructor). */
export function removeMember(studioId: number, userId: number): Promise<void> {
  return api.delete(`/api/studios/${studioId}/members/${userId}`);
}

export function useRemoveMember(studioId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (userId: number) => removeMember(studioId, userId),
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: studioKeys.detail(studioId) }),
        queryClient.invalidateQueries({ queryKey: studioKeys.lists() }),
      ]),
  });
}
