/**
 * The start-up sweep of capture storage (issue 19 item 7). After a crash — the app killed in the
 * middle of an upload, a disk restored from an older copy — storage and database can disagree:
 * - an object (or an unfinished `.part` file) that no capture row names is an orphan; it is removed
 *   once it is older than the grace age (default one hour), so an upload that another server or a
 *   job runner is writing right now, whose row is not committed yet, is never touched;
 * - a capture row whose object is missing cannot be analysed; its queued analyses are marked
 *   `failed` with `file_missing` (the worker would fail them the same way), and the rows are logged.
 * The database is read BEFORE storage is listed: a row committed after that read belongs to an
 * object written before it, which the listing then sees as younger than the grace age.
 */
import { Op, QueryTypes, type Sequelize } from 'sequelize';
import type { Logger } from '../logger';
import { Analysis } from '../models';
import type { ObjectStorage } from './storage';

/**
 * Keys the server makes for captures (`shops/<id>/captures/<uuid>`, and the local driver's
 * `<key>.<hex>.part` while writing). Anything else under the storage root is never touched, so a
 * STORAGE_DIR pointed at the wrong folder cannot lose someone's files.
 */
const SERVER_KEY = /^shops\/\d+\/captures\/[0-9a-f-]{36}(\.[0-9a-f]+\.part)?$/;

/** What one sweep did. */
export interface SweepResult {
  /** Orphan keys removed. */
  removed: string[];
  /** Orphans left because they are younger than the grace age. */
  young: number;
  /** Capture ids whose object is missing. */
  missing: number[];
  /** Queued analyses marked failed `file_missing`. */
  failedAnalyses: number;
}

/** Options of {@link sweepStorage}. */
export interface SweepOptions {
  sequelize: Sequelize;
  storage: ObjectStorage;
  logger: Logger;
  /** Orphans younger than this are left alone (ms). */
  graceMs: number;
  now?: () => Date;
}

/** Runs the sweep once; see the module comment. A storage without `list` is skipped. */
export async function sweepStorage(options: SweepOptions): Promise<SweepResult> {
  const { sequelize, storage, logger } = options;
  const result: SweepResult = { removed: [], young: 0, missing: [], failedAnalyses: 0 };
  if (!storage.list) {
    logger.info('storage sweep skipped: this storage cannot list its objects');
    return result;
  }
  const rows = await sequelize.query<{ id: number; storageKey: string }>('SELECT id, storageKey FROM captures', { type: QueryTypes.SELECT });
  const named = new Map(rows.map((r) => [r.storageKey, r.id]));
  const seen = new Set<string>();
  const cutoff = (options.now?.() ?? new Date()).getTime() - options.graceMs;
  for await (const object of storage.list()) {
    if (named.has(object.key)) {
      seen.add(object.key);
      continue;
    }
    if (!SERVER_KEY.test(object.key)) continue;
    if (object.modifiedAt.getTime() > cutoff) {
      result.young += 1;
      continue;
    }
    await storage.delete(object.key);
    result.removed.push(object.key);
  }
  for (const [key, id] of named) if (!seen.has(key)) result.missing.push(id);
  if (result.missing.length) {
    const [count] = await Analysis.update(
      { status: 'failed', stage: 'done', progress: 100, errorCode: 'file_missing', errorMessage: 'the stored capture file is missing; upload it again', finishedAt: new Date() },
      { where: { captureId: { [Op.in]: result.missing }, status: 'queued' } },
    );
    result.failedAnalyses = count;
    logger.warn('storage sweep: captures whose stored file is missing', { captureIds: result.missing.slice(0, 50), count: result.missing.length, analysesFailed: count });
  }
  if (result.removed.length) logger.info('storage sweep: removed orphan files', { count: result.removed.length });
  return result;
}
