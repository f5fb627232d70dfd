import { queryOptions, useQuery } from '@tanstack/react-query';
import type { BriefChange } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { briefKeys } from './keys.js';

/** `GET /api/briefs/:briefId/changes`: the changelog, newest first as the server orders it. */
export function getBriefChanges(briefId: number, signal?: AbortSignal): Promise<BriefChange[]> {
  return api.get<BriefChange[]>(`/api/briefs/${briefId}/changes`, signal);
}

export function briefChangesQueryOptions(briefId: number) {
  return queryOptions({ queryKey: briefKeys.changes(briefId), queryFn: ({ signal }) => getBriefChanges(briefId, signal) });
}

export function useBriefChanges(briefId: number, enabled = true) {
  return useQuery({ ...briefChangesQueryOptions(briefId), enabled });
}
