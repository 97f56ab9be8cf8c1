import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { settingsFromTruth } from '../../../shared/synth/accuracy';
import { rankCapture } from '../../../shared/ranking/rank-capture';
import { judgeRanking, type RankingVerdict } from '../../../shared/ranking/judge-ranking';
import { makeScenarioCapture, scenarios, type Scenario } from '../../helpers/scenarios';

// End to end on the generator's named scenarios (tests/helpers/scenarios.ts): generated capture →
// runPipeline → rankCapture. Issue 11's targets over all runs are planted part first ≥ 95 %,
// part and fault first ≥ 90 %, top three 100 %, indistinguishable pairs named; `npm run accuracy`
// measures them over 20 seeds per scenario. Here two seeds each: every run must have the part in
// the top three and every pair named; the first-place rates must reach 90 % / 85 % over these few runs.

function rank(scenario: Scenario, seed: number): RankingVerdict {
  const capture = makeScenarioCapture(scenario, seed);
  const settings = AnalysisSettingsSchema.parse(settingsFromTruth(capture.truth));
  const result = runPipeline({ channels: capture.channels, sampleRateHz: capture.sampleRateHz }, settings, {
    rank: (input) => rankCapture(scenario.drive, input),
  });
  const fault = capture.truth.fault!;
  return judgeRanking(result.ranking, { component: fault.component, fault: fault.fault, indistinguishableFrom: scenario.indistinguishableFrom });
}

describe('ranking generated captures through the pipeline', () => {
  const verdicts: { name: string; seed: number; verdict: RankingVerdict }[] = [];

  it.each(scenarios.map((s) => [s.name, s] as const))('%s: planted part in the top three', (_name, scenario) => {
    for (const seed of [1, 2]) {
      const verdict = rank(scenario, seed);
      verdicts.push({ name: scenario.name, seed, verdict });
      expect(verdict.topThreePart, `${scenario.name} seed ${seed}: first ${JSON.stringify(verdict.first)}, part place ${verdict.partPlace}`).toBe(true);
      if (verdict.pairNamed !== null) expect(verdict.pairNamed, `${scenario.name} seed ${seed}: indistinguishable pair not both named in the top two`).toBe(true);
    }
  }, 60_000);

  it('puts the planted part first in at least 90 % of these runs, with its fault in at least 85 %', () => {
    expect(verdicts.length).toBe(2 * scenarios.length);
    const rate = (f: (v: RankingVerdict) => boolean) => verdicts.filter((v) => f(v.verdict)).length / verdicts.length;
    const misses = verdicts.filter((v) => !v.verdict.topPartAndFault).map((v) => `${v.name}#${v.seed} → ${JSON.stringify(v.verdict.first)}`);
    expect(rate((v) => v.topPart), misses.join('; ')).toBeGreaterThanOrEqual(0.9);
    expect(rate((v) => v.topPartAndFault), misses.join('; ')).toBeGreaterThanOrEqual(0.85);
  });
});
