import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import type { OrderSpectrum } from '../../../shared/analysis/types';
import type { DriveDocument } from '../../../shared/drive/types';
import { generateCapture } from '../../../shared/synth/generate-capture';
import type { GenerateOptionsInput } from '../../../shared/synth/options';
import { AnalysisSeries, type Case } from '../../../server/models';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { packFloat32 } from '../../../server/services/analysis-results';
import { seedPublishedBearings } from '../../../server/services/bearings';
import { createCaptureRow, createCaseRow, createFindingRow } from '../../helpers/case-factories';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

// Issue 20 item 4 through the API, on a seeded history: confirmed cases of one engine with
// different faults (generated captures, their spectra stored as the analysis service stores
// them), and a new case of a known fault made with another seed, rpm, noise and contact.
let t: TestApp;
let shop: TestShop;
let tech: ApiAgent;
let engineId: number;
let drive: DriveDocument;
const ids: Record<string, number> = {};

const meta = (s: OrderSpectrum) => ({ resolution: s.resolution, maxOrder: s.maxOrder, samplesPerRev: s.samplesPerRev, revsPerBlock: s.revsPerBlock, blocks: s.blocks, length: s.amplitude.length });

async function caseWith(status: 'confirmed' | 'testing', o: Omit<GenerateOptionsInput, 'drive'>, confirmed?: { component: string; fault: 'outer_race' | 'inner_race' | 'shaft' | 'cage'; note: string }): Promise<Case> {
  const c = await createCaseRow(shop.shop, { engineId, status });
  const { analysis } = await createCaptureRow(shop.shop, c, { status: 'done' });
  const g = generateCapture({ drive, durationS: 5, sampleRateHz: 24_000, wanderPct: 2, ...o });
  const r = runPipeline(g, resolveSettings({ cylinders: 4, firingOrder: [1, 3, 4, 2] }));
  await AnalysisSeries.create({
    analysisId: analysis.id, name: 'orders', band: 0, meta: { ...meta(r.orders.spectrum), ranking: { cylinders: 4, cyclesAveraged: r.cycle.cyclesAveraged, meanRpm: r.speed.meanRpm } },
    data: packFloat32(Float32Array.from(r.orders.spectrum.amplitude), Float32Array.from(r.orders.spectrum.floor)),
  });
  for (const [i, b] of r.envelope.bands.entries()) {
    await AnalysisSeries.create({ analysisId: analysis.id, name: 'envelope', band: i, meta: { ...meta(b.spectrum), bandHz: b.bandHz, score: b.score }, data: packFloat32(Float32Array.from(b.spectrum.amplitude), Float32Array.from(b.spectrum.floor)) });
  }
  if (confirmed) {
    const f = await createFindingRow(shop.shop, c, confirmed.component, confirmed.fault);
    await f.update({ status: 'confirmed', note: confirmed.note, decidedAt: new Date() });
  }
  return c;
}

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  await seedPublishedBearings(shop.shop.id);
  const lead = await t.signIn(shop.users.lead.email, shop.users.lead.password);
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  drive = { ...DEMO_I4, name: `Memory ${uniq()}` };
  const res = await lead.post('/api/engines', drive);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  engineId = res.body.engine.id;
  ids.twin = (await caseWith('confirmed', { seed: 401, rpm: 760, snrDb: 0, fault: { component: 'Alternator', fault: 'outer_race' } }, { component: 'Alternator', fault: 'outer_race', note: 'Alternator rear bearing outer race spalled' })).id;
  ids.pump = (await caseWith('confirmed', { seed: 402, rpm: 800, snrDb: 0, fault: { component: 'Water pump', fault: 'inner_race' } }, { component: 'Water pump', fault: 'inner_race', note: 'Water pump bearing' })).id;
  ids.idler = (await caseWith('confirmed', { seed: 403, rpm: 780, snrDb: 0, fault: { component: 'Upper idler', fault: 'outer_race' } }, { component: 'Upper idler', fault: 'outer_race', note: 'Idler pulley bearing' })).id;
  ids.altShaft = (await caseWith('confirmed', { seed: 404, rpm: 790, snrDb: 0, fault: { component: 'Alternator', fault: 'shaft' } }, { component: 'Alternator', fault: 'shaft', note: 'Alternator pulley runout' })).id;
  ids.fresh = (await caseWith('testing', { seed: 999, rpm: 880, snrDb: -3, engineLevel: 0.5, fault: { component: 'Alternator', fault: 'outer_race' } })).id;
}, 180_000);
afterAll(async () => t.close());

describe('similar cases API', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get(`/api/cases/${ids.fresh}/similar`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('finds the twin first among same-engine confirmed cases of other faults, with its cause', async () => {
    const res = await tech.get(`/api/cases/${ids.fresh}/similar`);
    expect(res.status).toBe(200);
    expect(res.body.items.length).toBeGreaterThan(0);
    expect(res.body.items.length).toBeLessThanOrEqual(3);
    const first = res.body.items[0];
    expect(first.caseId).toBe(ids.twin);
    expect(first.sameEngine).toBe(true);
    expect(first.cause).toBe('Alternator rear bearing outer race spalled');
    expect(first.confirmed).toEqual({ component: 'Alternator', fault: 'outer_race' });
    for (const other of res.body.items.slice(1)) expect(other.distance).toBeGreaterThanOrEqual(first.distance);
  });

  it('never lists the case itself, and answers an empty list for a case without an engine', async () => {
    const res = await tech.get(`/api/cases/${ids.twin}/similar`);
    expect(res.body.items.map((x: { caseId: number }) => x.caseId)).not.toContain(ids.twin);
    const bare = await createCaseRow(shop.shop);
    const empty = await tech.get(`/api/cases/${bare.id}/similar`);
    expect(empty.status).toBe(200);
    expect(empty.body.items).toEqual([]);
  });
});
