import { describe, expect, it } from 'vitest';
import { runPipeline } from '../../../shared/analysis/pipeline';
import { AnalysisSettingsSchema } from '../../../shared/schemas/analysis-settings';
import { settingsFromTruth } from '../../../shared/synth/accuracy';
import { generateCapture } from '../../../shared/synth/generate-capture';
import type { GenerateOptionsInput } from '../../../shared/synth/options';
import { rankCapture } from '../../../shared/ranking/rank-capture';
import { rankCase, type CaseCapture } from '../../../shared/ranking/rank-case';
import { candidateLines } from '../../../shared/drive/candidate-lines';
import type { RankingEntry } from '../../../shared/analysis/types';
import { drives } from '../../helpers/scenarios';

// Each case-level term on its own, on generated captures run through the pipeline and the ranking.
const drive = drives.i4Petrol;
const base = { durationS: 6, sampleRateHz: 24000, refKind: 'cyl1', creepPct: 1 } as const;

function analyse(options: Omit<GenerateOptionsInput, 'drive'>): RankingEntry[] {
  const capture = generateCapture({ ...base, ...options, drive });
  const settings = AnalysisSettingsSchema.parse(settingsFromTruth(capture.truth));
  return runPipeline({ channels: capture.channels, sampleRateHz: capture.sampleRateHz }, settings, { rank: (input) => rankCapture(drive, input) }).ranking;
}
const find = <T extends { component: string; fault: string }>(list: T[], component: string, fault: string): T => list.find((e) => e.component === component && e.fault === fault)!;

describe('rankCase', () => {
  const altFault = { component: 'Alternator', fault: 'outer_race' } as const;
  const near = analyse({ seed: 11, snrDb: 9, fault: altFault });
  const far = analyse({ seed: 12, snrDb: -6, fault: altFault });

  it('gives weight to a part whose lines are stronger with the probe nearest it', () => {
    const without = rankCase(drive, [
      { captureId: 1, entries: near, phase: 'before' },
      { captureId: 2, entries: far, phase: 'before' },
    ]);
    const withProbe = rankCase(drive, [
      { captureId: 1, entries: near, phase: 'before', probeComponent: 'Alternator' },
      { captureId: 2, entries: far, phase: 'before', probeComponent: 'Water pump' },
    ]);
    const a = find(without, 'Alternator', 'outer_race');
    const b = find(withProbe, 'Alternator', 'outer_race');
    expect(b.score).toBeGreaterThan(a.score);
    expect(b.notes.join(' ')).toMatch(/stronger with the probe at Alternator/);
    // The same captures with the probe points swapped count against it.
    const swapped = rankCase(drive, [
      { captureId: 1, entries: near, phase: 'before', probeComponent: 'Water pump' },
      { captureId: 2, entries: far, phase: 'before', probeComponent: 'Alternator' },
    ]);
    expect(find(swapped, 'Alternator', 'outer_race').score).toBeLessThan(a.score);
  }, 30_000);

  it('points lines present only with the A/C clutch engaged at the compressor', () => {
    const clutchOn = analyse({ seed: 21, snrDb: 6, fault: { component: 'A/C compressor', fault: 'inner_race' } });
    const clutchOff = analyse({ seed: 22, snrDb: 6, fault: null });
    const captures: CaseCapture[] = [
      { captureId: 'on', entries: clutchOn, phase: 'before', acClutch: 'on' },
      { captureId: 'off', entries: clutchOff, phase: 'before', acClutch: 'off' },
    ];
    const plain = rankCase(drive, captures.map((c) => ({ ...c, acClutch: null })));
    const withCondition = rankCase(drive, captures);
    const compressor = find(withCondition, 'A/C compressor', 'inner_race');
    expect(compressor.score).toBeGreaterThan(find(plain, 'A/C compressor', 'inner_race').score);
    expect(compressor.notes.join(' ')).toMatch(/only with the A\/C clutch engaged/);
    expect(withCondition[0]).toBe(compressor);
    // Another part with clutch-only lines is pointed at the compressor instead.
    const altOn = analyse({ seed: 24, snrDb: 6, fault: altFault });
    const other = rankCase(drive, [
      { captureId: 'on', entries: altOn, phase: 'before', acClutch: 'on' },
      { captureId: 'off', entries: clutchOff, phase: 'before', acClutch: 'off' },
    ]);
    const alt = find(other, 'Alternator', 'outer_race');
    expect(alt.notes.join(' ')).toMatch(/points at the A\/C compressor/);
    expect(alt.score).toBeLessThan(find(rankCase(drive, [{ captureId: 'on', entries: altOn, phase: 'before' }]), 'Alternator', 'outer_race').score);
  }, 30_000);

  it('marks what remains in a belt-off capture as engine-born', () => {
    // An impulsive engine source (a tick train) that falls in the tensioner's outer-race window, in both runs.
    const tensioner = candidateLines(drive).find((c) => c.component === 'Tensioner')!;
    const order = tensioner.lines.find((l) => l.label === 'BPFO 1x')!.nominalOrder * 0.99;
    const distractor = { kind: 'tick-train', order, amplitude: 0.6 } as const;
    const beltOn = analyse({ seed: 31, snrDb: 3, fault: altFault, distractor });
    const beltOff = analyse({ seed: 32, snrDb: 3, fault: null, distractor });
    expect(find(beltOn.map((e) => ({ ...e })), 'Tensioner', 'outer_race').score).toBeGreaterThan(0.3);
    const ranked = rankCase(drive, [
      { captureId: 'on', entries: beltOn, phase: 'before' },
      { captureId: 'off', entries: beltOff, phase: 'before', beltOff: true },
    ]);
    const t = find(ranked, 'Tensioner', 'outer_race');
    expect(t.engineBorn).toBe(true);
    expect(t.notes.join(' ')).toMatch(/engine-born/);
    expect(ranked[0]).toMatchObject({ component: 'Alternator', fault: 'outer_race', engineBorn: false });
  }, 30_000);

  it('never re-ranks from after-repair captures, but reports their scores', () => {
    const before: CaseCapture[] = [{ captureId: 1, entries: near, phase: 'before' }];
    const after = analyse({ seed: 41, snrDb: 6, fault: { component: 'Water pump', fault: 'inner_race' } });
    const a = rankCase(drive, before);
    const b = rankCase(drive, [...before, { captureId: 2, entries: after, phase: 'after_repair' }]);
    expect(b.map((s) => [s.component, s.fault, s.score])).toEqual(a.map((s) => [s.component, s.fault, s.score]));
    expect(find(b, 'Water pump', 'inner_race').afterRepairScore).toBeGreaterThan(0.3);
    expect(a[0].afterRepairScore).toBeNull();
  }, 30_000);
});

describe('rankCase with a part that keeps turning with the belt off', () => {
  // The diesel's vacuum pump is cam-driven (fixedRatio 0.5): taking the accessory belt off does
  // not stop it, so a pattern still there with the belt off says nothing against it.
  const diesel = drives.i4Diesel;
  const entry = (component: string, score: number): RankingEntry => ({
    component, target: 'component', fault: 'outer_race', order: 1, nominalOrder: 1, score, slipPct: null,
    evidence: `${component}, outer race`, indistinguishableFrom: [], approximate: false, matched: [],
  });

  it('does not scale a fixed-ratio part down as engine-born, while a belt-driven part still is', () => {
    const on = [entry('Vacuum pump', 0.7), entry('Alternator', 0.6)];
    const off = [entry('Vacuum pump', 0.68), entry('Alternator', 0.55)];
    const ranked = rankCase(diesel, [
      { captureId: 'on', entries: on, phase: 'before' },
      { captureId: 'off', entries: off, phase: 'before', beltOff: true },
    ]);
    const pump = find(ranked, 'Vacuum pump', 'outer_race');
    expect(pump.engineBorn).toBe(false);
    expect(pump.score).toBeCloseTo(0.7, 9);
    expect(pump.notes.join(' ')).toMatch(/keeps turning with the accessory belt off/);
    const alt = find(ranked, 'Alternator', 'outer_race');
    expect(alt.engineBorn).toBe(true);
    expect(alt.score).toBeLessThan(0.3);
    expect(ranked[0].component).toBe('Vacuum pump');
  });
});
