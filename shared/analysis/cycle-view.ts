import { median } from '../dsp/stats';
import { synchronousAverage } from './synchronous-average';
import { type CycleEvent, type CycleResult } from './types';

/**
 * The engine-cycle view (DESIGN.md step 6) over 720° from cylinder-1 TDC. The synchronous average
 * of the pickup over whole cycles keeps what is locked to the cycle (injector and valve ticks,
 * combustion) and lowers the rest by the number of cycles (REFERENCES.md §3). Its high-passed
 * part (minus its own ±5° moving average, which removes the engine's low orders) gives a
 * short-window (3°) RMS per degree; the strongest impulsive event is reported when its 3° RMS
 * stands at least 3× above the median of the cycle (else null), at its onset (the earliest degree
 * before the energy maximum still holding 30 % of it: a tick rings after it lands).
 * Slot i = [i·720/c, (i+1)·720/c) is firingOrder[i]'s firing slot; with an unresolved phase the
 * event may sit one ambiguity period (360° for a crank-only reference, 720/N for N pulses per
 * cycle) further on, so every cylinder whose slot it could be in is a candidate.
 */
export interface CycleInput {
  /** Angle-domain pickup starting at cylinder-1 TDC, samplesPerRev per revolution. */
  x: Float64Array;
  samplesPerRev: number;
  tdcOffsetDeg: number;
  firingOrder: number[];
  phaseResolved: boolean;
  ambiguityDeg: number;
}

const RMS_WINDOW_DEG = 3;
const HIGH_PASS_HALF_DEG = 5;
const EVENT_PROMINENCE = 3;

/** Cycle average, RMS per degree and the strongest impulsive event. */
export function cycleView(input: CycleInput): CycleResult {
  const { x, samplesPerRev, firingOrder } = input;
  const period = 2 * samplesPerRev;
  const { average, cycles } = synchronousAverage(x, period);
  const perDeg = period / 720;
  // High-pass: the average minus its circular moving average over ±5°.
  const w = Math.max(1, Math.round(HIGH_PASS_HALF_DEG * perDeg));
  const cum = new Float64Array(period + 1);
  for (let i = 0; i < period; i++) cum[i + 1] = cum[i] + average[i];
  const total = cum[period];
  const windowSum = (a: number, b: number) => {
    // Sum of average[a..b] inclusive, indices taken circularly (|b − a| < period).
    const lo = ((a % period) + period) % period;
    const len = b - a + 1;
    const hi = lo + len;
    return hi <= period ? cum[hi] - cum[lo] : total - cum[lo] + cum[hi - period];
  };
  const avgDeg = new Float64Array(720);
  const energy = new Float64Array(720);
  for (let i = 0; i < period; i++) {
    const d = Math.min(719, Math.floor(i / perDeg));
    const hp = average[i] - windowSum(i - w, i + w) / (2 * w + 1);
    avgDeg[d] += average[i];
    energy[d] += hp * hp;
  }
  const counts = new Float64Array(720);
  for (let i = 0; i < period; i++) counts[Math.min(719, Math.floor(i / perDeg))]++;
  for (let d = 0; d < 720; d++) { avgDeg[d] /= Math.max(1, counts[d]); energy[d] /= Math.max(1, counts[d]); }
  const rms = new Float64Array(720);
  const half = Math.floor(RMS_WINDOW_DEG / 2);
  for (let d = 0; d < 720; d++) {
    let s = 0;
    for (let j = -half; j <= half; j++) s += energy[(d + j + 720) % 720];
    rms[d] = Math.sqrt(s / (2 * half + 1));
  }
  let event: CycleEvent | null = null;
  if (cycles >= 2) {
    let best = 0;
    for (let d = 1; d < 720; d++) if (rms[d] > rms[best]) best = d;
    const floor = median(rms);
    if (floor > 0 && rms[best] / floor >= EVENT_PROMINENCE) {
      // The degree with the most energy within the peak's ±2°, then back to where the tick starts.
      let top = best;
      for (let j = -2; j <= 2; j++) { const d = (best + j + 720) % 720; if (energy[d] > energy[top]) top = d; }
      // Onset: the earliest degree up to 6° before it that already holds 30 % of its energy.
      let onset = top;
      for (let j = 1; j <= 6; j++) { const d = (top - j + 720) % 720; if (energy[d] >= 0.3 * energy[top]) onset = d; else break; }
      event = describeEvent(onset + 0.5, firingOrder, input.phaseResolved, input.ambiguityDeg);
    }
  }
  return {
    tdcOffsetDeg: input.tdcOffsetDeg,
    phaseResolved: input.phaseResolved,
    cyclesAveraged: cycles,
    event,
    averageDeg: Float32Array.from(avgDeg),
    rmsDeg: Float32Array.from(rms),
  };
}

/** Slot, cylinder, candidates and angle after that slot's TDC for an event angle. */
export function describeEvent(angleDeg: number, firingOrder: number[], phaseResolved: boolean, ambiguityDeg: number): CycleEvent {
  const c = firingOrder.length;
  const slotDeg = 720 / c;
  const slot = Math.min(c - 1, Math.floor(angleDeg / slotDeg));
  const candidates: number[] = [];
  const shifts = phaseResolved ? 1 : Math.max(1, Math.round(720 / ambiguityDeg));
  for (let k = 0; k < shifts; k++) {
    const a = (angleDeg + k * (phaseResolved ? 720 : ambiguityDeg)) % 720;
    const cyl = firingOrder[Math.min(c - 1, Math.floor(a / slotDeg))];
    if (!candidates.includes(cyl)) candidates.push(cyl);
  }
  return {
    angleDeg,
    cylinder: phaseResolved ? firingOrder[slot] : null,
    candidates,
    afterTdcDeg: angleDeg - slot * slotDeg,
  };
}
