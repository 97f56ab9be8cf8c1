import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { DriveDocument } from '../../../../shared/drive/types';
import type { CsvImportPreviewDto, EngineDetailDto } from '../../../../shared/schemas/engines-api';
import { api } from '../../../lib/api-client';
import { engineKeys } from './engine-keys';

type EngineBody = DriveDocument & { notes?: string; version?: number };
type EngineResponse = { engine: EngineDetailDto };

function useEngineCacheUpdate() {
  const queryClient = useQueryClient();
  return (engine: EngineDetailDto) => {
    queryClient.setQueryData(engineKeys.detail(engine.id), engine);
    void queryClient.invalidateQueries({ queryKey: engineKeys.history(engine.id) });
    return queryClient.invalidateQueries({ queryKey: engineKeys.lists() });
  };
}

/** POST /api/engines; field errors are shown at their cells, so no toast. */
export function useCreateEngine() {
  const update = useEngineCacheUpdate();
  return useMutation({
    mutationFn: (body: EngineBody) => api.post<EngineResponse>('/api/engines', body).then((r) => r.engine),
    onSuccess: (engine) => update(engine),
    meta: { inlineErrors: true },
  });
}

/** PUT /api/engines/:id (the whole document). */
export function useUpdateEngine(id: number) {
  const update = useEngineCacheUpdate();
  return useMutation({
    mutationFn: (body: EngineBody) => api.put<EngineResponse>(`/api/engines/${id}`, body).then((r) => r.engine),
    onSuccess: (engine) => update(engine),
    meta: { inlineErrors: true },
  });
}

/** POST /api/engines/:id/duplicate → the copy. */
export function useDuplicateEngine() {
  const update = useEngineCacheUpdate();
  return useMutation({
    mutationFn: (id: number) => api.post<EngineResponse>(`/api/engines/${id}/duplicate`).then((r) => r.engine),
    onSuccess: (engine) => update(engine),
  });
}

/** DELETE /api/engines/:id; 409 `engine_in_use` while cases use it (shown as a toast). */
export function useDeleteEngine() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (id: number) => api.delete(`/api/engines/${id}`),
    onSuccess: (_data, id) => {
      queryClient.removeQueries({ queryKey: engineKeys.detail(id) });
      return queryClient.invalidateQueries({ queryKey: engineKeys.lists() });
    },
  });
}

/** POST /api/engines/import.json: a drive document file as a new engine; problems listed in the dialog. */
export function useImportEngineJson() {
  const update = useEngineCacheUpdate();
  return useMutation({
    mutationFn: (doc: unknown) => api.post<EngineResponse>('/api/engines/import.json', doc).then((r) => r.engine),
    onSuccess: (engine) => update(engine),
    meta: { inlineErrors: true },
  });
}

/** POST /api/engines/:id/import.csv?preview=1: what the import would change, nothing written. */
export function usePreviewEngineCsv(id: number) {
  return useMutation({
    mutationFn: (csv: string) => api.post<{ preview: CsvImportPreviewDto }>(`/api/engines/${id}/import.csv?preview=1`, { csv }).then((r) => r.preview),
    meta: { inlineErrors: true },
  });
}

/** POST /api/engines/:id/import.csv with the version previewed: replaces the engine (or its parts); problems listed by line. */
export function useImportComponentsCsv(id: number) {
  const update = useEngineCacheUpdate();
  return useMutation({
    mutationFn: ({ csv, version }: { csv: string; version: number }) =>
      api.post<EngineResponse & { imported: { rows: number } }>(`/api/engines/${id}/import.csv`, { csv, version }),
    onSuccess: (r) => update(r.engine),
    meta: { inlineErrors: true },
  });
}

/** POST /api/engines/import.csv: a whole-engine CSV as a new engine. */
export function useImportEngineCsv() {
  const update = useEngineCacheUpdate();
  return useMutation({
    mutationFn: (csv: string) => api.post<EngineResponse & { imported: { rows: number } }>('/api/engines/import.csv', { csv }).then((r) => r.engine),
    onSuccess: (engine) => update(engine),
    meta: { inlineErrors: true },
  });
}
