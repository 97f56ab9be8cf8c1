// Hostile and malformed captures (tests/fixtures/bad/, issue 19 item 6) uploaded to the BUILT
// server running as a child process with its in-process job runner, one file per request:
// - format tier: 422 capture_rejected naming the problem (details.reason = the reader's code), no
//   file left in storage and no row;
// - signal tier (and format errors the upload's structure check cannot see without reading the
//   whole file, found by the worker): stored, and its analysis ends `failed` with the stable code;
// - a valid capture under a hostile name (path separators, `..`, shell characters): stored under the
//   server's key, its name shown cleaned.
// The server answers /api/health after every file and its resident memory (read from /proc for the
// child) stays bounded. Needs the build (`npm test` builds first).
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { Capture } from '../../../server/models';
import { projectRoot } from '../../../server/paths';
import { createEngine } from '../../../server/services/engines';
import { DEMO_I4 } from '../../../server/db/seeders/demo-engines';
import { metadataFor } from '../../helpers/case-factories';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';
import { freePort } from '../../helpers/test-server';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { buildBadCapture } from '../../fixtures/bad/make-bad-captures';

type Expected = { refused: string } | { failed: string } | { done: true };

/** What the server does with each file (tests/fixtures/bad/README.md has the reader's code for each). */
const EXPECTED: Record<string, Expected> = {
  'empty.wav': { refused: 'no_data' }, 'empty.csv': { refused: 'no_data' }, 'riff-only.wav': { refused: 'truncated' },
  'header-cut-at-20-bytes.wav': { refused: 'truncated' }, 'header-cut-inside-fmt.wav': { refused: 'truncated' },
  'ends-before-data.wav': { refused: 'truncated' }, 'data-truncated.wav': { refused: 'truncated' },
  'claims-2e31-samples.wav': { refused: 'truncated' }, 'chunk-size-past-end.wav': { refused: 'truncated' },
  'fmt-size-4-gb.wav': { refused: 'truncated' }, 'fmt-too-short.wav': { refused: 'bad_header' },
  'block-align-mismatch.wav': { refused: 'bad_header' }, 'data-before-fmt.wav': { refused: 'bad_header' },
  'zero-sample-rate.wav': { refused: 'zero_rate' }, 'zero-channels.wav': { refused: 'unsupported_encoding' },
  'nine-channels.wav': { refused: 'unsupported_encoding' }, 'adpcm-encoding.wav': { refused: 'unsupported_encoding' },
  'rf64-header.wav': { refused: 'unsupported_encoding' }, 'rate-500-hz.wav': { refused: 'rate_out_of_range' },
  'zip-renamed.wav': { refused: 'unknown_format' }, 'zip-renamed.csv': { refused: 'unknown_format' },
  'png-renamed.csv': { refused: 'unknown_format' }, 'binary-garbage.csv': { refused: 'unknown_format' },
  'million-columns.csv': { refused: 'bad_header' },
  'only-a-time-column.csv': { refused: 'too_few_channels' }, 'one-data-row.csv': { refused: 'no_data' },
  'over-range-marker.csv': { refused: 'non_finite' },
  // Deep in the file: the structure check reads the head only; the worker reads it all.
  'text-in-number-column.csv': { failed: 'not_a_number' }, 'ragged-rows.csv': { failed: 'ragged_row' },
  'non-uniform-time.csv': { failed: 'rate_irregular' }, 'time-stands-still.csv': { failed: 'zero_rate' },
  'nan-in-float-wav.wav': { failed: 'non_finite' },
  // Signal tier.
  'all-zero-channels.wav': { failed: 'flat_channel' }, 'pickup-clipped-flat.wav': { failed: 'flat_channel' },
  'reference-without-pulses.wav': { failed: 'no_reference' }, 'reference-at-30000-rpm.wav': { failed: 'speed_implausible' },
  'valid-capture.wav': { done: true },
};

/** Resident memory the server may reach over the whole set (MB); the WAV bug alone reserved 8 GB. */
const SERVER_RSS_MB = 500;
const HOSTILE_NAME = '../../etc/passwd; rm -rf ~ $(reboot) `id` <b>|x.wav';

const root = projectRoot();
let t: TestApp;
let shop: TestShop;
let dir: string;
let server: ChildProcess;
let base: string;
let cookie = '';
let token = '';
let caseId: number;
const rss: number[] = [];

function rssMb(pid: number): number {
  const line = readFileSync(`/proc/${pid}/status`, 'utf8').split('\n').find((l) => l.startsWith('VmRSS:'));
  return Number(line!.replace(/\D+/g, '')) / 1024;
}

function keepCookies(res: Response): void {
  const jar = new Map(cookie ? cookie.split('; ').map((c) => [c.slice(0, c.indexOf('=')), c.slice(c.indexOf('=') + 1)]) : []);
  for (const raw of res.headers.getSetCookie()) {
    const pair = raw.split(';')[0]!;
    jar.set(pair.slice(0, pair.indexOf('=')), pair.slice(pair.indexOf('=') + 1));
  }
  cookie = [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
}

async function api(method: string, path: string, body?: unknown): Promise<{ status: number; body: Record<string, any> }> {
  const res = await fetch(`${base}${path}`, {
    method,
    headers: { cookie, 'x-csrf-token': token, ...(body !== undefined && !(body instanceof FormData) ? { 'content-type': 'application/json' } : {}) },
    body: body === undefined ? undefined : body instanceof FormData ? body : JSON.stringify(body),
  });
  keepCookies(res);
  const text = await res.text();
  return { status: res.status, body: text ? JSON.parse(text) : {} };
}

async function refreshCsrf(): Promise<void> {
  token = (await api('GET', '/api/csrf')).body.token as string;
}

async function storedFiles(): Promise<string[]> {
  try {
    return (await readdir(dir, { recursive: true, withFileTypes: true })).filter((e) => e.isFile()).map((e) => join(e.parentPath, e.name));
  } catch {
    return [];
  }
}

function uploadForm(bytes: Uint8Array, name: string): FormData {
  const form = new FormData();
  form.append('metadata', JSON.stringify([metadataFor()]));
  form.append('files', new Blob([bytes as Uint8Array<ArrayBuffer>]), name);
  return form;
}

async function waitForFinal(analysisId: number): Promise<{ status: string; error: { code: string; message: string } | null }> {
  for (;;) {
    const res = await api('GET', `/api/analyses/${analysisId}`);
    expect(res.status).toBe(200);
    const a = res.body.analysis as { status: string; error: { code: string; message: string } | null };
    if (a.status === 'done' || a.status === 'failed') return a;
    await new Promise((r) => setTimeout(r, 100));
  }
}

beforeAll(async () => {
  const entry = join(root, 'dist', 'node', 'server', 'index.js');
  if (!existsSync(entry)) throw new Error(`${entry} is missing: run npm run build (npm test builds first)`);
  t = await createTestApp();
  shop = await createTestShop();
  const engineId = (await createEngine(shop.shop.id, { ...DEMO_I4, name: `Hostile I4 ${uniq()}` })).engine.id;
  dir = await mkdtemp(join(tmpdir(), 'crankwise-hostile-'));
  const port = await freePort();
  base = `http://127.0.0.1:${port}`;
  server = spawn(process.execPath, [entry], {
    cwd: root,
    env: {
      ...process.env, NODE_ENV: 'test', DATABASE_URL: inject('databaseUrl'), HOST: '127.0.0.1', PORT: String(port),
      MAIL_FAKE_PORT: String(await freePort()), DEMO: 'off', LOG_LEVEL: 'error', BCRYPT_ROUNDS: '4', STORAGE_DIR: dir,
      JOBS_IN_PROCESS: 'on', JOBS_CONCURRENCY: '1', JOB_POLL_MS: '50', MAIL_URL: '',
    },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  server.stderr!.on('data', (d) => (stderr += String(d)));
  for (let i = 0; ; i++) {
    if (server.exitCode !== null) throw new Error(`the server exited: ${stderr}`);
    try {
      if ((await fetch(`${base}/api/health`)).ok) break;
    } catch {
      /* not yet listening */
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  await refreshCsrf();
  const signIn = await api('POST', '/api/auth/sign-in', { email: shop.users.tech.email, password: shop.users.tech.password });
  expect(signIn.status).toBe(200);
  await refreshCsrf();
  const created = await api('POST', '/api/cases', {
    roNumber: `RO-${uniq()}`, vehicle: { year: 2016, make: 'Nordfahrt', model: 'Kestrel' }, complaint: 'Whine at idle', engineId, leadId: shop.users.lead.user.id,
  });
  expect(created.status, JSON.stringify(created.body)).toBe(201);
  caseId = created.body.case.id;
  rss.push(rssMb(server.pid!));
}, 120_000);

afterAll(async () => {
  if (server && server.exitCode === null) {
    server.kill('SIGTERM');
    await new Promise((r) => server.once('exit', r));
  }
  await t?.close();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('hostile uploads to the running server', () => {
  it.each(Object.entries(EXPECTED))('%s', async (name, expected) => {
    const bytes = name === 'valid-capture.wav' ? new Uint8Array(await readFile(join(root, 'tests', 'fixtures', 'bad', name))) : buildBadCapture(name);
    const filesBefore = await storedFiles();
    const rowsBefore = await Capture.count({ where: { caseId } });
    const res = await api('POST', `/api/cases/${caseId}/captures`, uploadForm(bytes, name));
    if ('refused' in expected) {
      expect(res.status, JSON.stringify(res.body)).toBe(422);
      expect(res.body.error.code).toBe('capture_rejected');
      expect(res.body.error.details.reason).toBe(expected.refused);
      expect(res.body.error.message.length).toBeGreaterThan(20);
      expect(await storedFiles()).toEqual(filesBefore);
      expect(await Capture.count({ where: { caseId } })).toBe(rowsBefore);
    } else {
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const capture = res.body.captures[0] as { id: number; analysis: { id: number } };
      const analysis = await waitForFinal(capture.analysis.id);
      if ('failed' in expected) {
        expect(analysis.status, JSON.stringify(analysis)).toBe('failed');
        expect(analysis.error!.code).toBe(expected.failed);
      } else expect(analysis.status, JSON.stringify(analysis)).toBe('done');
    }
    expect((await fetch(`${base}/api/health`)).status).toBe(200);
    rss.push(rssMb(server.pid!));
  });

  it('stores a valid capture sent under a hostile name under its own key and shows the name cleaned', async () => {
    const bytes = await readFile(join(root, 'tests', 'fixtures', 'bad', 'valid-capture.wav'));
    const res = await api('POST', `/api/cases/${caseId}/captures`, uploadForm(new Uint8Array(bytes), HOSTILE_NAME));
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    const dto = res.body.captures[0] as { id: number; originalName: string };
    expect(dto.originalName).not.toMatch(/[/\\$`<>|]|\.\.\//);
    expect(dto.originalName).toMatch(/x\.wav$/);
    const row = await Capture.findByPk(dto.id);
    expect(row!.storageKey).toMatch(new RegExp(`^shops/${shop.shop.id}/captures/[0-9a-f-]{36}`));
    const files = await storedFiles();
    expect(files.some((f) => f.endsWith(row!.storageKey.split('/').pop()!))).toBe(true);
    expect(files.every((f) => f.startsWith(dir))).toBe(true);
    expect(files.some((f) => /passwd|reboot/.test(f))).toBe(false);
  });

  it('kept its memory bounded over the whole set', () => {
    expect(Math.max(...rss)).toBeLessThan(SERVER_RSS_MB);
    process.stdout.write(`hostile uploads: server RSS ${rss[0]!.toFixed(0)} MB after boot, peak ${Math.max(...rss).toFixed(0)} MB over ${rss.length - 1} files\n`);
  });
});
