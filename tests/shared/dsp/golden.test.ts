import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { envelope } from '../../../shared/dsp/analytic';
import { FftPlanCache } from '../../../shared/dsp/fft';
import { designLowPass } from '../../../shared/dsp/fir';
import { stftAmplitude } from '../../../shared/dsp/stft';

// Golden vectors made offline with numpy/scipy: tests/fixtures/dsp/make-golden.py says how.
const golden = JSON.parse(readFileSync(new URL('../../fixtures/dsp/scipy-golden.json', import.meta.url), 'utf8'));

describe('DSP blocks against scipy golden vectors', () => {
  it('the Kaiser low-pass equals scipy.signal.firwin with kaiser_beta(80)', () => {
    const g = golden.kaiserLowpass;
    const h = designLowPass(g.cutoff, g.taps, g.attenuationDb);
    g.h.forEach((v: number, i: number) => expect(h[i]).toBeCloseTo(v, 10));
  });

  it('the envelope of a decaying ring matches |scipy.signal.hilbert| away from the ends', () => {
    const g = golden.hilbertEnvelope;
    const e = envelope(Float64Array.from(g.x), new FftPlanCache());
    for (let i = 20; i < 200; i++) expect(e[i]).toBeCloseTo(g.envelope[i], 6);
  });

  it('a Hann STFT frame matches numpy.fft.rfft scaled by 2/(N·CG)', () => {
    const g = golden.hannAmplitude;
    const s = stftAmplitude(Float64Array.from(g.x), { frameSize: 1024, hop: 1024 }, new FftPlanCache());
    g.amplitude.forEach((v: number, k: number) => expect(s.data[k]).toBeCloseTo(v, 5));
  });
});
