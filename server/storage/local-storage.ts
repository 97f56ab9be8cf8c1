import { randomBytes } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, readdir, rename, rm, stat } from 'node:fs/promises';
import { dirname, join, relative, sep } from 'node:path';
import type { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { checkKey, missingObject, type LocalFile, type ObjectStorage } from './storage';

/**
 * The local-folder driver: each object is a file under `root` (outside the web root). A write
 * goes to a `.part` file renamed into place when complete, so a half-written object never
 * appears under its key and an aborted one leaves nothing behind.
 */
export function createLocalStorage(root: string): ObjectStorage {
  const pathOf = (key: string) => join(root, checkKey(key));
  return {
    kind: 'local',
    async put(key, body: Readable) {
      const target = pathOf(key);
      await mkdir(dirname(target), { recursive: true });
      const part = `${target}.${randomBytes(6).toString('hex')}.part`;
      try {
        await pipeline(body, createWriteStream(part, { flags: 'wx' }));
        await rename(part, target);
      } catch (error) {
        await rm(part, { force: true });
        throw error;
      }
    },
    async get(key) {
      const path = pathOf(key);
      if (!(await exists(path))) throw missingObject(key);
      return createReadStream(path, { highWaterMark: 1 << 20 });
    },
    async toLocalFile(key): Promise<LocalFile> {
      const path = pathOf(key);
      if (!(await exists(path))) throw missingObject(key);
      return { path, release: async () => {} };
    },
    async delete(key) {
      await rm(pathOf(key), { force: true });
    },
    exists: (key) => exists(pathOf(key)),
    async *list() {
      let entries;
      try {
        entries = await readdir(root, { recursive: true, withFileTypes: true });
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return;
        throw error;
      }
      for (const e of entries) {
        if (!e.isFile()) continue;
        const path = join(e.parentPath, e.name);
        const key = relative(root, path).split(sep).join('/');
        try {
          yield { key, modifiedAt: (await stat(path)).mtime };
        } catch {
          /* removed meanwhile */
        }
      }
    },
  };
}

async function exists(path: string): Promise<boolean> {
  try {
    return (await stat(path)).isFile();
  } catch {
    return false;
  }
}
