/**
 * The capture upload contract (issue 15 item 2, docs/api.md): `POST /api/cases/:id/captures`
 * takes multipart with one `metadata` field — a JSON array, index-aligned with the files, sent
 * BEFORE them — and one or several `files`. Each entry says what the technician recorded: the
 * role, scale and unit of every channel, the reference, the sensor, the probe point, the engine's
 * condition (what rankCase reads), the phase and the source. `captureSettings` turns an entry into
 * the capture tier of the analysis settings (defaults → engine → shop → capture → this run).
 */
import { z } from 'zod';
import { type AnalysisSettingsInput, RefKindSchema } from './analysis-settings';

/** What a channel carries. `unused` channels are read but ignored. */
export const ChannelRoleSchema = z.enum(['reference', 'pickup', 'cam', 'unused']);
export type ChannelRole = z.infer<typeof ChannelRoleSchema>;

/** One channel: role, scale (unit per volt or per count as the file stores it) and unit after scaling. */
export const ChannelSpecSchema = z.object({
  role: ChannelRoleSchema,
  scale: z.number().finite().refine((v) => v !== 0, 'a channel scale cannot be 0').refine((v) => Math.abs(v) <= 1e6, 'channel scale looks too large').default(1),
  unit: z.string().trim().max(20, { message: 'unit: use at most 20 characters' }).default('V'),
});
export type ChannelSpec = z.infer<typeof ChannelSpecSchema>;

/** The engine-speed reference as wired; `null` in the metadata means the capture has none. */
export const ReferenceSpecSchema = z.object({
  kind: RefKindSchema.default('cyl1'),
  /** Trigger-wheel pattern, e.g. 60-2 (only for kind 'wheel'). */
  wheel: z.string().regex(/^\d{1,3}-\d{1,2}$/, 'wheel pattern must look like 60-2 (tooth positions-missing teeth)').optional(),
  /** Evenly spaced pulses per 720° cycle when not implied by the kind. */
  perCycle: z.number().int().min(1).max(64).nullable().default(null),
  polarity: z.enum(['rising', 'falling', 'auto']).default('auto'),
  /** Crank degrees from the reference edge to cylinder-1 TDC. */
  tdcOffsetDeg: z.number().min(-720).max(720).default(0),
});
export type ReferenceSpec = z.infer<typeof ReferenceSpecSchema>;

/** The pickup's sensor. */
export const SensorKindSchema = z.enum(['accelerometer', 'piezo_contact', 'microphone', 'other']);
export type SensorKind = z.infer<typeof SensorKindSchema>;

/** Where the probe touched: free text plus the nearest drive component of the case's engine (by name). */
export const ProbePointSchema = z.object({
  label: z.string().trim().min(1, { message: 'Say where the probe was (e.g. "alternator front housing")' }).max(100, { message: 'probe point: use at most 100 characters' }),
  component: z.string().trim().max(100).nullable().default(null),
});
export type ProbePoint = z.infer<typeof ProbePointSchema>;

/** The engine's condition during the capture (what rankCase reads). */
export const CaptureConditionSchema = z
  .object({
    speed: z.enum(['idle', 'held']).default('idle'),
    heldRpm: z.number().int().min(300).max(8000).optional(),
    acClutch: z.enum(['on', 'off', 'unknown']).default('unknown'),
    electricalLoad: z.enum(['on', 'off', 'unknown']).default('unknown'),
    beltOff: z.boolean().default(false),
  })
  .refine((c) => c.speed !== 'held' || c.heldRpm !== undefined, { message: 'Give the held rpm', path: ['heldRpm'] });
export type CaptureCondition = z.infer<typeof CaptureConditionSchema>;

export const CapturePhaseSchema = z.enum(['before', 'after_repair']);
export type CapturePhase = z.infer<typeof CapturePhaseSchema>;

/** Metadata of one uploaded file. At most one reference, one pickup and one cam channel. */
export const CaptureMetadataSchema = z
  .object({
    /** One entry per channel of the file, channel 1 first (at least the pickup). */
    channels: z.array(ChannelSpecSchema).min(1, { message: 'Describe at least the pickup channel' }).max(8, { message: 'At most 8 channels' }),
    /** The reference; null when the capture has none (speed is then read from the pickup, issue 20; `speed_unreadable` when it cannot be). */
    reference: ReferenceSpecSchema.nullable().default({ kind: 'cyl1', perCycle: null, polarity: 'auto', tdcOffsetDeg: 0 }),
    sensorKind: SensorKindSchema.default('accelerometer'),
    probePoint: ProbePointSchema,
    condition: CaptureConditionSchema.default({ speed: 'idle', acClutch: 'unknown', electricalLoad: 'unknown', beltOff: false }),
    phase: CapturePhaseSchema.default('before'),
    source: z.enum(['upload', 'recording']).default('upload'),
  })
  .superRefine((m, ctx) => {
    const count = (r: ChannelRole) => m.channels.filter((c) => c.role === r).length;
    for (const r of ['reference', 'pickup', 'cam'] as const) {
      if (count(r) > 1) ctx.addIssue({ code: 'custom', path: ['channels'], message: `Only one channel can be the ${r}` });
    }
    if (count('pickup') === 0) ctx.addIssue({ code: 'custom', path: ['channels'], message: 'Mark which channel is the pickup' });
    if (m.reference && count('reference') === 0) {
      ctx.addIssue({ code: 'custom', path: ['reference'], message: 'Mark which channel is the reference, or set reference to null when there is none' });
    }
    if (m.reference?.kind === 'wheel' && !m.reference.wheel) {
      ctx.addIssue({ code: 'custom', path: ['reference', 'wheel'], message: 'Give the trigger-wheel pattern, e.g. 60-2' });
    }
  });
export type CaptureMetadata = z.infer<typeof CaptureMetadataSchema>;
export type CaptureMetadataInput = z.input<typeof CaptureMetadataSchema>;

/** Files per upload request. */
export const MAX_FILES_PER_UPLOAD = 8;

/** The `metadata` field: a JSON array index-aligned with the files. */
export const UploadMetadataSchema = z.array(CaptureMetadataSchema).min(1, { message: 'metadata needs one entry per file' }).max(MAX_FILES_PER_UPLOAD, { message: `At most ${MAX_FILES_PER_UPLOAD} files per upload` });
export type UploadMetadata = z.infer<typeof UploadMetadataSchema>;

/** POST /api/captures/:id/analyses: re-analyse with other settings (the "this run" tier); the older analysis is kept. */
export const ReanalyzeSchema = z.object({
  settings: z.record(z.string(), z.unknown()).default({}),
});
export type Reanalyze = z.infer<typeof ReanalyzeSchema>;

/**
 * The capture tier of the analysis settings from its metadata: channel numbers are 1-based from
 * the roles, scales per channel, the reference kind, pattern, polarity and TDC offset.
 */
export function captureSettings(m: CaptureMetadata): AnalysisSettingsInput {
  const channelOf = (r: ChannelRole) => {
    const i = m.channels.findIndex((c) => c.role === r);
    return i < 0 ? undefined : i + 1;
  };
  const out: AnalysisSettingsInput = { channelScales: m.channels.map((c) => c.scale) };
  const ref = channelOf('reference');
  const pickup = channelOf('pickup');
  if (ref !== undefined) out.refChannel = ref;
  if (pickup !== undefined) out.pickupChannel = pickup;
  out.camChannel = channelOf('cam') ?? null;
  if (m.reference) {
    out.refKind = m.reference.kind;
    if (m.reference.wheel) out.wheel = m.reference.wheel;
    out.refPerCycle = m.reference.perCycle;
    out.refPolarity = m.reference.polarity;
    out.tdcOffsetDeg = m.reference.tdcOffsetDeg;
  } else {
    // No reference (issue 20 item 2): speed is read from the pickup's firing-order line, near the held rpm when given.
    out.speedSource = 'pickup';
    if (m.condition.speed === 'held' && m.condition.heldRpm !== undefined) out.expectedRpm = m.condition.heldRpm;
  }
  return out;
}

// ---- responses -------------------------------------------------------------------------------

/** One capture of a case, with its current analysis. */
export interface CaptureDto {
  id: number;
  caseId: number;
  /** Cleaned original file name, for display only. */
  originalName: string;
  /** Recognised from the content. */
  format: 'wav' | 'csv';
  byteSize: number;
  sha256: string;
  /** From the structure check (WAV header) or the analysis; null until known. */
  sampleRateHz: number | null;
  channelCount: number | null;
  durationS: number | null;
  metadata: CaptureMetadata;
  uploadedBy: { id: number; name: string; role: string } | null;
  createdAt: string;
  /** The current analysis (the latest run); null never happens after upload. */
  analysis: import('./analyses').AnalysisDto | null;
  /** Analyses of this capture, newest first (ids and status only). */
  analysisIds: number[];
}

/** POST /api/cases/:id/captures → 201. */
export interface UploadResponse { captures: CaptureDto[] }
