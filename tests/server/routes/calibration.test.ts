import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { speedRatio } from '../../../shared/drive/kinematics';
import type { DriveDocument } from '../../../shared/drive/types';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { AnalysisSeries } from '../../../server/models';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { packFloat32 } from '../../../server/services/analysis-results';
import { acceptedCalibrations } from '../../../server/services/ratio-calibration';
import { seedPublishedBearings } from '../../../server/services/bearings';
import { createCaptureRow, createCaseRow } from '../../helpers/case-factories';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

// Issue 20 item 3 through the API: four cases of one engine, each with a done analysis of a
// generated capture whose alternator pulley is really 55 mm (the library says 56: +1.8 % ratio),
// creep and rpm varying; the stored order spectra are what the calibration reads.
let t: TestApp;
let shop: TestShop;
let lead: ApiAgent;
let tech: ApiAgent;
let engineId: number;
const planted: number[] = [];

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  await seedPublishedBearings(shop.shop.id);
  lead = await t.signIn(shop.users.lead.email, shop.users.lead.password);
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  const doc: DriveDocument = { ...DEMO_I4, name: `Calibrated ${uniq()}` };
  const res = await lead.post('/api/engines', doc);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  engineId = res.body.engine.id;
  const truth: DriveDocument = { ...doc, components: doc.components.map((c) => (c.name === 'Alternator' ? { ...c, pulleyMm: 55 } : c)) };
  for (let i = 0; i < 4; i++) {
    const c = await createCaseRow(shop.shop, { engineId });
    const { analysis } = await createCaptureRow(shop.shop, c, { status: 'done' });
    const g = generateCapture({ drive: truth, seed: 700 + i, durationS: 4, sampleRateHz: 24_000, rpm: 750 + 200 * i, creepPct: 0.6 + 0.4 * i, snrDb: 6, fault: { component: 'Alternator', fault: 'shaft' } });
    planted.push(g.truth.fault!.plantedOrder / speedRatio(doc, 'Alternator'));
    const r = runPipeline(g, resolveSettings({ cylinders: 4, firingOrder: [1, 3, 4, 2] }));
    const o = r.orders.spectrum;
    await AnalysisSeries.create({
      analysisId: analysis.id, name: 'orders', band: 0,
      meta: { resolution: o.resolution, maxOrder: o.maxOrder, samplesPerRev: o.samplesPerRev, revsPerBlock: o.revsPerBlock, blocks: o.blocks, length: o.amplitude.length, ranking: { cylinders: 4, cyclesAveraged: r.cycle.cyclesAveraged, meanRpm: r.speed.meanRpm } },
      data: packFloat32(Float32Array.from(o.amplitude), Float32Array.from(o.floor)),
    });
  }
}, 120_000);
afterAll(async () => t.close());

describe('engine ratio calibration API', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get(`/api/engines/${engineId}/calibration`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('offers the alternator correction measured on 4 cases, close to the truth', async () => {
    const res = await tech.get(`/api/engines/${engineId}/calibration`);
    expect(res.status).toBe(200);
    const alt = res.body.parts.find((p: { component: string }) => p.component === 'Alternator');
    expect(alt.measured.offered).toBe(true);
    expect(alt.measured.sentence).toMatch(/^measured on 4 cases: Alternator turns \d\.\d % faster than its nominal ratio ± \d\.\d %$/);
    const truthPct = 100 * (Math.exp(planted.reduce((a, b) => a + Math.log(b), 0) / planted.length) - 1);
    expect(Math.abs(alt.measured.correctionPct - truthPct)).toBeLessThan(0.3);
    expect(alt.accepted).toBeNull();
  });

  it('lets a lead accept and withdraw it; a technician may not; the ranking then reads it', async () => {
    const denied = await tech.send('put', `/api/engines/${engineId}/calibration`, { component: 'Alternator', accept: true });
    expect(denied.status).toBe(403);
    const ok = await lead.send('put', `/api/engines/${engineId}/calibration`, { component: 'alternator', accept: true });
    expect(ok.status, JSON.stringify(ok.body)).toBe(200);
    const alt = ok.body.parts.find((p: { component: string }) => p.component === 'Alternator');
    expect(alt.accepted.correctionPct).toBeCloseTo(alt.measured.correctionPct, 9);
    const cal = await acceptedCalibrations(shop.shop.id, engineId);
    expect(cal.Alternator.factor).toBeCloseTo(1 + alt.measured.correctionPct / 100, 9);
    const back = await lead.send('put', `/api/engines/${engineId}/calibration`, { component: 'Alternator', accept: false });
    expect(back.body.parts.find((p: { component: string }) => p.component === 'Alternator').accepted).toBeNull();
  });

  it('refuses to accept a part without enough measurements (409) and a body without a part (400)', async () => {
    const res = await lead.send('put', `/api/engines/${engineId}/calibration`, { component: 'Water pump', accept: true });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('calibration_not_offered');
    expect(res.body.error.message).toMatch(/offered from 4 captures/);
    const bad = await lead.send('put', `/api/engines/${engineId}/calibration`, { accept: true });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });
});
