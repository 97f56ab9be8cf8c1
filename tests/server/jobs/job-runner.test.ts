// The job runner against the real MariaDB and pool: a worker thread terminated mid-job leaves the
// job to its lease and it is finished on the next attempt once the lease expires (the server keeps
// running); two `npm run jobs` processes sharing one database run 100 queued jobs, each exactly
// once, each runner taking at least 25. The server project runs its files one at a time, so the
// terminated threads and the child processes never run beside other tests.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Op } from 'sequelize';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { AppContext } from '../../../server/context';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { Analysis, Capture, CaseEvent } from '../../../server/models';
import { projectRoot } from '../../../server/paths';
import { closePool, getPool, runTask } from '../../../server/pool';
import { createEngine } from '../../../server/services/engines';
import { captureWav, testRunner, upload, waitForAnalysis } from '../../helpers/captures';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';

let t: TestApp;
let dir: string;
let shop: TestShop;
let tech: ApiAgent;
let engineId: number;
const children: ChildProcess[] = [];

async function newCase(): Promise<number> {
  const res = await tech.post('/api/cases', { roNumber: `RO-${uniq()}`, vehicle: { make: 'Nordfahrt', model: 'Kestrel' }, complaint: 'Whirr', engineId });
  expect(res.status).toBe(201);
  return res.body.case.id as number;
}

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'crankwise-jobs-'));
  t = await createTestApp({ STORAGE_DIR: dir });
  shop = await createTestShop();
  tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
  engineId = (await createEngine(shop.shop.id, { ...DEMO_I4, name: `Demo I4 ${uniq()}` })).engine.id;
});

afterAll(async () => {
  for (const c of children) if (c.exitCode === null) c.kill('SIGKILL');
  await closePool();
  await t?.close();
  await rm(dir, { recursive: true, force: true });
});

describe('a worker thread terminated mid-job', () => {
  it('does not take the server down, and the job is finished after its lease expires', async () => {
    const caseId = await newCase();
    const res = await upload(tech, caseId, [{ bytes: captureWav(DEMO_I4, { seed: 21 }), name: 'a.wav' }]);
    expect(res.status).toBe(201);
    // Warm the pool: a thread still loading its module when it is terminated never picks the task
    // up (piscina then leaves it pending), so the thread must be running the job when it goes.
    const storage = (t.app.locals.ctx as AppContext).storage;
    const key = (await Capture.findByPk(res.body.captures[0].id))!.storageKey;
    const local = await storage.toLocalFile(key);
    await runTask('analyzeFile', { path: local.path, settings: {} });
    let calls = 0;
    const runner = testRunner(t.sequelize, (t.app.locals.ctx as AppContext).storage, 1500, (input) => {
      calls += 1;
      const run = runTask('analyzeFile', input);
      if (calls === 1) {
        // The warm thread takes the task at once; terminate it while it runs.
        setTimeout(() => { for (const th of getPool().threads) void th.terminate(); }, 100);
      }
      return run;
    });
    try {
      const a = await waitForAnalysis(tech, res.body.captures[0].analysis.id, 60_000);
      expect(a.status).toBe('done');
      expect(a.attempts).toBe(2);
      expect(calls).toBe(2);
      expect(runner.counts.abandoned).toBe(1);
      expect(runner.counts.done).toBe(1);
      // The server still answers.
      expect((await tech.get(`/api/cases/${caseId}`)).status).toBe(200);
    } finally {
      await runner.stop();
    }
  }, 120_000);
});

describe('two runner processes sharing one database', () => {
  it('run 100 queued jobs, each exactly once, each runner taking at least 25', async () => {
    const caseId = await newCase();
    const res = await upload(tech, caseId, [{ bytes: captureWav(DEMO_I4, { seed: 22, durationS: 2, sampleRateHz: 12000 }), name: 'short.wav' }]);
    expect(res.status).toBe(201);
    const first = await Analysis.findByPk(res.body.captures[0].analysis.id);
    // Hold the jobs until both runners are up, so neither gets a head start.
    await first!.update({ status: 'done' });
    const env = {
      ...process.env, DATABASE_URL: inject('databaseUrl'), STORAGE_DIR: dir, JOB_POLL_MS: '20', JOB_LEASE_S: '30', JOBS_CONCURRENCY: '1',
      LOG_LEVEL: 'error', NODE_ENV: 'test',
    };
    const outputs: string[] = ['', ''];
    const ready = [0, 1].map((i) => new Promise<void>((resolve, reject) => {
      const child = spawn(process.execPath, [join(projectRoot(), 'dist', 'node', 'server', 'jobs', 'runner.js')], { env, stdio: ['ignore', 'pipe', 'pipe'] });
      children.push(child);
      child.stdout!.on('data', (d: Buffer) => { outputs[i] += d.toString(); if (outputs[i].includes('ready')) resolve(); });
      child.stderr!.on('data', (d: Buffer) => { outputs[i] += d.toString(); });
      child.once('exit', (code) => reject(new Error(`runner ${i} exited ${code}: ${outputs[i]}`)));
    }));
    await Promise.all(ready);
    const rows = Array.from({ length: 100 }, () => ({ shopId: shop.shop.id, captureId: first!.captureId, status: 'queued' as const, stage: 'queued' as const, runSettings: {} }));
    const created = await Analysis.bulkCreate(rows);
    const ids = created.map((a) => a.id);
    const deadline = Date.now() + 240_000;
    for (;;) {
      const open = await Analysis.count({ where: { id: ids, status: { [Op.in]: ['queued', 'running'] } } });
      if (open === 0) break;
      if (Date.now() > deadline) throw new Error(`${open} jobs still open; runner output: ${outputs.join(' | ')}`);
      await new Promise((r) => setTimeout(r, 200));
    }
    const done = await Analysis.findAll({ where: { id: ids } });
    const odd = done.filter((a) => a.status !== 'done' || a.attempts !== 1).map((a) => `${a.id}:${a.status}:${a.attempts}:${a.errorCode}`);
    expect(odd).toEqual([]);
    const holders = new Map<string, number>();
    for (const a of done) holders.set(a.leasedBy ?? '?', (holders.get(a.leasedBy ?? '?') ?? 0) + 1);
    expect(holders.size).toBe(2);
    for (const n of holders.values()) expect(n).toBeGreaterThanOrEqual(25);
    const events = await CaseEvent.findAll({ where: { caseId, kind: 'analysis_done' } });
    const ran = events.map((e) => Number(e.data.analysisId)).filter((id) => ids.includes(id));
    expect(ran).toHaveLength(100);
    expect(new Set(ran).size).toBe(100);
    await Promise.all(children.map((c) => new Promise<void>((resolve) => { c.removeAllListeners('exit'); c.once('exit', () => resolve()); c.kill('SIGTERM'); })));
    for (const out of outputs) expect(out).toMatch(/stopped after \d+ done/);
  }, 300_000);
});
