import { describe, expect, it } from 'vitest';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { DriveDocument } from '../../../shared/drive/types';
import { engineOrders, linesOf, nearestCandidate, strongestUnexplained } from '../../../shared/plots/candidates';
import type { Peak } from '../../../shared/analysis/types';

// A belt drive: ratio = driver pitch diameter / driven pitch diameter (the belt-drive kinematics of
// any machine-design text, e.g. Shigley's Mechanical Engineering Design, flexible elements).
const drive: DriveDocument = {
  name: 'Plot test I4', cylinders: 4, firingOrder: [1, 3, 4, 2],
  belts: [{ name: 'Main', lengthMm: 1480, driver: 'Crankshaft', driverPulleyMm: 148 }],
  components: [
    { name: 'Crankshaft', kind: 'crankshaft' },
    { name: 'Alternator', kind: 'alternator', belt: 'Main', pulleyMm: 56, bearing: { designation: '6203', rotatingRing: 'inner' } },
    { name: 'Water pump', kind: 'water_pump', belt: 'Main', pulleyMm: 110, bearing: { designation: '6203', rotatingRing: 'inner' } },
  ],
} as DriveDocument;

const peak = (order: number, snrDb: number, engineOrder: number | null = null): Peak => ({ order, amplitude: 1, snrDb, engineOrder, firing: false });

describe('nearest candidate on hover', () => {
  const lines = linesOf(candidateLines(drive), 'orders');

  it('names the alternator shaft line for an order just under 148/56 and gives the distance in %', () => {
    const near = nearestCandidate(2.61, lines);
    expect(near?.component).toBe('Alternator');
    expect(near?.line.label).toBe('shaft 1x');
    // 100 * (2.61 - 148/56) / (148/56) = -1.243 %
    expect(near?.distancePct).toBeCloseTo((100 * (2.61 - 148 / 56)) / (148 / 56), 6);
    expect(near?.inWindow).toBe(true);
  });

  it('says an order far from any line lies outside its nearest window', () => {
    const near = nearestCandidate(4.0, lines);
    expect(near?.inWindow).toBe(false);
  });

  it('returns null with no candidates', () => {
    expect(nearestCandidate(2, [])).toBeNull();
  });
});

describe('strongest line that fits no part', () => {
  const lines = linesOf(candidateLines(drive), 'orders');

  it('calls out a strong line at order 6.31 that no part of this engine explains', () => {
    const out = strongestUnexplained([peak(2.63, 12), peak(6.31, 25)], lines, 1 / 32);
    expect(out?.order).toBeCloseTo(6.31);
    expect(out?.message).toBe('Strongest line, order 6.31, fits no part of this engine — check the engine chosen or the pulley table.');
  });

  it('stays silent when the strongest line is the alternator shaft line', () => {
    expect(strongestUnexplained([peak(2.63, 30), peak(6.31, 20)], lines, 1 / 32)).toBeNull();
  });

  it('stays silent when the strongest line is an engine order (the engine itself)', () => {
    expect(strongestUnexplained([peak(2, 40, 2), peak(6.31, 12)], lines, 1 / 32)).toBeNull();
  });

  it('stays silent when nothing stands 10 dB over the floor', () => {
    expect(strongestUnexplained([peak(6.31, 8)], lines, 1 / 32)).toBeNull();
  });
});

describe('engine orders', () => {
  it('marks multiples of cylinders/2 as firing orders (4 cylinders fire twice per revolution)', () => {
    const orders = engineOrders(4, 4);
    expect(orders.map((o) => o.order)).toEqual([0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4]);
    expect(orders.filter((o) => o.firing).map((o) => o.order)).toEqual([2, 4]);
  });

  it('gives a V6 its firing order at 3', () => {
    expect(engineOrders(6, 6).filter((o) => o.firing).map((o) => o.order)).toEqual([3, 6]);
  });
});
