/**
 * The drive document: an engine's accessory drive as the `analyze --drive` file and the Drive
 * library's import/export (issue 10 item 5). `DriveDocumentSchema` checks each field's type and
 * range; `parseDriveDocument` adds the rules across fields (unique names, firing order, one
 * crankshaft, belts chained to the crank) and reports every violation with its JSON path.
 * Lengths in millimetres (effective, pitch-line diameters), angles in degrees.
 */
import { z } from 'zod';
import type { DriveDocument } from '../drive/types';
import { driveDocumentRuleIssues, type DriveIssue } from '../drive/drive-rules';

const got = (input: unknown): string => (typeof input === 'number' || typeof input === 'string' ? ` (got ${JSON.stringify(input)})` : '');

const rangeMm = (what: string, lo: number, hi: number) =>
  z.number({ error: `${what} must be a number of millimetres` })
    .refine((v) => Number.isFinite(v), { error: `${what} must be a finite number` })
    .refine((v) => v >= lo && v <= hi, { error: (iss) => `${what} must be between ${lo} and ${hi} mm${got(iss.input)}` });

const positive = (what: string) =>
  z.number({ error: `${what} must be a number` })
    .refine((v) => Number.isFinite(v) && v > 0, { error: (iss) => `${what} must be a positive number${got(iss.input)}` });

const NameSchema = z.string({ error: 'name must be text' }).trim().min(1, { error: 'name must not be empty' }).max(100, { error: 'name must be at most 100 characters' });

/** Entered defect factors, multiples of the turning ring's speed (the cage factor already for that ring). */
export const BearingFactorsSchema = z.strictObject({
  ftf: positive('ftf'),
  bpfo: positive('bpfo'),
  bpfi: positive('bpfi'),
  bsf: positive('bsf'),
});

/** A bearing by designation, by geometry (balls, ballMm, pitchMm, contactDeg) or by entered factors. */
export const BearingSpecSchema = z.strictObject({
  designation: z.string({ error: 'designation must be text, e.g. "6203"' }).trim().min(1, { error: 'designation must not be empty' }).optional(),
  balls: z.number({ error: 'balls must be a whole number' })
    .refine((v) => Number.isInteger(v) && v >= 5 && v <= 30, { error: (iss) => `balls must be a whole number from 5 to 30${got(iss.input)}` })
    .optional(),
  ballMm: rangeMm('ballMm', 1, 40).optional(),
  pitchMm: rangeMm('pitchMm', 2, 400).optional(),
  contactDeg: z.number({ error: 'contactDeg must be a number of degrees' })
    .refine((v) => v >= 0 && v <= 45, { error: (iss) => `contactDeg must be between 0 and 45°${got(iss.input)}` })
    .optional(),
  factors: BearingFactorsSchema.optional(),
  rotatingRing: z.enum(['inner', 'outer'], { error: 'rotatingRing must be "inner" or "outer"' }).optional(),
});

/** A belt: its length and the component (and groove diameter) that drives it. */
export const BeltSpecSchema = z.strictObject({
  name: NameSchema,
  lengthMm: rangeMm('lengthMm', 500, 3000),
  driver: z.string({ error: 'driver must name the component that drives the belt' }).trim().min(1, { error: 'driver must name the component that drives the belt' }),
  driverPulleyMm: rangeMm('driverPulleyMm', 20, 400),
});

/** The component kinds Crankwise knows. */
export const ComponentKindSchema = z.enum(
  ['crankshaft', 'alternator', 'water_pump', 'power_steering', 'ac_compressor', 'idler', 'tensioner', 'fan', 'vacuum_pump', 'other'],
  { error: 'kind must be one of crankshaft, alternator, water_pump, power_steering, ac_compressor, idler, tensioner, fan, vacuum_pump, other' },
);

/** One part of the drive: on a belt (with its effective pulley diameter) or at a fixed ratio. */
export const ComponentSpecSchema = z.strictObject({
  name: NameSchema,
  kind: ComponentKindSchema,
  belt: z.string({ error: 'belt must name one of the drive\'s belts' }).trim().min(1, { error: 'belt must not be empty' }).optional(),
  pulleyMm: rangeMm('pulleyMm', 20, 400).optional(),
  backside: z.boolean({ error: 'backside must be true or false' }).optional(),
  fixedRatio: z.number({ error: 'fixedRatio must be a number' })
    .refine((v) => Number.isFinite(v) && v > 0 && v <= 20, { error: (iss) => `fixedRatio must be above 0 and at most 20${got(iss.input)}` })
    .optional(),
  overrunning: z.boolean({ error: 'overrunning must be true or false' }).optional(),
  bearing: BearingSpecSchema.optional(),
});

/** The whole document, field by field (the rules across fields are in `parseDriveDocument`). */
export const DriveDocumentSchema = z.object({
  name: NameSchema,
  cylinders: z.number({ error: 'cylinders must be a whole number' })
    .refine((v) => Number.isInteger(v) && v >= 1 && v <= 16, { error: (iss) => `cylinders must be a whole number from 1 to 16${got(iss.input)}` }),
  firingOrder: z.array(z.number({ error: 'firing order entries must be cylinder numbers' }), { error: 'firingOrder must be a list of cylinder numbers, e.g. [1, 3, 4, 2]' }),
  idleRpm: z.number({ error: 'idleRpm must be a number' })
    .refine((v) => v >= 300 && v <= 3000, { error: (iss) => `idleRpm must be between 300 and 3000 rpm${got(iss.input)}` })
    .optional(),
  notes: z.string().optional(),
  belts: z.array(BeltSpecSchema, { error: 'belts must be a list (use [] when no part is belt-driven)' }),
  components: z.array(ComponentSpecSchema, { error: 'components must be a list' }),
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
  constructor(issues: DriveDocumentIssue[]) {
    const head = issues.slice(0, 5).map((i) => `${i.path}: ${i.message}`).join('; ');
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
 * Validates a drive document (already JSON-parsed) and returns it typed. Throws a
 * `DriveDocumentError` listing every violation with its JSON path: field types and ranges
 * (pulley 20–400 mm, ball 1–40 mm and below the pitch diameter, 5–30 balls, contact 0–45°,
 * belt 500–3000 mm), names unique (case-insensitive), firing order a permutation of
 * 1..cylinders, exactly one crankshaft, every belt chained to the crank, belt parts with a pulley.
 */
export function parseDriveDocument(json: unknown): DriveDocument {
  const result = DriveDocumentSchema.safeParse(json);
  const issues: DriveDocumentIssue[] = result.success
    ? []
    : result.error.issues.map((issue) => ({ path: jsonPath(issue.path), message: issue.message }));
  issues.push(...driveDocumentRuleIssues(json));
  if (issues.length > 0 || !result.success) {
    throw new DriveDocumentError(issues.length > 0 ? issues : [{ path: '$', message: 'not a drive document' }]);
  }
  return result.data;
}
