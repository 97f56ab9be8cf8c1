/**
 * Spectrum series as the plots read them: `order[i]` and `amplitude[i]` (the API serves them
 * decimated with explicit x; docs/api.md GET /analyses/:id/series/:name), plus the resolution of
 * the underlying spectrum in orders (1 / revolutions per block) for widening windows. Linear
 * amplitudes are in the capture's units; dB are 20·log10(amplitude / 1 unit), floored so an empty
 * bin stays on the chart.
 */
export interface SpectrumData {
  order: ArrayLike<number>;
  amplitude: ArrayLike<number>;
  resolution: number;
}

/** The dB value of an amplitude (re 1 unit); amplitudes below 1e-12 are drawn at −240 dB. */
export function toDb(amplitude: number): number {
  return 20 * Math.log10(Math.max(amplitude, 1e-12));
}

/** Highest order the series reaches (0 when empty). */
export function lastOrder(s: SpectrumData): number {
  return s.order.length > 0 ? s.order[s.order.length - 1]! : 0;
}

/** [order, value] pairs above order 0 (bin 0 is the mean, never a line), in linear or dB. */
export function spectrumPoints(s: SpectrumData, scale: 'linear' | 'db', maxOrder = Infinity): [number, number][] {
  const out: [number, number][] = [];
  const n = Math.min(s.order.length, s.amplitude.length);
  for (let i = 0; i < n; i += 1) {
    const order = s.order[i]!;
    if (order <= 0) continue;
    if (order > maxOrder) break;
    const a = s.amplitude[i]!;
    out.push([order, scale === 'db' ? toDb(a) : a]);
  }
  return out;
}
