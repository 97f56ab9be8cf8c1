/**
 * Receives a capture upload (issue 15 items 2–3): multipart with one `metadata` field (a JSON
 * array, index-aligned with the files, sent before them) and one or several `files`. A multer
 * storage engine streams each file straight to storage (never whole in memory) under a key the
 * server chooses, computing its SHA-256 and running the structure-only check on the way; a file
 * over UPLOAD_MAX_MB is answered 413, a file the check refuses 422 `capture_rejected`. Any refusal
 * or an aborted request removes every object already written for the request, so nothing is left.
 */
import { createHash, randomUUID } from 'node:crypto';
import { Transform } from 'node:stream';
import type { Request, RequestHandler } from 'express';
import multer, { MulterError, type StorageEngine } from 'multer';
import { ZodError } from 'zod';
import { CaptureFormatError } from '../../shared/formats/capture-format-error';
import { createStructureChecker, type StructureInfo } from '../../shared/formats/structure-check';
import { MAX_FILES_PER_UPLOAD, type UploadMetadata, UploadMetadataSchema } from '../../shared/schemas/captures';
import { appContext } from '../context';
import { AppError } from '../errors';
import { zodToAppError } from '../middleware/error-handler';
import type { ObjectStorage } from '../storage/storage';

/** One stored file of an upload. */
export interface StoredUpload {
  index: number;
  key: string;
  originalName: string;
  sha256: string;
  byteSize: number;
  info: StructureInfo;
}

interface UploadState { metadata: UploadMetadata | null; next: number; stored: StoredUpload[] }

const stateOf = (req: Request): UploadState => {
  const r = req as Request & { captureUpload?: UploadState };
  r.captureUpload ??= { metadata: null, next: 0, stored: [] };
  return r.captureUpload;
};

/**
 * The original file name, cleaned for display: path parts, control characters and characters
 * that mean something in a shell or an HTML attribute dropped, at most 200 characters. Any name
 * is accepted; it is never used to store or recognise the file.
 */
export function cleanFileName(name: string | undefined): string {
  const base = (name ?? '').split(/[\\/]/).pop() ?? '';
  // eslint-disable-next-line no-control-regex
  const cleaned = base.normalize('NFC').replace(/[\u0000-\u001f\u007f<>:"|?*`$]/g, '').replace(/\s+/g, ' ').trim().slice(0, 200);
  return cleaned === '' || cleaned === '.' || cleaned === '..' ? 'capture' : cleaned;
}

function readMetadata(req: Request): UploadMetadata {
  const raw = (req.body as Record<string, unknown> | undefined)?.metadata;
  if (typeof raw !== 'string') {
    throw new AppError(400, 'metadata_missing', 'Send the "metadata" field (a JSON array with one entry per file) before the files');
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(raw);
  } catch {
    throw new AppError(400, 'validation_failed', 'metadata: not valid JSON; send an array with one object per file', [{ path: 'metadata', message: 'not valid JSON' }]);
  }
  try {
    return UploadMetadataSchema.parse(parsed);
  } catch (e) {
    if (e instanceof ZodError) throw zodToAppError(e, 'metadata');
    throw e;
  }
}

function rejection(e: unknown, index: number, name: string): Error {
  if (e instanceof CaptureFormatError) {
    return new AppError(422, 'capture_rejected', e.message, { index, name, reason: e.code });
  }
  return e instanceof Error ? e : new Error(String(e));
}

function captureEngine(storage: ObjectStorage, shopId: (req: Request) => number, maxBytes: number): StorageEngine {
  return {
    _handleFile(req, file, cb) {
      const state = stateOf(req);
      let index = -1;
      try {
        state.metadata ??= readMetadata(req);
        index = state.next++;
        if (index >= state.metadata.length) {
          throw new AppError(400, 'file_count_mismatch', `More files than metadata entries (${state.metadata.length}); send one metadata entry per file`);
        }
      } catch (e) {
        file.stream.resume();
        cb(e as Error);
        return;
      }
      const name = cleanFileName(file.originalname);
      const key = `shops/${shopId(req)}/captures/${randomUUID()}`;
      const hash = createHash('sha256');
      const checker = createStructureChecker(name);
      let bytes = 0;
      let info: StructureInfo | null = null;
      const tap = new Transform({
        transform(chunk: Buffer, _enc, done) {
          try {
            bytes += chunk.length;
            if (bytes > maxBytes) throw tooLarge(name, maxBytes);
            hash.update(chunk);
            checker.feed(chunk);
            done(null, chunk);
          } catch (e) {
            done(rejection(e, index, name));
          }
        },
        flush(done) {
          try {
            info = checker.end();
            done();
          } catch (e) {
            done(rejection(e, index, name));
          }
        },
      });
      // The storage driver's pipeline reports the error; this listener keeps a second emission
      // (after the pipeline let go of the stream) from becoming an uncaught exception.
      tap.on('error', () => {});
      file.stream.on('limit', () => tap.destroy(tooLarge(name, maxBytes)));
      file.stream.on('error', (e) => tap.destroy(e));
      file.stream.pipe(tap);
      storage.put(key, tap).then(
        () => {
          const stored: StoredUpload = { index, key, originalName: name, sha256: hash.digest('hex'), byteSize: bytes, info: info! };
          state.stored.push(stored);
          cb(null, { path: key, size: bytes });
        },
        (e: unknown) => {
          file.stream.unpipe(tap);
          file.stream.resume();
          cb(e instanceof Error ? e : new Error(String(e)));
        },
      );
    },
    _removeFile(req, file, cb) {
      const key = (file as unknown as { path?: string }).path;
      const state = stateOf(req);
      state.stored = state.stored.filter((s) => s.key !== key);
      if (!key) { cb(null); return; }
      storage.delete(key).then(() => cb(null), (e: unknown) => cb(e as Error));
    },
  };
}

function tooLarge(name: string, maxBytes: number): AppError {
  const mb = Math.round(maxBytes / 1024 / 1024);
  return new AppError(413, 'file_too_large', `${name} is larger than ${mb} MB; record a shorter capture (60 s is plenty) or ask your admin to raise UPLOAD_MAX_MB`);
}

/**
 * The middleware: stores the files and leaves `res.locals.uploads` (StoredUpload[] in file order)
 * and `res.locals.uploadMetadata`. On any error every object already stored is removed.
 */
export function receiveCaptures(): RequestHandler {
  return (req, res, next) => {
    const ctx = appContext(req);
    const maxBytes = ctx.env.UPLOAD_MAX_MB * 1024 * 1024;
    const upload = multer({
      storage: captureEngine(ctx.storage, (r) => r.user!.shopId, maxBytes),
      limits: { fileSize: maxBytes, files: MAX_FILES_PER_UPLOAD, fields: 4, fieldSize: 512 * 1024, parts: MAX_FILES_PER_UPLOAD + 4 },
    }).array('files', MAX_FILES_PER_UPLOAD);
    if (!req.is('multipart/form-data')) {
      next(new AppError(400, 'validation_failed', 'Send the captures as multipart/form-data with a "metadata" field and the "files"'));
      return;
    }
    upload(req, res, (err?: unknown) => {
      const state = stateOf(req);
      const fail = (e: unknown) => {
        const keys = state.stored.map((s) => s.key);
        state.stored = [];
        Promise.all(keys.map((k) => ctx.storage.delete(k).catch(() => {}))).finally(() => next(e));
      };
      if (err) {
        if (err instanceof MulterError) {
          if (err.code === 'LIMIT_FILE_SIZE') return fail(tooLarge(cleanFileName(err.field === 'files' ? (err as { filename?: string }).filename : undefined), maxBytes));
          if (err.code === 'LIMIT_FILE_COUNT' || err.code === 'LIMIT_UNEXPECTED_FILE') {
            return fail(new AppError(400, 'validation_failed', `Send at most ${MAX_FILES_PER_UPLOAD} files, in the "files" field`));
          }
          return fail(new AppError(400, 'validation_failed', `The upload form is not as expected (${err.code}); send "metadata" then "files"`));
        }
        return fail(err);
      }
      try {
        const metadata = state.metadata ?? readMetadata(req);
        const stored = [...state.stored].sort((a, b) => a.index - b.index);
        if (stored.length === 0) throw new AppError(400, 'no_files', 'No capture files received; add one or more files in the "files" field');
        if (stored.length !== metadata.length) {
          throw new AppError(400, 'file_count_mismatch', `${stored.length} file${stored.length === 1 ? '' : 's'} but ${metadata.length} metadata entries; send one entry per file`);
        }
        for (const s of stored) {
          const described = metadata[s.index].channels.length;
          if (described > s.info.channels) {
            throw new AppError(422, 'capture_rejected', `${s.originalName}: the metadata describes ${described} channels but the file has ${s.info.channels}; describe only the file's channels`, { index: s.index, name: s.originalName, reason: 'channel_count' });
          }
        }
        res.locals.uploads = stored;
        res.locals.uploadMetadata = metadata;
        next();
      } catch (e) {
        fail(e);
      }
    });
  };
}
