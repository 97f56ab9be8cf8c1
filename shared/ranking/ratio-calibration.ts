/**
 * Ratio calibration from measured shaft lines (issue 20 item 3). Hand-measured pulley diameters
 * carry 1–3 % error and belts creep (REFERENCES.md §5). On one belt a common creep and an error of
 * the driver's diameter change every driven ratio by the same factor, so they cannot be told apart
 * from shaft lines; what can be measured is one EFFECTIVE ratio per part: its shaft line's order
 * over its nominal ratio. Across the captures of an engine's cases the log of that quotient is fitted
 * per part by weighted least squares (y = Xβ + ε, β = (XᵀWX)⁻¹XᵀWy, one column per part; ml-matrix),
 * each observation weighted by 1/σ² with σ² = the line's own order scatter (from its SNR and the
 * spectrum's resolution) plus a case-to-case creep scatter. The weighted scatter of a part's
 * residuals across captures is its uncertainty; a correction is offered only from MIN_CAPTURES
 * captures on at least two cases.
 */
import { Matrix, solve } from 'ml-matrix';
import type { OrderSpectrum } from '../analysis/types';
import { driveRegime } from '../drive/candidate-lines';
import { speedRatio } from '../drive/kinematics';
import type { DriveDocument } from '../drive/types';
import { localMaxima, onEngineComb } from './spectrum-lines';

/** One part's shaft line in one capture. */
export interface ShaftLineObservation {
  caseId: string;
  captureId: string;
  component: string;
  harmonic: number;
  /** Nominal order of the line: harmonic × the part's nominal ratio. */
  nominalOrder: number;
  measuredOrder: number;
  snrDb: number;
  /** Order resolution of the spectrum the line was read in. */
  resolution: number;
}

/** A fitted effective-ratio correction of one part. */
export interface RatioCorrection {
  component: string;
  /** Effective ratio / nominal ratio (e.g. 0.984 = turns 1.6 % slower than nominal). */
  factor: number;
  /** 100·(factor − 1). */
  correctionPct: number;
  /** Weighted case-to-case scatter of the part's measurements, in percent (the ± shown). */
  scatterPct: number;
  /** Standard error of the fitted correction, in percent. */
  standardErrorPct: number;
  captures: number;
  cases: number;
  /** Enough captures on enough cases to offer the correction. */
  offered: boolean;
  /** e.g. "measured on 4 cases: Alternator turns 1.6 % slower than its nominal ratio ± 0.3 %". */
  sentence: string;
}

/** Captures a correction needs before it is offered, and distinct cases among them. */
export const MIN_CAPTURES = 4;
export const MIN_CASES = 2;
/** Shaft lines are searched from 6 % below to 4 % above nominal: 3 % diameter error plus up to 3 % creep (REFERENCES.md §5 [practice]). */
const SEARCH_BELOW = 0.06;
const SEARCH_ABOVE = 0.04;
/** A shaft line must stand this far over the floor to be measured (as estimateSlip's lines). */
const MIN_LINE_DB = 10;
/** Assumed capture-to-capture creep spread (fraction) in the weights: 0.3 % [common practice, from memory]. */
const CREEP_SCATTER = 0.003;

/**
 * The shaft 1× (or, when the 1× is absent or on the engine comb, 2×) line of every belt-driven
 * part in one capture's order spectrum. A line is kept only when it falls in exactly one search
 * window of all parts' 1× and 2×, so parts of near-equal ratio (or one part's 2× on another's 1×)
 * never share a measurement.
 */
export function shaftLineObservations(drive: DriveDocument, orders: OrderSpectrum, ids: { caseId: string; captureId: string }): ShaftLineObservation[] {
  const parts = drive.components.filter((c) => c.kind !== 'crankshaft' && driveRegime(c) === 'belt');
  const ratios = parts.map((c) => speedRatio(drive, c.name));
  const res = orders.resolution;
  // Windows of every part's 1× and 2× that hold the order: a line in two of them (near-equal
  // ratios, or one part's 2× on another's 1×) belongs to neither.
  const owners = (order: number) => ratios.reduce((n, r) => n
    + [1, 2].filter((h) => order >= h * r * (1 - SEARCH_BELOW) - res && order <= h * r * (1 + SEARCH_ABOVE) + res).length, 0);
  const out: ShaftLineObservation[] = [];
  parts.forEach((part, i) => {
    for (const harmonic of [1, 2]) {
      const nominal = harmonic * ratios[i];
      const found = localMaxima(orders, nominal * (1 - SEARCH_BELOW) - res, nominal * (1 + SEARCH_ABOVE) + res, MIN_LINE_DB)
        .find((l) => !onEngineComb(l.order, res) && owners(l.order) === 1);
      if (found) {
        out.push({ ...ids, component: part.name, harmonic, nominalOrder: nominal, measuredOrder: found.order, snrDb: found.snrDb, resolution: res });
        return;
      }
    }
  });
  return out;
}

/** Relative order scatter of one line: resolution / (order·√(2·SNR)) (a tone's frequency estimate; Rife & Boorstyn 1974, from memory) plus the creep spread. */
function sigmaOf(o: ShaftLineObservation): number {
  const snr = 10 ** (Math.min(o.snrDb, 60) / 10);
  const line = o.resolution / (o.measuredOrder * Math.sqrt(2 * snr));
  return Math.sqrt(line * line + CREEP_SCATTER * CREEP_SCATTER);
}

/**
 * Fits one effective-ratio correction per part over the observations of an engine's captures.
 * Returns one entry per part observed, by name. Throws RangeError on a non-positive order.
 */
export function fitRatioCalibration(observations: readonly ShaftLineObservation[], options: { minCaptures?: number; minCases?: number } = {}): RatioCorrection[] {
  const minCaptures = options.minCaptures ?? MIN_CAPTURES;
  const minCases = options.minCases ?? MIN_CASES;
  for (const o of observations) {
    if (!(o.nominalOrder > 0 && o.measuredOrder > 0)) throw new RangeError(`shaft line orders must be positive, got ${o.measuredOrder} for nominal ${o.nominalOrder} (${o.component})`);
  }
  const names = [...new Set(observations.map((o) => o.component))].sort((a, b) => a.localeCompare(b));
  if (names.length === 0) return [];
  const n = observations.length;
  // Weighted design: rows scaled by √w, so ordinary least squares on them is the WLS solution.
  const xw = Matrix.zeros(n, names.length);
  const yw = Matrix.zeros(n, 1);
  const y = new Float64Array(n);
  const w = new Float64Array(n);
  observations.forEach((o, i) => {
    y[i] = Math.log(o.measuredOrder / o.nominalOrder);
    w[i] = 1 / sigmaOf(o) ** 2;
    const s = Math.sqrt(w[i]);
    xw.set(i, names.indexOf(o.component), s);
    yw.set(i, 0, s * y[i]);
  });
  const xtw = xw.transpose();
  const beta = solve(xtw.mmul(xw), xtw.mmul(yw));
  return names.map((name, j) => {
    const rows = observations.map((o, i) => ({ o, i })).filter((r) => r.o.component === name);
    const b = beta.get(j, 0);
    let sw = 0, swr2 = 0, sw2 = 0;
    for (const { i } of rows) { const r = y[i] - b; sw += w[i]; sw2 += w[i] * w[i]; swr2 += w[i] * r * r; }
    const k = rows.length;
    // Weighted sample standard deviation (reliability weights): Σw r² / (Σw − Σw²/Σw).
    const denom = sw - sw2 / sw;
    const scatter = k > 1 && denom > 0 ? Math.sqrt(swr2 / denom) : NaN;
    const nEff = (sw * sw) / sw2;
    const factor = Math.exp(b);
    const cases = new Set(rows.map((r) => r.o.caseId)).size;
    const correctionPct = 100 * (factor - 1);
    const scatterPct = 100 * scatter;
    const offered = k >= minCaptures && cases >= minCases && Number.isFinite(scatter);
    return {
      component: name, factor, correctionPct, scatterPct, standardErrorPct: scatterPct / Math.sqrt(nEff),
      captures: k, cases, offered, sentence: calibrationSentence(name, correctionPct, scatterPct, cases, k, offered, minCaptures),
    };
  });
}

/** The Drive library's line for a correction. */
export function calibrationSentence(name: string, correctionPct: number, scatterPct: number, cases: number, captures: number, offered: boolean, minCaptures = MIN_CAPTURES): string {
  if (!offered) return `${name}: ${captures} capture${captures === 1 ? '' : 's'} on ${cases} case${cases === 1 ? '' : 's'} so far; a correction is offered from ${minCaptures} captures on ${MIN_CASES} cases`;
  const way = correctionPct < 0 ? 'slower' : 'faster';
  return `measured on ${cases} cases: ${name} turns ${Math.abs(correctionPct).toFixed(1)} % ${way} than its nominal ratio ± ${scatterPct.toFixed(1)} %`;
}
