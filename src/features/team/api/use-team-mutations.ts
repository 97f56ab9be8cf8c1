import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CreateInvite, InviteDto } from '../../../../shared/schemas/invites';
import type { UpdateUser, UserResponse } from '../../../../shared/schemas/users';
import { api } from '../../../lib/api-client';
import { inviteKeys, userKeys } from './team-keys';

/** PATCH /api/users/:id (role, active, name); 409 `cannot_change_self` for the admin's own row. */
export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, changes }: { id: number; changes: UpdateUser }) => api.patch<UserResponse>(`/api/users/${id}`, changes),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}

/** POST /api/invites: sends the invite e-mail; the form shows field errors itself. */
export function useCreateInvite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateInvite) => api.post<{ invite: InviteDto }>('/api/invites', body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: inviteKeys.lists() }),
    meta: { inlineErrors: true },
  });
}

/** DELETE /api/invites/:id: the link stops working. */
export function useRevokeInvite() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/invites/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: inviteKeys.lists() }),
  });
}
