import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `DELETE /api/studios/:studioId/invitations/:invitationId` (instructor). */
export function revokeInvitation(studioId: number, invitationId: number): Promise<void> {
  return api.delete(`/api/studios/${studioId}/invitations/${invitationId}`);
}

export function useRevokeInvitation(studioId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (invitationId: number) => revokeInvitation(studioId, invitationId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.invitations(studioId) }),
  });
}
