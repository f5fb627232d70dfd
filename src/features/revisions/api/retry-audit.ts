import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Audit } from '../../../../shared/api/revisions.js';
import { api } from '../../../lib/api-client.js';
import { revisionKeys } from './keys.js';

/** `POST /api/revisions/:revisionId/retry` (owner or instructor; only a failed audit). */
export function retryAudit(revisionId: number): Promise<Audit> {
  return api.post<Audit>(`/api/revisions/${revisionId}/retry`);
}

export function useRetryAudit(revisionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => retryAudit(revisionId),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: revisionKeys.all }),
  });
}
