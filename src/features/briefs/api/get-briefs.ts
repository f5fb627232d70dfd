import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Brief } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { briefKeys } from './keys.js';

/** `GET /api/studios/:studioId/briefs` (members; drafts only to instructors). */
export function getBriefs(studioId: number, signal?: AbortSignal): Promise<Brief[]> {
  return api.get<Brief[]>(`/api/studios/${studioId}/briefs`, signal);
}

export function briefsQueryOptions(studioId: number) {
  return queryOptions({ queryKey: briefKeys.list(studioId), queryFn: ({ signal }) => getBriefs(studioId, signal) });
}

export function useBriefs(studioId: number) {
  return useQuery(briefsQueryOptions(studioId));
}
