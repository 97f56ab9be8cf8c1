/**
 * Serving a stored series decimated (issue 15 item 6): line series keep each bucket's minimum and
 * maximum so no peak is lost (shared/analysis/decimate-series.ts); the spectrogram is max-pooled.
 * The ETag names the analysis, its finish time and the query, so a client's repeat asks are 304s
 * without reading the blob.
 */
import { createHash } from 'node:crypto';
import { maxPoolGrid, minMaxIndices } from '../../shared/analysis/decimate-series';
import type { GridSeriesDto, LineSeriesDto, SeriesDto, SeriesName, SeriesQuery } from '../../shared/schemas/analyses';
import { AppError } from '../errors';
import type { Analysis } from '../models/analysis';
import { AnalysisSeries } from '../models/analysis-series';
import { unpackFloat32 } from './analysis-results';

/** The ETag of a series answer. */
export function seriesEtag(a: Analysis, name: SeriesName, q: SeriesQuery): string {
  const h = createHash('sha256').update(JSON.stringify([a.id, a.finishedAt ? new Date(a.finishedAt).getTime() : 0, name, q.points, q.band, q.from ?? null, q.to ?? null])).digest('base64url');
  return `"s-${h.slice(0, 27)}"`;
}

const round = (v: number, digits = 6) => (v === 0 || !Number.isFinite(v) ? 0 : Number(v.toPrecision(digits)));

/** The decimated series (409 before the analysis is done, 404 for a series it does not hold). */
export async function seriesView(a: Analysis, name: SeriesName, q: SeriesQuery): Promise<SeriesDto> {
  if (a.status !== 'done') throw new AppError(409, 'analysis_not_done', `The analysis is ${a.status}; its plots are ready once it is done`);
  const row = await AnalysisSeries.findOne({ where: { analysisId: a.id, name, band: name === 'envelope' ? q.band : 0 } });
  if (!row) throw new AppError(404, 'not_found', name === 'envelope' ? `This analysis has no envelope band ${q.band}` : `This analysis holds no ${name} series`);
  const all = unpackFloat32(row.data);
  const m = row.meta as Record<string, unknown>;
  const unit = String(m.unit ?? 'V');
  if (name === 'spectrogram') {
    const frames = Number(m.frames);
    const bins = Number(m.bins);
    const pooled = maxPoolGrid(all.subarray(0, frames * bins), frames, bins, q.points);
    const rpm = all.subarray(frames * bins);
    const rpmOut: number[] = [];
    for (let f = 0; f < pooled.frames; f++) rpmOut.push(round(rpm[Math.min(frames - 1, f * pooled.frameStep)]));
    const dto: GridSeriesDto = {
      kind: 'grid', name: 'spectrogram', frames: pooled.frames, bins: pooled.bins, binWidthHz: Number(m.binWidthHz) * pooled.binStep,
      hopS: Number(m.hopS) * pooled.frameStep, startS: Number(m.startS), amplitude: Array.from(pooled.values, (v) => round(v)), rpm: rpmOut, total: frames * bins,
    };
    return dto;
  }
  const n = name === 'rpm' || name === 'cycle' || name === 'orders' || name === 'envelope' ? Number(m.length) : all.length / 2;
  let xOf: (i: number) => number;
  let y: Float32Array;
  let y2: Float32Array | undefined;
  let xUnit: LineSeriesDto['xUnit'];
  let yUnit = unit;
  if (name === 'orders' || name === 'envelope') {
    const res = Number(m.resolution);
    xOf = (i) => i * res; y = all.subarray(0, n); y2 = all.subarray(n, 2 * n); xUnit = 'order';
  } else if (name === 'cycle') {
    const step = 720 / n;
    xOf = (i) => i * step; y = all.subarray(0, n); y2 = all.subarray(n, 2 * n); xUnit = 'deg';
  } else {
    const t = all.subarray(0, n);
    xOf = (i) => t[i]; y = all.subarray(n, 2 * n); xUnit = 's'; yUnit = 'rpm';
  }
  let from = 0;
  let to = n;
  if (q.from !== undefined || q.to !== undefined) {
    while (from < n && q.from !== undefined && xOf(from) < q.from) from++;
    to = from;
    while (to < n && (q.to === undefined || xOf(to) <= q.to)) to++;
  }
  const idx = minMaxIndices(y, q.points, from, to);
  const dto: LineSeriesDto = {
    kind: 'line', name, xUnit, yUnit, x: idx.map((i) => round(xOf(i))), y: idx.map((i) => round(y[i])), total: n,
  };
  if (y2) dto.y2 = idx.map((i) => round(y2![i]));
  if (name === 'envelope') dto.bandHz = m.bandHz as [number, number];
  return dto;
}
