import { queryOptions, useSuspenseQuery } from '@tanstack/react-query';
import type { AdminUser } from '../../../../shared/api/admin.js';
import { api } from '../../../lib/api-client.js';
import { adminKeys } from './keys.js';

/** `GET /api/admin/users`. */
export function getUsers(signal?: AbortSignal): Promise<AdminUser[]> {
  return api.get<AdminUser[]>('/api/admin/users', signal);
}

export function usersQueryOptions() {
  return queryOptions({
    queryKey: adminKeys.userList(),
    queryFn: ({ signal }) => getUsers(signal),
  });
}

export function useUsers() {
  return useSuspenseQuery(usersQueryOptions());
}
