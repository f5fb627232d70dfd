import { queryOptions, useQuery } from '@tanstack/react-query';
import type { HistoryEntry, Submission } from '../../../../shared/api/revisions.js';
import { api } from '../../../lib/api-client.js';
import { auditPollInterval } from './audit-polling.js';
import { revisionKeys } from './keys.js';

/** `GET /api/submissions/:submissionId`: the participant's revisions to one brief. */
export function getSubmission(submissionId: number, signal?: AbortSignal): Promise<Submission> {
  return api.get<Submission>(`/api/submissions/${submissionId}`, signal);
}

export function submissionQueryOptions(submissionId: number) {
  return queryOptions({ queryKey: revisionKeys.submission(submissionId), queryFn: ({ signal }) => getSubmission(submissionId, signal) });
}

/** Polls while the newest revision's audit is still on its way. */
export function useSubmission(submissionId: number | null) {
  return useQuery({
    ...submissionQueryOptions(submissionId ?? 0),
    enabled: submissionId !== null,
    refetchInterval: (query) => auditPollInterval(query.state.data?.revisions.at(-1)?.auditState),
  });
}

/** `GET /api/submissions/:submissionId/history`: figures per revision, oldest first. */
export function getHistory(submissionId: number, signal?: AbortSignal): Promise<HistoryEntry[]> {
  return api.get<HistoryEntry[]>(`/api/submissions/${submissionId}/history`, signal);
}

export function historyQueryOptions(submissionId: number) {
  return queryOptions({ queryKey: revisionKeys.history(submissionId), queryFn: ({ signal }) => getHistory(submissionId, signal) });
}

export function useHistory(submissionId: number, poll: boolean) {
  return useQuery({ ...historyQueryOptions(submissionId), refetchInterval: poll ? 1500 : false });
}
