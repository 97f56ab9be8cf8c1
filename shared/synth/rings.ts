/**
 * Impacts that ring a lightly damped structural mode: each impact at time t₀ adds
 * a·e^(−(t−t₀)/τ)·sin(2πf(t−t₀)) for t ≥ t₀, with τ = 1 / (2π·ζ·f) (the impulse response of a
 * single-degree-of-freedom mode of damping ratio ζ, as used for bearing-impact models in
 * Randall & Antoni, MSSP 25(2), 2011). Times are exact (sub-sample); the sine onset keeps the
 * signal continuous.
 */

/** A structural mode: natural frequency and damping ratio. */
export interface RingMode {
  freqHz: number;
  damping: number;
}

/**
 * Adds one ringing burst per impact to `out` (in place). Each burst is cut after seven time
 * constants (under 0.1 % of its start).
 */
export function addRings(
  out: Float64Array,
  sampleRateHz: number,
  timesS: ArrayLike<number>,
  amplitudes: ArrayLike<number>,
  mode: RingMode,
): void {
  const tau = 1 / (2 * Math.PI * mode.damping * mode.freqHz);
  const span = Math.ceil(7 * tau * sampleRateHz);
  const w = 2 * Math.PI * mode.freqHz;
  for (let k = 0; k < timesS.length; k++) {
    const t0 = timesS[k];
    const a = amplitudes[k];
    if (a === 0) continue;
    const start = Math.max(0, Math.ceil(t0 * sampleRateHz));
    const end = Math.min(out.length, start + span);
    for (let i = start; i < end; i++) {
      const dt = i / sampleRateHz - t0;
      out[i] += a * Math.exp(-dt / tau) * Math.sin(w * dt);
    }
  }
}

/** Mean square of a signal (its power). */
export function meanSquare(x: ArrayLike<number>): number {
  let sum = 0;
  for (let i = 0; i < x.length; i++) sum += x[i] * x[i];
  return x.length > 0 ? sum / x.length : 0;
}
