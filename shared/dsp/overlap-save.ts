import { type FftPlanCache, nextPowerOfTwo } from './fft';

/**
 * Zero-phase FIR filtering of a long signal by overlap-save in blocks (Oppenheim & Schafer
 * §8.7.3): never a whole-signal FFT. Two real blocks share one complex FFT (one in the real part,
 * one in the imaginary part; h is real, so the filtered parts stay separate). The FFT size is the
 * power of two ≥ 4·(taps − 1), so each transform yields at least ¾ of its length as output.
 * h must be odd-length and symmetric; samples outside x count as 0.
 */
export function overlapSaveFilter(x: ArrayLike<number>, h: Float64Array, plans: FftPlanCache, out?: Float64Array): Float64Array {
  const m = h.length;
  if (m % 2 === 0) throw new RangeError(`overlap-save needs an odd-length FIR, got ${m} taps`);
  const n = x.length;
  const y = out ?? new Float64Array(n);
  const size = Math.max(256, nextPowerOfTwo(4 * (m - 1)));
  const plan = plans.get(size);
  const step = size - (m - 1);
  const delay = (m - 1) / 2;
  // Spectrum of h (zero-padded), full complex.
  const hBuf = new Float64Array(2 * size);
  for (let i = 0; i < m; i++) hBuf[2 * i] = h[i];
  const H = new Float64Array(2 * size);
  plan.fft.transform(H, hBuf);
  const buf = new Float64Array(2 * size);
  const spec = new Float64Array(2 * size);
  const res = new Float64Array(2 * size);
  // Output block b covers y[b·step … b·step + step); it needs x from b·step − (m − 1) + delay.
  const blocks = Math.ceil(n / step);
  for (let b = 0; b < blocks; b += 2) {
    for (let part = 0; part < 2; part++) {
      const s0 = (b + part) * step - (m - 1) + delay;
      const off = part;
      if (b + part >= blocks) { for (let i = 0; i < size; i++) buf[2 * i + off] = 0; continue; }
      for (let i = 0; i < size; i++) {
        const j = s0 + i;
        buf[2 * i + off] = j >= 0 && j < n ? x[j] : 0;
      }
    }
    plan.fft.transform(spec, buf);
    for (let k = 0; k < size; k++) {
      const ar = spec[2 * k], ai = spec[2 * k + 1];
      const br = H[2 * k], bi = H[2 * k + 1];
      spec[2 * k] = ar * br - ai * bi;
      spec[2 * k + 1] = ar * bi + ai * br;
    }
    plan.fft.inverseTransform(res, spec);
    for (let part = 0; part < 2; part++) {
      const o0 = (b + part) * step;
      if (o0 >= n) break;
      const lim = Math.min(step, n - o0);
      for (let i = 0; i < lim; i++) y[o0 + i] = res[2 * (m - 1 + i) + part];
    }
  }
  return y;
}
