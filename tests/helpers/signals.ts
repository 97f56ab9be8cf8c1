/**
 * Small deterministic test signals (no generator needed): tones, a seeded Gaussian source,
 * crank-angle profiles with slow wander, and reference pulse trains of every kind drawn from a
 * known θ(t). Angles in degrees, times in seconds.
 */
import { createRng } from '../../shared/synth/prng';

/** Seeded uniforms in [0, 1): the generator's mulberry32 (shared/synth/prng.ts), so there is one PRNG. */
export function rng(seed: number): () => number {
  const source = createRng(seed);
  return () => source.uniform();
}

/** Standard normal samples (Box–Muller). */
export function gaussian(n: number, seed: number): Float64Array {
  const u = rng(seed);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i += 2) {
    const r = Math.sqrt(-2 * Math.log(1 - u()));
    const a = 2 * Math.PI * u();
    out[i] = r * Math.cos(a);
    if (i + 1 < n) out[i + 1] = r * Math.sin(a);
  }
  return out;
}

/** A cos tone of amplitude `amp` at `freq` cycles per sample·fs (freq in Hz with rate fs). */
export function tone(n: number, freqHz: number, sampleRateHz: number, amp = 1, phase = 0): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = amp * Math.cos((2 * Math.PI * freqHz * i) / sampleRateHz + phase);
  return out;
}

/**
 * Crank angle θ(t) in degrees, sampled at fs: mean speed `rpm` with a slow sinusoidal wander of
 * ±wanderPct % (period `wanderPeriodS`), starting at θ0.
 */
export function crankProfile(n: number, sampleRateHz: number, rpm: number, wanderPct = 0, wanderPeriodS = 3.1, theta0 = 0): Float64Array {
  const th = new Float64Array(n);
  const w0 = (rpm / 60) * 360;
  const a = (wanderPct / 100) * w0;
  const om = (2 * Math.PI) / wanderPeriodS;
  for (let i = 0; i < n; i++) {
    const t = i / sampleRateHz;
    th[i] = theta0 + w0 * t + (a / om) * (1 - Math.cos(om * t));
  }
  return th;
}

/** Mean rpm of a profile over its whole length (what a speed measurement should report). */
export function meanRpmOf(theta: Float64Array, sampleRateHz: number): number {
  return ((theta[theta.length - 1] - theta[0]) / 360) * 60 / ((theta.length - 1) / sampleRateHz);
}

export interface PulseOptions {
  /** Pulse every `pitchDeg` crank degrees, first at `offsetDeg`. */
  pitchDeg: number;
  offsetDeg?: number;
  amp?: number;
  /** Pulse width in crank degrees. */
  widthDeg?: number;
  polarity?: 1 | -1;
  /** Damped ringing after each pulse (ignition-like), amplitude relative to the pulse. */
  ringing?: number;
  /** Weak pulse midway (wasted spark), amplitude relative; negative = other polarity. */
  wasted?: number;
  /** Indices of pulses to leave out (missed pulses). */
  skip?: number[];
  noise?: number;
  seed?: number;
}

/** A reference pulse train drawn from θ(t): narrow raised-cosine pulses at fixed angles. */
export function pulseTrain(theta: Float64Array, sampleRateHz: number, o: PulseOptions): Float32Array {
  const n = theta.length;
  const out = new Float32Array(n);
  const amp = o.amp ?? 1;
  const width = o.widthDeg ?? 3;
  const pol = o.polarity ?? 1;
  const off = o.offsetDeg ?? 0;
  const skip = new Set(o.skip ?? []);
  const noise = o.noise ? gaussian(n, o.seed ?? 1) : null;
  for (let i = 0; i < n; i++) {
    const rel = theta[i] - off;
    const k = Math.floor(rel / o.pitchDeg);
    const phase = rel - k * o.pitchDeg;
    let v = 0;
    if (!skip.has(k)) {
      if (phase < width) v += amp * Math.sin((Math.PI * phase) / width) ** 2;
      if (o.ringing) {
        const tAfter = (phase - width) / ((theta[Math.min(n - 1, i + 1)] - theta[i]) * sampleRateHz || 1);
        if (phase >= width && tAfter < 0.004) v += amp * o.ringing * Math.exp(-tAfter / 0.0008) * Math.sin(2 * Math.PI * 2500 * tAfter);
      }
      if (o.wasted) {
        const p2 = phase - o.pitchDeg / 2;
        if (p2 >= 0 && p2 < width) v += amp * o.wasted * Math.sin((Math.PI * p2) / width) ** 2;
      }
    }
    out[i] = pol * v + (noise ? o.noise! * noise[i] : 0);
  }
  return out;
}

/** A trigger wheel "teeth-missing" drawn from θ(t): square teeth (half the pitch high), gap after the last tooth. */
export function wheelSignal(theta: Float64Array, teeth: number, missing: number, gapStartDeg = 0): Float32Array {
  const out = new Float32Array(theta.length);
  const pitch = 360 / teeth;
  for (let i = 0; i < theta.length; i++) {
    const a = (((theta[i] - gapStartDeg) % 360) + 360) % 360;
    const tooth = Math.floor(a / pitch);
    // Teeth 0..missing-1 are the gap; angle 0 of the wheel convention = first tooth after the gap.
    const high = tooth >= missing && a - tooth * pitch < pitch / 2;
    out[i] = high ? 1 : 0;
  }
  return out;
}
