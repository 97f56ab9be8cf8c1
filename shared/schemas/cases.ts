/**
 * Request and response shapes of the Cases API (/api/cases, docs/api.md). A case is one repair
 * order (DESIGN.md "Case"): RO number, vehicle, engine from the Drive library, complaint, assigned
 * technician and lead, the service advisor, a status that moves only as CASE_MOVES allows, and an
 * append-only timeline. The client's forms and the server's validate() parse the same schemas.
 */
import { z } from 'zod';
import { EmailSchema } from './common';

/** Case statuses in their usual order (DESIGN.md "Case"). */
export const CASE_STATUSES = ['open', 'testing', 'ranked', 'confirmed', 'verified', 'closed'] as const;
export const CaseStatusSchema = z.enum(CASE_STATUSES);
export type CaseStatus = z.infer<typeof CaseStatusSchema>;

/**
 * Every legal status move, from → allowed targets. `open → testing` happens by itself on the
 * first capture; `testing → ranked` when the before-repair captures are marked complete; the
 * others are a lead's (or admin's) action. Any other move is refused with 409 `illegal_move`.
 */
export const CASE_MOVES: Record<CaseStatus, readonly CaseStatus[]> = {
  open: ['testing'],
  testing: ['ranked'],
  ranked: ['confirmed', 'testing'],
  confirmed: ['verified', 'testing'],
  verified: ['closed'],
  closed: [],
};

/** Whether a case may move from one status to another. */
export function canMove(from: CaseStatus, to: CaseStatus): boolean {
  return CASE_MOVES[from].includes(to);
}

const text = (max: number, what: string) => z.string().trim().max(max, { message: `${what}: use at most ${max} characters` });
const optionalId = z.number().int().positive().max(2_147_483_647).nullable();

/** A VIN: 17 characters, letters and digits without I, O and Q (ISO 3779); stored upper-case. */
export const VinSchema = z
  .string()
  .trim()
  .transform((s) => s.toUpperCase())
  .pipe(z.string().regex(/^[A-HJ-NPR-Z0-9]{17}$/, { message: 'A VIN has 17 letters and digits (no I, O or Q); leave it empty if unknown' }));

/** The vehicle of a case. */
export const VehicleSchema = z.object({
  year: z.number().int().min(1950, { message: 'Year must be 1950 or later' }).max(2100, { message: 'Year must be 2100 or earlier' }).nullable().default(null),
  make: text(60, 'Make').min(1, { message: 'Enter the make' }),
  model: text(60, 'Model').min(1, { message: 'Enter the model' }),
  vin: z.union([z.literal('').transform(() => null), VinSchema]).nullable().default(null),
  odometer: z.number().int().min(0).max(3_000_000, { message: 'Odometer reading looks too large' }).nullable().default(null),
  odometerUnit: z.enum(['km', 'mi']).default('km'),
});
export type Vehicle = z.infer<typeof VehicleSchema>;

/** POST /api/cases. */
export const CreateCaseSchema = z.object({
  roNumber: text(40, 'RO number').min(1, { message: 'Enter the repair order number' }),
  vehicle: VehicleSchema,
  /** Engine from the Drive library; may be chosen later, but a case cannot be ranked without one. */
  engineId: optionalId.default(null),
  complaint: text(2000, 'Complaint').min(1, { message: 'Describe the noise the customer reports' }),
  /** Assigned technician (any active user of the shop); defaults to the creator. */
  technicianId: optionalId.optional(),
  /** Lead technician who confirms the cause and gets the "ranked" e-mail (a lead or admin). */
  leadId: optionalId.default(null),
  advisorName: text(100, 'Service advisor').default(''),
  advisorEmail: z.union([z.literal(''), EmailSchema]).default(''),
});
export type CreateCase = z.infer<typeof CreateCaseSchema>;
export type CreateCaseInput = z.input<typeof CreateCaseSchema>;

/** PATCH /api/cases/:id: any subset of the create fields plus the version read (409 `stale_write` when it moved on). */
export const UpdateCaseSchema = z.object({
  version: z.number().int().min(0),
  roNumber: text(40, 'RO number').min(1, { message: 'Enter the repair order number' }).optional(),
  vehicle: VehicleSchema.optional(),
  engineId: optionalId.optional(),
  complaint: text(2000, 'Complaint').min(1, { message: 'Describe the noise the customer reports' }).optional(),
  technicianId: optionalId.optional(),
  leadId: optionalId.optional(),
  advisorName: text(100, 'Service advisor').optional(),
  advisorEmail: z.union([z.literal(''), EmailSchema]).optional(),
});
export type UpdateCase = z.infer<typeof UpdateCaseSchema>;

/** Sort keys of the cases table; a leading minus sorts descending. */
export const CASE_SORTS = ['updatedAt', '-updatedAt', 'createdAt', '-createdAt', 'roNumber', '-roNumber', 'status', '-status'] as const;

/** GET /api/cases query. `status` may list several, comma-separated (`?status=open,testing`). */
export const CaseListQuerySchema = z.object({
  status: z
    .string()
    .trim()
    .max(100)
    .default('')
    .transform((s) => (s === '' ? [] : s.split(',').map((x) => x.trim())))
    .pipe(z.array(CaseStatusSchema, { message: `status must be one or more of ${CASE_STATUSES.join(', ')}` })),
  technicianId: z.coerce.number().int().positive().optional(),
  leadId: z.coerce.number().int().positive().optional(),
  /** Searched in RO number, vehicle (year, make, model, VIN) and complaint. */
  search: z.string().trim().max(100, { message: 'Use at most 100 characters' }).default(''),
  sort: z.enum(CASE_SORTS, { message: `sort must be one of ${CASE_SORTS.join(', ')}` }).default('-updatedAt'),
  page: z.coerce.number().int().min(1, { message: 'page starts at 1' }).default(1),
  pageSize: z.coerce.number().int().min(1).max(100, { message: 'pageSize must be 1–100' }).default(20),
});
export type CaseListQuery = z.infer<typeof CaseListQuerySchema>;

/** A note with a decision (dismiss, restore, confirm, re-open, verify, close). */
export const NoteSchema = text(2000, 'Note');

/** POST /api/cases/:id/reopen, /verify, /close: an optional note. */
export const CaseMoveSchema = z.object({ note: NoteSchema.default('') });
export type CaseMove = z.infer<typeof CaseMoveSchema>;

/**
 * POST /api/cases/:id/confirm: a suspect of the ranking (`findingId`), or a part not in the list
 * (`component`, with an optional `fault`), always with a note.
 */
export const ConfirmCauseSchema = z
  .object({
    findingId: z.number().int().positive().optional(),
    component: text(100, 'Part').min(1).optional(),
    fault: z.enum(['shaft', 'outer_race', 'inner_race', 'ball', 'cage', 'belt']).optional(),
    note: NoteSchema.min(1, { message: 'Say why this is the cause' }),
  })
  .refine((b) => (b.findingId === undefined) !== (b.component === undefined), {
    message: 'Choose one suspect (findingId) or name a part not in the list (component)',
    path: ['findingId'],
  });
export type ConfirmCause = z.infer<typeof ConfirmCauseSchema>;

/** POST /api/findings/:id/dismiss and /restore. */
export const FindingDecisionSchema = z.object({ note: NoteSchema.min(1, { message: 'Add a note saying why' }) });
export type FindingDecision = z.infer<typeof FindingDecisionSchema>;

// ---- responses -------------------------------------------------------------------------------

/** A user as a case shows them. */
export interface PersonDto { id: number; name: string; role: string }

/** One row of the cases table (GET /api/cases). */
export interface CaseListItemDto {
  id: number;
  roNumber: string;
  status: CaseStatus;
  vehicle: Vehicle;
  /** "2019 Nordfahrt Kestrel" for display. */
  vehicleLabel: string;
  complaint: string;
  engine: { id: number; name: string } | null;
  technician: PersonDto | null;
  lead: PersonDto | null;
  captureCount: number;
  /** The highest-ranked suspect not dismissed, once ranked. */
  topSuspect: { component: string; fault: string; score: number } | null;
  createdAt: string;
  updatedAt: string;
  version: number;
}

/** GET /api/cases. */
export interface CaseListResponse { items: CaseListItemDto[]; total: number; page: number; pageSize: number }

/** Kinds of timeline entries (append-only). */
export const TIMELINE_KINDS = [
  'created', 'updated', 'capture_added', 'capture_deleted', 'analysis_done', 'analysis_failed', 'ranked', 're_ranked',
  'suspect_dismissed', 'suspect_restored', 'confirmed', 'reopened', 'verified', 'closed', 'report_sent',
] as const;
export type TimelineKind = (typeof TIMELINE_KINDS)[number];

/** One timeline entry. `actor` is null for what the system did (an analysis finishing). */
export interface TimelineEntryDto {
  id: number;
  at: string;
  kind: TimelineKind;
  actor: PersonDto | null;
  /** One sentence for display, e.g. "Dana Ferreira dismissed Idler outer race: belt was off". */
  message: string;
  note: string | null;
  /** Ids the entry is about (captureId, analysisId, findingId…). */
  data: Record<string, unknown>;
}

/** GET /api/cases/:id → { case }. */
export interface CaseDto extends CaseListItemDto {
  advisorName: string;
  advisorEmail: string;
  /** Statuses the case may move to next (by anyone; the role decides further). */
  allowedMoves: CaseStatus[];
  /** Whether "captures complete" would rank now, and if not, why (for the button's hint). */
  rankable: { ok: boolean; reason: string | null };
  captures: import('./captures').CaptureDto[];
  findings: import('./analyses').FindingDto[];
  timeline: TimelineEntryDto[];
  /** The confirmed cause, once confirmed. */
  confirmed: { component: string; fault: string | null; findingId: number | null; note: string; by: PersonDto | null; at: string } | null;
}

/** GET /api/cases/people: who can be assigned as technician or lead. */
export interface CasePeopleResponse { technicians: PersonDto[]; leads: PersonDto[] }
