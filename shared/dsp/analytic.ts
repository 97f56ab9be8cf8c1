import { type FftPlanCache, nextPowerOfTwo } from './fft';

/**
 * Analytic signal by the FFT (S. L. Marple, "Computing the discrete-time analytic signal via
 * FFT", IEEE Trans. SP 47(9), 1999): X[0] and X[N/2] kept, positive bins doubled, negative bins
 * zeroed, inverse FFT. The input is zero-padded to a power of two; the result has x's length,
 * interleaved re, im. Meant for frames and short signals (the pipeline forms envelopes block by
 * block, see shared/analysis/envelope-spectrum.ts).
 */
export function analyticSignal(x: ArrayLike<number>, plans: FftPlanCache): Float64Array {
  const n = x.length;
  const size = nextPowerOfTwo(Math.max(2, n));
  const plan = plans.get(size);
  const buf = new Float64Array(2 * size);
  for (let i = 0; i < n; i++) buf[2 * i] = x[i];
  const spec = new Float64Array(2 * size);
  plan.fft.transform(spec, buf);
  for (let k = 1; k < size / 2; k++) { spec[2 * k] *= 2; spec[2 * k + 1] *= 2; }
  for (let k = size / 2 + 1; k < size; k++) { spec[2 * k] = 0; spec[2 * k + 1] = 0; }
  const z = new Float64Array(2 * size);
  plan.fft.inverseTransform(z, spec);
  return z.subarray(0, 2 * n);
}

/** Envelope |analytic signal| of x (same length). */
export function envelope(x: ArrayLike<number>, plans: FftPlanCache): Float64Array {
  const z = analyticSignal(x, plans);
  const e = new Float64Array(x.length);
  for (let i = 0; i < e.length; i++) e[i] = Math.hypot(z[2 * i], z[2 * i + 1]);
  return e;
}
