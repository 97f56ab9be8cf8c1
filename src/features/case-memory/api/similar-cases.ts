import { queryOptions } from '@tanstack/react-query';
import type { SimilarCasesDto } from '../../../../shared/schemas/calibration';
import { api } from '../../../lib/api-client';

/** Query keys of case memory: all → forCase(id). */
export const similarCaseKeys = {
  all: ['similar-cases'] as const,
  forCase: (caseId: number) => [...similarCaseKeys.all, caseId] as const,
};

/** GET /api/cases/:id/similar: up to three confirmed earlier cases most alike this one. */
export const similarCasesQueryOptions = (caseId: number) =>
  queryOptions({
    queryKey: similarCaseKeys.forCase(caseId),
    queryFn: ({ signal }) => api.get<SimilarCasesDto>(`/api/cases/${caseId}/similar`, { signal }),
  });
