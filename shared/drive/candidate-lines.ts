/**
 * Every crank order at which a part of the drive can show, with its match window and flags
 * (docs/design.md "Ranking suspects"): ratio × (shaft 1×, 2×; FTF, BPFO, BPFI, 2×BSF and their 1×–3×
 * harmonics; sidebands) and the belt-pass order of each belt. Shaft and belt lines are looked for
 * in the raw order spectrum, bearing lines in the envelope spectrum.
 */
import type { BearingFactors, CandidateLine, ComponentCandidates, ComponentSpec, DriveDocument, Fault, RotatingRing } from './types';
import { bearingFactors } from './bearing-factors';
import type { BearingTable } from './bearing-table';
import { beltPassOrder, beltStages, speedRatio } from './kinematics';
import { absoluteWindow, relativeWindow, windowHoldsMultiple, type DriveRegime, type LineRole } from './line-windows';

/** Options of `candidateLines`. */
export interface CandidateOptions {
  /** The shop's bearing table, searched before the built-in rows. */
  shopTable?: BearingTable;
  /** Spectrum resolutions in orders; flags are judged on windows widened by them (0 when absent). */
  resolution?: { orders?: number; envelope?: number };
  /** Known slip per component name (fraction, positive = slower), e.g. measured from its shaft line. */
  knownSlip?: Record<string, number>;
  /** Number of defect harmonics per bearing fault (default 3). */
  harmonics?: number;
  /**
   * Accepted ratio calibrations per component name (issue 20 item 3): the part's lines move to
   * nominal ratio × factor and its windows narrow to the measured scatter (see `calibratedWindow`).
   */
  calibration?: Record<string, AcceptedCalibration>;
}

/** An effective-ratio correction a lead accepted: factor = effective / nominal ratio; uncertainty = its ± as a fraction. */
export interface AcceptedCalibration { factor: number; uncertainty: number }

/**
 * Window of a line of a calibrated part: the creep allowance is gone (the factor holds the part's
 * usual creep), replaced by twice the measured scatter (at least ±0.3 %, the fixed-ratio spread),
 * plus the rolling-slip allowance for bearing lines (as for a known slip of 0).
 */
export function calibratedWindow(
  line: Pick<CandidateLine, 'role' | 'nominalOrder' | 'sideband' | 'carrierHarmonic' | 'modulatorOrder' | 'fault'>,
  regime: DriveRegime, rotatingRing: RotatingRing, beltStages: number, uncertainty: number,
): [number, number] {
  const [lo, hi] = windowOf(line, regime, rotatingRing, 0, beltStages);
  const pad = Math.max(0, 2 * uncertainty - 0.003) * line.nominalOrder;
  return [lo - pad, hi + pad];
}

/** Engine-synchronous step: every multiple of half an order (the 720° cycle). */
export const ENGINE_ORDER_STEP = 0.5;

/** The driving regime of a component: fixed ratio, loose (overrunning or fan clutch) or belt. */
export function driveRegime(component: ComponentSpec): DriveRegime {
  if (component.fixedRatio !== undefined) return 'fixed';
  if (component.overrunning || component.kind === 'fan') return 'loose';
  return 'belt';
}

/**
 * Window of a line given its role and the part's regime, turning ring and (optionally) known slip.
 * Sidebands take the carrier's window shifted by the modulator's (shaft-locked or cage) window.
 */
export function windowOf(
  line: Pick<CandidateLine, 'role' | 'nominalOrder' | 'sideband' | 'carrierHarmonic' | 'modulatorOrder' | 'fault'>,
  regime: DriveRegime,
  rotatingRing: RotatingRing,
  knownSlip?: number,
  beltStages = 1,
): [number, number] {
  const outer = rotatingRing === 'outer';
  if (line.sideband === 0 || line.modulatorOrder === undefined) {
    return absoluteWindow(line.nominalOrder, relativeWindow(line.role, regime, outer, knownSlip, beltStages));
  }
  const carrierNominal = line.nominalOrder - line.sideband * line.modulatorOrder;
  const carrier = absoluteWindow(carrierNominal, relativeWindow(line.role, regime, outer, knownSlip, beltStages));
  const modRole: LineRole = line.fault === 'ball' ? 'fixed' : 'shaft';
  const mod = absoluteWindow(line.modulatorOrder, relativeWindow(modRole, regime, outer, knownSlip, beltStages));
  return line.sideband > 0
    ? [carrier[0] + mod[0], carrier[1] + mod[1]]
    : [carrier[0] - mod[1], carrier[1] - mod[0]];
}

interface LineSeed { label: string; fault: Fault; harmonic: number; sideband: number; nominalOrder: number; role: LineRole;
  spectrum: 'orders' | 'envelope'; carrierHarmonic?: number; modulatorOrder?: number; optional?: boolean }

/** Odd multiples of BSF a ball fault may show beside the 2×BSF series. */
const BALL_ODD_MULTIPLES = [1, 3, 5];

function componentSeeds(ratio: number, f: BearingFactors, ring: RotatingRing, harmonics: number): LineSeed[] {
  const seeds: LineSeed[] = [];
  const outer = ring === 'outer';
  for (const k of [1, 2]) {
    seeds.push({ label: `shaft ${k}x`, fault: 'shaft', harmonic: k, sideband: 0, nominalOrder: k * ratio, role: 'shaft', spectrum: 'orders' });
  }
  const defects: { fault: Fault; name: string; factor: number; role: LineRole }[] = [
    { fault: 'outer_race', name: 'BPFO', factor: f.bpfo, role: outer ? 'turning' : 'fixed' },
    { fault: 'inner_race', name: 'BPFI', factor: f.bpfi, role: outer ? 'fixed' : 'turning' },
    { fault: 'ball', name: '2xBSF', factor: 2 * f.bsf, role: 'fixed' },
    { fault: 'cage', name: 'FTF', factor: f.ftf, role: 'fixed' },
  ];
  for (const d of defects) {
    for (let k = 1; k <= harmonics; k += 1) {
      seeds.push({ label: `${d.name} ${k}x`, fault: d.fault, harmonic: k, sideband: 0, nominalOrder: k * ratio * d.factor, role: d.role, spectrum: 'envelope' });
    }
    // A ball that strikes one race harder than the other (or only one) shows BSF and its odd
    // multiples as well as the 2×BSF series (docs/references.md §1; W. A. Smith and R. B. Randall 2015
    // on real ball faults); they count when found and are never missed.
    if (d.fault === 'ball') {
      for (const k of BALL_ODD_MULTIPLES.filter((m) => m < 2 * harmonics)) {
        seeds.push({ label: `BSF ${k}x`, fault: 'ball', harmonic: k / 2, sideband: 0, nominalOrder: k * ratio * f.bsf, role: 'fixed', spectrum: 'envelope', optional: true });
      }
    }
    // Sidebands (docs/references.md §1): the turning race's defect is modulated at the shaft (ring) speed;
    // a ball defect at the cage speed. A fixed race's defect carries none.
    let modulator: { order: number; name: string } | undefined;
    if (d.role === 'turning' && d.fault !== 'cage') modulator = { order: ratio, name: '1x shaft' };
    if (d.fault === 'ball') modulator = { order: ratio * f.ftf, name: 'FTF' };
    if (!modulator) continue;
    for (let k = 1; k <= Math.min(2, harmonics); k += 1) {
      for (const side of [-1, 1]) {
        seeds.push({
          label: `${d.name} ${k}x ${side < 0 ? '-' : '+'}${modulator.name}`, fault: d.fault, harmonic: 0, sideband: side,
          nominalOrder: k * ratio * d.factor + side * modulator.order, role: d.role, spectrum: 'envelope',
          carrierHarmonic: k, modulatorOrder: modulator.order,
        });
      }
    }
  }
  return seeds;
}

function finishLine(seed: LineSeed, window: [number, number], ratio: number, pad: number): CandidateLine {
  const isBearing = seed.fault !== 'shaft' && seed.fault !== 'belt';
  return {
    ...seed,
    window,
    engineSynchronous: windowHoldsMultiple(window, ENGINE_ORDER_STEP, pad),
    nearShaftHarmonic: isBearing && seed.sideband === 0 && windowHoldsMultiple(window, ratio, pad),
  };
}

/**
 * Candidate lines of every part of a drive (the crankshaft itself excluded) and of every belt.
 * Bearing factors come from `bearingFactors` (entered, geometry, designation or the rule of thumb,
 * then marked approximate). Windows follow `line-windows.ts`; flags are judged on windows widened
 * by the spectrum's resolution when given.
 */
export function candidateLines(drive: DriveDocument, options: CandidateOptions = {}): ComponentCandidates[] {
  const harmonics = options.harmonics ?? 3;
  const padOrders = options.resolution?.orders ?? 0;
  const padEnvelope = options.resolution?.envelope ?? 0;
  const out: ComponentCandidates[] = [];
  for (const component of drive.components) {
    if (component.kind === 'crankshaft') continue;
    const regime = driveRegime(component);
    const cal = regime === 'belt' ? options.calibration?.[component.name] : undefined;
    const ratio = speedRatio(drive, component.name) * (cal?.factor ?? 1);
    const bearing = bearingFactors(component.bearing, options.shopTable);
    const slip = options.knownSlip?.[component.name];
    const stages = beltStages(drive, component.name);
    const lines = componentSeeds(ratio, bearing.factors, bearing.rotatingRing, harmonics).map((seed) =>
      finishLine(seed, cal ? calibratedWindow(seed, regime, bearing.rotatingRing, stages, cal.uncertainty) : windowOf(seed, regime, bearing.rotatingRing, slip, stages),
        ratio, seed.spectrum === 'orders' ? padOrders : padEnvelope));
    out.push({
      component: component.name, target: 'component', kind: component.kind, ratio, factors: bearing.factors,
      approximate: bearing.approximate, rotatingRing: bearing.rotatingRing, regime, beltStages: stages, lines,
      ...(cal ? { calibrated: cal } : {}),
    });
  }
  for (const belt of drive.belts) {
    const order = beltPassOrder(drive, belt.name);
    // A belt driven by a belt-driven part inherits that part's creep as well.
    const stages = beltStages(drive, belt.driver) + 1;
    const lines: CandidateLine[] = [];
    for (let k = 1; k <= harmonics; k += 1) {
      const seed: LineSeed = { label: `belt pass ${k}x`, fault: 'belt', harmonic: k, sideband: 0, nominalOrder: k * order, role: 'belt', spectrum: 'orders' };
      lines.push(finishLine(seed, absoluteWindow(k * order, relativeWindow('belt', 'belt', false, undefined, stages)), order, padOrders));
    }
    out.push({ component: belt.name, target: 'belt', kind: 'belt', ratio: order, approximate: false, rotatingRing: 'inner', regime: 'belt', beltStages: stages - 1, lines });
  }
  return out;
}
