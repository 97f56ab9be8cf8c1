/**
 * Matches one (part, fault) line pattern against a capture's spectra. A real fault puts its
 * harmonics at exact multiples of one measured fundamental (whatever the slip), so the search
 * tries each fundamental that a local maximum in any harmonic's window suggests and scores the
 * whole comb it implies: prominence of each harmonic over the floor, sidebands at the modulating
 * order, less for lines on the engine's 0.5-order comb unless the rest of the pattern stands off
 * it, and the plausibility of the slip the matched lines imply.
 */
import type { OrderSpectrum } from '../analysis/types';
import type { CandidateLine } from '../drive/types';
import { engineCombLevelDb, lineCycleGain, lineNear, lineStrength, localMaxima, onEngineComb, topOrder, type FoundLine } from './spectrum-lines';

/** One line of a matched pattern, with what the scoring made of it. */
export interface PatternLine {
  line: CandidateLine;
  found: FoundLine;
  onComb: boolean;
  cycleGain: number;
  weight: number;
}

/** The best reading of one pattern in one set of spectra. */
export interface PatternMatch {
  /**
   * Evidence 0–1: the carriers' weighted strengths over those of a complete pattern, times the
   * sideband factor (0.6–1; 0.85 for a fault kind without sidebands), times the plausibility of
   * the slip the lines imply (0.4–1).
   */
  total: number;
  /** Measured fundamental (the 1× of the fault's carrier) in orders. */
  fundamental: number;
  /** Harmonics found at ≥ 6 dB, and those of them off the engine comb. */
  harmonicsFound: number;
  offCombFound: number;
  sidebandsFound: number;
  /** Index of the spectrum the pattern was read from, and how many other spectra confirm it. */
  spectrumIndex: number;
  confirmations: number;
  lines: PatternLine[];
}

/** Settings of a pattern search. */
export interface PatternSearch {
  carriers: CandidateLine[];
  sidebands: CandidateLine[];
  /** Window of the modulating order (part shaft speed, or cage speed), for sidebands. */
  modulatorWindow?: [number, number];
  /**
   * Relative window of the fundamental (below, above) and the deviations the kinematics make
   * likely, for the plausibility of a reading; `preferCentre` false once the part's own shaft
   * line has measured its slip (see `slipPlausibility`).
   */
  relative: { below: number; above: number; likely: [number, number]; preferCentre?: boolean };
  cyclesAveraged: number;
}

const FOUND_DB = 6;
const HARMONIC_WEIGHT = [1, 0.8, 0.6, 0.5];
const SIDEBAND_WEIGHT = 0.2;

/** Median SNR at the 0.5-order multiples below which a spectrum is taken to hold no engine comb. */
const COMB_ABSENT_DB = 4;

/**
 * Weight of a line on the engine's 0.5-order comb, judged from the whole pattern: more of its
 * harmonics off the comb make it likelier the part's own. In the raw order spectrum the engine's
 * lines are always there; the envelope spectra are taken from the residual after the 720°
 * average (docs/design.md step 5), which removes most of them, so a comb line there counts more; and
 * where such a residual shows no comb at all (median SNR at the multiples under 4 dB), it counts
 * fully. (The raw spectrum's comb fades at high orders, so its median says nothing there.)
 */
function combWeight(offCombFound: number, engineLinesRemoved: boolean, combLevelDb: number): number {
  if (engineLinesRemoved && combLevelDb < COMB_ABSENT_DB) return 1;
  const weights = engineLinesRemoved ? [0.6, 0.8, 0.95] : [0.2, 0.5, 0.8];
  return weights[Math.min(2, offCombFound)];
}

/**
 * Plausibility 0.4–1 of a relative deviation `dev` of the fundamental from nominal, with `slack`
 * (half a bin) added to the likely range. Unmeasured slip (`preferCentre`): 1 at the middle of the
 * likely range, 0.85 at its ends, and beyond them falling in proportion to the slip the reading
 * needs past the likely range, to 0.4 at the window's edges. Measured slip (the part's own shaft
 * line fixed its speed, only the cage lag is left): 1 over the likely range, falling with the
 * square of the distance beyond it (gentle just past its edge, where the measurement's own spread
 * can put a line).
 */
export function slipPlausibility(dev: number, relative: PatternSearch['relative'], slack: number): number {
  const { below, above, likely, preferCentre } = relative;
  const lo = likely[0] - slack;
  const hi = likely[1] + slack;
  const fall = (d: number, span: number) => {
    const x = Math.min(1, d / Math.max(1e-6, span));
    return preferCentre === false ? x * x : x;
  };
  if (dev < lo) return 0.85 - 0.45 * fall(lo - dev, lo - below);
  if (dev > hi) return 0.85 - 0.45 * fall(dev - hi, above - hi);
  if (preferCentre === false) return 1;
  return 1 - 0.15 * ((dev - (likely[0] + likely[1]) / 2) / Math.max(1e-6, (hi - lo) / 2)) ** 2;
}

function evaluate(spectrum: OrderSpectrum, f: number, search: PatternSearch, spectrumIndex: number, engineLinesRemoved: boolean, combLevelDb: number): PatternMatch {
  const res = spectrum.resolution;
  const top = topOrder(spectrum);
  const carriers: { line: CandidateLine; found: FoundLine; h: number }[] = [];
  for (const line of search.carriers) {
    const at = line.harmonic * f;
    if (at > top) continue;
    const found = lineNear(spectrum, at, 0.75 * res + 0.004 * at);
    if (found && found.snrDb >= 3) carriers.push({ line, found, h: line.harmonic });
  }
  const sidebands: { line: CandidateLine; found: FoundLine }[] = [];
  if (search.modulatorWindow) {
    const [mLo, mHi] = search.modulatorWindow;
    for (const sb of search.sidebands) {
      const carrier = carriers.find((c) => c.h === sb.carrierHarmonic && c.found.snrDb >= FOUND_DB);
      if (!carrier) continue;
      const p = carrier.found.order;
      const lo = sb.sideband > 0 ? p + mLo : p - mHi;
      const hi = sb.sideband > 0 ? p + mHi : p - mLo;
      if (hi > top || lo <= 0) continue;
      const found = localMaxima(spectrum, lo - 0.75 * res, hi + 0.75 * res)[0];
      if (found && found.snrDb >= 3) sidebands.push({ line: sb, found });
    }
  }
  const gain = (o: number) => lineCycleGain(o, search.cyclesAveraged);
  const isComb = (o: number) => onEngineComb(o, res) || gain(o) > 0.3;
  const offCombFound = carriers.filter((c) => c.found.snrDb >= FOUND_DB && !isComb(c.found.order)).length;
  const cw = combWeight(offCombFound, engineLinesRemoved, combLevelDb);
  const lines: PatternLine[] = [];
  // Carriers: the weighted strengths found over those of every harmonic the spectrum holds.
  let carrierTotal = 0;
  let carrierPossible = 0;
  for (const line of search.carriers) if (line.harmonic * f <= top) carrierPossible += HARMONIC_WEIGHT[line.harmonic - 1] ?? 0.4;
  for (const c of carriers) {
    const onComb = isComb(c.found.order);
    const weight = (HARMONIC_WEIGHT[c.h - 1] ?? 0.4) * (onComb ? cw : 1);
    carrierTotal += weight * lineStrength(c.found.snrDb);
    lines.push({ line: c.line, found: c.found, onComb, cycleGain: gain(c.found.order), weight });
  }
  // Sidebands confirm (docs/design.md): a sideband sits about 8–12 dB below its carrier, so it is
  // judged 9 dB more leniently, and its absence counts only as far as the carrier's strength
  // made it expected. A pattern whose kind has no sidebands neither gains nor loses by them.
  let sbPossible = 0;
  let sbExpected = 0;
  if (search.modulatorWindow) {
    for (const sb of search.sidebands) {
      const at = (sb.carrierHarmonic ?? 1) * f + sb.sideband * (search.modulatorWindow[0] + search.modulatorWindow[1]) / 2;
      if (!(at > 0 && at <= top)) continue;
      const carrier = carriers.find((c) => c.h === sb.carrierHarmonic);
      sbPossible += 1;
      sbExpected += carrier ? Math.max(0, Math.min(1, (carrier.found.snrDb - 10) / 14)) : 0;
    }
  }
  let sbTotal = 0;
  for (const s of sidebands) {
    // An engine line where a sideband should be confirms nothing.
    const onComb = isComb(s.found.order);
    const weight = onComb ? 0.2 : 1;
    sbTotal += weight * lineStrength(s.found.snrDb + 9);
    lines.push({ line: s.line, found: s.found, onComb, cycleGain: gain(s.found.order), weight: weight * SIDEBAND_WEIGHT });
  }
  const sbFound = sbPossible > 0 ? Math.min(1, sbTotal / sbPossible) : 0;
  const expectation = sbPossible > 0 ? sbExpected / sbPossible : 0;
  const sidebandFactor = sbPossible > 0 ? 0.85 + 0.15 * sbFound - 0.25 * expectation * (1 - sbFound) : 0.85;
  // Plausibility of the fundamental's deviation from nominal (`slipPlausibility`), so that a
  // stray impulsive source or a near-equal ratio that needs an extreme slip counts less.
  // Judge the fundamental the matched lines imply (least squares over harmonics), not the trial
  // value that found them, so a trial inside the window cannot vouch for lines outside it.
  const nominal = search.carriers.find((c) => c.harmonic === 1)?.nominalOrder ?? search.carriers[0].nominalOrder / search.carriers[0].harmonic;
  const fitted = carriers.length > 0
    ? carriers.reduce((sum, c) => sum + c.h * c.found.order, 0) / carriers.reduce((sum, c) => sum + c.h * c.h, 0)
    : f;
  const plausibility = slipPlausibility(fitted / nominal - 1, search.relative, 0.5 * res / nominal);
  const completeness = carrierPossible > 0 ? Math.min(1, carrierTotal / carrierPossible) * sidebandFactor : 0;
  return {
    total: completeness * plausibility,
    fundamental: fitted,
    harmonicsFound: carriers.filter((c) => c.found.snrDb >= FOUND_DB).length,
    offCombFound,
    sidebandsFound: sidebands.filter((s) => s.found.snrDb >= FOUND_DB).length,
    spectrumIndex,
    confirmations: 0,
    lines,
  };
}

/** An empty match (nothing in any window). */
export function emptyMatch(search: PatternSearch): PatternMatch {
  const first = search.carriers[0];
  return { total: 0, fundamental: first ? first.nominalOrder / first.harmonic : 0, harmonicsFound: 0, offCombFound: 0, sidebandsFound: 0, spectrumIndex: -1, confirmations: 0, lines: [] };
}

/**
 * Best reading of the pattern over the given spectra (e.g. the envelope bands), with the number
 * of other spectra in which the same fundamental's harmonics also stand ≥ 6 dB above the floor.
 * `engineLinesRemoved[i]` says spectrum i is of the residual after the 720° average (envelopes).
 */
export function matchPattern(spectra: readonly OrderSpectrum[], search: PatternSearch, engineLinesRemoved: readonly boolean[] = []): PatternMatch {
  let best = emptyMatch(search);
  spectra.forEach((spectrum, index) => {
    const res = spectrum.resolution;
    const combLevelDb = engineCombLevelDb(spectrum);
    const tried: number[] = [];
    for (const line of search.carriers) {
      const [lo, hi] = line.window;
      for (const peak of localMaxima(spectrum, lo - res, hi + res, 3)) {
        const f = peak.order / line.harmonic;
        if (tried.some((t) => Math.abs(t - f) < 0.25 * res / line.harmonic)) continue;
        tried.push(f);
        const m = evaluate(spectrum, f, search, index, engineLinesRemoved[index] ?? false, combLevelDb);
        if (m.total > best.total) best = m;
      }
    }
  });
  if (best.spectrumIndex >= 0) {
    best.confirmations = spectra.filter((spectrum, index) => index !== best.spectrumIndex && search.carriers.some((c) => {
      const at = c.harmonic * best.fundamental;
      const found = at <= topOrder(spectrum) ? lineNear(spectrum, at, 0.75 * spectrum.resolution + 0.004 * at) : null;
      return found !== null && found.snrDb >= FOUND_DB;
    })).length;
  }
  return best;
}
