import { describe, expect, it } from 'vitest';
import { extractReference } from '../../../shared/analysis/reference';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { crankAngle, crankSpeed } from '../../../shared/analysis/crank-speed';
import { crankProfile, meanRpmOf, pulseTrain } from '../../helpers/signals';

const fs = 12_000;
const n = 3 * fs;

// Wasted-spark ignition [common practice; J. B. Heywood, Internal Combustion Engine Fundamentals,
// 1988, from memory]: one coil fires a cylinder pair once per revolution, on compression and on
// exhaust; the exhaust spark needs far less voltage, so its pulse on the lead can be much weaker.
describe('per-rev reference with a weak same-polarity exhaust spark', () => {
  const theta = crankProfile(n, fs, 1500, 3, 1.3, 11);
  const truth = meanRpmOf(theta, fs);
  const speedOf = (ref: Float32Array) => {
    const r = extractReference(ref, fs, resolveSettings({ refKind: 'per-rev' }), null);
    return { r, rpm: crankSpeed(r, crankAngle(r), n / fs).meanRpm };
  };

  it('takes exhaust sparks of 15 % height midway (they were under the trigger: rpm read 50 % low)', () => {
    const { r, rpm } = speedOf(pulseTrain(theta, fs, { pitchDeg: 720, wasted: 0.15, ringing: 0.4, noise: 0.003 }));
    expect(Math.abs(rpm / truth - 1)).toBeLessThan(0.005);
    expect(r.warnings.map((w) => w.code)).toContain('wasted_spark_merged');
  });

  it('reads the speed right when only some exhaust sparks reach the trigger (heights straddling 30 %)', () => {
    // Every third exhaust spark is left out of the strong train: holes of twice the spacing.
    const strong = pulseTrain(theta, fs, { pitchDeg: 720, wasted: 0.4, noise: 0.003 });
    const weakOnly = pulseTrain(theta, fs, { pitchDeg: 2160, offsetDeg: 360, amp: 0.2 });
    const strongMissing = pulseTrain(theta, fs, { pitchDeg: 2160, offsetDeg: 360, amp: 0.4 });
    const ref = Float32Array.from(strong, (v, i) => v - strongMissing[i] + weakOnly[i]);
    const { rpm } = speedOf(ref);
    expect(Math.abs(rpm / truth - 1)).toBeLessThan(0.005);
  });

  it('adds nothing to a clean once-per-revolution train', () => {
    const { r, rpm } = speedOf(pulseTrain(theta, fs, { pitchDeg: 360, ringing: 0.4, noise: 0.003 }));
    expect(Math.abs(rpm / truth - 1)).toBeLessThan(0.005);
    expect(r.warnings.map((w) => w.code)).not.toContain('wasted_spark_merged');
  });
});
