import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Pinup } from '../../../../shared/api/critique.js';
import { api } from '../../../lib/api-client.js';
import { pinupKeys } from './keys.js';

/** `GET /api/pinups/:pinupId`. */
export function getPinup(pinupId: number, signal?: AbortSignal): Promise<Pinup> {
  return api.get<Pinup>(`/api/pinups/${pinupId}`, signal);
}

export function pinupQueryOptions(pinupId: number) {
  return queryOptions({ queryKey: pinupKeys.detail(pinupId), queryFn: ({ signal }) => getPinup(pinupId, signal) });
}

/** How often a session is asked again: while it runs, pins are placed and resolved in it. */
export function pinupPollInterval(pinup: Pick<Pinup, 'state'> | undefined): number | false {
  return pinup?.state === 'running' ? 10_000 : false;
}

/** The session with loading and error states of its own (the page shows them in place). */
export function usePinup(pinupId: number) {
  return useQuery({ ...pinupQueryOptions(pinupId), refetchInterval: (query) => pinupPollInterval(query.state.data) });
}
