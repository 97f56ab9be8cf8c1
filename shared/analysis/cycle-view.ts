import { type FftPlanCache } from '../dsp/fft';
import { median } from '../dsp/stats';
import { createWindow } from '../dsp/window';
import { synchronousAverage } from './synchronous-average';
import { type CycleEvent, type CycleResult } from './types';

/**
 * The engine-cycle view (docs/design.md step 6) over 720° from cylinder-1 TDC.
 * - `averageDeg`: the synchronous average of the pickup per degree (what is locked to the cycle).
 * - `rmsDeg`: a short-window RMS per degree in the band where the cycle's energy varies most with
 *   angle. It comes from an angle-domain STFT of the first difference (which tilts the spectrum
 *   towards the kHz ringing of ticks and away from the engine's low orders; the two lowest bins,
 *   where a Hann window's main lobe still holds those orders, are skipped) with frames of at most
 *   6° (hop half a frame, aligned
 *   with the cycle so every cycle's frames fall on the same angles), whose power is averaged over
 *   cycles per (angle, band) as a geometric mean (the mean of log power). Power is averaged, not
 *   the signal, so a degree of jitter between cycles — which cancels a 5 kHz ring in a plain
 *   synchronous average — costs nothing; the log mean counts what happens in every cycle (a tick)
 *   and hardly what happens in one (a stray impact of a bearing or belt), and averaging over N
 *   cycles lowers the noise's spread by √N. The band with the largest ratio of peak to median
 *   over the cycle wins.
 * - `event`: the strongest impulsive event from the better of two detectors, each judged against
 *   what noise alone reaches: the power detector above (ratio over eventThreshold, placed at its
 *   onset — the earliest frame up to 3 frames before the peak still holding 30 % of its power) and
 *   a coherent one on the synchronous average itself (coherentEvent), which wins when the ticks
 *   repeat exactly enough to add up in the average.
 * Slot i = [i·720/c, (i+1)·720/c) is firingOrder[i]'s firing slot; with an unresolved phase the
 * event may sit one ambiguity period (360° for a crank-only reference, 720/N for N pulses per
 * cycle) further on, so every cylinder whose slot it could be in is a candidate.
 */
export interface CycleInput {
  /** Angle-domain pickup starting at cylinder-1 TDC, samplesPerRev per revolution (a power of two). */
  x: Float64Array;
  samplesPerRev: number;
  tdcOffsetDeg: number;
  firingOrder: number[];
  phaseResolved: boolean;
  ambiguityDeg: number;
  plans: FftPlanCache;
  /** The synchronous average over 2·samplesPerRev when the caller has it already. */
  average?: Float64Array;
}

const MAX_FRAME_DEG = 6;
const MAX_POWER_CYCLES = 128;
/**
 * Event threshold on the peak-to-median power ratio: the log-mean of N exponential powers has a
 * spread of about 1.28/√N (π/√6), and the largest of some 10⁴ (angle, band) cells of pure noise
 * stays below about 4.5 spreads; never below 1.6 (2 dB in RMS).
 */
function eventThreshold(cycles: number): number {
  return Math.max(1.6, Math.exp((4.5 * 1.28) / Math.sqrt(cycles)));
}

/** Peak-to-median ratio of the coherent detector above which an event is reported (noise alone stays near 2). */
const COHERENT_THRESHOLD = 4;

/** Cycle average, band RMS per degree and the strongest impulsive event. */
export function cycleView(input: CycleInput): CycleResult {
  const { x, samplesPerRev, firingOrder } = input;
  const period = 2 * samplesPerRev;
  const cycles = Math.floor(x.length / period);
  const average = input.average?.length === period ? input.average : synchronousAverage(x, period).average;
  const perDeg = period / 720;
  const avgDeg = new Float64Array(720);
  for (let i = 0; i < period; i++) avgDeg[Math.min(719, Math.floor(i / perDeg))] += average[i] / perDeg;

  let frame = 4;
  while (frame * 2 <= MAX_FRAME_DEG * (samplesPerRev / 360) && frame < 256) frame *= 2;
  const hop = frame / 2;
  const positions = period / hop;
  const bins = frame / 2 + 1;
  const power = new Float64Array(positions * bins);
  const rmsDeg = new Float64Array(720);
  let event: CycleEvent | null = null;
  if (cycles >= 2) {
    const plan = input.plans.get(frame);
    const w = createWindow('hann', frame);
    const buf = new Float64Array(frame);
    // At most MAX_POWER_CYCLES cycles, evenly spaced (enough statistics, bounded cost).
    const used = Math.min(cycles, MAX_POWER_CYCLES);
    const perPos = new Float64Array(positions);
    for (let u = 0; u < used; u++) {
      const c = used === cycles ? u : Math.round((u * (cycles - 1)) / Math.max(1, used - 1));
      const base = c * period;
      for (let pos = 0; pos < positions; pos++) {
        const s = base + pos * hop;
        if (s + frame > x.length) break;
        differencedWindowedFrame(buf, x, s, w);
        plan.fft.realTransform(plan.work, buf);
        addLogPower(plan.work, power, pos * bins, bins);
        perPos[pos]++;
      }
    }
    // Geometric mean over cycles (a tick in every cycle counts; one big stray impact hardly does).
    for (let p = 0; p < positions; p++) for (let k = 2; k < bins; k++) power[p * bins + k] = Math.exp(power[p * bins + k] / Math.max(1, perPos[p]));
    // Band with the largest peak-to-median ratio over the cycle.
    let bestK = 2, bestRatio = 0, bestPos = 0;
    const profile = new Float64Array(positions);
    for (let k = 2; k < bins; k++) {
      let mx = 0, at = 0;
      for (let p = 0; p < positions; p++) { const v = power[p * bins + k]; profile[p] = v; if (v > mx) { mx = v; at = p; } }
      const med = median(profile);
      const ratio = med > 0 ? mx / med : 0;
      if (ratio > bestRatio) { bestRatio = ratio; bestK = k; bestPos = at; }
    }
    for (let p = 0; p < positions; p++) profile[p] = power[p * bins + bestK];
    const med = median(profile);
    // RMS per degree (frame centres at p·hop + frame/2 samples), normalised to the band's median.
    for (let d = 0; d < 720; d++) {
      const pc = ((d + 0.5) * perDeg - frame / 2) / hop;
      const p0 = Math.floor(pc);
      const f = pc - p0;
      const a = profile[((p0 % positions) + positions) % positions];
      const b = profile[(((p0 + 1) % positions) + positions) % positions];
      rmsDeg[d] = Math.sqrt(((1 - f) * a + f * b) / Math.max(med, 1e-300));
    }
    const coherent = coherentEvent(average, perDeg);
    const sB = bestRatio / eventThreshold(used);
    const sA = coherent.ratio / COHERENT_THRESHOLD;
    if (sA >= 1 && sA >= sB) {
      event = describeEvent(coherent.angleDeg, firingOrder, input.phaseResolved, input.ambiguityDeg);
    } else if (sB >= 1) {
      let onset = bestPos;
      for (let j = 1; j <= 3; j++) {
        const p = (bestPos - j + positions) % positions;
        if (profile[p] >= 0.3 * profile[bestPos]) onset = p; else break;
      }
      // The frame's centre marks where its energy is.
      const angleDeg = ((((onset * hop + frame / 2) / perDeg) % 720) + 720) % 720;
      event = describeEvent(angleDeg, firingOrder, input.phaseResolved, input.ambiguityDeg);
    }
  }
  return {
    tdcOffsetDeg: input.tdcOffsetDeg,
    phaseResolved: input.phaseResolved,
    cyclesAveraged: cycles,
    event,
    averageDeg: Float32Array.from(avgDeg),
    rmsDeg: Float32Array.from(rmsDeg),
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

/**
 * The coherent detector: the synchronous average minus its own ±5° moving average (the engine's
 * smooth low orders go), energy per degree smoothed over 3°; ratio of its peak to its median and
 * the onset (earliest degree up to 6° before the peak still holding 30 % of the peak degree's
 * energy). Strong when ticks repeat to a fraction of their ringing period; the power detector
 * takes over when they do not.
 */
function coherentEvent(average: Float64Array, perDeg: number): { ratio: number; angleDeg: number } {
  const period = average.length;
  const w = Math.max(1, Math.round(5 * perDeg));
  const cum = new Float64Array(period + 1);
  for (let i = 0; i < period; i++) cum[i + 1] = cum[i] + average[i];
  const circSum = (a: number, len: number) => {
    const lo = ((a % period) + period) % period;
    const hi = lo + len;
    return hi <= period ? cum[hi] - cum[lo] : cum[period] - cum[lo] + cum[hi - period];
  };
  const energy = new Float64Array(720);
  for (let i = 0; i < period; i++) {
    const hp = average[i] - circSum(i - w, 2 * w + 1) / (2 * w + 1);
    energy[Math.min(719, Math.floor(i / perDeg))] += hp * hp;
  }
  const smooth = new Float64Array(720);
  for (let d = 0; d < 720; d++) smooth[d] = energy[(d + 719) % 720] + energy[d] + energy[(d + 1) % 720];
  let best = 0;
  for (let d = 1; d < 720; d++) if (smooth[d] > smooth[best]) best = d;
  const med = median(smooth);
  let top = best;
  for (let j = -2; j <= 2; j++) { const d = (best + j + 720) % 720; if (energy[d] > energy[top]) top = d; }
  let onset = top;
  for (let j = 1; j <= 6; j++) { const d = (top - j + 720) % 720; if (energy[d] >= 0.3 * energy[top]) onset = d; else break; }
  return { ratio: med > 0 ? smooth[best] / med : 0, angleDeg: onset + 0.5 };
}

// The per-frame loops sit in small functions of their own, so V8 compiles them once with type
// feedback instead of running cycleView's single call unoptimised until on-stack replacement.

/** buf[i] = (x[s + i] − x[s + i − 1])·w[i] (first difference; x[−1] counts as x[0]). */
function differencedWindowedFrame(buf: Float64Array, x: Float64Array, s: number, w: Float64Array): void {
  for (let i = 0; i < buf.length; i++) buf[i] = (x[s + i] - (s + i > 0 ? x[s + i - 1] : x[s + i])) * w[i];
}

/** power[o + k] += ln |X[k]|² for k = 2..bins − 1, from interleaved complex `wk`. */
function addLogPower(wk: Float64Array, power: Float64Array, o: number, bins: number): void {
  for (let k = 2; k < bins; k++) power[o + k] += Math.log(wk[2 * k] * wk[2 * k] + wk[2 * k + 1] * wk[2 * k + 1] + 1e-300);
}
