import FFT from 'fft.js';

/**
 * Real and complex FFTs on fft.js (radix-4, accurate to about 5e-16). A plan precomputes the
 * twiddles and bit reversal of one size and owns its work buffers, so a transform allocates
 * nothing. Conventions: X[k] = Σ x[n]·e^(−2πi·k·n/N) (no scaling forward, 1/N inverse); bin k is
 * at k·fs/N; a complex array interleaves re, im.
 */

export interface FftPlan {
  readonly size: number;
  readonly fft: FFT;
  /** Work buffer of 2·size (complex, interleaved). */
  readonly work: Float64Array;
}

/** Plans one FFT size (a power of two ≥ 2). */
export function createFftPlan(size: number): FftPlan {
  if (!Number.isInteger(size) || size < 2 || (size & (size - 1)) !== 0) {
    throw new RangeError(`FFT size must be a power of two ≥ 2, got ${size}`);
  }
  return { size, fft: new FFT(size), work: new Float64Array(2 * size) };
}

/**
 * A cache of plans, one per size: the pipeline creates one at its entry and passes it down
 * (planning a 1M-point FFT costs about 90 ms; reuse matters). This is the only cache of the DSP
 * layer and it lives in the caller's hands, not in module state.
 */
export class FftPlanCache {
  private readonly plans = new Map<number, FftPlan>();

  /** The plan of this size, created on first use. */
  get(size: number): FftPlan {
    let p = this.plans.get(size);
    if (!p) { p = createFftPlan(size); this.plans.set(size, p); }
    return p;
  }
}

/**
 * Real FFT of `frame` (length = plan.size): writes bins 0..N/2 as interleaved complex values
 * into `out` (length ≥ N + 2) and returns it.
 */
export function realFft(frame: ArrayLike<number>, plan: FftPlan, out?: Float64Array): Float64Array {
  const n = plan.size;
  const res = out ?? new Float64Array(n + 2);
  plan.fft.realTransform(plan.work, frame);
  // fft.js fills bins 0..N/2 of the complex output for a real transform.
  for (let i = 0; i < n + 2; i++) res[i] = plan.work[i];
  return res;
}

/** Forward complex FFT of interleaved `input` (length 2N) into `out` (length 2N). */
export function complexFft(input: Float64Array, plan: FftPlan, out?: Float64Array): Float64Array {
  const res = out ?? new Float64Array(2 * plan.size);
  plan.fft.transform(res, input);
  return res;
}

/** Inverse complex FFT (scaled by 1/N) of interleaved `input` into `out`. */
export function inverseComplexFft(input: Float64Array, plan: FftPlan, out?: Float64Array): Float64Array {
  const res = out ?? new Float64Array(2 * plan.size);
  plan.fft.inverseTransform(res, input);
  return res;
}

/**
 * Power spectrum |X[k]|² of a real frame, bins 0..N/2 (length N/2 + 1), unscaled.
 * Writes into `out` when given.
 */
export function powerSpectrum(frame: ArrayLike<number>, plan: FftPlan, out?: Float64Array): Float64Array {
  const n = plan.size;
  const res = out ?? new Float64Array(n / 2 + 1);
  plan.fft.realTransform(plan.work, frame);
  const w = plan.work;
  for (let k = 0; k <= n / 2; k++) res[k] = w[2 * k] * w[2 * k] + w[2 * k + 1] * w[2 * k + 1];
  return res;
}

/** Smallest power of two ≥ n. */
export function nextPowerOfTwo(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}
