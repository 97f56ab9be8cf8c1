import { findPeaks } from '../dsp/peaks';
import { type OrderSpectrum, type Peak } from './types';

/**
 * Peaks of an order spectrum as the CLI reports them: every interpolated local maximum with
 * snrDb ≥ 6 against the running-median floor, at most 50, strongest first. engineOrder = the
 * 0.5-order multiple within half the resolution (else null); firing = that multiple is a multiple
 * of cylinders/2 (firing frequency = rpm/60 × cylinders/2 [common practice; Heywood 1988, from
 * memory]).
 */
export function orderPeaks(spec: OrderSpectrum, cylinders: number, minOrder = 0.2): Peak[] {
  const from = Math.max(1, Math.ceil(minOrder / spec.resolution));
  const raw = findPeaks(spec.amplitude, spec.floor, { minSnrDb: 6, maxPeaks: 50, fromBin: from, toBin: Math.floor(spec.maxOrder / spec.resolution) });
  return raw.map((p) => {
    const order = p.bin * spec.resolution;
    return { order, amplitude: p.amplitude, snrDb: p.snrDb, ...engineLine(order, spec.resolution, cylinders) };
  });
}

/** The engine-synchronous label of an order (see orderPeaks). */
export function engineLine(order: number, resolution: number, cylinders: number): { engineOrder: number | null; firing: boolean } {
  const m = Math.round(order * 2) / 2;
  if (m <= 0 || Math.abs(order - m) > resolution / 2 + 1e-9) return { engineOrder: null, firing: false };
  const ratio = m / (cylinders / 2);
  return { engineOrder: m, firing: Math.abs(ratio - Math.round(ratio)) < 1e-9 };
}
