import { queryOptions } from '@tanstack/react-query';
import type { ListResponse } from '../../../../shared/schemas/common';
import type { OutboxItem, OutboxMessage } from '../../../../shared/schemas/invites';
import { api } from '../../../lib/api-client';
import { outboxKeys } from './outbox-keys';

/** GET /api/outbox (admin): messages the mail fake received, newest first as the server sends them. */
export const outboxListQueryOptions = () =>
  queryOptions({
    queryKey: outboxKeys.list(),
    queryFn: ({ signal }) => api.get<ListResponse<OutboxItem>>('/api/outbox', { signal }),
    staleTime: 5_000,
  });

/** GET /api/outbox/:id (admin): one message with its text. */
export const outboxMessageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: outboxKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ message: OutboxMessage }>(`/api/outbox/${id}`, { signal }),
  });
