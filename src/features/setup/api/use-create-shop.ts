import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Setup } from '../../../../shared/schemas/setup';
import type { UserResponse } from '../../../../shared/schemas/users';
import { api, resetCsrfToken } from '../../../lib/api-client';
import { setupKeys } from './setup-keys';

/**
 * POST /api/setup: creates the shop and its admin and signs the admin in (201 `{ user }`).
 * The session changed, so the CSRF token and every cached query go; the caller stores the user.
 */
export function useCreateShop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: Setup) => api.post<UserResponse>('/api/setup', body),
    onSuccess: () => {
      resetCsrfToken();
      queryClient.clear();
      queryClient.setQueryData(setupKeys.status(), { needsSetup: false });
    },
    meta: { inlineErrors: true },
  });
}
