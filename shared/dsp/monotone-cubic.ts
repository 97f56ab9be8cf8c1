/**
 * Monotone piecewise-cubic Hermite interpolation (F. N. Fritsch & R. E. Carlson, "Monotone
 * piecewise cubic interpolation", SIAM J. Numer. Anal. 17(2):238–246, 1980), with the weighted
 * harmonic-mean slopes of Fritsch & Butland (1984) used by PCHIP. Knots in float64, strictly
 * increasing x. Used for crank angle against time (and its inverse): monotone data stay
 * monotone, so no sample is ever resampled twice or out of order.
 */
export class MonotoneCubic {
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  readonly slopes: Float64Array;

  constructor(xs: Float64Array, ys: Float64Array) {
    const n = xs.length;
    if (n < 2 || ys.length !== n) throw new RangeError(`monotone cubic needs ≥ 2 knots of equal length, got ${n} and ${ys.length}`);
    for (let i = 1; i < n; i++) {
      if (!(xs[i] > xs[i - 1])) throw new RangeError(`monotone cubic knots must increase strictly, knot ${i} = ${xs[i]} after ${xs[i - 1]}`);
    }
    this.xs = xs;
    this.ys = ys;
    const m = new Float64Array(n);
    const h = new Float64Array(n - 1);
    const d = new Float64Array(n - 1);
    for (let i = 0; i < n - 1; i++) { h[i] = xs[i + 1] - xs[i]; d[i] = (ys[i + 1] - ys[i]) / h[i]; }
    if (n === 2) { m[0] = m[1] = d[0]; }
    else {
      for (let i = 1; i < n - 1; i++) {
        if (d[i - 1] * d[i] <= 0) m[i] = 0;
        else {
          const w1 = 2 * h[i] + h[i - 1];
          const w2 = h[i] + 2 * h[i - 1];
          m[i] = (w1 + w2) / (w1 / d[i - 1] + w2 / d[i]);
        }
      }
      m[0] = endSlope(h[0], h[1], d[0], d[1]);
      m[n - 1] = endSlope(h[n - 2], h[n - 3], d[n - 2], d[n - 3]);
    }
    this.slopes = m;
  }

  /** Index i of the interval [x_i, x_{i+1}] holding x (clamped to the ends). */
  private interval(x: number, hint = 0): number {
    const xs = this.xs;
    const n = xs.length;
    let i = Math.min(Math.max(hint, 0), n - 2);
    if (x >= xs[i] && x <= xs[i + 1]) return i;
    if (x >= xs[i + 1] && i + 2 < n && x <= xs[i + 2]) return i + 1;
    let lo = 0, hi = n - 1;
    while (hi - lo > 1) { const mid = (lo + hi) >> 1; if (xs[mid] <= x) lo = mid; else hi = mid; }
    return lo;
  }

  /** Value at x (linear extension beyond the ends, with the end slopes). */
  at(x: number, hint = 0): number {
    const xs = this.xs;
    const n = xs.length;
    if (x <= xs[0]) return this.ys[0] + this.slopes[0] * (x - xs[0]);
    if (x >= xs[n - 1]) return this.ys[n - 1] + this.slopes[n - 1] * (x - xs[n - 1]);
    const i = this.interval(x, hint);
    return this.hermite(i, x);
  }

  /** Derivative dy/dx at x. */
  derivative(x: number): number {
    const xs = this.xs;
    const n = xs.length;
    if (x <= xs[0]) return this.slopes[0];
    if (x >= xs[n - 1]) return this.slopes[n - 1];
    const i = this.interval(x);
    const h = xs[i + 1] - xs[i];
    const t = (x - xs[i]) / h;
    const y0 = this.ys[i], y1 = this.ys[i + 1], m0 = this.slopes[i], m1 = this.slopes[i + 1];
    const t2 = t * t;
    return ((6 * t2 - 6 * t) * y0 + (3 * t2 - 4 * t + 1) * h * m0 + (-6 * t2 + 6 * t) * y1 + (3 * t2 - 2 * t) * h * m1) / h;
  }

  /** Values at increasing query points (a pointer walk: O(knots + queries)). */
  atSorted(q: ArrayLike<number>, out?: Float64Array): Float64Array {
    const y = out ?? new Float64Array(q.length);
    const xs = this.xs;
    const n = xs.length;
    let i = 0;
    for (let k = 0; k < q.length; k++) {
      const x = q[k];
      if (x <= xs[0] || x >= xs[n - 1]) { y[k] = this.at(x); continue; }
      while (i < n - 2 && xs[i + 1] < x) i++;
      y[k] = this.hermite(i, x);
    }
    return y;
  }

  private hermite(i: number, x: number): number {
    const x0 = this.xs[i];
    const h = this.xs[i + 1] - x0;
    const t = (x - x0) / h;
    const t2 = t * t, t3 = t2 * t;
    return (2 * t3 - 3 * t2 + 1) * this.ys[i] + (t3 - 2 * t2 + t) * h * this.slopes[i]
      + (-2 * t3 + 3 * t2) * this.ys[i + 1] + (t3 - t2) * h * this.slopes[i + 1];
  }
}

/** Three-point end slope with the Fritsch–Carlson shape limits (as in PCHIP). */
function endSlope(h0: number, h1: number, d0: number, d1: number): number {
  let m = ((2 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
  if (Math.sign(m) !== Math.sign(d0)) m = 0;
  else if (Math.sign(d0) !== Math.sign(d1) && Math.abs(m) > Math.abs(3 * d0)) m = 3 * d0;
  return m;
}
