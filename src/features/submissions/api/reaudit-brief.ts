import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { submissionKeys } from './keys.js';

/** `POST /api/briefs/:briefId/reaudit` (instructor): queues every latest revision again. */
export function reauditBrief(briefId: number): Promise<{ queued: number }> {
  return api.post<{ queued: number }>(`/api/briefs/${briefId}/reaudit`);
}

export function useReauditBrief(briefId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => reauditBrief(briefId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: submissionKeys.lists() }),
  });
}
