import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_USERS } from '../../server/services/demo-shop';
import { runPipeline } from '../../shared/analysis/pipeline';
import { resolveSettings } from '../../shared/analysis/resolve-settings';
import { parseCaptureBytes } from '../../shared/formats/parse-capture-stream';
import { encodeWav } from '../../shared/synth/encode-wav';
import { generateCapture } from '../../shared/synth/generate-capture';
import { launchChromium, screenshot } from '../helpers/browser';
import { freePort, startTestServer } from '../helpers/test-server';
import drive from '../fixtures/drives/fixture-i4-petrol.json' with { type: 'json' };

// Recording in the browser (issue 20 item 1) on the BUILT app in Debian's Chromium, with its
// fake audio capture playing a generated two-channel WAV (reference on 1, pickup on 2):
// --use-fake-ui-for-media-stream --use-fake-device-for-media-stream
// --use-file-for-fake-audio-capture=<wav>%noloop delivers both channels distinct and unmixed.
// The upload request is intercepted at the browser and its WAV analysed with the shared
// pipeline: its rpm must match the generated capture's truth (within 1 %), and its metadata say
// source: recording. (The server side of the upload is the analysis service's.)
const tech = DEMO_USERS.find((u) => u.role === 'tech')!;
const dir = mkdtempSync(join(tmpdir(), 'crankwise-rec-'));
const wavPath = join(dir, 'two-channel.wav');
const capture = generateCapture({ drive: drive as never, seed: 5, durationS: 20, sampleRateHz: 48_000, rpm: 900, wanderPct: 1, fault: { component: 'Alternator', fault: 'outer_race' } });
const norm = (c: Float32Array) => { let m = 0; for (const v of c) m = Math.max(m, Math.abs(v)); return Float32Array.from(c, (v) => (0.8 * v) / m); };
writeFileSync(wavPath, encodeWav([norm(capture.channels[0]), norm(capture.channels[1])], 48_000, 'pcm16'));

let browser: Browser;
let server: { baseUrl: string; stop: () => Promise<void> };

beforeAll(async () => {
  server = await startTestServer({ port: await freePort() });
  browser = await launchChromium(['--use-fake-ui-for-media-stream', '--use-fake-device-for-media-stream', `--use-file-for-fake-audio-capture=${wavPath}%noloop`]);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
  rmSync(dir, { recursive: true, force: true });
});

/** The parts of a multipart body: name, optional filename, bytes. */
function multipart(body: Buffer, contentType: string): { name: string; filename: string | null; data: Buffer }[] {
  const boundary = /boundary=(?:"([^"]+)"|([^;]+))/.exec(contentType)!;
  const sep = Buffer.from(`--${boundary[1] ?? boundary[2]}`);
  const parts: { name: string; filename: string | null; data: Buffer }[] = [];
  let at = body.indexOf(sep);
  while (at >= 0) {
    const next = body.indexOf(sep, at + sep.length);
    if (next < 0) break;
    const part = body.subarray(at + sep.length + 2, next - 2);
    const headEnd = part.indexOf('\r\n\r\n');
    const head = part.subarray(0, headEnd).toString('utf8');
    parts.push({ name: /name="([^"]*)"/.exec(head)![1], filename: /filename="([^"]*)"/.exec(head)?.[1] ?? null, data: part.subarray(headEnd + 4) });
    at = next;
  }
  return parts;
}

describe('recording in the browser', () => {
  it('shows two distinct live channels and the live rpm, records, and uploads a 2-channel WAV whose rpm matches the truth', async () => {
    const context = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    const page = await context.newPage();
    const problems: string[] = [];
    page.on('pageerror', (e) => problems.push(e.message));
    await page.goto(`${server.baseUrl}/sign-in`);
    await page.getByLabel('E-mail').fill(tech.email);
    await page.getByLabel('Password').fill(tech.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('navigation', { name: 'Main' }).waitFor();

    let uploaded: { body: Buffer; type: string } | null = null;
    await page.route('**/api/cases/7/captures', async (route) => {
      uploaded = { body: route.request().postDataBuffer()!, type: (await route.request().allHeaders())['content-type'] };
      await route.fulfill({ status: 201, contentType: 'application/json', body: JSON.stringify({ captures: [] }) });
    });
    await page.goto(`${server.baseUrl}/cases/7/record?cylinders=4&idle=780`);
    await page.getByRole('heading', { name: 'Record into case 7' }).waitFor();
    await page.getByRole('button', { name: 'Connect input' }).click();
    // Live rpm from the reference (shared code reading the last seconds of input 1).
    const rpmCell = page.getByTestId('live-rpm');
    await expect.poll(async () => Number(await rpmCell.innerText()) || 0, { timeout: 20_000 }).toBeGreaterThan(0);
    const live = Number(await rpmCell.innerText());
    expect(Math.abs(live - capture.truth.rpm.mean) / capture.truth.rpm.mean).toBeLessThan(0.03);
    const levels = await page.getByRole('meter').evaluateAll((els) => els.map((e) => Number(e.getAttribute('aria-valuenow'))));
    expect(levels).toHaveLength(2);
    expect(levels.every((v) => v > -40)).toBe(true);
    await screenshot(page, 'recording-live');

    await page.getByLabel('Seconds').fill('6');
    await page.getByRole('button', { name: 'Record 6 s' }).click();
    await page.getByRole('button', { name: 'Upload to the case' }).waitFor({ timeout: 30_000 });
    await screenshot(page, 'recording-review');
    await page.getByRole('button', { name: 'Upload to the case' }).click();
    await page.getByText('Uploaded: the capture is analysed like a file upload.').waitFor();

    expect(uploaded).not.toBeNull();
    const parts = multipart(uploaded!.body, uploaded!.type);
    expect(parts.map((p) => p.name)).toEqual(['metadata', 'files']);
    const [meta] = JSON.parse(parts[0].data.toString('utf8'));
    expect(meta.source).toBe('recording');
    expect(meta.channels.map((c: { role: string }) => c.role)).toEqual(['reference', 'pickup']);
    expect(meta.reference.kind).toBe('cyl1');
    const wav = parseCaptureBytes(new Uint8Array(parts[1].data), { name: parts[1].filename ?? 'recording.wav' });
    expect(wav.channels).toHaveLength(2);
    expect(wav.sampleRateHz).toBe(48_000);
    expect(wav.channels[0].length / wav.sampleRateHz).toBeGreaterThanOrEqual(5.9);
    // Distinct, unmixed channels: the reference pulses and the pickup differ.
    let diff = 0;
    for (let i = 0; i < wav.channels[0].length; i++) diff = Math.max(diff, Math.abs(wav.channels[0][i] - wav.channels[1][i]));
    expect(diff).toBeGreaterThan(0.1);
    const r = runPipeline({ channels: wav.channels, sampleRateHz: wav.sampleRateHz }, resolveSettings({ cylinders: 4, firingOrder: [1, 3, 4, 2] }));
    expect(Math.abs(r.speed.meanRpm - capture.truth.rpm.mean) / capture.truth.rpm.mean).toBeLessThan(0.01);
    expect(problems).toEqual([]);
    await context.close();
  });
});
