import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateStudioBody, Studio } from '../../../../shared/api/studios.js';
import { api } from '../../../lib/api-client.js';
import { studioKeys } from './keys.js';

/** `POST /api/studios` (admin). */
export function createStudio(body: CreateStudioBody): Promise<Studio> {
  return api.post<Studio>('/api/studios', body);
}

export function useCreateStudio() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createStudio,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: studioKeys.lists() }),
  });
}
