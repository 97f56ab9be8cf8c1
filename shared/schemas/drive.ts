/**
 * The drive document: an engine's accessory drive as the `analyze --drive` file and the Drive
 * library's import/export (issue 10 item 5, issue 17). `DriveDocumentSchema` checks each field's
 * type and range; `parseDriveDocument` adds the rules across fields (unique names, firing order,
 * one crankshaft, belts chained to the crank, at most 4 belt stages and an overall ratio of
 * 0.1–20) and reports every violation with its JSON path and a message in the user's words
 * ("Pulley diameter must be between 20 and 400 mm"). Lengths in millimetres (effective, pitch-line
 * diameters), angles in degrees.
 */
import { z } from 'zod';
import type { DriveDocument } from '../drive/types';
import { driveDocumentRuleIssues, type DriveIssue } from '../drive/drive-rules';
import { nameSchema } from './names';

/** At most this many components per engine (a real accessory drive has about 4 to 12). */
export const MAX_COMPONENTS = 64;
/** At most this many belts per engine. */
export const MAX_BELTS = 8;

const got = (input: unknown): string => (typeof input === 'number' || typeof input === 'string' ? ` (got ${JSON.stringify(input)})` : '');

const rangeMm = (what: string, lo: number, hi: number) =>
  z.number({ error: `${what} must be a number of millimetres` })
    .refine((v) => Number.isFinite(v), { error: `${what} must be a finite number` })
    .refine((v) => v >= lo && v <= hi, { error: (iss) => `${what} must be between ${lo} and ${hi} mm${got(iss.input)}` });

const positive = (what: string) =>
  z.number({ error: `${what} must be a number` })
    .refine((v) => Number.isFinite(v) && v > 0, { error: (iss) => `${what} must be a positive number${got(iss.input)}` });

/** Entered defect factors, multiples of the turning ring's speed (the cage factor already for that ring). */
export const BearingFactorsSchema = z.strictObject({
  ftf: positive('The FTF factor'),
  bpfo: positive('The BPFO factor'),
  bpfi: positive('The BPFI factor'),
  bsf: positive('The BSF factor'),
}, { error: 'Give the factors as ftf, bpfo, bpfi and bsf' });

/** A bearing by designation, by geometry (balls, ballMm, pitchMm, contactDeg) or by entered factors; `source` says where the geometry comes from. */
export const BearingSpecSchema = z.strictObject({
  designation: nameSchema('The bearing designation', 40).optional(),
  balls: z.number({ error: 'The number of balls must be a whole number' })
    .refine((v) => Number.isInteger(v) && v >= 5 && v <= 30, { error: (iss) => `The number of balls must be a whole number from 5 to 30${got(iss.input)}` })
    .optional(),
  ballMm: rangeMm('Ball diameter', 1, 40).optional(),
  pitchMm: rangeMm('Pitch diameter', 2, 400).optional(),
  contactDeg: z.number({ error: 'Contact angle must be a number of degrees' })
    .refine((v) => v >= 0 && v <= 45, { error: (iss) => `Contact angle must be between 0 and 45°${got(iss.input)}` })
    .optional(),
  factors: BearingFactorsSchema.optional(),
  rotatingRing: z.enum(['inner', 'outer'], { error: 'The turning ring must be inner or outer' }).optional(),
  source: z.enum(['published', 'measured', 'estimated'], { error: 'The bearing source must be published, measured or estimated' }).optional(),
}, { error: 'The bearing has a field Crankwise does not know' });

/** A belt: its length and the component (and groove diameter) that drives it. */
export const BeltSpecSchema = z.strictObject({
  name: nameSchema('The belt name'),
  lengthMm: rangeMm('Belt length', 500, 3000),
  driver: z.string({ error: 'Choose the part whose groove drives the belt' }).trim().min(1, { error: 'Choose the part whose groove drives the belt' }),
  driverPulleyMm: rangeMm('Driver groove diameter', 20, 400),
}, { error: 'The belt has a field Crankwise does not know' });

/** The component kinds Crankwise knows. */
export const ComponentKindSchema = z.enum(
  ['crankshaft', 'alternator', 'water_pump', 'power_steering', 'ac_compressor', 'idler', 'tensioner', 'fan', 'vacuum_pump', 'other'],
  { error: 'The kind must be one of crankshaft, alternator, water_pump, power_steering, ac_compressor, idler, tensioner, fan, vacuum_pump, other' },
);

/** One part of the drive: on a belt (with its effective pulley diameter) or at a fixed ratio. */
export const ComponentSpecSchema = z.strictObject({
  name: nameSchema('The part name'),
  kind: ComponentKindSchema,
  belt: z.string({ error: 'Choose one of the engine\'s belts' }).trim().min(1, { error: 'Choose one of the engine\'s belts' }).optional(),
  pulleyMm: rangeMm('Pulley diameter', 20, 400).optional(),
  outsideMm: rangeMm('Measured outside diameter', 15, 400).optional(),
  backside: z.boolean({ error: 'Backside must be yes or no' }).optional(),
  fixedRatio: z.number({ error: 'The fixed ratio must be a number' })
    .refine((v) => Number.isFinite(v) && v >= 0.1 && v <= 20, { error: (iss) => `The fixed ratio must be between 0.1 and 20${got(iss.input)}` })
    .optional(),
  overrunning: z.boolean({ error: 'Overrunning must be yes or no' }).optional(),
  bearing: BearingSpecSchema.optional(),
}, { error: 'The part has a field Crankwise does not know' });

/** The whole document, field by field (the rules across fields are in `parseDriveDocument`). */
export const DriveDocumentSchema = z.object({
  name: nameSchema('The engine name'),
  cylinders: z.number({ error: 'Cylinders must be a whole number' })
    .refine((v) => Number.isInteger(v) && v >= 1 && v <= 16, { error: (iss) => `Cylinders must be a whole number from 1 to 16${got(iss.input)}` }),
  firingOrder: z.array(z.number({ error: 'The firing order lists cylinder numbers' }), { error: 'Write the firing order as cylinder numbers, e.g. 1-3-4-2' }).max(16, { error: 'The firing order lists at most 16 cylinders' }),
  idleRpm: z.number({ error: 'Idle speed must be a number of rpm' })
    .refine((v) => v >= 300 && v <= 3000, { error: (iss) => `Idle speed must be between 300 and 3000 rpm${got(iss.input)}` })
    .optional(),
  notes: z.string().max(2000, { error: 'Notes can be at most 2000 characters' }).optional(),
  belts: z.array(BeltSpecSchema, { error: 'Belts must be a list (empty when no part is belt-driven)' })
    .max(MAX_BELTS, { error: `An engine can have at most ${MAX_BELTS} belts` }),
  components: z.array(ComponentSpecSchema, { error: 'Parts must be a list' })
    .max(MAX_COMPONENTS, { error: `An engine can have at most ${MAX_COMPONENTS} parts` }),
});

/** A parsed drive document (identical to `DriveDocument` in shared/drive/types.ts, plus optional notes). */
export type DriveDocumentParsed = z.infer<typeof DriveDocumentSchema>;

// Compile-time check that the schema and the hand-written type agree.
const agreesWithType: (d: DriveDocumentParsed) => DriveDocument = (d) => d;
void agreesWithType;

/** One violation: a JSON path such as `components[2].pulleyMm` ("$" for the whole document) and what to fix. */
export type DriveDocumentIssue = DriveIssue;

/** Thrown by `parseDriveDocument`; `issues` lists every violation, not just the first. */
export class DriveDocumentError extends Error {
  readonly issues: DriveDocumentIssue[];
  constructor(issues: DriveDocumentIssue[], json?: unknown) {
    const head = issues.slice(0, 5).map((i) => `${describeDrivePath(i.path, json)}: ${i.message}`).join('; ');
    super(`The drive document has ${issues.length} problem${issues.length === 1 ? '' : 's'}: ${head}${issues.length > 5 ? '; …' : ''}`);
    this.name = 'DriveDocumentError';
    this.issues = issues;
  }
}

/** Formats a zod path as a JSON path: ['components', 2, 'pulleyMm'] → `components[2].pulleyMm`. */
export function jsonPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const key of path) {
    if (typeof key === 'number') out += `[${key}]`;
    else out += out === '' ? String(key) : `.${String(key)}`;
  }
  return out === '' ? '$' : out;
}

/**
 * Where a JSON path points, in the user's words: `components[2].pulleyMm` → `part 3 "Alternator"`,
 * `belts[0].driver` → `belt 1 "Main"`, `name` → `the engine`.
 */
export function describeDrivePath(path: string, json?: unknown): string {
  const m = /^(components|belts)\[(\d+)\]/.exec(path);
  if (!m) return 'the engine';
  const i = Number(m[2]);
  const list = json && typeof json === 'object' ? (json as Record<string, unknown>)[m[1]] : undefined;
  const item = Array.isArray(list) ? list[i] : undefined;
  const name = item && typeof item === 'object' && typeof (item as { name?: unknown }).name === 'string' ? (item as { name: string }).name.trim() : '';
  return `${m[1] === 'components' ? 'part' : 'belt'} ${i + 1}${name ? ` "${name}"` : ''}`;
}

/**
 * Validates a drive document (already JSON-parsed) and returns it typed. Throws a
 * `DriveDocumentError` listing every violation with its JSON path: field types and ranges
 * (pulley 20–400 mm, ball 1–40 mm and below the pitch diameter, 5–30 balls, contact 0–45°,
 * belt 500–3000 mm), at most 8 belts and 64 parts, names unique (ignoring case and accents),
 * firing order a permutation of 1..cylinders, exactly one crankshaft, every belt chained to the
 * crank in at most 4 stages, belt parts with a pulley, every ratio 0.1–20.
 */
export function parseDriveDocument(json: unknown): DriveDocument {
  const result = DriveDocumentSchema.safeParse(json);
  const issues: DriveDocumentIssue[] = result.success
    ? []
    : result.error.issues.map((issue) => ({ path: jsonPath(issue.path), message: issue.message }));
  // The rules across rows are skipped for an oversized list: its cap is the one thing to fix.
  const oversized = issues.some((i) => (i.path === 'components' || i.path === 'belts') && /at most/.test(i.message));
  if (!oversized) issues.push(...driveDocumentRuleIssues(json));
  if (issues.length > 0 || !result.success) {
    throw new DriveDocumentError(issues.length > 0 ? issues : [{ path: '$', message: 'This is not a drive document' }], json);
  }
  return result.data;
}
