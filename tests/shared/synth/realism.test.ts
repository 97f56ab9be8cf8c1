import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { settingsFromTruth } from '../../../shared/synth/accuracy';
import { generateCapture } from '../../../shared/synth/generate-capture';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import { engineCombLevelDb, lineNear } from '../../../shared/ranking/spectrum-lines';
import { drives } from '../../helpers/scenarios';

// The realistic generator (shared/synth/realism.ts) against today's: today's captures are unchanged
// sample for sample; the realistic one shows every rotating part's 1× in the order spectrum and
// keeps a 0.5-order comb in the residual after the 720° average (cycle-to-cycle combustion).
const drive = drives.i4Petrol;
const base = { drive, seed: 7, durationS: 6, sampleRateHz: 24000, snrDb: 12, fault: null, creepPct: 1 } as const;

function analyse(realism: 'today' | 'real') {
  const g = generateCapture({ ...base, realism });
  return runPipeline({ channels: g.channels, sampleRateHz: g.sampleRateHz }, AnalysisSettingsSchema.parse(settingsFromTruth(g.truth)));
}

describe('realistic generator', () => {
  it('leaves today\'s captures sample for sample as they were', () => {
    const a = generateCapture({ ...base });
    const b = generateCapture({ ...base, realism: 'today' });
    const same = (x: Float32Array, y: Float32Array) => x.length === y.length && x.every((v, i) => v === y[i]);
    expect(same(b.channels[1], a.channels[1])).toBe(true);
    const c = generateCapture({ ...base, realism: 'real' });
    expect(same(c.channels[0], a.channels[0])).toBe(true);
    expect(same(c.channels[1], a.channels[1])).toBe(false);
  }, 30_000);

  it('gives every rotating part a 1× line and keeps an engine comb in the residual', () => {
    const today = analyse('today');
    const real = analyse('real');
    const parts = candidateLines(drive).filter((c) => c.target === 'component');
    const res = real.orders.spectrum.resolution;
    let seenReal = 0;
    let seenToday = 0;
    for (const p of parts) {
      const at = p.ratio * (p.regime === 'fixed' ? 1 : 0.99);
      if ((lineNear(real.orders.spectrum, at, 1.5 * res)?.snrDb ?? 0) >= 10) seenReal += 1;
      if ((lineNear(today.orders.spectrum, at, 1.5 * res)?.snrDb ?? 0) >= 10) seenToday += 1;
    }
    expect(seenReal).toBe(parts.length);
    expect(seenToday).toBeLessThan(parts.length);
    const combReal = Math.max(...real.envelope.bands.map((b) => engineCombLevelDb(b.spectrum)));
    const combToday = Math.max(...today.envelope.bands.map((b) => engineCombLevelDb(b.spectrum)));
    expect(combReal).toBeGreaterThan(combToday);
  }, 60_000);
});
