import { describe, expect, it } from 'vitest';
import { describeEvent } from '../../../shared/analysis/cycle-view';
import { commonFiringOrder } from '../../../shared/analysis/firing-order';

// Slot i = [i·720/c, (i+1)·720/c) belongs to firingOrder[i]; a crank-only reference is
// 360°-ambiguous, an all-cylinder one (720/c)-ambiguous (docs/references.md §5 [common practice]).
describe('engine-cycle slots and candidates', () => {
  const fo = [1, 3, 4, 2];

  it('220° with a resolved phase is cylinder 3, 40° after its TDC', () => {
    expect(describeEvent(220, fo, true, 720)).toEqual({ angleDeg: 220, cylinder: 3, candidates: [3], afterTdcDeg: 40 });
  });

  it('a crank-only reference gives the two cylinders 360° apart', () => {
    const e = describeEvent(220, fo, false, 360);
    expect(e.cylinder).toBeNull();
    expect(e.candidates.sort()).toEqual([2, 3]);
  });

  it('an all-cylinder reference gives every cylinder', () => {
    expect(describeEvent(220, fo, false, 180).candidates.sort()).toEqual([1, 2, 3, 4]);
  });

  it('knows the common firing orders and numbers other counts in sequence (common practice)', () => {
    expect(commonFiringOrder(4)).toEqual([1, 3, 4, 2]);
    expect(commonFiringOrder(6)).toEqual([1, 5, 3, 6, 2, 4]);
    expect(commonFiringOrder(7)).toEqual([1, 2, 3, 4, 5, 6, 7]);
  });
});
