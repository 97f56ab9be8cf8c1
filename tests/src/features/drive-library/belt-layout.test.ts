import { describe, expect, it } from 'vitest';
import { DEMO_DIESEL_I4, DEMO_I4, DEMO_V6 } from '../../../../server/db/seeders/demo-engines';
import { layoutDrive, tangent } from '../../../../src/features/drive-library/lib/belt-layout';

/** Distance from point p to the line through a and b. */
function distance(p: { x: number; y: number }, a: { x: number; y: number }, b: { x: number; y: number }) {
  return Math.abs((b.x - a.x) * (a.y - p.y) - (a.x - p.x) * (b.y - a.y)) / Math.hypot(b.x - a.x, b.y - a.y);
}

describe('belt layout', () => {
  it('draws each span tangent to both pulleys, for outer and crossed (backside) tangents', () => {
    const a = { x: 0, y: 0, rho: 50 };
    for (const b of [{ x: 300, y: 40, rho: 30 }, { x: 200, y: -120, rho: -35 }]) {
      const [p, q] = tangent(a, b)!;
      expect(distance(a, p, q)).toBeCloseTo(Math.abs(a.rho), 9);
      expect(distance(b, p, q)).toBeCloseTo(Math.abs(b.rho), 9);
      // The tangent points lie on the circles.
      expect(Math.hypot(p.x - a.x, p.y - a.y)).toBeCloseTo(Math.abs(a.rho), 9);
      expect(Math.hypot(q.x - b.x, q.y - b.y)).toBeCloseTo(Math.abs(b.rho), 9);
    }
    expect(tangent({ x: 0, y: 0, rho: 50 }, { x: 10, y: 0, rho: -50 })).toBeNull();
  });

  it('gives every belt its pulleys, sized by effective diameter, with the backside one marked', () => {
    const layout = layoutDrive(DEMO_I4);
    expect(layout.belts).toHaveLength(1);
    const main = layout.belts[0];
    expect(main.pulleys.map((p) => p.component)).toEqual(['Crankshaft', ...DEMO_I4.components.slice(1).map((c) => c.name)]);
    expect(main.pulleys[0].r).toBe(74);
    expect(main.pulleys.find((p) => p.component === 'Alternator')!.r).toBe(28);
    expect(main.pulleys.filter((p) => p.backside).map((p) => p.component)).toEqual(['Upper idler']);
    expect(main.path).toMatch(/^M [-\d.]+ [-\d.]+ A /);
    expect(main.path.endsWith('Z')).toBe(true);
    // No two pulleys of the loop overlap.
    for (const [i, p] of main.pulleys.entries()) {
      for (const q of main.pulleys.slice(i + 1)) expect(Math.hypot(p.x - q.x, p.y - q.y)).toBeGreaterThan(p.r + q.r);
    }
  });

  it('draws a second belt around its own loop and lists parts on no belt', () => {
    const v6 = layoutDrive(DEMO_V6);
    expect(v6.belts.map((b) => b.name)).toEqual(['Front', 'A/C belt']);
    const ac = v6.belts[1];
    // The second groove sits on the crank's centre, with its own diameter.
    expect(ac.pulleys[0]).toMatchObject({ component: 'Crankshaft', x: 0, y: 0, r: 75 });
    // Its other pulleys stay clear of the first belt's pulleys.
    for (const p of ac.pulleys.slice(1)) {
      for (const q of v6.belts[0].pulleys) expect(Math.hypot(p.x - q.x, p.y - q.y), `${p.component} vs ${q.component}`).toBeGreaterThan(p.r + q.r);
    }
    expect(layoutDrive(DEMO_DIESEL_I4).unbelted).toEqual(['Vacuum pump']);
  });

  it('tolerates a half-typed draft', () => {
    const layout = layoutDrive({ belts: [{ name: 'B', lengthMm: Number.NaN, driver: 'Crank', driverPulleyMm: Number.NaN }], components: [{ name: 'Crank', kind: 'crankshaft' }, { name: 'X', kind: 'other', belt: 'B' }] });
    expect(layout.belts[0].pulleys.map((p) => p.r)).toEqual([30, 30]);
  });
});
