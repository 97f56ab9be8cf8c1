/**
 * Decimation of long series for plotting (issue 15 item 6): a line series is cut into buckets and
 * each bucket keeps its minimum and its maximum sample, in index order, so no peak or notch is lost
 * however far the series is reduced (the "min/max" or envelope decimation common in plotting
 * practice); a 2-D grid (spectrogram) is max-pooled. Pure: typed arrays in, index lists and arrays out.
 */

/**
 * Indices of `y` to keep so that at most `maxPoints` remain (at least 2), keeping each bucket's
 * minimum and maximum. Returns every index when the series is already short enough.
 * @param y the samples (over [from, to) of the series)
 * @param maxPoints at most this many indices (≥ 2)
 */
export function minMaxIndices(y: ArrayLike<number>, maxPoints: number, from = 0, to = y.length): number[] {
  if (!(maxPoints >= 2)) throw new RangeError(`maxPoints must be at least 2, got ${maxPoints}`);
  const n = Math.max(0, to - from);
  if (n <= maxPoints) return Array.from({ length: n }, (_, i) => from + i);
  const buckets = Math.floor(maxPoints / 2);
  const out: number[] = [];
  for (let b = 0; b < buckets; b++) {
    const s = from + Math.floor((b * n) / buckets);
    const e = from + Math.floor(((b + 1) * n) / buckets);
    let lo = s;
    let hi = s;
    for (let i = s + 1; i < e; i++) {
      if (y[i] < y[lo]) lo = i;
      if (y[i] > y[hi]) hi = i;
    }
    if (lo === hi) out.push(lo);
    else if (lo < hi) out.push(lo, hi);
    else out.push(hi, lo);
  }
  return out;
}

/** A max-pooled grid: `frames × bins` cells row-major, pooled by `frameStep × binStep`. */
export interface PooledGrid { frames: number; bins: number; frameStep: number; binStep: number; values: Float32Array }

/**
 * Max-pools a row-major `frames × bins` grid so that at most `maxCells` cells remain, pooling
 * bins and frames by about the same factor.
 */
export function maxPoolGrid(values: ArrayLike<number>, frames: number, bins: number, maxCells: number): PooledGrid {
  if (!(maxCells >= 1)) throw new RangeError(`maxCells must be at least 1, got ${maxCells}`);
  if (values.length < frames * bins) throw new RangeError(`grid needs ${frames * bins} values, got ${values.length}`);
  let frameStep = 1;
  let binStep = 1;
  const cells = () => Math.ceil(frames / frameStep) * Math.ceil(bins / binStep);
  while (cells() > maxCells) {
    if (Math.ceil(bins / binStep) >= Math.ceil(frames / frameStep)) binStep++;
    else frameStep++;
  }
  const f2 = Math.ceil(frames / frameStep);
  const b2 = Math.ceil(bins / binStep);
  const out = new Float32Array(f2 * b2).fill(-Infinity);
  for (let f = 0; f < frames; f++) {
    const row = Math.floor(f / frameStep) * b2;
    for (let b = 0; b < bins; b++) {
      const v = values[f * bins + b];
      const k = row + Math.floor(b / binStep);
      if (v > out[k]) out[k] = v;
    }
  }
  return { frames: f2, bins: b2, frameStep, binStep, values: out };
}
