import { type FftPlanCache, nextPowerOfTwo } from '../dsp/fft';
import { stftAmplitude } from '../dsp/stft';
import { type CrankAngle } from './crank-speed';
import { type SpectrogramResult } from './types';

/** Largest spectrogram kept: frames × bins ≤ 1M floats (4 MiB as float32, DEVELOPERS.md "Database: Sequelize and umzug"). */
export const SPECTROGRAM_MAX_FLOATS = 1 << 20;

/**
 * Spectrogram of the pickup (docs/design.md step 7): Hann STFT with frames of about 40 ms (bins of
 * about 25 Hz), the hop raised until frames × bins ≤ 1M floats, with rpm(t) at every frame centre.
 */
export function spectrogram(x: Float64Array, sampleRateHz: number, crank: CrankAngle, plans: FftPlanCache): SpectrogramResult {
  const frameSize = Math.max(64, Math.min(8192, nextPowerOfTwo(sampleRateHz / 25)));
  const bins = frameSize / 2 + 1;
  const maxFrames = Math.floor(SPECTROGRAM_MAX_FLOATS / bins);
  const avail = Math.max(0, x.length - frameSize);
  const hop = Math.max(frameSize / 2, Math.ceil(avail / Math.max(1, maxFrames - 1)));
  const s = stftAmplitude(x, { frameSize, hop, window: 'hann' }, plans);
  const rpm = new Float32Array(s.frames);
  for (let f = 0; f < s.frames; f++) rpm[f] = crank.angleAt.derivative((f * hop + frameSize / 2) / sampleRateHz) / 6;
  return {
    frames: s.frames, bins: s.bins, binWidthHz: sampleRateHz / frameSize, hopS: hop / sampleRateHz,
    startS: frameSize / 2 / sampleRateHz, amplitude: s.data, rpm,
  };
}
