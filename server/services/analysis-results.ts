/**
 * Results of an analysis in MariaDB (issue 15 item 6, STYLE.md §6): the `analyze --json` summary
 * as JSON on the analysis row, every long series as a float32 little-endian LONGBLOB in
 * analysis_series, one series per INSERT and each at most 4 MiB (well under the default
 * max_allowed_packet of 16 MiB). The stored spectra are what the case ranking reads, so a re-rank
 * never re-analyses.
 */
import type { Transaction } from 'sequelize';
import type { EnvelopeBand, OrderSpectrum, RankingInput } from '../../shared/analysis/types';
import type { AnalyzeFileOutput, SpectrumSeries } from '../../shared/tasks';
import { AnalysisSeries } from '../models/analysis-series';

/** Largest blob one series may have. */
export const MAX_SERIES_BYTES = 4 * 1024 * 1024;

/** Float32 arrays → one little-endian buffer (every platform Node runs on is little-endian). */
export function packFloat32(...arrays: Float32Array[]): Buffer {
  const n = arrays.reduce((s, a) => s + a.length, 0);
  const out = new Float32Array(n);
  let o = 0;
  for (const a of arrays) { out.set(a, o); o += a.length; }
  return Buffer.from(out.buffer, out.byteOffset, out.byteLength);
}

/** A blob → Float32Array (copied so the view is aligned). */
export function unpackFloat32(buf: Buffer): Float32Array {
  const copy = new Uint8Array(buf.byteLength);
  copy.set(buf);
  return new Float32Array(copy.buffer, 0, Math.floor(buf.byteLength / 4));
}

interface SeriesRow { name: string; band: number; meta: Record<string, unknown>; data: Buffer }

const spectrumMeta = (s: SpectrumSeries) => ({
  resolution: s.resolution, maxOrder: s.maxOrder ?? null, samplesPerRev: s.samplesPerRev ?? null, revsPerBlock: s.revsPerBlock ?? null,
  blocks: s.blocks ?? null, length: s.amplitude.length,
});

/** The rows to store for a worker's output (spectrogram frames halved by max until it fits 4 MiB). */
export function seriesRows(out: AnalyzeFileOutput, pickupUnit: string): SeriesRow[] {
  const s = out.series;
  const ctx = out.rankingContext ?? null;
  const rows: SeriesRow[] = [
    { name: 'orders', band: 0, meta: { ...spectrumMeta(s.orders), unit: pickupUnit, ranking: ctx }, data: packFloat32(s.orders.amplitude, s.orders.floor) },
    ...s.envelopes.map((e, i) => ({
      name: 'envelope', band: i, meta: { ...spectrumMeta(e), bandHz: e.bandHz, score: ctx?.envelopeScores[i] ?? null, unit: pickupUnit },
      data: packFloat32(e.amplitude, e.floor),
    })),
    { name: 'cycle', band: 0, meta: { length: s.cycle.averageDeg.length, unit: pickupUnit }, data: packFloat32(s.cycle.averageDeg, s.cycle.rmsDeg) },
    { name: 'rpm', band: 0, meta: { length: s.rpm.timeS.length }, data: packFloat32(s.rpm.timeS, s.rpm.rpm) },
  ];
  let { frames, amplitude, rpm, hopS } = s.spectrogram;
  const { bins } = s.spectrogram;
  while ((frames * bins + frames) * 4 > MAX_SERIES_BYTES && frames > 1) {
    const f2 = Math.ceil(frames / 2);
    const a2 = new Float32Array(f2 * bins);
    const r2 = new Float32Array(f2);
    for (let f = 0; f < f2; f++) {
      for (let b = 0; b < bins; b++) a2[f * bins + b] = Math.max(amplitude[2 * f * bins + b], 2 * f + 1 < frames ? amplitude[(2 * f + 1) * bins + b] : -Infinity);
      r2[f] = rpm[2 * f];
    }
    frames = f2; amplitude = a2; rpm = r2; hopS *= 2;
  }
  if (s.orderMap) {
    // Issue 20 item 5: the sweep's order map, for order tracks (rows × bins amplitudes, then rpm per row).
    const m = s.orderMap;
    rows.push({ name: 'order-map', band: 0, meta: { resolution: m.resolution, bins: m.bins, rows: m.rows, unit: pickupUnit }, data: packFloat32(m.amplitude, m.rpm) });
  }
  rows.push({
    name: 'spectrogram', band: 0,
    meta: { frames, bins, binWidthHz: s.spectrogram.binWidthHz, hopS, startS: s.spectrogram.startS, unit: pickupUnit },
    data: packFloat32(amplitude, rpm),
  });
  return rows;
}

/** Replaces an analysis's series, one INSERT per series, inside `t`. */
export async function storeSeries(analysisId: number, rows: SeriesRow[], t: Transaction): Promise<void> {
  // A first run has nothing to replace; skipping the DELETE avoids its gap lock, on which two
  // runners storing at once would deadlock.
  if ((await AnalysisSeries.count({ where: { analysisId }, transaction: t })) > 0) {
    await AnalysisSeries.destroy({ where: { analysisId }, transaction: t });
  }
  for (const r of rows) {
    if (r.data.byteLength > MAX_SERIES_BYTES) throw new RangeError(`series ${r.name} is ${r.data.byteLength} bytes, over the 4 MiB cap`);
    await AnalysisSeries.create({ analysisId, name: r.name, band: r.band, meta: r.meta, data: r.data }, { transaction: t });
  }
}

function spectrumOf(row: AnalysisSeries): OrderSpectrum {
  const all = unpackFloat32(row.data);
  const n = Number(row.meta.length);
  const m = row.meta as Record<string, number | null>;
  return {
    resolution: Number(m.resolution), maxOrder: Number(m.maxOrder ?? n * Number(m.resolution)), samplesPerRev: Number(m.samplesPerRev ?? 0),
    revsPerBlock: Number(m.revsPerBlock ?? 0), blocks: Number(m.blocks ?? 0),
    amplitude: Float64Array.from(all.subarray(0, n)), floor: Float64Array.from(all.subarray(n, 2 * n)),
  };
}

/** The ranking input of a done analysis, from its stored spectra (null when they are missing). */
export async function loadRankingInput(analysisId: number, transaction?: Transaction): Promise<RankingInput | null> {
  const rows = await AnalysisSeries.findAll({ where: { analysisId, name: ['orders', 'envelope'] }, order: [['name', 'ASC'], ['band', 'ASC']], transaction });
  const orders = rows.find((r) => r.name === 'orders');
  if (!orders) return null;
  const ctx = orders.meta.ranking as { cylinders: number; cyclesAveraged: number; meanRpm: number } | null;
  const envelopes: EnvelopeBand[] = rows.filter((r) => r.name === 'envelope').map((r) => ({
    bandHz: r.meta.bandHz as [number, number], score: Number(r.meta.score ?? 0), spectrum: spectrumOf(r), peaks: [],
  }));
  return { orders: spectrumOf(orders), envelopes, cylinders: ctx?.cylinders ?? 4, cyclesAveraged: ctx?.cyclesAveraged ?? 0, meanRpm: ctx?.meanRpm ?? 0 };
}
