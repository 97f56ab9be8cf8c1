/**
 * The result of one pipeline run over a capture (docs/design.md "The analysis pipeline"). The CLI's
 * `--json` output is a projection of this (typed arrays dropped); the ranking reads the spectra.
 * Orders are multiples of crank speed; amplitudes are single-sided peak amplitudes in input units
 * times the channel scale, corrected for the window's coherent gain.
 */

import type { AnalysisSettings } from '../schemas/analysis-settings';
import type { OrderMap } from './order-tracks';

export interface Peak {
  order: number;
  amplitude: number;
  snrDb: number;
  /** The 0.5-order multiple the peak lies on within half the order resolution, else null. */
  engineOrder: number | null;
  /** engineOrder is a multiple of cylinders / 2. */
  firing: boolean;
}

/** An amplitude spectrum over crank order: bin k is at order k * resolution. */
export interface OrderSpectrum {
  resolution: number;
  maxOrder: number;
  samplesPerRev: number;
  revsPerBlock: number;
  blocks: number;
  amplitude: Float64Array;
  /** Running-median floor on the same bins (for SNR and prominence). */
  floor: Float64Array;
}

export interface EnvelopeBand {
  bandHz: [number, number];
  /** Spectral kurtosis (or other impulsiveness score) that chose this band. */
  score: number;
  spectrum: OrderSpectrum;
  peaks: Peak[];
}

export interface SpeedSummary {
  meanRpm: number;
  minRpm: number;
  maxRpm: number;
  stabilityPct: number;
  edges: number;
  repairedEdges: number;
}

export interface CycleEvent {
  angleDeg: number;
  cylinder: number | null;
  candidates: number[];
  afterTdcDeg: number;
}

export interface CycleResult {
  tdcOffsetDeg: number;
  phaseResolved: boolean;
  /** Number of whole 720° cycles in the synchronous average (for the comb gain of docs/references.md §3). */
  cyclesAveraged: number;
  event: CycleEvent | null;
  /** Synchronous average and short-window RMS over 720°, for the engine-cycle view. */
  averageDeg?: Float32Array;
  rmsDeg?: Float32Array;
  /** false when speed came from the pickup (no reference): the 720° phase is unknown, no view. */
  available?: boolean;
}

export interface Warning { code: string; message: string }

export interface AnalysisTimingsMs {
  read: number; speed: number; orders: number; envelope: number; cycle: number;
  spectrogram: number; peaks: number; ranking: number; total: number;
}

/**
 * What the ranking needs from one capture's analysis: the raw order spectrum, the envelope
 * spectra of the best bands (first = the reported one), the cylinder count and the number of
 * cycles the 720° average used.
 */
export interface RankingInput {
  orders: OrderSpectrum;
  envelopes: EnvelopeBand[];
  cylinders: number;
  cyclesAveraged: number;
  meanRpm: number;
}

/** One matched line behind a ranking entry (also stored per capture on a Finding). */
export interface MatchedLine {
  label: string;
  spectrum: 'orders' | 'envelope';
  nominalOrder: number;
  order: number;
  amplitude: number;
  snrDb: number;
  /** Comb gain of the 720° average at this order (docs/references.md §3); > ~0.3 means not separable. */
  cycleGain: number;
}

/** One (component, fault) suspect: the `ranking` entries of `analyze --json`, plus the matched lines. */
export interface RankingEntry {
  component: string;
  target: 'component' | 'belt';
  fault: 'shaft' | 'outer_race' | 'inner_race' | 'ball' | 'cage' | 'belt';
  /** Measured crank order of the strongest matched line. */
  order: number;
  /** That line's nominal order. */
  nominalOrder: number;
  score: number;
  /** 100·(1 − measured/nominal) from shaft lines (positive = slower); null without one. */
  slipPct: number | null;
  evidence: string;
  indistinguishableFrom: string[];
  approximate: boolean;
  matched: MatchedLine[];
  /**
   * The named terms the score is the product of (shared/ranking/score-terms.ts); the evidence
   * names exactly those that moved it. Absent on entries made before the terms existed.
   */
  terms?: { name: string; factor: number; reason: string }[];
}

/** What was read: rate, duration and channel count (plus names and units where the file gave them). */
export interface CaptureInfo {
  sampleRateHz: number;
  durationS: number;
  channels: number;
  format?: string;
  channelNames?: string[];
  channelUnits?: (string | null)[];
}

/** Crank speed: the JSON summary plus the series behind the Speed and Spectrogram views. */
export interface SpeedResult extends SpeedSummary {
  /** Trigger-wheel gaps found (each counted as its missing pitches, never as missed teeth). */
  gaps: number;
  /** Reference pulses per revolution used (wheel: teeth positions per revolution). */
  pulsesPerRev: number;
  /** rpm of each whole revolution. */
  perRevRpm: Float32Array;
  /** rpm(t) sampled evenly: trace.timeS[i], trace.rpm[i]. */
  trace: { timeS: Float32Array; rpm: Float32Array };
  /** Where the speed came from (absent = the reference). */
  source?: 'reference' | 'pickup';
  /** When read from the pickup: the order assumed for the followed line and how sure the reading is. */
  fromPickup?: PickupSpeedSummary;
}

/** How a speed read from the pickup was obtained (shared/analysis/pickup-speed.ts). */
export interface PickupSpeedSummary {
  /** The order the followed line was taken to be (cylinders / 2): every order is relative to this assumption. */
  firingOrder: number;
  /** 0–1. */
  confidence: number;
  /** Median level of the followed line over the floor (dB). */
  lineDb: number;
  presentFraction: number;
  /** Salience of the chosen reading over the best octave alternative (dB). */
  marginDb: number;
}

export interface OrdersResult {
  spectrum: OrderSpectrum;
  peaks: Peak[];
}

export interface EnvelopeResult {
  bandHz: [number, number];
  bandChoice: 'auto' | 'given';
  resolution: number;
  /** Peaks of the reported (first) band's envelope order spectrum. */
  peaks: Peak[];
  /** The best two or three bands (first = reported), each with its spectrum and peaks. */
  bands: EnvelopeBand[];
  /** Whether the 720° synchronous average was subtracted before the envelope (needs ≥ 2 cycles). */
  residual: boolean;
}

/** STFT amplitude of the pickup with the rpm at each frame (capped at 1M floats). */
export interface SpectrogramResult {
  frames: number;
  bins: number;
  binWidthHz: number;
  hopS: number;
  /** Time of frame 0's centre. */
  startS: number;
  /** frames × bins, row-major, single-sided peak amplitude. */
  amplitude: Float32Array;
  rpm: Float32Array;
}

/** One whole pipeline run (docs/design.md steps 1–8). `toAnalyzeJson` projects it to the CLI's JSON. */
export interface AnalysisResult {
  capture: CaptureInfo;
  settings: AnalysisSettings;
  speed: SpeedResult;
  orders: OrdersResult;
  envelope: EnvelopeResult;
  cycle: CycleResult;
  spectrogram: SpectrogramResult;
  /** Order map of a sweep (speed spanning ≥ 1.2×), for order tracks (shared/analysis/order-tracks.ts). */
  orderMap?: OrderMap;
  ranking: RankingEntry[];
  warnings: Warning[];
  timingsMs: AnalysisTimingsMs;
}
