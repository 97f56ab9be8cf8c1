import { median } from '../dsp/stats';
import { type Warning } from './types';

/**
 * Repair of a pulse train with evenly spaced pulses (docs/design.md step 2): an extra pulse (a glitch,
 * or ringing past the dead time) splits one nominal interval in two and is removed — of the two
 * close pulses, the one that sits worse on the grid of the pulse before; a missed pulse
 * leaves an interval of about twice the nominal one and is inserted midway. Nominal = running
 * median of 9 intervals, so a ±5 % speed wander does not matter. Longer holes are counted as
 * their whole number of pitches (with a warning) so the angle stays right.
 */
export interface RepairedPulses {
  /** Pulse times (samples), including inserted ones. */
  times: Float64Array;
  /** Pitch index of each pulse (0 for the first): angle = pitchIndex × pitch. */
  pitchIndex: Float64Array;
  /** Detected pulses kept. */
  edges: number;
  /** Pulses removed plus pulses inserted. */
  repaired: number;
  warnings: Warning[];
}

function runningNominal(d: number[], half = 4): number[] {
  const out: number[] = new Array(d.length);
  for (let i = 0; i < d.length; i++) out[i] = median(d.slice(Math.max(0, i - half), Math.min(d.length, i + half + 1)));
  return out;
}

/** Removes single extra pulses and fills missed ones (see module comment). */
export function repairPulses(raw: number[]): RepairedPulses {
  const warnings: Warning[] = [];
  let removed = 0;
  const d0: number[] = [];
  for (let i = 1; i < raw.length; i++) d0.push(raw[i] - raw[i - 1]);
  const nom0 = runningNominal(d0);
  const kept: number[] = [raw[0]];
  for (let j = 1; j < raw.length; j++) {
    const nom = nom0[Math.min(j - 1, nom0.length - 1)];
    const dd = raw[j] - kept[kept.length - 1];
    if (dd < 0.6 * nom) {
      // Two pulses too close: keep the one that sits better on the grid of the one before.
      removed++;
      if (kept.length >= 2) {
        const prev = kept[kept.length - 2];
        const keepLast = Math.abs((kept[kept.length - 1] - prev) / nom - 1);
        const takeNew = Math.abs((raw[j] - prev) / nom - 1);
        if (takeNew < keepLast) kept[kept.length - 1] = raw[j];
      }
      continue;
    }
    kept.push(raw[j]);
  }
  const d: number[] = [];
  for (let i = 1; i < kept.length; i++) d.push(kept[i] - kept[i - 1]);
  const nom = runningNominal(d);
  const times: number[] = [kept[0]];
  const pitch: number[] = [0];
  let inserted = 0;
  let longHoles = 0;
  for (let i = 0; i < d.length; i++) {
    const k = Math.max(1, Math.round(d[i] / nom[i]));
    const p0 = pitch[pitch.length - 1];
    if (k === 2) {
      times.push(kept[i] + d[i] / 2);
      pitch.push(p0 + 1);
      inserted++;
    } else if (k > 2) longHoles++;
    times.push(kept[i + 1]);
    pitch.push(p0 + k);
  }
  if (longHoles > 0) {
    warnings.push({ code: 'reference_gaps', message: `${longHoles} gap${longHoles === 1 ? '' : 's'} of several missing reference pulses; angle bridged over them — check the reference lead` });
  }
  if (removed + inserted > Math.max(2, 0.05 * kept.length)) {
    warnings.push({ code: 'reference_repaired_often', message: `${removed + inserted} reference pulses repaired; check the reference lead and --ref-kind` });
  }
  return { times: Float64Array.from(times), pitchIndex: Float64Array.from(pitch), edges: kept.length, repaired: removed + inserted, warnings };
}
