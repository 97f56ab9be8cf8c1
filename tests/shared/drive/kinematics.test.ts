import { describe, expect, it } from 'vitest';
import { beltPassOrder, beltSpeedMs, beltStages, speedRatio, turnsBackwards } from '../../../shared/drive/kinematics';
import type { DriveDocument } from '../../../shared/drive/types';

const twoBelts: DriveDocument = {
  name: 'Test V6', cylinders: 6, firingOrder: [1, 2, 3, 4, 5, 6], idleRpm: 700,
  belts: [
    { name: 'Main', lengthMm: 1900, driver: 'Crankshaft', driverPulleyMm: 160 },
    { name: 'Second', lengthMm: 900, driver: 'Water pump', driverPulleyMm: 100 },
  ],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    { name: 'Water pump', kind: 'water_pump', belt: 'Main', pulleyMm: 128 },
    { name: 'Idler', kind: 'idler', belt: 'Main', pulleyMm: 80, backside: true },
    { name: 'A/C compressor', kind: 'ac_compressor', belt: 'Second', pulleyMm: 110 },
    { name: 'Vacuum pump', kind: 'vacuum_pump', fixedRatio: 0.5 },
  ],
};

describe('speed ratios along belt chains', () => {
  // Ratio = driver effective diameter / driven effective diameter (docs/references.md §5, [published, secondary]).
  it('divides driver by driven diameter on the crank belt', () => {
    expect(speedRatio(twoBelts, 'Water pump')).toBeCloseTo(160 / 128, 12);
    expect(speedRatio(twoBelts, 'crankshaft')).toBe(1);
  });

  it('multiplies the ratios along a chain of belts', () => {
    expect(speedRatio(twoBelts, 'A/C compressor')).toBeCloseTo((160 / 128) * (100 / 110), 12);
    expect(beltStages(twoBelts, 'A/C compressor')).toBe(2);
    expect(beltStages(twoBelts, 'Vacuum pump')).toBe(0);
  });

  it('uses a fixed ratio as given', () => {
    expect(speedRatio(twoBelts, 'Vacuum pump')).toBe(0.5);
  });

  it('keeps the ratio magnitude of a backside pulley and says it turns the other way', () => {
    expect(speedRatio(twoBelts, 'Idler')).toBeCloseTo(2, 12);
    expect(turnsBackwards(twoBelts, 'Idler')).toBe(true);
    expect(turnsBackwards(twoBelts, 'Water pump')).toBe(false);
  });

  // docs/references.md §5 [derived]: 1 mm per side on a 56 mm pulley moves the ratio by about 2 % (160/56 = 2.857 vs 162/58 = 2.793).
  it('shows why effective diameters matter', () => {
    const doc = (driver: number, driven: number): DriveDocument => ({ ...twoBelts, belts: [{ ...twoBelts.belts[0], driverPulleyMm: driver }], components: [twoBelts.components[0], { name: 'Alt', kind: 'alternator', belt: 'Main', pulleyMm: driven }] });
    const a = speedRatio(doc(160, 56), 'Alt');
    const b = speedRatio(doc(162, 58), 'Alt');
    expect(a).toBeCloseTo(2.857, 3);
    expect(b).toBeCloseTo(2.793, 3);
    expect((a - b) / a).toBeGreaterThan(0.02);
  });

  it('refuses an unknown name with a RangeError that names it', () => {
    expect(() => speedRatio(twoBelts, 'Fan')).toThrow(/"Fan"/);
    expect(() => beltPassOrder(twoBelts, 'Timing')).toThrow(RangeError);
  });
});

describe('belt speed and belt-pass order', () => {
  // docs/references.md §5 [derived]: D 160 mm, 750 rpm, L 1900 mm → v 6.2832 m/s, 3.3069 Hz, order 0.26456.
  it('reproduces the worked example', () => {
    const v = beltSpeedMs(twoBelts, 'Main', 750);
    expect(v).toBeCloseTo(6.2832, 4);
    expect(v / 1.9).toBeCloseTo(3.3069, 4);
    expect(beltPassOrder(twoBelts, 'Main')).toBeCloseTo(0.26456, 5);
  });

  it('drives a second belt at its driver part\'s speed and groove', () => {
    const pumpRatio = 160 / 128;
    expect(beltSpeedMs(twoBelts, 'Second', 600)).toBeCloseTo(Math.PI * 0.1 * (600 / 60) * pumpRatio, 10);
    expect(beltPassOrder(twoBelts, 'Second')).toBeCloseTo((Math.PI * 100 * pumpRatio) / 900, 12);
  });

  it('refuses a negative speed', () => {
    expect(() => beltSpeedMs(twoBelts, 'Main', -1)).toThrow(/-1/);
  });
});
