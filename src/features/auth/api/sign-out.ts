import type { QueryClient } from '@tanstack/react-query';
import { ApiError, api, resetCsrfToken } from '../../../lib/api-client';

/**
 * Ends the session (POST /api/auth/sign-out) and forgets everything cached for this user.
 * A session that was already gone (401) counts as signed out; other failures are rethrown.
 */
export async function signOut(queryClient: QueryClient): Promise<void> {
  try {
    await api.post<void>('/api/auth/sign-out');
  } catch (error) {
    if (!(error instanceof ApiError && error.status === 401)) throw error;
  } finally {
    resetCsrfToken();
  }
  queryClient.clear();
}
