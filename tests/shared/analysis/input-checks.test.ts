import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';
import { AnalysisInputError } from '../../../shared/analysis/analysis-input-error';
import { crankProfile, pulseTrain } from '../../helpers/signals';

const fs = 12_000;
const n = 3 * fs;

// Four-stroke rules [common practice; J. B. Heywood, Internal Combustion Engine Fundamentals, 1988,
// from memory]: the firing order is cylinders/2 per revolution, and every order read off a reference
// scales by (pulses per cycle assumed / pulses per cycle on the wire).
describe('pipeline input checks found by the variety sweep', () => {
  const theta = crankProfile(n, fs, 2500, 0);
  const ref = pulseTrain(theta, fs, { pitchDeg: 720 });
  const pickup = Float32Array.from({ length: n }, (_, i) => Math.cos((2 * Math.PI * 2 * theta[i]) / 360));
  const cam = pulseTrain(theta, fs, { pitchDeg: 720, offsetDeg: 300 });

  it('refuses one channel named for two roles (reference and pickup, or cam and reference)', () => {
    const run = (s: Parameters<typeof resolveSettings>[0]) => () => runPipeline({ channels: [ref, pickup, cam], sampleRateHz: fs }, resolveSettings(s));
    expect(run({ refChannel: 1, pickupChannel: 1 })).toThrow(AnalysisInputError);
    expect(run({ refChannel: 1, pickupChannel: 1 })).toThrow(/--ref-channel and --pickup-channel both name channel 1/);
    expect(run({ refChannel: 1, pickupChannel: 2, camChannel: 2 })).toThrow(/--pickup-channel and --cam-channel both name channel 2/);
    let caught: unknown = null;
    try { run({ refChannel: 2, pickupChannel: 2 })(); } catch (e) { caught = e; }
    expect((caught as AnalysisInputError | null)?.code).toBe('channel_conflict');
  });

  it('a reference channel of noise only says how far its pulses stand above the noise', () => {
    const noise = Float32Array.from({ length: n }, (_, i) => Math.sin(i * 12.9898) * 43758.5453 % 1);
    let caught: unknown = null;
    try { runPipeline({ channels: [noise, pickup], sampleRateHz: fs }, resolveSettings({})); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(AnalysisInputError);
    expect((caught as AnalysisInputError).code).toBe('no_reference');
    expect((caught as Error).message).toMatch(/channel 1 stand only \d\.\d× above its noise/);
  });

  it('warns when a reference told 8 pulses per cycle carries 1 (firing line at 8× the firing order)', () => {
    const wrong = runPipeline({ channels: [ref, pickup], sampleRateHz: fs }, resolveSettings({ cylinders: 4, refPerCycle: 8, firingOrder: [1, 3, 4, 2] }));
    expect(wrong.orders.peaks[0].engineOrder).toBe(16);
    const mismatch = wrong.warnings.find((w) => w.code === 'firing_order_mismatch');
    expect(mismatch?.message).toMatch(/8 times the firing order 2/);
    const right = runPipeline({ channels: [ref, pickup], sampleRateHz: fs }, resolveSettings({ cylinders: 4, refKind: 'cyl1', firingOrder: [1, 3, 4, 2] }));
    expect(right.warnings.map((w) => w.code)).not.toContain('firing_order_mismatch');
  });
});
