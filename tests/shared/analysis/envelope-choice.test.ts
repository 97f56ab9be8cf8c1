import { describe, expect, it } from 'vitest';
import { FftPlanCache } from '../../../shared/dsp/fft';
import { bandsOverlap } from '../../../shared/analysis/envelope-band';
import { chooseEnvelopeBands } from '../../../shared/analysis/envelope-choice';
import { gaussian, rng } from '../../helpers/signals';

// A bearing fault's impacts ring a structural resonance and show in the envelope spectrum of a band
// around it (Randall & Antoni 2011, docs/references.md §4); spectral kurtosis finds impulsive bands
// (Antoni 2006/2007). Here a second, louder impulsive source (a tick train at its own order, ringing
// its own resonance) must not take every kept band.
const spr = 2048;
const shaftHz = 13;
const revs = 96;
const rate = spr * shaftHz;

function ringTrain(x: Float64Array, order: number, ringHz: number, amp: number, seed: number): void {
  const r = rng(seed);
  const len = Math.round(0.004 * rate);
  for (let th = 0.3; th < revs - 0.1; th += (1 + 0.01 * (r() - 0.5)) / order) {
    const i0 = Math.round(th * spr);
    const a = amp * (0.8 + 0.4 * r());
    for (let i = 0; i < len && i0 + i < x.length; i++) x[i0 + i] += a * Math.exp(-i / (0.0008 * rate)) * Math.sin((2 * Math.PI * ringHz * i) / rate);
  }
}

describe('automatic envelope bands with a second impulsive source', () => {
  it('keeps non-overlapping bands, one at the louder distractor and one at the fault', () => {
    const x = gaussian(spr * revs, 7);
    for (let i = 0; i < x.length; i++) x[i] *= 0.3;
    ringTrain(x, 6.64, 2200, 3, 1); // distractor, louder
    ringTrain(x, 11.5, 4400, 1.5, 2); // fault
    const minWidthHz = Math.max(500, 40 * shaftHz);
    const bands = chooseEnvelopeBands({
      residual: x, samplesPerRev: spr, revsPerBlock: 16, meanShaftHz: shaftHz,
      search: { rateHz: rate, loHz: 300, hiHz: 0.4 * rate, minWidthHz, maxWidthHz: 4 * minWidthHz, count: 3, cyclePeriod: 2 * spr },
    }, new FftPlanCache());
    expect(bands.length).toBeGreaterThanOrEqual(2);
    for (let i = 0; i < bands.length; i++) for (let j = i + 1; j < bands.length; j++) expect(bandsOverlap(bands[i].bandHz, bands[j].bandHz)).toBe(false);
    const holds = (hz: number) => bands.some((b) => b.bandHz[0] <= hz && hz <= b.bandHz[1]);
    expect(holds(2200)).toBe(true);
    expect(holds(4400)).toBe(true);
  });

  it('bandsOverlap: touching bands do not overlap, shared width does', () => {
    expect(bandsOverlap([1000, 2000], [2000, 3000])).toBe(false);
    expect(bandsOverlap([1000, 2000], [1800, 2800])).toBe(true);
  });
});
