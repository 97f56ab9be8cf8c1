// The capture storage drivers pass the same tests: the local folder and S3-compatible storage
// through @aws-sdk/client-s3 against the local S3 fake s3rver 3.7.1 on loopback (port 0). Every
// object is read back and its SHA-256 compared with what was sent (a streamed PutObject with the
// SDK's default checksums was once stored in s3rver with the aws-chunked framing inside it).
// s3rver checks no signatures, so nothing here tests signing.
import { createHash, randomBytes } from 'node:crypto';
import { readFile, mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLocalStorage } from '../../../server/storage/local-storage';
import { createS3Storage } from '../../../server/storage/s3-storage';
import type { ObjectStorage } from '../../../server/storage/storage';

process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED = 'true';

let dir: string;
let s3: S3rver;
const drivers: Record<string, ObjectStorage> = {};

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'crankwise-storage-'));
  drivers.local = createLocalStorage(join(dir, 'local'));
  s3 = new S3rver({ port: 0, address: '127.0.0.1', silent: true, directory: join(dir, 's3'), configureBuckets: [{ name: 'captures' }] });
  const { port } = await s3.run();
  drivers.s3 = createS3Storage({
    bucket: 'captures', endpoint: `http://127.0.0.1:${port}`, region: 'us-east-1', accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER', prefix: 'crankwise/',
  });
});

afterAll(async () => {
  await s3?.close();
  await rm(dir, { recursive: true, force: true });
});

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

/** `bytes` as a stream of uneven chunks, as an upload arrives. */
function chunked(bytes: Buffer, size = 65_531): Readable {
  const parts: Buffer[] = [];
  for (let o = 0; o < bytes.length; o += size) parts.push(bytes.subarray(o, o + size));
  return Readable.from(parts);
}

async function readAll(stream: Readable): Promise<Buffer> {
  const parts: Buffer[] = [];
  for await (const c of stream) parts.push(Buffer.from(c as Uint8Array));
  return Buffer.concat(parts);
}

for (const kind of ['local', 's3'] as const) {
  describe(`${kind} storage driver`, () => {
    it('stores a streamed object byte for byte (SHA-256 of what is read back)', async () => {
      const storage = drivers[kind];
      for (const size of [1, 1_048_576, 9 * 1024 * 1024 + 17]) {
        const bytes = randomBytes(size);
        const key = `shops/1/captures/t-${kind}-${size}`;
        await storage.put(key, chunked(bytes));
        expect(await storage.exists(key)).toBe(true);
        const back = await readAll(await storage.get(key));
        expect(back.length).toBe(size);
        expect(sha(back)).toBe(sha(bytes));
        const local = await storage.toLocalFile(key);
        expect(sha(await readFile(local.path))).toBe(sha(bytes));
        await local.release();
        await storage.delete(key);
        expect(await storage.exists(key)).toBe(false);
      }
    }, 60_000);

    it('leaves nothing under the key when the stream fails midway', async () => {
      const storage = drivers[kind];
      const key = `shops/1/captures/t-${kind}-aborted`;
      let sent = 0;
      const failing = new Readable({
        read() {
          // Three chunks arrive, then the client goes away.
          if (sent++ < 3) this.push(randomBytes(64 * 1024));
          else this.destroy(new Error('client went away'));
        },
      });
      await expect(storage.put(key, failing)).rejects.toThrow(/client went away/);
      expect(await storage.exists(key)).toBe(false);
    });

    it('answers a missing object with ENOENT and deletes a missing one quietly', async () => {
      const storage = drivers[kind];
      await expect(storage.get('shops/1/captures/none')).rejects.toMatchObject({ code: 'ENOENT' });
      await expect(storage.toLocalFile('shops/1/captures/none')).rejects.toMatchObject({ code: 'ENOENT' });
      await storage.delete('shops/1/captures/none');
    });

    it('refuses a key the server would never make', async () => {
      await expect(drivers[kind].put('../etc/passwd', Readable.from([Buffer.from('x')]))).rejects.toThrow(RangeError);
    });
  });
}
