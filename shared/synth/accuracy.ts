/**
 * Accuracy of one pipeline run on a generated capture, judged against the generator's truth by
 * the criteria of the signal-core issue: mean rpm within 0.5 %; the planted line (after creep and
 * slip) among the first 20 peaks of the order or the envelope spectrum within
 * max(1.5 × resolution, 0.6 % of the order); the loudest injector tick in the right cylinder slot
 * (or among the candidates when the reference leaves the phase open); a trigger wheel's gaps
 * counted as gaps, never as repaired (missed) teeth.
 */
import type { AnalysisResult, Peak } from '../analysis/types';
import type { AnalysisSettingsInput } from '../schemas/analysis-settings';
import type { CaptureTruth } from './truth';

/** Largest mean-rpm error accepted, percent. */
export const RPM_TOLERANCE_PCT = 0.5;
/** How many of the strongest peaks the planted line must be among. */
export const TOP_PEAKS = 20;

/** The judged outcome of one run. */
export interface AccuracyOutcome {
  rpmErrorPct: number;
  rpmOk: boolean;
  /** Null when nothing was planted. */
  order: {
    plantedOrder: number;
    /** 0-based rank among the top peaks of the raw order spectrum, −1 when absent. */
    ordersRank: number;
    /** 0-based rank among the top peaks of the reported envelope band, −1 when absent. */
    envelopeRank: number;
    /** Rank in any of the envelope bands the pipeline kept for the ranking (diagnostic). */
    anyBandRank: number;
    ok: boolean;
  } | null;
  tick: { slotCylinder: number; truthCandidates: number[]; found: number | null; foundCandidates: number[]; angleErrorDeg: number | null; ok: boolean } | null;
  wheel: { gapsTrue: number; gapsFound: number; edgesTrue: number; edgesFound: number; repaired: number; ok: boolean } | null;
}

/** Analysis settings that read a generated capture as the truth describes it. */
export function settingsFromTruth(truth: CaptureTruth): AnalysisSettingsInput {
  const a = truth.analysis;
  return {
    refChannel: a.refChannel, pickupChannel: a.pickupChannel, camChannel: a.camChannel, refKind: a.refKind,
    refPerCycle: a.refPerCycle, ...(a.wheel ? { wheel: a.wheel } : {}), refPolarity: a.refPolarity,
    tdcOffsetDeg: a.tdcOffsetDeg, cylinders: a.cylinders, firingOrder: a.firingOrder,
  };
}

function rankOf(peaks: readonly Peak[], order: number, resolution: number): number {
  const tolerance = Math.max(1.5 * resolution, 0.006 * order);
  return peaks.slice(0, TOP_PEAKS).findIndex((p) => Math.abs(p.order - order) <= tolerance);
}

/** Judges one run against the truth (see the module comment for the criteria). */
export function judgeAccuracy(truth: CaptureTruth, result: AnalysisResult): AccuracyOutcome {
  const rpmErrorPct = 100 * Math.abs(result.speed.meanRpm / truth.rpm.mean - 1);
  let order: AccuracyOutcome['order'] = null;
  if (truth.fault) {
    const planted = truth.fault.plantedOrder;
    const ordersRank = rankOf(result.orders.peaks, planted, result.orders.spectrum.resolution);
    const envelopeRank = rankOf(result.envelope.peaks, planted, result.envelope.resolution);
    const bandRanks = result.envelope.bands.map((b) => rankOf(b.peaks, planted, b.spectrum.resolution)).filter((r) => r >= 0);
    order = {
      plantedOrder: planted, ordersRank, envelopeRank, anyBandRank: bandRanks.length > 0 ? Math.min(...bandRanks) : -1,
      ok: ordersRank >= 0 || envelopeRank >= 0,
    };
  }
  let tick: AccuracyOutcome['tick'] = null;
  const loud = truth.loudestTick;
  if (loud) {
    const event = result.cycle.event;
    const foundCandidates = event ? [...event.candidates].sort((a, b) => a - b) : [];
    const ok = event !== null && (loud.phaseResolved ? event.cylinder === loud.slotCylinder : foundCandidates.includes(loud.slotCylinder));
    // Angle error folded to the reference's ambiguity period (the candidates' spacing).
    const period = 720 / Math.max(1, loud.candidates.length);
    const folded = event ? (((event.angleDeg - loud.angleDeg) % period) + period) % period : null;
    const angleErrorDeg = folded === null ? null : Math.min(folded, period - folded);
    tick = { slotCylinder: loud.slotCylinder, truthCandidates: loud.candidates, found: event?.cylinder ?? null, foundCandidates, angleErrorDeg, ok };
  }
  let wheel: AccuracyOutcome['wheel'] = null;
  if (truth.reference.kind === 'wheel') {
    const speed = result.speed;
    wheel = {
      gapsTrue: truth.reference.gaps, gapsFound: speed.gaps, edgesTrue: truth.reference.edges, edgesFound: speed.edges, repaired: speed.repairedEdges,
      ok: speed.repairedEdges === 0 && speed.gaps === truth.reference.gaps && Math.abs(speed.edges - truth.reference.edges) <= 1,
    };
  }
  return { rpmErrorPct, rpmOk: rpmErrorPct <= RPM_TOLERANCE_PCT, order, tick, wheel };
}
