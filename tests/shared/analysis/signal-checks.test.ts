// Signal-tier checks (issue 19 item 6): a flat or clipped-flat pickup and a reference implying an
// impossible speed stop the analysis with a stable code instead of producing plausible-looking spectra.
import { describe, expect, it } from 'vitest';
import { AnalysisInputError } from '../../../shared/analysis/analysis-input-error';
import { checkPickupNotFlat, checkSpeedPlausible } from '../../../shared/analysis/signal-checks';

function codeOf(run: () => void): string | null {
  try {
    run();
    return null;
  } catch (error) {
    if (error instanceof AnalysisInputError) return error.code;
    throw error;
  }
}

describe('checkPickupNotFlat', () => {
  it('refuses a constant channel and one clipped at a rail for most of its samples', () => {
    expect(codeOf(() => checkPickupNotFlat(new Float32Array(1000).fill(1), 2))).toBe('flat_channel');
    expect(codeOf(() => checkPickupNotFlat(new Float32Array(1000), 2))).toBe('flat_channel');
    // A sine driven far past the input range: about 90 % of samples sit at ±1, half of them at +1.
    const clipped = Float32Array.from({ length: 4000 }, (_, i) => Math.max(-1, Math.min(1, 20 * Math.sin(i / 10))));
    expect(codeOf(() => checkPickupNotFlat(clipped, 3))).toBe('flat_channel');
  });

  it('accepts a sine, a quiet coarse-quantised signal and a signal that touches its peak now and then', () => {
    expect(codeOf(() => checkPickupNotFlat(Float32Array.from({ length: 4000 }, (_, i) => Math.sin(i / 10)), 2))).toBeNull();
    // Three 8-bit steps of a quiet signal: each level holds about a third of the samples.
    expect(codeOf(() => checkPickupNotFlat(Float32Array.from({ length: 3000 }, (_, i) => ((i % 3) - 1) / 128), 2))).toBeNull();
    const lightlyClipped = Float32Array.from({ length: 4000 }, (_, i) => Math.max(-1, Math.min(1, 1.2 * Math.sin(i / 10))));
    expect(codeOf(() => checkPickupNotFlat(lightlyClipped, 2))).toBeNull();
  });
});

describe('checkSpeedPlausible', () => {
  it('stops far outside the range and lets the edges through (those stay a warning)', () => {
    expect(codeOf(() => checkSpeedPlausible(15_000, 300, 8000))).toBe('speed_implausible');
    expect(codeOf(() => checkSpeedPlausible(100, 300, 8000))).toBe('speed_implausible');
    expect(codeOf(() => checkSpeedPlausible(9000, 300, 8000))).toBeNull();
    expect(codeOf(() => checkSpeedPlausible(250, 300, 8000))).toBeNull();
    expect(codeOf(() => checkSpeedPlausible(750, 300, 8000))).toBeNull();
  });
});
