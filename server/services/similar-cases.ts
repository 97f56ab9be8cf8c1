/**
 * Case memory (issue 20 item 4): confirmed earlier cases of the same shop whose order signatures
 * are most alike the current case's (shared/ranking/case-signature.ts), same engine first, top
 * three. Signatures are computed from the stored spectra of each case's before-repair captures at
 * its confirmed part, so a re-analysis is always reflected.
 */
import { Op } from 'sequelize';
import type { RankingInput } from '../../shared/analysis/types';
import type { DriveDocument } from '../../shared/drive/types';
import { caseSignature, type PastCase, similarCases } from '../../shared/ranking/case-signature';
import type { SimilarCasesDto } from '../../shared/schemas/calibration';
import { notFound } from '../errors';
import { Case } from '../models/case';
import { Engine } from '../models/engine';
import { Finding } from '../models/finding';
import { loadRankingInput } from './analysis-results';
import { capturesWithAnalyses } from './case-ranking';
import { vehicleLabel } from './cases';
import { loadDriveDocument } from './engine-drive';

/** Confirmed cases read per request (the most recent): bounds the work of one request. */
const MAX_HISTORY = 200;

async function beforeInputs(caseId: number): Promise<RankingInput[]> {
  const out: RankingInput[] = [];
  for (const { capture, analysis } of await capturesWithAnalyses(caseId)) {
    if (capture.phase !== 'before' || !analysis || analysis.status !== 'done') continue;
    const input = await loadRankingInput(analysis.id);
    if (input) out.push(input);
  }
  return out;
}

/** The confirmed earlier cases most alike case `caseId` (empty when it has no engine or no analysed capture). */
export async function similarCasesFor(shopId: number, caseId: number): Promise<SimilarCasesDto> {
  const c = await Case.findOne({ where: { id: caseId, shopId } });
  if (!c) throw notFound('Case');
  if (c.engineId === null) return { items: [] };
  const drives = new Map<number, { engine: Engine; drive: DriveDocument }>();
  const driveOf = async (engineId: number) => {
    if (!drives.has(engineId)) {
      const engine = await Engine.findOne({ where: { id: engineId, shopId } });
      if (!engine) return null;
      drives.set(engineId, { engine, drive: await Engine.sequelize!.transaction((t) => loadDriveDocument(engine, t)) });
    }
    return drives.get(engineId)!;
  };
  const own = await driveOf(c.engineId);
  const captures = await beforeInputs(c.id);
  if (!own || captures.length === 0) return { items: [] };
  const past = await Case.findAll({
    where: { shopId, id: { [Op.ne]: c.id }, status: ['confirmed', 'verified', 'closed'], engineId: { [Op.ne]: null } },
    order: [['id', 'DESC']], limit: MAX_HISTORY,
  });
  const history: (PastCase & { row: Case; engineName: string })[] = [];
  for (const p of past) {
    const finding = await Finding.findOne({ where: { caseId: p.id, status: 'confirmed' }, order: [['decidedAt', 'DESC']] });
    const d = finding ? await driveOf(p.engineId!) : null;
    if (!finding || !d) continue;
    const inputs = await beforeInputs(p.id);
    if (inputs.length === 0) continue;
    let signature: Float64Array;
    try { signature = caseSignature(d.drive, finding.component, inputs); } catch { continue; }
    const kind = finding.target === 'belt' ? 'belt' : d.drive.components.find((x) => x.name.toLowerCase() === finding.componentKey)?.kind ?? 'other';
    history.push({
      caseId: String(p.id), engineId: String(p.engineId), part: finding.component, partKind: kind, fault: finding.fault,
      cause: finding.note?.trim() || `${finding.component}, ${finding.fault.replace('_', ' ')}`, signature, row: p, engineName: d.engine.name,
    });
  }
  const found = similarCases({ engineId: String(c.engineId), drive: own.drive, captures }, history);
  return {
    items: found.map((f) => {
      const h = history.find((x) => x.caseId === f.caseId)!;
      return {
        caseId: h.row.id, roNumber: h.row.roNumber, vehicleLabel: vehicleLabel(h.row.vehicle), engine: { id: h.row.engineId!, name: h.engineName },
        sameEngine: f.sameEngine, distance: Math.round(1000 * f.distance) / 1000, confirmed: { component: f.part, fault: f.fault }, cause: f.cause,
      };
    }),
  };
}
