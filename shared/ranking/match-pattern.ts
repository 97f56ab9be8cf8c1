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
  /** On a whole multiple of a part's shaft order (the part's own or another's). */
  onShaftMultiple: boolean;
  cycleGain: number;
  weight: number;
}

/**
 * The factors a pattern reading is scored by (each 0–1 unless said; their product is `total`).
 * rank-capture.ts turns each into a named term (shared/ranking/score-terms.ts).
 */
export interface PatternFactors {
  /** The carriers' strengths over those of every harmonic the band can carry, masked ones counted as missing. */
  pattern: number;
  /** ≥ 1: the same with lines masked by a much stronger engine line counted as unknown rather than missing. */
  masked: number;
  /** Lines on the engine's 0.5-order comb count less (see `combWeight`). */
  engineOrders: number;
  /** Lines on whole multiples of a part's shaft order count less (see `shaftMultipleWeight`). */
  shaftMultiples: number;
  /** Sidebands found, or missing where the carrier's strength made them expected (0.6–1). */
  sidebands: number;
  /** Plausibility of the slip the matched lines imply (0.4–1). */
  slip: number;
}

/** The best reading of one pattern in one set of spectra. */
export interface PatternMatch {
  /** Evidence 0–1: the product of `factors`. */
  total: number;
  factors: PatternFactors;
  /** Measured fundamental (the 1× of the fault's carrier) in orders. */
  fundamental: number;
  /** Harmonics found at ≥ 6 dB, those of them off the engine comb, and those off every shaft multiple. */
  harmonicsFound: number;
  offCombFound: number;
  offShaftFound: number;
  /** Carriers the band could carry but a much stronger engine line hides (unknown, not missing). */
  maskedLines: number;
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
   * likely, for the plausibility of a reading (see `slipPlausibility`).
   */
  relative: { below: number; above: number; likely: [number, number]; preferCentre?: boolean };
  cyclesAveraged: number;
  /**
   * Shaft orders whose whole multiples a bearing line may merely be (the part's own measured or
   * fixed shaft order first, then the other parts'); empty for shaft and belt patterns.
   */
  shaftOrders?: number[];
  /** Whether a missing sideband counts fully against the pattern (false for ball faults: real ones often show none). */
  sidebandsExpected?: boolean;
  /** Read a ball's whole BSF series (1×…6× BSF) as one comb; set by `matchPattern` itself. */
  bsfSeries?: boolean;
}

const FOUND_DB = 6;
const HARMONIC_WEIGHT = [1, 0.8, 0.6, 0.5];
/**
 * Weights of a ball's whole BSF series (1×…6× BSF) when read as one comb: a ball striking one race
 * harder than the other shows odd multiples of BSF as well as the 2×BSF series.
 */
const BSF_SERIES_WEIGHT = [1, 0.8, 0.6, 0.5, 0.45, 0.4];
const SIDEBAND_WEIGHT = 0.2;
/** How much expected but missing sidebands cost: fully expected ones 0.25; a ball's, which real recordings often lack, 0.1. */
const MISSED_SIDEBAND_WEIGHT = 0.25;
const MISSED_SIDEBAND_WEIGHT_UNEXPECTED = 0.1;

/** Median SNR at the 0.5-order multiples below which a spectrum is taken to hold no engine comb. */
const COMB_ABSENT_DB = 4;

/**
 * Relative error of published defect factors and of real speed references (about ±0.5–1 %
 * [practice, from memory]): added to the likely range of every bearing line, so a reading that far from
 * the kinematics' core is still fully plausible.
 */
export const FACTOR_ERROR = 0.005;

/** A line within this many bins of a 0.5-order multiple, but not on it, can be hidden by an engine line there. */
const MASK_BINS = 2;
/** An engine line at least this far above the floor hides a weaker line within `MASK_BINS` (dB). */
const MASK_ENGINE_DB = 20;
/** …and at least this far above the line read in its place (dB). */
const MASK_MARGIN_DB = 10;

/** Harmonics of a shaft order a bearing line is compared with (a shaft's own envelope shows up to about 10×). */
const SHAFT_MULTIPLES_MAX = 12;

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
 * Weight of a bearing line on a whole multiple of a shaft order: real machines
 * put lines at 1×…10× shaft in the envelope (looseness, misalignment, rubbing; W. A. Smith and
 * R. B. Randall 2015 on the CWRU records), so a line there may be the shaft's and not the
 * bearing's. With no found harmonic off every shaft multiple the pattern is ambiguous with the
 * shaft and counts little (0.3); one or two off make it likelier the bearing's (0.6, 0.85).
 */
function shaftMultipleWeight(offShaftFound: number): number {
  return [0.3, 0.6, 0.85][Math.min(2, offShaftFound)];
}

/** Whether an order sits on a whole multiple (1×…12×) of one of the shaft orders, within 0.6 bin. */
export function onShaftMultiple(order: number, shaftOrders: readonly number[], resolution: number): boolean {
  for (const s of shaftOrders) {
    if (!(s > 0)) continue;
    const k = Math.round(order / s);
    if (k >= 1 && k <= SHAFT_MULTIPLES_MAX && Math.abs(order - k * s) <= 0.6 * resolution) return true;
  }
  return false;
}

/**
 * Whether a line expected at `at` is hidden by an engine line: a 0.5-order
 * multiple within `MASK_BINS` bins (but not within 0.6 bin, where the line is simply on the
 * comb) stands ≥ 20 dB above the floor, and what was read near `at` is that engine line or at
 * least 10 dB weaker than it. Such a line can be neither seen nor missed: it is unknown.
 */
export function maskedByEngineLine(spectrum: OrderSpectrum, at: number, found: FoundLine | null): boolean {
  const res = spectrum.resolution;
  const m = Math.round(at / 0.5) * 0.5;
  const d = Math.abs(at - m);
  if (m <= 0 || d <= 0.6 * res || d > MASK_BINS * res) return false;
  const engine = lineNear(spectrum, m, 0.6 * res);
  if (!engine || !onEngineComb(engine.order, res) || engine.snrDb < MASK_ENGINE_DB) return false;
  if (!found) return true;
  return Math.abs(found.order - engine.order) <= 0.6 * res || found.snrDb <= engine.snrDb - MASK_MARGIN_DB;
}

/**
 * Plausibility 0.4–1 of a relative deviation `dev` of the fundamental from nominal, with `slack`
 * (half a bin plus the published factors' error) added to the likely range: 1 over the whole
 * likely range (flat, not peaked at a default creep, since real factors and
 * speed references carry ±0.5–1 % error); beyond it falling in proportion to the deviation past
 * the likely range from 1 (unmeasured slip), or with its square from 0.85 (measured slip: gentle
 * just past the edge, where the measurement's own spread can put a line), to 0.4 at the window's
 * edges.
 */
export function slipPlausibility(dev: number, relative: PatternSearch['relative'], slack: number): number {
  const { below, above, likely, preferCentre } = relative;
  const lo = likely[0] - slack;
  const hi = likely[1] + slack;
  const fall = (d: number, span: number) => {
    const x = Math.min(1, d / Math.max(1e-6, span));
    return preferCentre === false ? x * x : x;
  };
  // Unmeasured: continuous from 1 at the likely range's edge; measured: from 0.85 (a reading past
  // a measured speed's range is already less likely), both to 0.4 at the window's edges.
  const edge = preferCentre === false ? 0.85 : 1;
  if (dev < lo) return edge - (edge - 0.4) * fall(lo - dev, lo - below);
  if (dev > hi) return edge - (edge - 0.4) * fall(dev - hi, above - hi);
  return 1;
}

/** A carrier's weight in its pattern: by harmonic, or by BSF multiple when the ball's whole BSF series is read. */
const weightOf = (line: CandidateLine, bsfSeries: boolean): number => (bsfSeries
  ? BSF_SERIES_WEIGHT[Math.round(2 * line.harmonic) - 1] ?? 0.4
  : HARMONIC_WEIGHT[line.harmonic - 1] ?? 0.4);

function evaluate(spectrum: OrderSpectrum, f: number, search: PatternSearch, spectrumIndex: number, engineLinesRemoved: boolean, combLevelDb: number, cap: number): PatternMatch {
  const res = spectrum.resolution;
  const top = Math.min(topOrder(spectrum), cap);
  const bsfSeries = search.bsfSeries === true;
  const carriers: { line: CandidateLine; found: FoundLine; h: number }[] = [];
  let possibleAll = 0;
  let possibleVisible = 0;
  let maskedLines = 0;
  for (const line of search.carriers) {
    const at = line.harmonic * f;
    if (at > top) continue;
    const tol = Math.max(0.75 * res + 0.004 * at, res);
    let near = lineNear(spectrum, at, tol);
    // A line expected off the engine comb is read off it when a peak of its own stands there,
    // rather than as the stronger engine line beside it.
    if (near && onEngineComb(near.order, res) && !onEngineComb(at, res)) {
      near = localMaxima(spectrum, at - tol, at + tol, 3).find((p) => !onEngineComb(p.order, res)) ?? near;
    }
    const found = near && near.snrDb >= 3 ? near : null;
    const masked = maskedByEngineLine(spectrum, at, found);
    possibleAll += weightOf(line, bsfSeries);
    if (!masked) possibleVisible += weightOf(line, bsfSeries);
    if (masked) maskedLines += 1;
    else if (found) carriers.push({ line, found, h: line.harmonic });
  }
  // A carrier read on a 0.5-order multiple where the engine line stands ≥ 20 dB above the floor and
  // ≥ 10 dB above every line of the pattern off the comb is that engine line: the part's own line
  // there cannot be seen, so it is unknown too.
  const offCombDb = Math.max(-Infinity, ...carriers.filter((c) => !onEngineComb(c.found.order, res)).map((c) => c.found.snrDb));
  for (let i = carriers.length - 1; i >= 0; i -= 1) {
    const c = carriers[i];
    if (offCombDb > -Infinity && onEngineComb(c.found.order, res) && c.found.snrDb >= MASK_ENGINE_DB && c.found.snrDb >= offCombDb + MASK_MARGIN_DB) {
      carriers.splice(i, 1);
      possibleVisible -= weightOf(c.line, bsfSeries);
      maskedLines += 1;
    }
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
  const shafts = search.shaftOrders ?? [];
  const isShaft = (o: number) => shafts.length > 0 && onShaftMultiple(o, shafts, res);
  const strong = carriers.filter((c) => c.found.snrDb >= FOUND_DB);
  const offCombFound = strong.filter((c) => !isComb(c.found.order)).length;
  const offShaftFound = strong.filter((c) => !isShaft(c.found.order) && !isComb(c.found.order)).length;
  const cw = combWeight(offCombFound, engineLinesRemoved, combLevelDb);
  const sw = shaftMultipleWeight(offShaftFound);
  const lines: PatternLine[] = [];
  // Carriers: raw, engine-comb-weighted, and also shaft-multiple-weighted strength sums; their
  // ratios are the engine-orders and shaft-multiples factors.
  let raw = 0;
  let withComb = 0;
  let withBoth = 0;
  for (const c of carriers) {
    const onComb = isComb(c.found.order);
    const onShaft = isShaft(c.found.order);
    const strength = weightOf(c.line, bsfSeries) * lineStrength(c.found.snrDb);
    const combW = onComb ? cw : 1;
    const bothW = Math.min(combW, onShaft ? sw : 1);
    raw += strength;
    withComb += strength * combW;
    withBoth += strength * bothW;
    lines.push({ line: c.line, found: c.found, onComb, onShaftMultiple: onShaft, cycleGain: gain(c.found.order), weight: weightOf(c.line, bsfSeries) * bothW });
  }
  // Sidebands confirm (docs/design.md): a sideband sits about 8–12 dB below its carrier, so it is
  // judged 9 dB more leniently, and its absence counts only as far as the carrier's strength
  // made it expected (never for a ball fault, whose sidebands real recordings often lack). A
  // pattern whose kind has no sidebands neither gains nor loses by them.
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
    lines.push({ line: s.line, found: s.found, onComb, onShaftMultiple: false, cycleGain: gain(s.found.order), weight: weight * SIDEBAND_WEIGHT });
  }
  const sbFound = sbPossible > 0 ? Math.min(1, sbTotal / sbPossible) : 0;
  const expectation = sbPossible > 0 ? sbExpected / sbPossible : 0;
  const missedWeight = search.sidebandsExpected === false ? MISSED_SIDEBAND_WEIGHT_UNEXPECTED : MISSED_SIDEBAND_WEIGHT;
  const sidebandFactor = sbPossible > 0 ? 0.85 + 0.15 * sbFound - missedWeight * expectation * (1 - sbFound) : 0.85;
  // Plausibility of the fundamental's deviation from nominal (`slipPlausibility`), so that a
  // stray impulsive source or a near-equal ratio that needs an extreme slip counts less.
  // Judge the fundamental the matched lines imply (least squares over harmonics), not the trial
  // value that found them, so a trial inside the window cannot vouch for lines outside it.
  const nominal = search.carriers.find((c) => c.harmonic === 1)?.nominalOrder ?? search.carriers[0].nominalOrder / search.carriers[0].harmonic;
  const fitted = carriers.length > 0
    ? carriers.reduce((sum, c) => sum + c.h * c.found.order, 0) / carriers.reduce((sum, c) => sum + c.h * c.h, 0)
    : f;
  const bearing = search.carriers[0].fault !== 'shaft' && search.carriers[0].fault !== 'belt';
  const plausibility = slipPlausibility(fitted / nominal - 1, search.relative, 0.5 * res / nominal + (bearing ? FACTOR_ERROR : 0));
  const pattern = possibleAll > 0 ? Math.min(1, raw / possibleAll) : 0;
  const visible = possibleVisible > 0 ? Math.min(1, raw / possibleVisible) : 0;
  const factors: PatternFactors = {
    pattern,
    masked: pattern > 0 ? visible / pattern : 1,
    engineOrders: raw > 0 ? withComb / raw : 1,
    shaftMultiples: withComb > 0 ? withBoth / withComb : 1,
    sidebands: possibleAll > 0 ? sidebandFactor : 1,
    slip: plausibility,
  };
  const total = factors.pattern * factors.masked * factors.engineOrders * factors.shaftMultiples * factors.sidebands * factors.slip;
  return {
    total,
    factors,
    fundamental: fitted,
    harmonicsFound: strong.length,
    offCombFound,
    offShaftFound,
    maskedLines,
    sidebandsFound: sidebands.filter((s) => s.found.snrDb >= FOUND_DB).length,
    spectrumIndex,
    confirmations: 0,
    lines,
  };
}

/** An empty match (nothing in any window). */
export function emptyMatch(search: PatternSearch): PatternMatch {
  const first = search.carriers[0];
  return {
    total: 0, factors: { pattern: 0, masked: 1, engineOrders: 1, shaftMultiples: 1, sidebands: 1, slip: 1 },
    fundamental: first ? first.nominalOrder / first.harmonic : 0, harmonicsFound: 0, offCombFound: 0, offShaftFound: 0, maskedLines: 0,
    sidebandsFound: 0, spectrumIndex: -1, confirmations: 0, lines: [],
  };
}

/**
 * Best reading of the pattern over the given spectra (e.g. the envelope bands), with the number
 * of other spectra in which the same fundamental's harmonics also stand ≥ 6 dB above the floor.
 * `engineLinesRemoved[i]` says spectrum i is of the residual after the 720° average (envelopes);
 * `caps[i]` is the highest order spectrum i can carry a pattern's line at (an envelope spectrum:
 * its band's width in orders; default its top order).
 */
export function matchPattern(spectra: readonly OrderSpectrum[], search: PatternSearch, engineLinesRemoved: readonly boolean[] = [], caps: readonly number[] = []): PatternMatch {
  // A ball is read twice: as the 2×BSF series alone, and as the whole BSF
  // series with the odd multiples required too; the better reading stands.
  if (search.carriers.some((c) => c.optional)) {
    const even = matchPattern(spectra, { ...search, carriers: search.carriers.filter((c) => !c.optional) }, engineLinesRemoved, caps);
    const whole = matchPattern(spectra, { ...search, bsfSeries: true, carriers: search.carriers.map((c) => (c.optional ? { ...c, optional: false } : c)) }, engineLinesRemoved, caps);
    return whole.total > even.total ? whole : even;
  }
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
        const m = evaluate(spectrum, f, search, index, engineLinesRemoved[index] ?? false, combLevelDb, caps[index] ?? Infinity);
        if (m.total > best.total) best = m;
      }
    }
  });
  if (best.spectrumIndex >= 0) {
    best.confirmations = spectra.filter((spectrum, index) => index !== best.spectrumIndex && search.carriers.some((c) => {
      const at = c.harmonic * best.fundamental;
      const found = !c.optional && at <= Math.min(topOrder(spectrum), caps[index] ?? Infinity) ? lineNear(spectrum, at, 0.75 * spectrum.resolution + 0.004 * at) : null;
      return found !== null && found.snrDb >= FOUND_DB;
    })).length;
  }
  return best;
}
