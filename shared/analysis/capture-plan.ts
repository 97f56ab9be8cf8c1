/**
 * The capture planner's arithmetic: from the engine speeds, the cylinder count, the highest order
 * of interest, the top of the envelope band and the revolutions wanted, how long to record, what a
 * 10-division scope screen should be set to, the sample rate and the order resolution — each with
 * the reason, so the page can show its working.
 *
 * - One four-stroke cycle is 720° of crank rotation, so it lasts 120 000 / rpm ms; a 200 ms screen
 *   (20 ms/div × 10) holds exactly one cycle at 600 rpm and more at any higher speed
 *   (docs/references.md §5, common practice, arithmetic derived).
 * - Firing frequency = rpm / 60 × cylinders / 2 (docs/references.md §5).
 * - Sample rate: order tracking needs the highest order's frequency at the highest speed below the
 *   anti-alias edge, 2.56 samples per period by the usual analyser convention (Nyquist 2 plus
 *   filter roll-off; common practice); the envelope needs its band's top below Nyquist with margin,
 *   2.5 × (common practice). The plan takes the larger and rounds up to a rate recorders offer.
 * - Order resolution = 1 / revolutions in a block (docs/design.md, order tracking).
 */

/** What the planner is given. */
export interface CapturePlanInput {
  idleRpm: number;
  /** The highest speed the capture will see (a held rpm); at least idleRpm. */
  heldRpm: number;
  cylinders: number;
  /** Highest crank order of interest (e.g. a bearing's 3rd harmonic). */
  highestOrder: number;
  /** Top of the envelope band (Hz); default AnalysisSettingsSchema's envelopeMaxHz. */
  envelopeTopHz: number;
  /** Revolutions wanted in the window (at idle, the slowest). */
  revolutions: number;
}

/** What the planner gives, with its working. */
export interface CapturePlan {
  windowS: number;
  /** Time per division for a 10-division screen, rounded up to a 1-2-5 step (s). */
  perDivisionS: number;
  /** Minimum sample rate from the rule and the rate to set (Hz). */
  minSampleRateHz: number;
  sampleRateHz: number;
  orderResolution: number;
  /** Engine cycles the window holds at idle. */
  cyclesAtIdle: number;
  firingHzAtIdle: number;
  reasoning: string[];
}

/** Sample rates recorders and sound cards commonly offer (Hz). */
export const COMMON_SAMPLE_RATES = [8000, 11025, 16000, 22050, 32000, 44100, 48000, 88200, 96000, 176400, 192000, 384000] as const;

/** Duration of one four-stroke cycle (720°) in ms at a crank speed. */
export function cycleMs(rpm: number): number {
  if (!(Number.isFinite(rpm) && rpm > 0)) throw new RangeError(`engine speed must be a positive rpm, got ${rpm}`);
  return 120_000 / rpm;
}

/** The smallest 1-2-5 step (…, 10 ms, 20 ms, 50 ms, 100 ms, …) at or above `s` seconds. */
export function roundUp125(s: number): number {
  const decade = 10 ** Math.floor(Math.log10(s));
  for (const m of [1, 2, 5, 10]) if (m * decade >= s * (1 - 1e-12)) return m * decade;
  return 10 * decade;
}

/** Checks the input and returns the plan; throws RangeError naming a bad value in the user's words. */
export function planCapture(input: CapturePlanInput): CapturePlan {
  const { idleRpm, heldRpm, cylinders, highestOrder, envelopeTopHz, revolutions } = input;
  if (!(idleRpm >= 300 && idleRpm <= 3000)) throw new RangeError('Idle speed must be between 300 and 3000 rpm');
  if (!(heldRpm >= idleRpm && heldRpm <= 8000)) throw new RangeError('The highest speed must be at least the idle speed and at most 8000 rpm');
  if (!(Number.isInteger(cylinders) && cylinders >= 1 && cylinders <= 16)) throw new RangeError('Cylinders must be a whole number from 1 to 16');
  if (!(highestOrder > 0 && highestOrder <= 2000)) throw new RangeError('The highest order must be above 0 and at most 2000');
  if (!(envelopeTopHz >= 500 && envelopeTopHz <= 100_000)) throw new RangeError('The envelope band top must be between 500 and 100000 Hz');
  if (!(Number.isInteger(revolutions) && revolutions >= 2 && revolutions <= 4096)) throw new RangeError('Revolutions must be a whole number from 2 (one engine cycle) to 4096');

  const windowS = (revolutions * 60) / idleRpm;
  const perDivisionS = roundUp125(windowS / 10);
  const orderNeedHz = (2.56 * highestOrder * heldRpm) / 60;
  const envelopeNeedHz = 2.5 * envelopeTopHz;
  const minSampleRateHz = Math.max(orderNeedHz, envelopeNeedHz);
  const sampleRateHz = COMMON_SAMPLE_RATES.find((r) => r >= minSampleRateHz) ?? Math.ceil(minSampleRateHz / 1000) * 1000;
  const orderResolution = 1 / revolutions;
  const cyclesAtIdle = revolutions / 2;
  const firingHzAtIdle = (idleRpm / 60) * (cylinders / 2);
  const f = (v: number, d = 1) => v.toFixed(d);
  const reasoning = [
    `At ${f(idleRpm, 0)} rpm one revolution takes ${f(60_000 / idleRpm)} ms and one engine cycle (720°) ${f(cycleMs(idleRpm))} ms; ${revolutions} revolutions take ${f(windowS, 2)} s (${f(cyclesAtIdle, 1)} cycles). Record at least that long at the slowest speed.`,
    `On a 10-division screen that is ${f((windowS / 10) * 1000)} ms per division; the next scope step is ${f(perDivisionS * 1000, perDivisionS < 0.01 ? 1 : 0)} ms/div.`,
    `Order ${highestOrder} at ${f(heldRpm, 0)} rpm is ${f((highestOrder * heldRpm) / 60)} Hz; 2.56 samples per period (common analyser practice) needs ${f(orderNeedHz, 0)} Hz.`,
    `The envelope band reaches ${f(envelopeTopHz, 0)} Hz; 2.5 × that (common practice) needs ${f(envelopeNeedHz, 0)} Hz.`,
    `So at least ${f(minSampleRateHz, 0)} Hz: set ${sampleRateHz} Hz${sampleRateHz === minSampleRateHz ? '' : ', the next rate recorders offer'}.`,
    `Order resolution is 1 / ${revolutions} = ${orderResolution.toPrecision(3)} order: lines closer than that merge. Firing frequency at idle: ${f(firingHzAtIdle)} Hz (order ${f(cylinders / 2, 1)}).`,
  ];
  return { windowS, perDivisionS, minSampleRateHz, sampleRateHz, orderResolution, cyclesAtIdle, firingHzAtIdle, reasoning };
}
