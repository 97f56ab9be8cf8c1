import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { DriveDocument } from '../../../../shared/drive/types';
import { isFinalStatus, type SeriesDto, type SeriesName } from '../../../../shared/schemas/analyses';
import type { CaptureDto } from '../../../../shared/schemas/captures';
import type { CaseDto, CaseListQuery, CaseListResponse, CasePeopleResponse } from '../../../../shared/schemas/cases';
import type { ShopSettingsDto } from '../../../../shared/schemas/shop-settings';
import { api } from '../../../lib/api-client';
import { caseKeys } from './case-keys';

/** The default filters of the cases table. */
export const DEFAULT_CASE_FILTERS: CaseListQuery = { status: [], search: '', sort: '-updatedAt', page: 1, pageSize: 20 };

/** GET /api/cases with every filter in the key; the previous page stays on screen while the next loads. */
export const casesQueryOptions = (filters: CaseListQuery) =>
  queryOptions({
    queryKey: caseKeys.list(filters),
    queryFn: ({ signal }) => {
      const qs = new URLSearchParams({ search: filters.search, sort: filters.sort, page: String(filters.page), pageSize: String(filters.pageSize) });
      if (filters.status.length > 0) qs.set('status', filters.status.join(','));
      if (filters.technicianId) qs.set('technicianId', String(filters.technicianId));
      if (filters.leadId) qs.set('leadId', String(filters.leadId));
      return api.get<CaseListResponse>(`/api/cases?${qs}`, { signal });
    },
    placeholderData: keepPreviousData,
  });

/** Whether any capture of the case still has an analysis on its way. */
export function analysesPending(c: Pick<CaseDto, 'captures'>): boolean {
  return c.captures.some((cap) => cap.analysis !== null && !isFinalStatus(cap.analysis.status));
}

/** GET /api/cases/:id; polls every 1.5 s while an analysis runs, and stops once all are final. */
export const caseQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ case: CaseDto }>(`/api/cases/${id}`, { signal }).then((r) => r.case),
    refetchInterval: (query) => (query.state.data && analysesPending(query.state.data) ? 1500 : false),
  });

/** GET /api/cases/people: who can be assigned. */
export const casePeopleQueryOptions = () =>
  queryOptions({
    queryKey: caseKeys.people(),
    queryFn: ({ signal }) => api.get<CasePeopleResponse>('/api/cases/people', { signal }),
    staleTime: 5 * 60_000,
  });

/** The engine's drive document (GET /api/engines/:id/export.json): candidate lines for the plots. */
export const caseDriveQueryOptions = (engineId: number) =>
  queryOptions({
    queryKey: caseKeys.drive(engineId),
    queryFn: ({ signal }) => api.get<DriveDocument>(`/api/engines/${engineId}/export.json`, { signal }),
    staleTime: 60_000,
  });

/** GET /api/captures/:id. */
export const captureQueryOptions = (id: number) =>
  queryOptions({
    queryKey: caseKeys.capture(id),
    queryFn: ({ signal }) => api.get<{ capture: CaptureDto }>(`/api/captures/${id}`, { signal }).then((r) => r.capture),
  });

/** GET /api/analyses/:id/series/:name (decimated server-side, peaks kept). Series of a done analysis never change. */
export const seriesQueryOptions = <T extends SeriesDto = SeriesDto>(analysisId: number, name: SeriesName, params: { points?: number; band?: number } = {}) =>
  queryOptions({
    queryKey: caseKeys.series(analysisId, name, params),
    queryFn: ({ signal }) => {
      const qs = new URLSearchParams();
      if (params.points) qs.set('points', String(params.points));
      if (params.band !== undefined) qs.set('band', String(params.band));
      return api.get<T>(`/api/analyses/${analysisId}/series/${name}?${qs}`, { signal });
    },
    staleTime: Infinity,
    // The plots show their own error state; no toast on top of it.
    meta: { quiet: true },
  });

/** Where the browser fetches a capture's pickup channel as WAV, the case's report PDF and export zip. */
export const captureAudioUrl = (captureId: number) => `/api/captures/${captureId}/audio`;
export const reportPdfUrl = (caseId: number, copy: 'advisor' | 'customer') => `/api/cases/${caseId}/report.pdf?copy=${copy}`;
export const caseExportUrl = (caseId: number) => `/api/cases/${caseId}/export.zip`;

/** GET /api/shop/settings: the report header (name, address, phone) and the new-case defaults (lead, advisor's e-mail). */
export const caseShopQueryOptions = () =>
  queryOptions({
    queryKey: caseKeys.shop(),
    queryFn: ({ signal }) => api.get<{ settings: ShopSettingsDto }>('/api/shop/settings', { signal }).then((r) => r.settings),
    staleTime: 60_000,
    meta: { quiet: true },
  });
