/**
 * Pulley slip of one part from its own shaft lines in the raw order spectrum (docs/references.md §4:
 * bearing lines cannot separate belt creep from rolling-element slip, so only the 1× and 2×
 * shaft lines are used). A shaft line on the engine's 0.5-order comb says nothing about the part.
 */
import type { OrderSpectrum } from '../analysis/types';
import type { ComponentCandidates } from '../drive/types';
import { lineNear, localMaxima, onEngineComb, type FoundLine } from './spectrum-lines';

/** A slip estimate: fraction (positive = slower than nominal) and the shaft line it came from. */
export interface SlipEstimate {
  slip: number;
  line: FoundLine;
  harmonic: number;
}

/** Minimum SNR of a shaft line to estimate slip from (a weaker one is as likely noise). */
export const SLIP_LINE_MIN_DB = 10;

/**
 * Estimates a part's slip from its shaft 1× line (or its 2× when the 1× is missing or on the
 * engine comb). Returns null when neither stands ≥ 10 dB above the floor off the comb.
 */
export function estimateSlip(candidates: ComponentCandidates, orders: OrderSpectrum): SlipEstimate | null {
  const res = orders.resolution;
  let best: SlipEstimate | null = null;
  for (const line of candidates.lines) {
    if (line.fault !== 'shaft' || line.sideband !== 0) continue;
    const [lo, hi] = line.window;
    const found = localMaxima(orders, lo - res, hi + res, SLIP_LINE_MIN_DB).find((p) => !onEngineComb(p.order, res));
    if (!found) continue;
    // A 1× confirmed by a 2× at twice its order (or the reverse) outranks a lone line.
    const partner = lineNear(orders, line.harmonic === 1 ? 2 * found.order : found.order / 2, 0.75 * res);
    const support = found.snrDb + (partner && partner.snrDb >= 6 ? 6 : 0) + (line.harmonic === 1 ? 1 : 0);
    const bestSupport = best ? best.line.snrDb + (best.harmonic === 1 ? 1 : 0) : -Infinity;
    if (support > bestSupport) best = { slip: 1 - found.order / line.nominalOrder, line: found, harmonic: line.harmonic };
  }
  return best;
}
