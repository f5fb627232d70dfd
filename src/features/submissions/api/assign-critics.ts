import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Submission } from '../../../../shared/api/revisions.js';
import { api } from '../../../lib/api-client.js';
import { submissionKeys } from './keys.js';

/** `PUT /api/submissions/:submissionId/critics` (instructor): the critics assigned, replacing the list. */
export function assignCritics(submissionId: number, userIds: number[]): Promise<Submission> {
  return api.put<Submission>(`/api/submissions/${submissionId}/critics`, { userIds });
}

/** Refreshes the submissions tables; screens that show critics elsewhere refresh their own data. */
export function useAssignCritics() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ submissionId, userIds }: { submissionId: number; userIds: number[] }) => assignCritics(submissionId, userIds),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: submissionKeys.lists() }),
  });
}
