/**
 * Interpolated spectral peaks. A peak is a local maximum of the amplitude spectrum; its position
 * and height are refined by a parabola through the log amplitudes of the three bins around it
 * (a Gaussian fit: for a Hann window the position error is below about 0.05 bin and the height
 * error below 0.1 dB; J. O. Smith, Spectral Audio Signal Processing, "Quadratic interpolation of
 * spectral peaks", from memory). SNR is 20·log10(peak / floor) against a floor such as the
 * running median.
 */
export interface SpectralPeak {
  /** Interpolated position in bins. */
  bin: number;
  amplitude: number;
  snrDb: number;
}

export interface FindPeaksOptions {
  minSnrDb?: number;
  maxPeaks?: number;
  /** First and last bin searched (inclusive). */
  fromBin?: number;
  toBin?: number;
}

/**
 * Offset (−0.5 … 0.5 bin) of the peak at bin k from the parabola through the log amplitudes of
 * bins k−1, k, k+1 (the Gaussian fit above); 0 at the edges or where the three are not concave.
 */
export function gaussianPeakOffset(amplitude: ArrayLike<number>, k: number): number {
  if (k <= 0 || k >= amplitude.length - 1) return 0;
  const tiny = 1e-300;
  const la = Math.log(Math.max(amplitude[k - 1], tiny));
  const lb = Math.log(Math.max(amplitude[k], tiny));
  const lc = Math.log(Math.max(amplitude[k + 1], tiny));
  const den = la - 2 * lb + lc;
  const delta = den < 0 ? (0.5 * (la - lc)) / den : 0;
  return delta > 0.5 ? 0.5 : delta < -0.5 ? -0.5 : delta;
}

/** Every local maximum with SNR ≥ minSnrDb, strongest first, at most maxPeaks. */
export function findPeaks(amplitude: ArrayLike<number>, floor: ArrayLike<number>, options: FindPeaksOptions = {}): SpectralPeak[] {
  const minSnrDb = options.minSnrDb ?? 6;
  const maxPeaks = options.maxPeaks ?? 50;
  const from = Math.max(1, options.fromBin ?? 1);
  const to = Math.min(amplitude.length - 2, options.toBin ?? amplitude.length - 2);
  const peaks: SpectralPeak[] = [];
  const tiny = 1e-300;
  for (let k = from; k <= to; k++) {
    const b = amplitude[k];
    if (!(b > amplitude[k - 1] && b >= amplitude[k + 1])) continue;
    const la = Math.log(Math.max(amplitude[k - 1], tiny));
    const lb = Math.log(Math.max(b, tiny));
    const lc = Math.log(Math.max(amplitude[k + 1], tiny));
    const delta = gaussianPeakOffset(amplitude, k);
    const amp = Math.exp(lb - 0.25 * (la - lc) * delta);
    const fl = floor[k];
    const snrDb = fl > 0 ? 20 * Math.log10(amp / fl) : Infinity;
    if (snrDb >= minSnrDb) peaks.push({ bin: k + delta, amplitude: amp, snrDb });
  }
  peaks.sort((p, q) => q.amplitude - p.amplitude);
  return peaks.slice(0, maxPeaks);
}
