import { describe, expect, it } from 'vitest';
import { combGain, cycleCombGain } from '../../../shared/dsp/comb-gain';

// docs/references.md §3 [derived]: gain |sin(Nπx)/(N sin πx)|; over the 720° cycle x = 2·order taken
// to the nearest integer. A 1:1 pump with 0.5 % creep (order 0.995, x = 0.01) keeps 0.96 at N = 16
// and 0.48 at N = 62; every 0.5-order multiple passes in full.
describe('synchronous-average comb gain (REFERENCES.md §3)', () => {
  it('is 0.96 at N = 16 and 0.48 at N = 62 for order 0.995', () => {
    expect(cycleCombGain(0.995, 16)).toBeCloseTo(0.96, 2);
    expect(cycleCombGain(0.995, 62)).toBeCloseTo(0.48, 2);
    expect(combGain(0.01, 16)).toBeCloseTo(cycleCombGain(0.995, 16), 12);
  });

  it('passes every 0.5-order multiple in full and attenuates a line halfway between', () => {
    for (const o of [0.5, 1, 2.5, 7]) expect(cycleCombGain(o, 40)).toBe(1);
    expect(cycleCombGain(0.75, 40)).toBeLessThan(0.03);
  });
});
