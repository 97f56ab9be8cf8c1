import { describe, expect, it } from 'vitest';
import { compareRepair, VERIFY_DROP_DB } from '../../../shared/report/repair-verification';
import { alternatorFinding } from '../../helpers/report-case';

// dB change of an amplitude ratio = 20·log10(after / before) (IEC 60027-3 level of a field quantity).
describe('repair verification', () => {
  it('passes a drop of 14 dB at the main line (0.04 → 0.008: 20·log10(0.2) = −13.98 dB)', () => {
    const v = compareRepair(alternatorFinding(0.008));
    const main = v.lines.find((l) => l.main)!;
    expect(main.label).toBe('BPFO 1x');
    expect(main.changeDb).toBeCloseTo(20 * Math.log10(0.2), 9);
    expect(v.mainDropDb).toBeCloseTo(13.98, 2);
    expect(v.passes).toBe(true);
  });

  it('asks for a note when the main line dropped less than 6 dB (0.04 → 0.03: −2.5 dB)', () => {
    const v = compareRepair(alternatorFinding(0.03));
    expect(v.mainDropDb!).toBeLessThan(VERIFY_DROP_DB);
    expect(v.passes).toBe(false);
    expect(v.sentence).toMatch(/add a note/);
  });

  it('passes when the main line is gone into the floor', () => {
    const v = compareRepair(alternatorFinding(null));
    expect(v.mainGone).toBe(true);
    expect(v.passes).toBe(true);
    expect(v.lines.find((l) => l.main)!.changeDb).toBeNull();
  });

  it('says what to do when there is no after-repair capture', () => {
    const f = alternatorFinding(0.01);
    f.captures = f.captures.filter((c) => c.phase === 'before');
    const v = compareRepair(f);
    expect(v.hasAfter).toBe(false);
    expect(v.passes).toBe(false);
    expect(v.sentence).toMatch(/Upload an after-repair capture/);
  });
});
