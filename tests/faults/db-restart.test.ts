// Fault: MariaDB stopped and started again while the app runs (issue 19 item 7), on the test's own
// MariaDB. While it is down the API answers 503 `database_unavailable` with a clear message (health,
// which needs no database, still answers); once it is back the app recovers by itself — same
// session, no restart — and every queued or interrupted analysis still ends `done`.
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningDatabase } from '../../scripts/db';
import { metadataFor } from '../helpers/case-factories';
import { Client, freePort, ownDatabase, root, startServer, until, type ServerProcess } from './fault-helpers';

let db: RunningDatabase;
let dbPort: number;
let server: ServerProcess;
let dir: string;
let client: Client;

beforeAll(async () => {
  dbPort = await freePort();
  db = await ownDatabase('faults-db', dbPort, true);
  dir = await mkdtemp(join(tmpdir(), 'crankwise-faults-db-'));
  server = await startServer({ DATABASE_URL: db.url, STORAGE_DIR: dir, JOBS_IN_PROCESS: 'on', JOBS_CONCURRENCY: '1', JOB_POLL_MS: '100', JOB_LEASE_S: '5' });
  client = new Client(server.base);
  await client.setUpShop();
});

afterAll(async () => {
  await server?.kill('SIGTERM');
  await db?.stopServer();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('MariaDB stopped and restarted under the running app', () => {
  it('answers 503 while it is down, recovers by itself and loses no job', async () => {
    const created = await client.send('POST', '/api/cases', { roNumber: 'RO-FAULT-1', vehicle: { year: 2016, make: 'Nordfahrt', model: 'Kestrel' }, complaint: 'Whine at idle' });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const bytes = await readFile(join(root, 'tests', 'fixtures', 'bad', 'valid-capture.wav'));
    const form = new FormData();
    form.append('metadata', JSON.stringify(Array.from({ length: 5 }, () => metadataFor())));
    for (let i = 0; i < 5; i++) form.append('files', new Blob([bytes]), `take-${i}.wav`);
    const uploaded = await client.send('POST', `/api/cases/${created.body.case.id}/captures`, form);
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    const analysisIds = (uploaded.body.captures as { analysis: { id: number } }[]).map((c) => c.analysis.id);

    await db.stopServer();
    const down = await client.send('GET', '/api/cases');
    expect(down.status, JSON.stringify(down.body)).toBe(503);
    expect(down.body.error.code).toBe('database_unavailable');
    expect(down.body.error.message).toMatch(/database is not answering/);
    expect((await fetch(`${server.base}/api/health`)).status).toBe(200);
    expect(server.child.exitCode).toBeNull();

    db = await ownDatabase('faults-db', dbPort, false);
    await until('the app answering again', async () => (await client.send('GET', '/api/cases')).status === 200);
    for (const id of analysisIds) {
      const final = await until(`analysis ${id} ending`, async () => {
        const a = (await client.send('GET', `/api/analyses/${id}`)).body.analysis as { status: string; error: unknown } | undefined;
        return a && (a.status === 'done' || a.status === 'failed') ? a : null;
      });
      expect(final.status, JSON.stringify(final)).toBe('done');
    }
  });
});
