/**
 * The analysis service's half of `npm run bench` (issue 15): on a private MariaDB (.data/bench-db,
 * port BENCH_DB_PORT, default 3309) and a temporary local capture store,
 * 1. throughput: 20 two-channel 60 s captures at 48 kHz queued at once, analysed through the job
 *    runner and the piscina pool → captures per minute (target ≥ 30 on 2 cores);
 * 2. upload → ranked: one 10 s capture uploaded through the API (multipart, streamed, structure
 *    check), analysed by the in-process runner with the pool idle, then "captures complete" →
 *    wall time until the case is ranked (target ≤ 3 s), median of 3.
 * Prints the figures and writes docs/service-performance.md. A benchmark, not a test.
 */
import { createHash, randomUUID } from 'node:crypto';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { availableParallelism, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import request from 'supertest';
import { createApp } from '../server/app';
import type { AppContext } from '../server/context';
import { DEMO_I4 } from '../server/db/seeders/demo-engines';
import { migrate } from '../server/db/migrator';
import { createSequelize } from '../server/db/sequelize';
import { parseEnv } from '../server/env';
import { startJobRunner } from '../server/jobs/job-runner';
import { silentLogger } from '../server/logger';
import type { Mailer } from '../server/mail/mailer';
import { Analysis, Capture, Case } from '../server/models';
import { closePool, getPool, runTask } from '../server/pool';
import { createShop } from '../server/services/create-shop';
import { createEngine } from '../server/services/engines';
import { createLocalStorage } from '../server/storage/local-storage';
import { CaptureMetadataSchema } from '../shared/schemas/captures';
import { encodeWav } from '../shared/synth/encode-wav';
import { generateCapture } from '../shared/synth/generate-capture';
import { startDatabase } from './db';

const median = (v: number[]) => { const s = [...v].sort((a, b) => a - b); const m = s.length >> 1; return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2; };
const metadata = () => ({
  channels: [{ role: 'reference', scale: 1, unit: 'V' }, { role: 'pickup', scale: 1, unit: 'g' }],
  reference: { kind: 'cyl1', polarity: 'auto', tdcOffsetDeg: 0, perCycle: null },
  probePoint: { label: 'alternator housing', component: 'Alternator' }, phase: 'before', source: 'upload',
});

async function main(): Promise<void> {
  // The throughput a runner machine gets: `npm run jobs` gives the pool every core.
  process.env.POOL_THREADS ??= String(availableParallelism());
  const db = await startDatabase({ name: 'bench-db', port: Number(process.env.BENCH_DB_PORT ?? 3309), database: 'crankwise_bench', fresh: true, log: (m) => process.stderr.write(`[bench-db] ${m}\n`) });
  const dir = mkdtempSync(join(tmpdir(), 'cw-service-bench-'));
  const sequelize = await createSequelize(db.url);
  try {
    await migrate(sequelize);
    const { shop, users } = await createShop(sequelize, { name: 'Bench Shop', users: [{ name: 'Bench Tech', email: 'tech@bench.test', password: 'bench-password-1', role: 'tech' }] }, 4);
    const tech = users[0];
    const engine = (await createEngine(shop.id, DEMO_I4)).engine;
    const storage = createLocalStorage(join(dir, 'captures'));
    const threads = getPool().options.maxThreads;

    // 1. Throughput: 20 queued 60 s captures.
    const g60 = generateCapture({ drive: DEMO_I4, seed: 11, durationS: 60, sampleRateHz: 48_000, fault: { component: 'Alternator', fault: 'outer_race' } });
    const wav60 = Buffer.from(encodeWav(g60.channels, 48_000, 'pcm16'));
    const c = await Case.create({ shopId: shop.id, roNumber: 'RO-BENCH', vehicle: { year: 2020, make: 'Bench', model: 'Rig', vin: null, odometer: null, odometerUnit: 'km' }, engineId: engine.id, complaint: 'bench', technicianId: tech.id, leadId: null, createdById: tech.id, status: 'testing', searchText: 'bench' });
    const ids: number[] = [];
    for (let i = 0; i < 20; i++) {
      const key = `shops/${shop.id}/captures/${randomUUID()}`;
      await storage.put(key, Readable.from([wav60]));
      const cap = await Capture.create({ shopId: shop.id, caseId: c.id, uploadedById: tech.id, originalName: `bench-${i}.wav`, format: 'wav', byteSize: wav60.length, sha256: createHash('sha256').update(wav60).digest('hex'), storageKey: key, sampleRateHz: 48_000, channelCount: 2, durationS: 60, phase: 'before', metadata: CaptureMetadataSchema.parse(metadata()), currentAnalysisId: null });
      const a = await Analysis.create({ shopId: shop.id, captureId: cap.id, status: 'queued', stage: 'queued', runSettings: {} });
      await cap.update({ currentAnalysisId: a.id });
      ids.push(a.id);
    }
    const load0 = loadavg()[0];
    const t0 = performance.now();
    const runner = startJobRunner({ sequelize, storage, logger: silentLogger, analyze: (input) => runTask('analyzeFile', input), concurrency: threads, leaseMs: 60_000, pollMs: 20 });
    for (;;) {
      const open = await Analysis.count({ where: { id: ids, status: ['queued', 'running'] } });
      if (open === 0) break;
      await new Promise((r) => setTimeout(r, 50));
    }
    const throughputS = (performance.now() - t0) / 1000;
    await runner.stop();
    const doneCount = await Analysis.count({ where: { id: ids, status: 'done' } });
    const perMinute = (doneCount / throughputS) * 60;
    const load1 = loadavg()[0];

    // 2. Upload → ranked, one 10 s capture, the pool idle.
    const g10 = generateCapture({ drive: DEMO_I4, seed: 12, durationS: 10, sampleRateHz: 48_000, fault: { component: 'Alternator', fault: 'outer_race' } });
    const wav10 = Buffer.from(encodeWav(g10.channels, 48_000, 'pcm16'));
    const mailer: Mailer = { send: async () => {}, close: () => {} };
    const env = parseEnv({ NODE_ENV: 'test', LOG_LEVEL: 'silent', BCRYPT_ROUNDS: '4', DEMO: 'off' });
    const app = createApp({ sequelize, env, mailer, logger: silentLogger, sessionSecret: 'bench-secret-bench-secret-bench-secret-00', storage });
    const inProcess = startJobRunner({ sequelize, storage, logger: silentLogger, analyze: (input) => runTask('analyzeFile', input), concurrency: threads, leaseMs: 60_000, pollMs: 200 });
    (app.locals.ctx as AppContext).jobs = inProcess;
    const agent = request.agent(app);
    let token = (await agent.get('/api/csrf')).body.token as string;
    await agent.post('/api/auth/sign-in').set('x-csrf-token', token).send({ email: 'tech@bench.test', password: 'bench-password-1' });
    token = (await agent.get('/api/csrf')).body.token as string;
    const times: number[] = [];
    for (let run = 0; run < 3; run++) {
      const created = await agent.post('/api/cases').set('x-csrf-token', token).send({ roNumber: `RO-B${run}`, vehicle: { make: 'Bench', model: 'Rig' }, complaint: 'bench', engineId: engine.id });
      const caseId = created.body.case.id as number;
      await new Promise((r) => setTimeout(r, 500)); // the pool idle
      const s0 = performance.now();
      const up = await agent.post(`/api/cases/${caseId}/captures`).set('x-csrf-token', token).field('metadata', JSON.stringify([metadata()])).attach('files', wav10, 'bench-10s.wav');
      if (up.status !== 201) throw new Error(`upload answered ${up.status}: ${JSON.stringify(up.body)}`);
      const analysisId = up.body.captures[0].analysis.id as number;
      for (;;) {
        const a = (await agent.get(`/api/analyses/${analysisId}`)).body.analysis;
        if (a.status === 'done') break;
        if (a.status === 'failed') throw new Error(`bench analysis failed: ${a.error.message}`);
        await new Promise((r) => setTimeout(r, 20));
      }
      const ranked = await agent.post(`/api/cases/${caseId}/complete`).set('x-csrf-token', token);
      if (ranked.body.case?.status !== 'ranked') throw new Error(`complete answered ${ranked.status}: ${JSON.stringify(ranked.body)}`);
      times.push((performance.now() - s0) / 1000);
    }
    await inProcess.stop();
    const uploadRanked = median(times);

    const lines = [
      `throughput: ${doneCount}/20 captures (60 s, 2 channels, 48 kHz) in ${throughputS.toFixed(1)} s → ${perMinute.toFixed(1)} per minute (target ≥ 30) with ${threads} pool thread(s) on ${availableParallelism()} cores; load average ${load0.toFixed(1)} → ${load1.toFixed(1)}`,
      `upload → ranked (10 s capture, pool idle): median ${uploadRanked.toFixed(2)} s of ${times.map((t) => t.toFixed(2)).join(', ')} s (target ≤ 3 s)`,
    ];
    process.stdout.write(`\n${lines.join('\n')}\n`);
    writeFileSync('docs/service-performance.md', `# Analysis service performance

Written by \`npm run bench\` (scripts/bench-service.ts) on ${new Date().toISOString().slice(0, 10)}, a ${availableParallelism()}-core machine
shared with other work (1-minute load average ${load0.toFixed(1)} at the start of the throughput run, ${load1.toFixed(1)} at its end, so
wall-clock figures include waiting for a core).

| measure | result | target | met |
|---|---|---|---|
| 60 s two-channel 48 kHz captures analysed per minute, 20 queued at once, job runner + pool (${threads} thread${threads === 1 ? '' : 's'}) | ${perMinute.toFixed(1)} | ≥ 30 | ${perMinute >= 30 ? 'yes' : 'no'} |
| upload → ranked, one 10 s capture, pool idle (median of 3: ${times.map((t) => t.toFixed(2)).join(', ')} s) | ${uploadRanked.toFixed(2)} s | ≤ 3 s | ${uploadRanked <= 3 ? 'yes' : 'no'} |

Throughput counts from the runner's start to the last job stored: each job fetches its file from the
local store, runs \`analyzeFile\` on the pool, and writes the summary and every series (one INSERT per
float32 blob) in one transaction. Upload → ranked is one API client's wall clock: the streamed
multipart upload with its structure check and SHA-256, the queued job picked up at once (the upload
wakes the in-process runner), the analysis, polling \`GET /api/analyses/:id\` every 20 ms, then
\`POST /api/cases/:id/complete\` (ranking from the stored spectra, findings written).
`);
  } finally {
    await closePool();
    await sequelize.close();
    await db.stop();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((error: unknown) => {
  process.stderr.write(`bench-service: ${error instanceof Error ? error.stack ?? error.message : String(error)}\n`);
  process.exit(1);
});
