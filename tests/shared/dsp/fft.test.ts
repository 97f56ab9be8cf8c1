import { describe, expect, it } from 'vitest';
import { complexFft, createFftPlan, FftPlanCache, inverseComplexFft, powerSpectrum, realFft } from '../../../shared/dsp/fft';
import { gaussian, tone } from '../../helpers/signals';

/** Direct DFT, the textbook definition X[k] = Σ x[n] e^(−2πikn/N) (independent reference). */
function dft(x: Float64Array): { re: Float64Array; im: Float64Array } {
  const n = x.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    for (let j = 0; j < n; j++) {
      const a = (-2 * Math.PI * k * j) / n;
      re[k] += x[j] * Math.cos(a);
      im[k] += x[j] * Math.sin(a);
    }
  }
  return { re, im };
}

describe('real FFT (fft.js plan)', () => {
  it('matches a direct DFT on random data (n = 64)', () => {
    const x = gaussian(64, 3);
    const X = realFft(x, createFftPlan(64));
    const ref = dft(x);
    for (let k = 0; k <= 32; k++) {
      expect(X[2 * k]).toBeCloseTo(ref.re[k], 9);
      expect(X[2 * k + 1]).toBeCloseTo(ref.im[k], 9);
    }
  });

  it('satisfies Parseval: Σ|x|² = (1/N) Σ|X|² over all bins', () => {
    const n = 1024;
    const x = gaussian(n, 5);
    const p = powerSpectrum(x, createFftPlan(n));
    let time = 0;
    for (const v of x) time += v * v;
    let freq = p[0] + p[n / 2];
    for (let k = 1; k < n / 2; k++) freq += 2 * p[k];
    expect(freq / n).toBeCloseTo(time, 8);
  });

  it('gives |X| = A·N/2 for a tone of amplitude A on a bin centre (rectangular window)', () => {
    const n = 4096;
    const x = tone(n, 100, n, 0.7, 0.3);
    const p = powerSpectrum(x, createFftPlan(n));
    expect(Math.sqrt(p[100])).toBeCloseTo((0.7 * n) / 2, 6);
    expect(Math.sqrt(p[101])).toBeLessThan(1e-8);
  });

  it('round-trips a complex signal through forward and inverse transforms', () => {
    const n = 256;
    const z = gaussian(2 * n, 9);
    const plan = createFftPlan(n);
    const back = inverseComplexFft(complexFft(z, plan), plan);
    for (let i = 0; i < 2 * n; i++) expect(back[i]).toBeCloseTo(z[i], 12);
  });

  it('plans each size once in a cache', () => {
    const cache = new FftPlanCache();
    expect(cache.get(512)).toBe(cache.get(512));
    expect(cache.get(512)).not.toBe(cache.get(1024));
  });

  it('refuses a size that is not a power of two, naming it', () => {
    expect(() => createFftPlan(1000)).toThrow(/power of two.*1000/);
  });
});
