import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreatePinupBody, Pinup } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { pinupKeys } from './keys.js';

/** `POST /api/briefs/:briefId/pinups` (instructor): schedules a session. */
export function createPinup(briefId: number, body: CreatePinupBody): Promise<Pinup> {
  return api.post<Pinup>(`/api/briefs/${briefId}/pinups`, body);
}

export function useCreatePinup(briefId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreatePinupBody) => createPinup(briefId, body),
    onSuccess: (pinup) => {
      queryClient.setQueryData(pinupKeys.detail(pinup.id), pinup);
      return queryClient.invalidateQueries({ queryKey: pinupKeys.list(briefId) });
    },
  });
}
