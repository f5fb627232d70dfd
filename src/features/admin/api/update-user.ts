import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { AdminUser } from '../../../../shared/api/admin.js';
import type { GlobalRole } from '../../../../shared/api/roles.js';
import { api } from '../../../lib/api-client.js';
import { adminKeys } from './keys.js';

/** `PATCH /api/admin/users/:userId`. */
export function updateUser(userId: number, globalRole: GlobalRole | null): Promise<AdminUser> {
  return api.patch<AdminUser>(`/api/admin/users/${userId}`, { globalRole });
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ userId, globalRole }: { userId: number; globalRole: GlobalRole | null }) => updateUser(userId, globalRole),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: adminKeys.users() }),
  });
}
