/**
 * The engine's own contribution to a generated pickup signal: crank-angle-locked vibration at
 * every 0.5-order multiple (firing orders = multiples of cylinders/2 strongest; docs/references.md §5,
 * common practice) and injector-like ticks at fixed angles of the 720° cycle (short bursts ringing
 * at 2–3 kHz, one cylinder's loudest).
 */
import type { Rng } from './prng';
import type { InjectorTick } from './options';
import type { TruthTick } from './truth';
import { addRings } from './rings';
import { timesAtAngles, type SpeedProfile } from './speed-profile';

/** Highest engine order drawn. */
const MAX_ENGINE_ORDER = 12;

/**
 * Amplitudes of the engine lines: the n-th firing harmonic has level/n; other half-orders a
 * seeded 0.05–0.25 × level, falling with order.
 */
export function engineOrderLines(rng: Rng, cylinders: number, level: number): Array<{ order: number; amplitude: number; phase: number }> {
  const firing = cylinders / 2;
  const lines: Array<{ order: number; amplitude: number; phase: number }> = [];
  for (let k = 1; k <= 2 * MAX_ENGINE_ORDER; k++) {
    const order = k / 2;
    const harmonic = order / firing;
    const isFiring = Math.abs(harmonic - Math.round(harmonic)) < 1e-9;
    const amplitude = isFiring ? level / harmonic : level * rng.between(0.05, 0.25) * Math.exp(-order / 6);
    lines.push({ order, amplitude, phase: rng.between(0, 2 * Math.PI) });
  }
  return lines;
}

/**
 * Adds the engine lines to `out` (in place), each cos(2π·order·θ + phase) with θ in revolutions.
 * Every order is a multiple of 0.5, so the k-th half-order phasor is the k-th power of e^(iπθ)
 * (one cos/sin pair per sample instead of one per line).
 */
export function addEngineVibration(out: Float64Array, profile: SpeedProfile, lines: ReadonlyArray<{ order: number; amplitude: number; phase: number }>): void {
  const { thetaRev } = profile;
  const maxK = Math.max(0, ...lines.map((l) => Math.round(l.order * 2)));
  const ampC = new Float64Array(maxK + 1);
  const ampS = new Float64Array(maxK + 1);
  for (const line of lines) {
    const k = Math.round(line.order * 2);
    if (Math.abs(k / 2 - line.order) > 1e-12) throw new RangeError(`engine lines must sit on 0.5-order multiples, got ${line.order}`);
    // a·cos(kφ + p) = a·cos p·cos kφ − a·sin p·sin kφ
    ampC[k] += line.amplitude * Math.cos(line.phase);
    ampS[k] += line.amplitude * Math.sin(line.phase);
  }
  for (let i = 0; i < out.length; i++) {
    const phi = Math.PI * thetaRev[i];
    const c1 = Math.cos(phi);
    const s1 = Math.sin(phi);
    let c = c1;
    let s = s1;
    let v = 0;
    for (let k = 1; k <= maxK; k++) {
      v += ampC[k] * c - ampS[k] * s;
      const cNext = c * c1 - s * s1;
      s = s * c1 + c * s1;
      c = cNext;
    }
    out[i] += v;
  }
}

/**
 * The default injector pattern: each cylinder's tick at its TDC + a seeded 385–415°, amplitude
 * 0.2–0.3 × level, one seeded cylinder's tick 0.9 × level (the loudest).
 */
export function defaultInjectorTicks(rng: Rng, firingOrder: readonly number[], level: number): InjectorTick[] {
  const c = firingOrder.length;
  const base = rng.between(385, 415);
  const loudest = firingOrder[Math.floor(rng.uniform() * c)];
  return firingOrder.map((cylinder, slot) => ({
    cylinder,
    angleDeg: mod(slot * (720 / c) + base + rng.between(-3, 3), 720),
    amplitude: cylinder === loudest ? 0.9 * level : level * rng.between(0.2, 0.3),
  }));
}

/** The firing slot an angle falls in: slot i = [i·720/c, (i+1)·720/c) belongs to firingOrder[i]. */
export function slotOf(angleDeg: number, firingOrder: readonly number[]): { slotIndex: number; slotCylinder: number; afterTdcDeg: number } {
  const width = 720 / firingOrder.length;
  const a = mod(angleDeg, 720);
  const slotIndex = Math.min(firingOrder.length - 1, Math.floor(a / width));
  return { slotIndex, slotCylinder: firingOrder[slotIndex], afterTdcDeg: a - slotIndex * width };
}

/** Describes the planted ticks with their slots. */
export function describeTicks(ticks: readonly InjectorTick[], firingOrder: readonly number[]): TruthTick[] {
  return ticks.map((t) => ({ cylinder: t.cylinder, angleDeg: t.angleDeg, amplitude: t.amplitude, ...slotOf(t.angleDeg, firingOrder) }));
}

/**
 * Adds the injector ticks (every cycle, ±10 % amplitude scatter) ringing at `ringHz` ± 5 % per
 * cylinder, damping ratio 0.08.
 */
export function addInjectorTicks(out: Float64Array, rng: Rng, profile: SpeedProfile, ticks: readonly InjectorTick[], ringHz: number): void {
  const { thetaRev, sampleRateHz } = profile;
  const cycles = [Math.floor(thetaRev[0] / 2) - 1, Math.ceil(thetaRev[thetaRev.length - 1] / 2) + 1];
  for (const tick of ticks) {
    const angles: number[] = [];
    for (let cycle = cycles[0]; cycle <= cycles[1]; cycle++) angles.push(cycle * 2 + tick.angleDeg / 360);
    const { timesS } = timesAtAngles(profile, angles);
    const amps = Float64Array.from(timesS, () => tick.amplitude * (1 + 0.1 * rng.normal()));
    addRings(out, sampleRateHz, timesS, amps, { freqHz: ringHz * rng.between(0.95, 1.05), damping: 0.08 });
  }
}

function mod(a: number, m: number): number {
  return ((a % m) + m) % m;
}
