import { z } from 'zod';

/**
 * Settings of one analysis run: the single source of defaults for the CLI, the workers and the
 * web app (DEVELOPERS.md "Signal processing in shared/"). Parse every settings object through `AnalysisSettingsSchema` so the
 * command line and the UI give identical results. Channels are 1-based (channel 1 = the first
 * data column after time, or the first interleaved WAV channel). Orders are multiples of crank
 * speed; angles are crank degrees.
 */

const isPowerOfTwo = (n: number) => Number.isInteger(n) && n > 0 && (n & (n - 1)) === 0;

/** Reference kinds: one pulse per engine cycle, one per revolution, one per cylinder, or a trigger wheel. */
export const RefKindSchema = z.enum(['cyl1', 'per-rev', 'per-cylinder', 'wheel']);
export type RefKind = z.infer<typeof RefKindSchema>;

/** Band for the envelope: 'auto' (chosen by spectral kurtosis) or [lo, hi] in Hz. */
export const EnvelopeBandSettingSchema = z.union([
  z.literal('auto'),
  z
    .tuple([z.number().min(0), z.number().positive()])
    .refine(([lo, hi]) => hi > lo, { message: 'envelope band upper edge must exceed the lower edge' }),
]);

export const AnalysisSettingsSchema = z
  .object({
    /** 1-based channel holding the engine-speed reference. */
    refChannel: z.number().int().min(1).max(8).default(1),
    /** 1-based channel holding the vibration pickup. */
    pickupChannel: z.number().int().min(1).max(8).default(2),
    /** 1-based channel of an optional cam signal (one pulse per cycle) that resolves the 720° phase; null = none. */
    camChannel: z.number().int().min(1).max(8).nullable().default(null),
    refKind: RefKindSchema.default('cyl1'),
    /** N evenly spaced reference pulses per 720° cycle; overrides the count implied by refKind (not for 'wheel'). */
    refPerCycle: z.number().int().min(1).max(64).nullable().default(null),
    /** Trigger-wheel pattern "teeth-missing", e.g. 60-2 or 36-1 (tooth positions, missing teeth). */
    wheel: z
      .string()
      .regex(/^\d{1,3}-\d{1,2}$/, 'wheel pattern must look like 60-2 (tooth positions-missing teeth)')
      .refine((s) => {
        const [n, m] = s.split('-').map(Number);
        return n >= 4 && n <= 720 && m >= 1 && m < n / 2;
      }, 'wheel pattern needs at least 4 tooth positions and fewer missing teeth than half of them')
      .default('60-2'),
    /** Edge polarity of the reference pulse; 'auto' takes the side with the larger pulses. */
    refPolarity: z.enum(['rising', 'falling', 'auto']).default('auto'),
    /** Crank degrees from the reference edge (wheel: first tooth after the gap) to cylinder-1 TDC. */
    tdcOffsetDeg: z.number().min(-720).max(720).default(0),
    cylinders: z.number().int().min(1).max(16).default(4),
    /** Firing order (permutation of 1..cylinders); null = the common order for the cylinder count (with a warning). */
    firingOrder: z.array(z.number().int().min(1).max(16)).nullable().default(null),
    /** Highest crank order reported in the order and envelope spectra. */
    maxOrder: z.number().min(1).max(2000).default(100),
    /** Samples per revolution of the order-tracked signal (power of two, raised automatically to fit maxOrder). */
    samplesPerRev: z.number().int().refine(isPowerOfTwo, 'samples per revolution must be a power of two').default(256),
    /** Revolutions per FFT block (power of two): order resolution = 1 / revsPerBlock. Lowered for short captures, with a warning. */
    revsPerBlock: z.number().int().refine(isPowerOfTwo, 'revolutions per block must be a power of two').default(32),
    envelopeBand: EnvelopeBandSettingSchema.default('auto'),
    /** Highest frequency (Hz) searched for the envelope band (limited further by the sample rate). */
    envelopeMaxHz: z.number().min(500).max(100_000).default(9000),
    /** Time unit of a CSV time column; null = from the header (s, ms, us), else seconds. */
    timeUnit: z.enum(['s', 'ms', 'us']).nullable().default(null),
    /** Scale per channel (index 0 = channel 1), e.g. g per volt; missing entries are 1. */
    channelScales: z.array(z.number().finite().refine((v) => v !== 0, 'a channel scale cannot be 0')).max(8).default([]),
    /** Plausible crank-speed range: sets the reference debounce and the anti-alias design. */
    minRpm: z.number().min(30).max(20_000).default(300),
    maxRpm: z.number().min(60).max(30_000).default(8000),
    /**
     * Where crank speed comes from: the reference channel, or the pickup itself (its firing-order
     * line followed through the spectrogram; for captures without a usable reference).
     */
    speedSource: z.enum(['reference', 'pickup']).default('reference'),
    /** Speed the capture is expected near (idle or held rpm), for reading speed from the pickup; null = the drive's idle rpm, else 800. */
    expectedRpm: z.number().min(100).max(20_000).nullable().default(null),
  })
  .superRefine((s, ctx) => {
    if (s.maxRpm <= s.minRpm) ctx.addIssue({ code: 'custom', path: ['maxRpm'], message: `maxRpm (${s.maxRpm}) must exceed minRpm (${s.minRpm})` });
    if (s.firingOrder) {
      const sorted = [...s.firingOrder].sort((a, b) => a - b);
      const ok = sorted.length === s.cylinders && sorted.every((v, i) => v === i + 1);
      if (!ok) ctx.addIssue({ code: 'custom', path: ['firingOrder'], message: `firing order ${s.firingOrder.join('-')} is not a permutation of 1..${s.cylinders}` });
    }
    if (s.envelopeBand !== 'auto' && s.envelopeBand[1] - s.envelopeBand[0] < 100) {
      ctx.addIssue({ code: 'custom', path: ['envelopeBand'], message: 'envelope band must be at least 100 Hz wide' });
    }
  });

/** Expected speed when neither the settings nor the drive give one: a common petrol idle [common practice]. */
export const FALLBACK_EXPECTED_RPM = 800;

export type AnalysisSettings = z.infer<typeof AnalysisSettingsSchema>;
/** Settings as a caller may give them: every field optional. */
export type AnalysisSettingsInput = z.input<typeof AnalysisSettingsSchema>;

/** Parses (and defaults) a settings object; throws a ZodError naming the bad field. */
export function parseAnalysisSettings(input: unknown): AnalysisSettings {
  return AnalysisSettingsSchema.parse(input ?? {});
}
