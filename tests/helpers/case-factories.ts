// Case-side factories: a case, a capture row (no stored file), its analysis and a finding, for
// tests that need rows without going through an upload (the route-table walk, status moves).
import { randomUUID } from 'node:crypto';
import { Analysis, Capture, Case, Finding, type Shop } from '../../server/models';
import { CaptureMetadataSchema, type CaptureMetadataInput } from '../../shared/schemas/captures';
import type { CaseStatus } from '../../shared/schemas/cases';

/** The metadata of a generated two-channel capture (channel 1 reference, channel 2 pickup). */
export function metadataFor(overrides: Partial<CaptureMetadataInput> = {}): CaptureMetadataInput {
  return {
    channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 1, unit: 'g' }],
    reference: { kind: 'cyl1', polarity: 'auto', tdcOffsetDeg: 0, perCycle: null },
    sensorKind: 'accelerometer',
    probePoint: { label: 'alternator front housing', component: 'Alternator' },
    condition: { speed: 'idle', acClutch: 'off', electricalLoad: 'unknown', beltOff: false },
    phase: 'before',
    source: 'upload',
    ...overrides,
  };
}

/** A case row in `shop` (status open unless given). */
export async function createCaseRow(shop: Shop, opts: { status?: CaseStatus; engineId?: number | null; leadId?: number | null } = {}): Promise<Case> {
  return Case.create({
    shopId: shop.id, roNumber: `RO-${randomUUID().slice(0, 6)}`, vehicle: { year: 2016, make: 'Nordfahrt', model: 'Kestrel', vin: null, odometer: 120000, odometerUnit: 'km' },
    engineId: opts.engineId ?? null, complaint: 'Whine at idle', technicianId: null, leadId: opts.leadId ?? null, createdById: null,
    status: opts.status ?? 'open', searchText: 'nordfahrt kestrel whine',
  });
}

/** A capture row with a queued (or given) analysis; its storage key points at nothing. */
export async function createCaptureRow(shop: Shop, c: Case, opts: { status?: 'queued' | 'done' | 'failed' } = {}): Promise<{ capture: Capture; analysis: Analysis }> {
  const capture = await Capture.create({
    shopId: shop.id, caseId: c.id, uploadedById: null, originalName: 'capture.wav', format: 'wav', byteSize: 1000, sha256: '0'.repeat(64),
    storageKey: `shops/${shop.id}/captures/${randomUUID()}`, sampleRateHz: 24000, channelCount: 2, durationS: 2, phase: 'before',
    metadata: CaptureMetadataSchema.parse(metadataFor()), currentAnalysisId: null,
  });
  const analysis = await Analysis.create({ shopId: shop.id, captureId: capture.id, status: opts.status ?? 'queued', stage: 'queued', runSettings: {} });
  capture.currentAnalysisId = analysis.id;
  await capture.save();
  return { capture, analysis };
}

/** A suggested finding on a case. */
export async function createFindingRow(shop: Shop, c: Case, component = 'Alternator', fault: Finding['fault'] = 'outer_race'): Promise<Finding> {
  return Finding.create({
    shopId: shop.id, caseId: c.id, componentKey: component.toLowerCase(), component, target: 'component', fault, rank: 1, score: 0.7, order: 10.9,
    nominalOrder: 11, slipPct: 1, evidence: 'test', notes: [], indistinguishableFrom: [], approximate: false, engineBorn: false, captures: [],
    afterRepairScore: null, status: 'suggested',
  });
}
