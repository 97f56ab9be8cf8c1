import { type FftPlanCache } from './fft';
import { type StftOptions, visitStftPower } from './stft';

/**
 * Spectral kurtosis over STFT frames, SK(f) = ⟨|X|⁴⟩ / ⟨|X|²⟩² − 2 (J. Antoni, "The spectral
 * kurtosis: a useful tool for characterising non-stationary signals", MSSP 20(2):282–307, 2006):
 * about 0 for Gaussian noise, −1 for a steady sinusoid, > 0 for impulsive content. Returned per
 * bin k = 0..N/2 (bin k at k·fs/N).
 */
export function spectralKurtosis(x: ArrayLike<number>, options: StftOptions, plans: FftPlanCache): { sk: Float64Array; meanPower: Float64Array; frames: number } {
  const bins = options.frameSize / 2 + 1;
  const s2 = new Float64Array(bins);
  const s4 = new Float64Array(bins);
  const frames = visitStftPower(x, options, plans, (_f, p) => {
    for (let k = 0; k < bins; k++) { s2[k] += p[k]; s4[k] += p[k] * p[k]; }
  });
  const sk = new Float64Array(bins);
  const meanPower = new Float64Array(bins);
  for (let k = 0; k < bins; k++) {
    const m2 = s2[k] / Math.max(1, frames);
    meanPower[k] = m2;
    sk[k] = m2 > 0 ? s4[k] / Math.max(1, frames) / (m2 * m2) - 2 : 0;
  }
  return { sk, meanPower, frames };
}
