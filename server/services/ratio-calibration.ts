/**
 * Ratio calibration of an engine (issue 20 item 3): the shaft lines of every done before-repair
 * capture of the engine's cases, read from the stored order spectra, fitted per part
 * (shared/ranking/ratio-calibration.ts); a lead accepts a part's correction, and later rankings of
 * the engine's cases use it (case-ranking.ts passes `acceptedCalibrations` to rankCapture).
 */
import type { Transaction } from 'sequelize';
import type { AcceptedCalibration } from '../../shared/drive/candidate-lines';
import { fitRatioCalibration, MIN_CAPTURES, type RatioCorrection, shaftLineObservations, type ShaftLineObservation } from '../../shared/ranking/ratio-calibration';
import type { CalibrationDto } from '../../shared/schemas/calibration';
import { AppError, notFound } from '../errors';
import { Case } from '../models/case';
import { Engine } from '../models/engine';
import { RatioCalibration } from '../models/ratio-calibration';
import { loadRankingInput } from './analysis-results';
import { capturesWithAnalyses } from './case-ranking';
import { loadDriveDocument } from './engine-drive';

const keyOf = (name: string) => name.trim().toLowerCase();
/** Cases read for one fit (the most recent first): bounds the work of one request. */
const MAX_CASES = 200;

async function loadEngine(shopId: number, engineId: number, t?: Transaction): Promise<Engine> {
  const engine = await Engine.findOne({ where: { id: engineId, shopId }, transaction: t });
  if (!engine) throw notFound('Engine');
  return engine;
}

/** The current fit over the engine's captures. */
async function currentFit(shopId: number, engine: Engine, t?: Transaction): Promise<RatioCorrection[]> {
  // The engine's drive is one aggregate: read it (and the spectra) in one transaction.
  if (!t) return RatioCalibration.sequelize!.transaction((tx) => currentFit(shopId, engine, tx));
  const drive = await loadDriveDocument(engine, t);
  const cases = await Case.findAll({ where: { shopId, engineId: engine.id }, order: [['id', 'DESC']], limit: MAX_CASES, transaction: t });
  const obs: ShaftLineObservation[] = [];
  for (const c of cases) {
    for (const { capture, analysis } of await capturesWithAnalyses(c.id, t)) {
      if (capture.phase !== 'before' || !analysis || analysis.status !== 'done') continue;
      const input = await loadRankingInput(analysis.id, t);
      if (input) obs.push(...shaftLineObservations(drive, input.orders, { caseId: String(c.id), captureId: String(capture.id) }));
    }
  }
  return fitRatioCalibration(obs);
}

/** What the Drive library shows: every part measured or accepted, with its sentence. */
export async function engineCalibration(shopId: number, engineId: number): Promise<CalibrationDto> {
  const engine = await loadEngine(shopId, engineId);
  const fit = await currentFit(shopId, engine);
  const rows = await RatioCalibration.findAll({ where: { shopId, engineId } });
  const names = [...new Set([...fit.map((f) => f.component), ...rows.map((r) => r.component)])].sort((a, b) => a.localeCompare(b));
  return {
    engineId, minCaptures: MIN_CAPTURES,
    parts: names.map((name) => {
      const f = fit.find((x) => keyOf(x.component) === keyOf(name));
      const r = rows.find((x) => x.componentKey === keyOf(name));
      return {
        component: name,
        measured: f ? { correctionPct: f.correctionPct, scatterPct: f.scatterPct, standardErrorPct: f.standardErrorPct, captures: f.captures, cases: f.cases, offered: f.offered, sentence: f.sentence } : null,
        accepted: r ? { correctionPct: 100 * (r.factor - 1), scatterPct: 100 * r.uncertainty, captures: r.captures, cases: r.cases, acceptedAt: r.updatedAt.toISOString() } : null,
      };
    }),
  };
}

/**
 * Accepts a part's current correction (409 `calibration_not_offered` below the minimum captures)
 * or withdraws an accepted one; one transaction with the engine row locked, so two leads never
 * leave a half-written pair.
 */
export async function decideCalibration(user: { id: number; shopId: number }, engineId: number, component: string, accept: boolean): Promise<CalibrationDto> {
  const sequelize = RatioCalibration.sequelize!;
  await sequelize.transaction(async (t) => {
    const engine = await Engine.findOne({ where: { id: engineId, shopId: user.shopId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!engine) throw notFound('Engine');
    const key = keyOf(component);
    if (!accept) {
      await RatioCalibration.destroy({ where: { shopId: user.shopId, engineId, componentKey: key }, transaction: t });
      return;
    }
    const f = (await currentFit(user.shopId, engine, t)).find((x) => keyOf(x.component) === key);
    if (!f || !f.offered) {
      throw new AppError(409, 'calibration_not_offered', `${component} has ${f ? `${f.captures} measured capture${f.captures === 1 ? '' : 's'} on ${f.cases} case${f.cases === 1 ? '' : 's'}` : 'no measured shaft line yet'}; a correction is offered from ${MIN_CAPTURES} captures on 2 cases`);
    }
    const values = { component: f.component, factor: f.factor, uncertainty: f.scatterPct / 100, captures: f.captures, cases: f.cases, acceptedById: user.id };
    const row = await RatioCalibration.findOne({ where: { shopId: user.shopId, engineId, componentKey: key }, transaction: t });
    if (row) await row.update(values, { transaction: t });
    else await RatioCalibration.create({ shopId: user.shopId, engineId, componentKey: key, ...values }, { transaction: t });
  });
  return engineCalibration(user.shopId, engineId);
}

/** The accepted corrections of an engine, by part name, for rankCapture's `calibration` option. */
export async function acceptedCalibrations(shopId: number, engineId: number, t?: Transaction): Promise<Record<string, AcceptedCalibration>> {
  const rows = await RatioCalibration.findAll({ where: { shopId, engineId }, transaction: t });
  return Object.fromEntries(rows.map((r) => [r.component, { factor: r.factor, uncertainty: r.uncertainty }]));
}
