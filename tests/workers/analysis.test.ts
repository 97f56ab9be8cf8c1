import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { closePool, runTask } from '../../server/pool';
import { parseTaskError } from '../../shared/tasks';
import { crankProfile, gaussian, pulseTrain } from '../helpers/signals';

// Runs the BUILT worker (dist/node/workers/analysis.js, made by `npm run build:node`, which
// `npm test` runs first) through the server's one pool.
const dir = mkdtempSync(join(tmpdir(), 'cw-worker-'));

/** A 4 s two-channel float32 WAV: cylinder-1 pulses at 900 rpm and a pickup with orders 2 and 3.3. */
function writeCapture(): string {
  const fs = 20_000;
  const n = 4 * fs;
  const theta = crankProfile(n, fs, 900, 2);
  const ref = pulseTrain(theta, fs, { pitchDeg: 720 });
  const noise = gaussian(n, 4);
  const pick = Float32Array.from({ length: n }, (_, i) => Math.cos((2 * Math.PI * 2 * theta[i]) / 360) + 0.2 * Math.cos((2 * Math.PI * 3.3 * theta[i]) / 360) + 0.05 * noise[i]);
  const bytes = new Uint8Array(44 + n * 8);
  const v = new DataView(bytes.buffer);
  const put = (o: number, s: string) => { for (let i = 0; i < 4; i++) bytes[o + i] = s.charCodeAt(i); };
  put(0, 'RIFF'); v.setUint32(4, 36 + n * 8, true); put(8, 'WAVE'); put(12, 'fmt '); v.setUint32(16, 16, true);
  v.setUint16(20, 3, true); v.setUint16(22, 2, true); v.setUint32(24, fs, true); v.setUint32(28, fs * 8, true); v.setUint16(32, 8, true); v.setUint16(34, 32, true);
  put(36, 'data'); v.setUint32(40, n * 8, true);
  for (let i = 0; i < n; i++) { v.setFloat32(44 + 8 * i, ref[i], true); v.setFloat32(48 + 8 * i, pick[i], true); }
  const path = join(dir, 'capture.wav');
  writeFileSync(path, bytes);
  return path;
}

describe('analysis worker through the pool', () => {
  afterAll(() => closePool());

  it('analyses a file: the --json summary plus float32 series moved out of the worker', async () => {
    const out = await runTask('analyzeFile', { path: writeCapture(), settings: { refPerCycle: 1, cylinders: 4, firingOrder: [1, 3, 4, 2] } });
    const speed = out.summary.speed as { meanRpm: number };
    expect(Math.abs(speed.meanRpm - 900) / 900).toBeLessThan(0.005);
    const orders = out.summary.orders as { peaks: { order: number; firing: boolean }[] };
    expect(orders.peaks[0].order).toBeCloseTo(2, 2);
    expect(orders.peaks[0].firing).toBe(true);
    expect(orders.peaks.some((p) => Math.abs(p.order - 3.3) < 0.05)).toBe(true);
    expect(out.series.orders.amplitude).toBeInstanceOf(Float32Array);
    const k = Math.round(2 / out.series.orders.resolution);
    expect(out.series.orders.amplitude[k]).toBeGreaterThan(0.9);
    expect(out.series.spectrogram.frames * out.series.spectrogram.bins).toBeLessThanOrEqual(1 << 20);
    expect(out.ranking).toEqual([]);
  }, 60_000);

  it('rejects a missing file with a stable code', async () => {
    const err = await runTask('analyzeFile', { path: join(dir, 'nope.wav'), settings: {} }).catch((e) => e);
    expect(parseTaskError(err).code).toBe('file_missing');
  }, 60_000);

  it('rejects a truncated capture with the reader code', async () => {
    const path = join(dir, 'short.wav');
    writeFileSync(path, Buffer.from('RIFF\u0000\u0000\u0000\u0000WAVEfmt '));
    const err = await runTask('analyzeFile', { path, settings: {} }).catch((e) => e);
    expect(parseTaskError(err).code).toBe('truncated');
  }, 60_000);
});
