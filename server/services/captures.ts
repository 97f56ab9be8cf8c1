/**
 * Captures of a case and their analysis jobs (issue 15 items 2 and 5): the rows for an upload
 * (one capture and one queued Analysis per file, in one transaction with the case row locked and
 * the status rules checked there), deletion before ranking, re-analysis with other settings (the
 * older Analysis is kept), and retrying a failed job.
 */
import { transactionWithRetry } from '../db/retry';
import type { Transaction } from 'sequelize';
import { AnalysisSettingsSchema } from '../../shared/schemas/analysis-settings';
import type { UploadMetadata } from '../../shared/schemas/captures';
import { AppError, forbidden } from '../errors';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import type { Case } from '../models/case';
import type { ObjectStorage } from '../storage/storage';
import type { StoredUpload } from './capture-upload';
import { appendTimeline } from './case-timeline';
import { type Actor, lockCase, sequelizeOf } from './cases';

/** Checks that the case takes captures of `phase` now (409 otherwise). */
export function assertTakesCaptures(c: Case, phase: 'before' | 'after_repair'): void {
  if (phase === 'before' && c.status !== 'open' && c.status !== 'testing') {
    throw new AppError(409, 'case_not_testing', `The case is ${c.status}; re-open it to add before-repair captures`);
  }
  if (phase === 'after_repair' && c.status !== 'confirmed') {
    throw new AppError(409, 'case_not_confirmed', `After-repair captures are added once a cause is confirmed; the case is ${c.status}`);
  }
}

/** Queues a new analysis of a capture (inside `t`) and makes it the capture's current one. */
export async function queueAnalysis(capture: Capture, runSettings: Record<string, unknown>, t: Transaction): Promise<Analysis> {
  const a = await Analysis.create({ shopId: capture.shopId, captureId: capture.id, status: 'queued', stage: 'queued', runSettings }, { transaction: t });
  capture.currentAnalysisId = a.id;
  await capture.save({ transaction: t });
  return a;
}

/**
 * Creates the capture and analysis rows for stored uploads. On any error the stored objects are
 * deleted, so a refused upload leaves neither a file nor a row.
 */
export async function createCaptures(actor: Actor, caseId: number, uploads: StoredUpload[], metadata: UploadMetadata, storage: ObjectStorage): Promise<Capture[]> {
  try {
    return await transactionWithRetry(sequelizeOf(), async (t) => {
      const c = await lockCase(actor.shopId, caseId, t);
      const out: Capture[] = [];
      for (const u of uploads) {
        const m = metadata[u.index];
        assertTakesCaptures(c, m.phase);
        const capture = await Capture.create({
          shopId: actor.shopId, caseId, uploadedById: actor.id, originalName: u.originalName, format: u.info.format, byteSize: u.byteSize,
          sha256: u.sha256, storageKey: u.key, sampleRateHz: u.info.sampleRateHz, channelCount: u.info.channels, durationS: u.info.durationS,
          phase: m.phase, metadata: m, currentAnalysisId: null,
        }, { transaction: t });
        const a = await queueAnalysis(capture, {}, t);
        await appendTimeline({
          shopId: actor.shopId, caseId, actorId: actor.id, kind: 'capture_added',
          message: `${actor.name} added ${u.originalName} (${m.phase === 'before' ? 'before repair' : 'after repair'}, probe at ${m.probePoint.label})`,
          data: { captureId: capture.id, analysisId: a.id },
        }, t);
        out.push(capture);
      }
      if (c.status === 'open' && out.some((x) => x.phase === 'before')) {
        c.status = 'testing';
        c.version += 1;
        await c.save({ transaction: t });
      } else {
        c.changed('updatedAt', true);
        await c.save({ transaction: t });
      }
      return out;
    });
  } catch (error) {
    await Promise.all(uploads.map((u) => storage.delete(u.key).catch(() => {})));
    throw error;
  }
}

/** Deletes a capture before ranking (a technician only their own), with its analyses and file. */
export async function deleteCapture(actor: Actor, captureId: number, storage: ObjectStorage): Promise<void> {
  const key = await sequelizeOf().transaction(async (t) => {
    const found = await Capture.findOne({ where: { id: captureId, shopId: actor.shopId }, transaction: t });
    if (!found) throw new AppError(404, 'not_found', 'Capture not found');
    const c = await lockCase(actor.shopId, found.caseId, t);
    const capture = (await Capture.findByPk(captureId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    if (actor.role === 'tech' && capture.uploadedById !== actor.id) throw forbidden();
    if (c.status !== 'open' && c.status !== 'testing') {
      throw new AppError(409, 'case_ranked', `The case is ${c.status}; captures can be deleted only before it is ranked (re-open it first)`);
    }
    await capture.destroy({ transaction: t });
    await appendTimeline({ shopId: actor.shopId, caseId: c.id, actorId: actor.id, kind: 'capture_deleted', message: `${actor.name} deleted ${capture.originalName}`, data: { captureId } }, t);
    return capture.storageKey;
  });
  await storage.delete(key).catch(() => {});
  await storage.delete(`${key}.listen48k.wav`).catch(() => {});
}

/** Queues a re-analysis with the "this run" settings (validated now; 400 naming a bad field). */
export async function reanalyzeCapture(actor: Actor, captureId: number, settings: Record<string, unknown>): Promise<Analysis> {
  AnalysisSettingsSchema.parse(settings);
  // The job runner locks analysis rows too: a deadlock reruns this transaction (issue 19), never a 500.
  return transactionWithRetry(sequelizeOf(), async (t) => {
    const found = await Capture.findOne({ where: { id: captureId, shopId: actor.shopId }, transaction: t });
    if (!found) throw new AppError(404, 'not_found', 'Capture not found');
    const c = await lockCase(actor.shopId, found.caseId, t);
    if (c.status === 'closed') throw new AppError(409, 'case_closed', 'This case is closed; its captures can no longer be analysed again');
    const capture = (await Capture.findByPk(captureId, { transaction: t, lock: t.LOCK.UPDATE }))!;
    return queueAnalysis(capture, settings, t);
  });
}

/** Queues a failed analysis again (attempts reset). */
export async function retryAnalysis(actor: Actor, analysisId: number): Promise<Analysis> {
  return sequelizeOf().transaction(async (t) => {
    const a = await Analysis.findOne({ where: { id: analysisId, shopId: actor.shopId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!a) throw new AppError(404, 'not_found', 'Analysis not found');
    if (a.status !== 'failed') throw new AppError(409, 'not_failed', `Only a failed analysis can be retried; this one is ${a.status}`);
    await a.update({
      status: 'queued', stage: 'queued', progress: 0, attempts: 0, errorCode: null, errorMessage: null, leasedBy: null, leaseExpiresAt: null,
      startedAt: null, finishedAt: null,
    }, { transaction: t });
    return a;
  });
}
