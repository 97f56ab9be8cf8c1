/**
 * Linear-phase FIR design by the Kaiser window method (J. F. Kaiser, "Nonrecursive digital filter
 * design using the I0-sinh window function", 1974; formulas as in Oppenheim & Schafer,
 * Discrete-Time Signal Processing, §7.5): β = 0.1102(A − 8.7) for A > 50 dB, length
 * M = (A − 8) / (2.285·Δω) + 1 with Δω the transition width in rad/sample. Frequencies are given
 * as fractions of the sample rate (0 … 0.5). Filters are odd-length and symmetric; applying them
 * with the delay compensated keeps them zero-phase.
 */

function besselI0(x: number): number {
  let sum = 1;
  let term = 1;
  const q = (x * x) / 4;
  for (let k = 1; k < 64; k++) {
    term *= q / (k * k);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return sum;
}

/** Odd filter length for a transition width (fraction of fs) and stopband attenuation (dB). */
export function kaiserLength(transition: number, attenuationDb: number): number {
  if (!(transition > 0 && transition < 0.5)) throw new RangeError(`transition width must be in (0, 0.5) of the sample rate, got ${transition}`);
  const m = Math.ceil((attenuationDb - 8) / (2.285 * 2 * Math.PI * transition)) + 1;
  return m % 2 === 1 ? m : m + 1;
}

/**
 * Low-pass FIR with the band edge (−6 dB point) at `cutoff` (fraction of fs), `length` odd taps,
 * Kaiser window for `attenuationDb`; DC gain exactly 1.
 */
export function designLowPass(cutoff: number, length: number, attenuationDb = 80): Float64Array {
  if (!(cutoff > 0 && cutoff < 0.5)) throw new RangeError(`low-pass cutoff must be in (0, 0.5) of the sample rate, got ${cutoff}`);
  if (!Number.isInteger(length) || length < 3 || length % 2 === 0) throw new RangeError(`FIR length must be an odd integer ≥ 3, got ${length}`);
  const beta = attenuationDb > 50 ? 0.1102 * (attenuationDb - 8.7) : attenuationDb >= 21 ? 0.5842 * (attenuationDb - 21) ** 0.4 + 0.07886 * (attenuationDb - 21) : 0;
  const h = new Float64Array(length);
  const c = (length - 1) / 2;
  const i0b = besselI0(beta);
  let sum = 0;
  for (let n = 0; n < length; n++) {
    const k = n - c;
    const sinc = k === 0 ? 2 * cutoff : Math.sin(2 * Math.PI * cutoff * k) / (Math.PI * k);
    const r = k / c;
    const w = besselI0(beta * Math.sqrt(Math.max(0, 1 - r * r))) / i0b;
    h[n] = sinc * w;
    sum += h[n];
  }
  for (let n = 0; n < length; n++) h[n] /= sum;
  return h;
}

/**
 * A half-band low-pass (band edge fs/4) passing 0 … 0.2·fs and stopping 0.3 … 0.5·fs by about
 * 80 dB; every second tap except the centre is zero, so decimation by 2 costs about a quarter of
 * the taps per output sample.
 */
export function designHalfBand(): Float64Array {
  return designLowPass(0.25, 51, 80);
}

/**
 * Filters with a half-band filter and keeps every second sample: y[m] ≈ x filtered at 2m
 * (delay compensated; samples outside x count as 0). Usable band of the output: 0 … 0.4 of its
 * sample rate.
 */
export function decimateByTwo(x: Float32Array | Float64Array, h: Float64Array = designHalfBand(), out?: Float64Array): Float64Array {
  const n = x.length;
  const m = Math.ceil(n / 2);
  const y = out ?? new Float64Array(m);
  const c = (h.length - 1) / 2;
  const centre = h[c];
  // Non-zero side taps sit at odd offsets 1, 3, 5, … from the centre: tap t at offset 2t + 1.
  const nt = (c + 1) >> 1;
  const taps = new Float64Array(nt);
  for (let t = 0; t < nt; t++) taps[t] = h[c + 2 * t + 1];
  const edge = 2 * nt - 1;
  let k = 0;
  // Edges: samples outside x count as 0.
  for (; k < m && 2 * k < edge; k++) y[k] = sideSum(x, 2 * k, taps, centre);
  const last = Math.floor((n - 1 - edge) / 2);
  // Separate loops per element type keep the hot loop's element access monomorphic.
  if (nt === 13 && x instanceof Float32Array) k = halfBand13F32(x, y, k, last, taps, centre);
  else if (nt === 13 && x instanceof Float64Array) k = halfBand13F64(x, y, k, last, taps, centre);
  else {
    for (; k <= last; k++) {
      const i = 2 * k;
      let s = centre * x[i];
      for (let t = 0; t < nt; t++) s += taps[t] * (x[i - 2 * t - 1] + x[i + 2 * t + 1]);
      y[k] = s;
    }
  }
  for (; k < m; k++) y[k] = sideSum(x, 2 * k, taps, centre);
  return y;
}

/** The 51-tap half-band's 13 side taps, unrolled, on float32 input; returns the next k. */
function halfBand13F32(x: Float32Array, y: Float64Array, k0: number, last: number, t: Float64Array, c: number): number {
  const [a0, a1, a2, a3, a4, a5, a6, a7, a8, a9, a10, a11, a12] = t;
  let k = k0;
  for (; k <= last; k++) {
    const i = 2 * k;
    y[k] = c * x[i] + a0 * (x[i - 1] + x[i + 1]) + a1 * (x[i - 3] + x[i + 3]) + a2 * (x[i - 5] + x[i + 5])
      + a3 * (x[i - 7] + x[i + 7]) + a4 * (x[i - 9] + x[i + 9]) + a5 * (x[i - 11] + x[i + 11]) + a6 * (x[i - 13] + x[i + 13])
      + a7 * (x[i - 15] + x[i + 15]) + a8 * (x[i - 17] + x[i + 17]) + a9 * (x[i - 19] + x[i + 19]) + a10 * (x[i - 21] + x[i + 21])
      + a11 * (x[i - 23] + x[i + 23]) + a12 * (x[i - 25] + x[i + 25]);
  }
  return k;
}

/** The same on float64 input. */
function halfBand13F64(x: Float64Array, y: Float64Array, k0: number, last: number, t: Float64Array, c: number): number {
  const [a0, a1, a2, a3, a4, a5, a6, a7, a8, a9, a10, a11, a12] = t;
  let k = k0;
  for (; k <= last; k++) {
    const i = 2 * k;
    y[k] = c * x[i] + a0 * (x[i - 1] + x[i + 1]) + a1 * (x[i - 3] + x[i + 3]) + a2 * (x[i - 5] + x[i + 5])
      + a3 * (x[i - 7] + x[i + 7]) + a4 * (x[i - 9] + x[i + 9]) + a5 * (x[i - 11] + x[i + 11]) + a6 * (x[i - 13] + x[i + 13])
      + a7 * (x[i - 15] + x[i + 15]) + a8 * (x[i - 17] + x[i + 17]) + a9 * (x[i - 19] + x[i + 19]) + a10 * (x[i - 21] + x[i + 21])
      + a11 * (x[i - 23] + x[i + 23]) + a12 * (x[i - 25] + x[i + 25]);
  }
  return k;
}

function sideSum(x: ArrayLike<number>, i: number, taps: Float64Array, centre: number): number {
  const n = x.length;
  let s = centre * x[i];
  for (let t = 0; t < taps.length; t++) {
    const o = 2 * t + 1;
    s += taps[t] * ((i - o >= 0 ? x[i - o] : 0) + (i + o < n ? x[i + o] : 0));
  }
  return s;
}

/**
 * Doubles the sample rate with the half-band filter `h` (zero-stuffing, then filtering with gain
 * 2): y[2m] = x[m] (a half-band's even side taps are zero and its centre is ½), y[2m+1] =
 * 2·Σₜ h[c+2t+1]·(x[m−t] + x[m+1+t]) (samples outside x count as 0). With the default 51-tap
 * half-band (80 dB Kaiser, docs/references.md / common practice) the band 0 … 0.4 of the INPUT rate
 * passes within about 0.01 dB, so a cubic interpolator reading the output sees every frequency
 * below 0.2 of its rate instead of up to 0.4.
 */
export function upsampleByTwo(x: Float32Array | Float64Array, h: Float64Array = designHalfBand(), out?: Float64Array): Float64Array {
  const n = x.length;
  const y = out ?? new Float64Array(2 * n);
  const c = (h.length - 1) / 2;
  const nt = (c + 1) >> 1;
  const taps = new Float64Array(nt);
  for (let t = 0; t < nt; t++) taps[t] = 2 * h[c + 2 * t + 1];
  const inner0 = nt - 1;
  const inner1 = n - 1 - nt;
  for (let m = 0; m < n; m++) {
    // The centre tap is ½ to within the design's DC normalisation (3e-6 for the default), so the
    // even outputs are the input itself.
    y[2 * m] = x[m];
    let s = 0;
    if (m >= inner0 && m <= inner1) {
      for (let t = 0; t < nt; t++) s += taps[t] * (x[m - t] + x[m + 1 + t]);
    } else {
      for (let t = 0; t < nt; t++) s += taps[t] * ((m - t >= 0 ? x[m - t] : 0) + (m + 1 + t < n ? x[m + 1 + t] : 0));
    }
    y[2 * m + 1] = s;
  }
  return y;
}

/**
 * Direct-form zero-phase FIR filtering (odd symmetric h, delay compensated, zeros outside x).
 * For long filters use `overlapSaveFilter`.
 */
export function firFilter(x: ArrayLike<number>, h: Float64Array, out?: Float64Array): Float64Array {
  const n = x.length;
  const y = out ?? new Float64Array(n);
  const c = (h.length - 1) / 2;
  for (let i = 0; i < n; i++) {
    let s = h[c] * x[i];
    for (let j = 1; j <= c; j++) {
      const a = i - j >= 0 ? x[i - j] : 0;
      const b = i + j < n ? x[i + j] : 0;
      s += h[c + j] * (a + b);
    }
    y[i] = s;
  }
  return y;
}
