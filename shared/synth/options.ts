/**
 * Options of the capture generator (`generateCapture`, `npm run generate`): one zod schema with a
 * default for every field, so the CLI, the tests and the demo data describe a capture the same way.
 * Units are in the names: rpm, percent, degrees of crank angle, hertz, seconds.
 */
import { z } from 'zod';
import type { DriveDocument } from '../drive/types';
// The generator draws exactly the pipeline's reference kinds.
import { RefKindSchema } from '../schemas/analysis-settings';


/** The six fault kinds of the ranking (docs/design.md "Ranking suspects"). */
export const FaultKindSchema = z.enum(['shaft', 'outer_race', 'inner_race', 'ball', 'cage', 'belt']);
export type FaultKind = z.infer<typeof FaultKindSchema>;

/** A trigger-wheel pattern "teeth-missing", e.g. "60-2" (58 teeth on a 6° pitch) or "36-1". */
export const WheelPatternSchema = z.string().regex(/^\d{1,3}-\d{1,2}$/, { error: 'wheel pattern must look like 60-2 or 36-1' })
  .refine((p) => {
    const [pitches, missing] = p.split('-').map(Number);
    return pitches >= 4 && pitches <= 360 && missing >= 1 && missing <= pitches / 4;
  }, { error: 'wheel pattern needs 4–360 pitches and 1 to a quarter of them missing' });

/**
 * One planted fault. `component` names a drive component, or a belt when `fault` is `belt`.
 * `amplitude` (pickup units, the engine's firing-order line being 1.0 × engineLevel) is the peak of
 * one impact for bearing and belt faults, of the 1× sinusoid for a shaft fault; null = a default
 * per kind.
 */
export const PlantedFaultSchema = z.object({
  component: z.string().min(1),
  fault: FaultKindSchema,
  amplitude: z.number().positive().nullable().default(null),
});
export type PlantedFault = z.infer<typeof PlantedFaultSchema>;

/** An injector-like tick: a short burst at a fixed angle in the 720° cycle (0 = cylinder-1 TDC). */
export const InjectorTickSchema = z.object({
  cylinder: z.number().int().min(1),
  angleDeg: z.number().min(0).lt(720),
  amplitude: z.number().min(0),
});
export type InjectorTick = z.infer<typeof InjectorTickSchema>;

/**
 * An impulsive noise source that is not in the drive table: a tick train at a crank order no part
 * has (`order` null = chosen away from every candidate line), or a few random clunks.
 */
export const DistractorSchema = z.object({
  kind: z.enum(['tick-train', 'clunk']),
  amplitude: z.number().positive().nullable().default(null),
  order: z.number().positive().nullable().default(null),
});
export type Distractor = z.infer<typeof DistractorSchema>;

const DriveInputSchema = z.custom<DriveDocument>(
  (v) => typeof v === 'object' && v !== null && Array.isArray((v as DriveDocument).components)
    && Array.isArray((v as DriveDocument).firingOrder) && Number.isInteger((v as DriveDocument).cylinders),
  { error: 'drive must be a drive document (name, cylinders, firingOrder, belts, components)' },
);

/**
 * Everything that describes one generated capture. Conventions:
 * - crank angle 0° is cylinder-1 TDC at the start of its power stroke; the cycle is 720°;
 * - `tdcOffsetDeg` = crank degrees from the reference edge to cylinder-1 TDC, so the reference
 *   edge sits at −tdcOffsetDeg (a spark 10° before TDC: offset 10);
 * - a trigger wheel's reference edge is the first tooth after the gap; the wheel turns with the crank;
 * - `refPerCycle` (when set) draws N evenly spaced ignition-like pulses per 720° instead of `refKind`'s count;
 * - `rpm` null = the drive's idle rpm, else 780; `rpmEnd` (when set) ramps the speed linearly from
 *   `rpm` to it over the capture; `wanderPct` = the largest excursion of slow speed wander;
 * - `rollingSlipPct` null = a seeded value in 1–2 % (cage lag); `resonanceHz` null = seeded 2.5–5.5 kHz;
 * - `snrDb` = planted-fault power over noise power across 0 … fs/2 (see CaptureTruth.snr).
 */
export const GenerateOptionsSchema = z.object({
  drive: DriveInputSchema,
  seed: z.number().int().min(0).max(4294967295).default(1),
  durationS: z.number().min(0.5).max(600).default(10),
  sampleRateHz: z.number().int().min(1000).max(1_000_000).default(48000),
  rpm: z.number().min(300).max(8000).nullable().default(null),
  rpmEnd: z.number().min(300).max(8000).nullable().default(null),
  wanderPct: z.number().min(0).max(10).default(2),
  firingFluctuationPct: z.number().min(0).max(3).default(0.3),
  refKind: RefKindSchema.default('cyl1'),
  refPerCycle: z.number().int().min(1).max(64).nullable().default(null),
  wheel: WheelPatternSchema.default('60-2'),
  wheelSensor: z.enum(['vr', 'hall']).default('vr'),
  refPolarity: z.enum(['rising', 'falling']).default('rising'),
  tdcOffsetDeg: z.number().min(-720).max(720).default(0),
  ringing: z.boolean().default(true),
  wastedSparkRatio: z.number().min(0.1).max(1).default(0.5),
  wastedSparkInverted: z.boolean().default(false),
  camChannel: z.boolean().default(false),
  camLeadDeg: z.number().min(1).max(350).default(30),
  fault: PlantedFaultSchema.nullable().default(null),
  creepPct: z.number().min(0).max(5).default(1),
  rollingSlipPct: z.number().min(0).max(4).nullable().default(null),
  impactJitterPct: z.number().min(0).max(5).default(1),
  snrDb: z.number().min(-20).max(80).default(6),
  injectorTicks: z.array(InjectorTickSchema).nullable().default(null),
  distractor: DistractorSchema.nullable().default(null),
  resonanceHz: z.number().min(500).max(20000).nullable().default(null),
  engineLevel: z.number().min(0).max(100).default(1),
  /**
   * 'today': the generator as it has been (one resonance, fixed sideband depths, no healthy shaft
   * lines, identical combustion cycles), so older sweeps can be rerun; 'real': closer to real
   * engines (shared/synth/realism.ts).
   */
  realism: z.enum(['today', 'real']).default('today'),
}).refine((o) => !(o.refKind === 'wheel' && o.refPerCycle !== null), {
  error: 'refPerCycle draws ignition-like pulses; it cannot be combined with refKind "wheel"', path: ['refPerCycle'],
});

/** Parsed options (every default filled in). */
export type GenerateOptions = z.infer<typeof GenerateOptionsSchema>;
/** Options as a caller writes them (only `drive` is required). */
export type GenerateOptionsInput = z.input<typeof GenerateOptionsSchema>;

/** Parses "60-2" into its pitch count and missing teeth. */
export function parseWheelPattern(pattern: string): { pitches: number; missing: number } {
  const parsed = WheelPatternSchema.safeParse(pattern);
  if (!parsed.success) throw new RangeError(`wheel pattern must look like 60-2 or 36-1, got "${pattern}"`);
  const [pitches, missing] = pattern.split('-').map(Number);
  return { pitches, missing };
}
