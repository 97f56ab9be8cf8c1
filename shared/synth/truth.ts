/**
 * The truth written beside every generated capture: what was planted and how to analyse it.
 * Orders are multiples of crank speed; angles are crank degrees in the 720° cycle from cylinder-1
 * TDC; percentages are of the nominal value.
 */
import type { FaultKind } from './options';
import type { RefKind } from '../schemas/analysis-settings';

/** Settings that analyse the capture (mirrors the pipeline's settings fields by meaning). */
export interface TruthAnalysisSettings {
  refKind: RefKind;
  /** N evenly spaced pulses per cycle when the reference is generic, else null. */
  refPerCycle: number | null;
  wheel: string | null;
  refPolarity: 'rising' | 'falling';
  tdcOffsetDeg: number;
  cylinders: number;
  firingOrder: number[];
  /** 1-based channel numbers. */
  refChannel: number;
  pickupChannel: number;
  camChannel: number | null;
}

/** The planted fault with the orders it produces. */
export interface TruthFault {
  component: string;
  target: 'component' | 'belt';
  fault: FaultKind;
  /** Nominal crank-to-part speed ratio (for a belt: of the belt's driver). */
  ratio: number;
  creepPct: number;
  /** Cage lag of the rolling elements (bearing faults), else 0. */
  rollingSlipPct: number;
  /** Actual part speed in crank orders (ratio after creep). */
  partOrder: number;
  /** Label of the planted line, e.g. 'shaft 1x', 'BPFO 1x', '2xBSF 1x', 'FTF 1x', 'belt pass'. */
  line: string;
  /** Where the line is meant to show: the raw order spectrum or the envelope spectrum. */
  spectrum: 'orders' | 'envelope';
  /** The line's nominal order (ratio × factor, no creep, no slip). */
  nominalOrder: number;
  /** The line's mean order in this capture (after creep and rolling slip). */
  plantedOrder: number;
  /** For bearing faults, the bearing line's order after slip (= plantedOrder); null otherwise. */
  bearingLineOrder: number | null;
  /** Order of the amplitude modulation (sidebands at ± this), or null when unmodulated. */
  modulationOrder: number | null;
  /** Defect factors used (multiples of the turning ring's speed), null for shaft and belt faults. */
  factors: { ftf: number; bpfo: number; bpfi: number; bsf: number } | null;
  rotatingRing: 'inner' | 'outer' | null;
  amplitude: number;
}

/** One injector tick as planted, with the firing slot its angle falls in. */
export interface TruthTick {
  cylinder: number;
  angleDeg: number;
  amplitude: number;
  /** Cylinder whose firing slot [i·720/c, (i+1)·720/c) holds the angle. */
  slotCylinder: number;
  slotIndex: number;
  afterTdcDeg: number;
}

/** Everything the generator planted in one capture. */
export interface CaptureTruth {
  generator: 'crankwise-synth';
  version: 1;
  seed: number;
  drive: string;
  sampleRateHz: number;
  durationS: number;
  channels: Array<'reference' | 'pickup' | 'cam'>;
  /** Speeds over whole crank revolutions (per-revolution rpm for min and max); `end` = ramp target or null when held. */
  rpm: { nominal: number; end: number | null; mean: number; min: number; max: number; wanderPct: number };
  reference: {
    kind: RefKind;
    refPerCycle: number | null;
    wheel: string | null;
    /** Pulses (or teeth) whose edge lies inside the capture. */
    edges: number;
    /** For a wheel: complete gaps inside the capture; else 0. */
    gaps: number;
    /** Crank angle of the reference edge in the cycle (= −tdcOffsetDeg mod 720). */
    edgeAngleDeg: number;
    /** Crank angle of the cam pulse's rising edge, or null without a cam channel. */
    camEdgeAngleDeg: number | null;
  };
  analysis: TruthAnalysisSettings;
  fault: TruthFault | null;
  snr: { db: number; bandHz: [number, number]; definition: string };
  /** Total RMS of the added noise over 0 … fs/2. */
  noiseRms: number;
  resonanceHz: number;
  ticks: TruthTick[];
  loudestTick: (TruthTick & {
    /** Cylinders the event may belong to given the reference's ambiguity (one when resolved). */
    candidates: number[];
    phaseResolved: boolean;
  }) | null;
  distractor: { kind: 'tick-train' | 'clunk'; order: number | null; amplitude: number; ringHz: number; events: number } | null;
  /** Engine-synchronous lines planted (orders and amplitudes of the pickup's engine vibration). */
  engineOrders: Array<{ order: number; amplitude: number }>;
  /** Per-channel factor from file value to pickup units (set by the file writer; 1 when unscaled). */
  channelScale: number[];
}
