import { queryOptions } from '@tanstack/react-query';
import type { SetupStatus } from '../../../../shared/schemas/setup';
import { api } from '../../../lib/api-client';
import { setupKeys } from './setup-keys';

/** GET /api/setup/status: whether a real shop still has to be created. */
export const setupStatusQueryOptions = () =>
  queryOptions({
    queryKey: setupKeys.status(),
    queryFn: ({ signal }) => api.get<SetupStatus>('/api/setup/status', { signal }),
    staleTime: 60_000,
  });
