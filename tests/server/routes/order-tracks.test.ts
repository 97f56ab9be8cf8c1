import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import type { AnalyzeFileOutput } from '../../../shared/tasks';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { AnalysisSeries } from '../../../server/models';
import { seriesRows } from '../../../server/services/analysis-results';
import { createCaptureRow, createCaseRow, createFindingRow } from '../../helpers/case-factories';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, type TestShop } from '../../helpers/factories';

// Issue 20 item 5 through the API: a generated run-up (800 → 3000 rpm) whose alternator shaft line
// passes a planted structural resonance (second-order band-pass of the RBJ Audio EQ Cookbook) at
// 1900 rpm; the analysis's stored order map gives the suspect's track and where it peaks.
const drive = JSON.parse(readFileSync(new URL('../../fixtures/drives/fixture-i4-petrol.json', import.meta.url), 'utf8'));
let t: TestApp;
let shop: TestShop;
let tech: ApiAgent;
let sweptId: number;
let heldId: number;

function resonate(x: Float32Array, fs: number, fr: number): Float32Array {
  const w0 = (2 * Math.PI * fr) / fs, alpha = Math.sin(w0) / 16, a0 = 1 + alpha, a1 = -2 * Math.cos(w0), a2 = 1 - alpha;
  const y = new Float32Array(x.length);
  let x1 = 0, x2 = 0, y1 = 0, y2 = 0;
  for (let i = 0; i < x.length; i++) {
    const bp = (alpha * x[i] - alpha * x2 - a1 * y1 - a2 * y2) / a0;
    x2 = x1; x1 = x[i]; y2 = y1; y1 = bp;
    y[i] = x[i] + 9 * bp;
  }
  return y;
}

async function store(analysisId: number, rpmEnd: number | null) {
  const g = generateCapture({ drive, seed: 41, durationS: rpmEnd ? 20 : 4, sampleRateHz: 24_000, rpm: 800, rpmEnd, wanderPct: 0.5, engineLevel: 0.3, snrDb: 10, fault: { component: 'Alternator', fault: 'shaft' } });
  const order = g.truth.fault!.plantedOrder;
  const r = runPipeline({ channels: [g.channels[0], resonate(g.channels[1], 24_000, (order * 1900) / 60)], sampleRateHz: 24_000 }, resolveSettings({ cylinders: 4, firingOrder: [1, 3, 4, 2] }));
  const f32 = (a: Float64Array) => Float32Array.from(a);
  const out = {
    series: {
      orders: { ...r.orders.spectrum, amplitude: f32(r.orders.spectrum.amplitude), floor: f32(r.orders.spectrum.floor) }, envelopes: [],
      cycle: { averageDeg: new Float32Array(720), rmsDeg: new Float32Array(720) }, rpm: { timeS: r.speed.trace.timeS, rpm: r.speed.trace.rpm },
      spectrogram: { ...r.spectrogram }, ...(r.orderMap ? { orderMap: r.orderMap } : {}),
    },
    rankingContext: { cylinders: 4, cyclesAveraged: r.cycle.cyclesAveraged, meanRpm: r.speed.meanRpm, envelopeScores: [] },
  } as unknown as AnalyzeFileOutput;
  for (const row of seriesRows(out, 'g')) await AnalysisSeries.create({ analysisId, ...row });
  return order;
}

let plantedOrder = 0;
beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  const c = await createCaseRow(shop.shop);
  const swept = await createCaptureRow(shop.shop, c, { status: 'done' });
  plantedOrder = await store(swept.analysis.id, 3000);
  sweptId = swept.analysis.id;
  const f = await createFindingRow(shop.shop, c, 'Alternator', 'shaft');
  await f.update({ order: plantedOrder, inRanking: true });
  const held = await createCaptureRow(shop.shop, c, { status: 'done' });
  await store(held.analysis.id, null);
  heldId = held.analysis.id;
}, 180_000);
afterAll(async () => t.close());

describe('order tracks API', () => {
  it('requires authentication', async () => {
    const res = await (await t.agent()).get(`/api/analyses/${sweptId}/order-tracks`);
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('names the speed range where the suspect peaks: the planted resonance', async () => {
    const res = await tech.get(`/api/analyses/${sweptId}/order-tracks`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const alt = res.body.tracks.find((x: { label: string }) => x.label === 'Alternator shaft');
    expect(alt.peak).not.toBeNull();
    expect(Math.abs(alt.peak.rpm - 1900)).toBeLessThanOrEqual(Math.max(alt.rpm[1] - alt.rpm[0], 57));
    expect(alt.sentence).toMatch(/^Alternator shaft peaks at \d+ rpm \(\d+–\d+ rpm\)/);
    expect(res.body.tracks[0].label).toBe('firing order 2');
    expect(res.body.rpmRange[0]).toBeLessThan(950);
    expect(res.body.rpmRange[1]).toBeGreaterThan(2800);
  });

  it('says what to record when the speed did not sweep (404 no_sweep)', async () => {
    const res = await tech.get(`/api/analyses/${heldId}/order-tracks`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('no_sweep');
    expect(res.body.error.message).toMatch(/run-up/);
  });

  it('stores no order map for a held capture and one under 4 MiB for a sweep', async () => {
    const swept = await AnalysisSeries.findOne({ where: { analysisId: sweptId, name: 'order-map' } });
    expect(swept!.data.byteLength).toBeLessThan(4 * 1024 * 1024);
    expect(await AnalysisSeries.count({ where: { analysisId: heldId, name: 'order-map' } })).toBe(0);
  });
});
