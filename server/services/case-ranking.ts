/**
 * The case ranking (issue 15 item 6): `rankCase` over the current analyses of a case's captures,
 * each capture re-ranked from its stored spectra against the engine's current drive document (so
 * "re-rank with the current engine" never re-analyses), stored as Findings keyed by
 * (component, fault). A finding's status, note and decider survive a re-rank; a suspect the new
 * ranking drops is kept with `inRanking = false`. After-repair captures never re-rank: their lines
 * at each suspect's orders are stored beside the before ones for the comparison.
 */
import type { Transaction } from 'sequelize';
import type { RankingEntry } from '../../shared/analysis/types';
import type { DriveDocument } from '../../shared/drive/types';
import { rankCapture } from '../../shared/ranking/rank-capture';
import { type CaseCapture, rankCase } from '../../shared/ranking/rank-case';
import type { FindingCaptureDto } from '../../shared/schemas/analyses';
import { AppError } from '../errors';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import { Case } from '../models/case';
import { Engine } from '../models/engine';
import { Finding } from '../models/finding';
import { loadRankingInput } from './analysis-results';
import { shopBearingTable } from './bearings';
import { loadDriveDocument } from './engine-drive';
import { acceptedCalibrations } from './ratio-calibration';

/** Suspects below this score are not stored as findings unless a decision was already made on them. */
export const MIN_FINDING_SCORE = 0.05;

const keyOf = (component: string) => component.trim().toLowerCase();

/** Each capture of the case with its current analysis row. */
export async function capturesWithAnalyses(caseId: number, t?: Transaction) {
  const captures = await Capture.findAll({ where: { caseId }, order: [['id', 'ASC']], transaction: t });
  const ids = captures.map((c) => c.currentAnalysisId).filter((x): x is number => x !== null);
  const analyses = ids.length ? await Analysis.findAll({ where: { id: ids }, transaction: t }) : [];
  const byId = new Map(analyses.map((a) => [a.id, a]));
  return captures.map((capture) => ({ capture, analysis: capture.currentAnalysisId ? byId.get(capture.currentAnalysisId) ?? null : null }));
}

/** Why a case cannot be ranked now, or null when it can (engine, captures, analyses). */
export async function rankBlocker(c: Case, t?: Transaction): Promise<AppError | null> {
  if (c.engineId === null) return new AppError(409, 'engine_required', 'Choose the engine from the Drive library before ranking');
  const before = (await capturesWithAnalyses(c.id, t)).filter((x) => x.capture.phase === 'before');
  if (before.length === 0) return new AppError(409, 'no_usable_capture', 'Upload at least one before-repair capture before ranking');
  const pending = before.filter((x) => !x.analysis || x.analysis.status === 'queued' || x.analysis.status === 'running');
  if (pending.length) {
    return new AppError(409, 'analyses_pending', `${pending.length} capture${pending.length === 1 ? ' is' : 's are'} still being analysed; wait for ${pending.length === 1 ? 'it' : 'them'}`);
  }
  if (!before.some((x) => x.analysis?.status === 'done')) {
    return new AppError(409, 'no_usable_capture', 'Every before-repair capture failed analysis; fix or replace one (see its message) before ranking');
  }
  return null;
}

/** The per-capture rankings of the case's done analyses against `drive`. */
async function caseCaptures(c: Case, drive: DriveDocument, t: Transaction) {
  const shopTable = await shopBearingTable(c.shopId, t);
  // Ratio corrections the lead accepted for this engine move and narrow their parts' windows (issue 20).
  const calibration = c.engineId !== null ? await acceptedCalibrations(c.shopId, c.engineId, t) : {};
  const out: { cc: CaseCapture; capture: Capture }[] = [];
  for (const { capture, analysis } of await capturesWithAnalyses(c.id, t)) {
    if (!analysis || analysis.status !== 'done') continue;
    const input = await loadRankingInput(analysis.id, t);
    if (!input) continue;
    const entries: RankingEntry[] = rankCapture(drive, input, { shopTable, calibration });
    const cond = capture.metadata.condition;
    out.push({
      capture,
      cc: {
        captureId: capture.id, entries, probeComponent: capture.metadata.probePoint.component,
        acClutch: cond.acClutch === 'unknown' ? null : cond.acClutch, beltOff: cond.beltOff, phase: capture.phase,
      },
    });
  }
  return out;
}

/**
 * Ranks the case now (inside `t`, the case row locked by the caller) and upserts its findings.
 * Returns whether a confirmed cause dropped out of the ranking (the caller re-opens the case).
 */
export async function rankAndStore(c: Case, t: Transaction): Promise<{ confirmedDropped: boolean; suspects: number }> {
  const engine = await Engine.findOne({ where: { id: c.engineId!, shopId: c.shopId }, transaction: t });
  if (!engine) throw new AppError(409, 'engine_required', 'Choose the engine from the Drive library before ranking');
  const drive = await loadDriveDocument(engine, t);
  const ranked = await caseCaptures(c, drive, t);
  const suspects = rankCase(drive, ranked.map((r) => r.cc));
  const captureById = new Map(ranked.map((r) => [r.capture.id, r]));
  const existing = await Finding.findAll({ where: { caseId: c.id }, transaction: t, lock: t.LOCK.UPDATE });
  const byKey = new Map(existing.map((f) => [`${f.componentKey}|${f.fault}`, f]));
  const seen = new Set<string>();
  let rank = 0;
  for (const s of suspects) {
    const key = `${keyOf(s.component)}|${s.fault}`;
    const old = byKey.get(key);
    if (s.score < MIN_FINDING_SCORE && !(old && old.status !== 'suggested')) continue;
    seen.add(key);
    rank += 1;
    const lines: FindingCaptureDto[] = [];
    for (const r of ranked) {
      const entry = r.cc.entries.find((e) => keyOf(e.component) === keyOf(s.component) && e.fault === s.fault);
      if (!entry) continue;
      const strongest = entry.matched.length ? Math.max(...entry.matched.map((m) => m.snrDb)) : null;
      lines.push({
        captureId: r.capture.id, phase: r.capture.phase, probePoint: captureById.get(r.capture.id)!.capture.metadata.probePoint.label,
        score: entry.score, strongestSnrDb: strongest, lines: entry.matched.map((m) => ({ ...m })),
      });
    }
    const values = {
      component: s.component, target: s.target, fault: s.fault, rank, score: s.score, order: s.best.order, nominalOrder: s.best.nominalOrder,
      slipPct: s.best.slipPct, evidence: s.best.evidence, notes: s.notes, indistinguishableFrom: s.best.indistinguishableFrom,
      approximate: s.best.approximate, engineBorn: s.engineBorn, captures: lines, afterRepairScore: s.afterRepairScore, inRanking: true,
    };
    if (old) await old.update(values, { transaction: t });
    else await Finding.create({ shopId: c.shopId, caseId: c.id, componentKey: keyOf(s.component), status: 'suggested', ...values }, { transaction: t });
  }
  let confirmedDropped = false;
  for (const f of existing) {
    const key = `${f.componentKey}|${f.fault}`;
    if (seen.has(key)) continue;
    if (f.inRanking) await f.update({ inRanking: false, rank: 9999 }, { transaction: t });
    if (f.status === 'confirmed') confirmedDropped = true;
  }
  return { confirmedDropped, suspects: rank };
}

/**
 * Stores an after-repair capture's lines at each finding's orders (the before/after comparison),
 * without re-ranking: the capture is ranked alone against the engine and its entry for each
 * finding's (component, fault) is appended to that finding's captures.
 */
export async function recordAfterRepair(captureId: number, t: Transaction): Promise<void> {
  const capture = await Capture.findByPk(captureId, { transaction: t });
  if (!capture || capture.phase !== 'after_repair' || !capture.currentAnalysisId) return;
  const c = await Case.findByPk(capture.caseId, { transaction: t, lock: t.LOCK.UPDATE });
  if (!c?.engineId) return;
  const engine = await Engine.findByPk(c.engineId, { transaction: t });
  if (!engine) return;
  const drive = await loadDriveDocument(engine, t);
  const input = await loadRankingInput(capture.currentAnalysisId, t);
  if (!input) return;
  const entries = rankCapture(drive, input, { shopTable: await shopBearingTable(c.shopId, t), calibration: await acceptedCalibrations(c.shopId, c.engineId, t) });
  const findings = await Finding.findAll({ where: { caseId: c.id }, transaction: t });
  for (const f of findings) {
    const entry = entries.find((e) => keyOf(e.component) === f.componentKey && e.fault === f.fault);
    if (!entry) continue;
    const strongest = entry.matched.length ? Math.max(...entry.matched.map((m) => m.snrDb)) : null;
    const captures = f.captures.filter((x) => x.captureId !== capture.id);
    captures.push({ captureId: capture.id, phase: 'after_repair', probePoint: capture.metadata.probePoint.label, score: entry.score, strongestSnrDb: strongest, lines: entry.matched.map((m) => ({ ...m })) });
    const afterScores = captures.filter((x) => x.phase === 'after_repair').map((x) => x.score);
    await f.update({ captures, afterRepairScore: Math.max(...afterScores) }, { transaction: t });
  }
}
