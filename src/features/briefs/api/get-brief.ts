import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { Brief } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { briefKeys } from './keys.js';

/** `GET /api/briefs/:briefId`. */
export function getBrief(briefId: number, signal?: AbortSignal): Promise<Brief> {
  return api.get<Brief>(`/api/briefs/${briefId}`, signal);
}

export function briefQueryOptions(briefId: number) {
  return queryOptions({ queryKey: briefKeys.detail(briefId), queryFn: ({ signal }) => getBrief(briefId, signal) });
}

/** Suspends: the brief is the page, so its loader has fetched it (or shown the error page). */
export function useBrief(briefId: number) {
  return useSuspenseQuery(briefQueryOptions(briefId));
}

/** The drawing template of one family of the brief (an SVG download). */
export function briefTemplateUrl(briefId: number, familyId: string): string {
  return `/api/briefs/${briefId}/templates/${encodeURIComponent(familyId)}`;
}
