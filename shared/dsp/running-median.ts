/**
 * Running median over a centred window of `width` bins (odd; clipped at the ends): the noise
 * floor under a spectrum, robust to the peaks themselves. O(n·width) with a sorted window.
 */
export function runningMedian(x: ArrayLike<number>, width: number, out?: Float64Array): Float64Array {
  if (!Number.isInteger(width) || width < 1 || width % 2 === 0) throw new RangeError(`running-median width must be an odd positive integer, got ${width}`);
  const n = x.length;
  const y = out ?? new Float64Array(n);
  if (n === 0) return y;
  const half = (width - 1) / 2;
  const win: number[] = [];
  const insert = (v: number) => {
    let lo = 0, hi = win.length;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (win[mid] < v) lo = mid + 1; else hi = mid; }
    win.splice(lo, 0, v);
  };
  const remove = (v: number) => {
    let lo = 0, hi = win.length;
    while (lo < hi) { const mid = (lo + hi) >> 1; if (win[mid] < v) lo = mid + 1; else hi = mid; }
    win.splice(lo, 1);
  };
  let left = 0, right = -1;
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - half), b = Math.min(n - 1, i + half);
    while (right < b) insert(x[++right]);
    while (left < a) remove(x[left++]);
    const m = win.length;
    y[i] = m % 2 === 1 ? win[(m - 1) >> 1] : 0.5 * (win[m / 2 - 1] + win[m / 2]);
  }
  return y;
}
