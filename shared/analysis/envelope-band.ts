import { type FftPlanCache, nextPowerOfTwo } from '../dsp/fft';
import { spectralKurtosis } from '../dsp/spectral-kurtosis';

/**
 * Automatic envelope band (DESIGN.md step 5): spectral kurtosis (Antoni 2006) of the residual
 * after the 720° average was subtracted, estimated with two STFT frame lengths (about 3 ms and
 * 12 ms, like two levels of a kurtogram; Antoni 2007), scored per candidate band as the mean SK of
 * its bins, best of the two. The residual is in the angle domain; its bins map to Hz with the mean
 * speed (a structural resonance is fixed in Hz). Bands of 1×, 2× and 4× the minimum width slide in
 * quarter-width steps; the best two or three that overlap each other by less than half are kept.
 */
export interface BandCandidate {
  bandHz: [number, number];
  score: number;
}

export interface BandSearch {
  /** Equivalent sample rate of the angle-domain residual at the mean speed (Hz). */
  rateHz: number;
  loHz: number;
  hiHz: number;
  minWidthHz: number;
  maxWidthHz: number;
  count: number;
  /** At most this many STFT frames per frame length (strided over the whole capture). */
  maxFrames?: number;
}

/** The best bands, best first (at least one). */
export function chooseEnvelopeBands(residual: Float64Array, search: BandSearch, plans: FftPlanCache): BandCandidate[] {
  const { rateHz, loHz, hiHz } = search;
  const maxFrames = search.maxFrames ?? 6000;
  const levels = [0.003, 0.012].map((sec) => {
    const size = Math.min(4096, Math.max(32, nextPowerOfTwo(rateHz * sec)));
    const hop = size / 2;
    const frames = Math.max(1, Math.floor((residual.length - size) / hop) + 1);
    const stride = Math.max(1, Math.ceil(frames / maxFrames));
    const { sk } = spectralKurtosis(residual, { frameSize: size, hop, stride, window: 'hann' }, plans);
    // Cumulative sums for O(1) band means.
    const cum = new Float64Array(sk.length + 1);
    for (let k = 0; k < sk.length; k++) cum[k + 1] = cum[k] + sk[k];
    return { binHz: rateHz / size, cum, bins: sk.length };
  });
  const bandScore = (lo: number, hi: number) => {
    let best = -Infinity;
    for (const L of levels) {
      const a = Math.max(1, Math.ceil(lo / L.binHz));
      const b = Math.min(L.bins - 1, Math.floor(hi / L.binHz));
      if (b < a) continue;
      const m = (L.cum[b + 1] - L.cum[a]) / (b - a + 1);
      if (m > best) best = m;
    }
    return best;
  };
  const cands: BandCandidate[] = [];
  const span = hiHz - loHz;
  for (let w = Math.min(search.minWidthHz, span); w <= Math.min(search.maxWidthHz, span) + 1e-9; w *= 2) {
    const step = w / 4;
    for (let lo = loHz; lo + w <= hiHz + 1e-9; lo += step) {
      const s = bandScore(lo, lo + w);
      if (Number.isFinite(s)) cands.push({ bandHz: [lo, lo + w], score: s });
    }
    if (w >= span) break;
  }
  if (cands.length === 0) return [{ bandHz: [loHz, hiHz], score: 0 }];
  cands.sort((a, b) => b.score - a.score);
  const chosen: BandCandidate[] = [];
  for (const c of cands) {
    if (chosen.every((k) => overlapFraction(k.bandHz, c.bandHz) < 0.5)) chosen.push(c);
    if (chosen.length >= search.count) break;
  }
  return chosen;
}

function overlapFraction(a: [number, number], b: [number, number]): number {
  const o = Math.max(0, Math.min(a[1], b[1]) - Math.max(a[0], b[0]));
  return o / Math.min(a[1] - a[0], b[1] - b[0]);
}
