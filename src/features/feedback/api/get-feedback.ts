import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Feedback } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { feedbackKeys } from './keys.js';

/** `GET /api/submissions/:submissionId/feedback`: what the caller may see of the feedback. */
export function getFeedback(submissionId: number, signal?: AbortSignal): Promise<Feedback> {
  return api.get<Feedback>(`/api/submissions/${submissionId}/feedback`, signal);
}

export function feedbackQueryOptions(submissionId: number) {
  return queryOptions({ queryKey: feedbackKeys.detail(submissionId), queryFn: ({ signal }) => getFeedback(submissionId, signal) });
}

/** Not suspending: a refusal (403) is shown in place, in the server's words. */
export function useFeedback(submissionId: number) {
  return useQuery(feedbackQueryOptions(submissionId));
}
