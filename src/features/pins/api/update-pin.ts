import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Pin, UpdatePinBody } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { putPinInCache } from './cache.js';
import { pinKeys } from './keys.js';

/** `PATCH /api/pins/:pinId`: resolve or reopen, or change the category (author or instructor). */
export function updatePin(pinId: number, body: UpdatePinBody): Promise<Pin> {
  return api.patch<Pin>(`/api/pins/${pinId}`, body);
}

/** Updates a pin shown on `revisionId`; the cached list takes the server's pin. */
export function useUpdatePin(revisionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ pinId, change }: { pinId: number; change: UpdatePinBody }) => updatePin(pinId, change),
    onSuccess: (pin) => putPinInCache(queryClient, revisionId, { ...pin, revisionId }),
    // Not awaited: the mutation is done when the server answered, the refetch catches up after.
    onSettled: () => {
      void queryClient.invalidateQueries({ queryKey: pinKeys.list(revisionId) });
    },
  });
}
