/**
 * Shapes of the analysis service's API (docs/api.md): an Analysis is one run of the pipeline over a
 * capture (status `queued → running → done | failed`, progress 0–100 by stage, attempts, a stable
 * error code), its results (the `analyze --json` summary and long series served decimated), and the
 * Findings the case ranking stores. Clients poll GET /api/analyses/:id until the status is final.
 */
import { z } from 'zod';
import type { AnalysisSettings } from './analysis-settings';

export const ANALYSIS_STATUSES = ['queued', 'running', 'done', 'failed'] as const;
export const AnalysisStatusSchema = z.enum(ANALYSIS_STATUSES);
export type AnalysisStatus = z.infer<typeof AnalysisStatusSchema>;

/** Final statuses: polling stops on these. */
export const isFinalStatus = (s: AnalysisStatus): boolean => s === 'done' || s === 'failed';

/** Stages a running analysis reports, with the progress each starts at. */
export const ANALYSIS_STAGES = ['queued', 'fetching', 'analysing', 'storing', 'done'] as const;
export type AnalysisStage = (typeof ANALYSIS_STAGES)[number];

/** Names of the long series of an analysis (GET /api/analyses/:id/series/:name). */
export const SERIES_NAMES = ['orders', 'envelope', 'cycle', 'spectrogram', 'rpm', 'edges'] as const;
export const SeriesNameSchema = z.enum(SERIES_NAMES);
export type SeriesName = z.infer<typeof SeriesNameSchema>;

/** Default and largest number of points a series is decimated to. */
export const DEFAULT_SERIES_POINTS = 4000;
export const MAX_SERIES_POINTS = 50_000;

/** Query of GET /api/analyses/:id/series/:name. */
export const SeriesQuerySchema = z.object({
  /** At most this many points (line series) or cells (spectrogram); peaks are kept. */
  points: z.coerce.number().int().min(10, { message: 'points must be at least 10' }).max(MAX_SERIES_POINTS, { message: `points must be at most ${MAX_SERIES_POINTS}` }).default(DEFAULT_SERIES_POINTS),
  /** Envelope band index (0 = best band). */
  band: z.coerce.number().int().min(0).max(15).default(0),
  /** Optional x range (orders, degrees or seconds) before decimation, for zooming. */
  from: z.coerce.number().finite().optional(),
  to: z.coerce.number().finite().optional(),
});
export type SeriesQuery = z.infer<typeof SeriesQuerySchema>;

/** GET /api/analyses query (the shop's failed-jobs list uses `?status=failed`). */
export const AnalysisListQuerySchema = z.object({
  status: AnalysisStatusSchema.optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(100).default(20),
});
export type AnalysisListQuery = z.infer<typeof AnalysisListQuerySchema>;

// ---- responses -------------------------------------------------------------------------------

/** Which series an analysis holds and how long each is before decimation. */
export interface SeriesInfoDto { name: SeriesName; points: number; bands?: number }

/** One analysis run (GET /api/analyses/:id → { analysis }). */
export interface AnalysisDto {
  id: number;
  captureId: number;
  caseId: number;
  status: AnalysisStatus;
  /** 0–100 by stage. */
  progress: number;
  stage: AnalysisStage;
  attempts: number;
  /** Set when failed: a stable code (CaptureFormatError / AnalysisInputError codes, `worker_crashed`, `lease_expired`, `internal_error`) and what to do. */
  error: { code: string; message: string } | null;
  /** The resolved settings this run used (null until it starts). */
  settings: AnalysisSettings | null;
  /** Stage timings (ms) of the pipeline plus queue wait. */
  timingsMs: Record<string, number> | null;
  /** Exactly the `analyze --json` object once done; null before. */
  summary: Record<string, unknown> | null;
  series: SeriesInfoDto[];
  /** Name of the engine (drive document) it ranked against, when any. */
  driveName: string | null;
  createdAt: string;
  startedAt: string | null;
  finishedAt: string | null;
}

/** A line series, decimated keeping peaks: x and y of equal length. */
export interface LineSeriesDto {
  kind: 'line';
  name: SeriesName;
  /** x unit: 'order' (orders, envelope), 'deg' (cycle), 's' (rpm, edges). */
  xUnit: 'order' | 'deg' | 's';
  /** y unit: amplitude in the pickup's unit, 'rpm', or the pickup unit for cycle. */
  yUnit: string;
  x: number[];
  y: number[];
  /** Second curve where there is one: the noise floor (spectra) or the short-window RMS (cycle). */
  y2?: number[];
  /** Points before decimation. */
  total: number;
  /** Envelope only: the band in Hz. */
  bandHz?: [number, number];
}

/** The spectrogram, pooled (max) down to at most `points` cells. amplitude[f * bins + b]. */
export interface GridSeriesDto {
  kind: 'grid';
  name: 'spectrogram';
  frames: number;
  bins: number;
  binWidthHz: number;
  hopS: number;
  startS: number;
  amplitude: number[];
  /** rpm at each (pooled) frame. */
  rpm: number[];
  total: number;
}

export type SeriesDto = LineSeriesDto | GridSeriesDto;

/** One matched line of a finding in one capture. */
export interface FindingLineDto {
  label: string;
  spectrum: 'orders' | 'envelope';
  nominalOrder: number;
  order: number;
  amplitude: number;
  snrDb: number;
  cycleGain: number;
}

/** A finding's evidence in one capture (before or after repair). */
export interface FindingCaptureDto {
  captureId: number;
  phase: 'before' | 'after_repair';
  probePoint: string;
  score: number;
  strongestSnrDb: number | null;
  lines: FindingLineDto[];
}

export const FINDING_STATUSES = ['suggested', 'dismissed', 'confirmed'] as const;
export type FindingStatus = (typeof FINDING_STATUSES)[number];

/** A ranked suspect of a case (in GET /api/cases/:id → case.findings, best first). */
export interface FindingDto {
  id: number;
  caseId: number;
  /** 1 = best. */
  rank: number;
  component: string;
  target: 'component' | 'belt';
  fault: 'shaft' | 'outer_race' | 'inner_race' | 'ball' | 'cage' | 'belt';
  /** 0–1. */
  score: number;
  order: number;
  nominalOrder: number;
  slipPct: number | null;
  evidence: string;
  /** Case-level notes (probe point, A/C, belt off). */
  notes: string[];
  indistinguishableFrom: string[];
  approximate: boolean;
  engineBorn: boolean;
  status: FindingStatus;
  /** False once a re-rank no longer lists it (kept for its decision and note; rank is then 9999). */
  inRanking: boolean;
  decidedBy: { id: number; name: string; role: string } | null;
  decidedAt: string | null;
  note: string | null;
  /** Per capture: before-repair ones ranked, after-repair ones for the comparison. */
  captures: FindingCaptureDto[];
  afterRepairScore: number | null;
}

/** GET /api/analyses (failed-jobs list). */
export interface AnalysisListResponse {
  items: (AnalysisDto & { originalName: string; roNumber: string })[];
  total: number;
  page: number;
  pageSize: number;
}
