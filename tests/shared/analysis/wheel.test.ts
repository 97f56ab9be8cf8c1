import { describe, expect, it } from 'vitest';
import { wheelAngles } from '../../../shared/analysis/wheel';
import { extractReference } from '../../../shared/analysis/reference';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { crankAngle, crankSpeed } from '../../../shared/analysis/crank-speed';
import { wheelSignal } from '../../helpers/signals';

// Trigger wheels [common practice, docs/references.md §5]: an "N-M" wheel has N tooth positions on a
// 360/N° pitch with M teeth missing; the gap spans M + 1 pitches and marks the same angle on every
// revolution.

/** Edge times (samples) of the teeth of `revs` revolutions; `pitchSamples(q)` = duration of pitch q. */
function wheelTimes(teeth: number, missing: number, revs: number, pitchSamples: (q: number) => number, drop: Set<number>) {
  const times: number[] = [];
  const positions: number[] = [];
  let t = 1000;
  for (let q = 0; q < revs * teeth; q++) {
    if (q % teeth < teeth - missing && !drop.has(q)) { times.push(t); positions.push(q); }
    t += pitchSamples(q);
  }
  return { times, positions };
}

describe('trigger-wheel gaps and angles', () => {
  it('36-1: a missed tooth before the first gap is not taken for the gap (it locked every later gap out)', () => {
    const { times, positions } = wheelTimes(36, 1, 10, () => 100, new Set([5]));
    const w = wheelAngles(times, 36, 1);
    expect(w.gaps).toBe(9);
    expect(w.repaired).toBe(1);
    expect(w.warnings.map((x) => x.code)).not.toContain('wheel_count');
    // Angle 0 is the first tooth after the first real gap (position 36).
    positions.forEach((q, i) => expect(w.anglesDeg[i]).toBeCloseTo((q - 36) * 10, 9));
  });

  it('60-2: a revolution that miscounts its missed teeth does not shift the angle of later revolutions', () => {
    // Revolution 4 slows by a quarter over ten pitches while three teeth are missed there: the run
    // spans 5.0 median pitches and is counted as 5 instead of 4.
    const slow = (q: number) => (q >= 4 * 60 + 20 && q < 4 * 60 + 30 ? 125 : 100);
    const { times, positions } = wheelTimes(60, 2, 10, slow, new Set([4 * 60 + 22, 4 * 60 + 23, 4 * 60 + 24]));
    const w = wheelAngles(times, 60, 2);
    expect(w.gaps).toBe(9);
    expect(w.warnings.map((x) => x.code)).toContain('wheel_count');
    positions.forEach((q, i) => {
      if (q >= 5 * 60) expect(w.anglesDeg[i]).toBeCloseTo((q - 60) * 6, 9);
    });
  });

  it('teeth only a few samples apart: the warning names the sample rate instead of the wheel', () => {
    // Every fourth tooth lost, as when 3.5 kHz teeth are sampled at 10 kHz.
    const { times } = wheelTimes(60, 2, 10, () => 2.9, new Set(Array.from({ length: 150 }, (_, k) => 4 * k + 61)));
    const w = wheelAngles(times, 60, 2, 10_000);
    const warning = w.warnings.find((x) => x.code === 'reference_undersampled');
    expect(warning?.message).toMatch(/2\.9 samples apart/);
    expect(warning?.message).toMatch(/at least 21 kHz/);
  });
});

describe('variable-reluctance wheel over a run-up (sensor voltage grows with speed)', () => {
  it('finds every tooth from 600 to 4200 rpm though the slow teeth are a seventh of the fast ones', () => {
    const fs = 24_000;
    const n = 3 * fs;
    const f0 = 600 / 60, f1 = 4200 / 60, T = n / fs;
    const theta = Float64Array.from({ length: n }, (_, i) => { const t = i / fs; return 360 * (f0 * t + ((f1 - f0) * t * t) / (2 * T)); });
    const square = wheelSignal(theta, 36, 1, 0);
    const ref = Float32Array.from(square, (v, i) => (v * (f0 + ((f1 - f0) * i) / n)) / f1);
    let rises = 0;
    for (let i = 1; i < n; i++) if (square[i] > 0.5 && square[i - 1] <= 0.5) rises++;
    const r = extractReference(ref, fs, resolveSettings({ refKind: 'wheel', wheel: '36-1' }), null);
    expect(r.repairedEdges).toBe(0);
    expect(Math.abs(r.edges - rises)).toBeLessThanOrEqual(1);
    const firstS = r.timesS[0], lastS = r.timesS[r.timesS.length - 1];
    // Speed over the edges' own span against θ(t) over the same span.
    const at = (s: number) => 360 * (f0 * s + ((f1 - f0) * s * s) / (2 * T));
    const spanRpm = (60 * (at(lastS) - at(firstS))) / 360 / (lastS - firstS);
    expect(Math.abs(crankSpeed(r, crankAngle(r), T).meanRpm / spanRpm - 1)).toBeLessThan(0.001);
    expect(firstS).toBeLessThan(0.2);
  });
});
