import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { InvitationPreview } from '../../../../shared/api/studios.js';
import { api, isApiError } from '../../../lib/api-client.js';
import { invitationKeys } from './keys.js';

/** What the invitation page shows: the preview, or why the link cannot be used. */
export type InvitationLookup =
  | { state: 'open'; preview: InvitationPreview }
  | { state: 'unknown'; message: string }
  | { state: 'gone'; message: string };

/**
 * `GET /api/invitations/:token`. 404 (unknown link) and 410 (expired, revoked or used) are
 * answers the page explains, so they resolve instead of throwing.
 */
export async function getInvitationPreview(token: string, signal?: AbortSignal): Promise<InvitationLookup> {
  try {
    const preview = await api.get<InvitationPreview>(`/api/invitations/${encodeURIComponent(token)}`, signal);
    return { state: 'open', preview };
  } catch (error) {
    if (isApiError(error) && error.status === 404) return { state: 'unknown', message: error.message };
    if (isApiError(error) && error.status === 410) return { state: 'gone', message: error.message };
    throw error;
  }
}

export function invitationPreviewQueryOptions(token: string) {
  return queryOptions({
    queryKey: invitationKeys.detail(token),
    queryFn: ({ signal }) => getInvitationPreview(token, signal),
    staleTime: 30_000,
  });
}

export function useInvitationPreview(token: string) {
  return useSuspenseQuery(invitationPreviewQueryOptions(token));
}
