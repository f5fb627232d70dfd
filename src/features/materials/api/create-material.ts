import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateMaterialBody, Material } from '../../../../shared/api/materials.js';
import { api } from '../../../lib/api-client.js';
import { materialKeys } from './keys.js';

/** `POST /api/materials` (admin). */
export function createMaterial(body: CreateMaterialBody): Promise<Material> {
  return api.post<Material>('/api/materials', body);
}

export function useCreateMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createMaterial,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: materialKeys.all }),
  });
}
