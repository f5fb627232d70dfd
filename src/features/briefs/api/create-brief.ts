import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Brief, CreateBriefBody } from '../../../../shared/api/briefs.js';
import { api } from '../../../lib/api-client.js';
import { briefKeys } from './keys.js';

/** `POST /api/studios/:studioId/briefs` (instructor): the brief starts as a draft. */
export function createBrief(studioId: number, body: CreateBriefBody): Promise<Brief> {
  return api.post<Brief>(`/api/studios/${studioId}/briefs`, body);
}

export function useCreateBrief(studioId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateBriefBody) => createBrief(studioId, body),
    onSuccess: (brief) => {
      queryClient.setQueryData(briefKeys.detail(brief.id), brief);
      return queryClient.invalidateQueries({ queryKey: briefKeys.lists() });
    },
  });
}
