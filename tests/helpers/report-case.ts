// An invented case as GET /api/cases/:id returns it (docs/api.md), confirmed on the alternator's
// outer race, with one before-repair and one after-repair capture, for the report tests.
import type { FindingDto } from '../../shared/schemas/analyses';
import type { CaseDto } from '../../shared/schemas/cases';

const person = (id: number, name: string, role: string) => ({ id, name, role });

/** A finding with its lines in a before capture and (optionally) an after capture. */
export function alternatorFinding(afterAmplitude: number | null): FindingDto {
  const before = [
    { label: 'BPFO 1x', spectrum: 'envelope' as const, nominalOrder: 8.1, order: 8.02, amplitude: 0.04, snrDb: 18, cycleGain: 0.05 },
    { label: 'BPFO 2x', spectrum: 'envelope' as const, nominalOrder: 16.2, order: 16.05, amplitude: 0.01, snrDb: 9, cycleGain: 0.05 },
  ];
  const after = afterAmplitude === null ? [] : [{ ...before[0]!, amplitude: afterAmplitude, snrDb: 4 }];
  return {
    id: 41, caseId: 12, rank: 1, component: 'Alternator', target: 'component', fault: 'outer_race', score: 0.82, order: 8.02,
    nominalOrder: 8.1, slipPct: 1.1, evidence: 'Alternator, outer race: 2 harmonics at 8.02, 16.05 orders in the envelope, 18 dB above floor.',
    notes: [], indistinguishableFrom: [], approximate: false, engineBorn: false, status: 'confirmed', inRanking: true,
    decidedBy: person(2, 'Lena Lead', 'lead'), decidedAt: '2026-12-03T09:00:00.000Z', note: 'Rough by hand',
    captures: [
      { captureId: 7, phase: 'before', probePoint: 'alternator front housing', score: 0.82, strongestSnrDb: 18, lines: before },
      { captureId: 9, phase: 'after_repair', probePoint: 'alternator front housing', score: 0.1, strongestSnrDb: 4, lines: after },
    ],
    afterRepairScore: 0.1,
  };
}

/** The confirmed case. */
export function confirmedCase(afterAmplitude: number | null = 0.008): CaseDto {
  const finding = alternatorFinding(afterAmplitude);
  return {
    id: 12, roNumber: 'RO-48213', status: 'verified',
    vehicle: { year: 2017, make: 'Nordfahrt', model: 'Kestrel', vin: null, odometer: 142300, odometerUnit: 'km' },
    vehicleLabel: '2017 Nordfahrt Kestrel', complaint: 'Whine at idle, worse with lights on', engine: { id: 4, name: 'Demo 1.6 I4 petrol' },
    technician: person(3, 'Tess Tech', 'tech'), lead: person(2, 'Lena Lead', 'lead'), captureCount: 2,
    topSuspect: { component: 'Alternator', fault: 'outer_race', score: 0.82 }, createdAt: '2026-12-03T08:00:00.000Z', updatedAt: '2026-12-03T09:30:00.000Z',
    version: 5, advisorName: 'Sam Idowu', advisorEmail: 'sam@example.test', allowedMoves: ['closed'], rankable: { ok: false, reason: null },
    captures: [], findings: [finding], timeline: [],
    confirmed: { component: 'Alternator', fault: 'outer_race', findingId: 41, note: 'Rough by hand', by: person(2, 'Lena Lead', 'lead'), at: '2026-12-03T09:00:00.000Z' },
  };
}
