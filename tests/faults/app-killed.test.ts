// Fault: the app killed (SIGKILL) in the middle of an upload and in the middle of an analysis, then
// started again (issue 19 item 7), on the test's own MariaDB. After the upload: no capture row, and
// the half-written file is removed by the start-up sweep once older than the grace age (the test
// ages it; a younger one is left for an upload still in progress). After the analysis: its lease
// expires, the restarted runner claims it again and it ends `done` with its results — no half-written
// result rows.
import http from 'node:http';
import { mkdtemp, readdir, rm, utimes } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { RunningDatabase } from '../../scripts/db';
import { DEMO_I4 } from '../../server/db/seeders/demo-engines';
import { encodeWav } from '../../shared/synth/encode-wav';
import { generateCapture } from '../../shared/synth/generate-capture';
import { metadataFor } from '../helpers/case-factories';
import { Client, freePort, ownDatabase, startServer, until, type ServerProcess } from './fault-helpers';

let db: RunningDatabase;
let server: ServerProcess;
let dir: string;
let client: Client;
let caseId: number;
const env = () => ({ DATABASE_URL: db.url, STORAGE_DIR: dir, JOBS_IN_PROCESS: 'on', JOBS_CONCURRENCY: '1', JOB_POLL_MS: '100', JOB_LEASE_S: '3' });

/** A long capture (40 s at 48 kHz, 16-bit): about 7.7 MB, a second or more of analysis. */
function longCapture(): Uint8Array {
  const gen = generateCapture({ drive: DEMO_I4, durationS: 40, sampleRateHz: 48_000, refKind: 'cyl1', tdcOffsetDeg: 8, seed: 19 });
  return encodeWav(gen.channels, gen.sampleRateHz, 'pcm16');
}

async function filesIn(root: string): Promise<string[]> {
  try {
    return (await readdir(root, { recursive: true, withFileTypes: true })).filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name));
  } catch {
    return [];
  }
}

/** A whole multipart upload over http.request (metadata first, then the file); resolves with the answer. */
function uploadRaw(bytes: Uint8Array, name: string): Promise<{ status: number; body: Record<string, any> }> {
  const boundary = 'crankwise-fault-upload';
  const head = Buffer.from(
    `--${boundary}\r\nContent-Disposition: form-data; name="metadata"\r\n\r\n${JSON.stringify([metadataFor()])}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="${name}"\r\nContent-Type: audio/wav\r\n\r\n`,
  );
  const tail = Buffer.from(`\r\n--${boundary}--\r\n`);
  return new Promise((resolve, reject) => {
    const req = http.request(`${server.base}/api/cases/${caseId}/captures`, {
      method: 'POST',
      headers: { cookie: client.cookie, 'x-csrf-token': client.token, 'content-type': `multipart/form-data; boundary=${boundary}` },
    }, (res) => {
      let text = '';
      res.on('data', (d) => (text += String(d)));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body: text ? JSON.parse(text) : {} }));
    });
    req.on('error', reject);
    req.end(Buffer.concat([head, Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength), tail]));
  });
}

beforeAll(async () => {
  db = await ownDatabase('faults-db', await freePort(), true);
  dir = await mkdtemp(join(tmpdir(), 'crankwise-faults-kill-'));
  server = await startServer(env());
  client = new Client(server.base);
  await client.setUpShop();
  const created = await client.send('POST', '/api/cases', { roNumber: 'RO-FAULT-2', vehicle: { year: 2016, make: 'Nordfahrt', model: 'Kestrel' }, complaint: 'Chirp on cold start' });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  caseId = created.body.case.id;
});

afterAll(async () => {
  await server?.kill('SIGTERM');
  await db?.stopServer();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('the app killed and started again', () => {
  it('mid-upload: no row is left, and the start-up sweep removes the half-written file once it is old enough', async () => {
    const bytes = longCapture();
    const boundary = 'crankwise-fault-boundary';
    const head = Buffer.from(
      `--${boundary}\r\nContent-Disposition: form-data; name="metadata"\r\n\r\n${JSON.stringify([metadataFor()])}\r\n` +
        `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="cut.wav"\r\nContent-Type: audio/wav\r\n\r\n`,
    );
    const req = http.request(`${server.base}/api/cases/${caseId}/captures`, {
      method: 'POST',
      headers: { cookie: client.cookie, 'x-csrf-token': client.token, 'content-type': `multipart/form-data; boundary=${boundary}` },
    });
    req.on('error', () => {});
    req.write(head);
    req.write(Buffer.from(bytes.buffer, bytes.byteOffset, 2 * 1024 * 1024));
    // The file is being written under a .part name when the app dies.
    await until('a .part file in storage', async () => (await filesIn(dir)).some((f) => f.endsWith('.part')));
    await server.kill('SIGKILL');
    req.destroy();
    const parts = (await filesIn(dir)).filter((f) => f.endsWith('.part'));
    expect(parts.length).toBeGreaterThan(0);

    // Restarted at once, the sweep leaves the young file (it could be another server's upload).
    server = await startServer(env());
    client = new Client(server.base);
    await client.signIn();
    const detail = await client.send('GET', `/api/cases/${caseId}`);
    expect(detail.status).toBe(200);
    expect(detail.body.case?.captures ?? detail.body.captures ?? []).toEqual([]);
    await new Promise((r) => setTimeout(r, 1500));
    expect((await filesIn(dir)).filter((f) => f.endsWith('.part'))).toEqual(parts);

    // An hour later (the test ages the file) the next start removes it.
    const old = new Date(Date.now() - 2 * 3_600_000);
    for (const p of parts) await utimes(p, old, old);
    await server.kill('SIGTERM');
    server = await startServer(env());
    await until('the sweep removing the old .part file', async () => (await filesIn(dir)).length === 0, 60_000);
    client = new Client(server.base);
    await client.signIn();
  });

  it('mid-analysis: the lease expires, the restarted runner finishes the job, and its results are whole', async () => {
    const uploaded = await uploadRaw(longCapture(), 'long.wav');
    expect(uploaded.status, JSON.stringify(uploaded.body)).toBe(201);
    const id = uploaded.body.captures[0].analysis.id as number;
    await until('the analysis running', async () => (await client.send('GET', `/api/analyses/${id}`)).body.analysis?.status === 'running', 60_000);
    await server.kill('SIGKILL');

    server = await startServer(env());
    client = new Client(server.base);
    await client.signIn();
    const final = await until('the analysis ending after the restart', async () => {
      const a = (await client.send('GET', `/api/analyses/${id}`)).body.analysis as { status: string; attempts: number; summary: unknown; series: unknown[] } | undefined;
      return a && (a.status === 'done' || a.status === 'failed') ? a : null;
    });
    expect(final.status, JSON.stringify(final).slice(0, 400)).toBe('done');
    expect(final.attempts).toBeGreaterThanOrEqual(2);
    expect(final.summary).toBeTruthy();
    expect(final.series.length).toBeGreaterThan(0);
    const orders = await client.send('GET', `/api/analyses/${id}/series/orders`);
    expect(orders.status).toBe(200);
  });
});
