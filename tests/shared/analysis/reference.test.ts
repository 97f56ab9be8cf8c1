import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { extractReference } from '../../../shared/analysis/reference';
import { fillHolesFromOther } from '../../../shared/analysis/reference-edges';
import { type AnalysisSettingsInput } from '../../../shared/schemas/analysis-settings';
import { crankProfile, gaussian, meanRpmOf, pulseTrain, wheelSignal } from '../../helpers/signals';
import { crankAngle, crankSpeed } from '../../../shared/analysis/crank-speed';

const fs = 20_000;
const n = 4 * fs;

function speedOf(ref: Float32Array, settings: AnalysisSettingsInput) {
  const s = resolveSettings(settings);
  const r = extractReference(ref, fs, s, null);
  return { ref: r, speed: crankSpeed(r, crankAngle(r), n / fs) };
}

// Four-stroke rules [common practice; J. B. Heywood, Internal Combustion Engine Fundamentals, 1988,
// from memory]: 720° per cycle; a cylinder-1 coil fires once per 720°, a wasted-spark coil once per
// revolution (the exhaust-stroke spark weaker, maybe of the other polarity), a distributor lead
// cylinders/2 per revolution; trigger wheels 60-2 and 36-1 (docs/references.md §5).
describe('reference edges and crank speed, ±5 % speed wander', () => {
  const theta = crankProfile(n, fs, 840, 5, 1.7, 30);
  const truth = meanRpmOf(theta, fs);
  const within = (rpm: number) => expect(Math.abs(rpm - truth) / truth).toBeLessThan(0.005);

  it('cyl1: ignition ringing and a weak same-polarity wasted spark are not counted', () => {
    const ref = pulseTrain(theta, fs, { pitchDeg: 720, ringing: 0.6, wasted: 0.4, noise: 0.01 });
    const { ref: r, speed } = speedOf(ref, { refKind: 'cyl1' });
    within(speed.meanRpm);
    expect(r.repairedEdges).toBe(0);
    expect(r.phaseResolved).toBe(true);
  });

  it('per-rev: a weak spark of the other polarity midway is merged, not lost', () => {
    const ref = pulseTrain(theta, fs, { pitchDeg: 720, wasted: -0.35, ringing: 0.3, noise: 0.01 });
    const { ref: r, speed } = speedOf(ref, { refKind: 'per-rev' });
    within(speed.meanRpm);
    expect(r.warnings.map((w) => w.code)).toContain('wasted_spark_merged');
    expect(r.phaseResolved).toBe(false);
    expect(r.ambiguityDeg).toBe(360);
  });

  it('per-rev: weak sparks mostly seen on the chosen polarity, a few only on the other one, fill their holes', () => {
    // Strong compression sparks rise to 1 then ring to −0.7; the weak exhaust sparks fall to −0.5 and
    // ring up to +0.35 (above the 0.3 threshold), except every fifth, which rings only to +0.2.
    const ref = new Float32Array(n);
    const pitch = fs / 14; // 840 rpm
    for (let p = 1; p * pitch + 40 < n; p++) {
      const i = Math.round(p * pitch);
      const weak = p % 2 === 1;
      const [a, b] = weak ? [-0.5, (p - 1) % 10 === 0 ? 0.2 : 0.35] : [1, -0.7];
      for (let k = 0; k < 8; k++) { ref[i + k] += a; ref[i + 12 + k] += b; }
    }
    const { ref: r, speed } = speedOf(ref, { refKind: 'per-rev' });
    expect(Math.abs(speed.meanRpm - 840) / 840).toBeLessThan(0.005);
    expect(r.repairedEdges).toBe(0);
    expect(r.warnings.map((w) => w.code)).toContain('wasted_spark_merged');
  });

  it('fillHolesFromOther fills only intervals of about twice the spacing, from a pulse near their middle', () => {
    const filled = fillHolesFromOther([0, 100, 300, 400, 500, 700], [100.5, 199, 250, 600.2, 650]);
    expect(filled.times).toEqual([0, 100, 199, 300, 400, 500, 600.2, 700]);
    expect(filled.added).toBe(2);
    expect(fillHolesFromOther([0, 100, 200, 300], [50, 150]).added).toBe(0);
  });

  it('per-cylinder (4 cylinders, 180° apart), falling polarity', () => {
    const ref = pulseTrain(theta, fs, { pitchDeg: 180, polarity: -1, noise: 0.01 });
    within(speedOf(ref, { refKind: 'per-cylinder', cylinders: 4 }).speed.meanRpm);
  });

  it('--ref-per-cycle 3 (N evenly spaced pulses per cycle)', () => {
    const ref = pulseTrain(theta, fs, { pitchDeg: 240, noise: 0.01 });
    within(speedOf(ref, { refPerCycle: 3 }).speed.meanRpm);
  });

  for (const [pattern, teeth, missing] of [['60-2', 60, 2], ['36-1', 36, 1]] as const) {
    it(`wheel ${pattern}: the gap is counted as its missing pitches, never as missed teeth`, () => {
      const ref = wheelSignal(theta, teeth, missing, 17);
      const { ref: r, speed } = speedOf(ref, { refKind: 'wheel', wheel: pattern });
      within(speed.meanRpm);
      expect(r.repairedEdges).toBe(0);
      const revs = (theta[n - 1] - theta[0]) / 360;
      expect(r.gaps).toBeGreaterThanOrEqual(Math.floor(revs) - 1);
      expect(r.gaps).toBeLessThanOrEqual(Math.ceil(revs));
      // Every tooth sits on its pitch: angles are multiples of 360/teeth.
      for (const a of r.anglesDeg) expect(Math.abs(a / (360 / teeth) - Math.round(a / (360 / teeth)))).toBeLessThan(1e-9);
    });
  }

  it('repairs a single missed pulse and removes a single glitch', () => {
    const ref = pulseTrain(theta, fs, { pitchDeg: 360, skip: [9], noise: 0.01 });
    const glitchAt = Math.round(2.158 * fs); // midway between two pulses, past the debounce
    ref[glitchAt] = 1.2;
    ref[glitchAt + 1] = 1.1;
    const { ref: r, speed } = speedOf(ref, { refKind: 'per-rev' });
    within(speed.meanRpm);
    expect(r.repairedEdges).toBe(2);
  });

  it('refuses a reference channel with no pulses (exit-2 error with a code)', () => {
    const flat = Float32Array.from(gaussian(n, 2), (v) => 0.01 * v);
    expect(() => speedOf(flat, {})).toThrow(expect.objectContaining({ code: 'no_reference' }));
  });
});

describe('firing order line (common practice; Heywood 1988, from memory)', () => {
  for (const [cylinders, firingHz] of [[4, 25], [6, 37.5]] as const) {
    it(`${cylinders} cylinders at 750 rpm: firing frequency ${firingHz} Hz is order ${cylinders / 2}, flagged as firing`, () => {
      const theta = crankProfile(n, fs, 750, 0);
      const ref = pulseTrain(theta, fs, { pitchDeg: 720 });
      const noise = gaussian(n, 7);
      const pickup = Float32Array.from({ length: n }, (_, i) => Math.cos((2 * Math.PI * firingHz * i) / fs) + 0.05 * noise[i]);
      const r = runPipeline({ channels: [ref, pickup], sampleRateHz: fs }, resolveSettings({ cylinders, refKind: 'cyl1' }));
      expect(r.orders.peaks[0].order).toBeCloseTo(cylinders / 2, 2);
      expect(r.orders.peaks[0].engineOrder).toBe(cylinders / 2);
      expect(r.orders.peaks[0].firing).toBe(true);
      expect(r.orders.peaks[0].amplitude).toBeCloseTo(1, 1);
      expect(r.warnings.map((w) => w.code)).toContain('firing_order_assumed');
    });
  }

  it('warns when the strongest engine line sits at twice the firing order (pulse count wrong)', () => {
    const theta = crankProfile(n, fs, 750, 0);
    const ref = pulseTrain(theta, fs, { pitchDeg: 720 });
    const pickup = Float32Array.from({ length: n }, (_, i) => Math.cos((2 * Math.PI * 2 * theta[i]) / 360));
    // Told "per-rev", the pipeline sees half the speed: order 2 reads as order 4 = 2 × firing.
    const r = runPipeline({ channels: [ref, pickup], sampleRateHz: fs }, resolveSettings({ cylinders: 4, refKind: 'per-rev', firingOrder: [1, 3, 4, 2] }));
    expect(r.warnings.map((w) => w.code)).toContain('firing_order_mismatch');
  });
});
