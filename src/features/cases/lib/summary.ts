import type { CycleEvent, Peak } from '../../../../shared/analysis/types';

/** The parts of an analysis summary (the `analyze --json` object) the screens read. */
export interface SummaryView {
  meanRpm: number | null;
  speed: { meanRpm: number; minRpm: number; maxRpm: number; stabilityPct: number; edges: number; repairedEdges: number } | null;
  ordersResolution: number;
  orderPeaks: Peak[];
  envelopeResolution: number;
  envelopePeaks: Peak[];
  envelopeBandHz: [number, number] | null;
  cycle: { phaseResolved: boolean; event: CycleEvent | null } | null;
  cylinders: number | null;
  firingOrder: number[] | null;
}

/** Reads an analysis summary defensively (fields may be missing on an older run). */
export function summaryView(summary: Record<string, unknown> | null | undefined): SummaryView {
  const s = (summary ?? {}) as Record<string, any>;
  const speed = s.speed && typeof s.speed.meanRpm === 'number' ? s.speed : null;
  return {
    meanRpm: speed ? speed.meanRpm : null,
    speed,
    ordersResolution: Number(s.orders?.resolution ?? 1 / 32),
    orderPeaks: Array.isArray(s.orders?.peaks) ? s.orders.peaks : [],
    envelopeResolution: Number(s.envelope?.resolution ?? s.orders?.resolution ?? 1 / 32),
    envelopePeaks: Array.isArray(s.envelope?.peaks) ? s.envelope.peaks : [],
    envelopeBandHz: Array.isArray(s.envelope?.bandHz) ? s.envelope.bandHz : null,
    cycle: s.cycle ? { phaseResolved: !!s.cycle.phaseResolved, event: s.cycle.event ?? null } : null,
    cylinders: typeof s.settings?.cylinders === 'number' ? s.settings.cylinders : null,
    firingOrder: Array.isArray(s.settings?.firingOrder) ? s.settings.firingOrder : null,
  };
}
