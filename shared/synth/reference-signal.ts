/**
 * The reference channel (and the optional cam channel) of a generated capture, drawn from θ(t).
 *
 * Ignition-like pulses (cyl1, per-rev, per-cylinder, generic N per cycle): a raised-cosine rise
 * whose half-amplitude point is exactly the edge, then a decaying ring (an ignition lead seen by an
 * inductive clamp rings at a few kHz; common practice). Wasted spark: one pulse per revolution,
 * the exhaust-stroke spark weaker and optionally of the other polarity (docs/references.md §5).
 * Trigger wheel: a variable-reluctance sensor gives one sine period per tooth pitch, rising
 * through zero at each tooth's edge, amplitude growing with speed and nothing across the gap; a
 * Hall sensor gives a square wave high for the first half of each pitch. The reference edge is at
 * crank angle −tdcOffsetDeg (so the TDC offset is the degrees from the edge to cylinder-1 TDC); a
 * wheel's reference edge is the first tooth after its gap.
 */
import type { Rng } from './prng';
import type { GenerateOptions } from './options';
import { parseWheelPattern } from './options';
import { rpmAtSamples, timesAtAngles, type SpeedProfile } from './speed-profile';

/** The drawn reference and what it holds. */
export interface ReferenceSignal {
  signal: Float64Array;
  /** Pulse or tooth edges inside the capture. */
  edges: number;
  /** Complete wheel gaps inside the capture (0 for pulse references). */
  gaps: number;
  /** Crank angle of the reference edge in the cycle, degrees in [0, 720). */
  edgeAngleDeg: number;
}

const PULSE_VOLTS = 2;
const VR_VOLTS_PER_KRPM = 1.5;
const HALL_VOLTS = 5;
const NOISE_FRACTION = 0.01;

type RefOptions = Pick<GenerateOptions, 'refKind' | 'refPerCycle' | 'wheel' | 'wheelSensor' | 'refPolarity' | 'tdcOffsetDeg'
  | 'ringing' | 'wastedSparkRatio' | 'wastedSparkInverted'>;

/** Crank angle of the reference edge in revolutions, in [0, 2). */
export function referenceEdgeRev(tdcOffsetDeg: number): number {
  return mod(-tdcOffsetDeg / 360, 2);
}

/** Ignition-like pulses per 720° cycle for a pulse reference (null for a wheel). */
export function pulsesPerCycle(options: Pick<GenerateOptions, 'refKind' | 'refPerCycle'>, cylinders: number): number | null {
  if (options.refPerCycle !== null) return options.refPerCycle;
  switch (options.refKind) {
    case 'cyl1': return 1;
    case 'per-rev': return 2;
    case 'per-cylinder': return cylinders;
    case 'wheel': return null;
  }
}

/** Draws the reference channel. */
export function synthesizeReference(rng: Rng, profile: SpeedProfile, options: RefOptions, cylinders: number): ReferenceSignal {
  const perCycle = pulsesPerCycle(options, cylinders);
  const edgeRev = referenceEdgeRev(options.tdcOffsetDeg);
  const drawn = perCycle === null
    ? wheelReference(profile, options, edgeRev)
    : pulseReference(rng, profile, options, perCycle, edgeRev);
  const sign = options.refPolarity === 'falling' ? -1 : 1;
  const noise = NOISE_FRACTION * (perCycle === null ? HALL_VOLTS / 2 : PULSE_VOLTS);
  const signal = drawn.signal;
  for (let i = 0; i < signal.length; i++) signal[i] = sign * signal[i] + noise * rng.normal();
  return { ...drawn, edgeAngleDeg: edgeRev * 360 };
}

function pulseReference(rng: Rng, profile: SpeedProfile, options: RefOptions, perCycle: number, edgeRev: number) {
  const { thetaRev, sampleRateHz } = profile;
  const n = thetaRev.length;
  const spacing = 2 / perCycle;
  const angles: number[] = [];
  const kFirst = Math.floor((thetaRev[0] - edgeRev) / spacing) - 1;
  for (let k = kFirst; edgeRev + k * spacing <= thetaRev[n - 1] + spacing; k++) angles.push(edgeRev + k * spacing);
  const { timesS, anglesRev } = timesAtAngles(profile, angles);
  const wasted = options.refPerCycle === null && options.refKind === 'per-rev';
  const riseS = Math.max(40e-6, 2.5 / sampleRateHz);
  const ringHz = Math.min(5000, 0.2 * sampleRateHz);
  const decayS = options.ringing ? 0.35e-3 : 0.5e-3;
  const span = riseS / 2 + 8 * decayS;
  const signal = new Float64Array(n);
  for (let k = 0; k < timesS.length; k++) {
    // The compression-stroke spark is at an even revolution from the edge angle; the wasted one at an odd.
    const exhaust = wasted && mod(Math.round(anglesRev[k] - edgeRev), 2) === 1;
    const amp = PULSE_VOLTS * (1 + 0.05 * rng.normal()) * (exhaust ? options.wastedSparkRatio : 1)
      * (exhaust && options.wastedSparkInverted ? -1 : 1);
    const te = timesS[k];
    const i0 = Math.max(0, Math.ceil((te - riseS / 2) * sampleRateHz));
    const i1 = Math.min(n, Math.ceil((te + span) * sampleRateHz));
    for (let i = i0; i < i1; i++) {
      const tau = i / sampleRateHz - te;
      let v: number;
      if (tau < riseS / 2) v = 0.5 * (1 - Math.cos((Math.PI * (tau + riseS / 2)) / riseS));
      else {
        const after = tau - riseS / 2;
        v = Math.exp(-after / decayS) * (options.ringing ? Math.cos(2 * Math.PI * ringHz * after) : 1);
      }
      signal[i] += amp * v;
    }
  }
  return { signal, edges: timesS.length, gaps: 0 };
}

function wheelReference(profile: SpeedProfile, options: RefOptions, edgeRev: number) {
  const { thetaRev, sampleRateHz } = profile;
  const n = thetaRev.length;
  const { pitches, missing } = parseWheelPattern(options.wheel);
  const teeth = pitches - missing;
  const pitchDeg = 360 / pitches;
  const rpm = rpmAtSamples(profile);
  const signal = new Float64Array(n);
  const present = (cell: number) => cell >= 0 && cell < teeth;
  for (let i = 0; i < n; i++) {
    const phiDeg = mod((thetaRev[i] - edgeRev) * 360, 360);
    const cell = Math.floor(phiDeg / pitchDeg);
    const u = phiDeg - cell * pitchDeg;
    if (options.wheelSensor === 'vr') {
      // The flanks beside the gap swing a little further (a longer air gap change).
      const gain = cell === 0 || cell === teeth - 1 ? 1.2 : 1;
      signal[i] = present(cell) ? VR_VOLTS_PER_KRPM * (rpm[i] / 1000) * gain * Math.sin((2 * Math.PI * u) / pitchDeg) : 0;
    } else {
      // Transition width of about 2.5 samples, centred on the edge (half level exactly at the edge).
      const widthDeg = (2.5 * 6 * rpm[i]) / sampleRateHz;
      let level: number;
      if (u < pitchDeg / 4) level = present(cell) ? ramp(u / widthDeg) : 0;
      else if (u > (3 * pitchDeg) / 4) level = present((cell + 1) % pitches) ? ramp((u - pitchDeg) / widthDeg) : 0;
      else level = present(cell) ? ramp((pitchDeg / 2 - u) / widthDeg) : 0;
      signal[i] = HALL_VOLTS * level;
    }
  }
  // Edges: every present tooth's leading edge inside the capture; gaps: both flanking teeth inside.
  const firstRev = Math.floor(thetaRev[0] - edgeRev) - 1;
  const lastRev = Math.ceil(thetaRev[n - 1] - edgeRev) + 1;
  let edges = 0;
  let gaps = 0;
  const inside = (rev: number) => rev >= thetaRev[0] && rev <= thetaRev[n - 1];
  for (let r = firstRev; r <= lastRev; r++) {
    for (let k = 0; k < teeth; k++) if (inside(edgeRev + r + (k * pitchDeg) / 360)) edges++;
    if (inside(edgeRev + r + ((teeth - 1) * pitchDeg) / 360) && inside(edgeRev + r + 1)) gaps++;
  }
  return { signal, edges, gaps };
}

/**
 * The cam channel: a Hall-type level high for 180° of crank once per 720° cycle, its rising edge
 * `camLeadDeg` before cylinder-1's reference edge (so the next reference edge after the cam edge
 * is cylinder 1's). Returns the signal and the cam edge's crank angle (degrees in [0, 720)).
 */
export function synthesizeCam(rng: Rng, profile: SpeedProfile, tdcOffsetDeg: number, camLeadDeg: number): { signal: Float64Array; edgeAngleDeg: number } {
  const { thetaRev, sampleRateHz } = profile;
  const n = thetaRev.length;
  const camEdgeRev = mod(referenceEdgeRev(tdcOffsetDeg) - camLeadDeg / 360, 2);
  const rpm = rpmAtSamples(profile);
  const signal = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const u = mod(thetaRev[i] - camEdgeRev, 2);
    const widthRev = (2.5 * rpm[i]) / 60 / sampleRateHz;
    const rising = ramp((u > 1 ? u - 2 : u) / widthRev);
    const falling = ramp((0.5 - u) / widthRev);
    signal[i] = HALL_VOLTS * Math.min(rising, falling) + NOISE_FRACTION * HALL_VOLTS * rng.normal();
  }
  return { signal, edgeAngleDeg: camEdgeRev * 360 };
}

/** Smooth step from 0 (x ≤ −½) to 1 (x ≥ ½), exactly ½ at 0. */
function ramp(x: number): number {
  if (x <= -0.5) return 0;
  if (x >= 0.5) return 1;
  return 0.5 - 0.5 * Math.cos(Math.PI * (x + 0.5));
}

function mod(a: number, m: number): number {
  return ((a % m) + m) % m;
}
