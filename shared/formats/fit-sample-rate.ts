import { CaptureFormatError } from './capture-format-error';

/**
 * Least-squares line t_i = a + b·i over the whole time column (float64, centred sums). The fit is
 * refused (`rate_irregular`) only when the local interval drifts by more than 1 % between the
 * first and last tenth of the column, or when a residual exceeds both half a sample interval and
 * the column's printed precision (a time printed with 2 decimals cannot be better than 0.01).
 * A zero or negative slope is `zero_rate`.
 */
export interface RateFit {
  /** Sample interval in the time column's units. */
  intervalUnits: number;
  startUnits: number;
  maxResidualUnits: number;
  driftFraction: number;
}

/** Fits the sample interval of a time column (see the module comment for the refusal rule). */
export function fitSampleRate(t: Float64Array, printedPrecision: number, name: string): RateFit {
  const n = t.length;
  const iMean = (n - 1) / 2;
  let tMean = 0;
  for (let i = 0; i < n; i++) tMean += t[i];
  tMean /= n;
  let sxy = 0;
  let sxx = 0;
  for (let i = 0; i < n; i++) {
    const di = i - iMean;
    sxy += di * (t[i] - tMean);
    sxx += di * di;
  }
  const b = sxy / sxx;
  if (!(b > 0)) {
    throw new CaptureFormatError('zero_rate', `${name}: the time column does not increase, so no sample rate can be found; export the capture with its time column`);
  }
  const a = tMean - b * iMean;
  let maxRes = 0;
  let worst = 0;
  for (let i = 0; i < n; i++) {
    const r = Math.abs(t[i] - (a + b * i));
    if (r > maxRes) { maxRes = r; worst = i; }
  }
  const tenth = Math.max(2, Math.floor(n / 10));
  const local = (i0: number, i1: number) => (t[i1] - t[i0]) / (i1 - i0);
  const drift = n >= 20 ? Math.abs(local(n - tenth, n - 1) - local(0, tenth - 1)) / b : 0;
  if (drift > 0.01) {
    throw new CaptureFormatError('rate_irregular',
      `${name}: the sample interval drifts by ${(drift * 100).toFixed(1)} % along the time column (over 1 %); export with a fixed sample rate`);
  }
  if (maxRes > 0.5 * b && maxRes > printedPrecision * 1.0001) {
    throw new CaptureFormatError('rate_irregular',
      `${name}: row ${worst + 1} of the data is ${(maxRes / b).toFixed(1)} sample intervals off an even time grid (gaps or repeated rows?); export the capture again without gaps`);
  }
  return { intervalUnits: b, startUnits: a, maxResidualUnits: maxRes, driftFraction: drift };
}
