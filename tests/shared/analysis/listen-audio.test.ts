// The Listen view's signal (shared/analysis/listen-audio.ts): resampling keeps a tone's frequency
// (counted by zero crossings, an analytic check), removes the mean and scales the peak to 0.9;
// above 0.45 × 48 kHz a 200 kHz capture's content is filtered out before resampling (no alias).
import { describe, expect, it } from 'vitest';
import { LISTEN_RATE_HZ, listenSignal } from '../../../shared/analysis/listen-audio';
import { tone } from '../../helpers/signals';

const crossings = (x: Float32Array) => { let n = 0; for (let i = 1; i < x.length; i++) if ((x[i - 1] < 0) !== (x[i] < 0)) n++; return n; };

describe('listenSignal', () => {
  it('keeps a 1 kHz tone at 1 kHz from 24 kHz and from 200 kHz, mean removed, peak 0.9', () => {
    for (const fs of [24_000, 200_000]) {
      const x = Float32Array.from(tone(fs, 1000, fs, 0.01), (v) => v + 0.5);
      const y = listenSignal(x, fs);
      expect(y.length).toBe(LISTEN_RATE_HZ);
      // 1 s of 1 kHz: 2000 zero crossings.
      expect(Math.abs(crossings(y.subarray(100, y.length - 100)) - 2000 * (y.length - 200) / y.length)).toBeLessThan(4);
      expect(Math.max(...y.map(Math.abs))).toBeCloseTo(0.9, 3);
    }
  });

  it('filters content above the listening band before resampling a 200 kHz capture', () => {
    const fs = 200_000;
    // 60 kHz would alias to 12 kHz at 48 kHz without the low-pass.
    const x = Float32Array.from(tone(fs, 60_000, fs, 1)).map((v, i) => v + 0.001 * Math.cos((2 * Math.PI * 500 * i) / fs));
    const y = listenSignal(x, fs);
    // What is left is the 500 Hz tone: about 1000 crossings in 1 s, not the 24 000 of a 12 kHz alias.
    expect(crossings(y)).toBeLessThan(1100);
  });
});
