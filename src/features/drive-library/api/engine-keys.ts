import type { EngineListQuery } from '../../../../shared/schemas/engines-api';

/** Query keys of the Drive library (DEVELOPERS.md "Client: TanStack Query"): all → lists → list(filters) → details → detail(id) → calibration(id). */
export const engineKeys = {
  all: ['engines'] as const,
  lists: () => [...engineKeys.all, 'list'] as const,
  list: (filters: EngineListQuery) => [...engineKeys.lists(), filters] as const,
  details: () => [...engineKeys.all, 'detail'] as const,
  detail: (id: number) => [...engineKeys.details(), id] as const,
  calibration: (id: number) => [...engineKeys.detail(id), 'calibration'] as const,
  history: (id: number) => [...engineKeys.detail(id), 'history'] as const,
};
