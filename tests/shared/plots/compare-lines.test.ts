import { describe, expect, it } from 'vitest';
import { compareLines } from '../../../shared/plots/compare-lines';
import type { Peak } from '../../../shared/analysis/types';

const p = (order: number, amplitude: number, snrDb = 15): Peak => ({ order, amplitude, snrDb, engineOrder: null, firing: false });

// Level change of a field quantity: 20·log10(B/A) dB (IEC 60027-3); halving the amplitude is −6.02 dB.
describe('condition comparison', () => {
  it('lists a line that appears only with the A/C clutch engaged', () => {
    const d = compareLines([p(2.64, 0.01)], [p(2.64, 0.01), p(4.1, 0.02)], 'orders', 1 / 32);
    expect(d).toEqual([{ spectrum: 'orders', order: 4.1, kind: 'appears', snrA: null, snrB: 15, changeDb: null }]);
  });

  it('lists a line that vanishes with the belt off', () => {
    const d = compareLines([p(2.64, 0.01), p(2, 0.1)], [p(2, 0.1)], 'orders', 1 / 32);
    expect(d.map((x) => [x.order, x.kind])).toEqual([[2.64, 'vanishes']]);
  });

  it('reports a change of more than 6 dB and ignores a smaller one', () => {
    const d = compareLines([p(8, 0.04), p(3, 0.01)], [p(8.01, 0.008), p(3, 0.006)], 'envelope', 1 / 32);
    expect(d.length).toBe(1);
    expect(d[0]!.kind).toBe('quieter');
    expect(d[0]!.changeDb).toBeCloseTo(20 * Math.log10(0.2), 9);
  });

  it('does not pair lines further apart than the tolerance', () => {
    const d = compareLines([p(5, 0.01)], [p(5.2, 0.01)], 'orders', 1 / 32);
    expect(d.map((x) => x.kind)).toEqual(['vanishes', 'appears']);
  });
});
