import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { SignIn } from '../../../../shared/schemas/auth';
import type { UserResponse } from '../../../../shared/schemas/users';
import { api, resetCsrfToken } from '../../../lib/api-client';
import { authKeys } from './auth-keys';

/**
 * Starts a session for a user we now know, shared by sign-in, set-up and invite acceptance:
 * the session id changed, so the CSRF token is fetched anew, and nothing cached for a previous
 * user survives.
 */
export function useStartSession() {
  const queryClient = useQueryClient();
  return (response: UserResponse) => {
    resetCsrfToken();
    queryClient.clear();
    queryClient.setQueryData(authKeys.me(), response);
  };
}

/** POST /api/auth/sign-in. Errors (401 `invalid_credentials`, 429 `too_many_attempts`) are shown by the form. */
export function useSignIn() {
  const startSession = useStartSession();
  return useMutation({
    mutationFn: (body: SignIn) => api.post<UserResponse>('/api/auth/sign-in', body),
    onSuccess: startSession,
    meta: { inlineErrors: true },
  });
}

/** POST /api/invites/accept: the new user's name and password; signs them in. */
export function useAcceptInvite() {
  const startSession = useStartSession();
  return useMutation({
    mutationFn: (body: { token: string; name: string; password: string }) => api.post<UserResponse>('/api/invites/accept', body),
    onSuccess: startSession,
    meta: { inlineErrors: true },
  });
}
