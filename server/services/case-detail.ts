/**
 * Reads a whole case (captures with their analyses, findings, timeline) in one transaction, so a
 * reader never sees a capture without its analysis or a ranking half-written (STYLE.md §5).
 */
import { AnalysisSeries } from '../models/analysis-series';
import { Analysis } from '../models/analysis';
import { Capture } from '../models/capture';
import { Case } from '../models/case';
import { CaseEvent } from '../models/case-event';
import { Finding } from '../models/finding';
import { User } from '../models/user';
import { notFound } from '../errors';
import { presentAnalysis, presentCapture, presentCaseDetail, presentFinding, presentTimeline, seriesInfo } from '../presenters/present-case';
import { rankBlocker } from './case-ranking';
import { sequelizeOf } from './cases';
import type { CaseDto } from '../../shared/schemas/cases';
import type { AnalysisDto } from '../../shared/schemas/analyses';

/** Series info of done analyses, by analysis id. */
export async function seriesInfoOf(analysisIds: number[], transaction?: import('sequelize').Transaction) {
  const rows = analysisIds.length
    ? await AnalysisSeries.findAll({ where: { analysisId: analysisIds }, attributes: ['analysisId', 'name', 'band', 'meta'], order: [['name', 'ASC'], ['band', 'ASC']], transaction })
    : [];
  const by = new Map<number, AnalysisSeries[]>();
  for (const r of rows) by.set(r.analysisId, [...(by.get(r.analysisId) ?? []), r]);
  return (id: number) => seriesInfo(by.get(id) ?? []);
}

/** The case as GET /api/cases/:id presents it. */
export async function getCaseDetail(shopId: number, id: number): Promise<CaseDto> {
  return sequelizeOf().transaction(async (t) => {
    const c = await Case.findOne({
      where: { id, shopId }, transaction: t,
      include: [{ association: 'engine', attributes: ['id', 'name'] }, { association: 'technician' }, { association: 'lead' }],
    });
    if (!c) throw notFound('Case');
    const [captures, findings, events] = await Promise.all([
      Capture.findAll({ where: { caseId: id }, order: [['id', 'ASC']], include: [{ association: 'uploadedBy' }], transaction: t }),
      Finding.findAll({ where: { caseId: id }, order: [['inRanking', 'DESC'], ['rank', 'ASC'], ['id', 'ASC']], include: [{ association: 'decidedBy' }], transaction: t }),
      CaseEvent.findAll({ where: { caseId: id }, order: [['id', 'ASC']], include: [{ association: 'actor' }], transaction: t }),
    ]);
    const analyses = captures.length
      ? await Analysis.findAll({ where: { captureId: captures.map((x) => x.id) }, order: [['id', 'DESC']], transaction: t })
      : [];
    const currentIds = captures.map((x) => x.currentAnalysisId).filter((x): x is number => x !== null);
    const info = await seriesInfoOf(analyses.filter((a) => a.status === 'done' && currentIds.includes(a.id)).map((a) => a.id), t);
    const byCapture = new Map<number, Analysis[]>();
    for (const a of analyses) byCapture.set(a.captureId, [...(byCapture.get(a.captureId) ?? []), a]);
    const captureDtos = captures.map((cap) => {
      const list = byCapture.get(cap.id) ?? [];
      const current = list.find((a) => a.id === cap.currentAnalysisId) ?? null;
      const dto: AnalysisDto | null = current ? presentAnalysis(current, id, info(current.id)) : null;
      return presentCapture(cap, dto, list.map((a) => a.id), cap.uploadedBy);
    });
    const blocker = c.status === 'testing' ? await rankBlocker(c, t) : null;
    const rankable = c.status === 'testing' ? { ok: blocker === null, reason: blocker?.message ?? null } : { ok: false, reason: c.status === 'open' ? 'Upload a before-repair capture first' : `The case is ${c.status}` };
    const confirmedBy = c.confirmed?.byId ? await User.findOne({ where: { id: c.confirmed.byId, shopId }, transaction: t }) : null;
    return presentCaseDetail({
      c, captures: captureDtos, findings: findings.map((f) => presentFinding(f, f.decidedBy)), timeline: events.map((e) => presentTimeline(e, e.actor)),
      rankable, confirmedBy,
    });
  });
}
