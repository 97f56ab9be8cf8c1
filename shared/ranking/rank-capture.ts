/**
 * Ranks the drive's parts for one capture (docs/design.md "Ranking suspects"): for
 * each (part, fault) its candidate lines are matched within their windows (shaft lines in the raw
 * order spectrum, bearing lines in the envelope spectra, belt lines in both), the whole pattern is
 * scored 0–1, and the entries are sorted by score, ties by name.
 */
import type { MatchedLine, OrderSpectrum, RankingEntry, RankingInput } from '../analysis/types';
import type { BearingTable } from '../drive/bearing-table';
import { type CandidateOptions, candidateLines, windowOf } from '../drive/candidate-lines';
import { likelyDeviation, relativeWindow } from '../drive/line-windows';
import type { CandidateLine, ComponentCandidates, DriveDocument, Fault } from '../drive/types';
import { estimateSlip, type SlipEstimate } from './estimate-slip';
import { evidenceSentence } from './evidence';
import { patternsCoincide, separationAdvice } from './indistinguishable';
import { emptyMatch, matchPattern, type PatternMatch, type PatternSearch } from './match-pattern';
import { topOrder } from './spectrum-lines';

/** Options of `rankCapture`. */
export interface RankOptions {
  /** The shop's bearing table, searched before the built-in rows. */
  shopTable?: BearingTable;
  /** Ratio calibrations the lead accepted, per component name (shared/ranking/ratio-calibration.ts). */
  calibration?: CandidateOptions['calibration'];
}

const COMPONENT_FAULTS: Fault[] = ['shaft', 'outer_race', 'inner_race', 'ball', 'cage'];
/** Minimum score for an entry to be considered when naming indistinguishable parts. */
const INDISTINGUISHABLE_MIN_SCORE = 0.15;

interface Scored {
  candidates: ComponentCandidates;
  fault: Fault;
  match: PatternMatch;
  slip: SlipEstimate | null;
  /** The bearing pattern was read within the cage-lag band of the part's own measured shaft speed. */
  shaftConfirmed: boolean;
  score: number;
  entry: RankingEntry;
}

function searchFor(cc: ComponentCandidates, fault: Fault, cyclesAveraged: number, slip?: number): PatternSearch {
  const relocate = (l: CandidateLine): CandidateLine => (slip === undefined ? l : { ...l, window: windowOf(l, cc.regime, cc.rotatingRing, slip, cc.beltStages) });
  const lines = cc.lines.filter((l) => l.fault === fault).map(relocate);
  const carriers = lines.filter((l) => l.sideband === 0);
  const sidebands = lines.filter((l) => l.sideband !== 0);
  const role = carriers[0]?.role ?? 'shaft';
  const outer = cc.rotatingRing === 'outer';
  // The turning race rises by the cage lag times the other race's share (docs/references.md §1, §4).
  const f = cc.factors;
  const share = f && role === 'turning' ? (fault === 'inner_race' ? f.bpfo / f.bpfi : f.bpfi / f.bpfo) : undefined;
  // A calibrated part's nominal already holds its usual creep: the likely deviation is about 0.
  const likely = likelyDeviation(role, cc.regime, outer, slip ?? (cc.calibrated ? 0 : undefined), cc.beltStages, share);
  const preferCentre = slip === undefined;
  let relative = { ...relativeWindow(role, cc.regime, outer, slip, cc.beltStages), likely, preferCentre };
  if (carriers[0]) {
    const [lo, hi] = carriers[0].window;
    relative = { below: lo / carriers[0].nominalOrder - 1, above: hi / carriers[0].nominalOrder - 1, likely, preferCentre };
  }
  let modulatorWindow: [number, number] | undefined;
  if (sidebands.length > 0) {
    const modulator = fault === 'ball'
      ? cc.lines.find((l) => l.fault === 'cage' && l.harmonic === 1)
      : cc.lines.find((l) => l.fault === 'shaft' && l.harmonic === 1);
    if (modulator) modulatorWindow = relocate(modulator).window;
  }
  return { carriers, sidebands, modulatorWindow, relative, cyclesAveraged };
}

/** The spectra a fault is looked for in, and whether each is of the residual after the 720° average (the envelopes). */
function spectraFor(fault: Fault, input: RankingInput): { spectra: OrderSpectrum[]; residual: boolean[] } {
  const envelopes = input.envelopes.map((b) => b.spectrum);
  if (fault === 'shaft') return { spectra: [input.orders], residual: [false] };
  if (fault === 'belt') return { spectra: [input.orders, ...envelopes], residual: [false, ...envelopes.map(() => true)] };
  return { spectra: envelopes, residual: envelopes.map(() => true) };
}

function matchFault(cc: ComponentCandidates, fault: Fault, input: RankingInput, slip: SlipEstimate | null): { match: PatternMatch; shaftConfirmed: boolean } {
  const { spectra, residual } = spectraFor(fault, input);
  if (spectra.length === 0) return { match: emptyMatch(searchFor(cc, fault, input.cyclesAveraged)), shaftConfirmed: false };
  const full = matchPattern(spectra, searchFor(cc, fault, input.cyclesAveraged), residual);
  if (!slip || fault === 'shaft' || fault === 'belt' || cc.regime === 'fixed') return { match: full, shaftConfirmed: false };
  // The part's measured slip narrows its bearing windows; prefer that reading unless it loses most of the evidence.
  const narrowed = matchPattern(spectra, searchFor(cc, fault, input.cyclesAveraged, slip.slip), residual);
  return narrowed.total >= 0.6 * full.total && narrowed.total > 0
    ? { match: { ...narrowed, total: Math.min(1, narrowed.total * 1.1) }, shaftConfirmed: true }
    : { match: full, shaftConfirmed: false };
}

function toMatched(match: PatternMatch): MatchedLine[] {
  return match.lines
    .slice()
    .sort((a, b) => b.found.snrDb - a.found.snrDb)
    .map((l) => ({
      label: l.line.label, spectrum: l.line.spectrum === 'orders' && l.line.fault !== 'belt' ? 'orders' : (l.line.fault === 'belt' && match.spectrumIndex > 0 ? 'envelope' : l.line.spectrum),
      nominalOrder: l.line.nominalOrder, order: l.found.order, amplitude: l.found.amplitude, snrDb: l.found.snrDb, cycleGain: l.cycleGain,
    }));
}

function nearShaftHarmonic(cc: ComponentCandidates, fault: Fault): number | null {
  const first = cc.lines.find((l) => l.fault === fault && l.harmonic === 1 && l.sideband === 0);
  if (!first || !first.nearShaftHarmonic || fault === 'shaft' || fault === 'belt') return null;
  return Math.max(1, Math.round(first.nominalOrder / cc.ratio));
}

function scoreOne(cc: ComponentCandidates, fault: Fault, input: RankingInput, slip: SlipEstimate | null): Scored {
  const { match, shaftConfirmed } = matchFault(cc, fault, input, slip);
  // Seen in other envelope bands as well: a little more credible (at most 1 when confirmed twice).
  const total = match.total * (0.9 + 0.05 * Math.min(2, match.confirmations));
  const score = Math.round(1000 * Math.min(1, total)) / 1000;
  const matched = toMatched(match);
  const strongest = match.lines.filter((l) => l.line.sideband === 0).sort((a, b) => b.found.snrDb - a.found.snrDb)[0];
  const fundamental = cc.lines.find((l) => l.fault === fault && l.sideband === 0 && l.harmonic === 1);
  const shaftSlip = fault === 'shaft' && strongest ? 1 - strongest.found.order / strongest.line.nominalOrder : slip?.slip;
  const spectrumWord = fault === 'shaft' || (fault === 'belt' && match.spectrumIndex === 0) ? 'order spectrum' : 'envelope';
  const evidence = evidenceSentence({
    component: cc.component, fault, match, slip: fault === 'shaft' ? null : slip, approximate: cc.approximate && fault !== 'belt' && fault !== 'shaft',
    nearShaftHarmonic: nearShaftHarmonic(cc, fault), spectrumWord,
  });
  const entry: RankingEntry = {
    component: cc.component,
    target: cc.target,
    fault,
    order: strongest ? strongest.found.order : (fundamental?.nominalOrder ?? 0),
    nominalOrder: strongest ? strongest.line.nominalOrder : (fundamental?.nominalOrder ?? 0),
    score,
    slipPct: shaftSlip === undefined || fault === 'belt' ? null : Math.round(1000 * shaftSlip) / 10,
    evidence,
    indistinguishableFrom: [],
    approximate: cc.approximate && fault !== 'shaft' && fault !== 'belt',
    matched,
  };
  return { candidates: cc, fault, match, slip, shaftConfirmed, score, entry };
}

const isBearingFault = (fault: Fault): boolean => fault !== 'shaft' && fault !== 'belt';

function markIndistinguishable(scored: Scored[], input: RankingInput): void {
  const res = Math.max(input.orders.resolution, ...input.envelopes.map((b) => b.spectrum.resolution));
  const maxOrder = Math.max(topOrder(input.orders), ...input.envelopes.map((b) => topOrder(b.spectrum)));
  const live = scored.filter((s) => s.score >= INDISTINGUISHABLE_MIN_SCORE && s.candidates.target === 'component');
  for (const a of live) {
    for (const b of scored) {
      if (b === a || b.candidates.target !== 'component' || b.candidates.component === a.candidates.component || b.fault !== a.fault) continue;
      if (patternsCoincide(a.candidates, b.candidates, a.fault, res, maxOrder)) {
        if (!a.entry.indistinguishableFrom.includes(b.entry.component)) a.entry.indistinguishableFrom.push(b.entry.component);
        if (!b.entry.indistinguishableFrom.includes(a.entry.component)) b.entry.indistinguishableFrom.push(a.entry.component);
      }
    }
  }
  for (const s of scored) {
    if (s.entry.indistinguishableFrom.length > 0) s.entry.evidence += `; ${separationAdvice(s.entry.indistinguishableFrom)}`;
  }
  // Near-equal ratios: another part whose same fault (or another bearing fault) reads the very same lines almost as well is
  // not indistinguishable (its pattern differs within the slip allowance), but the technician
  // should know the capture leans on slip to choose between them.
  for (const a of live) {
    const strongest = a.match.lines.filter((l) => l.line.sideband === 0).sort((x, y) => y.found.snrDb - x.found.snrDb)[0];
    if (!strongest) continue;
    const rivals = scored.filter((b) => b !== a && (b.fault === a.fault || (isBearingFault(a.fault) && isBearingFault(b.fault))) && b.candidates.target === 'component'
      && b.candidates.component !== a.candidates.component && !a.entry.indistinguishableFrom.includes(b.entry.component)
      && b.score >= 0.85 * a.score && b.match.lines.some((l) => Math.abs(l.found.order - strongest.found.order) <= res));
    if (rivals.length > 0) {
      const names = rivals.map((r) => (r.fault === a.fault ? r.entry.component : `${r.entry.component} (${r.fault.replace('_', ' ')})`));
      a.entry.evidence += `; the same lines also fit ${names.join(', ')} with a different slip (near-equal ratio): a probe nearer each part separates them`;
    }
  }
}

/**
 * Explaining away: when one pattern's fundamental is 2× or 3× another's, and the lower one's own
 * 1× stands clear of the floor, the higher pattern is only reading the lower one's harmonics (an
 * impact train at f has lines at 2f, 3f, … but nothing at f/2), so it counts less (×0.6).
 */
function explainAway(scored: Scored[], input: RankingInput): void {
  const res = Math.max(input.orders.resolution, ...input.envelopes.map((b) => b.spectrum.resolution));
  const firstLine = (s: Scored) => s.match.lines.find((l) => l.line.sideband === 0 && l.line.harmonic === 1);
  // The lower pattern's own 1× must stand ≥ 10 dB above the floor off the engine comb, and about
  // as strong as the higher pattern's lines (an engine line explains nothing).
  const strong = scored.filter((s) => {
    const one = firstLine(s);
    return s.score >= 0.3 && one !== undefined && one.found.snrDb >= 10 && !one.onComb;
  });
  for (const high of scored) {
    if (high.score <= 0 || high.match.spectrumIndex < 0) continue;
    const highDb = Math.max(...high.match.lines.filter((l) => l.line.sideband === 0).map((l) => l.found.snrDb));
    const lower = strong.find((low) => low !== high && low.match.spectrumIndex >= 0
      && (low.fault === 'shaft') === (high.fault === 'shaft')
      && firstLine(low)!.found.snrDb >= highDb - 3
      && [2, 3].some((k) => Math.abs(high.match.fundamental - k * low.match.fundamental) <= Math.max(res, 0.003 * high.match.fundamental)));
    if (!lower) continue;
    high.score = Math.round(1000 * high.score * 0.6) / 1000;
    high.entry.score = high.score;
    high.entry.evidence += `; its lines are also harmonics of ${lower.entry.component}'s ${lower.fault.replace('_', ' ')} pattern at ${lower.match.fundamental.toFixed(2)}, which explains them better`;
  }
}

/** Factor on a pattern whose lines a shaft-confirmed rival explains (see `explainByShaftConfirmed`). */
const SHAFT_CONFIRMED_RIVAL_FACTOR = 0.7;

/**
 * Explaining away by a measured speed: when a part's bearing pattern sits where its own shaft line
 * puts it (slip measured from the shaft 1×/2×, bearing lines within the cage-lag band of that
 * speed), another part whose pattern reads the very same lines but whose speed the capture does
 * not show (no shaft line of its own, so it fits only by assuming an unmeasured slip) is a
 * coincidence of ratios, and counts less (×0.7). Parts whose whole patterns coincide (same ratio
 * and bearing) are left to `markIndistinguishable`; a rival whose own shaft line was measured too
 * keeps its score.
 */
function explainByShaftConfirmed(scored: Scored[], input: RankingInput): void {
  const res = Math.max(input.orders.resolution, ...input.envelopes.map((b) => b.spectrum.resolution));
  const maxOrder = Math.max(topOrder(input.orders), ...input.envelopes.map((b) => topOrder(b.spectrum)));
  const carriersOf = (s: Scored) => s.match.lines.filter((l) => l.line.sideband === 0 && l.found.snrDb >= 6);
  const confirmed = scored.filter((s) => s.shaftConfirmed && s.score >= 0.3 && carriersOf(s).length > 0);
  for (const rival of scored) {
    if (rival.shaftConfirmed || rival.slip !== null || rival.score <= 0 || rival.candidates.target !== 'component' || rival.fault === 'shaft') continue;
    const strongest = carriersOf(rival).sort((a, b) => b.found.snrDb - a.found.snrDb)[0];
    if (!strongest) continue;
    const explainer = confirmed.find((c) => c.candidates.component !== rival.candidates.component
      && c.score >= 0.8 * rival.score
      && !patternsCoincide(c.candidates, rival.candidates, c.fault, res, maxOrder, rival.fault)
      && carriersOf(c).some((l) => Math.abs(l.found.order - strongest.found.order) <= res));
    if (!explainer) continue;
    rival.score = Math.round(1000 * rival.score * SHAFT_CONFIRMED_RIVAL_FACTOR) / 1000;
    rival.entry.score = rival.score;
    const slipPct = explainer.slip ? (100 * explainer.slip.slip).toFixed(1) : '0.0';
    rival.entry.evidence += `; its lines sit where ${explainer.entry.component}'s own shaft line (${slipPct} % slip) puts its ${explainer.fault.replace('_', ' ')} pattern, while this part's speed is not measured, so the fit is likelier a coincidence of ratios`;
  }
}

/**
 * Ranks every (component, fault) of the drive and every belt for one capture. Returns one entry
 * each, sorted by score (0–1) descending, ties by component name then fault. Without envelope
 * spectra the bearing faults score 0. Throws RangeError when the input holds no order spectrum.
 */
export function rankCapture(drive: DriveDocument, input: RankingInput, options: RankOptions = {}): RankingEntry[] {
  if (!input.orders || !(input.orders.resolution > 0) || input.orders.amplitude.length !== input.orders.floor.length) {
    throw new RangeError('ranking needs an order spectrum with a positive resolution and a floor of the same length');
  }
  const envRes = input.envelopes[0]?.spectrum.resolution ?? input.orders.resolution;
  const all = candidateLines(drive, { shopTable: options.shopTable, calibration: options.calibration, resolution: { orders: input.orders.resolution, envelope: envRes } });
  const scored: Scored[] = [];
  for (const cc of all) {
    if (cc.target === 'belt') {
      scored.push(scoreOne(cc, 'belt', input, null));
      continue;
    }
    const slip = cc.regime === 'fixed' ? null : estimateSlip(cc, input.orders);
    for (const fault of COMPONENT_FAULTS) scored.push(scoreOne(cc, fault, input, slip));
  }
  explainAway(scored, input);
  explainByShaftConfirmed(scored, input);
  markIndistinguishable(scored, input);
  return scored
    .map((s) => s.entry)
    .sort((a, b) => b.score - a.score || a.component.localeCompare(b.component) || a.fault.localeCompare(b.fault));
}
