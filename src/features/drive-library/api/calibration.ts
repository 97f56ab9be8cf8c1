import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalibrationDecision, CalibrationDto } from '../../../../shared/schemas/calibration';
import { api } from '../../../lib/api-client';
import { engineKeys } from './engine-keys';

/** GET /api/engines/:id/calibration: measured ratio corrections of the engine's parts and the accepted ones. */
export const calibrationQueryOptions = (id: number) =>
  queryOptions({
    queryKey: engineKeys.calibration(id),
    queryFn: ({ signal }) => api.get<CalibrationDto>(`/api/engines/${id}/calibration`, { signal }),
  });

/** PUT /api/engines/:id/calibration: a lead accepts or withdraws a part's correction. */
export function useDecideCalibration(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CalibrationDecision) => api.put<CalibrationDto>(`/api/engines/${id}/calibration`, body),
    onSuccess: (data) => { qc.setQueryData(engineKeys.calibration(id), data); },
  });
}
