import { useMutation } from '@tanstack/react-query';
import type { ResetRequestBody } from '../../../../shared/api/auth.js';
import { api } from '../../../lib/api-client.js';

/** `POST /api/auth/password-reset` — answers 202 whether or not the address has an account. */
export function requestPasswordReset(body: ResetRequestBody): Promise<void> {
  return api.post<void>('/api/auth/password-reset', body);
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: requestPasswordReset });
}
