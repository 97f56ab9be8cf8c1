import { MonotoneCubic } from '../dsp/monotone-cubic';
import { mean, standardDeviation } from '../dsp/stats';
import { type ReferenceResult } from './reference';
import { type SpeedResult } from './types';

/**
 * Crank angle as a smooth monotone function of time (docs/design.md step 3): a Fritsch–Carlson cubic
 * through (edge time, edge angle) in float64, plus the inverse t(θ) through the same knots for
 * resampling at constant angle. rpm(t) = (dθ/dt in °/s) / 6. Per-revolution rpm is 60 / (time of
 * each whole 360°); min/max come from those; mean rpm = whole revolutions / their time;
 * stabilityPct = 100 × standard deviation / mean of the per-revolution rpm.
 */
export interface CrankAngle {
  /** θ(t): degrees at time t (s). */
  angleAt: MonotoneCubic;
  /** t(θ): seconds at angle θ (deg). */
  timeAt: MonotoneCubic;
  firstDeg: number;
  lastDeg: number;
}

/** Builds θ(t) and t(θ) from the reference edges. */
export function crankAngle(ref: ReferenceResult): CrankAngle {
  return {
    angleAt: new MonotoneCubic(ref.timesS, ref.anglesDeg),
    timeAt: new MonotoneCubic(ref.anglesDeg, ref.timesS),
    firstDeg: ref.anglesDeg[0],
    lastDeg: ref.anglesDeg[ref.anglesDeg.length - 1],
  };
}

/** Speed summary, per-revolution rpm and an evenly sampled rpm trace (about 20 points per second). */
export function crankSpeed(ref: ReferenceResult, crank: CrankAngle, durationS: number): SpeedResult {
  const revs = Math.floor((crank.lastDeg - crank.firstDeg) / 360);
  const perRev = new Float32Array(Math.max(0, revs));
  let tPrev = crank.timeAt.at(crank.firstDeg);
  for (let k = 0; k < revs; k++) {
    const t = crank.timeAt.at(crank.firstDeg + 360 * (k + 1), 0);
    perRev[k] = 60 / (t - tPrev);
    tPrev = t;
  }
  const t0 = crank.timeAt.at(crank.firstDeg);
  const tEnd = crank.timeAt.at(crank.lastDeg);
  const meanRpm = (((crank.lastDeg - crank.firstDeg) / 360) * 60) / (tEnd - t0);
  let minRpm = meanRpm, maxRpm = meanRpm;
  if (perRev.length > 0) {
    minRpm = Infinity; maxRpm = -Infinity;
    for (const r of perRev) { if (r < minRpm) minRpm = r; if (r > maxRpm) maxRpm = r; }
  }
  const stabilityPct = perRev.length > 1 ? (100 * standardDeviation(perRev)) / mean(perRev) : 0;
  const points = Math.max(2, Math.min(20_000, Math.round(durationS * 20)));
  const timeS = new Float32Array(points);
  const rpm = new Float32Array(points);
  for (let i = 0; i < points; i++) {
    const t = t0 + ((tEnd - t0) * i) / (points - 1);
    timeS[i] = t;
    rpm[i] = crank.angleAt.derivative(t) / 6;
  }
  return {
    meanRpm, minRpm, maxRpm, stabilityPct,
    edges: ref.edges, repairedEdges: ref.repairedEdges, gaps: ref.gaps, pulsesPerRev: ref.pulsesPerRev,
    perRevRpm: perRev, trace: { timeS, rpm },
  };
}
