import { describe, expect, it } from 'vitest';
import { FftPlanCache } from '../../../shared/dsp/fft';
import { decimateByTwo, designHalfBand, designLowPass, firFilter, kaiserLength } from '../../../shared/dsp/fir';
import { overlapSaveFilter } from '../../../shared/dsp/overlap-save';
import { gaussian, tone } from '../../helpers/signals';

function rmsOf(x: Float64Array, from: number, to: number): number {
  let s = 0;
  for (let i = from; i < to; i++) s += x[i] * x[i];
  return Math.sqrt(s / (to - from));
}

describe('FIR low-pass (Kaiser window method, Oppenheim & Schafer §7.5)', () => {
  const fs = 10_000;
  const h = designLowPass(1000 / fs, kaiserLength(400 / fs, 80), 80);

  it('passes a tone in the passband at unit gain and stops one in the stopband by ≥ 75 dB', () => {
    const pass = firFilter(tone(8000, 600, fs), h);
    const stop = firFilter(tone(8000, 1500, fs), h);
    expect(rmsOf(pass, 1000, 7000) * Math.SQRT2).toBeCloseTo(1, 3);
    expect(20 * Math.log10(rmsOf(stop, 1000, 7000) * Math.SQRT2)).toBeLessThan(-75);
  });

  it('overlap-save in blocks equals direct convolution', () => {
    const x = gaussian(20_000, 2);
    const a = firFilter(x, h);
    const b = overlapSaveFilter(x, h, new FftPlanCache());
    let err = 0;
    for (let i = 0; i < x.length; i++) err = Math.max(err, Math.abs(a[i] - b[i]));
    expect(err).toBeLessThan(1e-10);
  });

  it('half-band decimation keeps a 0.15·fs tone and removes a 0.35·fs tone', () => {
    const hb = designHalfBand();
    const keep = decimateByTwo(tone(20_000, 0.15 * fs, fs), hb);
    const drop = decimateByTwo(tone(20_000, 0.35 * fs, fs), hb);
    expect(rmsOf(keep, 500, 9500) * Math.SQRT2).toBeCloseTo(1, 3);
    expect(20 * Math.log10(rmsOf(drop, 500, 9500) * Math.SQRT2)).toBeLessThan(-70);
  });

  it('half-band decimation equals direct filtering at every second sample, from float32 and float64 alike', () => {
    const hb = designHalfBand();
    const x = gaussian(5001, 6);
    const direct = firFilter(x, hb);
    const d64 = decimateByTwo(x, hb);
    const d32 = decimateByTwo(Float32Array.from(x), hb);
    for (let k = 0; k < d64.length; k++) {
      expect(d64[k]).toBeCloseTo(direct[2 * k], 12);
      expect(d32[k]).toBeCloseTo(direct[2 * k], 5);
    }
  });

  it('refuses a cutoff outside (0, 0.5), naming it', () => {
    expect(() => designLowPass(0.7, 31)).toThrow(/0\.7/);
  });
});
