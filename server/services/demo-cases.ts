/**
 * The demo shop's three invented cases (issue 15 item 8), seeded on the first run with captures
 * from the project's generator, analysed and ranked before the server listens:
 * 1. a bad alternator bearing captured at two probe points, louder near the alternator;
 * 2. a bad backside idler;
 * 3. a noise that is the engine's own vibration at its firing order: no accessory ranks high.
 * The captures go through the job path's own `runClaimedJob` on the pool (a lease held by the
 * seeder), so their results are stored exactly as an upload's are. Invented RO numbers, vehicles
 * and complaints.
 */
import { createHash, randomUUID } from 'node:crypto';
import { Readable } from 'node:stream';
import { QueryTypes } from 'sequelize';
import { CaptureMetadataSchema, type CaptureMetadataInput } from '../../shared/schemas/captures';
import { encodeWav } from '../../shared/synth/encode-wav';
import { generateCapture } from '../../shared/synth/generate-capture';
import type { GenerateOptionsInput } from '../../shared/synth/options';
import { DEMO_I4 } from '../db/seeders/demo-engines';
import { runClaimedJob } from '../jobs/analysis-job';
import type { Logger } from '../logger';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import { Case } from '../models/case';
import { Engine } from '../models/engine';
import { Shop } from '../models/shop';
import { User } from '../models/user';
import { runTask } from '../pool';
import type { ObjectStorage } from '../storage/storage';
import { rankAndStore } from './case-ranking';
import { appendTimeline } from './case-timeline';
import { sequelizeOf } from './cases';

interface DemoCapture { name: string; probe: string; component: string | null; options: Omit<GenerateOptionsInput, 'drive'> }
interface DemoCase { roNumber: string; vehicle: { year: number; make: string; model: string }; odometer: number; complaint: string; captures: DemoCapture[] }

const short = { durationS: 6, sampleRateHz: 24000, refKind: 'cyl1', tdcOffsetDeg: 8, creepPct: 1 } as const;

/** The three demo cases (invented). */
export const DEMO_CASES: readonly DemoCase[] = [
  {
    roNumber: 'RO-20417', vehicle: { year: 2016, make: 'Nordfahrt', model: 'Kestrel' }, odometer: 148200,
    complaint: 'Whirring at idle from the front of the engine, louder on cold mornings',
    captures: [
      { name: 'alternator-housing-idle.wav', probe: 'alternator rear housing', component: 'Alternator', options: { ...short, seed: 2041, fault: { component: 'Alternator', fault: 'outer_race' }, snrDb: 6 } },
      { name: 'water-pump-idle.wav', probe: 'water pump body', component: 'Water pump', options: { ...short, seed: 2042, fault: { component: 'Alternator', fault: 'outer_race' }, snrDb: -4 } },
    ],
  },
  {
    roNumber: 'RO-20433', vehicle: { year: 2014, make: 'Aldercrest', model: 'Tern Wagon' }, odometer: 201750,
    complaint: 'Chirp and rumble from the belt area, goes away when the engine is revved',
    captures: [
      { name: 'upper-idler-idle.wav', probe: 'upper idler bracket', component: 'Upper idler', options: { ...short, seed: 2051, fault: { component: 'Upper idler', fault: 'outer_race' }, snrDb: 4 } },
    ],
  },
  {
    roNumber: 'RO-20458', vehicle: { year: 2019, make: 'Nordfahrt', model: 'Kestrel Sport' }, odometer: 63400,
    complaint: 'Drone felt in the cabin at idle; customer suspects the alternator',
    captures: [
      { name: 'alternator-bracket-idle.wav', probe: 'alternator bracket', component: 'Alternator', options: { ...short, seed: 2061, fault: null, engineLevel: 3 } },
    ],
  },
];

/** Seeds the demo cases once (when the demo shop has none); returns how many were made. */
export async function seedDemoCases(storage: ObjectStorage, logger: Logger): Promise<number> {
  const shop = await Shop.findOne({ where: { isDemo: true } });
  if (!shop || (await Case.count({ where: { shopId: shop.id } })) > 0) return 0;
  const engine = await Engine.findOne({ where: { shopId: shop.id, name: DEMO_I4.name } });
  if (!engine) return 0;
  const users = await User.findAll({ where: { shopId: shop.id } });
  const tech = users.find((u) => u.role === 'tech') ?? null;
  const lead = users.find((u) => u.role === 'lead') ?? null;
  const holder = `demo-seed:${process.pid}`;
  let made = 0;
  for (const spec of DEMO_CASES) {
    const c = await Case.create({
      shopId: shop.id, roNumber: spec.roNumber, vehicle: { ...spec.vehicle, vin: null, odometer: spec.odometer, odometerUnit: 'km' }, engineId: engine.id,
      complaint: spec.complaint, technicianId: tech?.id ?? null, leadId: lead?.id ?? null, createdById: tech?.id ?? null, advisorName: 'Ola Brandt',
      advisorEmail: 'ola.advisor@demo.crankwise.test', status: 'testing',
      searchText: [spec.roNumber, spec.vehicle.year, spec.vehicle.make, spec.vehicle.model, spec.complaint].join(' ').toLowerCase(),
    });
    await appendTimeline({ shopId: shop.id, caseId: c.id, actorId: tech?.id ?? null, kind: 'created', message: `${tech?.name ?? 'The demo'} opened the case for ${spec.roNumber}` });
    for (const cap of spec.captures) {
      const gen = generateCapture({ drive: DEMO_I4, ...cap.options });
      const wav = encodeWav(gen.channels, gen.sampleRateHz, 'float32');
      const key = `shops/${shop.id}/captures/${randomUUID()}`;
      await storage.put(key, Readable.from([Buffer.from(wav.buffer, wav.byteOffset, wav.byteLength)]));
      const input: CaptureMetadataInput = {
        channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 1, unit: 'g' }],
        reference: { kind: 'cyl1', polarity: 'auto', tdcOffsetDeg: 8, perCycle: null },
        probePoint: { label: cap.probe, component: cap.component }, condition: { speed: 'idle', acClutch: 'off', electricalLoad: 'unknown', beltOff: false },
        phase: 'before', source: 'upload',
      };
      const capture = await Capture.create({
        shopId: shop.id, caseId: c.id, uploadedById: tech?.id ?? null, originalName: cap.name, format: 'wav', byteSize: wav.byteLength,
        sha256: createHash('sha256').update(wav).digest('hex'), storageKey: key, sampleRateHz: gen.sampleRateHz, channelCount: gen.channels.length,
        durationS: gen.channels[0].length / gen.sampleRateHz, phase: 'before', metadata: CaptureMetadataSchema.parse(input), currentAnalysisId: null,
      });
      const a = await Analysis.create({ shopId: shop.id, captureId: capture.id, status: 'queued', stage: 'queued', runSettings: {} });
      capture.currentAnalysisId = a.id;
      await capture.save();
      await appendTimeline({ shopId: shop.id, caseId: c.id, actorId: tech?.id ?? null, kind: 'capture_added', message: `${tech?.name ?? 'The demo'} added ${cap.name} (before repair, probe at ${cap.probe})`, data: { captureId: capture.id, analysisId: a.id } });
      // Hold the job under the seeder's lease, then run it the way a runner does.
      await sequelizeOf().query(
        `UPDATE analyses SET status = 'running', stage = 'fetching', progress = 10, attempts = 1, leasedBy = :holder,
           leaseExpiresAt = DATE_ADD(NOW(3), INTERVAL 10 MINUTE), startedAt = NOW(3) WHERE id = :id AND status = 'queued'`,
        { replacements: { holder, id: a.id }, type: QueryTypes.UPDATE },
      );
      const outcome = await runClaimedJob({ sequelize: sequelizeOf(), storage, logger, holder, leaseMs: 600_000, analyze: (inp) => runTask('analyzeFile', inp) }, a.id);
      if (outcome !== 'done') logger.warn('a demo capture did not analyse', { capture: cap.name, outcome });
    }
    await sequelizeOf().transaction(async (t) => {
      const row = (await Case.findByPk(c.id, { transaction: t, lock: t.LOCK.UPDATE }))!;
      const { suspects } = await rankAndStore(row, t);
      row.status = 'ranked';
      row.version += 1;
      await row.save({ transaction: t });
      await appendTimeline({ shopId: shop.id, caseId: c.id, actorId: tech?.id ?? null, kind: 'ranked', message: `${tech?.name ?? 'The demo'} marked the captures complete; ${suspects} suspect${suspects === 1 ? '' : 's'} ranked` }, t);
    });
    made += 1;
  }
  return made;
}
