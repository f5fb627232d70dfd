import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SessionUser } from '../../../../shared/api/auth.js';
import type { AcceptInvitationBody } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { invitationKeys } from './keys.js';

/**
 * `POST /api/invitations/:token/accept`: `{ name, password }` creates the account, `{}` adds the
 * signed-in account to the studio. Either way the answer is the session user.
 */
export function acceptInvitation(token: string, body: AcceptInvitationBody): Promise<SessionUser> {
  return api.post<SessionUser>(`/api/invitations/${encodeURIComponent(token)}/accept`, body);
}

export function useAcceptInvitation(token: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AcceptInvitationBody) => acceptInvitation(token, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: invitationKeys.detail(token) }),
  });
}
