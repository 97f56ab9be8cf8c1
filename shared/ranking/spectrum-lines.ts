/**
 * Reading lines out of an order spectrum for the ranking: local maxima inside a window, their
 * interpolated order, SNR over the running-median floor, and whether they sit on the engine's
 * 0.5-order comb. Spectra follow shared/analysis/types.ts: bin k is at order k × resolution,
 * amplitudes are Hann-windowed power averages (so a Gaussian fit over three bins places a peak).
 */
import type { OrderSpectrum } from '../analysis/types';
import { cycleCombGain } from '../dsp/comb-gain';
import { gaussianPeakOffset } from '../dsp/peaks';

/** A line found in a spectrum. */
export interface FoundLine {
  order: number;
  amplitude: number;
  /** 20·log10(peak / floor). */
  snrDb: number;
  bin: number;
}

/** Interpolated order of a local maximum at bin k (the Gaussian fit of shared/dsp/peaks.ts, Hann-windowed spectra). */
export function interpolateOrder(spectrum: OrderSpectrum, k: number): number {
  return (k + gaussianPeakOffset(spectrum.amplitude, k)) * spectrum.resolution;
}

function snrDbAt(spectrum: OrderSpectrum, k: number): number {
  const floor = spectrum.floor[k];
  const amp = spectrum.amplitude[k];
  if (!(floor > 0)) return amp > 0 ? 60 : 0;
  return 20 * Math.log10(Math.max(amp, 1e-300) / floor);
}

/**
 * Every local maximum whose bin centre lies in [lo, hi], strongest SNR first. A bin is a local
 * maximum when it is at least as high as both neighbours (neighbours outside the window count).
 */
export function localMaxima(spectrum: OrderSpectrum, lo: number, hi: number, minSnrDb = -Infinity): FoundLine[] {
  const a = spectrum.amplitude;
  const res = spectrum.resolution;
  const k0 = Math.max(1, Math.ceil(lo / res - 1e-9));
  const k1 = Math.min(a.length - 2, Math.floor(hi / res + 1e-9));
  const out: FoundLine[] = [];
  for (let k = k0; k <= k1; k += 1) {
    if (a[k] < a[k - 1] || a[k] < a[k + 1]) continue;
    const snrDb = snrDbAt(spectrum, k);
    if (snrDb < minSnrDb) continue;
    out.push({ order: interpolateOrder(spectrum, k), amplitude: a[k], snrDb, bin: k });
  }
  return out.sort((x, y) => y.snrDb - x.snrDb);
}

/** The strongest local maximum within ±tol of an order (tol at least one bin), or null. */
export function lineNear(spectrum: OrderSpectrum, order: number, tol: number): FoundLine | null {
  const t = Math.max(tol, spectrum.resolution);
  const found = localMaxima(spectrum, order - t, order + t);
  return found.length > 0 ? found[0] : null;
}

/** Highest order a spectrum holds (with a bin of margin for the neighbour test). */
export function topOrder(spectrum: OrderSpectrum): number {
  return (spectrum.amplitude.length - 2) * spectrum.resolution;
}

/**
 * Whether a measured line sits on the engine's comb: within 0.6 bin of a multiple of 0.5 order,
 * where the engine's own firing, valve and injector events put lines (locked to crank angle, so
 * exactly on the multiple; an interpolated peak lands within a fraction of a bin of it).
 */
export function onEngineComb(order: number, resolution: number): boolean {
  const nearest = Math.round(order / 0.5) * 0.5;
  if (nearest <= 0) return false;
  return Math.abs(order - nearest) <= 0.6 * resolution;
}

/**
 * Comb gain of the 720° synchronous average for a line at `order` (docs/references.md §3, via
 * shared/dsp/comb-gain.ts); 1 when no whole cycle was averaged. Above about 0.3 the average
 * cannot separate the line from the engine's own cycle.
 */
export function lineCycleGain(order: number, cycles: number): number {
  return cycles >= 1 ? cycleCombGain(order, cycles) : 1;
}

/**
 * Maps an SNR in dB to a strength 0–1: nothing at 3 dB or below, 0.5 at about 11 dB, 0.86 at
 * 27 dB; never saturating, so a stronger line always counts a little more.
 */
export function lineStrength(snrDb: number): number {
  return snrDb <= 3 ? 0 : 1 - Math.exp(-(snrDb - 3) / 12);
}

/**
 * How strongly the engine's own 0.5-order comb shows in a spectrum: the median SNR (dB) at the
 * bins of 0.5, 1.0, 1.5, … (up to order 40). Near 0 dB the comb is absent (e.g. an envelope of
 * the residual after the 720° average), so a line that happens to sit on a 0.5-order multiple
 * there is not suspect; a few of the multiples carrying a fault's lines do not move the median.
 */
export function engineCombLevelDb(spectrum: OrderSpectrum): number {
  const res = spectrum.resolution;
  const top = Math.min(40, topOrder(spectrum));
  const levels: number[] = [];
  for (let order = 0.5; order <= top; order += 0.5) {
    const k = Math.round(order / res);
    const floor = spectrum.floor[k];
    if (floor > 0) levels.push(20 * Math.log10(Math.max(spectrum.amplitude[k], 1e-300) / floor));
  }
  if (levels.length === 0) return 0;
  levels.sort((a, b) => a - b);
  return levels[Math.floor(levels.length / 2)];
}
