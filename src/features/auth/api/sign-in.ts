import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { LoginBody, SessionUser } from '../../../../shared/api/auth.js';
import { api } from '../../../lib/api-client.js';
import { authKeys } from './keys.js';

/** `POST /api/auth/login`. */
export function signIn(body: LoginBody): Promise<SessionUser> {
  return api.post<SessionUser>('/api/auth/login', body);
}

/** Signs in and swaps the whole cache for the new person's. */
export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (user) => {
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), user);
    },
  });
}
