import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client.js';
import { authKeys } from './keys.js';

/** `POST /api/auth/logout`. */
export function signOut(): Promise<void> {
  return api.post<void>('/api/auth/logout');
}

/**
 * Cancels what is loading, signs out, marks the person signed out, lets the caller leave the
 * current screen (`leave`, usually a navigation to the sign-in page), then drops every cached
 * answer that belonged to the person.
 */
export function useSignOut(leave: () => void | Promise<void>) {
  const queryClient = useQueryClient();
  return useMutation({
    // Requests still in flight would reach the server after the session is gone and come back
    // 401; cancelling them first (their fetches are aborted) keeps sign-out quiet.
    onMutate: () => queryClient.cancelQueries(),
    mutationFn: signOut,
    onSuccess: async () => {
      // Signed out first, so the signed-in screens unmount and stop observing their queries;
      // removing a query that a mounted screen still observes makes it fetch again (a 401).
      queryClient.setQueryData(authKeys.me(), null);
      await leave();
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
    },
  });
}
