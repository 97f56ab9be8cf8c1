/**
 * Gain of a time-synchronous average over N periods for a component at x cycles per averaging
 * period: |sin(Nπx) / (N·sin(πx))| (docs/references.md §3; P. D. McFadden, "A revised model for the
 * extraction of periodic waveforms by time domain averaging", MSSP 1(1), 1987, from memory).
 * Over the 720° engine cycle a crank order o has x = 2·o, taken as its distance to the nearest
 * integer: every 0.5-order multiple passes in full, other orders are only attenuated.
 */
export function combGain(x: number, periods: number): number {
  if (!(periods >= 1)) throw new RangeError(`synchronous average needs ≥ 1 period, got ${periods}`);
  const d = Math.abs(x - Math.round(x));
  if (d < 1e-12) return 1;
  return Math.abs(Math.sin(periods * Math.PI * d) / (periods * Math.sin(Math.PI * d)));
}

/** Comb gain of the 720° engine-cycle average (over `cycles` cycles) at crank order `order`. */
export function cycleCombGain(order: number, cycles: number): number {
  return combGain(2 * order, cycles);
}
