import { describe, expect, it } from 'vitest';
import demoJson from '../drive/fixtures/demo-i4.drive.json';
import type { RankingEntry } from '../../../shared/analysis/types';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { slipPlausibility } from '../../../shared/ranking/match-pattern';
import { rankCapture } from '../../../shared/ranking/rank-capture';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { parseDriveDocument } from '../../../shared/schemas/drive';
import { settingsFromTruth } from '../../../shared/synth/accuracy';
import { generateCapture } from '../../../shared/synth/generate-capture';

// Equivalents of the team kit's idle-i4.wav, to its truth file (../shared/samples/idle-i4.json):
// 10 s at 48 kHz, ~780 rpm with ±2 % wander, cylinder-1 reference at TDC, the alternator at ratio
// 2.8 (140/50 mm, demo-i4.drive.json) with an outer-race defect at 2.8 × 3.12 = 8.736 orders,
// impacts ringing a 4 kHz resonance, no creep. On this drive the Upper idler's inner race
// (140/76 × 6203 BPFI 4.947 = 9.112) reads the same 8.736 line only with its unmeasured speed 4.1 %
// low, while the alternator's pattern sits exactly where its own shaft line (2.80, 0.0 % slip)
// puts it: the alternator's outer race must rank first (the kit's check-analyze.mjs requires the
// alternator first on the real sample).
const drive = parseDriveDocument(demoJson);

function rankIdleI4(seed: number, snrDb: number, shaftLine: boolean): RankingEntry[] {
  const common = { drive, seed, durationS: 10, sampleRateHz: 48_000, rpm: 780, wanderPct: 2, refKind: 'cyl1', tdcOffsetDeg: 0, creepPct: 0, rollingSlipPct: 0 } as const;
  const capture = generateCapture({ ...common, fault: { component: 'Alternator', fault: 'outer_race' }, resonanceHz: 4000, snrDb });
  if (shaftLine) {
    // The kit's truth names the alternator's shaft order (shaft_order 2.8) and its scope sample of
    // the same engine (held-820-scope.csv) shows that line about 24 dB above the floor. The
    // generator plants no shaft line with a bearing fault, so the same seed (same speed profile)
    // is generated once more with only an alternator shaft fault and added to the pickup.
    const shaft = generateCapture({ ...common, fault: { component: 'Alternator', fault: 'shaft', amplitude: 0.05 }, snrDb: 80, engineLevel: 0, injectorTicks: [] });
    const pickup = capture.channels[1];
    for (let i = 0; i < pickup.length; i += 1) pickup[i] += shaft.channels[1][i];
  }
  const settings = AnalysisSettingsSchema.parse(settingsFromTruth(capture.truth));
  return runPipeline({ channels: capture.channels, sampleRateHz: capture.sampleRateHz }, settings, { rank: (input) => rankCapture(drive, input) }).ranking;
}

const find = (ranking: RankingEntry[], component: string, fault: string) => ranking.find((e) => e.component === component && e.fault === fault)!;

describe('idle-i4 equivalents: the alternator outer race against the near-coincident idler inner race', () => {
  it.each([[1, 6], [2, 0], [3, -3]])('seed %i at %i dB SNR with the alternator shaft line at 2.80: Alternator / outer race first, the idler explained away', (seed, snrDb) => {
    const ranking = rankIdleI4(seed, snrDb, true);
    const top = ranking[0];
    expect(`${top.component} / ${top.fault}`).toBe('Alternator / outer_race');
    expect(Math.abs(top.order - 8.736)).toBeLessThan(0.02);
    expect(Math.abs(top.slipPct!)).toBeLessThan(0.5);
    const idler = find(ranking, 'Upper idler', 'inner_race');
    expect(idler.score).toBeLessThan(0.8 * top.score);
    expect(idler.evidence).toContain("Alternator's own shaft line");
  }, 60_000);

  it('without any shaft line the two stay the first two, each pointing at the other (only slip could choose)', () => {
    // Creep 0–3 % and cage lag 0–2 % make the idler's 4.1 % as plausible as the alternator's 0 %,
    // so with neither speed measured the ranking must keep both on top and say so.
    const ranking = rankIdleI4(5, 6, false);
    const firstTwo = ranking.slice(0, 2).map((e) => `${e.component} / ${e.fault}`).sort();
    expect(firstTwo).toEqual(['Alternator / outer_race', 'Upper idler / inner_race']);
    const other = ranking[0].component === 'Alternator' ? 'Upper idler' : 'Alternator';
    expect(ranking[0].evidence).toContain(`also fit ${other}`);
  }, 60_000);
});

describe('slipPlausibility', () => {
  // A fixed-race line on one belt with its slip unmeasured: likely −4.94 … 0 % (creep 0–3 %,
  // docs/references.md §5, and cage lag 0–2 %, §4), window −5 … +0.5 % (shared/drive/line-windows.ts).
  const relative = { below: -0.05, above: 0.005, likely: [-0.0494, 0] as [number, number], preferCentre: true };

  it('is flat (1) over the whole likely range, not peaked at one creep', () => {
    expect(slipPlausibility(-0.0247, relative, 0)).toBeCloseTo(1, 9);
    expect(slipPlausibility(0, relative, 0)).toBeCloseTo(1, 9);
    expect(slipPlausibility(-0.0494, relative, 0)).toBeCloseTo(1, 9);
    expect(slipPlausibility(-0.01, relative, 0)).toBeCloseTo(1, 9);
  });

  it('costs in proportion to the slip needed beyond the likely range, down to 0.4 at the window edge', () => {
    expect(slipPlausibility(0.0025, relative, 0)).toBeCloseTo(0.7, 9);
    expect(slipPlausibility(0.005, relative, 0)).toBeCloseTo(0.4, 9);
    expect(slipPlausibility(0.02, relative, 0)).toBeCloseTo(0.4, 9);
  });

  it('with a measured slip is flat over the likely range and gentle just past it', () => {
    const measured = { below: -0.025, above: 0.005, likely: [-0.02, 0] as [number, number], preferCentre: false };
    expect(slipPlausibility(-0.019, measured, 0)).toBe(1);
    expect(slipPlausibility(-0.001, measured, 0)).toBe(1);
    expect(slipPlausibility(0.0025, measured, 0)).toBeCloseTo(0.85 - 0.45 * 0.25, 9);
  });
});
