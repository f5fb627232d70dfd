import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Pinup, UpdatePinupBody } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { pinupKeys } from './keys.js';

/** `PATCH /api/pinups/:pinupId` (instructor): any field, or the state (start, finish). */
export function updatePinup(pinupId: number, body: UpdatePinupBody): Promise<Pinup> {
  return api.patch<Pinup>(`/api/pinups/${pinupId}`, body);
}

export function useUpdatePinup(pinupId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdatePinupBody) => updatePinup(pinupId, body),
    onSuccess: (pinup) => {
      queryClient.setQueryData(pinupKeys.detail(pinupId), pinup);
      return queryClient.invalidateQueries({ queryKey: pinupKeys.lists() });
    },
  });
}
