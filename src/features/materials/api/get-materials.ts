import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Material } from '../../../../shared/api/materials.js';
import { api } from '../../../lib/api-client.js';
import { materialKeys } from './keys.js';

/** `GET /api/materials` (every signed-in person). */
export function getMaterials(signal?: AbortSignal): Promise<Material[]> {
  return api.get<Material[]>('/api/materials', signal);
}

export function materialsQueryOptions() {
  return queryOptions({ queryKey: materialKeys.list(), queryFn: ({ signal }) => getMaterials(signal) });
}

export function useMaterials() {
  return useQuery(materialsQueryOptions());
}
