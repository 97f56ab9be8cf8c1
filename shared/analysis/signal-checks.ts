import { AnalysisInputError } from './analysis-input-error';

/**
 * Checks on a capture that reads fine but whose signal cannot carry an analysis (issue 19, the
 * "signal tier" of hostile captures). Each throws an AnalysisInputError with a stable code and a
 * message saying what to do; the CLI exits 2 and the job runner marks the analysis failed.
 */

/** Share of samples held at the channel's extremes above which a pickup counts as clipped flat (ours). */
export const FLAT_SHARE = 0.5;
/** Consecutive samples at one extreme that make a clipped run (a quantised quiet signal flips faster; ours). */
export const CLIP_RUN = 8;

/**
 * Throws `flat_channel` when the pickup channel holds one value, or when at least FLAT_SHARE of its
 * samples sit at its minimum or maximum in runs of CLIP_RUN or more (an input clipped at the
 * recorder's range, or a lead that is off): its spectra would show nothing but the clipping.
 * @param pickup the pickup channel as read (any scale)
 * @param channel its 1-based channel number, for the message
 */
export function checkPickupNotFlat(pickup: ArrayLike<number>, channel: number): void {
  const n = pickup.length;
  if (n === 0) return;
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < n; i++) {
    const v = pickup[i];
    if (v < min) min = v;
    if (v > max) max = v;
  }
  let clipped = 0;
  let run = 0;
  for (let i = 0; i <= n; i++) {
    const v = i < n ? pickup[i] : NaN;
    if (i < n && (v === min || v === max) && (run === 0 || v === pickup[i - 1])) run++;
    else {
      if (run >= CLIP_RUN) clipped += run;
      run = i < n && (v === min || v === max) ? 1 : 0;
    }
  }
  const share = min === max ? 1 : clipped / n;
  if (share >= FLAT_SHARE) {
    throw new AnalysisInputError('flat_channel',
      `the pickup (channel ${channel}) is flat: ${(share * 100).toFixed(0)} % of its samples sit at its limits, so it was clipped at the recorder's input range or its lead is off; check the pickup lead and the range, then record again`);
  }
}

/** How far outside the plausible speed range a mean speed may read before the analysis stops (a factor; ours). */
export const SPEED_MARGIN = 1.5;

/**
 * Throws `speed_implausible` when the reference implies a mean speed more than SPEED_MARGIN times
 * outside minRpm…maxRpm (for example 30 000 rpm): the reference kind or pulse count is wrong, or
 * the channel carries something else, and every order would be wrong with it. Speeds just outside
 * the range stay a warning (`rpm_implausible`).
 */
export function checkSpeedPlausible(meanRpm: number, minRpm: number, maxRpm: number): void {
  if (meanRpm > maxRpm * SPEED_MARGIN || meanRpm < minRpm / SPEED_MARGIN) {
    throw new AnalysisInputError('speed_implausible',
      `the reference implies ${meanRpm.toFixed(0)} rpm, far outside ${minRpm}–${maxRpm} rpm; check the reference kind and pulses per cycle (--ref-kind, --ref-per-cycle) and that the reference lead is on the right channel`);
  }
}
