/**
 * What the Listen view does to the pickup channel before it plays, as a list of biquad filters
 * (Web Audio BiquadFilterNode settings), so the plan can be checked without a browser:
 * - a bearing fault rings the structure at impacts, so it is heard best band-passed in the
 *   envelope's resonance band: two band-pass sections centred on the band's geometric centre with
 *   Q = centre / bandwidth (a ringing that pulses at the defect rate);
 * - a shaft (or belt) fault is a tone at the shaft frequency and its harmonics, so each harmonic up
 *   to 1 kHz gets a peaking boost (+12 dB, Q 20, about ±2.5 % around each harmonic to ride the
 *   rpm's wander); lines under about 100 Hz need headphones to be heard.
 * The gain and Q are listening choices (common practice for "boost and sweep"), not a standard.
 */

/** One biquad section, in Web Audio's terms. */
export interface BiquadSpec {
  type: 'bandpass' | 'peaking';
  frequencyHz: number;
  q: number;
  gainDb: number;
}

/** A listening plan: the filters in series, an output gain against clipping and the notes to show. */
export interface ListenPlan {
  filters: BiquadSpec[];
  outputGain: number;
  notes: string[];
}

/** Highest harmonic frequency boosted for a shaft fault (Hz). */
export const SHAFT_BOOST_MAX_HZ = 1000;
/** Boost per harmonic (dB) and its Q. */
export const SHAFT_BOOST_DB = 12;
export const SHAFT_BOOST_Q = 20;
/** At most this many peaking sections (the lowest harmonics first). */
export const MAX_PEAKING_SECTIONS = 32;
/** Lines below this need headphones on a laptop or tablet speaker. */
export const HEADPHONES_BELOW_HZ = 100;

/** The plan for playing the whole pickup channel unfiltered. */
export function wholePlan(): ListenPlan {
  return { filters: [], outputGain: 1, notes: [] };
}

/** Band-pass in the envelope band [loHz, hiHz], limited below the audio's Nyquist frequency. */
export function bearingPlan(bandHz: [number, number], sampleRateHz = 48_000): ListenPlan {
  const nyquist = sampleRateHz / 2;
  const lo = Math.max(20, Math.min(bandHz[0], bandHz[1]));
  const hi = Math.min(Math.max(bandHz[0], bandHz[1]), nyquist * 0.95);
  if (!(hi > lo)) throw new RangeError(`envelope band ${bandHz[0]}–${bandHz[1]} Hz lies outside what the audio holds`);
  const centre = Math.sqrt(lo * hi);
  const q = centre / (hi - lo);
  const section: BiquadSpec = { type: 'bandpass', frequencyHz: centre, q, gainDb: 0 };
  return {
    filters: [section, { ...section }],
    outputGain: 2,
    notes: [`Band-passed ${Math.round(lo)}–${Math.round(hi)} Hz, where the impacts ring: listen for a ringing that pulses at the defect rate.`],
  };
}

/**
 * Peaking boosts at the shaft frequency f = order × rpm / 60 and its harmonics up to 1 kHz.
 * `order` is the part's shaft order (its speed ratio after slip), `rpm` the capture's mean crank speed.
 */
export function shaftPlan(order: number, rpm: number): ListenPlan {
  if (!(order > 0) || !(rpm > 0)) throw new RangeError(`shaft order and rpm must be positive, got ${order} and ${rpm}`);
  const f0 = (order * rpm) / 60;
  const filters: BiquadSpec[] = [];
  for (let k = 1; k * f0 <= SHAFT_BOOST_MAX_HZ && filters.length < MAX_PEAKING_SECTIONS; k += 1) {
    filters.push({ type: 'peaking', frequencyHz: k * f0, q: SHAFT_BOOST_Q, gainDb: SHAFT_BOOST_DB });
  }
  const notes = [`Boosted at ${f0.toFixed(1)} Hz (the shaft) and its harmonics up to ${SHAFT_BOOST_MAX_HZ} Hz.`];
  if (f0 < HEADPHONES_BELOW_HZ) notes.push(`The shaft line at ${f0.toFixed(0)} Hz is under about ${HEADPHONES_BELOW_HZ} Hz: use headphones, a tablet speaker cannot play it.`);
  return { filters, outputGain: 0.3, notes };
}

/**
 * Magnitude response (dB) of one section at frequency f (Hz) and sample rate fs, from the Audio EQ
 * Cookbook (R. Bristow-Johnson) formulas the W3C Web Audio API specifies for BiquadFilterNode
 * ("bandpass": constant 0 dB peak gain; "peaking": A = 10^(gain/40), α = sin(ω0)/(2Q)).
 */
export function biquadMagnitudeDb(s: BiquadSpec, f: number, fs: number): number {
  const w0 = (2 * Math.PI * s.frequencyHz) / fs;
  const alpha = Math.sin(w0) / (2 * s.q);
  const cos = Math.cos(w0);
  let b: [number, number, number];
  let a: [number, number, number];
  if (s.type === 'bandpass') {
    b = [alpha, 0, -alpha];
    a = [1 + alpha, -2 * cos, 1 - alpha];
  } else {
    const A = 10 ** (s.gainDb / 40);
    b = [1 + alpha * A, -2 * cos, 1 - alpha * A];
    a = [1 + alpha / A, -2 * cos, 1 - alpha / A];
  }
  const w = (2 * Math.PI * f) / fs;
  const re = (c: number[]) => c[0]! + c[1]! * Math.cos(-w) + c[2]! * Math.cos(-2 * w);
  const im = (c: number[]) => c[1]! * Math.sin(-w) + c[2]! * Math.sin(-2 * w);
  const num = Math.hypot(re(b), im(b));
  const den = Math.hypot(re(a), im(a));
  return 20 * Math.log10(num / den);
}

/** Response (dB) of the whole plan (sections in series, output gain included) at f. */
export function planMagnitudeDb(plan: ListenPlan, f: number, fs: number): number {
  return plan.filters.reduce((sum, s) => sum + biquadMagnitudeDb(s, f, fs), 20 * Math.log10(plan.outputGain));
}
