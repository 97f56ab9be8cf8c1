import { type FftPlanCache } from './fft';
import { coherentGain, createWindow, type WindowKind } from './window';

/**
 * Short-time Fourier transform of a real signal: frames of `frameSize` samples every `hop`
 * samples (frame f starts at f·hop), windowed (periodic window), FFT. Bin k of a frame is at
 * k·fs/frameSize. `visitStftPower` hands each frame's unscaled power |X[k]|² (k = 0..N/2) to a
 * callback (no storage); `stftAmplitude` stores single-sided peak amplitudes 2|X|/(N·CG) as
 * float32 frames × bins.
 */
export interface StftOptions {
  frameSize: number;
  hop: number;
  window?: WindowKind;
  /** Only use every `stride`-th frame (caps the cost on long signals). */
  stride?: number;
}

/** Number of whole frames that fit in n samples. */
export function stftFrameCount(n: number, frameSize: number, hop: number): number {
  return n < frameSize ? 0 : Math.floor((n - frameSize) / hop) + 1;
}

/** Calls visit(frameIndex, power) for every (strided) frame; power is reused between calls. */
export function visitStftPower(x: ArrayLike<number>, options: StftOptions, plans: FftPlanCache, visit: (frame: number, power: Float64Array) => void): number {
  const { frameSize, hop } = options;
  if (!(hop >= 1)) throw new RangeError(`STFT hop must be ≥ 1 sample, got ${hop}`);
  const plan = plans.get(frameSize);
  const w = createWindow(options.window ?? 'hann', frameSize);
  const frame = new Float64Array(frameSize);
  const power = new Float64Array(frameSize / 2 + 1);
  const frames = stftFrameCount(x.length, frameSize, hop);
  const stride = Math.max(1, Math.floor(options.stride ?? 1));
  let used = 0;
  for (let f = 0; f < frames; f += stride) {
    const s = f * hop;
    windowFrame(frame, x, s, w);
    plan.fft.realTransform(plan.work, frame);
    halfSpectrumPower(plan.work, power);
    visit(f, power);
    used++;
  }
  return used;
}

// The loops of a frame sit in small functions of their own: V8 then compiles them once with type
// feedback, whichever callback visitStftPower was last called with (a new callback deoptimised the
// whole frame loop, which then boxed every product while it ran unoptimised).

/** frame[i] = x[s + i]·w[i]. */
function windowFrame(frame: Float64Array, x: ArrayLike<number>, s: number, w: Float64Array): void {
  for (let i = 0; i < frame.length; i++) frame[i] = x[s + i] * w[i];
}

/** power[k] = |X[k]|² for k = 0..power.length − 1, from interleaved complex bins. */
function halfSpectrumPower(o: Float64Array, power: Float64Array): void {
  for (let k = 0; k < power.length; k++) power[k] = o[2 * k] * o[2 * k] + o[2 * k + 1] * o[2 * k + 1];
}

/** Amplitude STFT (frames × (frameSize/2 + 1), row-major float32). */
export function stftAmplitude(x: ArrayLike<number>, options: StftOptions, plans: FftPlanCache): { frames: number; bins: number; data: Float32Array } {
  const bins = options.frameSize / 2 + 1;
  const total = stftFrameCount(x.length, options.frameSize, options.hop);
  const stride = Math.max(1, Math.floor(options.stride ?? 1));
  const frames = Math.ceil(total / stride);
  const data = new Float32Array(frames * bins);
  const scale = 2 / (options.frameSize * coherentGain(createWindow(options.window ?? 'hann', options.frameSize)));
  let row = 0;
  visitStftPower(x, options, plans, (_f, p) => {
    const o = row * bins;
    for (let k = 0; k < bins; k++) data[o + k] = Math.sqrt(p[k]) * scale;
    row++;
  });
  return { frames, bins, data };
}
