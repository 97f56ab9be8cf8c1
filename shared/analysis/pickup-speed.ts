import { decimateByTwo, designHalfBand } from '../dsp/fir';
import { type FftPlanCache, nextPowerOfTwo } from '../dsp/fft';
import { runningMedian } from '../dsp/running-median';
import { median } from '../dsp/stats';
import { createWindow } from '../dsp/window';
import { AnalysisInputError } from './analysis-input-error';
import { type ReferenceResult } from './reference';

/**
 * Crank speed from the pickup itself, for a capture without a usable reference (issue 20 item 2).
 * A four-stroke engine's strongest vibration line is usually its firing order, cylinders / 2 per
 * revolution, with harmonics at its multiples (REFERENCES.md §5, common practice). The line is
 * followed through a spectrogram of the pickup: for every frame a harmonic salience S(rpm) =
 * Σ_{n=1..H} D(n·F·rpm/60)/n is read (D = dB over the frame's running-median floor, counted over
 * the 30 dB below the frame's strongest line; F = the firing order), a Viterbi path through the frames keeps the speed continuous,
 * a weak prior toward the expected speed (the engine's idle rpm from the Drive library, or the
 * held rpm of the capture) chooses between the octave readings (the firing line read as order F,
 * 2F or F/2), and each frame's rpm is refined from the interpolated peaks of the harmonics.
 * Orders measured with this speed are relative to the assumption that the followed line is the
 * firing order; the 720° phase is unknown, so no engine-cycle view is drawn.
 */
export interface PickupSpeedOptions {
  cylinders: number;
  /** Speed the capture is expected near (idle or held rpm); the search prefers readings near it. */
  expectedRpm: number;
  minRpm: number;
  maxRpm: number;
}

export interface PickupSpeedTrack {
  /** The order assumed for the followed line (cylinders / 2). */
  firingOrder: number;
  /** Frame centres (s) and the speed read there (rpm). */
  timeS: Float64Array;
  rpm: Float64Array;
  /** Mean of the frames' rpm. */
  meanRpm: number;
  /** Median over frames of the followed line's level over the floor (dB). */
  lineDb: number;
  /** Share of frames in which the line stands at least LINE_PRESENT_DB over the floor. */
  presentFraction: number;
  /** Mean salience (with the prior) of the chosen reading minus that of the best octave alternative, half or double (dB). */
  marginDb: number;
  /** 0–1, from lineDb, presentFraction and marginDb (see `pickupSpeedConfidence`). */
  confidence: number;
}

/** Harmonics of the firing order summed in the salience. */
const HARMONICS = 4;
/** dB over the floor at which a line counts as present in a frame. */
export const LINE_PRESENT_DB = 6;
/** Below this median line level (dB over floor) the speed is not read: as likely noise as an engine line. */
export const LINE_REFUSE_DB = 6;
/** Below this share of frames with the line present the speed is not read. */
const PRESENT_REFUSE = 0.5;
/** Frames span this many revolutions at the expected speed: 8 revolutions put the half-order lines 4 bins apart. */
const FRAME_REVS = 8;
/** Zero padding factor of each frame (finer bins to read the peaks on). */
const PAD = 2;
/** Speed grid step (relative). */
const GRID_STEP = 0.004;
/** Largest speed change between neighbouring frames the path may take (grid steps) and its cost per step (dB). */
const MAX_STEPS_PER_HOP = 10;
const STEP_COST_DB = 0.15;
/**
 * Prior: dB of salience per octave away from the expected speed, beyond ±15 % of it (idle wanders,
 * a held speed is held by hand). It settles the octave (the firing line read as F, 2F or F/2) where
 * the engine's lines alone leave it open; a run-up still follows its line, whose salience is larger.
 */
const PRIOR_DB_PER_OCTAVE = 8;
const PRIOR_FREE_OCTAVES = Math.log2(1.15);
/** Range of D (dB over floor, below the frame's strongest line) counted in the salience, so one huge line cannot outvote the comb. */
const CLIP_DB = 30;
/**
 * The other half orders (0.5-order multiples that are not firing harmonics) count a quarter each,
 * clipped at 15 dB over the floor: an engine shows that whole family, a lone accessory line does not,
 * so a strong bearing or shaft line is not taken for the firing line.
 */
const HALF_ORDER_WEIGHT = 0.25;
const HALF_ORDER_CLIP_DB = 15;

/** Confidence 0–1: the line's level (6 → 0, 16 dB → 1) × its presence × the octave margin (0 → 0, ≥ 6 dB → 1). */
export function pickupSpeedConfidence(lineDb: number, presentFraction: number, marginDb: number): number {
  const level = Math.min(1, Math.max(0, (lineDb - LINE_REFUSE_DB) / 10));
  const margin = Math.min(1, Math.max(0, marginDb / 6));
  return Math.round(1000 * level * presentFraction * margin) / 1000;
}

/**
 * Follows the firing-order line of the pickup `x` (sample rate `sampleRateHz`). Throws
 * AnalysisInputError 'speed_unreadable' when the line does not stand clear of the noise, and
 * RangeError for bad options.
 */
export function trackSpeedFromPickup(x: Float32Array | Float64Array, sampleRateHz: number, o: PickupSpeedOptions, plans: FftPlanCache): PickupSpeedTrack {
  if (!(o.cylinders >= 1)) throw new RangeError(`cylinders must be ≥ 1, got ${o.cylinders}`);
  if (!(o.expectedRpm > 0)) throw new RangeError(`expected rpm must be positive, got ${o.expectedRpm}`);
  if (!(o.maxRpm > o.minRpm && o.minRpm > 0)) throw new RangeError(`rpm range must be positive and increasing, got ${o.minRpm}–${o.maxRpm}`);
  const firing = o.cylinders / 2;
  const topHz = 1.05 * HARMONICS * firing * (o.maxRpm / 60);
  // Decimate to a rate that still carries the top harmonic at the highest speed searched.
  const half = designHalfBand();
  let y: Float64Array | null = null;
  let fs = sampleRateHz;
  while (fs / 2 >= 2.5 * topHz && (y ?? x).length > 4096) { y = decimateByTwo(y ?? x, half); fs /= 2; }
  if (!y) y = Float64Array.from(x);
  const frame = Math.max(64, nextPowerOfTwo((fs * FRAME_REVS * 60) / o.expectedRpm));
  const hop = frame / 4;
  const durationS = y.length / fs;
  if (y.length < frame) {
    throw new AnalysisInputError('too_short', `the capture is ${durationS.toFixed(1)} s long; reading speed from the pickup needs at least ${(frame / fs).toFixed(1)} s (record 10 seconds or more)`);
  }
  const nfft = frame * PAD;
  const plan = plans.get(nfft);
  const win = createWindow('hann', frame);
  const bins = nfft / 2 + 1;
  const binHz = fs / nfft;
  const frames = Math.floor((y.length - frame) / hop) + 1;
  // dB over floor per frame (frames × bins) and the power for peak reading.
  const dbOver = new Float32Array(frames * bins);
  const logPow = new Float32Array(frames * bins);
  const buf = new Float64Array(nfft);
  const pow = new Float64Array(bins);
  // Floor: running median over about four orders (8 half-order lines at the expected speed).
  const floorWidth = 4 * FRAME_REVS * PAD + 1;
  for (let f = 0; f < frames; f++) {
    const s = f * hop;
    let m = 0;
    for (let i = 0; i < frame; i++) m += y[s + i];
    m /= frame;
    buf.fill(0);
    for (let i = 0; i < frame; i++) buf[i] = (y[s + i] - m) * win[i];
    plan.fft.realTransform(plan.work, buf);
    for (let k = 0; k < bins; k++) pow[k] = plan.work[2 * k] ** 2 + plan.work[2 * k + 1] ** 2 + 1e-300;
    const floor = runningMedian(pow, floorWidth);
    for (let k = 0; k < bins; k++) {
      logPow[f * bins + k] = 10 * Math.log10(pow[k]);
      dbOver[f * bins + k] = 10 * Math.log10(pow[k] / Math.max(floor[k], 1e-300));
    }
  }
  // Each frame's strongest line in the searched band sets the top of the salience's 30 dB range,
  // so lines far above the noise are still told apart by level (the firing line above the half orders).
  const top = new Float64Array(frames);
  const kLo = Math.max(1, Math.floor((firing * o.minRpm) / 60 / binHz));
  const kHi = Math.min(bins - 1, Math.ceil(topHz / binHz));
  for (let f = 0; f < frames; f++) {
    let m = 0;
    for (let k = kLo; k <= kHi; k++) m = Math.max(m, dbOver[f * bins + k]);
    top[f] = Math.max(0, m - CLIP_DB);
  }
  // Speed grid (log-spaced) and each frame's salience on it.
  const grid: number[] = [];
  for (let r = o.minRpm; r <= o.maxRpm; r *= 1 + GRID_STEP) grid.push(r);
  const g = grid.length;
  const lnExpected = Math.log2(o.expectedRpm);
  const salienceAt = (f: number, rpm: number): number => {
    let sum = 0;
    for (let h = 1; h <= 2 * firing * HARMONICS; h++) {
      // Tooth h sits at order h/2: a firing harmonic n = h / (2F) when whole, else a half order.
      const n = h / (2 * firing);
      const isFiring = Math.abs(n - Math.round(n)) < 1e-9;
      const k = ((h / 2) * rpm) / 60 / binHz;
      const k0 = Math.round(k);
      if (k0 + 1 >= bins) break;
      // Tolerance of the grid step and the line's own width: the best of the nearest bins.
      let best = -Infinity;
      const reach = Math.max(1, Math.ceil(k * GRID_STEP));
      for (let j = Math.max(1, k0 - reach); j <= k0 + reach; j++) best = Math.max(best, dbOver[f * bins + j]);
      sum += isFiring
        ? Math.min(CLIP_DB, Math.max(0, best - top[f])) / Math.round(n)
        : HALF_ORDER_WEIGHT * Math.min(HALF_ORDER_CLIP_DB, Math.max(0, best));
    }
    return sum;
  };
  const prior = (rpm: number) => PRIOR_DB_PER_OCTAVE * Math.max(0, Math.abs(Math.log2(rpm) - lnExpected) - PRIOR_FREE_OCTAVES);
  const sal = new Float32Array(frames * g);
  for (let f = 0; f < frames; f++) {
    for (let i = 0; i < g; i++) sal[f * g + i] = salienceAt(f, grid[i]) - prior(grid[i]);
  }
  // Viterbi: maximise Σ salience − step cost over the frames.
  const score = new Float64Array(g);
  const next = new Float64Array(g);
  const back = new Int32Array(frames * g);
  for (let i = 0; i < g; i++) score[i] = sal[i];
  for (let f = 1; f < frames; f++) {
    for (let i = 0; i < g; i++) {
      let best = -Infinity, arg = i;
      for (let j = Math.max(0, i - MAX_STEPS_PER_HOP); j <= Math.min(g - 1, i + MAX_STEPS_PER_HOP); j++) {
        const v = score[j] - STEP_COST_DB * Math.abs(i - j);
        if (v > best) { best = v; arg = j; }
      }
      next[i] = best + sal[f * g + i];
      back[f * g + i] = arg;
    }
    score.set(next);
  }
  let end = 0;
  for (let i = 1; i < g; i++) if (score[i] > score[end]) end = i;
  const path = new Int32Array(frames);
  path[frames - 1] = end;
  for (let f = frames - 1; f > 0; f--) path[f - 1] = back[f * g + path[f]];

  // Refine each frame from the interpolated harmonic peaks near the path; measure the line.
  const timeS = new Float64Array(frames);
  const rpm = new Float64Array(frames);
  const lineLevels = new Float64Array(frames);
  let present = 0, salTrue = 0, salHalf = 0, salDouble = 0;
  for (let f = 0; f < frames; f++) {
    const r0 = grid[path[f]];
    timeS[f] = (f * hop + frame / 2) / fs;
    let wSum = 0, rSum = 0;
    for (let n = 1; n <= HARMONICS; n++) {
      const k = (n * firing * r0) / 60 / binHz;
      const reach = Math.max(2, Math.ceil(k * 2 * GRID_STEP));
      const lo = Math.max(1, Math.floor(k) - reach), hi = Math.min(bins - 2, Math.ceil(k) + reach);
      if (lo >= hi) continue;
      let kb = lo;
      for (let j = lo + 1; j <= hi; j++) if (logPow[f * bins + j] > logPow[f * bins + kb]) kb = j;
      const d = dbOver[f * bins + kb];
      if (n === 1) lineLevels[f] = d;
      if (d < LINE_PRESENT_DB || kb === lo || kb === hi) continue;
      // Parabolic interpolation on the log power (Grandke 1983; common practice for a Hann peak).
      const a = logPow[f * bins + kb - 1], b = logPow[f * bins + kb], c = logPow[f * bins + kb + 1];
      const den = a - 2 * b + c;
      const delta = den < 0 ? Math.max(-0.5, Math.min(0.5, (0.5 * (a - c)) / den)) : 0;
      const r = ((kb + delta) * binHz * 60) / (n * firing);
      const w = n * (d - 3);
      wSum += w; rSum += w * r;
    }
    rpm[f] = wSum > 0 ? rSum / wSum : r0;
    if (lineLevels[f] >= LINE_PRESENT_DB) present++;
    salTrue += salienceAt(f, r0) - prior(r0);
    salHalf += r0 / 2 >= o.minRpm ? salienceAt(f, r0 / 2) - prior(r0 / 2) : -Infinity;
    salDouble += r0 * 2 <= o.maxRpm ? salienceAt(f, r0 * 2) - prior(r0 * 2) : -Infinity;
  }
  const lineDb = median(lineLevels);
  const presentFraction = present / frames;
  const marginDb = (salTrue - Math.max(salHalf, salDouble)) / frames;
  if (lineDb < LINE_REFUSE_DB || presentFraction < PRESENT_REFUSE) {
    throw new AnalysisInputError('speed_unreadable',
      `no reference and no engine line stands clear of the noise in the pickup (the firing-order line stands ${lineDb.toFixed(1)} dB over the floor, ${LINE_REFUSE_DB} dB needed, in ${Math.round(100 * presentFraction)} % of the frames): speed cannot be read; record the ignition clamp on its own channel, or hold the pickup firmly on the engine block near the noise`);
  }
  let sum = 0;
  for (let f = 0; f < frames; f++) sum += rpm[f];
  return {
    firingOrder: firing, timeS, rpm, meanRpm: sum / frames, lineDb, presentFraction, marginDb,
    confidence: pickupSpeedConfidence(lineDb, presentFraction, marginDb),
  };
}

/**
 * A reference built from a pickup speed track, so the rest of the pipeline (crank angle, order
 * tracking, spectrogram) runs unchanged: knots at 0 s, every frame centre and the end, with the
 * crank angle integrated from the rpm by the trapezoid rule (°/s = 6 × rpm); the first and last
 * frames' speeds hold to the ends. The 720° phase is unknown (ambiguity 720° unresolved); no edges.
 */
export function referenceFromTrack(track: PickupSpeedTrack, durationS: number): ReferenceResult {
  const t: number[] = [0];
  const r: number[] = [track.rpm[0]];
  for (let i = 0; i < track.timeS.length; i++) {
    if (track.timeS[i] <= t[t.length - 1] || track.timeS[i] >= durationS) continue;
    t.push(track.timeS[i]); r.push(track.rpm[i]);
  }
  t.push(durationS); r.push(track.rpm[track.rpm.length - 1]);
  const timesS = Float64Array.from(t);
  const anglesDeg = new Float64Array(t.length);
  for (let i = 1; i < t.length; i++) anglesDeg[i] = anglesDeg[i - 1] + 3 * (r[i] + r[i - 1]) * (t[i] - t[i - 1]);
  return {
    timesS, anglesDeg, edges: 0, repairedEdges: 0, gaps: 0, pulsesPerRev: 0, polarity: 'rising',
    cycleOriginDeg: 0, phaseResolved: false, ambiguityDeg: 720, warnings: [],
  };
}
