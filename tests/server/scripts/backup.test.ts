// `npm run backup` / `npm run restore` (issue 19 item 8) on a database of their own in the test
// MariaDB and a capture folder of their own: back up, change rows and files, restore, and find the
// earlier state — rows, the stored capture bytes (SHA-256) and no trace of the later changes. A
// damaged archive changes nothing. `--no-objects` lists keys and SHA-256 instead of copying them.
import { createHash, randomUUID } from 'node:crypto';
import { mkdtemp, readFile, rm, writeFile, mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { spawnSync } from 'node:child_process';
import type { Sequelize } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startDatabase, type RunningDatabase } from '../../../scripts/db';
import { createSequelize } from '../../../server/db/sequelize';
import { migrate } from '../../../server/db/migrator';
import { Capture, Case, Shop, User } from '../../../server/models';
import { createBackup, restoreBackup } from '../../../server/ops/backup';
import { createLocalStorage } from '../../../server/storage/local-storage';
import type { ObjectStorage } from '../../../server/storage/storage';
import { createCaptureRow, createCaseRow } from '../../helpers/case-factories';
import { createTestShop, createUser, type TestShop } from '../../helpers/factories';

let db: RunningDatabase;
let sequelize: Sequelize;
let dir: string;
let storage: ObjectStorage;
let shop: TestShop;
let captureKey: string;
let captureId: number;
const bytes = Buffer.from(Array.from({ length: 50_000 }, (_, i) => (i * 31) & 255));
const sha = createHash('sha256').update(bytes).digest('hex');
const database = `crankwise_backup_r${process.pid}`;

beforeAll(async () => {
  db = await startDatabase({ name: 'test-db', port: Number(process.env.TEST_DB_PORT ?? 3308), dataDir: process.env.TEST_DB_DATA_DIR, database, fresh: true });
  sequelize = await createSequelize(db.url);
  await migrate(sequelize);
  dir = await mkdtemp(join(tmpdir(), 'crankwise-backup-test-'));
  storage = createLocalStorage(join(dir, 'captures'));
  shop = await createTestShop('Backup Garage');
  const c = await createCaseRow(shop.shop);
  const { capture } = await createCaptureRow(shop.shop, c);
  capture.sha256 = sha;
  capture.byteSize = bytes.length;
  await capture.save();
  captureKey = capture.storageKey;
  captureId = capture.id;
  await storage.put(captureKey, Readable.from([bytes]));
}, 120_000);

afterAll(async () => {
  await sequelize?.close();
  await db?.dropDatabase(database);
  await db?.stop();
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('backup and restore', () => {
  it('restores the earlier rows and capture files after changes', async () => {
    const { archive, manifest } = await createBackup({ databaseUrl: db.url, sequelize, storage, outDir: join(dir, 'backups') });
    expect(archive).toMatch(/crankwise-backup-\d{4}-\d{2}-\d{2}T\d{4}Z\.tar\.gz$/);
    expect(manifest.objects).toEqual([{ key: captureKey, byteSize: bytes.length, sha256: sha }]);
    const listing = spawnSync('tar', ['-tzf', archive], { encoding: 'utf8' }).stdout;
    expect(listing).toMatch(/database\.sql/);
    expect(listing).toMatch(/manifest\.json/);
    expect(listing).toContain(captureKey);

    // Later changes: a renamed shop, a new user, the capture row and its file deleted, another file.
    await Shop.update({ name: 'Renamed After Backup' }, { where: { id: shop.shop.id } });
    const late = await createUser(shop.shop, 'tech');
    await Capture.destroy({ where: { id: captureId } });
    await storage.delete(captureKey);
    await Case.destroy({ where: { shopId: shop.shop.id } });
    expect(await storage.exists(captureKey)).toBe(false);

    await restoreBackup({ archive, databaseUrl: db.url, sequelize, storage });
    expect((await Shop.findByPk(shop.shop.id))!.name).toBe('Backup Garage');
    expect(await User.findByPk(late.user.id)).toBeNull();
    expect(await User.count({ where: { shopId: shop.shop.id } })).toBe(4);
    const restored = await Capture.findByPk(captureId);
    expect(restored!.storageKey).toBe(captureKey);
    const file = await readFile(join(dir, 'captures', captureKey));
    expect(createHash('sha256').update(file).digest('hex')).toBe(sha);
    // The restored app still writes: the schema and its constraints came back too.
    await expect(createUser(shop.shop, 'lead')).resolves.toBeTruthy();
  });

  it('refuses a damaged archive before changing anything', async () => {
    const { archive } = await createBackup({ databaseUrl: db.url, sequelize, storage, outDir: join(dir, 'backups-2') });
    // Unpack, damage the stored capture, pack again.
    const work = join(dir, 'damage');
    await mkdir(work, { recursive: true });
    expect(spawnSync('tar', ['-xzf', archive, '-C', work]).status).toBe(0);
    await writeFile(join(work, 'objects', captureKey), Buffer.from('not the capture'));
    const damaged = join(dir, 'damaged.tar.gz');
    expect(spawnSync('tar', ['-czf', damaged, '-C', work, '.']).status).toBe(0);
    await Shop.update({ name: 'Changed Before Bad Restore' }, { where: { id: shop.shop.id } });
    await expect(restoreBackup({ archive: damaged, databaseUrl: db.url, sequelize, storage })).rejects.toThrow(/damaged/);
    expect((await Shop.findByPk(shop.shop.id))!.name).toBe('Changed Before Bad Restore');
    await expect(restoreBackup({ archive: join(dir, 'no-such.tar.gz'), databaseUrl: db.url, sequelize, storage })).rejects.toThrow(/not a readable backup archive/);
  });

  it('with --no-objects lists keys and SHA-256 and copies no object', async () => {
    const { archive, manifest } = await createBackup({ databaseUrl: db.url, sequelize, storage, outDir: join(dir, 'backups-3'), includeObjects: false });
    expect(manifest.objectsIncluded).toBe(false);
    expect(manifest.objects.map((o) => o.sha256)).toContain(sha);
    expect(spawnSync('tar', ['-tzf', archive], { encoding: 'utf8' }).stdout).not.toContain(captureKey);
    const missingKey = `shops/${shop.shop.id}/captures/${randomUUID()}`;
    await Capture.update({ storageKey: missingKey }, { where: { id: captureId } });
    const { archive: second } = await createBackup({ databaseUrl: db.url, sequelize, storage, outDir: join(dir, 'backups-4'), includeObjects: false });
    const { missing } = await restoreBackup({ archive: second, databaseUrl: db.url, sequelize, storage });
    expect(missing).toEqual([missingKey]);
  });
});
