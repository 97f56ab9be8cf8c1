/**
 * An impulsive noise source that is not in the drive table, so the ranking has something to
 * refuse: a tick train at a crank order that no part's candidate line (nor its 2× and 3×) comes
 * within 4 % of and that stays off the 0.5-order comb, ringing a mode of its own; or a few random
 * clunks (about 1.5 per second, ringing 0.6–1.2 kHz).
 */
import type { DriveDocument } from '../drive/types';
import { candidateLines } from '../drive/candidate-lines';
import type { Rng } from './prng';
import type { Distractor } from './options';
import type { CaptureTruth } from './truth';
import { impactTrain } from './fault-signal';
import { addRings } from './rings';
import type { SpeedProfile } from './speed-profile';

/**
 * Picks a tick-train order in [3, 13] whose first three harmonics each lie at least 4 % from every
 * candidate line of the drive, and at least 0.1 order from a 0.5-order multiple. Falls back to the
 * best found after 400 seeded tries.
 */
export function chooseDistractorOrder(rng: Rng, drive: DriveDocument): number {
  const nominal = candidateLines(drive).flatMap((c) => c.lines.map((l) => l.nominalOrder)).filter((o) => o > 0);
  let best = { order: 7.3, score: -Infinity };
  for (let attempt = 0; attempt < 400; attempt++) {
    const order = rng.between(3, 13);
    let closest = Infinity;
    for (let k = 1; k <= 3; k++) for (const o of nominal) closest = Math.min(closest, Math.abs(k * order - o) / o);
    const comb = Math.abs(order * 2 - Math.round(order * 2)) / 2;
    const score = Math.min(closest / 0.04, comb / 0.1);
    if (score >= 1) return order;
    if (score > best.score) best = { order, score };
  }
  return best.order;
}

/** Adds the distractor to `out` (in place) and describes it. */
export function addDistractor(
  out: Float64Array,
  rng: Rng,
  profile: SpeedProfile,
  drive: DriveDocument,
  distractor: Distractor,
  resonanceHz: number,
): NonNullable<CaptureTruth['distractor']> {
  const { sampleRateHz, thetaRev } = profile;
  if (distractor.kind === 'tick-train') {
    const order = distractor.order ?? chooseDistractorOrder(rng, drive);
    const amplitude = distractor.amplitude ?? 0.4;
    const ringHz = Math.min(0.42 * sampleRateHz, Math.max(1500, resonanceHz * (rng.uniform() < 0.5 ? 0.6 : 1.4)));
    const train = impactTrain(rng, profile, order, 0.01, () => amplitude);
    addRings(out, sampleRateHz, train.timesS, train.amps, { freqHz: ringHz, damping: 0.06 });
    return { kind: 'tick-train', order, amplitude, ringHz, events: train.timesS.length };
  }
  const amplitude = distractor.amplitude ?? 1;
  const ringHz = rng.between(600, 1200);
  const durationS = thetaRev.length / sampleRateHz;
  const times: number[] = [];
  for (let t = rng.between(0, 0.7); t < durationS; t += rng.between(0.2, 1.1)) times.push(t);
  const amps = times.map(() => amplitude * rng.between(0.5, 1.5));
  addRings(out, sampleRateHz, times, amps, { freqHz: ringHz, damping: 0.1 });
  return { kind: 'clunk', order: null, amplitude, ringHz, events: times.length };
}
