import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Material, UpdateMaterialBody } from '../../../../shared/api/materials.js';
import { api } from '../../../lib/api-client.js';
import { materialKeys } from './keys.js';

/** `PATCH /api/materials/:materialId` (admin). */
export function updateMaterial(materialId: number, body: UpdateMaterialBody): Promise<Material> {
  return api.patch<Material>(`/api/materials/${materialId}`, body);
}

export function useUpdateMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id: number; body: UpdateMaterialBody }) => updateMaterial(id, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: materialKeys.all }),
  });
}
