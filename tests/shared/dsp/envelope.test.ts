import { describe, expect, it } from 'vitest';
import { envelope } from '../../../shared/dsp/analytic';
import { FftPlanCache } from '../../../shared/dsp/fft';

// docs/references.md §4 [derived with scipy.signal.hilbert]: x = (1 + m cos 2πf_m t)·cos 2πf_c t,
// m = 0.5, f_m = 50 Hz, f_c = 2 kHz, f_s = 10 kHz, 1 s → envelope lines DC 1.0000, f_m 0.5000;
// squared-envelope lines DC 1.1250, f_m 1.0000, 2f_m 0.1250 (one-sided amplitudes).
describe('envelope of an AM tone (REFERENCES.md §4)', () => {
  const fs = 10_000;
  const n = fs;
  const x = Float64Array.from({ length: n }, (_, i) => (1 + 0.5 * Math.cos((2 * Math.PI * 50 * i) / fs)) * Math.cos((2 * Math.PI * 2000 * i) / fs));
  const env = envelope(x, new FftPlanCache());
  const line = (y: ArrayLike<number>, f: number) => {
    let re = 0, im = 0;
    for (let i = 0; i < n; i++) { re += y[i] * Math.cos((2 * Math.PI * f * i) / fs); im += y[i] * Math.sin((2 * Math.PI * f * i) / fs); }
    return (f === 0 ? 1 : 2) * Math.hypot(re, im) / n;
  };

  it('gives DC 1.0 and the modulation line 0.5', () => {
    expect(line(env, 0)).toBeCloseTo(1.0, 3);
    expect(line(env, 50)).toBeCloseTo(0.5, 3);
    expect(line(env, 100)).toBeLessThan(0.005);
  });

  it('squared envelope gives DC 1.125, f_m 1.0 and 2f_m 0.125 (why the product reports the envelope, not its square)', () => {
    const sq = env.map((v) => v * v);
    expect(line(sq, 0)).toBeCloseTo(1.125, 3);
    expect(line(sq, 50)).toBeCloseTo(1.0, 3);
    expect(line(sq, 100)).toBeCloseTo(0.125, 3);
  });
});
