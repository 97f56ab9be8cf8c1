/** Small order statistics on typed arrays (pure; inputs are not modified). */

/**
 * The p-quantile (0 ≤ p ≤ 1, linear interpolation between order statistics) of the values, by
 * quickselect on a copy (O(n) on average; C. A. R. Hoare, "Algorithm 65: Find", CACM 4(7), 1961).
 */
export function quantile(values: ArrayLike<number>, p: number): number {
  if (values.length === 0) throw new RangeError('quantile of an empty array');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`quantile p must be in [0, 1], got ${p}`);
  const a = Float64Array.from(values as ArrayLike<number>);
  const pos = p * (a.length - 1);
  const i = Math.floor(pos);
  const f = pos - i;
  const lo = select(a, i);
  if (f === 0 || i + 1 >= a.length) return lo;
  // After select(a, i) every element right of i is ≥ a[i]: the next order statistic is their minimum.
  return lo * (1 - f) + minFrom(a, i + 1) * f;
}

/** Smallest element of a[from…] (its own function: quantile then has no loop of its own to be
 * compiled mid-call, which left the interpolation without type feedback and deoptimised it). */
function minFrom(a: Float64Array, from: number): number {
  let m = Infinity;
  for (let k = from; k < a.length; k++) if (a[k] < m) m = a[k];
  return m;
}

/** Rearranges a so that a[k] is the k-th smallest (Hoare's selection, median-of-three pivot). */
function select(a: Float64Array, k: number): number {
  let left = 0;
  let right = a.length - 1;
  while (right > left) {
    const mid = (left + right) >> 1;
    // Median of three as pivot, moved to a[k] position logic below.
    const x = a[left], y = a[mid], z = a[right];
    const pivot = x < y ? (y < z ? y : x < z ? z : x) : (x < z ? x : y < z ? z : y);
    let i = left, j = right;
    while (i <= j) {
      while (a[i] < pivot) i++;
      while (a[j] > pivot) j--;
      if (i <= j) { const t = a[i]; a[i] = a[j]; a[j] = t; i++; j--; }
    }
    if (k <= j) right = j;
    else if (k >= i) left = i;
    else return a[k];
  }
  return a[k];
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
