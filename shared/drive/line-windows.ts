/**
 * Match windows for candidate lines, in crank orders. Belt creep makes a driven part turn slower
 * than nominal (shaft lines −3 % … +0.5 %, docs/references.md §5 [practice]); rolling elements slip as
 * well, and since the cage lags, slip lowers the fixed-race, cage and ball lines but raises the
 * turning race's line (about +1.3 % inner race, about +3 % for an idler's outer race;
 * docs/references.md §4, derived from §1, magnitudes from memory). Fixed-ratio parts have no creep;
 * overrunning (one-way, decoupler) pulleys and fan clutches are not locked to the belt.
 * When a part's own slip is known from its shaft line, its bearing windows are centred on the
 * slipped speed and keep only the rolling-slip allowance.
 */

/** How a line moves with slip: shaft-locked, turning race, fixed race / cage / ball, or belt pass. */
export type LineRole = 'shaft' | 'turning' | 'fixed' | 'belt';

/** How the part is driven: by a friction belt, by a fixed ratio (gear, cam, timing belt), or loosely (overrunning, fan clutch). */
export type DriveRegime = 'belt' | 'fixed' | 'loose';

/** Relative window edges [below, above] as fractions of the nominal order (below is negative). */
export interface RelativeWindow { below: number; above: number }

const SHAFT: Record<DriveRegime, RelativeWindow> = {
  belt: { below: -0.03, above: 0.005 },
  fixed: { below: -0.003, above: 0.003 },
  loose: { below: -0.1, above: 0.01 },
};

/**
 * Rolling-slip allowance alone (no creep): what is left once the part's speed is known. The cage
 * lag raises the turning race's line (inner ring about +1.3 %, an idler's outer ring about +3 %)
 * and lowers the fixed race's, the cage's and the ball's (docs/references.md §4); half a percent of
 * margin on the other side.
 */
const ROLLING: Record<'turning' | 'turningOuter' | 'fixed', RelativeWindow> = {
  turning: { below: -0.005, above: 0.02 },
  turningOuter: { below: -0.005, above: 0.03 },
  fixed: { below: -0.02, above: 0.005 },
};

/** Belt-pass lines: the belt runs at its driving groove's surface speed, less a little creep. */
const BELT_PASS: RelativeWindow = { below: -0.02, above: 0.005 };

/** Creep of friction belts, per stage: 0.5–1 % normal (ISO 5292 via docs/references.md §5), up to 3 % worn [practice]. */
const CREEP_RANGE: [number, number] = [0, 0.03];
/** Cage lag of rolling elements: about 1–2 % (docs/references.md §4, from memory), near 0 when lightly loaded. */
const CAGE_LAG_RANGE: [number, number] = [0, 0.02];

/**
 * The relative window of a line of the given role. `outerRingTurns` selects the idler's wider
 * turning-race allowance. `knownSlip` (fraction, positive = slower), when the part's shaft line
 * gave it, replaces the creep allowance by that slip. `beltStages` (friction belts between the
 * crank and the part, or the belt's driver for a belt-pass line) multiplies the creep allowance.
 */
export function relativeWindow(role: LineRole, regime: DriveRegime, outerRingTurns = false, knownSlip?: number, beltStages = 1): RelativeWindow {
  if (role === 'belt') return { below: BELT_PASS.below + SHAFT.belt.below * Math.max(0, beltStages - 1), above: BELT_PASS.above };
  // Creep compounds over belt stages (a part on a belt driven by a belt-driven part creeps twice).
  const base = SHAFT[regime];
  const creep = regime === 'belt' ? { below: base.below * Math.max(1, beltStages), above: base.above } : base;
  if (knownSlip !== undefined) {
    const speed = 1 - knownSlip;
    // A measured shaft line leaves only the measurement's own spread (a fixed-ratio-like window).
    const own = role === 'shaft' ? SHAFT.fixed : ROLLING[role === 'fixed' ? 'fixed' : outerRingTurns ? 'turningOuter' : 'turning'];
    return { below: speed * (1 + own.below) - 1, above: speed * (1 + own.above) - 1 };
  }
  if (role === 'shaft') return creep;
  const rolling = ROLLING[role === 'fixed' ? 'fixed' : outerRingTurns ? 'turningOuter' : 'turning'];
  // Creep and rolling slip add: below = creep below + rolling below; above = creep above + rolling above.
  return { below: creep.below + rolling.below, above: creep.above + rolling.above };
}

/**
 * The range of relative deviations from nominal that the kinematics make likely for a line (the
 * core of its window, where a reading is fully plausible): belt creep 0–3 % in all (none for
 * fixed ratios, up to 10 % for loose parts, or the known slip), and for bearing lines the cage lag
 * of 0–2 %, which lowers the fixed race, cage and ball lines by the lag and raises the turning
 * race by the lag × `turningShare` (the other race's factor over this one's: BPFO/BPFI for an inner
 * ring, BPFI/BPFO for an outer ring; docs/references.md §1, §4). Default share 0.6 (inner), 1.6 (outer).
 */
export function likelyDeviation(role: LineRole, regime: DriveRegime, outerRingTurns = false, knownSlip?: number, beltStages = 1, turningShare?: number): [number, number] {
  // The window allows creep on every belt stage, but a large total is unusual: the likely core
  // keeps to one worn belt's worth (0–3 % in all), so of two explanations the one needing less
  // compounded creep wins.
  const creep: [number, number] = knownSlip !== undefined ? [knownSlip, knownSlip]
    : regime === 'fixed' ? [0, 0]
      : regime === 'loose' ? [0, -SHAFT.loose.below]
        : CREEP_RANGE;
  if (role === 'belt') return [beltStages > 1 ? -CREEP_RANGE[1] : 0, 0];
  if (role === 'shaft') return [-creep[1], -creep[0]];
  const [lagLo, lagHi] = CAGE_LAG_RANGE;
  if (role === 'fixed') return [(1 - creep[1]) * (1 - lagHi) - 1, (1 - creep[0]) * (1 - lagLo) - 1];
  const share = turningShare ?? (outerRingTurns ? 1.6 : 0.6);
  return [(1 - creep[1]) * (1 + lagLo * share) - 1, (1 - creep[0]) * (1 + lagHi * share) - 1];
}

/** Absolute window [lo, hi] in orders around a nominal order. */
export function absoluteWindow(nominalOrder: number, rel: RelativeWindow): [number, number] {
  return [nominalOrder * (1 + rel.below), nominalOrder * (1 + rel.above)];
}

/** Whether [lo − pad, hi + pad] holds a multiple of `step` (e.g. 0.5 for engine-synchronous orders). */
export function windowHoldsMultiple(window: [number, number], step: number, pad = 0): boolean {
  const lo = window[0] - pad;
  const k = Math.floor((window[1] + pad) / step + 1e-9);
  return k >= 1 && k * step >= lo;
}
