/**
 * Crank angle against time for a generated capture. Speed = base rpm × (1 + slow wander) × (1 +
 * small firing-order fluctuation), the base rpm held or ramping linearly to `rpmEnd`; the wander is a sum of three slow sinusoids (0.08–0.7 Hz) and a
 * smoothed random walk, scaled so its largest excursion is exactly ±wanderPct. The angle is the
 * running sum of speed × dt in float64, in crank revolutions, with 0 = cylinder-1 TDC (power
 * stroke) so that 2 revolutions are one 720° engine cycle.
 */
import type { Rng } from './prng';

/** Inputs of `synthesizeSpeedProfile`. */
export interface SpeedProfileInput {
  sampleRateHz: number;
  samples: number;
  rpm: number;
  /** Base speed at the end of the capture (a linear ramp from `rpm`); null = held. */
  rpmEnd?: number | null;
  wanderPct: number;
  firingFluctuationPct: number;
  cylinders: number;
}

/** Crank angle at every sample, in revolutions from cylinder-1 TDC (float64, increasing). */
export interface SpeedProfile {
  sampleRateHz: number;
  thetaRev: Float64Array;
}

/**
 * Synthesises θ(t). The firing fluctuation is angle-locked at the firing order (cylinders/2 per
 * revolution), as a four-stroke crank speeds up at each power stroke (common practice).
 */
export function synthesizeSpeedProfile(rng: Rng, input: SpeedProfileInput): SpeedProfile {
  const { sampleRateHz, samples, rpm, wanderPct, firingFluctuationPct, cylinders } = input;
  const dt = 1 / sampleRateHz;
  const durationS = samples * dt;
  const wander = slowWander(rng, samples, sampleRateHz, durationS, wanderPct / 100);
  const firingOrder = cylinders / 2;
  const fluct = firingFluctuationPct / 100;
  const fluctPhase = rng.between(0, 2 * Math.PI);
  const thetaRev = new Float64Array(samples);
  let theta = rng.between(0, 2);
  const startRevPerS = rpm / 60;
  const slopeRevPerS2 = input.rpmEnd != null ? (input.rpmEnd - rpm) / 60 / durationS : 0;
  for (let i = 0; i < samples; i++) {
    thetaRev[i] = theta;
    const speed = (startRevPerS + slopeRevPerS2 * i * dt) * (1 + wander[i]) * (1 + fluct * Math.sin(2 * Math.PI * firingOrder * theta + fluctPhase));
    theta += speed * dt;
  }
  return { sampleRateHz, thetaRev };
}

function slowWander(rng: Rng, samples: number, sampleRateHz: number, durationS: number, peak: number): Float64Array {
  const out = new Float64Array(samples);
  if (peak === 0) return out;
  const tones = [0, 1, 2].map(() => ({ f: rng.between(0.08, 0.7), a: rng.between(0.3, 1), p: rng.between(0, 2 * Math.PI) }));
  // Random walk at 10 Hz, then linear interpolation: smooth on the scale of a revolution.
  const walkRate = 10;
  const knots = Math.ceil(durationS * walkRate) + 2;
  const walk = new Float64Array(knots);
  for (let k = 1; k < knots; k++) walk[k] = 0.97 * walk[k - 1] + 0.12 * rng.normal();
  let max = 0;
  for (let i = 0; i < samples; i++) {
    const t = i / sampleRateHz;
    let w = 0;
    for (const tone of tones) w += tone.a * Math.sin(2 * Math.PI * tone.f * t + tone.p);
    const x = t * walkRate;
    const k = Math.floor(x);
    w += walk[k] + (walk[k + 1] - walk[k]) * (x - k);
    out[i] = w;
    max = Math.max(max, Math.abs(w));
  }
  const scale = max > 0 ? peak / max : 0;
  for (let i = 0; i < samples; i++) out[i] *= scale;
  return out;
}

/**
 * Times (s) at which θ reaches each of the given angles (revolutions, ascending); angles outside
 * the capture are dropped. Linear interpolation inside a sample step (θ is smooth on that scale).
 */
export function timesAtAngles(profile: SpeedProfile, anglesRev: ArrayLike<number>): { timesS: Float64Array; anglesRev: Float64Array } {
  const { thetaRev, sampleRateHz } = profile;
  const n = thetaRev.length;
  const times: number[] = [];
  const kept: number[] = [];
  let i = 0;
  for (let k = 0; k < anglesRev.length; k++) {
    const target = anglesRev[k];
    if (target < thetaRev[0] || target > thetaRev[n - 1]) continue;
    while (i < n - 2 && thetaRev[i + 1] < target) i++;
    const frac = (target - thetaRev[i]) / (thetaRev[i + 1] - thetaRev[i]);
    times.push((i + frac) / sampleRateHz);
    kept.push(target);
  }
  return { timesS: Float64Array.from(times), anglesRev: Float64Array.from(kept) };
}

/**
 * Speed summary over whole revolutions: mean = revolutions / time between the first and last
 * whole-revolution crossings; min and max over per-revolution speeds (the `analyze` meanings).
 */
export function speedSummary(profile: SpeedProfile): { mean: number; min: number; max: number } {
  const { thetaRev } = profile;
  const first = Math.ceil(thetaRev[0]);
  const last = Math.floor(thetaRev[thetaRev.length - 1]);
  const marks: number[] = [];
  for (let r = first; r <= last; r++) marks.push(r);
  const { timesS } = timesAtAngles(profile, marks);
  if (timesS.length < 2) {
    const span = thetaRev[thetaRev.length - 1] - thetaRev[0];
    const rpm = (span / ((thetaRev.length - 1) / profile.sampleRateHz)) * 60;
    return { mean: rpm, min: rpm, max: rpm };
  }
  let min = Infinity;
  let max = -Infinity;
  for (let k = 1; k < timesS.length; k++) {
    const rpm = 60 / (timesS[k] - timesS[k - 1]);
    min = Math.min(min, rpm);
    max = Math.max(max, rpm);
  }
  const mean = ((timesS.length - 1) / (timesS[timesS.length - 1] - timesS[0])) * 60;
  return { mean, min, max };
}

/** The crank speed in rpm at each sample (central difference of θ). */
export function rpmAtSamples(profile: SpeedProfile): Float64Array {
  const { thetaRev, sampleRateHz } = profile;
  const n = thetaRev.length;
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - 1);
    const b = Math.min(n - 1, i + 1);
    out[i] = ((thetaRev[b] - thetaRev[a]) / ((b - a) / sampleRateHz)) * 60;
  }
  return out;
}
