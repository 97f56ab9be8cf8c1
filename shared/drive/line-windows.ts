/**
 * Match windows for candidate lines, in crank orders. Belt creep makes a driven part turn slower
 * than nominal (shaft lines −3 % … +0.5 %, REFERENCES.md §5 [practice]); rolling elements slip as
 * well, and since the cage lags, slip lowers the fixed-race, cage and ball lines but raises the
 * turning race's line (about +1.3 % inner race, about +3 % for an idler's outer race;
 * REFERENCES.md §4, derived from §1, magnitudes from memory). Fixed-ratio parts have no creep;
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

/** Rolling-slip allowance alone (no creep): what is left once the part's speed is known. */
const ROLLING: Record<'turning' | 'turningOuter' | 'fixed', RelativeWindow> = {
  turning: { below: -0.01, above: 0.025 },
  turningOuter: { below: -0.01, above: 0.035 },
  fixed: { below: -0.025, above: 0.01 },
};

const BELT_PASS: RelativeWindow = { below: -0.02, above: 0.005 };

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
