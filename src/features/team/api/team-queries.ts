import { queryOptions } from '@tanstack/react-query';
import type { ListResponse } from '../../../../shared/schemas/common';
import type { InviteDto } from '../../../../shared/schemas/invites';
import type { UserDto } from '../../../../shared/schemas/users';
import { api } from '../../../lib/api-client';
import { inviteKeys, userKeys } from './team-keys';

/** GET /api/users (admin): every user of the admin's shop. */
export const usersQueryOptions = () =>
  queryOptions({
    queryKey: userKeys.list(),
    queryFn: ({ signal }) => api.get<ListResponse<UserDto>>('/api/users', { signal }),
  });

/** GET /api/invites (admin): the shop's invites, accepted or not. */
export const invitesQueryOptions = () =>
  queryOptions({
    queryKey: inviteKeys.list(),
    queryFn: ({ signal }) => api.get<ListResponse<InviteDto>>('/api/invites', { signal }),
  });
