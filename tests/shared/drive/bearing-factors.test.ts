import { describe, expect, it } from 'vitest';
import { bearingFactors, factorsFromGeometry } from '../../../shared/drive/bearing-factors';
import { BUILT_IN_BEARINGS, findBearing, normaliseDesignation } from '../../../shared/drive/bearing-table';

const rel = (actual: number, expected: number) => Math.abs(actual - expected) / Math.abs(expected);

describe('bearing defect factors from geometry', () => {
  // Source: Case Western Reserve University Bearing Data Center, "Bearing Information" (defect
  // frequencies as multiples of running speed), drive-end 6205-2RS: 9 balls, d 0.3126 in, D 1.537 in
  // (docs/references.md §1, published). Tolerance relative 1e-4 as docs/references.md states.
  it('matches the CWRU drive-end 6205 row within 1e-4', () => {
    const f = factorsFromGeometry({ balls: 9, ballMm: 0.3126, pitchMm: 1.537 });
    expect(rel(f.bpfi, 5.4152)).toBeLessThan(1e-4);
    expect(rel(f.bpfo, 3.5848)).toBeLessThan(1e-4);
    expect(rel(f.ftf, 0.39828)).toBeLessThan(1e-4);
    expect(rel(2 * f.bsf, 4.7135)).toBeLessThan(1e-4); // the table's "rolling element" column is 2×BSF
  });

  // Source: CWRU fan-end 6203-2RS row (8 balls, d 0.2656 in, D 1.122 in); the table rounds in the
  // 4th decimal, hence 1e-3 (docs/references.md §1).
  it('matches the CWRU fan-end 6203 row within 1e-3', () => {
    const f = factorsFromGeometry({ balls: 8, ballMm: 0.2656, pitchMm: 1.122 });
    expect(rel(f.bpfi, 4.9469)).toBeLessThan(1e-3);
    expect(rel(f.bpfo, 3.0530)).toBeLessThan(1e-3);
    expect(rel(f.ftf, 0.3817)).toBeLessThan(1e-3);
    expect(rel(2 * f.bsf, 3.9874)).toBeLessThan(1e-3);
  });

  // Pitfall noted in docs/references.md §1: the 6203 has 8 balls; 9 gives BPFO 3.4348, not the table's 3.0530.
  it('gives a different BPFO with the common n = 9 mistake for the 6203', () => {
    const wrong = factorsFromGeometry({ balls: 9, ballMm: 0.2656, pitchMm: 1.122 });
    expect(wrong.bpfo).toBeCloseTo(3.4348, 3);
    expect(rel(wrong.bpfo, 3.0530)).toBeGreaterThan(0.1);
  });

  // Source: MFPT Society fault data sets, test bearing d 0.235, D 1.245, n 8, α 0 at 25 Hz shaft
  // (docs/references.md §1: values derived from the formula; the data set's description gives 81.12 and 118.875 Hz, published).
  it('gives the MFPT test bearing frequencies at 25 Hz', () => {
    const f = factorsFromGeometry({ balls: 8, ballMm: 0.235, pitchMm: 1.245 });
    expect(25 * f.bpfo).toBeCloseTo(81.1245, 3);
    expect(25 * f.bpfi).toBeCloseTo(118.8755, 3);
    expect(25 * f.ftf).toBeCloseTo(10.1406, 3);
    expect(25 * f.bsf).toBeCloseTo(63.864, 2);
    expect(Math.abs(25 * f.bpfo - 81.12)).toBeLessThan(0.01);
    expect(Math.abs(25 * f.bpfi - 118.875)).toBeLessThan(0.001);
  });

  // Source: Curtin University bearing set (G. Forbes, 2012, CC BY 4.0), readme values (docs/references.md §1, published).
  it('gives the Curtin University set factors', () => {
    const f = factorsFromGeometry({ balls: 9, ballMm: 7.9375, pitchMm: 38.5 });
    expect(Math.abs(f.ftf - 0.3969)).toBeLessThan(5e-5);
    expect(Math.abs(f.bpfo - 3.572)).toBeLessThan(5e-4);
    expect(Math.abs(f.bpfi - 5.428)).toBeLessThan(5e-4);
    expect(Math.abs(f.bsf - 2.32)).toBeLessThan(5e-3);
  });

  // Source: docs/references.md §1 non-zero contact angle case [derived from Randall & Antoni 2011's formulas].
  it('applies the contact angle (n 8, d 20, D 120, α 15°)', () => {
    const f = factorsFromGeometry({ balls: 8, ballMm: 20, pitchMm: 120, contactDeg: 15 });
    expect(f.ftf).toBeCloseTo(0.41951, 5);
    expect(f.bpfo).toBeCloseTo(3.35605, 5);
    expect(f.bpfi).toBeCloseTo(4.64395, 5);
    expect(f.bsf).toBeCloseTo(2.92225, 5);
  });

  // Identities of the kinematics (Randall & Antoni 2011): BPFO + BPFI = n; BPFO = n·FTF (inner ring turning).
  it('keeps BPFO + BPFI = n and BPFO = n·FTF', () => {
    const f = factorsFromGeometry({ balls: 11, ballMm: 7.1, pitchMm: 33.3, contactDeg: 10 });
    expect(f.bpfo + f.bpfi).toBeCloseTo(11, 10);
    expect(f.bpfo).toBeCloseTo(11 * f.ftf, 10);
  });

  // docs/references.md §1: with the outer ring turning the cage factor becomes ½(1 + r); BPFO, BPFI, BSF keep their values.
  it('uses the cage factor ½(1 + r) when the outer ring turns', () => {
    const g = { balls: 8, ballMm: 6.74624, pitchMm: 28.49880 };
    const inner = factorsFromGeometry(g, 'inner');
    const outer = factorsFromGeometry(g, 'outer');
    const r = g.ballMm / g.pitchMm;
    expect(outer.ftf).toBeCloseTo(0.5 * (1 + r), 12);
    expect(inner.ftf + outer.ftf).toBeCloseTo(1, 12);
    expect(outer.bpfo).toBe(inner.bpfo);
    expect(outer.bpfi).toBe(inner.bpfi);
    expect(outer.bsf).toBe(inner.bsf);
  });

  it('refuses geometry that cannot be a bearing, naming the values', () => {
    expect(() => factorsFromGeometry({ balls: 8, ballMm: 30, pitchMm: 20 })).toThrow(/d 30, D 20/);
    expect(() => factorsFromGeometry({ balls: 0, ballMm: 3, pitchMm: 20 })).toThrow(RangeError);
  });
});

describe('resolving a component bearing', () => {
  it('uses entered factors as given for the stated ring', () => {
    const factors = { ftf: 0.62, bpfo: 3.05, bpfi: 4.95, bsf: 1.99 };
    const b = bearingFactors({ factors, rotatingRing: 'outer' });
    expect(b.factors).toEqual(factors);
    expect(b.rotatingRing).toBe('outer');
    expect(b.approximate).toBe(false);
  });

  // The built-in 6205 and 6203 rows are the CWRU geometry (inches × 25.4), so they reproduce the published factors.
  it('resolves the published designations to the CWRU factors', () => {
    expect(rel(bearingFactors({ designation: '6205-2RS' }).factors.bpfi, 5.4152)).toBeLessThan(1e-4);
    expect(rel(bearingFactors({ designation: '6203' }).factors.bpfo, 3.0530)).toBeLessThan(1e-3);
    expect(BUILT_IN_BEARINGS.filter((b) => b.source === 'published').map((b) => b.designation).sort()).toEqual(['6203', '6205']);
  });

  it('prefers the shop table over the built-in rows', () => {
    const shop = [{ designation: '6203', balls: 7, ballMm: 6.35, pitchMm: 28.5, contactDeg: 0, source: 'measured' as const, note: 'shop' }];
    expect(bearingFactors({ designation: '6203' }, shop).factors.bpfo).toBeCloseTo(3.5 * (1 - 6.35 / 28.5), 10);
    expect(findBearing('6203 zz', shop)?.source).toBe('measured');
  });

  it('marks a rule-of-thumb bearing approximate when nothing is known', () => {
    for (const spec of [undefined, {}, { designation: 'XYZ-99' }]) {
      const b = bearingFactors(spec);
      expect(b.approximate).toBe(true);
      expect(b.basis).toBe('rule-of-thumb');
      // Trade rule of thumb [practice]: BPFO ≈ 0.4·n, BPFI ≈ 0.6·n (here n = 8).
      expect(b.factors.bpfo / 8).toBeGreaterThan(0.35);
      expect(b.factors.bpfi / 8).toBeLessThan(0.65);
    }
  });

  it('marks estimated designation rows approximate', () => {
    expect(bearingFactors({ designation: '6204' }).approximate).toBe(true);
    expect(normaliseDesignation(' 6204-2rs ')).toBe('6204');
  });
});
