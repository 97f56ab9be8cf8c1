/**
 * Backups (issue 19 item 8): the database (mariadb-dump, one consistent snapshot) and the capture
 * storage in ONE dated archive, and the way back. With the S3 driver the objects are copied into
 * the archive too, or, with `includeObjects: false`, only listed (key, size, SHA-256) in the
 * manifest for a bucket the shop backs up itself. Used by `npm run backup` and `npm run restore`
 * (scripts/backup.ts, scripts/restore.ts). A restore replaces the whole database, so the app and
 * its job runners must be stopped first.
 */
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, mkdtemp, readFile, rm, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { QueryTypes, type Sequelize } from 'sequelize';
import type { ObjectStorage } from '../storage/storage';

/** What a backup archive holds besides the dump and the objects. */
export interface BackupManifest {
  format: 'crankwise-backup';
  version: 1;
  createdAt: string;
  database: string;
  /** Migrations applied when the dump was taken (a restore into older code is refused). */
  migrations: string[];
  storage: 'local' | 's3';
  objectsIncluded: boolean;
  objects: { key: string; byteSize: number; sha256: string }[];
}

/** A MariaDB URL taken apart for the command-line clients (password passed in MYSQL_PWD, never on argv). */
export function connectionOf(url: string): { host: string; port: string; user: string; password: string; database: string } {
  const u = new URL(url);
  return {
    host: u.hostname,
    port: u.port || '3306',
    user: decodeURIComponent(u.username),
    password: decodeURIComponent(u.password),
    database: decodeURIComponent(u.pathname.replace(/^\//, '')),
  };
}

function run(command: string, args: string[], options: { env?: NodeJS.ProcessEnv; stdinFile?: string; stdoutFile?: string }): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { env: { ...process.env, ...options.env }, stdio: ['pipe', options.stdoutFile ? 'pipe' : 'ignore', 'pipe'] });
    let stderr = '';
    child.stderr!.on('data', (d) => (stderr += String(d)));
    const done: Promise<unknown>[] = [];
    if (options.stdoutFile) done.push(pipeline(child.stdout!, createWriteStream(options.stdoutFile)));
    if (options.stdinFile) done.push(pipeline(createReadStream(options.stdinFile), child.stdin!));
    else child.stdin!.end();
    child.once('error', (error) => reject(new Error(`${command} could not start (${error.message}); install the mariadb-client package`)));
    child.once('close', (code) => {
      Promise.all(done).then(
        () => (code === 0 ? resolve() : reject(new Error(`${command} failed (exit ${code}): ${stderr.trim().split('\n').slice(-3).join(' ')}`))),
        reject,
      );
    });
  });
}

function clientArgs(c: ReturnType<typeof connectionOf>): string[] {
  return ['--host', c.host, '--port', c.port, '--user', c.user, '--protocol', 'tcp', '--default-character-set', 'utf8mb4'];
}

async function sha256OfFile(path: string): Promise<string> {
  const hash = createHash('sha256');
  await pipeline(createReadStream(path), hash);
  return hash.digest('hex');
}

/** The stored objects the database knows about (captures' keys, sizes and the SHA-256 taken at upload). */
async function storedObjects(sequelize: Sequelize): Promise<BackupManifest['objects']> {
  const rows = await sequelize.query<{ storageKey: string; byteSize: number; sha256: string }>(
    'SELECT storageKey, byteSize, sha256 FROM captures ORDER BY id', { type: QueryTypes.SELECT });
  return rows.map((r) => ({ key: r.storageKey, byteSize: Number(r.byteSize), sha256: r.sha256 }));
}

/** `crankwise-backup-2026-12-03T0915Z.tar.gz` for `now`. */
export function archiveName(now = new Date()): string {
  return `crankwise-backup-${now.toISOString().slice(0, 16).replace(/:/g, '')}Z.tar.gz`;
}

/** Options of {@link createBackup}. */
export interface BackupOptions {
  databaseUrl: string;
  sequelize: Sequelize;
  storage: ObjectStorage;
  /** Folder the archive is written to (created when missing). */
  outDir: string;
  /** Copy the objects into the archive (default true); false writes only the manifest of keys. */
  includeObjects?: boolean;
  now?: Date;
  log?: (message: string) => void;
}

/**
 * Writes one archive: `database.sql` (mariadb-dump --single-transaction: a consistent snapshot
 * without locking the app), `objects/<key>` for every stored capture (SHA-256 checked against the
 * value recorded at upload), and `manifest.json`. Returns the archive's path. A capture whose
 * object is missing is listed in the manifest but not copied, and reported through `log`.
 */
export async function createBackup(options: BackupOptions): Promise<{ archive: string; manifest: BackupManifest; missing: string[] }> {
  const log = options.log ?? (() => {});
  const c = connectionOf(options.databaseUrl);
  const work = await mkdtemp(join(tmpdir(), 'crankwise-backup-'));
  try {
    log(`dumping database ${c.database}`);
    await run('mariadb-dump', [...clientArgs(c), '--single-transaction', '--routines', '--triggers', '--add-drop-table', '--hex-blob', c.database], {
      env: { MYSQL_PWD: c.password },
      stdoutFile: join(work, 'database.sql'),
    });
    const objects = await storedObjects(options.sequelize);
    const migrations = (await options.sequelize.query<{ name: string }>('SELECT name FROM SequelizeMeta ORDER BY name', { type: QueryTypes.SELECT })).map((r) => r.name);
    const includeObjects = options.includeObjects ?? true;
    const missing: string[] = [];
    if (includeObjects) {
      log(`copying ${objects.length} stored capture${objects.length === 1 ? '' : 's'}`);
      for (const o of objects) {
        const target = join(work, 'objects', o.key);
        await mkdir(dirname(target), { recursive: true });
        let body;
        try {
          body = await options.storage.get(o.key);
        } catch (error) {
          if ((error as NodeJS.ErrnoException).code === 'ENOENT') { missing.push(o.key); continue; }
          throw error;
        }
        const hash = createHash('sha256');
        const tap = new Transform({ transform(chunk, _enc, cb) { hash.update(chunk); cb(null, chunk); } });
        await pipeline(body, tap, createWriteStream(target));
        const digest = hash.digest('hex');
        if (digest !== o.sha256) log(`warning: ${o.key} does not match the SHA-256 recorded at upload (stored ${digest.slice(0, 12)}…, recorded ${o.sha256.slice(0, 12)}…); backed up as it is`);
      }
      if (missing.length) log(`warning: ${missing.length} stored capture(s) missing from storage: ${missing.slice(0, 5).join(', ')}${missing.length > 5 ? ' …' : ''}`);
    }
    const manifest: BackupManifest = {
      format: 'crankwise-backup', version: 1, createdAt: (options.now ?? new Date()).toISOString(), database: c.database,
      migrations, storage: options.storage.kind, objectsIncluded: includeObjects, objects,
    };
    await writeFile(join(work, 'manifest.json'), `${JSON.stringify(manifest, null, 2)}\n`);
    await mkdir(options.outDir, { recursive: true });
    const archive = join(options.outDir, archiveName(options.now));
    await run('tar', ['-czf', archive, '-C', work, '.'], {});
    return { archive, manifest, missing };
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}

/** Options of {@link restoreBackup}. */
export interface RestoreOptions {
  archive: string;
  databaseUrl: string;
  sequelize: Sequelize;
  storage: ObjectStorage;
  log?: (message: string) => void;
}

/**
 * Brings an archive back: checks its manifest and every object's SHA-256 BEFORE touching
 * anything (a damaged archive changes nothing), then drops every table of the database and loads
 * the dump, then writes the objects back under their keys. For an archive made with
 * `--no-objects`, checks that each listed object is present in storage and reports the missing.
 * Objects in storage that the restored database does not name are left for the start-up sweep.
 */
export async function restoreBackup(options: RestoreOptions): Promise<{ manifest: BackupManifest; restoredObjects: number; missing: string[] }> {
  const log = options.log ?? (() => {});
  const c = connectionOf(options.databaseUrl);
  const work = await mkdtemp(join(tmpdir(), 'crankwise-restore-'));
  try {
    await run('tar', ['-xzf', options.archive, '-C', work], {}).catch((error: Error) => {
      throw new Error(`${options.archive} is not a readable backup archive (${error.message}); check the path`);
    });
    let manifest: BackupManifest;
    try {
      manifest = JSON.parse(await readFile(join(work, 'manifest.json'), 'utf8')) as BackupManifest;
    } catch {
      throw new Error(`${options.archive} has no manifest.json: not a Crankwise backup`);
    }
    if (manifest.format !== 'crankwise-backup' || manifest.version !== 1) throw new Error(`${options.archive}: unknown backup format`);
    const known = new Set((await options.sequelize.query<{ name: string }>('SELECT name FROM SequelizeMeta', { type: QueryTypes.SELECT }).catch(() => [])).map((r) => r.name));
    const unknown = manifest.migrations.filter((m) => known.size > 0 && !known.has(m));
    if (unknown.length) throw new Error(`the backup has migrations this database never ran (${unknown.slice(0, 3).join(', ')}); restore it with the Crankwise version that made it`);
    if (manifest.objectsIncluded) {
      log(`checking ${manifest.objects.length} object(s)`);
      for (const o of manifest.objects) {
        const path = join(work, 'objects', o.key);
        const digest = await sha256OfFile(path).catch(() => null);
        if (digest === null) continue; // missing at backup time (reported then)
        if (digest !== o.sha256) throw new Error(`${o.key} in the archive is damaged (SHA-256 differs); nothing was restored`);
      }
    }
    log(`restoring database ${c.database}`);
    const tables = await options.sequelize.query<{ name: string }>(
      'SELECT table_name AS name FROM information_schema.tables WHERE table_schema = DATABASE()', { type: QueryTypes.SELECT });
    await options.sequelize.transaction(async (transaction) => {
      await options.sequelize.query('SET FOREIGN_KEY_CHECKS = 0', { transaction });
      for (const t of tables) await options.sequelize.query(`DROP TABLE IF EXISTS \`${t.name.replace(/`/g, '')}\``, { transaction });
      await options.sequelize.query('SET FOREIGN_KEY_CHECKS = 1', { transaction });
    });
    await run('mariadb', [...clientArgs(c), c.database], { env: { MYSQL_PWD: c.password }, stdinFile: join(work, 'database.sql') });
    let restoredObjects = 0;
    const missing: string[] = [];
    for (const o of manifest.objects) {
      if (manifest.objectsIncluded) {
        const path = join(work, 'objects', o.key);
        const present = await sha256OfFile(path).then(() => true, () => false);
        if (!present) { missing.push(o.key); continue; }
        await options.storage.put(o.key, createReadStream(path));
        restoredObjects += 1;
      } else if (!(await options.storage.exists(o.key))) missing.push(o.key);
    }
    if (missing.length) log(`warning: ${missing.length} object(s) not available: ${missing.slice(0, 5).join(', ')}${missing.length > 5 ? ' …' : ''}`);
    return { manifest, restoredObjects, missing };
  } finally {
    await rm(work, { recursive: true, force: true });
  }
}
