// The start-up storage sweep (issue 19 item 7): orphan files older than the grace age go, younger
// ones (an upload another process is still committing) stay, named files stay, and a capture whose
// file is missing gets its queued analysis failed with `file_missing`.
import { randomUUID } from 'node:crypto';
import { mkdtemp, rm, utimes, writeFile, mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { silentLogger } from '../../../server/logger';
import { Analysis } from '../../../server/models';
import { createLocalStorage } from '../../../server/storage/local-storage';
import { sweepStorage } from '../../../server/storage/sweep';
import { createCaptureRow, createCaseRow } from '../../helpers/case-factories';
import { createTestShop } from '../../helpers/factories';
import { createTestApp, type TestApp } from '../../helpers/test-app';

let t: TestApp;
let dir: string;
beforeAll(async () => {
  t = await createTestApp();
  dir = await mkdtemp(join(tmpdir(), 'crankwise-sweep-'));
});
afterAll(async () => {
  await t.close();
  await rm(dir, { recursive: true, force: true });
});

const HOUR = 3_600_000;

async function file(key: string, ageMs: number): Promise<void> {
  const path = join(dir, key);
  await mkdir(dirname(path), { recursive: true });
  await writeFile(path, 'bytes');
  const when = new Date(Date.now() - ageMs);
  await utimes(path, when, when);
}

describe('sweepStorage', () => {
  it('removes old orphans and unfinished .part files, keeps young orphans and named files, fails analyses of missing files', async () => {
    const storage = createLocalStorage(dir);
    const shop = (await createTestShop()).shop;
    const c = await createCaseRow(shop);
    const kept = await createCaptureRow(shop, c);
    await storage.put(kept.capture.storageKey, Readable.from([Buffer.from('named')]));
    const lost = await createCaptureRow(shop, c);
    const oldOrphan = `shops/${shop.id}/captures/${randomUUID()}`;
    const oldPart = `shops/${shop.id}/captures/${randomUUID()}.0a1b2c3d4e5f.part`;
    const youngOrphan = `shops/${shop.id}/captures/${randomUUID()}`;
    await file(oldOrphan, 2 * HOUR);
    await file(oldPart, 3 * HOUR);
    await file(youngOrphan, 5 * 60_000);
    await file('notes/not-a-capture.txt', 5 * HOUR);

    const result = await sweepStorage({ sequelize: t.sequelize, storage, logger: silentLogger, graceMs: HOUR });
    expect(result.removed.sort()).toEqual([oldOrphan, oldPart].sort());
    expect(result.young).toBe(1);
    expect(result.missing).toContain(lost.capture.id);
    expect(result.missing).not.toContain(kept.capture.id);
    expect(await storage.exists(oldOrphan)).toBe(false);
    expect(await storage.exists('notes/not-a-capture.txt')).toBe(true);
    expect(await storage.exists(youngOrphan)).toBe(true);
    expect(await storage.exists(kept.capture.storageKey)).toBe(true);
    const failed = await Analysis.findByPk(lost.analysis.id);
    expect(failed).toMatchObject({ status: 'failed', errorCode: 'file_missing' });
    expect((await Analysis.findByPk(kept.analysis.id))!.status).toBe('queued');
  });

  it('skips a storage that cannot list (a test double) without touching anything', async () => {
    const storage = { ...createLocalStorage(dir), list: undefined };
    const result = await sweepStorage({ sequelize: t.sequelize, storage, logger: silentLogger, graceMs: 0 });
    expect(result).toEqual({ removed: [], young: 0, missing: [], failedAnalyses: 0 });
  });
});
