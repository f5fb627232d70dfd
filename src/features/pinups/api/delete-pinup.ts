import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { pinupKeys } from './keys.js';

/** `DELETE /api/pinups/:pinupId` (instructor). */
export function deletePinup(pinupId: number): Promise<void> {
  return api.delete(`/api/pinups/${pinupId}`);
}

/**
 * The lists are refreshed; the session's own cache entry is dropped only by
 * {@link forgetPinup} once the screen showing it has left (dropping it while mounted would fetch
 * it again and show a 404 for a moment).
 */
export function useDeletePinup(pinupId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => deletePinup(pinupId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: pinupKeys.lists() }),
  });
}

export function forgetPinup(queryClient: ReturnType<typeof useQueryClient>, pinupId: number): void {
  queryClient.removeQueries({ queryKey: pinupKeys.detail(pinupId), exact: true });
}
