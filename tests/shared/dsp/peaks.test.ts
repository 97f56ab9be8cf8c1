import { describe, expect, it } from 'vitest';
import { createFftPlan } from '../../../shared/dsp/fft';
import { findPeaks } from '../../../shared/dsp/peaks';
import { runningMedian } from '../../../shared/dsp/running-median';
import { coherentGain, createWindow } from '../../../shared/dsp/window';
import { gaussian } from '../../helpers/signals';

describe('interpolated peaks and running-median floor', () => {
  it('finds an off-bin tone within 0.05 bin and its amplitude within 0.2 dB (Hann, log-parabola)', () => {
    const n = 4096;
    const w = createWindow('hann', n);
    const noise = gaussian(n, 8);
    const x = Float64Array.from({ length: n }, (_, i) => (0.8 * Math.cos((2 * Math.PI * 200.37 * i) / n) + 0.001 * noise[i]) * w[i]);
    const plan = createFftPlan(n);
    plan.fft.realTransform(plan.work, x);
    const amp = new Float64Array(n / 2 + 1);
    const scale = 2 / (n * coherentGain(w));
    for (let k = 0; k <= n / 2; k++) amp[k] = Math.hypot(plan.work[2 * k], plan.work[2 * k + 1]) * scale;
    const peaks = findPeaks(amp, runningMedian(amp, 31));
    expect(peaks[0].bin).toBeCloseTo(200.37, 1);
    expect(Math.abs(peaks[0].bin - 200.37)).toBeLessThan(0.05);
    expect(Math.abs(20 * Math.log10(peaks[0].amplitude / 0.8))).toBeLessThan(0.2);
    expect(peaks.every((p, i) => i === 0 || p.amplitude <= peaks[i - 1].amplitude)).toBe(true);
  });

  it('keeps only peaks ≥ 6 dB over the floor, at most the asked number', () => {
    const amp = Float64Array.from({ length: 200 }, (_, k) => (k % 20 === 10 ? 3 : 1 + 0.01 * (k % 3)));
    const peaks = findPeaks(amp, runningMedian(amp, 15), { maxPeaks: 4 });
    expect(peaks).toHaveLength(4);
    expect(peaks.every((p) => p.snrDb >= 6)).toBe(true);
  });

  it('running median ignores isolated peaks', () => {
    const x = Float64Array.from({ length: 100 }, (_, k) => (k === 50 ? 100 : 1));
    expect(runningMedian(x, 9)[50]).toBe(1);
  });
});

describe('quantile (quickselect)', () => {
  it('matches sorting on random data for several p', async () => {
    const { quantile } = await import('../../../shared/dsp/stats');
    const x = gaussian(10_001, 12);
    const sorted = Float64Array.from(x).sort();
    for (const p of [0, 0.1, 0.5, 0.73, 1]) {
      const pos = p * (sorted.length - 1);
      const i = Math.floor(pos);
      const want = i + 1 < sorted.length ? sorted[i] * (1 - (pos - i)) + sorted[i + 1] * (pos - i) : sorted[i];
      expect(quantile(x, p)).toBeCloseTo(want, 12);
    }
    expect(quantile([3, 1, 2, 2], 0.5)).toBe(2);
  });
});
