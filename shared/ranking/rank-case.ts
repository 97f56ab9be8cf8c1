/**
 * Combines the rankings of several captures of one case into one list of suspects (docs/design.md
 * "Ranking suspects"). Terms, each applied on its own:
 * - base: a suspect's best score over the before-repair captures that ran with the belt on;
 * - probe point: a part whose lines are stronger in the capture probed nearest to it than in the
 *   others gains weight (and loses some when they are weaker there);
 * - A/C condition: lines present only with the A/C clutch engaged point at the compressor;
 * - belt off: what remains in a belt-off capture is engine-born, and counts little, except for a
 *   fixed-ratio part (gear, cam or timing-belt driven), which keeps turning with the accessory
 *   belt off;
 * - after-repair captures never re-rank; their scores are reported beside each suspect.
 */
import type { RankingEntry } from '../analysis/types';
import type { ComponentKind, DriveDocument, Fault } from '../drive/types';

/** One analysed capture of a case, with what the technician recorded about it. */
export interface CaseCapture {
  captureId: string | number;
  entries: RankingEntry[];
  /** The drive component the probe was nearest to, if recorded. */
  probeComponent?: string | null;
  /** A/C clutch state during the capture, if recorded. */
  acClutch?: 'on' | 'off' | null;
  /** The accessory belt was off during the capture. */
  beltOff?: boolean;
  phase: 'before' | 'after_repair';
}

/** One combined suspect of a case. */
export interface CaseSuspect {
  component: string;
  target: 'component' | 'belt';
  fault: Fault;
  score: number;
  /** The best single-capture entry behind the score (its evidence, order and slip). */
  best: RankingEntry;
  bestCaptureId: string | number;
  /** Remains in a belt-off capture: the engine makes it. */
  engineBorn: boolean;
  /** One sentence per case-level term that changed the score, for the technician. */
  notes: string[];
  /** The suspect's score in each before-repair capture, for the probe-point view. */
  perCapture: { captureId: string | number; score: number; strongestSnrDb: number | null }[];
  /** Its best score in after-repair captures (verification; never used to rank), null without any. */
  afterRepairScore: number | null;
}

/** Score a line pattern needs in a capture to count as present there. */
export const PRESENT_SCORE = 0.3;
/** Below this it counts as absent. */
export const ABSENT_SCORE = 0.15;

const keyOf = (e: Pick<RankingEntry, 'component' | 'fault'>): string => `${e.component.toLowerCase()}|${e.fault}`;
const strongest = (e: RankingEntry): number | null => (e.matched.length > 0 ? Math.max(...e.matched.map((m) => m.snrDb)) : null);

function kindOf(drive: DriveDocument, name: string): ComponentKind | 'belt' {
  const c = drive.components.find((x) => x.name.toLowerCase() === name.toLowerCase());
  return c ? c.kind : 'belt';
}

/** A part that keeps turning with the accessory belt off: driven at a fixed ratio (gear, cam, timing belt), or the crank itself. */
function turnsWithBeltOff(drive: DriveDocument, name: string): boolean {
  const c = drive.components.find((x) => x.name.toLowerCase() === name.toLowerCase());
  return !!c && (c.fixedRatio !== undefined || c.kind === 'crankshaft');
}

/** Probe-point term: ×(1 ± 0.3) as the part's strongest line is up to 12 dB stronger (weaker) at its own probe point than elsewhere. */
function probeFactor(component: string, seen: { capture: CaseCapture; entry: RankingEntry }[]): { factor: number; note?: string } {
  const snr = (x: { entry: RankingEntry }) => strongest(x.entry) ?? 0;
  const near = seen.filter((s) => s.capture.probeComponent && s.capture.probeComponent.toLowerCase() === component.toLowerCase());
  const far = seen.filter((s) => s.capture.probeComponent && s.capture.probeComponent.toLowerCase() !== component.toLowerCase());
  if (near.length === 0 || far.length === 0) return { factor: 1 };
  const nearDb = Math.max(...near.map(snr));
  const farDb = far.reduce((sum, s) => sum + snr(s), 0) / far.length;
  const diff = nearDb - farDb;
  if (Math.abs(diff) < 3) return { factor: 1 };
  const factor = 1 + 0.3 * Math.max(-1, Math.min(1, diff / 12));
  return {
    factor,
    note: diff > 0
      ? `its lines are ${diff.toFixed(0)} dB stronger with the probe at ${component} than elsewhere`
      : `its lines are ${(-diff).toFixed(0)} dB weaker with the probe at ${component} than elsewhere`,
  };
}

/** A/C term: present only with the clutch engaged → the compressor (×1.3 for it, ×0.7 for another part, with a note). */
function acFactor(kind: ComponentKind | 'belt', seen: { capture: CaseCapture; entry: RankingEntry }[]): { factor: number; note?: string } {
  const on = seen.filter((s) => s.capture.acClutch === 'on');
  const off = seen.filter((s) => s.capture.acClutch === 'off');
  if (on.length === 0 || off.length === 0) return { factor: 1 };
  const onlyWithClutch = on.some((s) => s.entry.score >= PRESENT_SCORE) && off.every((s) => s.entry.score < ABSENT_SCORE);
  if (!onlyWithClutch) return { factor: 1 };
  return kind === 'ac_compressor'
    ? { factor: 1.3, note: 'present only with the A/C clutch engaged, as a compressor fault would be' }
    : { factor: 0.7, note: 'present only with the A/C clutch engaged: points at the A/C compressor or its clutch rather than this part' };
}

/**
 * Combines the captures' rankings. Suspects are keyed by (component, fault); the result is sorted
 * by score (0–1) descending, ties by component name then fault. After-repair captures only fill
 * `afterRepairScore`.
 */
export function rankCase(drive: DriveDocument, captures: readonly CaseCapture[]): CaseSuspect[] {
  const before = captures.filter((c) => c.phase === 'before');
  const beltOn = before.filter((c) => !c.beltOff);
  const beltOff = before.filter((c) => c.beltOff);
  const after = captures.filter((c) => c.phase === 'after_repair');
  const keys = new Map<string, RankingEntry>();
  for (const c of before) for (const e of c.entries) if (!keys.has(keyOf(e))) keys.set(keyOf(e), e);
  const suspects: CaseSuspect[] = [];
  for (const [key, sample] of keys) {
    // A part that keeps turning with the belt off is seen in the belt-off captures as well.
    const keepsTurning = turnsWithBeltOff(drive, sample.component);
    const seen = (keepsTurning ? before : beltOn).flatMap((capture) => {
      const entry = capture.entries.find((e) => keyOf(e) === key);
      return entry ? [{ capture, entry }] : [];
    });
    const pool = seen.length > 0 ? seen : beltOff.flatMap((capture) => {
      const entry = capture.entries.find((e) => keyOf(e) === key);
      return entry ? [{ capture, entry }] : [];
    });
    if (pool.length === 0) continue;
    const top = pool.reduce((a, b) => (b.entry.score > a.entry.score ? b : a));
    let score = top.entry.score;
    const notes: string[] = [];
    const probe = probeFactor(sample.component, seen);
    score *= probe.factor;
    if (probe.note) notes.push(probe.note);
    const ac = acFactor(kindOf(drive, sample.component), seen);
    score *= ac.factor;
    if (ac.note) notes.push(ac.note);
    const remainsBeltOff = !keepsTurning && beltOff.some((c) => (c.entries.find((e) => keyOf(e) === key)?.score ?? 0) >= PRESENT_SCORE);
    if (keepsTurning && beltOff.length > 0) {
      notes.push('driven at a fixed ratio, it keeps turning with the accessory belt off, so the belt-off capture neither clears nor condemns it');
    } else if (remainsBeltOff) {
      score *= 0.3;
      notes.push('still there with the belt off: engine-born, not this accessory');
    } else if (beltOff.length > 0 && top.entry.score >= PRESENT_SCORE) {
      notes.push('gone with the belt off: belt-driven');
    }
    const afterScores = after.map((c) => c.entries.find((e) => keyOf(e) === key)?.score).filter((s): s is number => s !== undefined);
    suspects.push({
      component: sample.component, target: sample.target, fault: sample.fault,
      score: Math.round(1000 * Math.max(0, Math.min(1, score))) / 1000,
      best: top.entry, bestCaptureId: top.capture.captureId, engineBorn: remainsBeltOff, notes,
      perCapture: seen.map((s) => ({ captureId: s.capture.captureId, score: s.entry.score, strongestSnrDb: strongest(s.entry) })),
      afterRepairScore: afterScores.length > 0 ? Math.max(...afterScores) : null,
    });
  }
  return suspects.sort((a, b) => b.score - a.score || a.component.localeCompare(b.component) || a.fault.localeCompare(b.fault));
}
