import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { authKeys } from './keys.js';

/** `POST /api/auth/logout`. */
export function signOut(): Promise<void> {
  return api.post<void>('/api/auth/logout');
}

/**
 * Signs out, lets the caller leave the current screen (`leave`, usually a navigation to the
 * sign-in page), then drops every cached answer that belonged to the person.
 */
export function useSignOut(leave: () => void | Promise<void>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: async () => {
      await leave();
      queryClient.setQueryData(authKeys.me(), null);
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
    },
  });
}
