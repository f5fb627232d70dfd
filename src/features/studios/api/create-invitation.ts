import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Invitation, InviteBody } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `POST /api/studios/:studioId/invitations` (instructor); the server e-mails the link. */
export function createInvitation(studioId: number, body: InviteBody): Promise<Invitation> {
  return api.post<Invitation>(`/api/studios/${studioId}/invitations`, body);
}

export function useCreateInvitation(studioId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: InviteBody) => createInvitation(studioId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.invitations(studioId) }),
  });
}
