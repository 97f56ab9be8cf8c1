import { type FftPlan, type FftPlanCache, nextPowerOfTwo } from '../dsp/fft';
import { createWindow } from '../dsp/window';
import { finishSpectrum } from './order-spectrum';
import { type OrderSpectrum } from './types';

/** Whole blocks from which the blocks no longer overlap. */
const MIN_BLOCKS_WITHOUT_OVERLAP = 16;

/**
 * Envelope order spectra of several bands from one pass over an angle-domain signal. Per block of
 * revsPerBlock revolutions (50 % overlap; none for the full average once 16 whole blocks fit):
 * Hann window, one real FFT shared by all bands; per band the bins of the band (orders = Hz / mean
 * shaft Hz), doubled (analytic signal, Marple 1999) and moved to baseband, an inverse FFT of a smaller size M gives the complex band signal decimated to
 * M samples per block; |z| is the envelope times the window (the window varies slowly against the
 * band), its mean·window is removed (the spectrum of the envelope, mean removed — not the squared
 * envelope), a real FFT of size M, power averaged over blocks. Amplitudes are single-sided peak
 * amplitudes corrected for the Hann window's coherent gain, in input units. `maxBlocks` limits the
 * average to that many evenly spaced blocks (a quick look when comparing candidate bands).
 */
export function envelopeSpectra(x: Float64Array, samplesPerRev: number, revsPerBlock: number, bandsOrders: [number, number][], maxOrder: number, plans: FftPlanCache, maxBlocks = Infinity): OrderSpectrum[] {
  const n = samplesPerRev * revsPerBlock;
  if (x.length < n) throw new RangeError(`envelope spectrum needs at least ${n} samples (one block), got ${x.length}`);
  const plan = plans.get(n);
  const w = createWindow('hann', n);
  // 50 % overlap only while whole blocks are scarce: with 16 or more, the average is steady
  // enough without it, and each block costs one full-length FFT.
  const hop = maxBlocks === Infinity && Math.floor(x.length / n) >= MIN_BLOCKS_WITHOUT_OVERLAP ? n : n / 2;
  const allBlocks = Math.floor((x.length - n) / hop) + 1;
  // With maxBlocks, evenly spaced blocks only (a quick look for choosing bands).
  const blocks = Math.min(allBlocks, maxBlocks);
  const frame = new Float64Array(n);
  const spec = plan.work;
  const bands = bandsOrders.map(([lo, hi]) => planBand(lo, hi, n, revsPerBlock, maxOrder, w, plans));
  for (let b = 0; b < blocks; b++) {
    const s = (blocks === allBlocks ? b : Math.round((b * (allBlocks - 1)) / Math.max(1, blocks - 1))) * hop;
    windowBlock(frame, x, s, w);
    plan.fft.realTransform(spec, frame);
    for (let i = 0; i < bands.length; i++) accumulateBand(bands[i], spec, n);
  }
  return bands.map((B) => {
    const scale = 2 / (B.m * (B.wDecSum / B.m));
    const amp = new Float64Array(B.bins);
    for (let k = 0; k < B.bins; k++) amp[k] = Math.sqrt(B.acc[k] / blocks) * scale;
    return finishSpectrum(amp, revsPerBlock, maxOrder, B.m / revsPerBlock, blocks);
  });
}

/** One band's plan and buffers; every field is set once, so all bands share one hidden class. */
interface BandWork {
  k0: number;
  k1: number;
  m: number;
  bins: number;
  wDec: Float64Array;
  wDecSum: number;
  plan: FftPlan;
  zIn: Float64Array;
  z: Float64Array;
  e: Float64Array;
  acc: Float64Array;
}

function planBand(lo: number, hi: number, n: number, revsPerBlock: number, maxOrder: number, w: Float64Array, plans: FftPlanCache): BandWork {
  const k0 = Math.max(1, Math.floor(lo * revsPerBlock));
  const k1 = Math.min(n / 2 - 1, Math.ceil(hi * revsPerBlock));
  const width = Math.max(1, k1 - k0 + 1);
  const m = Math.min(n, nextPowerOfTwo(Math.max(Math.ceil(2.5 * maxOrder * revsPerBlock), Math.ceil(1.25 * width))));
  const bins = Math.min(m / 2, Math.floor(maxOrder * revsPerBlock)) + 1;
  const decim = n / m;
  const wDec = new Float64Array(m);
  let wDecSum = 0;
  for (let i = 0; i < m; i++) { wDec[i] = w[i * decim]; wDecSum += wDec[i]; }
  return {
    k0, k1, m, bins, wDec, wDecSum, plan: plans.get(m),
    zIn: new Float64Array(2 * m), z: new Float64Array(2 * m), e: new Float64Array(m), acc: new Float64Array(bins),
  };
}

/** frame[i] = x[s + i]·w[i]: its own small function, so V8 compiles this loop once with feedback. */
function windowBlock(frame: Float64Array, x: Float64Array, s: number, w: Float64Array): void {
  for (let i = 0; i < frame.length; i++) frame[i] = x[s + i] * w[i];
}

/** Adds one block's envelope power spectrum of band B, from the block's spectrum `spec` (size n), to B.acc. */
function accumulateBand(B: BandWork, spec: Float64Array, n: number): void {
  const { m, zIn, z, e, wDec, acc } = B;
  zIn.fill(0);
  // z[j] = (2/n)·Σ X[k]·e^{2πi(k−k0)j/m}: fft.js's inverse divides by m, hence the m/n factor.
  const g = (2 * m) / n;
  for (let k = B.k0, j = 0; k <= B.k1; k++, j++) { zIn[2 * j] = spec[2 * k] * g; zIn[2 * j + 1] = spec[2 * k + 1] * g; }
  B.plan.fft.inverseTransform(z, zIn);
  let eSum = 0;
  for (let i = 0; i < m; i++) { const re = z[2 * i], im = z[2 * i + 1];
    const v = Math.sqrt(re * re + im * im); e[i] = v; eSum += v; }
  const mu = eSum / B.wDecSum;
  for (let i = 0; i < m; i++) e[i] -= mu * wDec[i];
  B.plan.fft.realTransform(z, e);
  for (let k = 0; k < B.bins; k++) acc[k] += z[2 * k] * z[2 * k] + z[2 * k + 1] * z[2 * k + 1];
}
