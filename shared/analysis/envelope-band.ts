import { type FftPlanCache, nextPowerOfTwo } from '../dsp/fft';
import { spectralKurtosis } from '../dsp/spectral-kurtosis';
import { type StftOptions, stftFrameCount, visitStftPower } from '../dsp/stft';

/**
 * Automatic envelope band (docs/design.md step 5): spectral kurtosis (Antoni 2006) of the residual
 * after the 720° average was subtracted, estimated with two STFT frame lengths (about 3 ms and
 * 12 ms, like two levels of a kurtogram; Antoni 2007), scored per candidate band as the mean SK of
 * its bins, best of the two. Ticks that ring a little differently every cycle survive the
 * subtraction of the average, so each frame's power is first divided by the mean power of the
 * frames at the same angle of the cycle in that bin (frames are aligned with the 720° cycle): what
 * recurs at a fixed angle then stops looking impulsive, impacts at wandering angles still do; a
 * bin scores the smaller of its plain and its normalised kurtosis.
 * The residual is in the angle domain; its bins map to Hz with the mean
 * speed (a structural resonance is fixed in Hz). Bands of 1×, 2× and 4× the minimum width slide in
 * quarter-width steps; the best ones that do not overlap each other are kept.
 */
export interface BandCandidate {
  bandHz: [number, number];
  score: number;
}

export interface BandSearch {
  /** Equivalent sample rate of the angle-domain residual at the mean speed (Hz). */
  rateHz: number;
  loHz: number;
  hiHz: number;
  minWidthHz: number;
  maxWidthHz: number;
  count: number;
  /** At most this many STFT frames per frame length (strided over the whole capture). */
  maxFrames?: number;
  /** Samples per 720° cycle of the residual: enables the cycle normalisation (see module comment). */
  cyclePeriod?: number;
}

/** Candidate bands by spectral kurtosis, best first (at least one). */
export function kurtosisBands(residual: Float64Array, search: BandSearch, plans: FftPlanCache): BandCandidate[] {
  const { rateHz, loHz, hiHz } = search;
  const maxFrames = search.maxFrames ?? 2000;
  const levels = [0.003, 0.012].map((sec) => {
    const size = Math.min(4096, Math.max(32, nextPowerOfTwo(rateHz * sec)));
    const hop = size / 2;
    const frames = Math.max(1, Math.floor((residual.length - size) / hop) + 1);
    const stride = Math.max(1, Math.ceil(frames / maxFrames));
    const opts = { frameSize: size, hop, stride, window: 'hann' as const };
    const sk = search.cyclePeriod && search.cyclePeriod % hop === 0 && residual.length >= 4 * search.cyclePeriod
      ? cycleNormalisedKurtosis(residual, opts, search.cyclePeriod / hop, plans)
      : spectralKurtosis(residual, opts, plans).sk;
    // Cumulative sums for O(1) band means.
    const cum = new Float64Array(sk.length + 1);
    for (let k = 0; k < sk.length; k++) cum[k + 1] = cum[k] + sk[k];
    return { binHz: rateHz / size, cum, bins: sk.length };
  });
  const bandScore = (lo: number, hi: number) => {
    let best = -Infinity;
    for (const L of levels) {
      const a = Math.max(1, Math.ceil(lo / L.binHz));
      const b = Math.min(L.bins - 1, Math.floor(hi / L.binHz));
      if (b < a) continue;
      const m = (L.cum[b + 1] - L.cum[a]) / (b - a + 1);
      if (m > best) best = m;
    }
    return best;
  };
  const cands: BandCandidate[] = [];
  const span = hiHz - loHz;
  for (let w = Math.min(search.minWidthHz, span); w <= Math.min(search.maxWidthHz, span) + 1e-9; w *= 2) {
    const step = w / 4;
    for (let lo = loHz; lo + w <= hiHz + 1e-9; lo += step) {
      const s = bandScore(lo, lo + w);
      if (Number.isFinite(s)) cands.push({ bandHz: [lo, lo + w], score: s });
    }
    if (w >= span) break;
  }
  if (cands.length === 0) return [{ bandHz: [loHz, hiHz], score: 0 }];
  cands.sort((a, b) => b.score - a.score);
  return pickDistinct(cands, search.count);
}

/**
 * The first `count` candidates (in the given order) that overlap no chosen one (bands may touch):
 * each kept band then looks at a resonance of its own.
 */
export function pickDistinct(cands: BandCandidate[], count: number): BandCandidate[] {
  const chosen: BandCandidate[] = [];
  for (const c of cands) {
    if (chosen.every((k) => !bandsOverlap(k.bandHz, c.bandHz))) chosen.push(c);
    if (chosen.length >= count) break;
  }
  return chosen;
}

/** True when two bands share more than 1 % of the narrower one's width. */
export function bandsOverlap(a: [number, number], b: [number, number]): boolean {
  return overlapFraction(a, b) > 0.01;
}

function overlapFraction(a: [number, number], b: [number, number]): number {
  const o = Math.max(0, Math.min(a[1], b[1]) - Math.max(a[0], b[0]));
  return o / Math.min(a[1] - a[0], b[1] - b[0]);
}

/**
 * The smaller of the plain spectral kurtosis and that of the power normalised per (position in
 * the cycle, bin): impulsive in both senses, so neither cycle-locked ticks nor the noisy
 * normalisation of a quiet band win. One STFT pass: the frames' powers are kept (at most a few
 * thousand frames of a few hundred bins) for the mean power at each of `positions` frame
 * positions per cycle, then normalised from memory.
 */
function cycleNormalisedKurtosis(x: Float64Array, options: StftOptions, positions: number, plans: FftPlanCache): Float64Array {
  const bins = options.frameSize / 2 + 1;
  const mean = new Float64Array(positions * bins);
  const count = new Float64Array(positions);
  const r2 = new Float64Array(bins);
  const r4 = new Float64Array(bins);
  const stride = Math.max(1, Math.floor(options.stride ?? 1));
  const stored = new Float64Array(Math.ceil(stftFrameCount(x.length, options.frameSize, options.hop) / stride) * bins);
  const position = new Int32Array(stored.length / bins);
  let row = 0;
  const frames = visitStftPower(x, options, plans, (f, p) => {
    const q = f % positions;
    const o = q * bins;
    count[q]++;
    position[row] = q;
    stored.set(p, row * bins);
    row++;
    addFramePower(p, mean, o, r2, r4);
  });
  return kurtosisFromStored(stored, position, frames, bins, mean, count, positions, r2, r4);
}

/** mean[o + k] += p[k], r2[k] += p[k], r4[k] += p[k]² (its own function: compiled once with feedback). */
function addFramePower(p: Float64Array, mean: Float64Array, o: number, r2: Float64Array, r4: Float64Array): void {
  for (let k = 0; k < p.length; k++) { const v = p[k]; mean[o + k] += v; r2[k] += v; r4[k] += v * v; }
}

/**
 * The second half of cycleNormalisedKurtosis (its own function, so V8 compiles it with feedback
 * instead of deoptimising the caller when it first reaches these loops): means per position from
 * the sums, then min(plain, normalised) kurtosis per bin.
 */
function kurtosisFromStored(stored: Float64Array, position: Int32Array, frames: number, bins: number, mean: Float64Array, count: Float64Array,
  positions: number, r2: Float64Array, r4: Float64Array): Float64Array {
  for (let q = 0; q < positions; q++) for (let k = 0; k < bins; k++) mean[q * bins + k] = mean[q * bins + k] / Math.max(1, count[q]) + 1e-300;
  const s2 = new Float64Array(bins);
  const s4 = new Float64Array(bins);
  for (let r = 0; r < frames; r++) {
    const o = position[r] * bins;
    const so = r * bins;
    for (let k = 0; k < bins; k++) { const v = stored[so + k] / mean[o + k]; s2[k] += v; s4[k] += v * v; }
  }
  const sk = new Float64Array(bins);
  for (let k = 0; k < bins; k++) {
    const m2 = s2[k] / frames;
    const normalised = m2 > 0 ? s4[k] / frames / (m2 * m2) - 2 : 0;
    const q2 = r2[k] / frames;
    const raw = q2 > 0 ? r4[k] / frames / (q2 * q2) - 2 : 0;
    sk[k] = Math.min(raw, normalised);
  }
  return sk;
}
