import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Feedback, PutFeedbackBody } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { feedbackKeys } from './keys.js';

/** `PUT /api/submissions/:submissionId/feedback` (instructor): the final mark and summary. */
export function saveFinalMark(submissionId: number, body: PutFeedbackBody): Promise<Feedback> {
  return api.put<Feedback>(`/api/submissions/${submissionId}/feedback`, body);
}

export function useSaveFinalMark(submissionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PutFeedbackBody) => saveFinalMark(submissionId, body),
    onSuccess: (feedback) => queryClient.setQueryData(feedbackKeys.detail(submissionId), feedback),
  });
}
