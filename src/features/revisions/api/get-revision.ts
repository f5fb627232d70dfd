import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { RevisionDetail } from '../../../../shared/api/revisions.js';
import { api } from '../../../lib/api-client.js';
import { auditPollInterval } from './audit-polling.js';
import { revisionKeys } from './keys.js';

/** `GET /api/revisions/:revisionId`: the revision, its files, design document and audit. */
export function getRevision(revisionId: number, signal?: AbortSignal): Promise<RevisionDetail> {
  return api.get<RevisionDetail>(`/api/revisions/${revisionId}`, signal);
}

export function revisionQueryOptions(revisionId: number) {
  return queryOptions({ queryKey: revisionKeys.detail(revisionId), queryFn: ({ signal }) => getRevision(revisionId, signal) });
}

/**
 * The revision, asked again while its audit is queued or running so the page fills in by itself;
 * polling stops once the audit is done or failed.
 */
export function useRevision(revisionId: number) {
  return useSuspenseQuery({
    ...revisionQueryOptions(revisionId),
    refetchInterval: (query) => auditPollInterval(query.state.data?.audit.state),
  });
}

export function revisionTemplateUrl(revisionId: number, familyId: string): string {
  return `/api/revisions/${revisionId}/templates/${encodeURIComponent(familyId)}`;
}
