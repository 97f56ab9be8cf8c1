/** Small order statistics on typed arrays (pure; inputs are not modified). */

/** The p-quantile (0 ≤ p ≤ 1, linear interpolation between order statistics) of the values. */
export function quantile(values: ArrayLike<number>, p: number): number {
  if (values.length === 0) throw new RangeError('quantile of an empty array');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile p must be in [0, 1], got ${p}`);
  const s = Float64Array.from(values as ArrayLike<number>).sort();
  const pos = p * (s.length - 1);
  const i = Math.floor(pos);
  const f = pos - i;
  return i + 1 < s.length ? s[i] * (1 - f) + s[i + 1] * f : s[i];
}

/** Median of the values. */
export function median(values: ArrayLike<number>): number {
  return quantile(values, 0.5);
}

/** Mean of the values. */
export function mean(values: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < values.length; i++) s += values[i];
  return s / values.length;
}

/** Sample standard deviation (n − 1). */
export function standardDeviation(values: ArrayLike<number>): number {
  const m = mean(values);
  let s = 0;
  for (let i = 0; i < values.length; i++) s += (values[i] - m) ** 2;
  return Math.sqrt(s / Math.max(1, values.length - 1));
}
