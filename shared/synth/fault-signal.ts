/**
 * The planted fault of a generated capture (one per capture), locked to crank angle through the
 * part's speed: part order = nominal ratio × (1 − creep), creep being the total between crank and
 * part (fixed-ratio parts: no creep; docs/references.md §5). A belt runs at its driving groove's speed,
 * so a belt driven by a belt-driven part carries that part's creep.
 *
 * - shaft: 1× and 2× sinusoids at the part's speed (unbalance, misalignment);
 * - bearing faults: impacts ringing the structural resonance at the defect rate, with spacing
 *   jitter and the modulation of which ring turns (docs/references.md §1): outer race with the inner
 *   ring turning unmodulated, with the outer ring turning modulated at the pulley's 1×; inner race
 *   (inner ring turning) modulated at 1× shaft (load zone); ball at 2×BSF modulated at the cage
 *   speed; cage impacts at FTF;
 * - rolling slip as a cage lag s (docs/references.md §4): the cage turns at FTF·(1 − s) of the turning
 *   ring, so the fixed race's line n·FTF·(1 − s) falls, the turning race's line n·(1 − FTF·(1 − s))
 *   rises (n = BPFO + BPFI), ball spin falls by s;
 * - belt: a once-per-belt-revolution defect: a tension ripple (belt-pass order and its 2×, 3×)
 *   plus a slap ringing the resonance.
 */
import type { DriveDocument } from '../drive/types';
import { bearingFactors } from '../drive/bearing-factors';
import { beltPassOrder, beltStages, findBelt, findComponent, speedRatio } from '../drive/kinematics';
import type { Rng } from './prng';
import type { PlantedFault } from './options';
import type { TruthFault } from './truth';
import { addRings, type RingMode } from './rings';
import { timesAtAngles, type SpeedProfile } from './speed-profile';

/** Default amplitude per fault kind (pickup units; the firing-order line is 1.0). */
export const DEFAULT_FAULT_AMPLITUDE = { shaft: 0.3, outer_race: 0.4, inner_race: 0.4, ball: 0.4, cage: 0.4, belt: 0.25 } as const;

/** Inputs that shape the planted fault beyond its kind. */
export interface FaultShape {
  creepPct: number;
  rollingSlipPct: number;
  impactJitterPct: number;
  resonanceHz: number;
  /** Structural modes the impacts ring (the realistic generator's several resonances); default one mode at `resonanceHz`, damping 0.05. */
  modes?: RingMode[];
  /** Modulation (sideband) depth of a modulated fault; default the kind's fixed depth (0.5 outer ring, 0.8 inner race, 0.7 ball). */
  modulationDepth?: number;
}

/** Relative amplitude of each further structural mode an impact rings (the first mode 1). */
const MODE_WEIGHTS = [1, 0.5, 0.35];

function ring(signal: Float64Array, fs: number, timesS: Float64Array, amps: Float64Array, modes: RingMode[]): void {
  modes.forEach((mode, k) => {
    const w = MODE_WEIGHTS[k] ?? 0.25;
    addRings(signal, fs, timesS, w === 1 ? amps : amps.map((a) => w * a), mode);
  });
}

/** Synthesises the planted fault's signal (alone) and its truth. Throws RangeError for a name the drive lacks. */
export function synthesizeFault(rng: Rng, profile: SpeedProfile, drive: DriveDocument, fault: PlantedFault, shape: FaultShape): { signal: Float64Array; truth: TruthFault } {
  const signal = new Float64Array(profile.thetaRev.length);
  const amplitude = fault.amplitude ?? DEFAULT_FAULT_AMPLITUDE[fault.fault];
  const creep = shape.creepPct / 100;
  const modes = shape.modes ?? [{ freqHz: shape.resonanceHz, damping: 0.05 }];
  const depth = (fixed: number) => shape.modulationDepth ?? fixed;
  if (fault.fault === 'belt') {
    const belt = findBelt(drive, fault.component);
    if (!belt) throw new RangeError(`a belt fault needs a belt name; "${fault.component}" is not one of: ${drive.belts.map((b) => b.name).join(', ')}`);
    const driverOrder = speedRatio(drive, belt.driver) * (beltStages(drive, belt.driver) > 0 ? 1 - creep : 1);
    const order = beltPassOrder(drive, belt.name) * driverOrder / speedRatio(drive, belt.driver);
    addHarmonics(signal, rng, profile, order, [amplitude, 0.5 * amplitude, 0.3 * amplitude]);
    const slap = impactTrain(rng, profile, order, shape.impactJitterPct / 100, () => 1.5 * amplitude);
    ring(signal, profile.sampleRateHz, slap.timesS, slap.amps, modes);
    return {
      signal,
      truth: {
        component: belt.name, target: 'belt', fault: 'belt', ratio: speedRatio(drive, belt.driver),
        creepPct: beltStages(drive, belt.driver) > 0 ? shape.creepPct : 0, rollingSlipPct: 0, partOrder: driverOrder, line: 'belt pass 1x', spectrum: 'orders',
        nominalOrder: beltPassOrder(drive, belt.name), plantedOrder: order, bearingLineOrder: null, modulationOrder: null,
        factors: null, rotatingRing: null, amplitude,
      },
    };
  }
  const component = findComponent(drive, fault.component);
  if (!component) throw new RangeError(`no component named "${fault.component}"; the drive has: ${drive.components.map((c) => c.name).join(', ')}`);
  const ratio = speedRatio(drive, component.name);
  const partOrder = component.fixedRatio !== undefined || component.kind === 'crankshaft' ? ratio : ratio * (1 - creep);
  const base = {
    component: component.name, target: 'component' as const, fault: fault.fault, ratio, creepPct: component.fixedRatio !== undefined || component.kind === 'crankshaft' ? 0 : shape.creepPct,
    partOrder, amplitude,
  };
  if (fault.fault === 'shaft') {
    addHarmonics(signal, rng, profile, partOrder, [amplitude, 0.5 * amplitude]);
    return {
      signal,
      truth: { ...base, rollingSlipPct: 0, line: 'shaft 1x', spectrum: 'orders', nominalOrder: ratio, plantedOrder: partOrder,
        bearingLineOrder: null, modulationOrder: null, factors: null, rotatingRing: null },
    };
  }
  const bearing = bearingFactors(component.bearing);
  const f = bearing.factors;
  const ringTurns = bearing.rotatingRing;
  const s = shape.rollingSlipPct / 100;
  const cage = f.ftf * (1 - s);
  // With n = BPFO + BPFI: fixed race n·FTF·(1 − s) = its factor × (1 − s); turning race
  // n·(1 − FTF·(1 − s)) = its factor + the fixed race's factor × s (turning-ring revolutions).
  let factor: number; let rate: number; let label: string; let modulation: { order: number; depth: number } | null = null;
  switch (fault.fault) {
    case 'outer_race':
      factor = f.bpfo; label = 'BPFO 1x';
      rate = ringTurns === 'outer' ? f.bpfo + f.bpfi * s : f.bpfo * (1 - s);
      if (ringTurns === 'outer') modulation = { order: partOrder, depth: depth(0.5) };
      break;
    case 'inner_race':
      factor = f.bpfi; label = 'BPFI 1x';
      rate = ringTurns === 'inner' ? f.bpfi + f.bpfo * s : f.bpfi * (1 - s);
      if (ringTurns === 'inner') modulation = { order: partOrder, depth: depth(0.8) };
      break;
    case 'ball':
      factor = 2 * f.bsf; label = '2xBSF 1x'; rate = 2 * f.bsf * (1 - s);
      modulation = { order: cage * partOrder, depth: depth(0.7) };
      break;
    default:
      factor = f.ftf; label = 'FTF 1x'; rate = cage;
  }
  const lineOrder = rate * partOrder;
  const phase = rng.between(0, 2 * Math.PI);
  const train = impactTrain(rng, profile, lineOrder, shape.impactJitterPct / 100, (theta) =>
    amplitude * (modulation ? 1 + modulation.depth * Math.cos(2 * Math.PI * modulation.order * theta + phase) : 1));
  ring(signal, profile.sampleRateHz, train.timesS, train.amps, modes);
  return {
    signal,
    truth: {
      ...base, rollingSlipPct: shape.rollingSlipPct, line: label, spectrum: 'envelope', nominalOrder: ratio * factor,
      plantedOrder: lineOrder, bearingLineOrder: lineOrder, modulationOrder: modulation ? modulation.order : null,
      factors: { ...f }, rotatingRing: ringTurns,
    },
  };
}

/**
 * Impact times for a train at `order` impacts per crank revolution: impact i at
 * (i + φ + δᵢ) / order revolutions, where δ is an AR(1) sequence (coefficient 0.7) whose
 * innovations have standard deviation `jitter` (spacing jitter about `jitter` of the period; the
 * mean rate stays exact, so the line stays at `order`). Amplitudes scatter ±10 %.
 */
export function impactTrain(rng: Rng, profile: SpeedProfile, order: number, jitter: number, amplitudeAt: (thetaRev: number) => number): { timesS: Float64Array; amps: Float64Array } {
  const { thetaRev } = profile;
  const first = Math.floor(thetaRev[0] * order) - 2;
  const last = Math.ceil(thetaRev[thetaRev.length - 1] * order) + 2;
  const offset = rng.uniform();
  const angles: number[] = [];
  let delta = 0;
  for (let i = first; i <= last; i++) {
    delta = 0.7 * delta + jitter * rng.normal();
    angles.push((i + offset + delta) / order);
  }
  angles.sort((a, b) => a - b);
  const { timesS, anglesRev } = timesAtAngles(profile, angles);
  const amps = Float64Array.from(anglesRev, (theta) => Math.max(0, amplitudeAt(theta) * (1 + 0.1 * rng.normal())));
  return { timesS, amps };
}

/** Adds Σ aₖ·cos(2π·k·order·θ + φₖ) (k = 1, 2, …) to `out`. */
function addHarmonics(out: Float64Array, rng: Rng, profile: SpeedProfile, order: number, amplitudes: number[]): void {
  const phases = amplitudes.map(() => rng.between(0, 2 * Math.PI));
  const { thetaRev } = profile;
  for (let i = 0; i < out.length; i++) {
    let v = 0;
    for (let k = 0; k < amplitudes.length; k++) v += amplitudes[k] * Math.cos(2 * Math.PI * (k + 1) * order * thetaRev[i] + phases[k]);
    out[i] += v;
  }
}
