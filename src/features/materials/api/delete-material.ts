import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { materialKeys } from './keys.js';

/** `DELETE /api/materials/:materialId` (admin); 409 while a brief uses it. */
export function deleteMaterial(materialId: number): Promise<void> {
  return api.delete(`/api/materials/${materialId}`);
}

export function useDeleteMaterial() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deleteMaterial,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: materialKeys.all }),
  });
}
