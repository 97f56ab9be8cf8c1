/**
 * Time-synchronous average over whole periods of an angle-domain signal (here the 720° engine
 * cycle): avg[i] = mean over cycles c of x[c·period + i]. Noise power falls by the number of
 * cycles N; a component at x cycles per period passes with |sin(Nπx)/(N sin πx)| (docs/references.md
 * §3, see dsp/comb-gain.ts). Subtracting it leaves the residual in which the engine's own
 * cycle-locked ticks no longer dominate (Randall & Antoni 2011, discrete/random separation).
 */
export function synchronousAverage(x: Float64Array, period: number): { average: Float64Array; cycles: number } {
  if (!Number.isInteger(period) || period < 1) throw new RangeError(`synchronous-average period must be a positive integer, got ${period}`);
  const cycles = Math.floor(x.length / period);
  const average = new Float64Array(period);
  if (cycles === 0) return { average, cycles };
  for (let c = 0; c < cycles; c++) {
    const o = c * period;
    for (let i = 0; i < period; i++) average[i] += x[o + i];
  }
  for (let i = 0; i < period; i++) average[i] /= cycles;
  return { average, cycles };
}

/** x minus the periodic average (every sample, the partial last cycle included). */
export function subtractAverage(x: Float64Array, average: Float64Array, out?: Float64Array): Float64Array {
  const y = out ?? new Float64Array(x.length);
  const p = average.length;
  for (let i = 0, j = 0; i < x.length; i++, j++) {
    if (j === p) j = 0;
    y[i] = x[i] - average[j];
  }
  return y;
}
