/**
 * Ranks the drive's parts for one capture (docs/design.md "Ranking suspects"): for
 * each (part, fault) its candidate lines are matched within their windows (shaft lines in the raw
 * order spectrum, bearing lines in the envelope spectra, belt lines in both), the whole pattern is
 * scored 0–1 as a list of named terms (shared/ranking/score-terms.ts: the pattern's own factors,
 * then one pass of the terms that compare it with the other entries' first scores), the evidence
 * sentence is derived from the same terms, and the entries are sorted by score, ties by name.
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
import { scoreOf, termSentences, type ScoreTerm } from './score-terms';
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
  /** The score of the pattern's own terms, before the terms that compare it with other entries. */
  firstScore: number;
  terms: ScoreTerm[];
  entry: RankingEntry;
  /** The likely range of the fundamental's relative deviation the reading was judged by. */
  likely: [number, number];
}

function searchFor(cc: ComponentCandidates, fault: Fault, cyclesAveraged: number, shaftOrders: number[], slip?: number): PatternSearch {
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
  const bearing = fault !== 'shaft' && fault !== 'belt';
  return { carriers, sidebands, modulatorWindow, relative, cyclesAveraged, shaftOrders: bearing ? shaftOrders : [], sidebandsExpected: fault !== 'ball' };
}

/**
 * The spectra a fault is looked for in, whether each is of the residual after the 720° average
 * (the envelopes), and the highest order each can carry a line at: an envelope's band of width W
 * Hz carries modulation only up to W Hz, i.e. W / shaft Hz orders.
 */
function spectraFor(fault: Fault, input: RankingInput): { spectra: OrderSpectrum[]; residual: boolean[]; caps: number[] } {
  const shaftHz = input.meanRpm / 60;
  const envelopes = input.envelopes.map((b) => b.spectrum);
  const envCaps = input.envelopes.map((b) => (shaftHz > 0 ? (b.bandHz[1] - b.bandHz[0]) / shaftHz : Infinity));
  if (fault === 'shaft') return { spectra: [input.orders], residual: [false], caps: [Infinity] };
  if (fault === 'belt') return { spectra: [input.orders, ...envelopes], residual: [false, ...envelopes.map(() => true)], caps: [Infinity, ...envCaps] };
  return { spectra: envelopes, residual: envelopes.map(() => true), caps: envCaps };
}

/** Factor on a bearing pattern read where its own measured shaft speed puts it. */
const OWN_SHAFT_SPEED_FACTOR = 1.1;

function matchFault(cc: ComponentCandidates, fault: Fault, input: RankingInput, slip: SlipEstimate | null, shaftOrders: number[]): { match: PatternMatch; shaftConfirmed: boolean; likely: [number, number] } {
  const { spectra, residual, caps } = spectraFor(fault, input);
  const fullSearch = searchFor(cc, fault, input.cyclesAveraged, shaftOrders);
  if (spectra.length === 0) return { match: emptyMatch(fullSearch), shaftConfirmed: false, likely: fullSearch.relative.likely };
  const full = matchPattern(spectra, fullSearch, residual, caps);
  if (!slip || fault === 'shaft' || fault === 'belt' || cc.regime === 'fixed') return { match: full, shaftConfirmed: false, likely: fullSearch.relative.likely };
  // The part's measured slip narrows its bearing windows; prefer that reading unless it loses most of the evidence.
  const narrowSearch = searchFor(cc, fault, input.cyclesAveraged, shaftOrders, slip.slip);
  const narrowed = matchPattern(spectra, narrowSearch, residual, caps);
  return narrowed.total >= 0.6 * full.total && narrowed.total > 0
    ? { match: narrowed, shaftConfirmed: true, likely: narrowSearch.relative.likely }
    : { match: full, shaftConfirmed: false, likely: fullSearch.relative.likely };
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

const pct = (x: number): string => `${(100 * x).toFixed(1)} %`;

/** The terms of a pattern's own reading: the factors of the match, its confirmations and its own shaft speed. */
function ownTerms(cc: ComponentCandidates, fault: Fault, match: PatternMatch, shaftConfirmed: boolean, shaftNames: string[]): ScoreTerm[] {
  const f = match.factors;
  const strong = match.lines.filter((l) => l.line.sideband === 0 && l.found.snrDb >= 6);
  const onComb = strong.filter((l) => l.onComb).length;
  const onShaft = strong.filter((l) => l.onShaftMultiple).length;
  const hasSidebands = cc.lines.some((l) => l.fault === fault && l.sideband !== 0);
  const fundamental = cc.lines.find((l) => l.fault === fault && l.sideband === 0 && l.harmonic === 1);
  const deviation = fundamental ? match.fundamental / fundamental.nominalOrder - 1 : 0;
  const bands = fault === 'shaft' ? 0 : Math.max(0, match.spectrumIndex >= 0 ? 1 : 0);
  const terms: ScoreTerm[] = [
    { name: 'pattern', factor: f.pattern, reason: '' },
    { name: 'masked', factor: f.masked, reason: `${match.maskedLines === 1 ? '1 expected line is' : `${match.maskedLines} expected lines are`} hidden by a much stronger engine line: unknown, not missing` },
    {
      name: 'engine_orders', factor: f.engineOrders,
      reason: onComb === strong.length ? 'every line sits on an engine order (the engine makes these too), so it counts less' : `${onComb} of ${strong.length} lines sit on engine orders and count less`,
    },
    {
      name: 'shaft_multiples', factor: f.shaftMultiples,
      reason: onShaft === strong.length || match.offShaftFound === 0
        ? `every line falls on a whole multiple of a shaft speed (${shaftNames.join(', ')}): ambiguous with the shaft's own lines, so it counts little`
        : `${onShaft} of ${strong.length} lines fall on whole multiples of a shaft speed (${shaftNames.join(', ')}) and count less`,
    },
    {
      name: 'sidebands', factor: f.sidebands,
      reason: !hasSidebands ? 'its fault kind carries no sidebands to confirm it'
        : match.sidebandsFound === 0 ? 'no sidebands where the strength of its carriers made them likely' : 'its sidebands are only partly there',
    },
    { name: 'slip', factor: f.slip, reason: `its lines need a ${pct(-deviation)} slip from nominal, outside the likely range` },
    {
      name: 'other_bands', factor: match.spectrumIndex < 0 ? 1 : 0.9 + 0.05 * Math.min(2, match.confirmations),
      reason: match.confirmations === 0 ? (bands === 0 ? 'read from one spectrum only' : 'seen in one envelope band only') : 'confirmed in 1 of 2 other envelope bands',
    },
  ];
  if (shaftConfirmed) terms.push({ name: 'own_shaft_speed', factor: OWN_SHAFT_SPEED_FACTOR, reason: 'its lines sit where its own measured shaft speed puts them' });
  return terms;
}

function scoreOne(cc: ComponentCandidates, fault: Fault, input: RankingInput, slip: SlipEstimate | null, shafts: KnownShaft[]): Scored {
  // Shaft orders whose multiples a bearing line may merely be: the part's own first, then the other parts'.
  const own = shafts.filter((s) => s.component === cc.component);
  const ordered = [...own, ...shafts.filter((s) => s.component !== cc.component)];
  const { match, shaftConfirmed, likely } = matchFault(cc, fault, input, slip, ordered.map((s) => s.order));
  const hit = ordered.filter((s) => match.lines.some((l) => l.onShaftMultiple && Math.abs(l.found.order / s.order - Math.round(l.found.order / s.order)) * s.order <= 0.6 * maxRes(input)));
  const names = [...new Set(hit.map((s) => (s.component === cc.component ? 'its own' : s.component)))];
  const terms = ownTerms(cc, fault, match, shaftConfirmed, names.length > 0 ? names : ordered.slice(0, 1).map((s) => s.component));
  const score = scoreOf(terms);
  const matched = toMatched(match);
  const strongest = match.lines.filter((l) => l.line.sideband === 0).sort((a, b) => b.found.snrDb - a.found.snrDb)[0];
  const fundamental = cc.lines.find((l) => l.fault === fault && l.sideband === 0 && l.harmonic === 1);
  const shaftSlip = fault === 'shaft' && strongest ? 1 - strongest.found.order / strongest.line.nominalOrder : slip?.slip;
  const spectrumWord = fault === 'shaft' || (fault === 'belt' && match.spectrumIndex === 0) ? 'order spectrum' : 'envelope';
  const head = evidenceSentence({
    component: cc.component, fault, match, slip: fault === 'shaft' ? null : slip, approximate: cc.approximate && fault !== 'belt' && fault !== 'shaft',
    spectrumWord,
  });
  const entry: RankingEntry = {
    component: cc.component,
    target: cc.target,
    fault,
    order: strongest ? strongest.found.order : (fundamental?.nominalOrder ?? 0),
    nominalOrder: strongest ? strongest.line.nominalOrder : (fundamental?.nominalOrder ?? 0),
    score,
    slipPct: shaftSlip === undefined || fault === 'belt' ? null : Math.round(1000 * shaftSlip) / 10,
    evidence: head,
    indistinguishableFrom: [],
    approximate: cc.approximate && fault !== 'shaft' && fault !== 'belt',
    matched,
    terms,
  };
  return { candidates: cc, fault, match, slip, shaftConfirmed, firstScore: score, terms, entry, likely };
}

/** A part's shaft order where the capture fixes it: a fixed ratio, or measured from its own shaft line. */
interface KnownShaft { component: string; order: number }

function maxRes(input: RankingInput): number {
  return Math.max(input.orders.resolution, ...input.envelopes.map((b) => b.spectrum.resolution));
}

const isBearingFault = (fault: Fault): boolean => fault !== 'shaft' && fault !== 'belt';

/**
 * Advisory notes that do not change the score: indistinguishable partners (same ratio and bearing)
 * and near-equal ratios (another part reads the very same lines almost as well). Judged on the
 * final scores.
 */
function advisories(scored: Scored[], input: RankingInput): Map<Scored, string[]> {
  const notes = new Map<Scored, string[]>(scored.map((s) => [s, []]));
  const res = maxRes(input);
  const maxOrder = Math.max(topOrder(input.orders), ...input.envelopes.map((b) => topOrder(b.spectrum)));
  const live = scored.filter((s) => s.entry.score >= INDISTINGUISHABLE_MIN_SCORE && s.candidates.target === 'component');
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
    if (s.entry.indistinguishableFrom.length > 0) notes.get(s)!.push(separationAdvice(s.entry.indistinguishableFrom));
  }
  // Near-equal ratios: another part whose same fault (or another bearing fault) reads the very same lines almost as well is
  // not indistinguishable (its pattern differs within the slip allowance), but the technician
  // should know the capture leans on slip to choose between them.
  for (const a of live) {
    const strongest = a.match.lines.filter((l) => l.line.sideband === 0).sort((x, y) => y.found.snrDb - x.found.snrDb)[0];
    if (!strongest) continue;
    const rivals = scored.filter((b) => b !== a && (b.fault === a.fault || (isBearingFault(a.fault) && isBearingFault(b.fault))) && b.candidates.target === 'component'
      && b.candidates.component !== a.candidates.component && !a.entry.indistinguishableFrom.includes(b.entry.component)
      && b.entry.score >= 0.85 * a.entry.score && b.match.lines.some((l) => Math.abs(l.found.order - strongest.found.order) <= res));
    if (rivals.length > 0) {
      const names = rivals.map((r) => (r.fault === a.fault ? r.entry.component : `${r.entry.component} (${r.fault.replace('_', ' ')})`));
      notes.get(a)!.push(`the same lines also fit ${names.join(', ')} with a different slip (near-equal ratio): a probe nearer each part separates them`);
    }
  }
  return notes;
}

/** Factor on a pattern whose lines are only the harmonics of another, lower pattern (see `harmonicsTerm`). */
const HARMONICS_OF_ANOTHER_FACTOR = 0.6;

/**
 * Explaining away: when one pattern's fundamental is 2× or 3× another's, and the lower one's own
 * 1× stands clear of the floor, the higher pattern is only reading the lower one's harmonics (an
 * impact train at f has lines at 2f, 3f, … but nothing at f/2), so it counts less (×0.6). Judged
 * on the patterns' first scores, so the order of the entries changes nothing.
 */
function harmonicsTerm(high: Scored, scored: readonly Scored[], res: number): ScoreTerm | null {
  if (high.firstScore <= 0 || high.match.spectrumIndex < 0) return null;
  const firstLine = (s: Scored) => s.match.lines.find((l) => l.line.sideband === 0 && l.line.harmonic === 1);
  const highDb = Math.max(...high.match.lines.filter((l) => l.line.sideband === 0).map((l) => l.found.snrDb));
  // The lower pattern's own 1× must stand ≥ 10 dB above the floor off the engine comb, and about
  // as strong as the higher pattern's lines (an engine line explains nothing).
  const lower = scored.find((low) => {
    const one = firstLine(low);
    return low !== high && low.firstScore >= 0.3 && one !== undefined && one.found.snrDb >= 10 && !one.onComb && !one.onShaftMultiple
      && low.match.spectrumIndex >= 0 && (low.fault === 'shaft') === (high.fault === 'shaft')
      && one.found.snrDb >= highDb - 3
      && [2, 3].some((k) => Math.abs(high.match.fundamental - k * low.match.fundamental) <= Math.max(res, 0.003 * high.match.fundamental));
  });
  if (!lower) return null;
  return {
    name: 'harmonics_of_another', factor: HARMONICS_OF_ANOTHER_FACTOR,
    reason: `its lines are also harmonics of ${lower.entry.component}'s ${lower.fault.replace('_', ' ')} pattern at ${lower.match.fundamental.toFixed(2)}, which explains them better`,
  };
}

/** Factors on a bearing pattern whose lines another, stronger pattern's family explains: all of them, or at least half. */
const FAMILY_ALL_FACTOR = 0.5;
const FAMILY_MOST_FACTOR = 0.75;
/** Fundamentals closer than this fraction are one comb read by two near-equal ratios, left to the advisory note. */
const NEAR_EQUAL_FRACTION = 0.01;
/** Shaft sidebands of a modulated pattern's harmonics that count as its family (an inner race in real recordings shows ±1…±3×). */
const FAMILY_SIDEBANDS = 3;

/**
 * Explaining away by a stronger pattern's family: a bearing pattern whose
 * found lines are all (or mostly) harmonics of another pattern that scored higher, or their shaft
 * sidebands when that pattern is a race's, reads nothing of its own. Real
 * inner-race envelopes carry k·BPFI ± m·shaft lines for m up to 3 and beyond, which a ball or
 * outer-race pattern of a nearby order happily reads. Judged on first scores.
 */
function familyTerm(a: Scored, scored: readonly Scored[], res: number): ScoreTerm | null {
  if (a.firstScore <= 0 || a.match.spectrumIndex < 0 || !isBearingFault(a.fault)) return null;
  const mine = a.match.lines.filter((l) => l.line.sideband === 0 && !l.line.optional && l.found.snrDb >= 6).map((l) => l.found.order);
  if (mine.length === 0) return null;
  let best: { factor: number; by: Scored } | null = null;
  for (const b of scored) {
    if (b === a || b.firstScore <= a.firstScore || !isBearingFault(b.fault) || b.match.harmonicsFound < 2) continue;
    if (b.candidates.component === a.candidates.component && b.fault === a.fault) continue;
    const fb = b.match.fundamental;
    // The same fundamental is a near-equal ratio (both read the very same comb), not a family.
    if (Math.abs(a.match.fundamental - fb) <= Math.max(res, NEAR_EQUAL_FRACTION * fb)) continue;
    // Real races of either kind show shaft sidebands (load zone, run-out); a ball's are at the cage speed, left out.
    const modulated = b.fault !== 'ball' && b.fault !== 'cage';
    const mod = modulated ? b.candidates.ratio * (1 - (b.slip?.slip ?? 0)) : 0;
    const explained = (o: number) => {
      const tol = Math.max(res, 0.003 * o);
      for (let h = 1; h * fb <= o + FAMILY_SIDEBANDS * mod + tol; h += 1) {
        for (let m = modulated ? -FAMILY_SIDEBANDS : 0; m <= (modulated ? FAMILY_SIDEBANDS : 0); m += 1) {
          if (Math.abs(o - (h * fb + m * mod)) <= tol) return true;
        }
      }
      return false;
    };
    const n = mine.filter(explained).length;
    const factor = n === mine.length ? FAMILY_ALL_FACTOR : mine.length >= 2 && 2 * n >= mine.length ? FAMILY_MOST_FACTOR : 1;
    if (factor < 1 && (!best || factor < best.factor)) best = { factor, by: b };
  }
  if (!best) return null;
  return {
    name: 'family_of_another', factor: best.factor,
    reason: `${best.factor === FAMILY_ALL_FACTOR ? 'its lines are' : 'most of its lines are'} harmonics${best.by.fault === 'ball' || best.by.fault === 'cage' ? '' : ' or shaft sidebands'} of ${best.by.entry.component}'s stronger ${best.by.fault.replace('_', ' ')} pattern at ${best.by.match.fundamental.toFixed(2)}, which explains them better`,
  };
}

/** Factor on a pattern whose lines a shaft-confirmed rival explains (see `shaftConfirmedRivalTerm`). */
const SHAFT_CONFIRMED_RIVAL_FACTOR = 0.7;

/**
 * Explaining away by a measured speed: when a part's bearing pattern sits where its own shaft line
 * puts it (slip measured from the shaft 1×/2×, bearing lines within the cage-lag band of that
 * speed), another part whose pattern reads the very same lines but whose speed the capture does
 * not show (no shaft line of its own, so it fits only by assuming an unmeasured slip) is a
 * coincidence of ratios, and counts less (×0.7). Parts whose whole patterns coincide (same ratio
 * and bearing) are left to the indistinguishable note; a rival whose own shaft line was measured
 * too keeps its score. Judged on first scores.
 */
function shaftConfirmedRivalTerm(rival: Scored, scored: readonly Scored[], res: number, maxOrder: number): ScoreTerm | null {
  if (rival.shaftConfirmed || rival.slip !== null || rival.firstScore <= 0 || rival.candidates.target !== 'component' || rival.fault === 'shaft') return null;
  const carriersOf = (s: Scored) => s.match.lines.filter((l) => l.line.sideband === 0 && l.found.snrDb >= 6);
  const strongest = carriersOf(rival).sort((a, b) => b.found.snrDb - a.found.snrDb)[0];
  if (!strongest) return null;
  const explainer = scored.find((c) => c.shaftConfirmed && c.firstScore >= 0.3 && c.candidates.component !== rival.candidates.component
    && c.firstScore >= 0.8 * rival.firstScore
    && !patternsCoincide(c.candidates, rival.candidates, c.fault, res, maxOrder, rival.fault)
    && carriersOf(c).some((l) => Math.abs(l.found.order - strongest.found.order) <= res));
  if (!explainer) return null;
  const slipPct = explainer.slip ? (100 * explainer.slip.slip).toFixed(1) : '0.0';
  return {
    name: 'shaft_confirmed_rival', factor: SHAFT_CONFIRMED_RIVAL_FACTOR,
    reason: `its lines sit where ${explainer.entry.component}'s own shaft line (${slipPct} % slip) puts its ${explainer.fault.replace('_', ' ')} pattern, while this part's speed is not measured, so the fit is likelier a coincidence of ratios`,
  };
}

/** A shaft pattern this many dB above the median of the other parts' shaft lines counts fully; at or below it, `STANDS_OUT_FLOOR`. */
const STANDS_OUT_DB = 12;
const STANDS_OUT_FLOOR = 0.3;

/**
 * Every part turns, so every part shows some 1× (unbalance within grade): a shaft fault is a
 * 1×/2× that stands out against the drive's other shaft lines, not a line that is merely there.
 * The factor rises from 0.3 (no stronger than the median of the other parts' strongest shaft
 * lines) to 1 at 12 dB above it. Parts reading the very same line (a near-equal ratio) are left
 * out of the comparison.
 */
function standsOutTerm(s: Scored, scored: readonly Scored[], res: number): ScoreTerm | null {
  if (s.fault !== 'shaft' || s.match.spectrumIndex < 0) return null;
  const strongest = (x: Scored) => Math.max(0, ...x.match.lines.filter((l) => l.line.sideband === 0).map((l) => l.found.snrDb));
  const own = s.match.lines.filter((l) => l.line.sideband === 0).map((l) => l.found.order);
  const others = scored.filter((o) => o.fault === 'shaft' && o.candidates.component !== s.candidates.component && o.candidates.target === 'component'
    && !o.match.lines.some((l) => own.some((x) => Math.abs(x - l.found.order) <= res)));
  if (others.length === 0) return null;
  const levels = others.map(strongest).sort((a, b) => a - b);
  const median = levels[Math.floor(levels.length / 2)];
  const above = strongest(s) - median;
  const factor = STANDS_OUT_FLOOR + (1 - STANDS_OUT_FLOOR) * Math.max(0, Math.min(1, above / STANDS_OUT_DB));
  return {
    name: 'stands_out', factor,
    reason: `its shaft lines stand only ${Math.max(0, above).toFixed(0)} dB above the other parts' shaft lines (every part turns and shows some 1×)`,
  };
}

/** Shaft orders the capture fixes: fixed-ratio parts' ratios and the parts' measured shaft lines. */
function knownShafts(all: readonly ComponentCandidates[], slips: Map<string, SlipEstimate | null>): KnownShaft[] {
  const out: KnownShaft[] = [];
  for (const cc of all) {
    if (cc.target !== 'component') continue;
    const slip = slips.get(cc.component);
    if (slip) out.push({ component: cc.component, order: cc.ratio * (1 - slip.slip) });
    else if (cc.regime === 'fixed') out.push({ component: cc.component, order: cc.ratio });
  }
  return out;
}

/**
 * Ranks every (component, fault) of the drive and every belt for one capture. Returns one entry
 * each, sorted by score (0–1) descending, ties by component name then fault. Each entry's score is
 * the product of its `terms`, and its evidence names exactly the terms that moved it. Without
 * envelope spectra the bearing faults score 0. Throws RangeError when the input holds no order
 * spectrum.
 */
export function rankCapture(drive: DriveDocument, input: RankingInput, options: RankOptions = {}): RankingEntry[] {
  if (!input.orders || !(input.orders.resolution > 0) || input.orders.amplitude.length !== input.orders.floor.length) {
    throw new RangeError('ranking needs an order spectrum with a positive resolution and a floor of the same length');
  }
  const envRes = input.envelopes[0]?.spectrum.resolution ?? input.orders.resolution;
  const all = candidateLines(drive, { shopTable: options.shopTable, calibration: options.calibration, resolution: { orders: input.orders.resolution, envelope: envRes } });
  // Every part's own shaft line is measured, fixed-ratio ones too.
  const slips = new Map(all.filter((cc) => cc.target === 'component').map((cc) => [cc.component, estimateSlip(cc, input.orders)] as const));
  const shafts = knownShafts(all, slips);
  const scored: Scored[] = [];
  for (const cc of all) {
    if (cc.target === 'belt') {
      scored.push(scoreOne(cc, 'belt', input, null, []));
      continue;
    }
    const slip = cc.regime === 'fixed' ? null : slips.get(cc.component) ?? null;
    for (const fault of COMPONENT_FAULTS) scored.push(scoreOne(cc, fault, input, slip, shafts));
  }
  // One pass of the terms that compare a pattern with the others, on their first scores.
  const res = maxRes(input);
  const maxOrder = Math.max(topOrder(input.orders), ...input.envelopes.map((b) => topOrder(b.spectrum)));
  const rivalTerms = scored.map((s) => {
    const harmonics = harmonicsTerm(s, scored, res);
    return [harmonics ?? familyTerm(s, scored, res), shaftConfirmedRivalTerm(s, scored, res, maxOrder), standsOutTerm(s, scored, res)].filter((t): t is ScoreTerm => t !== null);
  });
  scored.forEach((s, i) => {
    s.terms.push(...rivalTerms[i]);
    s.entry.score = scoreOf(s.terms);
  });
  const notes = advisories(scored, input);
  for (const s of scored) s.entry.evidence = [s.entry.evidence, ...termSentences(s.terms), ...notes.get(s)!].join('; ');
  // Equal scores (the slip term is flat over the likely range, so near-equal ratios tie): the
  // reading nearer the middle of its likely range first, then by name.
  const offCentre = (s: Scored) => {
    const first = s.candidates.lines.find((l) => l.fault === s.fault && l.sideband === 0 && l.harmonic === 1);
    if (!first || s.match.spectrumIndex < 0) return Infinity;
    const [lo, hi] = s.likely;
    return Math.abs(s.match.fundamental / first.nominalOrder - 1 - (lo + hi) / 2);
  };
  return scored
    .sort((a, b) => b.entry.score - a.entry.score || offCentre(a) - offCentre(b)
      || a.entry.component.localeCompare(b.entry.component) || a.fault.localeCompare(b.fault))
    .map((s) => s.entry);
}
