import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { SubmissionRow, SubmissionsQuery } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { submissionKeys } from './keys.js';

function queryString(filters: SubmissionsQuery): string {
  const params = new URLSearchParams();
  for (const [key, value] of Object.entries(filters)) if (value !== undefined) params.set(key, String(value));
  const text = params.toString();
  return text ? `?${text}` : '';
}

/** `GET /api/briefs/:briefId/submissions?state=&hasErrors=&late=`. */
export function getSubmissions(briefId: number, filters: SubmissionsQuery = {}, signal?: AbortSignal): Promise<SubmissionRow[]> {
  return api.get<SubmissionRow[]>(`/api/briefs/${briefId}/submissions${queryString(filters)}`, signal);
}

export function submissionsQueryOptions(briefId: number, filters: SubmissionsQuery = {}) {
  return queryOptions({ queryKey: submissionKeys.list(briefId, filters), queryFn: ({ signal }) => getSubmissions(briefId, filters, signal) });
}

/** Polls while some audit in the table is still queued or running. */
export function useSubmissions(briefId: number, filters: SubmissionsQuery) {
  return useQuery({
    ...submissionsQueryOptions(briefId, filters),
    placeholderData: keepPreviousData,
    refetchInterval: (query) => (query.state.data?.some((r) => r.auditState === 'queued' || r.auditState === 'running') ? 2000 : false),
  });
}

/** The CSV of marks and audit figures (instructor); a plain download. */
export function submissionsExportUrl(briefId: number): string {
  return `/api/briefs/${briefId}/export`;
}
