import { queryOptions } from '@tanstack/react-query';
import type { InviteInfo } from '../../../../shared/schemas/invites';
import type { UserResponse } from '../../../../shared/schemas/users';
import { api } from '../../../lib/api-client';
import { authKeys } from './auth-keys';

/**
 * The signed-in user (GET /api/auth/me). Quiet: a 401 here is the normal "not signed in" answer,
 * which the app layout's loader turns into a redirect rather than an error toast.
 */
export const meQueryOptions = () =>
  queryOptions({
    queryKey: authKeys.me(),
    queryFn: ({ signal }) => api.get<UserResponse>('/api/auth/me', { signal }),
    staleTime: 5 * 60_000,
    meta: { quiet: true },
  });

/** The shop and address an invite link was sent to (public). Errors are shown by the accept page. */
export const inviteInfoQueryOptions = (token: string) =>
  queryOptions({
    queryKey: authKeys.invite(token),
    queryFn: ({ signal }) => api.get<InviteInfo>(`/api/invites/${encodeURIComponent(token)}/info`, { signal }),
    meta: { quiet: true },
  });
