import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Pinup } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { pinupKeys } from './keys.js';

/** `GET /api/briefs/:briefId/pinups`: the brief's pin-up sessions the caller may see. */
export function getPinups(briefId: number, signal?: AbortSignal): Promise<Pinup[]> {
  return api.get<Pinup[]>(`/api/briefs/${briefId}/pinups`, signal);
}

export function pinupsQueryOptions(briefId: number) {
  return queryOptions({ queryKey: pinupKeys.list(briefId), queryFn: ({ signal }) => getPinups(briefId, signal) });
}

/** Not suspending: a list that cannot be loaded shows its message in its own section. */
export function usePinups(briefId: number, enabled = true) {
  return useQuery({ ...pinupsQueryOptions(briefId), enabled });
}
