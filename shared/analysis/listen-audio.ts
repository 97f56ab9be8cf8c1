/**
 * The pickup channel made ready to listen to in a browser (issue 15 item 7): resampled to 48 kHz
 * (a Kaiser-windowed low-pass at 0.45 × 48 kHz first when the capture is faster, then cubic
 * interpolation — shared/dsp/fir.ts, shared/dsp/interpolate.ts), the mean removed and the peak
 * scaled to 0.9 full scale so that quiet pickups are audible; the level is relative, not calibrated.
 */
import { designLowPass, firFilter, kaiserLength } from '../dsp/fir';
import { resampleCubic } from '../dsp/interpolate';

/** The listening rate (Hz): what every browser plays natively. */
export const LISTEN_RATE_HZ = 48_000;

/**
 * Resamples `x` (at `sampleRateHz`) to `targetHz`, removes its mean and normalises its peak to 0.9.
 * Throws RangeError for a non-positive rate.
 */
export function listenSignal(x: Float32Array, sampleRateHz: number, targetHz = LISTEN_RATE_HZ): Float32Array {
  if (!(sampleRateHz > 0) || !(targetHz > 0)) throw new RangeError(`sample rates must be positive, got ${sampleRateHz} and ${targetHz}`);
  let src: ArrayLike<number> = x;
  if (sampleRateHz > targetHz * 1.001) {
    const cutoff = (0.45 * targetHz) / sampleRateHz;
    const transition = Math.min(0.49 - cutoff, (0.05 * targetHz) / sampleRateHz);
    src = firFilter(x, designLowPass(cutoff, kaiserLength(transition, 60), 60));
  }
  const n = Math.max(1, Math.floor((x.length * targetHz) / sampleRateHz));
  const step = sampleRateHz / targetHz;
  const positions = new Float64Array(n);
  for (let i = 0; i < n; i++) positions[i] = i * step;
  const y = resampleCubic(src, positions);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += y[i];
  mean /= n;
  let peak = 0;
  for (let i = 0; i < n; i++) {
    y[i] -= mean;
    const a = Math.abs(y[i]);
    if (a > peak) peak = a;
  }
  const out = new Float32Array(n);
  const g = peak > 0 ? 0.9 / peak : 0;
  for (let i = 0; i < n; i++) out[i] = y[i] * g;
  return out;
}
