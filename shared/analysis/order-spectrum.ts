import { type FftPlanCache } from '../dsp/fft';
import { runningMedian } from '../dsp/running-median';
import { coherentGain, createWindow } from '../dsp/window';
import { type OrderSpectrum } from './types';

/**
 * Order spectrum of an angle-domain signal (samplesPerRev samples per revolution): blocks of
 * revsPerBlock whole revolutions with 50 % overlap, periodic Hann window, FFT, POWER average
 * (docs/references.md §3: a complex average would be a 360° synchronous average and cancel every
 * non-integer accessory order), square root → single-sided peak amplitude corrected for the
 * coherent gain: A = 2·sqrt(⟨|X|²⟩) / (N·CG), so a tone of amplitude A on a bin reads A.
 * Bin k is at order k / revsPerBlock (resolution = 1 / revsPerBlock); bins up to maxOrder.
 */
export function orderSpectrum(x: Float64Array, samplesPerRev: number, revsPerBlock: number, maxOrder: number, plans: FftPlanCache): OrderSpectrum {
  const n = samplesPerRev * revsPerBlock;
  if (x.length < n) throw new RangeError(`order spectrum needs at least ${n} samples (one block), got ${x.length}`);
  const plan = plans.get(n);
  const w = createWindow('hann', n);
  const hop = n / 2;
  const blocks = Math.floor((x.length - n) / hop) + 1;
  const bins = Math.min(n / 2, Math.floor(maxOrder * revsPerBlock)) + 1;
  const acc = new Float64Array(bins);
  const frame = new Float64Array(n);
  const out = plan.work;
  for (let b = 0; b < blocks; b++) {
    demeanedWindowedBlock(frame, x, b * hop, w);
    plan.fft.realTransform(out, frame);
    addPower(out, acc);
  }
  const scale = 2 / (n * coherentGain(w));
  const amplitude = new Float64Array(bins);
  for (let k = 0; k < bins; k++) amplitude[k] = Math.sqrt(acc[k] / blocks) * scale;
  return finishSpectrum(amplitude, revsPerBlock, maxOrder, samplesPerRev, blocks);
}

// The block loops sit in small functions of their own, so V8 compiles them once with type
// feedback instead of running orderSpectrum's single call unoptimised until on-stack replacement.

/** frame[i] = (x[s + i] − mean of the block)·w[i]. */
function demeanedWindowedBlock(frame: Float64Array, x: Float64Array, s: number, w: Float64Array): void {
  const n = frame.length;
  let m = 0;
  for (let i = 0; i < n; i++) m += x[s + i];
  m /= n;
  for (let i = 0; i < n; i++) frame[i] = (x[s + i] - m) * w[i];
}

/** acc[k] += |X[k]|² for the first acc.length bins of interleaved complex `out`. */
function addPower(out: Float64Array, acc: Float64Array): void {
  for (let k = 0; k < acc.length; k++) acc[k] += out[2 * k] * out[2 * k] + out[2 * k + 1] * out[2 * k + 1];
}

/** Adds the running-median floor (width about 2 orders, at least 15 bins). */
export function finishSpectrum(amplitude: Float64Array, revsPerBlock: number, maxOrder: number, samplesPerRev: number, blocks: number): OrderSpectrum {
  let width = Math.max(15, Math.round(2 * revsPerBlock));
  if (width % 2 === 0) width++;
  return {
    resolution: 1 / revsPerBlock, maxOrder, samplesPerRev, revsPerBlock, blocks,
    amplitude, floor: runningMedian(amplitude, Math.min(width, amplitude.length % 2 === 1 ? amplitude.length : amplitude.length - 1)),
  };
}
