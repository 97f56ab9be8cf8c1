/**
 * Where capture files live, behind one small interface with two drivers: a local folder outside
 * the web root (default, `.data/captures`) and S3-compatible object storage (a hosted shop). Keys
 * are chosen by the server (`shops/<id>/captures/<uuid>`): never a name a user gave. Workers never
 * see storage: the job runner asks for a local file (`toLocalFile`) and hands its path over.
 */
import type { Readable } from 'node:stream';

/** A local copy of a stored object for a worker; `release` removes it when it was a temporary download. */
export interface LocalFile {
  path: string;
  release(): Promise<void>;
}

/** The storage driver interface. */
export interface ObjectStorage {
  readonly kind: 'local' | 's3';
  /**
   * Writes `body` under `key`, streaming. Resolves once the object is complete; on any error
   * (including `body` being destroyed) nothing is left under the key and the promise rejects.
   */
  put(key: string, body: Readable): Promise<void>;
  /** Reads an object as a stream (rejects with code `ENOENT` when missing). */
  get(key: string): Promise<Readable>;
  /** A local file with the object's bytes. */
  toLocalFile(key: string): Promise<LocalFile>;
  /** Removes an object; missing is not an error. */
  delete(key: string): Promise<void>;
  exists(key: string): Promise<boolean>;
  /**
   * Every stored object (and, for the local driver, every unfinished `.part` file) with its last
   * change, for the start-up sweep and backups. Optional so test doubles need not implement it.
   */
  list?(): AsyncIterable<StoredObject>;
}

/** One entry of {@link ObjectStorage.list}. */
export interface StoredObject {
  key: string;
  modifiedAt: Date;
}

/** Keys the drivers accept: lower-case letters, digits, '-', '_', '.', '/' segments; no '..'. */
export function checkKey(key: string): string {
  if (!/^[a-z0-9][a-z0-9._/-]{0,199}$/.test(key) || key.includes('..') || key.includes('//')) {
    throw new RangeError(`storage key "${key}" is not one the server makes`);
  }
  return key;
}

/** An error whose code is ENOENT (missing object), as fs gives one. */
export function missingObject(key: string): NodeJS.ErrnoException {
  const e = new Error(`stored object ${key} is missing`) as NodeJS.ErrnoException;
  e.code = 'ENOENT';
  return e;
}
