import { resampleCubic } from '../dsp/interpolate';
import { type MonotoneCubic } from '../dsp/monotone-cubic';

/**
 * Computed order tracking's resampling step (K. R. Fyfe & E. D. S. Munck, MSSP 11(2):187–205,
 * 1997): the signal is read at the times where the crank passes constant angle increments,
 * θ_k = startDeg + k·360/samplesPerRev, t_k = t(θ_k), by cubic interpolation. The signal's sample
 * 0 is at t = 0 and its rate is `sampleRateHz`. The caller low-passes the signal first.
 */
export function resampleAtAngles(x: ArrayLike<number>, sampleRateHz: number, timeAt: MonotoneCubic, startDeg: number, count: number, samplesPerRev: number): Float64Array {
  const step = 360 / samplesPerRev;
  // t(θ) is evaluated exactly every STRIDE samples and linearly between (over a few degrees the
  // cubic is a straight line to well under a nanosecond), which saves most of its cost.
  const coarseCount = Math.ceil(count / STRIDE) + 1;
  const coarse = new Float64Array(coarseCount);
  for (let j = 0; j < coarseCount; j++) coarse[j] = startDeg + j * STRIDE * step;
  timeAt.atSorted(coarse, coarse);
  const pos = new Float64Array(count);
  for (let j = 0; j + 1 < coarseCount; j++) {
    const a = coarse[j] * sampleRateHz;
    const d = (coarse[j + 1] * sampleRateHz - a) / STRIDE;
    const k0 = j * STRIDE;
    const k1 = Math.min(count, k0 + STRIDE);
    for (let k = k0; k < k1; k++) pos[k] = a + (k - k0) * d;
  }
  // Written in place over the positions (each output reads only its own position).
  return resampleCubic(x, pos, pos);
}

const STRIDE = 8;
