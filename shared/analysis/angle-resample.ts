import { resampleCubic } from '../dsp/interpolate';
import { type MonotoneCubic } from '../dsp/monotone-cubic';

/**
 * Computed order tracking's resampling step (K. R. Fyfe & E. D. S. Munck, MSSP 11(2):187–205,
 * 1997): the signal is read at the times where the crank passes constant angle increments,
 * θ_k = startDeg + k·360/samplesPerRev, t_k = t(θ_k), by cubic interpolation. The signal's sample
 * 0 is at t = 0 and its rate is `sampleRateHz`. The caller low-passes the signal first.
 */
export function resampleAtAngles(x: ArrayLike<number>, sampleRateHz: number, timeAt: MonotoneCubic, startDeg: number, count: number, samplesPerRev: number): Float64Array {
  const theta = new Float64Array(count);
  const step = 360 / samplesPerRev;
  for (let k = 0; k < count; k++) theta[k] = startDeg + k * step;
  const pos = timeAt.atSorted(theta, theta);
  for (let k = 0; k < count; k++) pos[k] *= sampleRateHz;
  // Written in place over the positions (each output reads only its own position).
  return resampleCubic(x, pos, pos);
}
