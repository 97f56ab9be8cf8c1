/**
 * Runs one claimed analysis job (issue 15 item 5): resolve the settings, fetch the capture to a
 * local file, run `analyzeFile` on the pool (progress by stage), store the results, append the
 * timeline entry. The lease is renewed by a heartbeat while the job runs. A signal error (a stable
 * code from the readers or the pipeline) fails the job at once with that code; a crash (a worker
 * thread that threw something unexpected or was terminated) leaves the job to its lease, so it is
 * taken back when the lease expires and retried up to three attempts (claim.ts). Every write is
 * guarded by `leasedBy = holder`, so a runner that lost its lease never overwrites another's work;
 * a finished job keeps `leasedBy` as the runner that ran it.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { ZodError } from 'zod';
import type { DriveDocument } from '../../shared/drive/types';
import { parseTaskError, type AnalyzeFileInput, type AnalyzeFileOutput } from '../../shared/tasks';
import type { Logger } from '../logger';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import { Case } from '../models/case';
import { Engine } from '../models/engine';
import { seriesRows, storeSeries } from '../services/analysis-results';
import { resolveRunSettings, shopDefaults } from '../services/analysis-settings';
import { recordAfterRepair } from '../services/case-ranking';
import { appendTimeline } from '../services/case-timeline';
import { loadDriveDocument } from '../services/engine-drive';
import type { ObjectStorage } from '../storage/storage';
import { affected, renewLease, retryOnDeadlock } from './claim';

/** What a job needs from its runner. */
export interface JobDeps {
  sequelize: Sequelize;
  storage: ObjectStorage;
  logger: Logger;
  holder: string;
  leaseMs: number;
  /** Runs the worker task (runTask('analyzeFile', …) on the pool). */
  analyze: (input: AnalyzeFileInput) => Promise<AnalyzeFileOutput>;
}

/** How a job ended for this runner. */
export type JobOutcome = 'done' | 'failed' | 'abandoned' | 'lost';

async function setStage(deps: JobDeps, id: number, stage: string, progress: number): Promise<void> {
  await deps.sequelize.query(
    `UPDATE analyses SET stage = :stage, progress = :progress, updatedAt = NOW(3) WHERE id = :id AND leasedBy = :holder AND status = 'running'`,
    { replacements: { id, stage, progress, holder: deps.holder } },
  );
}

/** Fails the job with a stable code and a message for the technician (guarded by the lease). */
async function failJob(deps: JobDeps, a: Analysis, caseId: number, name: string, code: string, message: string, extra: Record<string, unknown> = {}): Promise<JobOutcome> {
  const ok = await retryOnDeadlock(() => deps.sequelize.transaction(async (t) => {
    const result = await deps.sequelize.query(
      `UPDATE analyses SET status = 'failed', stage = 'done', progress = 100, errorCode = :code, errorMessage = :message,
         settings = :settings, leaseExpiresAt = NULL, finishedAt = NOW(3), updatedAt = NOW(3)
        WHERE id = :id AND leasedBy = :holder AND status = 'running'`,
      { replacements: { id: a.id, holder: deps.holder, code, message, settings: extra.settings ? JSON.stringify(extra.settings) : null }, transaction: t },
    );
    if (affected(result) === 0) return false;
    await appendTimeline({ shopId: a.shopId, caseId, actorId: null, kind: 'analysis_failed', message: `Analysis of ${name} failed: ${message}`, data: { analysisId: a.id, captureId: a.captureId, code } }, t);
    return true;
  }));
  return ok ? 'failed' : 'lost';
}

/** Runs the claimed job `id` to its end (see the module comment). */
export async function runClaimedJob(deps: JobDeps, id: number): Promise<JobOutcome> {
  const log = deps.logger.child({ analysisId: id, task: 'analyzeFile' });
  const a = await Analysis.findByPk(id);
  if (!a || a.leasedBy !== deps.holder) return 'lost';
  const capture = await Capture.findByPk(a.captureId);
  const c = capture ? await Case.findByPk(capture.caseId) : null;
  if (!capture || !c) return 'lost';
  let lost = false;
  const beat = setInterval(() => {
    renewLease(deps.sequelize, id, deps.holder, deps.leaseMs).then((ok) => { if (!ok) lost = true; }, (error: unknown) => log.warn('lease renewal failed', { error }));
  }, Math.max(50, Math.floor(deps.leaseMs / 3)));
  try {
    let drive: DriveDocument | null = null;
    if (c.engineId !== null) {
      const engineId = c.engineId;
      // One transaction: the engine and its drive are read as one snapshot (no torn read).
      drive = await deps.sequelize.transaction(async (t) => {
        const engine = await Engine.findByPk(engineId, { transaction: t });
        if (!engine) return null;
        const doc = await loadDriveDocument(engine, t);
        delete doc.notes;
        return doc;
      });
    }
    let resolved;
    try {
      resolved = resolveRunSettings(drive, await shopDefaults(a.shopId), capture.metadata, a.runSettings);
    } catch (e) {
      if (e instanceof ZodError) {
        const issue = e.issues[0];
        return failJob(deps, a, c.id, capture.originalName, 'validation_failed', `settings ${issue.path.join('.')}: ${issue.message}; change the capture's settings and analyse again`);
      }
      throw e;
    }
    const t0 = Date.now();
    let local;
    try {
      local = await deps.storage.toLocalFile(capture.storageKey);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code === 'ENOENT') {
        return failJob(deps, a, c.id, capture.originalName, 'file_missing', 'the stored capture file is missing; upload it again', { settings: resolved.settings });
      }
      throw e;
    }
    const fetchMs = Date.now() - t0;
    await setStage(deps, id, 'analysing', 20);
    let out: AnalyzeFileOutput;
    try {
      out = await deps.analyze({ path: local.path, settings: resolved.input, drive, name: capture.originalName });
    } catch (e) {
      const err = parseTaskError(e);
      if (err.code === 'internal_error') {
        // A crash, not a property of the file: leave the job to its lease (taken back and retried).
        log.error('analysis worker crashed; the job is retried when its lease expires', { error: err.message });
        return 'abandoned';
      }
      return failJob(deps, a, c.id, capture.originalName, err.code, err.message, { settings: resolved.settings });
    } finally {
      await local.release();
    }
    if (lost) return 'lost';
    await setStage(deps, id, 'storing', 90);
    const pickup = capture.metadata.channels.find((ch) => ch.role === 'pickup');
    const rows = seriesRows(out, pickup?.unit ?? 'V');
    const summary = out.summary as { capture?: { sampleRateHz?: number; durationS?: number; channels?: number }; timingsMs?: Record<string, number> };
    const stored = await retryOnDeadlock(() => deps.sequelize.transaction(async (t) => {
      const result = await deps.sequelize.query(
        `UPDATE analyses SET status = 'done', stage = 'done', progress = 100, errorCode = NULL, errorMessage = NULL,
           settings = :settings, driveSnapshot = :drive, summary = :summary, ranking = :ranking, timingsMs = :timings,
           leaseExpiresAt = NULL, finishedAt = NOW(3), updatedAt = NOW(3)
          WHERE id = :id AND leasedBy = :holder AND status = 'running'`,
        {
          replacements: {
            id, holder: deps.holder, settings: JSON.stringify(resolved.settings), drive: drive ? JSON.stringify(drive) : null,
            summary: JSON.stringify(out.summary), ranking: JSON.stringify(out.ranking),
            timings: JSON.stringify({ ...(summary.timingsMs ?? {}), fetch: fetchMs }),
          },
          transaction: t,
        },
      );
      if (affected(result) === 0) return false;
      await storeSeries(id, rows, t);
      await appendTimeline({ shopId: a.shopId, caseId: c.id, actorId: null, kind: 'analysis_done', message: `Analysis of ${capture.originalName} done`, data: { analysisId: id, captureId: capture.id } }, t);
      if (capture.phase === 'after_repair' && capture.currentAnalysisId === id) await recordAfterRepair(capture.id, t);
      return true;
    }));
    if (stored && summary.capture && (capture.sampleRateHz === null || capture.durationS === null)) {
      // What the reader found (a CSV's fitted rate); outside the transaction: many runs of one
      // capture must not queue on its row.
      await deps.sequelize.query(
        `UPDATE captures SET sampleRateHz = :rate, durationS = :dur, channelCount = :ch, updatedAt = NOW(3) WHERE id = :cid`,
        { replacements: { rate: summary.capture.sampleRateHz ?? null, dur: summary.capture.durationS ?? null, ch: summary.capture.channels ?? null, cid: capture.id }, type: QueryTypes.UPDATE },
      );
    }
    return stored ? 'done' : 'lost';
  } finally {
    clearInterval(beat);
  }
}
