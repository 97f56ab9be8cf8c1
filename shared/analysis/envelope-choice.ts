import { type FftPlanCache } from '../dsp/fft';
import { findPeaks } from '../dsp/peaks';
import { type BandCandidate, type BandSearch, bandsOverlap, kurtosisBands } from './envelope-band';
import { envelopeSpectra } from './envelope-spectrum';

/**
 * The automatic envelope band (docs/design.md step 5) in two looks. Spectral kurtosis of the residual
 * (envelope-band.ts) proposes its best bands; a plain grid of bands twice the minimum width, in
 * steps of ¾ width (every resonance falls well inside one), adds the rest of the usable range,
 * because at a low SNR a fault's impacts barely move the kurtosis. Every candidate then gets a
 * quick envelope order spectrum over six evenly spaced blocks of 8 revolutions, scored by its
 * lines: the sum of the SNRs (dB) of its three strongest peaks, those on a 0.5-order multiple at
 * half weight (the residual should hold none, so what is left there is more likely the engine's
 * ticks than a part — but a part can sit there).
 * Up to three bands are kept, greedily: the best first, then each time the best candidate that
 * overlaps no kept band, its lines re-weighted so that a line a kept band already shows (the same
 * order within the resolution) counts a fifth. A second impulsive source (an injector-like tick
 * train, a clunk ringing its own resonance) shows the same line family in every band around its
 * resonance; without this it takes all the kept bands and a part ringing elsewhere reaches none.
 * The pipeline does not know the drive, so novelty — a different line family — is the general
 * rule. A band's score is its re-weighted sum at the time it was kept (the first: the plain sum).
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
/** Lines summed per band. */
const LINES_SCORED = 3;
/** Weight of a line that an already kept band shows. */
const SHOWN_WEIGHT = 0.2;

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
  const lines = cands.map((_, i) => {
    const sp = spectra[i];
    const peaks = findPeaks(sp.amplitude, sp.floor, { minSnrDb: 6, maxPeaks: 40, fromBin: Math.ceil(0.3 / sp.resolution) });
    return peaks.map((p) => {
      const order = p.bin * sp.resolution;
      const onEngineOrder = Math.abs(order * 2 - Math.round(order * 2)) * 0.5 <= sp.resolution / 2;
      return { order, weightedDb: onEngineOrder ? 0.5 * p.snrDb : p.snrDb };
    });
  });
  const resolution = spectra[0]?.resolution ?? 1;
  /** Orders already shown by kept bands (their lines of at least 10 dB). */
  const shown: number[] = [];
  const novelty = (order: number) => (shown.some((o) => Math.abs(o - order) <= Math.max(1.5 * resolution, 0.006 * o)) ? SHOWN_WEIGHT : 1);
  const score = (i: number) => {
    const w = lines[i].map((l) => l.weightedDb * novelty(l.order)).sort((a, b) => b - a);
    return w.slice(0, LINES_SCORED).reduce((a, b) => a + b, 0);
  };
  const kept: BandCandidate[] = [];
  const open = cands.map((_, i) => i);
  while (kept.length < search.count && open.length > 0) {
    let best = -1, bestScore = -Infinity;
    for (const i of open) {
      if (kept.some((k) => bandsOverlap(k.bandHz, cands[i].bandHz))) continue;
      const sc = score(i);
      if (sc > bestScore) { best = i; bestScore = sc; }
    }
    if (best < 0) break;
    kept.push({ bandHz: cands[best].bandHz, score: bestScore });
    open.splice(open.indexOf(best), 1);
    for (const l of lines[best]) if (l.weightedDb >= 10) shown.push(l.order);
  }
  return kept;
}
