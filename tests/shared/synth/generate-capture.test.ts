import { describe, expect, it } from 'vitest';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { createRng } from '../../../shared/synth/prng';
import { slotOf } from '../../../shared/synth/engine-signal';
import { drives } from '../../helpers/scenarios';
import { risingEdges } from './signal-checks';

const drive = drives.i4Petrol;
const short = { durationS: 1.5, sampleRateHz: 16000 } as const;

describe('seeded generation', () => {
  it('gives the same capture and truth for the same seed, and a different one for another seed', () => {
    const options = { drive, ...short, fault: { component: 'Alternator', fault: 'ball' as const }, distractor: { kind: 'tick-train' as const } };
    const a = generateCapture({ ...options, seed: 42 });
    const b = generateCapture({ ...options, seed: 42 });
    const c = generateCapture({ ...options, seed: 43 });
    expect(b.channels).toEqual(a.channels);
    expect(b.truth).toEqual(a.truth);
    expect(c.channels[1]).not.toEqual(a.channels[1]);
    expect(c.truth.fault!.rollingSlipPct).not.toBe(a.truth.fault!.rollingSlipPct);
  });

  it('draws uniforms in [0, 1) and standard normals from mulberry32 + Box–Muller', () => {
    const rng = createRng(7);
    let sum = 0;
    let sumSq = 0;
    let min = 1;
    let max = 0;
    const n = 20000;
    for (let i = 0; i < n; i++) {
      const u = rng.uniform();
      min = Math.min(min, u);
      max = Math.max(max, u);
      const z = rng.normal();
      sum += z;
      sumSq += z * z;
    }
    expect(min).toBeGreaterThanOrEqual(0);
    expect(max).toBeLessThan(1);
    // Standard errors: mean 1/√n ≈ 0.007, variance √(2/n) ≈ 0.01.
    expect(Math.abs(sum / n)).toBeLessThan(0.03);
    expect(Math.abs(sumSq / n - 1)).toBeLessThan(0.05);
  });
});

describe('speed', () => {
  it('wanders within ±wanderPct, and the truth\'s mean rpm matches the reference pulses', () => {
    const { channels, truth, sampleRateHz } = generateCapture({ drive, seed: 3, durationS: 10, sampleRateHz: 12000, rpm: 800, wanderPct: 5, refKind: 'cyl1' });
    expect(truth.rpm.max).toBeLessThanOrEqual(800 * 1.05 * 1.004);
    expect(truth.rpm.min).toBeGreaterThanOrEqual(800 * 0.95 * 0.996);
    expect(truth.rpm.max - truth.rpm.min).toBeGreaterThan(800 * 0.03);
    const edges = risingEdges(channels[0], sampleRateHz, 1.0, 0.2, 0.005);
    const measured = ((edges.length - 1) * 2 * 60) / (edges[edges.length - 1] - edges[0]);
    expect(Math.abs(measured / truth.rpm.mean - 1)).toBeLessThan(0.005);
  });
});

describe('speed ramp', () => {
  it('ramps the speed linearly from rpm to rpmEnd (mean = the average of both ends)', () => {
    const { channels, truth, sampleRateHz } = generateCapture({ drive, seed: 4, durationS: 4, sampleRateHz: 12000, rpm: 800, rpmEnd: 2400, wanderPct: 0, firingFluctuationPct: 0, refKind: 'cyl1' });
    expect(truth.rpm.end).toBe(2400);
    expect(truth.rpm.mean).toBeGreaterThan(1600 * 0.99);
    expect(truth.rpm.mean).toBeLessThan(1600 * 1.01);
    expect(truth.rpm.min).toBeLessThan(850);
    expect(truth.rpm.max).toBeGreaterThan(2300);
    const edges = risingEdges(channels[0], sampleRateHz, 1.0, 0.2, 0.004);
    // One pulse per 720°: the interval falls from about 120/800 s to about 120/2400 s.
    expect(edges[1] - edges[0]).toBeGreaterThan(0.13);
    expect(edges[edges.length - 1] - edges[edges.length - 2]).toBeLessThan(0.052);
  });
});

describe('injector ticks and their slots', () => {
  it('places an angle in the firing slot as the sample README states (220° in 1-3-4-2 → cylinder 3, 40° after its TDC)', () => {
    expect(slotOf(220, [1, 3, 4, 2])).toEqual({ slotIndex: 1, slotCylinder: 3, afterTdcDeg: 40 });
    expect(slotOf(719.9, [1, 3, 4, 2]).slotCylinder).toBe(2);
  });

  it.each([
    ['cyl1', false, [4], true],
    ['per-rev', false, [1, 4], false],
    ['per-rev', true, [4], true],
    ['wheel', false, [1, 4], false],
    ['per-cylinder', false, [1, 2, 3, 4], false],
  ] as const)('lists the loudest tick\'s candidates for a %s reference (cam %s) as %o', (refKind, camChannel, candidates, resolved) => {
    // docs/references.md §5 (common practice): a crank-only reference is 360°-ambiguous; an all-cylinder one also (cylinders/2)-fold.
    const ticks = [
      { cylinder: 1, angleDeg: 404, amplitude: 0.9 },
      { cylinder: 3, angleDeg: 584, amplitude: 0.2 },
    ];
    const { truth } = generateCapture({ drive, seed: 1, ...short, refKind, camChannel, injectorTicks: ticks });
    expect(truth.loudestTick).toMatchObject({ cylinder: 1, slotCylinder: 4, afterTdcDeg: 44, phaseResolved: resolved });
    expect(truth.loudestTick!.candidates).toEqual(candidates);
  });

  it('by default plants one tick per cylinder with one clearly loudest', () => {
    const { truth } = generateCapture({ drive, seed: 11, ...short });
    expect(truth.ticks.map((t) => t.cylinder).sort()).toEqual([1, 2, 3, 4]);
    const amps = truth.ticks.map((t) => t.amplitude).sort((a, b) => b - a);
    expect(amps[0]).toBeGreaterThan(2.5 * amps[1]);
  });
});

describe('bad options', () => {
  it.each([
    [{ fault: { component: 'Nope', fault: 'shaft' } }, /Nope/],
    [{ fault: { component: 'Alternator', fault: 'belt' } }, /belt/],
    [{ wheel: '60x2', refKind: 'wheel' }, /wheel/],
    [{ durationS: 0.1 }, /durationS/],
    [{ refKind: 'wheel', refPerCycle: 4 }, /refPerCycle/],
    [{ injectorTicks: [{ cylinder: 7, angleDeg: 10, amplitude: 1 }] }, /cylinder 7/],
    [{ resonanceHz: 9000, sampleRateHz: 16000 }, /resonanceHz/],
  ] as const)('refuses %o with a RangeError naming it', (bad, message) => {
    expect(() => generateCapture({ drive, seed: 1, ...short, ...(bad as object) })).toThrow(RangeError);
    expect(() => generateCapture({ drive, seed: 1, ...short, ...(bad as object) })).toThrow(message);
  });
});
