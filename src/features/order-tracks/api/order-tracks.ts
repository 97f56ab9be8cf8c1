import { queryOptions } from '@tanstack/react-query';
import type { OrderTracksDto } from '../../../../shared/schemas/order-tracks';
import { api } from '../../../lib/api-client';

/** Query keys of order tracks: all → forAnalysis(id). */
export const orderTrackKeys = {
  all: ['order-tracks'] as const,
  forAnalysis: (analysisId: number) => [...orderTrackKeys.all, analysisId] as const,
};

/** GET /api/analyses/:id/order-tracks (404 no_sweep when the speed did not sweep). */
export const orderTracksQueryOptions = (analysisId: number) =>
  queryOptions({
    queryKey: orderTrackKeys.forAnalysis(analysisId),
    queryFn: ({ signal }) => api.get<OrderTracksDto>(`/api/analyses/${analysisId}/order-tracks`, { signal }),
    retry: false,
  });
