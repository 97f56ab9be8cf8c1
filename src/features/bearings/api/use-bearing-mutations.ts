import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BearingTypeDto, BearingTypeInput } from '../../../../shared/schemas/bearings';
import { api } from '../../../lib/api-client';
import { bearingKeys } from './bearing-keys';

/** POST /api/bearings, or PUT /api/bearings/:id when `id` is given; the form shows field errors. */
export function useSaveBearing() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, body }: { id?: number; body: BearingTypeInput }) =>
      (id === undefined ? api.post<{ bearing: BearingTypeDto }>('/api/bearings', body) : api.put<{ bearing: BearingTypeDto }>(`/api/bearings/${id}`, body))
        .then((r) => r.bearing),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: bearingKeys.lists() }),
    meta: { inlineErrors: true },
  });
}

/** DELETE /api/bearings/:id; 409 `bearing_in_use` while a component names it (toast). */
export function useDeleteBearing() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/bearings/${id}`),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: bearingKeys.lists() }),
  });
}
