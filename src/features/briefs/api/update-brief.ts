import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Brief, UpdateBriefBody } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { briefKeys } from './keys.js';

/** `PATCH /api/briefs/:briefId` (instructor). */
export function updateBrief(briefId: number, body: UpdateBriefBody): Promise<Brief> {
  return api.patch<Brief>(`/api/briefs/${briefId}`, body);
}

export function useUpdateBrief(briefId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateBriefBody) => updateBrief(briefId, body),
    onSuccess: (brief) => {
      queryClient.setQueryData(briefKeys.detail(briefId), brief);
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: briefKeys.changes(briefId) }),
        queryClient.invalidateQueries({ queryKey: briefKeys.lists() }),
      ]);
    },
  });
}
