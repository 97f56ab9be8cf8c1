import { describe, expect, it } from 'vitest';
import { FftPlanCache } from '../../../shared/dsp/fft';
import { stftAmplitude, stftFrameCount, visitStftPower } from '../../../shared/dsp/stft';
import { createWindow } from '../../../shared/dsp/window';
import { gaussian, tone } from '../../helpers/signals';

describe('STFT', () => {
  it('each frame equals a direct DFT of the Hann-windowed samples (definition of the DFT)', () => {
    const x = gaussian(300, 4);
    const w = createWindow('hann', 64);
    const frames: Float64Array[] = [];
    visitStftPower(x, { frameSize: 64, hop: 50 }, new FftPlanCache(), (_f, p) => frames.push(p.slice()));
    expect(frames.length).toBe(stftFrameCount(300, 64, 50));
    const f = 3;
    for (const k of [0, 5, 17, 32]) {
      let re = 0, im = 0;
      for (let j = 0; j < 64; j++) {
        const v = x[f * 50 + j] * w[j];
        re += v * Math.cos((-2 * Math.PI * k * j) / 64);
        im += v * Math.sin((-2 * Math.PI * k * j) / 64);
      }
      expect(frames[f][k]).toBeCloseTo(re * re + im * im, 8);
    }
  });

  it('reads a tone of amplitude A on a bin centre as A (coherent gain corrected)', () => {
    const fs = 8192;
    const x = tone(fs, 1000, fs, 0.25);
    const s = stftAmplitude(x, { frameSize: 1024, hop: 512 }, new FftPlanCache());
    const bin = 1000 / (fs / 1024);
    expect(Number.isInteger(bin)).toBe(true);
    for (let f = 0; f < s.frames; f++) expect(s.data[f * s.bins + bin]).toBeCloseTo(0.25, 5);
  });
});
