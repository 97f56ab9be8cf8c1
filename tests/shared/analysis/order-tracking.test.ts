import { describe, expect, it } from 'vitest';
import { FftPlanCache, powerSpectrum, createFftPlan } from '../../../shared/dsp/fft';
import { MonotoneCubic } from '../../../shared/dsp/monotone-cubic';
import { resampleAtAngles } from '../../../shared/analysis/angle-resample';
import { orderSpectrum } from '../../../shared/analysis/order-spectrum';
import { orderPeaks } from '../../../shared/analysis/order-peaks';

// docs/references.md §3 (Fyfe & Munck, MSSP 11(2), 1997; arithmetic [derived]).
describe('computed order tracking (REFERENCES.md §3)', () => {
  const fs = 10_000;
  const durationS = 6;
  const n = fs * durationS;
  // A run-up from 600 to 1500 rpm: θ(t) = 360·(f0·t + ½·a·t²) degrees, f0 = 10 rev/s, a = 2.5 rev/s².
  const thetaAt = (t: number) => 360 * (10 * t + 1.25 * t * t);
  // Knots every 10° of crank (as from a fine reference), in float64.
  const times: number[] = [];
  const angles: number[] = [];
  for (let k = 0; thetaAt(durationS) >= 10 * k; k++) {
    const th = 10 * k;
    const t = (-10 + Math.sqrt(100 + 4 * 1.25 * (th / 360))) / 2.5;
    times.push(t);
    angles.push(th);
  }
  const timeAt = new MonotoneCubic(Float64Array.from(angles), Float64Array.from(times));
  const x = Float64Array.from({ length: n }, (_, i) => 0.8 * Math.cos((3.5 * thetaAt(i / fs) * Math.PI) / 180));

  it('puts cos(3.5θ) of a chirp at exactly order 3.500 with its amplitude (a tone of A reads A)', () => {
    const spr = 64;
    const count = Math.floor((angles[angles.length - 1] / 360) * spr);
    const xa = resampleAtAngles(x, fs, timeAt, 0, count, spr);
    const spec = orderSpectrum(xa, spr, 16, 30, new FftPlanCache());
    const peaks = orderPeaks(spec, 4);
    expect(peaks[0].order).toBeCloseTo(3.5, 3);
    expect(peaks[0].amplitude).toBeGreaterThan(0.8 * 0.98);
    expect(peaks[0].amplitude).toBeLessThan(0.8 * 1.02);
    expect(peaks[0].engineOrder).toBe(3.5);
  });

  it('a plain FFT of the same span smears it (derived)', () => {
    const size = 32768;
    const p = powerSpectrum(x.subarray(0, size), createFftPlan(size));
    let max = 0;
    for (const v of p) max = Math.max(max, Math.sqrt(v));
    expect((2 * max) / size).toBeLessThan(0.3 * 0.8);
  });

  it('has resolution 1/revsPerBlock and bins up to samplesPerRev/2: 64 × 32 → N 2048, 0.03125, order 32', () => {
    const xa = Float64Array.from({ length: 64 * 100 }, (_, i) => Math.cos((2 * Math.PI * 5 * i) / 64));
    const spec = orderSpectrum(xa, 64, 32, 32, new FftPlanCache());
    expect(spec.resolution).toBe(0.03125);
    expect(spec.amplitude.length).toBe(2048 / 2 + 1);
    expect((spec.amplitude.length - 1) * spec.resolution).toBe(32);
  });

  it('averages power, so a non-integer (accessory) order survives where a complex average of whole revolutions would cancel it', () => {
    const spr = 64;
    const xa = Float64Array.from({ length: spr * 200 }, (_, i) => 0.5 * Math.cos((2 * Math.PI * 2.8125 * i) / spr));
    const spec = orderSpectrum(xa, spr, 32, 20, new FftPlanCache());
    expect(spec.amplitude[Math.round(2.8125 * 32)]).toBeCloseTo(0.5, 3);
    // The 360° synchronous average of the same signal (complex average of revolutions) nearly cancels it.
    const avg = new Float64Array(spr);
    for (let r = 0; r < 200; r++) for (let i = 0; i < spr; i++) avg[i] += xa[r * spr + i] / 200;
    expect(Math.max(...avg.map(Math.abs))).toBeLessThan(0.05);
  });
});
