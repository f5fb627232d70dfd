import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Brief } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { briefKeys } from './keys.js';

export type BriefTransition = 'publish' | 'close';

/** `POST /api/briefs/:briefId/publish` and `…/close` (instructor): draft → published → closed. */
export function changeBriefState(briefId: number, transition: BriefTransition): Promise<Brief> {
  return api.post<Brief>(`/api/briefs/${briefId}/${transition}`);
}

export function useChangeBriefState(briefId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (transition: BriefTransition) => changeBriefState(briefId, transition),
    onSuccess: (brief) => {
      queryClient.setQueryData(briefKeys.detail(briefId), brief);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: briefKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: briefKeys.changes(briefId) }),
      ]);
    },
  });
}
