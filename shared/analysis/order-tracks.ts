import { type FftPlanCache } from '../dsp/fft';
import { coherentGain, createWindow } from '../dsp/window';
import { type OrderSpectrum } from './types';

/**
 * Order tracks over a speed sweep (issue 20 item 5): the amplitude of a line at a FIXED crank
 * order against rpm. A bracket resonance or a pulley's critical speed sits at a fixed frequency,
 * so a line of order o peaks where o·rpm/60 crosses it: rpm_peak = 60·f_res / o, and every order
 * passes through it at its own speed (Brandt, "Noise and Vibration Analysis", 2011, ch. 12, order
 * tracks from computed order tracking; from memory). Here an order map is built in the angle
 * domain (short Hann blocks of whole revolutions, so a line keeps its order while the speed
 * sweeps), then each suspect's order is read in every block and the blocks are binned by rpm.
 */
export interface OrderMap {
  /** Order resolution of a row (1 / revolutions per block). */
  resolution: number;
  bins: number;
  rows: number;
  /** Mean rpm of each row (block or capture). */
  rpm: Float32Array;
  /** rows × bins, single-sided peak amplitude (as `orderSpectrum`). */
  amplitude: Float32Array;
}

/** Revolutions per block of the order map: 8 gives 1/8-order lines, short enough to follow a run-up. */
export const ORDER_MAP_REVS = 8;
/** A capture counts as a sweep when its per-revolution speed spans this ratio (max / min). */
export const SWEEP_RATIO = 1.2;
/** Largest order map kept (rows × bins floats, 2 MiB as float32: a stored series stays under 4 MiB; STYLE.md §6). */
const MAX_FLOATS = 1 << 19;

/**
 * Order map of an angle-domain signal (samplesPerRev per revolution, starting at crank angle
 * `startDeg`): Hann blocks of ORDER_MAP_REVS revolutions with 50 % overlap (the hop raised when
 * the map would pass 1M floats), amplitude 2|X|/(N·CG) per bin (bin k at order k/ORDER_MAP_REVS,
 * up to maxOrder), and each block's mean rpm from the crank's time at its edges: 60·revs/Δt.
 */
export function orderMap(
  xAng: Float64Array, samplesPerRev: number, startDeg: number, timeAtDeg: (deg: number) => number, maxOrder: number, plans: FftPlanCache,
): OrderMap {
  const n = samplesPerRev * ORDER_MAP_REVS;
  if (xAng.length < n) throw new RangeError(`an order map needs at least ${ORDER_MAP_REVS} revolutions, got ${(xAng.length / samplesPerRev).toFixed(1)}`);
  const bins = Math.min(n / 2, Math.floor(maxOrder * ORDER_MAP_REVS)) + 1;
  const maxRows = Math.max(1, Math.floor(MAX_FLOATS / bins));
  const avail = xAng.length - n;
  const hop = Math.max(n / 2, Math.ceil(avail / Math.max(1, maxRows - 1)));
  const rows = Math.floor(avail / hop) + 1;
  const plan = plans.get(n);
  const w = createWindow('hann', n);
  const scale = 2 / (n * coherentGain(w));
  const frame = new Float64Array(n);
  const amplitude = new Float32Array(rows * bins);
  const rpm = new Float32Array(rows);
  for (let r = 0; r < rows; r++) {
    const s = r * hop;
    let m = 0;
    for (let i = 0; i < n; i++) m += xAng[s + i];
    m /= n;
    for (let i = 0; i < n; i++) frame[i] = (xAng[s + i] - m) * w[i];
    plan.fft.realTransform(plan.work, frame);
    const o = plan.work;
    for (let k = 0; k < bins; k++) amplitude[r * bins + k] = Math.sqrt(o[2 * k] * o[2 * k] + o[2 * k + 1] * o[2 * k + 1]) * scale;
    const d0 = startDeg + (360 * s) / samplesPerRev;
    const dt = timeAtDeg(d0 + 360 * ORDER_MAP_REVS) - timeAtDeg(d0);
    rpm[r] = dt > 0 ? (60 * ORDER_MAP_REVS) / dt : 0;
  }
  return { resolution: 1 / ORDER_MAP_REVS, bins, rows, rpm, amplitude };
}

/** One capture of a held-rpm series as a one-row order map: its order spectrum at its mean rpm. */
export function orderMapFromSpectrum(spectrum: OrderSpectrum, meanRpm: number): OrderMap {
  return { resolution: spectrum.resolution, bins: spectrum.amplitude.length, rows: 1, rpm: Float32Array.of(meanRpm), amplitude: Float32Array.from(spectrum.amplitude) };
}

/** A line to track: its label and order (ratio × factor, or a measured order). */
export interface TrackedLine { label: string; order: number }

export interface OrderTrack {
  label: string;
  order: number;
  /** Centres of the rpm bins that hold data, and the line's RMS-averaged amplitude in each. */
  rpm: Float64Array;
  amplitude: Float64Array;
  /** The bin where the line peaks and the contiguous span within 3 dB of it; null when the track is flat. */
  peak: { rpm: number; amplitude: number; rangeRpm: [number, number]; prominenceDb: number } | null;
}

/** A track peaks when its top bin stands this far over the track's median (dB); else it is called flat. */
export const PEAK_PROMINENCE_DB = 6;

/**
 * Order tracks of the given lines over one or more order maps (a run-up, a run-down, or a series
 * of held-rpm captures). Each row's amplitude at order o is the largest of the bins within ±half
 * a bin of the line's width (±1 bin), so a line between bins or slightly slipped reads at its
 * level (Hann scalloping ≤ 1.42 dB; Harris 1978). Rows are binned by rpm in `binRpm` wide bins
 * (default: the speed span / 30, at least 20 rpm) and power-averaged. The peak's range is the
 * contiguous run of bins within 3 dB of the top bin (the half-power width of a resonance).
 */
export function orderTracks(maps: readonly OrderMap[], lines: readonly TrackedLine[], options: { binRpm?: number } = {}): OrderTrack[] {
  let lo = Infinity, hi = -Infinity;
  for (const m of maps) for (const r of m.rpm) if (r > 0) { lo = Math.min(lo, r); hi = Math.max(hi, r); }
  if (!(hi >= lo)) throw new RangeError('order tracks need at least one row with a positive rpm');
  const binRpm = options.binRpm ?? Math.max(20, Math.round((hi - lo) / 30 / 10) * 10);
  if (!(binRpm > 0)) throw new RangeError(`rpm bin width must be positive, got ${binRpm}`);
  const first = Math.floor(lo / binRpm);
  const nBins = Math.floor(hi / binRpm) - first + 1;
  return lines.map((line) => {
    const sum = new Float64Array(nBins);
    const count = new Float64Array(nBins);
    for (const m of maps) {
      const k0 = Math.round(line.order / m.resolution);
      if (k0 < 1 || k0 + 1 >= m.bins) continue;
      for (let r = 0; r < m.rows; r++) {
        if (!(m.rpm[r] > 0)) continue;
        const o = r * m.bins;
        const a = Math.max(m.amplitude[o + k0 - 1], m.amplitude[o + k0], m.amplitude[o + k0 + 1]);
        const b = Math.floor(m.rpm[r] / binRpm) - first;
        sum[b] += a * a;
        count[b]++;
      }
    }
    const rpm: number[] = [];
    const amp: number[] = [];
    for (let b = 0; b < nBins; b++) {
      if (count[b] === 0) continue;
      rpm.push((first + b + 0.5) * binRpm);
      amp.push(Math.sqrt(sum[b] / count[b]));
    }
    return { label: line.label, order: line.order, rpm: Float64Array.from(rpm), amplitude: Float64Array.from(amp), peak: findPeak(rpm, amp, binRpm) };
  });
}

function findPeak(rpm: number[], amp: number[], binRpm: number): OrderTrack['peak'] {
  if (amp.length < 3) return null;
  let top = 0;
  for (let i = 1; i < amp.length; i++) if (amp[i] > amp[top]) top = i;
  const sorted = [...amp].sort((a, b) => a - b);
  const med = sorted[Math.floor(sorted.length / 2)];
  const prominenceDb = 20 * Math.log10(amp[top] / Math.max(med, 1e-300));
  if (prominenceDb < PEAK_PROMINENCE_DB) return null;
  const half = amp[top] / Math.SQRT2;
  let a = top, b = top;
  while (a > 0 && amp[a - 1] >= half && rpm[a - 1] >= rpm[a] - 1.5 * binRpm) a--;
  while (b < amp.length - 1 && amp[b + 1] >= half && rpm[b + 1] <= rpm[b] + 1.5 * binRpm) b++;
  return { rpm: rpm[top], amplitude: amp[top], rangeRpm: [rpm[a] - binRpm / 2, rpm[b] + binRpm / 2], prominenceDb };
}
