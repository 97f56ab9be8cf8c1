import { type AnalysisSettings } from '../schemas/analysis-settings';
import { AnalysisInputError } from './analysis-input-error';
import { detectPulses, fillHolesFromOther, levelledWheel, medianSpacing, type Polarity, type PulseLevels, pulseLevels } from './reference-edges';
import { repairPulses } from './repair-pulses';
import { type Warning } from './types';
import { wheelAngles } from './wheel';

/**
 * From the reference channel to crank angle at each edge (docs/design.md step 2). Angles are crank
 * degrees from the first accepted edge (wheel: from the first tooth after the first gap). The
 * four-stroke cycle is 720° [common practice; Heywood 1988, from memory]: `cyl1` gives one pulse
 * per cycle, `per-rev` one per revolution, `per-cylinder` cylinders per cycle, `refPerCycle` N
 * evenly spaced per cycle; a wheel's teeth give angle from the tooth index.
 */
export interface ReferenceResult {
  /** Edge times in seconds (float64) and their crank angles in degrees, increasing. */
  timesS: Float64Array;
  anglesDeg: Float64Array;
  edges: number;
  repairedEdges: number;
  gaps: number;
  pulsesPerRev: number;
  polarity: Polarity;
  /** Crank angle (deg) of the reference edge that starts cylinder 1's cycle (TDC = this + tdcOffsetDeg). */
  cycleOriginDeg: number;
  phaseResolved: boolean;
  /** The 720° phase is known only modulo this many degrees (720 when resolved). */
  ambiguityDeg: number;
  warnings: Warning[];
}

/** Reference pulses per 720° cycle implied by the settings (not for wheels). */
export function pulsesPerCycle(s: AnalysisSettings): number {
  if (s.refPerCycle) return s.refPerCycle;
  return s.refKind === 'per-rev' ? 2 : s.refKind === 'per-cylinder' ? s.cylinders : 1;
}

/** Crank angle at each reference edge, with repair, wheel gaps and the cycle phase. */
export function extractReference(ref: Float32Array, sampleRateHz: number, s: AnalysisSettings, cam: Float32Array | null): ReferenceResult {
  const warnings: Warning[] = [];
  const isWheel = s.refKind === 'wheel';
  // A wheel's sensor voltage may change with speed: detect on the levelled signal then.
  const x = (isWheel ? levelledWheel(ref, sampleRateHz, pulseLevels(ref, sampleRateHz).baseline) : null) ?? ref;
  const levels = pulseLevels(x, sampleRateHz);
  const polarity: Polarity = s.refPolarity === 'auto' ? (levels.rising >= levels.falling ? 'rising' : 'falling') : s.refPolarity;
  const level = polarity === 'rising' ? levels.rising : levels.falling;
  const [teeth, missing] = s.wheel.split('-').map(Number);
  const ppc = isWheel ? 2 * teeth : pulsesPerCycle(s);
  const noRef = (found: number) => new AnalysisInputError('no_reference',
    `found ${found} reference pulse${found === 1 ? '' : 's'} on channel ${s.refChannel}; check --ref-channel, --ref-kind and the reference lead`);
  if (!(level > 0)) throw noRef(0);
  if (!isWheel && level < 4 * levels.noise) {
    throw new AnalysisInputError('no_reference',
      `the largest pulses on channel ${s.refChannel} stand only ${(level / levels.noise).toFixed(1)}× above its noise (4× needed): no reference pulses found; check --ref-channel and the reference lead (clip it nearer the coil, or set a more sensitive range for that channel)`);
  }
  const fs = sampleRateHz;
  const dead1 = 0.5 * fs * (120 / s.maxRpm) / ppc;
  let pulses = detectPulses(x, levels.baseline, level, polarity, dead1);
  if (pulses.times.length >= 4) {
    const dead2 = Math.max(dead1, 0.4 * medianSpacing(pulses.times));
    pulses = detectPulses(x, levels.baseline, level, polarity, dead2);
  }
  let times = Array.from(pulses.times);
  let heights = Array.from(pulses.heights);
  if (times.length < 3) throw noRef(times.length);

  if (!isWheel) {
    // A weak spark midway between strong ones (wasted spark of the same polarity): keep it only
    // when the reference has two or more pulses per cycle.
    const strong = heights.map((h) => h >= 0.6 * level);
    const mid = midwayCount(times, strong);
    const strongCount = strong.filter(Boolean).length;
    if (mid >= 0.5 * (strongCount - 1) && ppc === 1) {
      times = times.filter((_, i) => strong[i]);
      heights = heights.filter((_, i) => strong[i]);
      warnings.push({ code: 'wasted_spark_ignored', message: 'weak pulses midway between the reference pulses (a wasted spark) were ignored' });
    }
    // A weak spark of the other polarity midway: part of a once-per-revolution reference.
    if (ppc % 2 === 0) {
      const other: Polarity = polarity === 'rising' ? 'falling' : 'rising';
      const oLevel = other === 'rising' ? levels.rising : levels.falling;
      const ownDead = 0.4 * medianSpacing(Float64Array.from(times));
      if (oLevel >= Math.max(0.1 * level, 6 * levels.noise) && times.length >= 3) {
        const op = detectPulses(x, levels.baseline, oLevel, other, ownDead);
        const between = midwayOthers(times, Array.from(op.times));
        if (between.length >= 0.7 * (times.length - 1) && medianSpacing(Float64Array.from(times)) > 1.6 * medianSpacingOfMerged(times, between)) {
          times = [...times, ...between].sort((a, b) => a - b);
          warnings.push({ code: 'wasted_spark_merged', message: `the reference alternates ${polarity} and ${other} pulses (wasted spark of the other polarity); both were used` });
        } else {
          // Most weak sparks were seen on this polarity (their ringing crosses the threshold), a
          // few were not: those holes take the other-polarity pulse in their middle.
          const filled = fillHolesFromOther(times, Array.from(op.times));
          if (filled.added > 0) {
            times = filled.times;
            warnings.push({ code: 'wasted_spark_merged', message: `${filled.added} weak ${other} pulse${filled.added === 1 ? '' : 's'} (wasted spark of the other polarity) filled gaps of the ${polarity} reference pulses` });
          }
        }
      }
      // An exhaust spark of the same polarity too weak for the trigger (under 30 % of the strong
      // sparks): look again midway with a threshold just above the noise.
      const weak = sameWeakPulses(x, levels, level, polarity, times);
      if (weak.length > 0) {
        times = [...times, ...weak].sort((a, b) => a - b);
        warnings.push({ code: 'wasted_spark_merged', message: `${weak.length} weak ${polarity} pulse${weak.length === 1 ? '' : 's'} midway between the reference pulses (a weak wasted spark) were used` });
      }
    }
  }

  let result: { timesSamples: Float64Array; angles: Float64Array; edges: number; repaired: number; gaps: number };
  if (isWheel) {
    const w = wheelAngles(times, teeth, missing, fs);
    if (w.gaps === 0) {
      throw new AnalysisInputError('no_wheel_gap', `no gap found on the ${s.wheel} trigger wheel (channel ${s.refChannel}); check --wheel and --ref-kind`);
    }
    warnings.push(...w.warnings);
    result = { timesSamples: w.times, angles: w.anglesDeg, edges: w.edges, repaired: w.repaired, gaps: w.gaps };
  } else {
    const r = repairPulses(times);
    warnings.push(...r.warnings);
    const pitchDeg = 720 / ppc;
    const angles = new Float64Array(r.times.length);
    for (let i = 0; i < angles.length; i++) angles[i] = r.pitchIndex[i] * pitchDeg;
    result = { timesSamples: r.times, angles, edges: r.edges, repaired: r.repaired, gaps: 0 };
  }
  if (result.timesSamples.length < 3) throw noRef(result.timesSamples.length);
  const timesS = new Float64Array(result.timesSamples.length);
  for (let i = 0; i < timesS.length; i++) timesS[i] = result.timesSamples[i] / fs;

  // Cycle phase: resolved by a one-per-cycle reference or by a cam channel.
  const syncDeg = isWheel ? 360 : 720 / ppc;
  let cycleOriginDeg = 0;
  let phaseResolved = syncDeg >= 720;
  if (!phaseResolved && cam) {
    const origin = camOrigin(cam, fs, s, timesS, result.angles, syncDeg);
    if (origin === null) warnings.push({ code: 'cam_unreadable', message: `no cam pulses found on channel ${s.camChannel}; the cycle phase stays unresolved` });
    else { cycleOriginDeg = origin; phaseResolved = true; }
  }
  return {
    timesS, anglesDeg: result.angles, edges: result.edges, repairedEdges: result.repaired, gaps: result.gaps,
    pulsesPerRev: isWheel ? teeth : ppc / 2, polarity, cycleOriginDeg, phaseResolved,
    ambiguityDeg: phaseResolved ? 720 : syncDeg, warnings,
  };
}

/**
 * Weak same-polarity pulses midway between the detected ones, for a reference that should carry an
 * even count per cycle: when most intervals hold one (a wasted spark of 6–30 % height), all those
 * are returned; else the holes of about twice the spacing each take the one in their middle.
 */
function sameWeakPulses(ref: Float32Array, levels: PulseLevels, level: number, polarity: Polarity, times: number[]): number[] {
  const weakLevel = Math.max(0.2 * level, 20 * levels.noise);
  if (weakLevel >= 0.9 * level || times.length < 3) return [];
  const spacing = medianSpacing(Float64Array.from(times));
  // A first look over the first 64 intervals spares the whole pass on the usual clean train.
  const head = times.slice(0, 65);
  const headEnd = Math.min(ref.length, Math.ceil(head[head.length - 1]) + 1);
  const headWeak = Array.from(detectPulses(ref.subarray(0, headEnd), levels.baseline, weakLevel, polarity, 0.3 * spacing).times);
  if (midwayOthers(head, headWeak).length === 0 && fillHolesFromOther(head, headWeak).added === 0) return [];
  const weak = Array.from(detectPulses(ref, levels.baseline, weakLevel, polarity, 0.3 * spacing).times);
  const between = midwayOthers(times, weak);
  if (between.length >= 0.7 * (times.length - 1)) return between;
  const filled = fillHolesFromOther(times, weak);
  if (filled.added === 0) return [];
  const had = new Set(times);
  return filled.times.filter((t) => !had.has(t));
}

function midwayCount(times: number[], strong: boolean[]): number {
  let count = 0;
  let prev = -1;
  for (let i = 0; i < times.length; i++) {
    if (!strong[i]) continue;
    if (prev >= 0) {
      for (let j = prev + 1; j < i; j++) {
        const f = (times[j] - times[prev]) / (times[i] - times[prev]);
        if (f > 0.35 && f < 0.65) { count++; break; }
      }
    }
    prev = i;
  }
  return count;
}

function midwayOthers(times: number[], others: number[]): number[] {
  const out: number[] = [];
  let j = 0;
  for (let i = 1; i < times.length; i++) {
    const a = times[i - 1], b = times[i];
    while (j < others.length && others[j] <= a) j++;
    for (let k = j; k < others.length && others[k] < b; k++) {
      const f = (others[k] - a) / (b - a);
      if (f > 0.35 && f < 0.65) { out.push(others[k]); break; }
    }
  }
  return out;
}

function medianSpacingOfMerged(a: number[], b: number[]): number {
  return medianSpacing(Float64Array.from([...a, ...b].sort((x, y) => x - y)));
}

/** Angle of the first sync edge at or after each cam edge, folded to [0, 720); the most frequent wins. */
function camOrigin(cam: Float32Array, fs: number, s: AnalysisSettings, timesS: Float64Array, angles: Float64Array, syncDeg: number): number | null {
  const lv = pulseLevels(cam, fs);
  const pol: Polarity = lv.rising >= lv.falling ? 'rising' : 'falling';
  const level = pol === 'rising' ? lv.rising : lv.falling;
  if (!(level > 0)) return null;
  const p = detectPulses(cam, lv.baseline, level, pol, 0.5 * fs * (120 / s.maxRpm));
  const origins: number[] = [];
  for (const t of p.times) {
    const ts = t / fs;
    if (ts < timesS[0] || ts > timesS[timesS.length - 1]) continue;
    let i = 0;
    while (i < timesS.length - 2 && timesS[i + 1] < ts) i++;
    const th = angles[i] + ((ts - timesS[i]) / (timesS[i + 1] - timesS[i])) * (angles[i + 1] - angles[i]);
    const o = Math.ceil(th / syncDeg - 1e-6) * syncDeg;
    origins.push(((o % 720) + 720) % 720);
  }
  if (origins.length === 0) return null;
  // Origins fall on the sync grid; take the most frequent value.
  const counts = new Map<number, number>();
  for (const o of origins) { const k = Math.round(o); counts.set(k, (counts.get(k) ?? 0) + 1); }
  let best = origins[0], bestN = 0;
  for (const [k, n] of counts) if (n > bestN) { best = k; bestN = n; }
  return best;
}
