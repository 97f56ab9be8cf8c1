/**
 * A shop's own settings (Shop setup, admin only): the report header (name, address, phone), who a
 * new case goes to (default lead, service advisor's e-mail), the run-level analysis defaults that
 * describe the shop's equipment, the diameter offsets that turn a measured outside diameter into
 * an effective one (shared/drive/measured-diameter.ts), and the unit pulleys are entered in.
 */
import { z } from 'zod';
import { AnalysisSettingsSchema, EnvelopeBandSettingSchema } from './analysis-settings';
import { ShopNameSchema } from './setup';
import { DEFAULT_BACKSIDE_OFFSET_MM, DEFAULT_GROOVED_OFFSET_MM } from '../drive/measured-diameter';

/** Free text on one line: no control characters, trimmed, at most `max` characters. */
const lineText = (what: string, max: number) =>
  z.string({ error: `${what} must be text` })
    .trim()
    .max(max, { error: `${what} can be at most ${max} characters` })
    // eslint-disable-next-line no-control-regex
    .refine((s) => !/[\u0000-\u001f\u007f]/.test(s), { error: `${what} must be on one line, without control characters` });

/** An optional e-mail address: empty means none. */
const optionalEmail = (what: string) =>
  z.string().trim().max(254, { error: `${what} can be at most 254 characters` })
    .refine((s) => s === '' || z.email().safeParse(s).success, { error: `${what} must be an e-mail address such as advisor@example.com, or empty` })
    .transform((s) => s.toLowerCase());

const offsetMm = (what: string) =>
  z.number({ error: `${what} must be a number of millimetres` })
    .refine((v) => Number.isFinite(v) && v >= -10 && v <= 10, { error: `${what} must be between -10 and 10 mm` });

const shape = AnalysisSettingsSchema.shape;

/**
 * Run-level analysis defaults a shop sets once for its equipment: the envelope band limits, the
 * samples per revolution and the revolutions per block (defaults and ranges from
 * `AnalysisSettingsSchema`, the one source of defaults).
 */
export const ShopAnalysisDefaultsSchema = z.object({
  envelopeBand: EnvelopeBandSettingSchema.default('auto'),
  envelopeMaxHz: shape.envelopeMaxHz,
  samplesPerRev: shape.samplesPerRev,
  revsPerBlock: shape.revsPerBlock,
});
/** The shop's analysis defaults, parsed. */
export type ShopAnalysisDefaults = z.infer<typeof ShopAnalysisDefaultsSchema>;

/** Units pulley diameters are entered and shown in. */
export const PulleyUnitSchema = z.enum(['mm', 'inch'], { error: 'units must be mm or inch' });
/** `mm` or `inch`. */
export type PulleyUnit = z.infer<typeof PulleyUnitSchema>;

/** PUT /api/shop/settings: every field of Shop setup. */
export const ShopSettingsSchema = z.strictObject({
  name: ShopNameSchema,
  address: lineText('The address', 300).default(''),
  phone: lineText('The phone number', 40).default(''),
  defaultLeadId: z.number().int().positive().nullable().default(null),
  serviceAdvisorEmail: optionalEmail("The service advisor's e-mail").default(''),
  analysisDefaults: ShopAnalysisDefaultsSchema.default(ShopAnalysisDefaultsSchema.parse({})),
  groovedOffsetMm: offsetMm('The grooved-pulley offset').default(DEFAULT_GROOVED_OFFSET_MM),
  backsideOffsetMm: offsetMm('The backside-pulley offset').default(DEFAULT_BACKSIDE_OFFSET_MM),
  pulleyUnit: PulleyUnitSchema.default('mm'),
});
/** The settings as saved. */
export type ShopSettings = z.infer<typeof ShopSettingsSchema>;
/** The settings as a form or a request gives them. */
export type ShopSettingsInput = z.input<typeof ShopSettingsSchema>;

/** GET /api/shop/settings → { settings }: the saved settings plus what the page shows beside them. */
export interface ShopSettingsDto extends ShopSettings {
  id: number;
  isDemo: boolean;
  /** Leads and admins of the shop, for the default-lead choice. */
  leads: { id: number; name: string }[];
}
