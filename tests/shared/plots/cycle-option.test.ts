import { describe, expect, it } from 'vitest';
import { cycleEventText, cycleOption, cycleSlots, eventAngles } from '../../../shared/plots/cycle-option';

// A four-stroke engine fires every cylinder once per 720° of crank; with n cylinders evenly
// spaced, firings are 720/n apart in firing order (e.g. Heywood, Internal Combustion Engine
// Fundamentals, ch. 1: an I4 fires every 180°).
describe('engine cycle slots', () => {
  it('puts an I4 with firing order 1-3-4-2 at 0, 180, 360 and 540°', () => {
    expect(cycleSlots([1, 3, 4, 2])).toEqual([
      { cylinder: 1, startDeg: 0, endDeg: 180 },
      { cylinder: 3, startDeg: 180, endDeg: 360 },
      { cylinder: 4, startDeg: 360, endDeg: 540 },
      { cylinder: 2, startDeg: 540, endDeg: 720 },
    ]);
  });

  it('spaces a V6 (1-2-3-4-5-6) every 120°', () => {
    expect(cycleSlots([1, 2, 3, 4, 5, 6]).map((s) => s.startDeg)).toEqual([0, 120, 240, 360, 480, 600]);
  });
});

describe('the located event', () => {
  const event = { angleDeg: 220, cylinder: 3, candidates: [3, 2], afterTdcDeg: 40 };

  it('says the slot and degrees after TDC when the phase is resolved', () => {
    expect(cycleEventText(event, true)).toBe("In cylinder 3's firing slot, 40° after its TDC.");
    expect(eventAngles(event, [1, 3, 4, 2], true)).toEqual([{ cylinder: 3, angleDeg: 220 }]);
  });

  it('shows every candidate slot and how to resolve it when the phase is not resolved', () => {
    // A once-per-revolution reference cannot tell 220° from 220 + 360 = 580°: cylinder 2's slot.
    expect(eventAngles(event, [1, 3, 4, 2], false)).toEqual([{ cylinder: 3, angleDeg: 220 }, { cylinder: 2, angleDeg: 580 }]);
    const text = cycleEventText(event, false);
    expect(text).toContain('cylinder 3 or 2');
    expect(text).toMatch(/cylinder-1 reference|cam reference/);
  });

  it('draws each slot label and the event marker', () => {
    const option = cycleOption({ averageDeg: new Float32Array(720), rmsDeg: new Float32Array(720), firingOrder: [1, 3, 4, 2], phaseResolved: true, event, unit: 'g' });
    const series = option.series as { markArea?: { data: { name?: string }[][] }; markLine?: { data: { xAxis: number }[] } }[];
    expect(series[0]!.markArea!.data.map((d) => d[0]!.name)).toEqual(['Cyl 1', 'Cyl 3', 'Cyl 4', 'Cyl 2']);
    expect(series[0]!.markLine!.data.map((d) => d.xAxis)).toEqual([220]);
  });
});
