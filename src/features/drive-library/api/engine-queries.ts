import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { EngineDetailDto, EngineListQuery, EngineListResponse, EngineRevisionDto } from '../../../../shared/schemas/engines-api';
import { api } from '../../../lib/api-client';
import { engineKeys } from './engine-keys';

/** The default filters of the engines table. */
export const DEFAULT_ENGINE_FILTERS: EngineListQuery = { search: '', sort: 'name', page: 1, pageSize: 20 };

/** GET /api/engines with search, sort and page in the key; the previous page stays on screen while the next loads. */
export const enginesQueryOptions = (filters: EngineListQuery) =>
  queryOptions({
    queryKey: engineKeys.list(filters),
    queryFn: ({ signal }) => {
      const qs = new URLSearchParams({ search: filters.search, sort: filters.sort, page: String(filters.page), pageSize: String(filters.pageSize) });
      return api.get<EngineListResponse>(`/api/engines?${qs}`, { signal });
    },
    placeholderData: keepPreviousData,
  });

/** GET /api/engines/:id: the drive document, notes and computed orders. */
export const engineQueryOptions = (id: number) =>
  queryOptions({
    queryKey: engineKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ engine: EngineDetailDto }>(`/api/engines/${id}`, { signal }).then((r) => r.engine),
  });

/** GET /api/engines/:id/history: each save, newest first. */
export const engineHistoryQueryOptions = (id: number) =>
  queryOptions({
    queryKey: engineKeys.history(id),
    queryFn: ({ signal }) => api.get<{ items: EngineRevisionDto[] }>(`/api/engines/${id}/history`, { signal }).then((r) => r.items),
  });

/** Where the browser downloads an engine's exports from (CSV = the whole engine). */
export const engineExportUrl = (id: number, format: 'json' | 'csv') => `/api/engines/${id}/export.${format}`;
