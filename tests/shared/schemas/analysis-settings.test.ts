import { describe, expect, it } from 'vitest';
import { AnalysisSettingsSchema, parseAnalysisSettings } from '../../../shared/schemas/analysis-settings';
import { resolveSettings } from '../../../shared/analysis/resolve-settings';

describe('AnalysisSettingsSchema', () => {
  it('fills every field with its default from an empty object', () => {
    const s = parseAnalysisSettings({});
    expect(s).toMatchObject({ refChannel: 1, pickupChannel: 2, camChannel: null, refKind: 'cyl1', refPerCycle: null, wheel: '60-2',
      refPolarity: 'auto', tdcOffsetDeg: 0, cylinders: 4, firingOrder: null, maxOrder: 100, samplesPerRev: 256, revsPerBlock: 32,
      envelopeBand: 'auto', timeUnit: null, channelScales: [] });
    expect(Object.keys(s).sort()).toEqual(Object.keys(AnalysisSettingsSchema.parse({})).sort());
  });

  it('refuses a firing order that is not a permutation of 1..cylinders, naming the field', () => {
    const r = AnalysisSettingsSchema.safeParse({ cylinders: 4, firingOrder: [1, 3, 3, 2] });
    expect(r.success).toBe(false);
    expect(r.error!.issues[0].path).toEqual(['firingOrder']);
  });

  it('refuses samples per revolution that is not a power of two', () => {
    expect(AnalysisSettingsSchema.safeParse({ samplesPerRev: 300 }).success).toBe(false);
  });

  it('takes an envelope band as [lo, hi] Hz and refuses an inverted one', () => {
    expect(parseAnalysisSettings({ envelopeBand: [2000, 4000] }).envelopeBand).toEqual([2000, 4000]);
    expect(AnalysisSettingsSchema.safeParse({ envelopeBand: [4000, 2000] }).success).toBe(false);
  });

  it('lets explicit fields override the drive document, which fills the rest', () => {
    const drive = { name: 'x', cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4], belts: [], components: [] };
    expect(resolveSettings({}, drive)).toMatchObject({ cylinders: 6, firingOrder: [1, 5, 3, 6, 2, 4] });
    expect(resolveSettings({ cylinders: 4, firingOrder: [1, 2, 4, 3] }, drive)).toMatchObject({ cylinders: 4, firingOrder: [1, 2, 4, 3] });
  });
});
