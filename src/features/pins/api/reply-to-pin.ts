import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateCommentBody, PinComment } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { patchPinInCache } from './cache.js';
import { pinKeys } from './keys.js';

/** `POST /api/pins/:pinId/comments`: a reply in the pin's thread. */
export function replyToPin(pinId: number, body: CreateCommentBody): Promise<PinComment> {
  return api.post<PinComment>(`/api/pins/${pinId}/comments`, body);
}

/** Replies to a pin shown on `revisionId`; the reply joins the cached thread as soon as it is stored. */
export function useReplyToPin(revisionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ pinId, body }: { pinId: number; body: string }) => replyToPin(pinId, { body }),
    onSuccess: (comment, { pinId }) =>
      patchPinInCache(queryClient, revisionId, pinId, (p) =>
        p.comments.some((c) => c.id === comment.id) ? p : { ...p, comments: [...p.comments, comment], updatedAt: comment.createdAt },
      ),
    // Not awaited: the mutation is done when the server answered, the refetch catches up after.
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: pinKeys.list(revisionId) });
    },
  });
}
