import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { AnalysisDto, FindingDto } from '../../../../shared/schemas/analyses';
import type { CaseDto, ConfirmCause, CreateCaseInput, UpdateCase } from '../../../../shared/schemas/cases';
import { api } from '../../../lib/api-client';
import { caseKeys } from './case-keys';

function refreshCase(queryClient: QueryClient, c: CaseDto) {
  queryClient.setQueryData(caseKeys.detail(c.id), c);
  void queryClient.invalidateQueries({ queryKey: caseKeys.lists() });
}

/** POST /api/cases. */
export function useCreateCase() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: CreateCaseInput) => api.post<{ case: CaseDto }>('/api/cases', body).then((r) => r.case),
    onSuccess: (c) => refreshCase(queryClient, c),
    meta: { inlineErrors: true },
  });
}

/** PATCH /api/cases/:id (with the version read). */
export function useUpdateCase(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateCase) => api.patch<{ case: CaseDto }>(`/api/cases/${id}`, body).then((r) => r.case),
    onSuccess: (c) => refreshCase(queryClient, c),
    meta: { inlineErrors: true },
  });
}

/** The status moves and re-rank: POST /api/cases/:id/{complete,rerank,reopen,verify,close}. */
export function useCaseMove(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ move, note }: { move: 'complete' | 'rerank' | 'reopen' | 'verify' | 'close'; note?: string }) =>
      api.post<{ case: CaseDto }>(`/api/cases/${id}/${move}`, note === undefined ? {} : { note }).then((r) => r.case),
    onSuccess: (c) => refreshCase(queryClient, c),
  });
}

/** POST /api/cases/:id/confirm: a suspect or a part not in the list, with a note. */
export function useConfirmCause(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: ConfirmCause) => api.post<{ case: CaseDto }>(`/api/cases/${id}/confirm`, body).then((r) => r.case),
    onSuccess: (c) => refreshCase(queryClient, c),
    meta: { inlineErrors: true },
  });
}

/** POST /api/findings/:id/{dismiss,restore} with a note; the case is read again for its timeline. */
export function useFindingDecision(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ findingId, decision, note }: { findingId: number; decision: 'dismiss' | 'restore'; note: string }) =>
      api.post<{ finding: FindingDto }>(`/api/findings/${findingId}/${decision}`, { note }).then((r) => r.finding),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: caseKeys.detail(caseId) }),
    meta: { inlineErrors: true },
  });
}

/** POST /api/analyses/:id/retry. */
export function useRetryAnalysis(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (analysisId: number) => api.post<{ analysis: AnalysisDto }>(`/api/analyses/${analysisId}/retry`).then((r) => r.analysis),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: caseKeys.detail(caseId) }),
  });
}

/** POST /api/cases/:id/report/send: mails the report to the service advisor. */
export function useSendReport(caseId: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: { copy: 'advisor' | 'customer'; to?: string }) => api.post<{ sentTo: string }>(`/api/cases/${caseId}/report/send`, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: caseKeys.detail(caseId) }),
  });
}
