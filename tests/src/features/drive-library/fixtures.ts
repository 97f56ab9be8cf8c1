import { BUILT_IN_BEARINGS } from '../../../../shared/drive/bearing-table';
import { factorsFromGeometry } from '../../../../shared/drive/bearing-factors';
import type { DriveDocument } from '../../../../shared/drive/types';
import { computeEngine } from '../../../../shared/drive-io/engine-kinematics';
import type { BearingTypeDto } from '../../../../shared/schemas/bearings';
import type { EngineDetailDto, EngineSummaryDto } from '../../../../shared/schemas/engines-api';

/** The shop table the fake API serves: the published rows. */
export const BEARINGS: BearingTypeDto[] = BUILT_IN_BEARINGS.filter((b) => b.source === 'published').map((b, i) => ({
  id: i + 1, designation: b.designation, balls: b.balls, ballMm: b.ballMm, pitchMm: b.pitchMm, contactDeg: b.contactDeg,
  source: b.source, notes: b.note, factors: factorsFromGeometry(b, 'inner'), usedBy: 0, updatedAt: '2026-03-01T10:00:00.000Z',
}));

/** An engine DTO as GET /api/engines/:id sends it, computed with the shared kinematics. */
export function engineDto(doc: DriveDocument, id = 41): EngineDetailDto {
  const shopTable = BUILT_IN_BEARINGS.filter((b) => b.source === 'published');
  return { ...doc, id, notes: 'invented demo values', version: 1, updatedAt: '2026-03-01T10:00:00.000Z', computed: computeEngine(doc, shopTable) };
}

/** A row of the engines table. */
export function summary(doc: DriveDocument, id: number): EngineSummaryDto {
  return { id, name: doc.name, cylinders: doc.cylinders, firingOrder: doc.firingOrder, idleRpm: doc.idleRpm ?? null, belts: doc.belts.length, components: doc.components.length, updatedAt: '2026-03-01T10:00:00.000Z' };
}

/** The shop's settings as GET /api/shop/settings sends them (defaults). */
export const SETTINGS = {
  id: 1, isDemo: false, name: 'Test Garage', address: '', phone: '', defaultLeadId: null, serviceAdvisorEmail: '',
  analysisDefaults: { envelopeBand: 'auto' as const, envelopeMaxHz: 9000, samplesPerRev: 256, revsPerBlock: 32 },
  groovedOffsetMm: 2, backsideOffsetMm: 3, pulleyUnit: 'mm' as const, leads: [],
};
