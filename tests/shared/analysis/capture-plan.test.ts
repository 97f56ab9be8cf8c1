import { describe, expect, it } from 'vitest';
import { cycleMs, planCapture, roundUp125 } from '../../../shared/analysis/capture-plan';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';

const base = { idleRpm: 750, heldRpm: 2000, cylinders: 4, highestOrder: 30, envelopeTopHz: AnalysisSettingsSchema.parse({}).envelopeMaxHz, revolutions: 32 };

describe('capture planner', () => {
  it('holds one full engine cycle in a 200 ms window at 600 rpm and more above [common practice; docs/references.md §5]', () => {
    // 720° at 600 rpm = 2 revolutions × 100 ms: exactly the 20 ms/div × 10 div screen.
    expect(cycleMs(600)).toBe(200);
    for (const rpm of [600, 650, 750, 900, 1200, 3000]) expect(cycleMs(rpm)).toBeLessThanOrEqual(200);
    expect(cycleMs(550)).toBeGreaterThan(200);
    const plan = planCapture({ ...base, idleRpm: 600, revolutions: 2 });
    expect(plan.windowS).toBeCloseTo(0.2, 12);
    expect(plan.perDivisionS).toBeCloseTo(0.02, 12);
  });

  it('takes the sample rate from the larger of 2.56 × order × rpm / 60 and 2.5 × the envelope top, rounded up to a recorder rate', () => {
    // Order 30 at 2000 rpm = 1000 Hz → 2560 Hz; envelope 9000 Hz → 22 500 Hz: the envelope decides → 32 kHz.
    const plan = planCapture(base);
    expect(plan.minSampleRateHz).toBe(22500);
    expect(plan.sampleRateHz).toBe(32000);
    // Order 200 at 6000 rpm = 20 kHz → 51 200 Hz decides → 88.2 kHz.
    const high = planCapture({ ...base, highestOrder: 200, heldRpm: 6000 });
    expect(high.minSampleRateHz).toBeCloseTo(51200, 9);
    expect(high.sampleRateHz).toBe(88200);
  });

  it('gives the window, the order resolution and the firing frequency with its reasoning', () => {
    const plan = planCapture(base);
    expect(plan.windowS).toBeCloseTo((32 * 60) / 750, 12); // 2.56 s
    expect(plan.perDivisionS).toBeCloseTo(0.5, 12); // 256 ms/div → 500 ms step
    expect(plan.orderResolution).toBe(1 / 32);
    // Firing frequency = rpm/60 × cylinders/2: 4 cyl at 750 rpm → 25 Hz (docs/references.md §5).
    expect(plan.firingHzAtIdle).toBe(25);
    expect(plan.reasoning.join(' ')).toMatch(/2\.56 samples per period/);
  });

  it('rounds to 1-2-5 scope steps and refuses impossible inputs in plain words', () => {
    expect([0.0013, 0.02, 0.021, 0.256, 0.5].map(roundUp125)).toEqual([0.002, 0.02, 0.05, 0.5, 0.5]);
    expect(() => planCapture({ ...base, heldRpm: 500 })).toThrow(/at least the idle speed/);
    expect(() => planCapture({ ...base, revolutions: 1 })).toThrow(/from 2 \(one engine cycle\)/);
  });
});
