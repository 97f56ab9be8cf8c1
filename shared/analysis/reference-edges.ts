import { median } from '../dsp/stats';

/**
 * Reference pulses from an ignition lead, a coil, a cam/crank sensor or a trigger wheel.
 * Levels are robust: the baseline is the median, the pulse height the median of the maxima of
 * half-second segments (one glitch or one loud spark does not move it). A Schmitt trigger with
 * hysteresis (arm below 15 %, fire above 30 % of the pulse height) and a dead time (debounce from
 * the highest plausible rpm, then from the measured pulse spacing) rejects ignition ringing. The
 * edge time is the sub-sample crossing of half the pulse's own height (constant fraction, linear
 * interpolation between samples), so weak and strong pulses are timed alike (Fyfe & Munck 1997:
 * order-tracking accuracy depends on pulse timing).
 */

export type Polarity = 'rising' | 'falling';

export interface DetectedPulses {
  /** Edge times in samples (fractional). */
  times: Float64Array;
  /** Pulse heights above the baseline. */
  heights: Float64Array;
  polarity: Polarity;
  /** Robust pulse height of the chosen polarity. */
  level: number;
}

export interface PulseLevels {
  baseline: number;
  rising: number;
  falling: number;
  /** Robust noise deviation (1.4826 × median absolute deviation; pulses are too sparse to move it). */
  noise: number;
}

/** Baseline and robust pulse heights of both polarities. */
export function pulseLevels(x: Float32Array, sampleRateHz: number): PulseLevels {
  const stride = Math.max(1, Math.floor(x.length / 100_000));
  const sub = new Float64Array(Math.ceil(x.length / stride));
  for (let i = 0, j = 0; i < x.length; i += stride, j++) sub[j] = x[i];
  const baseline = median(sub);
  for (let j = 0; j < sub.length; j++) sub[j] = Math.abs(sub[j] - baseline);
  const noise = 1.4826 * median(sub);
  const seg = Math.max(16, Math.min(Math.round(0.5 * sampleRateHz), Math.floor(x.length / 4)));
  const segments = Math.floor(x.length / seg);
  const maxs = new Float64Array(segments);
  const mins = new Float64Array(segments);
  segmentExtremes(x, seg, baseline, maxs, mins);
  return { baseline, rising: median(maxs), falling: median(mins), noise };
}

/** Per whole segment of `seg` samples: its maximum above and its minimum below the baseline.
 * One tight loop of its own, so it is compiled once with full type feedback. */
function segmentExtremes(x: Float32Array, seg: number, baseline: number, maxs: Float64Array, mins: Float64Array): void {
  for (let k = 0; k < maxs.length; k++) {
    const s = k * seg;
    let hi = -Infinity, lo = Infinity;
    for (let i = s; i < s + seg; i++) { const v = x[i]; if (v > hi) hi = v; if (v < lo) lo = v; }
    maxs[k] = hi - baseline;
    mins[k] = baseline - lo;
  }
}

/**
 * Pulses of one polarity. `deadSamples` is the minimum spacing between accepted edges.
 * `level` is the pulse height the thresholds are relative to.
 */
export function detectPulses(x: Float32Array, baseline: number, level: number, polarity: Polarity, deadSamples: number): DetectedPulses {
  const sign = polarity === 'rising' ? 1 : -1;
  const hi = 0.3 * level;
  const lo = 0.15 * level;
  const times: number[] = [];
  const heights: number[] = [];
  const n = x.length;
  let armed = false;
  let last = -Infinity;
  let i = 0;
  // Start armed only once the signal has been below the low threshold (no half pulse at the start).
  while (i < n && sign * (x[i] - baseline) >= lo) i++;
  armed = true;
  for (; i < n; i++) {
    if (armed) {
      // Armed means the dead time is over: skip to the next sample at or above the high threshold
      // (one tight loop per polarity; the same comparisons as sign·(x − baseline) ≥ hi).
      i = sign === 1 ? nextAtOrAbove(x, i, baseline, hi) : nextAtOrBelow(x, i, baseline, hi);
      if (i >= n) break;
    }
    const y = sign * (x[i] - baseline);
    if (!armed) {
      if (y < lo && i - last >= deadSamples) armed = true;
      continue;
    }
    if (y >= hi && i - last >= deadSamples) {
      // Follow the pulse to its peak (until it falls below the low threshold or the dead time ends).
      let peak = y, pk = i;
      const stop = Math.min(n, i + Math.max(2, Math.floor(deadSamples)));
      for (let j = i + 1; j < stop; j++) {
        const v = sign * (x[j] - baseline);
        if (v > peak) { peak = v; pk = j; }
        if (v < lo) break;
      }
      // Constant-fraction crossing: half of this pulse's height, searched back from the peak.
      const half = 0.5 * peak;
      let j = pk;
      while (j > 0 && sign * (x[j - 1] - baseline) >= half) j--;
      let t = j;
      if (j > 0) {
        const a = sign * (x[j - 1] - baseline), b = sign * (x[j] - baseline);
        t = j - 1 + (b > a ? (half - a) / (b - a) : 1);
      }
      if (pk === n - 1 || (j === 0 && sign * (x[0] - baseline) >= half)) { armed = false; last = i; continue; }
      times.push(t);
      heights.push(peak);
      last = i;
      armed = false;
    }
  }
  return { times: Float64Array.from(times), heights: Float64Array.from(heights), polarity, level };
}

/** First index ≥ i where x − baseline ≥ level (x.length when none). */
function nextAtOrAbove(x: Float32Array, i: number, baseline: number, level: number): number {
  const n = x.length;
  while (i < n && !(x[i] - baseline >= level)) i++;
  return i;
}

/** First index ≥ i where baseline − x ≥ level, i.e. −(x − baseline) ≥ level (x.length when none). */
function nextAtOrBelow(x: Float32Array, i: number, baseline: number, level: number): number {
  const n = x.length;
  while (i < n && !(-(x[i] - baseline) >= level)) i++;
  return i;
}

/** Median spacing of pulse times (samples). */
export function medianSpacing(times: Float64Array): number {
  if (times.length < 2) return Infinity;
  const d = new Float64Array(times.length - 1);
  for (let i = 1; i < times.length; i++) d[i - 1] = times[i] - times[i - 1];
  return median(d);
}

/**
 * Fills holes of a pulse train from pulses of the other polarity: a wasted spark fires once on the
 * compression and once on the exhaust stroke, the exhaust spark weaker and often of the other
 * polarity, so its ringing on the chosen polarity can stay under the threshold now and then. Every
 * interval of about twice the median spacing (1.6–2.5×) takes the other-polarity pulse closest to
 * its middle, if one lies within 0.35–0.65 of it; other intervals are left alone (a pulse of the
 * other polarity that coincides with a detected one is the same spark). Returns the merged,
 * increasing times and how many were added.
 */
export function fillHolesFromOther(times: readonly number[], others: readonly number[]): { times: number[]; added: number } {
  const nominal = medianSpacing(Float64Array.from(times));
  if (!Number.isFinite(nominal) || others.length === 0) return { times: [...times], added: 0 };
  const out: number[] = [times[0]];
  let added = 0;
  let j = 0;
  for (let i = 1; i < times.length; i++) {
    const a = times[i - 1], b = times[i];
    const d = b - a;
    if (d >= 1.6 * nominal && d <= 2.5 * nominal) {
      while (j < others.length && others[j] <= a) j++;
      let best = -1, bestOff = Infinity;
      for (let k = j; k < others.length && others[k] < b; k++) {
        const off = Math.abs((others[k] - a) / d - 0.5);
        if (off < 0.15 && off < bestOff) { best = others[k]; bestOff = off; }
      }
      if (best >= 0) { out.push(best); added++; }
    }
    out.push(b);
  }
  return { times: out, added };
}

/** Segment length of the wheel's level tracking, seconds (a dozen teeth even at cranking speed). */
const LEVEL_SEGMENT_S = 0.05;

/**
 * A trigger-wheel signal with its slow level changes divided out, or null when the level holds
 * within 1.5×. A variable-reluctance sensor's voltage grows with speed, so over a run-up the teeth
 * at the slow end stay under a threshold set from the whole capture and are lost. The level is the
 * median of the largest |x − baseline| of five neighbouring 50 ms segments (a glitch moves one),
 * interpolated between segment centres and kept at least a tenth of the median level, so a
 * stretch without teeth is not raised into the noise. Edge times are kept: the gain changes far
 * more slowly than a tooth.
 */
export function levelledWheel(x: Float32Array, sampleRateHz: number, baseline: number): Float32Array | null {
  const seg = Math.max(16, Math.round(LEVEL_SEGMENT_S * sampleRateHz));
  const count = Math.floor(x.length / seg);
  if (count < 5) return null;
  const peaks = new Float64Array(count);
  for (let k = 0; k < count; k++) {
    let m = 0;
    for (let i = k * seg; i < (k + 1) * seg; i++) { const v = Math.abs(x[i] - baseline); if (v > m) m = v; }
    peaks[k] = m;
  }
  const level = new Float64Array(count);
  for (let k = 0; k < count; k++) level[k] = median(peaks.subarray(Math.max(0, k - 2), Math.min(count, k + 3)));
  const typical = median(level);
  if (!(typical > 0)) return null;
  let lo = Infinity, hi = 0;
  for (let k = 0; k < count; k++) { level[k] = Math.max(level[k], 0.1 * typical); lo = Math.min(lo, level[k]); hi = Math.max(hi, level[k]); }
  if (hi <= 1.5 * lo) return null;
  const out = new Float32Array(x.length);
  for (let i = 0; i < x.length; i++) {
    const c = i / seg - 0.5;
    const k = Math.max(0, Math.min(count - 2, Math.floor(c)));
    const f = Math.max(0, Math.min(1, c - k));
    out[i] = (x[i] - baseline) / (level[k] + f * (level[k + 1] - level[k]));
  }
  return out;
}
