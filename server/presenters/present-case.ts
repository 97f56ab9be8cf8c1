// Case, capture, analysis, finding and timeline presenters: what leaves the server (docs/api.md).
import type { AnalysisDto, FindingDto, SeriesInfoDto, SeriesName } from '../../shared/schemas/analyses';
import type { CaptureDto } from '../../shared/schemas/captures';
import { CASE_MOVES, type CaseDto, type CaseListItemDto, type PersonDto, type TimelineEntryDto } from '../../shared/schemas/cases';
import type { Analysis } from '../models/analysis';
import type { AnalysisSeries } from '../models/analysis-series';
import type { Capture } from '../models/capture';
import type { Case } from '../models/case';
import type { CaseEvent } from '../models/case-event';
import type { Finding } from '../models/finding';
import type { User } from '../models/user';
import { vehicleLabel } from '../services/cases';

const iso = (d: Date | null | undefined) => (d ? new Date(d).toISOString() : null);

/** A user as a case shows them. */
export function presentPerson(u: User | null | undefined): PersonDto | null {
  return u ? { id: u.id, name: u.name, role: u.role } : null;
}

/** Series an analysis holds, from its series rows' meta (no blobs read). */
export function seriesInfo(rows: Pick<AnalysisSeries, 'name' | 'band' | 'meta'>[]): SeriesInfoDto[] {
  const out: SeriesInfoDto[] = [];
  const envelopes = rows.filter((r) => r.name === 'envelope');
  for (const r of rows) {
    if (r.name === 'envelope' && r.band !== 0) continue;
    const m = r.meta as Record<string, number>;
    const points = r.name === 'spectrogram' ? m.frames * m.bins : Number(m.length ?? 0);
    out.push(r.name === 'envelope' ? { name: 'envelope', points, bands: envelopes.length } : { name: r.name as SeriesName, points });
  }
  const order: SeriesName[] = ['orders', 'envelope', 'cycle', 'spectrogram', 'rpm', 'edges'];
  return out.sort((a, b) => order.indexOf(a.name) - order.indexOf(b.name));
}

/** One analysis run. */
export function presentAnalysis(a: Analysis, caseId: number, series: SeriesInfoDto[] = []): AnalysisDto {
  return {
    id: a.id, captureId: a.captureId, caseId, status: a.status, progress: a.progress, stage: a.stage, attempts: a.attempts,
    error: a.errorCode ? { code: a.errorCode, message: a.errorMessage ?? '' } : null,
    settings: a.settings ?? null, timingsMs: a.timingsMs ?? null, summary: a.status === 'done' ? a.summary ?? null : null,
    series: a.status === 'done' ? series : [], driveName: a.driveSnapshot?.name ?? null,
    createdAt: iso(a.createdAt)!, startedAt: iso(a.startedAt), finishedAt: iso(a.finishedAt),
  };
}

/** One capture with its current analysis. */
export function presentCapture(c: Capture, current: AnalysisDto | null, analysisIds: number[], uploader: User | null | undefined): CaptureDto {
  return {
    id: c.id, caseId: c.caseId, originalName: c.originalName, format: c.format, byteSize: c.byteSize, sha256: c.sha256,
    sampleRateHz: c.sampleRateHz, channelCount: c.channelCount, durationS: c.durationS, metadata: c.metadata,
    uploadedBy: presentPerson(uploader), createdAt: iso(c.createdAt)!, analysis: current, analysisIds,
  };
}

/** One suspect. */
export function presentFinding(f: Finding, decidedBy: User | null | undefined): FindingDto {
  return {
    id: f.id, caseId: f.caseId, rank: f.rank, component: f.component, target: f.target, fault: f.fault, score: f.score, order: f.order,
    nominalOrder: f.nominalOrder, slipPct: f.slipPct, evidence: f.evidence, notes: f.notes, indistinguishableFrom: f.indistinguishableFrom,
    approximate: f.approximate, engineBorn: f.engineBorn, status: f.status, inRanking: f.inRanking, decidedBy: presentPerson(decidedBy), decidedAt: iso(f.decidedAt),
    note: f.note ?? null, captures: f.captures, afterRepairScore: f.afterRepairScore,
  };
}

/** One timeline entry. */
export function presentTimeline(e: CaseEvent, actor: User | null | undefined): TimelineEntryDto {
  return { id: e.id, at: iso(e.createdAt)!, kind: e.kind, actor: presentPerson(actor), message: e.message, note: e.note, data: e.data };
}

/** One row of the cases table. */
export function presentCaseListItem(c: Case, captureCount: number, top: Finding | null): CaseListItemDto {
  return {
    id: c.id, roNumber: c.roNumber, status: c.status, vehicle: c.vehicle, vehicleLabel: vehicleLabel(c.vehicle), complaint: c.complaint,
    engine: c.engine ? { id: c.engine.id, name: c.engine.name } : null, technician: presentPerson(c.technician), lead: presentPerson(c.lead),
    captureCount, topSuspect: top ? { component: top.component, fault: top.fault, score: top.score } : null,
    createdAt: iso(c.createdAt)!, updatedAt: iso(c.updatedAt)!, version: c.version,
  };
}

/** The whole case. */
export function presentCaseDetail(parts: {
  c: Case; captures: CaptureDto[]; findings: FindingDto[]; timeline: TimelineEntryDto[]; rankable: { ok: boolean; reason: string | null };
  confirmedBy: User | null | undefined;
}): CaseDto {
  const { c } = parts;
  const inRanking = parts.findings.filter((f) => f.inRanking);
  const top = inRanking.find((f) => f.status !== 'dismissed') ?? null;
  return {
    ...presentCaseListItem(c, parts.captures.length, null),
    topSuspect: top ? { component: top.component, fault: top.fault, score: top.score } : null,
    advisorName: c.advisorName, advisorEmail: c.advisorEmail, allowedMoves: [...CASE_MOVES[c.status]], rankable: parts.rankable,
    captures: parts.captures, findings: parts.findings, timeline: parts.timeline,
    confirmed: c.confirmed
      ? { component: c.confirmed.component, fault: c.confirmed.fault, findingId: c.confirmed.findingId, note: c.confirmed.note, by: presentPerson(parts.confirmedBy), at: c.confirmed.at }
      : null,
  };
}
