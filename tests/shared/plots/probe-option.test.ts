import { describe, expect, it } from 'vitest';
import { probeComparison } from '../../../shared/plots/probe-option';
import { alternatorFinding } from '../../helpers/report-case';

describe('probe-point comparison', () => {
  const finding = alternatorFinding(0.008);
  finding.captures.push({ captureId: 8, phase: 'before', probePoint: 'water pump housing', score: 0.3, strongestSnrDb: 8, lines: [{ ...finding.captures[0]!.lines[0]!, amplitude: 0.01 }] });

  it('compares in the shared unit when every pickup uses it', () => {
    const c = probeComparison([finding], [
      { captureId: 7, probePoint: 'alternator', unit: 'g', orderPeaks: [] },
      { captureId: 8, probePoint: 'water pump', unit: 'g', orderPeaks: [] },
    ]);
    expect(c.mode).toBe('absolute');
    expect(c.suspects[0]!.values).toEqual([0.04, 0.01]);
    expect(c.note).toContain('in g');
  });

  it('compares in dB relative to each capture’s firing-order line when units differ', () => {
    const firing = (amplitude: number) => ({ order: 2, amplitude, snrDb: 30, engineOrder: 2, firing: true });
    const c = probeComparison([finding], [
      { captureId: 7, probePoint: 'alternator', unit: 'g', orderPeaks: [firing(0.4)] },
      { captureId: 8, probePoint: 'water pump', unit: 'V', orderPeaks: [firing(1)] },
    ]);
    expect(c.mode).toBe('relative');
    expect(c.suspects[0]!.values[0]).toBeCloseTo(20 * Math.log10(0.04 / 0.4), 9);
    expect(c.suspects[0]!.values[1]).toBeCloseTo(20 * Math.log10(0.01 / 1), 9);
    expect(c.note).toMatch(/firing-order line/);
  });
});
