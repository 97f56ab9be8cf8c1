import { describe, expect, it } from 'vitest';
import { bearingPlan, biquadMagnitudeDb, planMagnitudeDb, shaftPlan, SHAFT_BOOST_DB } from '../../../../src/features/listen/lib/listen-plan';

const FS = 48_000;

describe('biquad response (Audio EQ Cookbook, as the Web Audio API specifies BiquadFilterNode)', () => {
  it('a peaking section gives its gain at its centre and about 0 dB far away', () => {
    const s = { type: 'peaking' as const, frequencyHz: 1000, q: 20, gainDb: 12 };
    expect(biquadMagnitudeDb(s, 1000, FS)).toBeCloseTo(12, 6);
    expect(Math.abs(biquadMagnitudeDb(s, 5000, FS))).toBeLessThan(0.1);
  });

  it('a band-pass section (constant 0 dB peak gain) passes its centre at 0 dB', () => {
    const s = { type: 'bandpass' as const, frequencyHz: 3000, q: 1.5, gainDb: 0 };
    expect(biquadMagnitudeDb(s, 3000, FS)).toBeCloseTo(0, 6);
    expect(biquadMagnitudeDb(s, 300, FS)).toBeLessThan(-12);
  });
});

describe('listening to a shaft fault', () => {
  // An alternator at 148/56 of a crank idling at 760 rpm turns at 2.643 × 760 / 60 = 33.48 Hz.
  const plan = shaftPlan(148 / 56, 760);
  const f0 = ((148 / 56) * 760) / 60;

  it('boosts the shaft frequency and every harmonic up to 1 kHz', () => {
    expect(plan.filters.length).toBe(Math.floor(1000 / f0));
    expect(plan.filters[0]!.frequencyHz).toBeCloseTo(f0, 9);
    expect(plan.filters.at(-1)!.frequencyHz).toBeLessThanOrEqual(1000);
  });

  it('lifts the harmonics by the boost over the frequencies between them', () => {
    const onLine = planMagnitudeDb(plan, 5 * f0, FS);
    const between = planMagnitudeDb(plan, 5.5 * f0, FS);
    expect(onLine - between).toBeGreaterThan(SHAFT_BOOST_DB - 3);
  });

  it('says a line under 100 Hz needs headphones', () => {
    expect(plan.notes.join(' ')).toMatch(/headphones/);
    expect(shaftPlan(3, 3000).notes.join(' ')).not.toMatch(/headphones/);
  });

  it('refuses a zero rpm with a RangeError naming the values', () => {
    expect(() => shaftPlan(2, 0)).toThrow(RangeError);
  });
});

describe('listening to a bearing fault', () => {
  it('band-passes the envelope band around its geometric centre', () => {
    const plan = bearingPlan([2000, 4000]);
    expect(plan.filters.every((f) => f.type === 'bandpass')).toBe(true);
    expect(plan.filters[0]!.frequencyHz).toBeCloseTo(Math.sqrt(2000 * 4000), 9);
    const centre = planMagnitudeDb(plan, Math.sqrt(2000 * 4000), FS);
    expect(centre - planMagnitudeDb(plan, 300, FS)).toBeGreaterThan(30);
  });

  it('keeps the band under the audio Nyquist frequency', () => {
    const plan = bearingPlan([15000, 30000]);
    expect(plan.filters[0]!.frequencyHz).toBeLessThan(24000);
  });
});
