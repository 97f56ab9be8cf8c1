/**
 * Order tracks of a swept capture (issue 20 item 5): the stored order map of the analysis, read at
 * the firing order and at the measured order of each suspect of the case still in the ranking
 * (the first five), binned by rpm (shared/analysis/order-tracks.ts).
 */
import { type OrderMap, orderTracks, type TrackedLine } from '../../shared/analysis/order-tracks';
import type { OrderTracksDto } from '../../shared/schemas/order-tracks';
import { AppError } from '../errors';
import type { Analysis } from '../models/analysis';
import { AnalysisSeries } from '../models/analysis-series';
import { Capture } from '../models/capture';
import { Finding } from '../models/finding';
import { unpackFloat32 } from './analysis-results';

const SUSPECTS = 5;

export async function orderTracksFor(a: Analysis): Promise<OrderTracksDto> {
  if (a.status !== 'done') throw new AppError(409, 'analysis_not_done', `The analysis is ${a.status}; its order tracks are ready once it is done`);
  const row = await AnalysisSeries.findOne({ where: { analysisId: a.id, name: 'order-map', band: 0 } });
  if (!row) {
    throw new AppError(404, 'no_sweep', 'The speed of this capture did not sweep (under 1.2× from slowest to fastest): record a slow run-up or run-down, or a series of captures at held speeds, to see order tracks');
  }
  const m = row.meta as Record<string, number>;
  const all = unpackFloat32(row.data);
  const map: OrderMap = { resolution: m.resolution, bins: m.bins, rows: m.rows, amplitude: all.subarray(0, m.rows * m.bins), rpm: all.subarray(m.rows * m.bins, m.rows * m.bins + m.rows) };
  const orders = await AnalysisSeries.findOne({ where: { analysisId: a.id, name: 'orders', band: 0 } });
  const cylinders = Number((orders?.meta.ranking as { cylinders?: number } | null)?.cylinders ?? 4);
  const lines: TrackedLine[] = [{ label: `firing order ${cylinders / 2}`, order: cylinders / 2 }];
  const capture = await Capture.findByPk(a.captureId);
  if (capture) {
    const findings = await Finding.findAll({ where: { caseId: capture.caseId, inRanking: true }, order: [['rank', 'ASC']], limit: SUSPECTS });
    for (const f of findings) lines.push({ label: `${f.component} ${f.fault.replace('_', ' ')}`, order: f.order });
  }
  let lo = Infinity, hi = -Infinity;
  for (const r of map.rpm) if (r > 0) { lo = Math.min(lo, r); hi = Math.max(hi, r); }
  return {
    rpmRange: [Math.round(lo), Math.round(hi)],
    tracks: orderTracks([map], lines).map((t) => ({
      label: t.label, order: t.order, rpm: Array.from(t.rpm), amplitude: Array.from(t.amplitude, (v) => Number(v.toPrecision(5))), peak: t.peak,
      sentence: t.peak
        ? `${t.label} peaks at ${t.peak.rpm.toFixed(0)} rpm (${t.peak.rangeRpm[0].toFixed(0)}–${t.peak.rangeRpm[1].toFixed(0)} rpm), ${t.peak.prominenceDb.toFixed(0)} dB over its level elsewhere`
        : `${t.label} stays level over ${Math.round(lo)}–${Math.round(hi)} rpm`,
    })),
  };
}
