import { useMutation } from '@tanstack/react-query';
import type { ResetConfirmBody } from '../../../../shared/api/auth.js';
import { api } from '../../../lib/api-client.js';

/** `POST /api/auth/password-reset/confirm`. */
export function confirmPasswordReset(body: ResetConfirmBody): Promise<void> {
  return api.post<void>('/api/auth/password-reset/confirm', body);
}

export function useConfirmPasswordReset() {
  return useMutation({ mutationFn: confirmPasswordReset });
}
