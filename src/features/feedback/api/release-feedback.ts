import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Feedback } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { feedbackKeys } from './keys.js';

/** `POST /api/submissions/:submissionId/feedback/release` (instructor): the participant may then read it. */
export function releaseFeedback(submissionId: number): Promise<Feedback> {
  return api.post<Feedback>(`/api/submissions/${submissionId}/feedback/release`);
}

export function useReleaseFeedback(submissionId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => releaseFeedback(submissionId),
    onSuccess: (feedback) => queryClient.setQueryData(feedbackKeys.detail(submissionId), feedback),
  });
}
