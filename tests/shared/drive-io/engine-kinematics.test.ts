import { describe, expect, it } from 'vitest';
import { BUILT_IN_BEARINGS } from '../../../shared/drive/bearing-table';
import { computeEngine } from '../../../shared/drive-io/engine-kinematics';
import { DEMO_DIESEL_I4, DEMO_I4, DEMO_V6 } from '../../../server/db/seeders/demo-engines';

const shopTable = BUILT_IN_BEARINGS.filter((b) => b.source === 'published');

describe('computeEngine (the columns beside each row of the drive table)', () => {
  it('gives a 6203 idler the CWRU published defect factors times its ratio', () => {
    // CWRU Bearing Data Center, fan-end 6203: BPFO 3.0530, BPFI 4.9469, rolling element (2×BSF) 3.9874 per
    // turn of the ring (docs/references.md §1, published; table rounds in the 4th decimal → relative 1e-3).
    const c = computeEngine(DEMO_I4, shopTable).components.find((x) => x.component === 'Upper idler')!;
    const ratio = 148 / 70;
    expect(c.ratio).toBeCloseTo(ratio, 12);
    expect(c.orders.bpfo! / (ratio * 3.053)).toBeCloseTo(1, 3);
    expect(c.orders.bpfi! / (ratio * 4.9469)).toBeCloseTo(1, 3);
    expect(c.orders.ball! / (ratio * 3.9874)).toBeCloseTo(1, 3);
    expect(c.basis).toBe('designation');
    expect(c.rotatingRing).toBe('outer');
  });

  it('marks the backside idler as turning backwards and the others forwards', () => {
    const comps = computeEngine(DEMO_I4, shopTable).components;
    expect(comps.filter((c) => c.backwards).map((c) => c.component)).toEqual(['Upper idler']);
  });

  it('computes belt speed at idle for each belt, and none for a fixed-ratio part', () => {
    const v6 = computeEngine(DEMO_V6, shopTable);
    // v = π·D·n: 0.150 m × π × 680/60 rev/s on the A/C belt [docs/references.md §5, derived].
    expect(v6.belts.find((b) => b.belt === 'A/C belt')!.speedMs).toBeCloseTo(Math.PI * 0.15 * (680 / 60), 9);
    const diesel = computeEngine(DEMO_DIESEL_I4, shopTable);
    const vac = diesel.components.find((c) => c.component === 'Vacuum pump')!;
    expect(vac.ratio).toBe(0.5);
    expect(vac.beltSpeedMs).toBeNull();
  });

  it('falls back to the stated rule of thumb for a part without a bearing and says so', () => {
    const doc = { ...DEMO_I4, components: [...DEMO_I4.components.slice(0, 1), { name: 'Mystery', kind: 'other' as const, belt: 'Main', pulleyMm: 100 }] };
    const c = computeEngine(doc, shopTable).components[1];
    expect(c.approximate).toBe(true);
    expect(c.basis).toBe('rule-of-thumb');
  });
});
