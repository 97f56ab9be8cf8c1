import { randomBytes } from 'node:crypto';
import { createWriteStream } from 'node:fs';
import { rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';
import { checkKey, missingObject, type LocalFile, type ObjectStorage } from './storage';

/** Settings of the S3-compatible driver (env S3_*; README "Storage"). */
export interface S3StorageOptions {
  bucket: string;
  /** e.g. http://127.0.0.1:4569 for a local fake; omitted = the provider's default for the region. */
  endpoint?: string;
  region: string;
  accessKeyId: string;
  secretAccessKey: string;
  /** Key prefix inside the bucket (e.g. "crankwise/"). */
  prefix?: string;
}

/**
 * The S3-compatible driver over @aws-sdk/client-s3. Path-style addressing (most self-hosted
 * stores need it) and checksums only when required: with the SDK's default of always adding a
 * checksum, a streamed upload is sent aws-chunked, and stores that do not decode that framing keep
 * it inside the object (issue 15 item 4). Uploads go through lib-storage's multipart Upload, so a
 * stream of unknown length is sent in parts without holding it whole in memory; a failed upload is
 * aborted (no object is left).
 */
export function createS3Storage(options: S3StorageOptions): ObjectStorage {
  const client = new S3Client({
    region: options.region,
    endpoint: options.endpoint,
    forcePathStyle: true,
    credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  });
  const Bucket = options.bucket;
  const keyOf = (key: string) => `${options.prefix ?? ''}${checkKey(key)}`;
  const isMissing = (e: unknown) => {
    const err = e as { name?: string; $metadata?: { httpStatusCode?: number } };
    return err?.name === 'NoSuchKey' || err?.name === 'NotFound' || err?.$metadata?.httpStatusCode === 404;
  };
  const storage: ObjectStorage = {
    kind: 's3',
    async put(key, body) {
      const upload = new Upload({ client, params: { Bucket, Key: keyOf(key), Body: body }, queueSize: 2, partSize: 8 * 1024 * 1024, leavePartsOnError: false });
      const failed = new Promise<never>((_, reject) => body.once('error', reject));
      try {
        await Promise.race([upload.done(), failed]);
      } catch (error) {
        await upload.abort().catch(() => {});
        await storage.delete(key).catch(() => {});
        throw error;
      }
    },
    async get(key) {
      try {
        const out = await client.send(new GetObjectCommand({ Bucket, Key: keyOf(key) }));
        return out.Body as Readable;
      } catch (e) {
        if (isMissing(e)) throw missingObject(key);
        throw e;
      }
    },
    async toLocalFile(key): Promise<LocalFile> {
      const path = join(tmpdir(), `crankwise-${randomBytes(8).toString('hex')}`);
      try {
        await pipeline(await storage.get(key), createWriteStream(path));
      } catch (e) {
        await rm(path, { force: true });
        throw e;
      }
      return { path, release: () => rm(path, { force: true }) };
    },
    async delete(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: keyOf(key) }));
    },
    async *list() {
      const prefix = options.prefix ?? '';
      let ContinuationToken: string | undefined;
      do {
        const page = await client.send(new ListObjectsV2Command({ Bucket, Prefix: `${prefix}shops/`, ContinuationToken }));
        for (const o of page.Contents ?? []) {
          if (o.Key) yield { key: o.Key.slice(prefix.length), modifiedAt: o.LastModified ?? new Date(0) };
        }
        ContinuationToken = page.IsTruncated ? page.NextContinuationToken : undefined;
      } while (ContinuationToken);
    },
    async exists(key) {
      try {
        await client.send(new HeadObjectCommand({ Bucket, Key: keyOf(key) }));
        return true;
      } catch (e) {
        if (isMissing(e)) return false;
        throw e;
      }
    },
  };
  return storage;
}

/** Wraps bytes as a stream for `put`. */
export const streamOf = (bytes: Uint8Array): Readable => Readable.from([Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength)]);
