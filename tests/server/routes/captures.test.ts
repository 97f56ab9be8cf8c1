// The capture intake and the analysis service end to end on the real MariaDB and the real piscina
// pool: upload → queued → done with results and findings, the two tiers of refusal (a bad file is
// refused while it streams, leaving no file and no row; an unusable signal is kept and its analysis
// fails with a stable code), 413, series with ETag, the audio endpoint, another shop's 404s.
// Captures come from the project's generator (3 s at 24 kHz) so the file stays within the budget.
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import type { AppContext } from '../../../server/context';
import type { JobRunner } from '../../../server/jobs/job-runner';
import { Analysis, Capture } from '../../../server/models';
import { closePool } from '../../../server/pool';
import { createEngine } from '../../../server/services/engines';
import { encodeCsv } from '../../../shared/synth/encode-csv';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { captureWav, testRunner, upload, waitForAnalysis } from '../../helpers/captures';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';
import { createTestApp, waitForMail, type ApiAgent, type TestApp } from '../../helpers/test-app';

let t: TestApp;
let small: TestApp;
let dir: string;
let shop: TestShop;
let other: TestShop;
let tech: ApiAgent;
let lead: ApiAgent;
let specialist: ApiAgent;
let outsider: ApiAgent;
let runner: JobRunner;
let engineId: number;

async function filesIn(root: string): Promise<string[]> {
  try {
    return (await readdir(root, { recursive: true, withFileTypes: true })).filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name));
  } catch {
    return [];
  }
}

async function newCase(agent: ApiAgent, body: Record<string, unknown> = {}) {
  const res = await agent.post('/api/cases', {
    roNumber: `RO-${uniq()}`, vehicle: { year: 2016, make: 'Nordfahrt', model: 'Kestrel' }, complaint: 'Whirr at idle', engineId, leadId: shop.users.lead.user.id, ...body,
  });
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.case as { id: number; status: string; version: number };
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'crankwise-captures-'));
  t = await createTestApp({ STORAGE_DIR: join(dir, 'main') });
  small = await createTestApp({ STORAGE_DIR: join(dir, 'small'), UPLOAD_MAX_MB: '0.25' });
  shop = await createTestShop();
  other = await createTestShop();
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  lead = await t.signIn(shop.users.lead.email, shop.users.lead.password);
  specialist = await t.signIn(shop.users.specialist.email, shop.users.specialist.password);
  outsider = await t.signIn(other.users.admin.email, other.users.admin.password);
  engineId = (await createEngine(shop.shop.id, { ...DEMO_I4, name: `Demo I4 ${uniq()}` })).engine.id;
  runner = testRunner(t.sequelize, (t.app.locals.ctx as AppContext).storage);
});

afterAll(async () => {
  await runner?.stop();
  await closePool();
  await small?.close();
  await t?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('upload → analysis → ranking', () => {
  let caseId: number;
  let analysisIds: number[];

  it('stores the files, queues one analysis per file and moves the case open → testing', async () => {
    caseId = (await newCase(tech)).id;
    const near = captureWav(DEMO_I4, { seed: 11, fault: { component: 'Alternator', fault: 'outer_race' }, snrDb: 8 });
    const far = captureWav(DEMO_I4, { seed: 12, fault: { component: 'Alternator', fault: 'outer_race' }, snrDb: -2 });
    const res = await upload(tech, caseId, [
      { bytes: near, name: 'alt housing (1).WAV', metadata: { probePoint: { label: 'alternator housing', component: 'Alternator' } } },
      { bytes: far, name: '../../etc/passwd', metadata: { probePoint: { label: 'water pump body', component: 'Water pump' } } },
    ]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const captures = res.body.captures as { id: number; originalName: string; format: string; byteSize: number; analysis: { id: number; status: string } }[];
    expect(captures).toHaveLength(2);
    expect(captures.map((c) => c.originalName)).toEqual(['alt housing (1).WAV', 'passwd']);
    expect(captures.every((c) => c.format === 'wav' && c.analysis.status === 'queued')).toBe(true);
    expect(captures[0].byteSize).toBe(near.length);
    analysisIds = captures.map((c) => c.analysis.id);
    const detail = await tech.get(`/api/cases/${caseId}`);
    expect(detail.body.case.status).toBe('testing');
    expect(detail.body.case.timeline.map((e: { kind: string }) => e.kind)).toEqual(['created', 'capture_added', 'capture_added']);
  });

  it('analyses both to done with a summary, series and timings', async () => {
    for (const id of analysisIds) {
      const a = await waitForAnalysis(tech, id);
      expect(a.error).toBeNull();
      expect(a.status).toBe('done');
      expect(a.progress).toBe(100);
      expect(a.attempts).toBe(1);
      expect((a.summary as { speed: { meanRpm: number } }).speed.meanRpm).toBeGreaterThan(600);
      expect(a.series.map((s) => s.name)).toEqual(['orders', 'envelope', 'cycle', 'spectrogram', 'rpm']);
      expect(a.settings?.cylinders).toBe(4);
      expect(a.driveName).toBe((await tech.get(`/api/cases/${caseId}`)).body.case.engine.name);
    }
  });

  it('serves a series decimated to the points asked, with an ETag answered 304', async () => {
    const res = await tech.get(`/api/analyses/${analysisIds[0]}/series/orders?points=200`);
    expect(res.status).toBe(200);
    expect(res.body.kind).toBe('line');
    expect(res.body.x.length).toBeLessThanOrEqual(200);
    expect(res.body.total).toBeGreaterThan(200);
    // The largest bin survives decimation (min/max buckets keep every peak).
    const full = await tech.get(`/api/analyses/${analysisIds[0]}/series/orders?points=50000`);
    expect(full.body.x.length).toBe(full.body.total);
    expect(Math.max(...res.body.y)).toBe(Math.max(...full.body.y));
    const etag = res.headers.etag as string;
    expect(etag).toBeTruthy();
    const again = await tech.http.get(`/api/analyses/${analysisIds[0]}/series/orders?points=200`).set('If-None-Match', etag);
    expect(again.status).toBe(304);
    const grid = await tech.get(`/api/analyses/${analysisIds[0]}/series/spectrogram?points=1000`);
    expect(grid.body.kind).toBe('grid');
    expect(grid.body.frames * grid.body.bins).toBeLessThanOrEqual(1000);
    expect(grid.body.amplitude).toHaveLength(grid.body.frames * grid.body.bins);
  });

  it('ranks on "captures complete", stores findings with lines per capture and mails the lead once', async () => {
    const since = new Date();
    const res = await tech.post(`/api/cases/${caseId}/complete`);
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const c = res.body.case;
    expect(c.status).toBe('ranked');
    expect(c.findings.length).toBeGreaterThan(0);
    const top = c.findings[0];
    expect(top.component).toBe('Alternator');
    expect(top.captures.map((x: { captureId: number }) => x.captureId)).toHaveLength(2);
    expect(top.captures[0].lines.length).toBeGreaterThan(0);
    expect(top.captures[0].lines[0]).toEqual(expect.objectContaining({ order: expect.any(Number), amplitude: expect.any(Number), snrDb: expect.any(Number) }));
    const mail = await waitForMail(shop.users.lead.email, since);
    expect(mail.text).toContain(`/cases/${caseId}`);
  });

  it('keeps a dismissal and its note across a re-rank with the current engine', async () => {
    const before = (await lead.get(`/api/cases/${caseId}`)).body.case;
    const second = before.findings[1];
    const dismissed = await specialist.post(`/api/findings/${second.id}/dismiss`, { note: 'belt was replaced last month' });
    expect(dismissed.status).toBe(200);
    expect(dismissed.body.finding.status).toBe('dismissed');
    const rerank = await specialist.post(`/api/cases/${caseId}/rerank`);
    expect(rerank.status).toBe(200);
    const after = rerank.body.case.findings.find((f: { id: number }) => f.id === second.id);
    expect(after.status).toBe('dismissed');
    expect(after.note).toBe('belt was replaced last month');
    expect(rerank.body.case.timeline.map((e: { kind: string }) => e.kind)).toContain('re_ranked');
  });

  it('refuses a technician the re-rank and the dismissal (403)', async () => {
    expect((await tech.post(`/api/cases/${caseId}/rerank`)).status).toBe(403);
  });

  it('serves the pickup as a 48 kHz WAV with range requests', async () => {
    const capId = (await tech.get(`/api/cases/${caseId}`)).body.case.captures[0].id;
    const whole = await tech.http.get(`/api/captures/${capId}/audio`).buffer(true).parse((r, cb) => {
      const parts: Buffer[] = [];
      r.on('data', (d: Buffer) => parts.push(d));
      r.on('end', () => cb(null, Buffer.concat(parts)));
    });
    expect(whole.status).toBe(200);
    expect(whole.headers['content-type']).toContain('audio/wav');
    expect(whole.headers['accept-ranges']).toBe('bytes');
    const wav = whole.body as Buffer;
    expect(wav.subarray(0, 4).toString('latin1')).toBe('RIFF');
    expect(wav.readUInt32LE(24)).toBe(48000); // fmt sample rate (RIFF/WAVE layout)
    expect(wav.readUInt16LE(34)).toBe(16); // bits per sample
    expect(wav.readUInt16LE(22)).toBe(1); // one channel: the pickup
    // 3 s at 48 kHz, 2 bytes a sample, plus the header.
    expect(Math.abs((wav.length - 44) / 2 / 48000 - 3)).toBeLessThan(0.01);
    const part = await tech.http.get(`/api/captures/${capId}/audio`).set('Range', 'bytes=100-199');
    expect(part.status).toBe(206);
    expect(part.headers['content-range']).toBe(`bytes 100-199/${wav.length}`);
    expect(Number(part.headers['content-length'])).toBe(100);
    const bad = await tech.http.get(`/api/captures/${capId}/audio`).set('Range', `bytes=${wav.length + 10}-`);
    expect(bad.status).toBe(416);
  });

  it('answers 404 to a user of another shop for the case, its captures, results and audio', async () => {
    const c = (await tech.get(`/api/cases/${caseId}`)).body.case;
    const cap = c.captures[0];
    for (const path of [
      `/api/cases/${caseId}`, `/api/captures/${cap.id}`, `/api/captures/${cap.id}/analyses`, `/api/analyses/${cap.analysis.id}`,
      `/api/analyses/${cap.analysis.id}/series/orders`, `/api/captures/${cap.id}/audio`,
    ]) {
      const res = await outsider.get(path);
      expect(res.status, path).toBe(404);
      expect(res.body.error.code, path).toBe('not_found');
    }
    expect((await outsider.get('/api/cases')).body.items.map((x: { id: number }) => x.id)).not.toContain(caseId);
  });

  it('stores an after-repair capture\'s lines beside the confirmed suspect without re-ranking', async () => {
    const before = (await lead.get(`/api/cases/${caseId}`)).body.case;
    const top = before.findings[0];
    const confirm = await lead.post(`/api/cases/${caseId}/confirm`, { findingId: top.id, note: 'outer race rough by hand' });
    expect(confirm.status).toBe(200);
    const after = captureWav(DEMO_I4, { seed: 13 }); // the same engine with the bearing replaced: no fault
    const res = await upload(tech, caseId, [{ bytes: after, name: 'after.wav', metadata: { phase: 'after_repair', probePoint: { label: 'alternator housing', component: 'Alternator' } } }]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect((await waitForAnalysis(tech, res.body.captures[0].analysis.id)).status).toBe('done');
    const c = (await lead.get(`/api/cases/${caseId}`)).body.case;
    expect(c.status).toBe('confirmed');
    const confirmed = c.findings.find((f: { id: number }) => f.id === top.id);
    expect(confirmed.rank).toBe(top.rank);
    expect(confirmed.score).toBe(top.score);
    const afterEntry = confirmed.captures.find((x: { phase: string }) => x.phase === 'after_repair');
    expect(afterEntry.captureId).toBe(res.body.captures[0].id);
    expect(confirmed.afterRepairScore).toBeLessThan(top.score);
  });

  it('refuses deleting a capture once the case is ranked (409)', async () => {
    const cap = (await lead.get(`/api/cases/${caseId}`)).body.case.captures[0];
    const res = await lead.delete(`/api/captures/${cap.id}`);
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('case_ranked');
    expect(res.body.error.message).toContain('confirmed');
  });
});

describe('refusals while streaming: no file and no row left', () => {
  const wav = () => captureWav(DEMO_I4, { seed: 3, durationS: 1 });
  const truncated = () => {
    const b = wav();
    return b.subarray(0, b.length - 4000); // the data chunk declares more than arrives
  };
  const zeroRate = () => {
    const b = Buffer.from(wav());
    b.writeUInt32LE(0, 24);
    return b;
  };
  const ragged = () => {
    const csv = encodeCsv(generateCapture({ drive: DEMO_I4, durationS: 0.5, sampleRateHz: 4000, seed: 3 }).channels, 4000, { timeUnit: 's' });
    const lines = csv.split('\n');
    lines[20] = lines[20].split(',').slice(0, 1).join(',');
    return Buffer.from(lines.join('\n'));
  };
  const cases: { kind: string; bytes: () => Buffer; reason: string }[] = [
    { kind: 'a binary file that is neither WAV nor CSV', bytes: () => Buffer.from(Array.from({ length: 4096 }, (_, i) => (i * 37) % 256)), reason: 'unknown_format' },
    { kind: 'a WAV cut short of its declared length', bytes: truncated, reason: 'truncated' },
    { kind: 'a WAV whose header gives 0 Hz', bytes: zeroRate, reason: 'zero_rate' },
    { kind: 'a RIFF file that is not WAVE', bytes: () => Buffer.concat([Buffer.from('RIFF\x10\x00\x00\x00AVI LIST', 'latin1'), Buffer.alloc(600)]), reason: 'bad_magic' },
    { kind: 'a CSV with a short row among its first rows', bytes: ragged, reason: 'ragged_row' },
    { kind: 'an empty file', bytes: () => Buffer.alloc(0), reason: 'no_data' },
  ];

  for (const k of cases) {
    it(`refuses ${k.kind} with 422 capture_rejected (${k.reason})`, async () => {
      const c = await newCase(tech);
      const before = await filesIn(join(dir, 'main'));
      const res = await upload(tech, c.id, [{ bytes: k.bytes(), name: 'capture.wav' }]);
      expect(res.status, JSON.stringify(res.body)).toBe(422);
      expect(res.body.error.code).toBe('capture_rejected');
      expect(res.body.error.details.reason).toBe(k.reason);
      expect(res.body.error.message).toMatch(/capture\.wav/);
      expect(await Capture.count({ where: { caseId: c.id } })).toBe(0);
      expect(await filesIn(join(dir, 'main'))).toEqual(before);
      expect((await tech.get(`/api/cases/${c.id}`)).body.case.status).toBe('open');
    });
  }

  it('refuses a file over UPLOAD_MAX_MB with 413 and keeps nothing', async () => {
    const smallTech = await small.signIn(shop.users.tech.email, shop.users.tech.password);
    const c = await newCase(smallTech);
    const big = captureWav(DEMO_I4, { seed: 4, durationS: 2 }); // about 384 kB > 0.25 MB
    const res = await upload(smallTech, c.id, [{ bytes: big, name: 'long.wav' }]);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('file_too_large');
    expect(res.body.error.message).toContain('UPLOAD_MAX_MB');
    expect(await Capture.count({ where: { caseId: c.id } })).toBe(0);
    expect(await filesIn(join(dir, 'small'))).toEqual([]);
  });

  it('refuses an upload whose metadata is missing, invalid or does not match the files (400)', async () => {
    const c = await newCase(tech);
    const bytes = wav();
    const missing = await tech.http.post(`/api/cases/${c.id}/captures`).set('x-csrf-token', tech.token).attach('files', bytes, 'a.wav');
    expect(missing.status).toBe(400);
    expect(missing.body.error.code).toBe('metadata_missing');
    const invalid = await upload(tech, c.id, [{ bytes, name: 'a.wav' }], { metadata: [{ channels: [{ role: 'pickup' }], probePoint: { label: '' } }] });
    expect(invalid.status).toBe(400);
    expect(invalid.body.error.code).toBe('validation_failed');
    expect(invalid.body.error.message).toContain('probePoint.label');
    const notJson = await upload(tech, c.id, [{ bytes, name: 'a.wav' }], { metadata: '[{oops' });
    expect(notJson.body.error.code).toBe('validation_failed');
    const mismatch = await upload(tech, c.id, [{ bytes, name: 'a.wav' }, { bytes, name: 'b.wav' }], { metadata: [JSON.parse(JSON.stringify((await import('../../helpers/case-factories')).metadataFor()))] });
    expect(mismatch.status).toBe(400);
    expect(mismatch.body.error.code).toBe('file_count_mismatch');
    expect(await Capture.count({ where: { caseId: c.id } })).toBe(0);
  });
});

describe('unusable signals: stored, and the analysis fails with a stable code', () => {
  it('fails a capture whose pickup is all zero with flat_channel', async () => {
    const c = await newCase(tech);
    const gen = generateCapture({ drive: DEMO_I4, durationS: 2, sampleRateHz: 24000, seed: 5 });
    gen.channels[1].fill(0);
    const { encodeWav } = await import('../../../shared/synth/encode-wav');
    const bytes = Buffer.from(encodeWav(gen.channels, 24000, 'float32'));
    const res = await upload(tech, c.id, [{ bytes, name: 'dead-probe.wav' }]);
    expect(res.status).toBe(201);
    const a = await waitForAnalysis(tech, res.body.captures[0].analysis.id);
    expect(a.status).toBe('failed');
    expect(a.error?.code).toBe('flat_channel');
    expect(a.error?.message).toMatch(/pickup.*flat/);
    expect(await Capture.count({ where: { caseId: c.id } })).toBe(1);
    const failed = await tech.get('/api/analyses?status=failed');
    expect(failed.body.items.map((x: { id: number }) => x.id)).toContain(a.id);
    const timeline = (await tech.get(`/api/cases/${c.id}`)).body.case.timeline;
    expect(timeline.at(-1).kind).toBe('analysis_failed');
  });

  it('fails a CSV with a bad row deep in the file (past the structure check) with not_a_number, and can retry it', async () => {
    const c = await newCase(tech);
    const gen = generateCapture({ drive: DEMO_I4, durationS: 2, sampleRateHz: 12000, seed: 6 });
    const csv = encodeCsv(gen.channels, 12000, { timeUnit: 's' }).split('\n');
    csv[20000] = csv[20000].replace(/,[^,]*$/, ',n/a');
    const res = await upload(tech, c.id, [{ bytes: Buffer.from(csv.join('\n')), name: 'scope export.csv' }]);
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.captures[0].format).toBe('csv');
    const a = await waitForAnalysis(tech, res.body.captures[0].analysis.id);
    expect(a.status).toBe('failed');
    expect(a.error?.code).toBe('not_a_number');
    const retry = await tech.post(`/api/analyses/${a.id}/retry`);
    expect(retry.status).toBe(202);
    expect(retry.body.analysis.status).toBe('queued');
    const again = await waitForAnalysis(tech, a.id);
    expect(again.error?.code).toBe('not_a_number');
    expect((await tech.post(`/api/analyses/${a.id}/retry`)).status).toBe(202);
    await waitForAnalysis(tech, a.id);
    const notFailed = await Analysis.findOne({ where: { status: 'done', shopId: shop.shop.id } });
    if (notFailed) expect((await tech.post(`/api/analyses/${notFailed.id}/retry`)).body.error.code).toBe('not_failed');
  });
});
