// BearingType → DTO, with its defect factors for the inner ring turning and how many parts name it.
import { factorsFromGeometry } from '../../shared/drive/bearing-factors';
import type { BearingTypeDto } from '../../shared/schemas/bearings';
import type { BearingType } from '../models/bearing-type';

/** One row of the Bearings page. */
export function presentBearing(row: BearingType, usedBy: number): BearingTypeDto {
  return {
    id: row.id, designation: row.designation, balls: row.balls, ballMm: row.ballMm, pitchMm: row.pitchMm,
    contactDeg: row.contactDeg, source: row.source, notes: row.notes,
    factors: factorsFromGeometry(row, 'inner'), usedBy, updatedAt: row.updatedAt.toISOString(),
  };
}
