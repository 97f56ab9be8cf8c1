import { queryOptions } from '@tanstack/react-query';
import type { BearingGeometry } from '../../../../shared/drive/bearing-table';
import type { BearingListResponse, BearingTypeDto } from '../../../../shared/schemas/bearings';
import { api } from '../../../lib/api-client';
import { bearingKeys } from './bearing-keys';

/** GET /api/bearings: the shop's bearing table. */
export const bearingsQueryOptions = () =>
  queryOptions({
    queryKey: bearingKeys.list(),
    queryFn: ({ signal }) => api.get<BearingListResponse>('/api/bearings', { signal }),
  });

/** The rows as the drive kinematics' shop table (for live defect orders on the engine page). */
export function toShopTable(items: readonly BearingTypeDto[]): BearingGeometry[] {
  return items.map((b) => ({ designation: b.designation, balls: b.balls, ballMm: b.ballMm, pitchMm: b.pitchMm, contactDeg: b.contactDeg, source: b.source, note: b.notes }));
}
