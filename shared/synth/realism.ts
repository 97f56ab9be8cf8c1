/**
 * What the realistic generator adds to today's captures (option `realism: 'real'`), so the
 * project's own sweeps stop flattering the method. Each piece follows what real recordings show:
 * - combustion varies from cycle to cycle: each firing event rings the block with an amplitude
 *   drawn log-normally (σ 0.3), so the residual after the 720° average keeps a 0.5-order comb
 *   (a coefficient of variation of IMEP of a few percent and far more in the knock band is
 *   common, J. B. Heywood, Internal Combustion Engine Fundamentals, ch. 9 [from memory]);
 * - every rotating part turns: a healthy 1× (and a weaker 2×) at each part's own speed, with
 *   amplitudes 0.02–0.08 of the firing line (unbalance within grade; common practice);
 * - a structure has several resonances of finite Q: bearing and belt impacts ring three modes
 *   (the drawn resonance and two more at 0.5–1.8× of it, damping ratio 0.02–0.08);
 * - sideband depths are drawn over a published-like range instead of fixed values: an inner
 *   race's shaft modulation 0.3–1.5 (real inner-race sidebands can exceed their carrier), an
 *   outer ring's 0.2–1.0, a ball's cage modulation 0–0.9 (real ball faults often show none;
 *   W. A. Smith and R. B. Randall 2015 on the CWRU data).
 * Pure: every draw comes from the generator's seeded streams.
 */
import type { DriveDocument } from '../drive/types';
import { speedRatio } from '../drive/kinematics';
import type { Rng } from './prng';
import { addRings, type RingMode } from './rings';
import { timesAtAngles, type SpeedProfile } from './speed-profile';

/** Log-normal spread of each firing event's amplitude (cycle-to-cycle variation). */
export const COMBUSTION_SIGMA = 0.3;
/** Healthy 1× amplitude range of every rotating part (firing line = 1). */
export const HEALTHY_SHAFT_RANGE: [number, number] = [0.02, 0.08];
/** Sideband (modulation) depth ranges per fault kind. */
export const MODULATION_DEPTH_RANGE = { inner_race: [0.3, 1.5], outer_ring: [0.2, 1.0], ball: [0, 0.9] } as const;

/** Three structural modes around the drawn resonance (the first is the resonance itself). */
export function structuralModes(rng: Rng, resonanceHz: number, sampleRateHz: number): RingMode[] {
  const modes: RingMode[] = [{ freqHz: resonanceHz, damping: rng.between(0.02, 0.08) }];
  for (let k = 0; k < 2; k++) {
    const f = Math.min(resonanceHz * rng.between(0.5, 1.8), 0.4 * sampleRateHz);
    modes.push({ freqHz: f, damping: rng.between(0.02, 0.08) });
  }
  return modes;
}

/** Adds one ringing impulse per firing event with a log-normal amplitude (mean about `level`·0.3). */
export function addCombustionVariation(out: Float64Array, rng: Rng, profile: SpeedProfile, cylinders: number, level: number, mode: RingMode): void {
  const { thetaRev } = profile;
  const perRev = cylinders / 2;
  const first = Math.ceil(thetaRev[0] * perRev);
  const last = Math.floor(thetaRev[thetaRev.length - 1] * perRev);
  const angles: number[] = [];
  for (let i = first; i <= last; i++) angles.push(i / perRev);
  const { timesS } = timesAtAngles(profile, angles);
  const amps = Float64Array.from(timesS, () => 0.3 * level * Math.exp(COMBUSTION_SIGMA * rng.normal() - COMBUSTION_SIGMA ** 2 / 2));
  addRings(out, profile.sampleRateHz, timesS, amps, mode);
}

/** Adds a healthy 1× and ½-as-strong 2× at every rotating part's speed (nominal ratio less `creepPct` on belt-driven parts). */
export function addHealthyShaftLines(out: Float64Array, rng: Rng, profile: SpeedProfile, drive: DriveDocument, creepPct: number): void {
  const { thetaRev } = profile;
  for (const c of drive.components) {
    if (c.kind === 'crankshaft') continue;
    const ratio = speedRatio(drive, c.name);
    const order = c.fixedRatio !== undefined ? ratio : ratio * (1 - creepPct / 100);
    const a1 = rng.between(HEALTHY_SHAFT_RANGE[0], HEALTHY_SHAFT_RANGE[1]);
    const p1 = rng.between(0, 2 * Math.PI);
    const p2 = rng.between(0, 2 * Math.PI);
    for (let i = 0; i < out.length; i++) {
      const th = 2 * Math.PI * order * thetaRev[i];
      out[i] += a1 * Math.cos(th + p1) + 0.5 * a1 * Math.cos(2 * th + p2);
    }
  }
}
