/**
 * Independent measuring tools for the generator's tests, written from textbook definitions on
 * fft.js directly (not on the pipeline's code), so a generator bug and a pipeline bug cannot
 * cancel out: threshold edges with hysteresis, a Hann amplitude spectrum, and the envelope as the
 * magnitude of the analytic signal of a band (frequency-domain Hilbert transform).
 */
import FFT from 'fft.js';

/** Rising crossings of `threshold` (linear interpolation), re-armed only after falling below `rearm`, at least `minGapS` apart. */
export function risingEdges(x: ArrayLike<number>, sampleRateHz: number, threshold: number, rearm: number, minGapS = 0): number[] {
  const edges: number[] = [];
  let armed = true;
  for (let i = 1; i < x.length; i++) {
    if (armed && x[i - 1] < threshold && x[i] >= threshold) {
      const t = (i - 1 + (threshold - x[i - 1]) / (x[i] - x[i - 1])) / sampleRateHz;
      if (edges.length === 0 || t - edges[edges.length - 1] >= minGapS) edges.push(t);
      armed = false;
    } else if (!armed && x[i] < rearm) armed = true;
  }
  return edges;
}

function nextPow2(n: number): number {
  let p = 1;
  while (p < n) p *= 2;
  return p;
}

/** One-sided amplitude spectrum of a Hann-windowed signal, zero-padded to a power of two: amplitude of a tone on a bin ≈ its amplitude. */
export function hannSpectrum(x: ArrayLike<number>, sampleRateHz: number): { binHz: number; amp: Float64Array } {
  const n = x.length;
  const size = nextPow2(n);
  const input = new Array<number>(size).fill(0);
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i] / n;
  for (let i = 0; i < n; i++) input[i] = (x[i] - mean) * 0.5 * (1 - Math.cos((2 * Math.PI * i) / n));
  const fft = new FFT(size);
  const out = fft.createComplexArray() as number[];
  fft.realTransform(out, input);
  const amp = new Float64Array(size / 2);
  // Hann coherent gain 0.5 (Harris 1978): |X| = A/2 · n · 0.5 → A = 4|X| / n.
  for (let k = 0; k < size / 2; k++) amp[k] = (4 * Math.hypot(out[2 * k], out[2 * k + 1])) / n;
  return { binHz: sampleRateHz / size, amp };
}

/** Envelope (|analytic signal|) of the band [loHz, hiHz] of x, by zeroing all other bins and the negative frequencies. */
export function bandEnvelope(x: ArrayLike<number>, sampleRateHz: number, loHz: number, hiHz: number): Float64Array {
  const n = x.length;
  const size = nextPow2(n);
  const fft = new FFT(size);
  const input = new Array<number>(size).fill(0);
  for (let i = 0; i < n; i++) input[i] = x[i];
  const spec = fft.createComplexArray() as number[];
  fft.realTransform(spec, input);
  fft.completeSpectrum(spec);
  const binHz = sampleRateHz / size;
  for (let k = 0; k < size; k++) {
    const f = k * binHz;
    const keep = k > 0 && k < size / 2 && f >= loHz && f <= hiHz;
    spec[2 * k] = keep ? 2 * spec[2 * k] : 0;
    spec[2 * k + 1] = keep ? 2 * spec[2 * k + 1] : 0;
  }
  const analytic = fft.createComplexArray() as number[];
  fft.inverseTransform(analytic, spec);
  const env = new Float64Array(n);
  for (let i = 0; i < n; i++) env[i] = Math.hypot(analytic[2 * i], analytic[2 * i + 1]);
  return env;
}

/** The largest bin within ±searchHz of fHz, refined by a parabola through its neighbours. */
export function peakNear(spec: { binHz: number; amp: Float64Array }, fHz: number, searchHz: number): { freqHz: number; amp: number } {
  const lo = Math.max(1, Math.floor((fHz - searchHz) / spec.binHz));
  const hi = Math.min(spec.amp.length - 2, Math.ceil((fHz + searchHz) / spec.binHz));
  let best = lo;
  for (let k = lo; k <= hi; k++) if (spec.amp[k] > spec.amp[best]) best = k;
  const a = spec.amp[best - 1];
  const b = spec.amp[best];
  const c = spec.amp[best + 1];
  const denom = a - 2 * b + c;
  const delta = denom !== 0 ? (0.5 * (a - c)) / denom : 0;
  return { freqHz: (best + delta) * spec.binHz, amp: b };
}

/** Median of the bins within ±halfHz of fHz (a local noise floor). */
export function floorNear(spec: { binHz: number; amp: Float64Array }, fHz: number, halfHz: number): number {
  const lo = Math.max(1, Math.floor((fHz - halfHz) / spec.binHz));
  const hi = Math.min(spec.amp.length - 1, Math.ceil((fHz + halfHz) / spec.binHz));
  const values = Array.from(spec.amp.subarray(lo, hi + 1)).sort((p, q) => p - q);
  return values[Math.floor(values.length / 2)];
}
