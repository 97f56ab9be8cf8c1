/**
 * What the Orders view says about the candidate lines of the case's engine: the nearest candidate
 * to a hovered order (with its distance in %), and whether the strongest line of a spectrum fits
 * any part at all. Pure functions over the shared candidate-line code (shared/drive/candidate-lines).
 */
import type { Peak } from '../analysis/types';
import type { CandidateLine, ComponentCandidates } from '../drive/types';

/** A candidate line with the part it belongs to. */
export interface PartLine {
  component: string;
  target: 'component' | 'belt';
  approximate: boolean;
  line: CandidateLine;
}

/** The nearest candidate to an order, with the signed distance 100·(order − nominal)/nominal. */
export interface NearestCandidate extends PartLine {
  distancePct: number;
  /** The order lies inside the line's match window (widened by the resolution). */
  inWindow: boolean;
}

/** Every candidate line of one spectrum ('orders' = raw order spectrum, 'envelope' = bearing lines). */
export function linesOf(candidates: readonly ComponentCandidates[], spectrum: 'orders' | 'envelope'): PartLine[] {
  const out: PartLine[] = [];
  for (const c of candidates) {
    for (const line of c.lines) {
      if (line.spectrum === spectrum) out.push({ component: c.component, target: c.target, approximate: c.approximate, line });
    }
  }
  return out;
}

/**
 * The candidate line nearest to `order` in relative terms (|order/nominal − 1| smallest), or null
 * when there is none. `padOrders` widens the windows by the spectrum's resolution for `inWindow`.
 */
export function nearestCandidate(order: number, lines: readonly PartLine[], padOrders = 0): NearestCandidate | null {
  let best: NearestCandidate | null = null;
  for (const pl of lines) {
    const nominal = pl.line.nominalOrder;
    if (!(nominal > 0)) continue;
    const distancePct = (100 * (order - nominal)) / nominal;
    if (best === null || Math.abs(distancePct) < Math.abs(best.distancePct)) {
      const [lo, hi] = pl.line.window;
      best = { ...pl, distancePct, inWindow: order >= lo - padOrders && order <= hi + padOrders };
    }
  }
  return best;
}

/** The strongest line of a spectrum that no part explains, for the "fits no part" call-out. */
export interface UnexplainedLine {
  order: number;
  snrDb: number;
  message: string;
}

/**
 * The strongest peak (by SNR) that is not engine-synchronous, when it lies in no candidate window
 * of this spectrum; null when it fits a part, when the strongest peak is an engine order (the
 * engine's own vibration is expected there), or when nothing stands 10 dB over the floor.
 * The 10 dB bar is common practice for calling a line clear in an order spectrum, not a standard.
 */
export function strongestUnexplained(peaks: readonly Peak[], lines: readonly PartLine[], padOrders: number, minSnrDb = 10): UnexplainedLine | null {
  let top: Peak | null = null;
  for (const p of peaks) {
    if (p.snrDb < minSnrDb || p.order < 0.25) continue;
    if (top === null || p.snrDb > top.snrDb) top = p;
  }
  if (top === null || top.engineOrder !== null) return null;
  const fits = lines.some((pl) => top.order >= pl.line.window[0] - padOrders && top.order <= pl.line.window[1] + padOrders);
  if (fits) return null;
  const order = top.order.toFixed(2);
  return {
    order: top.order,
    snrDb: top.snrDb,
    message: `Strongest line, order ${order}, fits no part of this engine — check the engine chosen or the pulley table.`,
  };
}

/** Orders that are multiples of half an order within [0, maxOrder]; `firing` for multiples of cylinders / 2. */
export function engineOrders(maxOrder: number, cylinders: number): { order: number; firing: boolean }[] {
  const out: { order: number; firing: boolean }[] = [];
  const firingStep = cylinders / 2;
  for (let k = 1; k * 0.5 <= maxOrder + 1e-9; k += 1) {
    const order = k * 0.5;
    const ratio = order / firingStep;
    out.push({ order, firing: Math.abs(ratio - Math.round(ratio)) < 1e-9 });
  }
  return out;
}
