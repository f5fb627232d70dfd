import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Feedback, PutScoresBody } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { feedbackKeys } from './keys.js';

/** `PUT /api/submissions/:submissionId/scores` (assigned critic or instructor): the caller's own sheet. */
export function saveScores(submissionId: number, body: PutScoresBody): Promise<Feedback> {
  return api.put<Feedback>(`/api/submissions/${submissionId}/scores`, body);
}

export function useSaveScores(submissionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PutScoresBody) => saveScores(submissionId, body),
    onSuccess: (feedback) => queryClient.setQueryData(feedbackKeys.detail(submissionId), feedback),
  });
}
