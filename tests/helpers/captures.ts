// Capture uploads in API tests: short generated captures (the project's generator), the multipart
// upload of the upload contract, and waiting for an analysis to end.
import { expect } from 'vitest';
import type { Sequelize } from 'sequelize';
import type { DriveDocument } from '../../shared/drive/types';
import type { CaptureMetadataInput } from '../../shared/schemas/captures';
import { encodeWav } from '../../shared/synth/encode-wav';
import { generateCapture } from '../../shared/synth/generate-capture';
import type { GenerateOptionsInput } from '../../shared/synth/options';
import type { AnalysisDto } from '../../shared/schemas/analyses';
import { startJobRunner, type JobRunner } from '../../server/jobs/job-runner';
import { createLogger } from '../../server/logger';
import { runTask } from '../../server/pool';
import type { ObjectStorage } from '../../server/storage/storage';
import type { ApiAgent } from './test-app';
import { metadataFor } from './case-factories';

/** A generated two-channel capture (reference, pickup) as float32 WAV bytes: short, so tests stay quick. */
export function captureWav(drive: DriveDocument, options: Omit<GenerateOptionsInput, 'drive'> = {}): Buffer {
  const gen = generateCapture({ drive, durationS: 3, sampleRateHz: 24000, refKind: 'cyl1', tdcOffsetDeg: 8, seed: 7, ...options });
  const wav = encodeWav(gen.channels, gen.sampleRateHz, 'float32');
  return Buffer.from(wav.buffer, wav.byteOffset, wav.byteLength);
}

/** One file of an upload. */
export interface UploadFile { bytes: Buffer; name: string; metadata?: Partial<CaptureMetadataInput> }

/** POST /api/cases/:id/captures with `metadata` first, then the files. */
export function upload(agent: ApiAgent, caseId: number, files: UploadFile[], options: { metadata?: unknown } = {}) {
  let req = agent.http.post(`/api/cases/${caseId}/captures`).set('x-csrf-token', agent.token);
  const metadata = options.metadata ?? files.map((f) => metadataFor(f.metadata));
  if (metadata !== undefined) req = req.field('metadata', typeof metadata === 'string' ? metadata : JSON.stringify(metadata));
  for (const f of files) req = req.attach('files', f.bytes, f.name);
  return req;
}

/** Polls GET /api/analyses/:id until it is done or failed. */
export async function waitForAnalysis(agent: ApiAgent, id: number, timeoutMs = 60_000): Promise<AnalysisDto> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent.get(`/api/analyses/${id}`);
    expect(res.status).toBe(200);
    const a = res.body.analysis as AnalysisDto;
    if (a.status === 'done' || a.status === 'failed') return a;
    if (Date.now() > deadline) throw new Error(`analysis ${id} still ${a.status} after ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** A job runner on the real pool for one test file (short poll; lease as given). */
export function testRunner(sequelize: Sequelize, storage: ObjectStorage, leaseMs = 20_000, analyze = (input: Parameters<typeof runTask<'analyzeFile'>>[1]) => runTask('analyzeFile', input)): JobRunner {
  return startJobRunner({ sequelize, storage, logger: createLogger((process.env.TEST_LOG as 'debug' | undefined) ?? 'error', false), analyze, concurrency: 1, leaseMs, pollMs: 50 });
}
