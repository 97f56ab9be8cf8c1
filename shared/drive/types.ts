/**
 * Types of the drive document (the `analyze --drive` file and the Drive library's export) and of
 * the candidate orders computed from it. The zod schema in `shared/schemas/drive.ts` validates a
 * document and infers a type identical to `DriveDocument` here; kinematics live in
 * `shared/drive/*.ts`. Units are in the names: millimetres, degrees, crank orders.
 */

export type ComponentKind =
  | 'crankshaft' | 'alternator' | 'water_pump' | 'power_steering' | 'ac_compressor'
  | 'idler' | 'tensioner' | 'fan' | 'vacuum_pump' | 'other';

export type RotatingRing = 'inner' | 'outer';

/** Defect factors as multiples of the turning ring's speed (cage factor already for that ring). */
export interface BearingFactors { ftf: number; bpfo: number; bpfi: number; bsf: number }

/** A bearing by geometry, by designation (built-in or shop table), or by entered factors. */
export interface BearingSpec {
  designation?: string;
  balls?: number;
  ballMm?: number;
  pitchMm?: number;
  contactDeg?: number;
  factors?: BearingFactors;
  rotatingRing?: RotatingRing;
  /** Where the geometry comes from (kept through export; informative only). */
  source?: 'published' | 'measured' | 'estimated';
}

export interface BeltSpec {
  name: string;
  lengthMm: number;
  /** Name of the component whose groove drives this belt. */
  driver: string;
  /** Effective (pitch-line) diameter of the driver's groove for this belt. */
  driverPulleyMm: number;
}

export interface ComponentSpec {
  name: string;
  kind: ComponentKind;
  belt?: string;
  pulleyMm?: number;
  /** Outside diameter as measured with calipers (mm); informative, pulleyMm is what the ratios use. */
  outsideMm?: number;
  backside?: boolean;
  fixedRatio?: number;
  overrunning?: boolean;
  bearing?: BearingSpec;
}

export interface DriveDocument {
  name: string;
  cylinders: number;
  firingOrder: number[];
  idleRpm?: number;
  belts: BeltSpec[];
  components: ComponentSpec[];
}

export type Fault = 'shaft' | 'outer_race' | 'inner_race' | 'ball' | 'cage' | 'belt';

/** One line at which a part may show, in crank orders, with its match window. */
export interface CandidateLine {
  /** e.g. 'shaft 1x', 'BPFO 2x', 'BPFI 1x -1x shaft' (sideband), 'belt pass'. */
  label: string;
  fault: Fault;
  /** Harmonic number (1..3) of the defect or shaft line; 0 for sidebands. */
  harmonic: number;
  /** Sideband offset in multiples of the modulating order (-1, +1) or 0 for a carrier. */
  sideband: number;
  nominalOrder: number;
  /** Window in crank orders [lo, hi] before widening by the spectrum's resolution. */
  window: [number, number];
  /** Which spectrum to look in: shaft and belt lines in the raw order spectrum, bearing lines in the envelope. */
  spectrum: 'orders' | 'envelope';
  /** On or within the window of a 0.5-order multiple (engine-synchronous). */
  engineSynchronous: boolean;
  /** Within the slip tolerance of an integer multiple of the part's own shaft order. */
  nearShaftHarmonic: boolean;
  /** How the line moves with slip (see shared/drive/line-windows.ts). */
  role: 'shaft' | 'turning' | 'fixed' | 'belt';
  /** For a sideband: the harmonic of the carrier it flanks and the modulating order's nominal value. */
  carrierHarmonic?: number;
  modulatorOrder?: number;
  /**
   * A carrier of a second reading only: a ball fault's BSF 1×, 3×, 5× (the ball strikes one race
   * harder, or only one; `harmonic` is then 0.5, 1.5, 2.5 of the 2×BSF line), read together with
   * the 2×BSF series as the whole BSF comb, beside the 2×BSF series alone.
   */
  optional?: boolean;
}

export interface ComponentCandidates {
  /** Component name, or the belt's name when target = 'belt'. */
  component: string;
  target: 'component' | 'belt';
  kind: ComponentKind | 'belt';
  /** Nominal crank-to-part speed ratio (sign dropped; backside parts turn the other way). */
  ratio: number;
  /** Bearing factors used (undefined without a bearing); approximate when from a rule of thumb. */
  factors?: BearingFactors;
  approximate: boolean;
  rotatingRing: RotatingRing;
  /** How the part is driven: friction belt, fixed ratio (gear, cam, timing belt) or loosely (overrunning, fan clutch). */
  regime: 'belt' | 'fixed' | 'loose';
  /** Friction-belt stages between the crank and the part (for a belt: its driver); each adds creep. */
  beltStages: number;
  lines: CandidateLine[];
  /** An accepted ratio calibration moved and narrowed this part's lines (issue 20 item 3). */
  calibrated?: { factor: number; uncertainty: number };
}
