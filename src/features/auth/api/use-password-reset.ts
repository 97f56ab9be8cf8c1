import { useMutation } from '@tanstack/react-query';
import type { PasswordResetComplete, PasswordResetRequest } from '../../../../shared/schemas/auth';
import { api } from '../../../lib/api-client';

/** POST /api/auth/password-reset: always 202, whether or not the address belongs to a user. */
export function useRequestPasswordReset() {
  return useMutation({
    mutationFn: (body: PasswordResetRequest) => api.post<void>('/api/auth/password-reset', body),
    meta: { inlineErrors: true },
  });
}

/** POST /api/auth/password-reset/complete: 400 `token_invalid` when the link is used or expired. */
export function useCompletePasswordReset() {
  return useMutation({
    mutationFn: (body: PasswordResetComplete) => api.post<void>('/api/auth/password-reset/complete', body),
    meta: { inlineErrors: true },
  });
}
