import type { CaseListQuery } from '../../../../shared/schemas/cases';

/** Query keys of cases (STYLE.md §7): all → lists → list(filters) → details → detail(id) → sub-resources. */
export const caseKeys = {
  all: ['cases'] as const,
  lists: () => [...caseKeys.all, 'list'] as const,
  list: (filters: CaseListQuery) => [...caseKeys.lists(), filters] as const,
  details: () => [...caseKeys.all, 'detail'] as const,
  detail: (id: number) => [...caseKeys.details(), id] as const,
  people: () => [...caseKeys.all, 'people'] as const,
  shop: () => [...caseKeys.all, 'shop'] as const,
  drive: (engineId: number) => [...caseKeys.all, 'drive', engineId] as const,
  capture: (id: number) => [...caseKeys.all, 'capture', id] as const,
  series: (analysisId: number, name: string, params: Record<string, number | undefined>) => [...caseKeys.all, 'series', analysisId, name, params] as const,
};
