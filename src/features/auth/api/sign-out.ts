import { ApiError, api, resetCsrfToken } from '../../../lib/api-client';

/**
 * Ends the session (POST /api/auth/sign-out); a session that was already gone (401) counts as
 * signed out. The cached data of this user is dropped by the sign-in page once the signed-in
 * layout has unmounted: clearing it earlier would make the still-mounted pages refetch and fail.
 */
export async function signOut(): Promise<void> {
  try {
    await api.post<void>('/api/auth/sign-out');
  } catch (error) {
    if (!(error instanceof ApiError && error.status === 401)) throw error;
  } finally {
    resetCsrfToken();
  }
}
