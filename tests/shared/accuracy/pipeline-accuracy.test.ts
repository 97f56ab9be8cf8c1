import { describe, expect, it } from 'vitest';
import { accuracyCasesFor, runAccuracySweep, type AccuracyCase } from '../../../shared/synth/sweep';
import { RPM_TOLERANCE_PCT, TOP_PEAKS } from '../../../shared/synth/accuracy';
import type { DriveDocument } from '../../../shared/drive/types';
import { drives } from '../../helpers/scenarios';

// The pipeline on generated captures (signal-core issue, "Checks"): each reference kind, speed
// wander up to ±5 %, pickup SNR down to −3 dB. Per run: mean rpm within 0.5 %; the planted order
// (after creep and slip) among the first 20 peaks of the order or the reported envelope spectrum
// within max(1.5 × resolution, 0.6 % of the order); the loudest injector tick in the right cylinder
// slot, or among the candidates when the reference leaves the phase open; a wheel's gaps counted as
// gaps and never as repaired teeth. The four-stroke facts behind the slots and ambiguities are
// common practice (docs/references.md §5; Heywood 1988, from memory). 4 s captures at 24 kHz keep this
// file short; `npm run accuracy` runs the same cases over more seeds (shared/synth/sweep.ts).

function expectAllPass(drive: DriveDocument, c: AccuracyCase, seeds: number[]): void {
  const rows = runAccuracySweep({ drive, seeds, cases: [c], durationS: 4, sampleRateHz: 24000 });
  for (const { seed, outcome } of rows) {
    const where = `${drive.name} · ${c.name} · seed ${seed}`;
    expect(outcome.rpmErrorPct, `${where}: mean rpm error %`).toBeLessThanOrEqual(RPM_TOLERANCE_PCT);
    if (outcome.order) expect(outcome.order.ok, `${where}: planted order ${outcome.order.plantedOrder.toFixed(3)} not in the first ${TOP_PEAKS} peaks (${JSON.stringify(outcome.order)})`).toBe(true);
    if (outcome.tick) expect(outcome.tick.ok, `${where}: loudest tick ${JSON.stringify(outcome.tick)}`).toBe(true);
    if (outcome.wheel) expect(outcome.wheel.ok, `${where}: wheel ${JSON.stringify(outcome.wheel)}`).toBe(true);
  }
}

const engines: Array<[string, DriveDocument, number[]]> = [
  ['four-cylinder petrol', drives.i4Petrol, [1, 2]],
  ['four-cylinder diesel', drives.i4Diesel, [1]],
  ['V6 petrol', drives.v6Petrol, [3]],
];

describe.each(engines)('pipeline accuracy on generated captures: %s', (_label, drive, seeds) => {
  it.each(accuracyCasesFor(drive).map((c) => [c.name, c] as const))('%s', (_name, c) => {
    expectAllPass(drive, c, seeds);
  }, 30_000);
});

describe('hard cases found by the sweep', () => {
  const v6 = accuracyCasesFor(drives.v6Petrol);
  // Injector-tick residue can win the automatic envelope band under ±5 % wander (only 11 cycles in
  // 4 s at 700 rpm); the band choice must still report the planted BPFO.
  it('V6, cylinder-1 reference, outer race at −3 dB, ±5 % wander, seed 1', () => {
    expectAllPass(drives.v6Petrol, v6[0], [1]);
  }, 30_000);
  // With the exhaust-stroke wasted spark of the other polarity, a few weak sparks ring too little on
  // the chosen polarity; they once left 4 holes of 46 edges and the mean rpm 4.4 % low. The holes
  // now take the other-polarity pulse in their middle.
  it('V6, wasted spark with the other-polarity exhaust spark, seed 2', () => {
    expectAllPass(drives.v6Petrol, v6[2], [2]);
  }, 30_000);
});
