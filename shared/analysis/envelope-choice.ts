import { type FftPlanCache } from '../dsp/fft';
import { findPeaks } from '../dsp/peaks';
import { type BandCandidate, type BandSearch, kurtosisBands, pickDistinct } from './envelope-band';
import { envelopeSpectra } from './envelope-spectrum';

/**
 * The automatic envelope band (DESIGN.md step 5) in two looks. Spectral kurtosis of the residual
 * (envelope-band.ts) proposes its best bands; a plain grid of bands twice the minimum width, in
 * steps of ¾ width (every resonance falls well inside one), adds the rest of the usable range,
 * because at a low SNR a fault's impacts barely move the kurtosis. Every candidate then gets a
 * quick envelope order spectrum over six evenly spaced blocks of 8 revolutions, scored by its lines: the sum of
 * the SNRs (dB) of its three strongest peaks, those on a 0.5-order multiple at half weight (the
 * residual should hold none, so what is left there is more likely the engine's ticks than a part
 * — but a part can sit there). The best two or three distinct bands are kept, best first; their
 * score is that sum.
 */
export interface EnvelopeChoiceInput {
  residual: Float64Array;
  samplesPerRev: number;
  revsPerBlock: number;
  meanShaftHz: number;
  search: BandSearch;
}

const QUICK_BLOCKS = 6;
/** Revolutions per block of the quick look (resolution 1/8 order is enough to see a line stand out). */
const QUICK_REVS_PER_BLOCK = 8;
const QUICK_MAX_ORDER = 50;

/** Best envelope bands, best first. */
export function chooseEnvelopeBands(input: EnvelopeChoiceInput, plans: FftPlanCache): BandCandidate[] {
  const { search } = input;
  const sk = kurtosisBands(input.residual, { ...search, count: 4 }, plans);
  const grid: BandCandidate[] = [];
  const width = Math.min(2 * search.minWidthHz, search.hiHz - search.loHz);
  for (let lo = search.loHz; lo + width <= search.hiHz + 1e-9; lo += width * 0.75) grid.push({ bandHz: [lo, lo + width], score: 0 });
  const cands = [...sk, ...grid];
  const spectra = envelopeSpectra(input.residual, input.samplesPerRev, Math.min(QUICK_REVS_PER_BLOCK, input.revsPerBlock),
    cands.map((c) => [c.bandHz[0] / input.meanShaftHz, c.bandHz[1] / input.meanShaftHz] as [number, number]),
    QUICK_MAX_ORDER, plans, QUICK_BLOCKS);
  const scored = cands.map((c, i) => {
    const s = spectra[i];
    const peaks = findPeaks(s.amplitude, s.floor, { minSnrDb: 6, maxPeaks: 40, fromBin: Math.ceil(0.3 / s.resolution) });
    let score = 0, used = 0;
    for (const p of peaks.sort((a, b) => b.snrDb - a.snrDb)) {
      const order = p.bin * s.resolution;
      const onEngineOrder = Math.abs(order * 2 - Math.round(order * 2)) * 0.5 <= s.resolution / 2;
      score += onEngineOrder ? 0.5 * p.snrDb : p.snrDb;
      if (++used === 3) break;
    }
    return { bandHz: c.bandHz, score };
  });
  scored.sort((a, b) => b.score - a.score);
  return pickDistinct(scored, search.count);
}
