/**
 * The Listen view's audio (issue 15 item 7): the pickup channel resampled to 48 kHz as a 16-bit
 * WAV, made once on the pool (workers never see storage: the capture is fetched to a local file
 * first) and kept in storage beside the capture, then served with HTTP range requests.
 */
import type { Readable } from 'node:stream';
import { parseTaskError } from '../../shared/tasks';
import { AppError } from '../errors';
import type { Capture } from '../models/capture';
import { runTask } from '../pool';
import type { ObjectStorage } from '../storage/storage';

const inflight = new Map<string, Promise<Buffer>>();

async function readAll(stream: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const chunk of stream) parts.push(Buffer.from(chunk as Uint8Array));
  return Buffer.concat(parts);
}

/** The audio key of a capture. */
export const audioKey = (c: Capture) => `${c.storageKey}.listen48k.wav`;

/** The capture's listening WAV (made on first use; 409 `audio_unavailable` when the file cannot be read). */
export async function captureAudio(c: Capture, storage: ObjectStorage): Promise<Buffer> {
  const key = audioKey(c);
  if (await storage.exists(key)) return readAll(await storage.get(key));
  let job = inflight.get(key);
  if (!job) {
    job = (async () => {
      const channel = c.metadata.channels.findIndex((ch) => ch.role === 'pickup') + 1 || 1;
      const local = await storage.toLocalFile(c.storageKey).catch(() => {
        throw new AppError(409, 'audio_unavailable', 'The stored capture file is missing; upload it again');
      });
      try {
        const { wav } = await runTask('pickupAudio', { path: local.path, channel, name: c.originalName });
        const buf = Buffer.from(wav.buffer, wav.byteOffset, wav.byteLength);
        const { Readable: R } = await import('node:stream');
        await storage.put(key, R.from([buf]));
        return buf;
      } catch (e) {
        if (e instanceof AppError) throw e;
        const err = parseTaskError(e);
        throw new AppError(409, 'audio_unavailable', `This capture cannot be played: ${err.message}`);
      } finally {
        await local.release();
      }
    })();
    inflight.set(key, job);
    job.finally(() => inflight.delete(key)).catch(() => {});
  }
  return job;
}
