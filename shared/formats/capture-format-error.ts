/**
 * The one error type of the capture readers. `code` is stable (the CLI maps it to exit 2, the
 * server to a failed analysis with that code); `message` tells a technician what is wrong and
 * what to do, in one line.
 */
export type CaptureFormatErrorCode =
  | 'truncated'
  | 'bad_magic'
  | 'zero_rate'
  | 'no_data'
  | 'not_a_number'
  | 'ragged_row'
  | 'non_finite'
  | 'too_few_channels'
  | 'unsupported_encoding'
  | 'rate_irregular'
  | 'rate_out_of_range'
  | 'unknown_format'
  | 'bad_header';

export class CaptureFormatError extends Error {
  readonly code: CaptureFormatErrorCode;

  constructor(code: CaptureFormatErrorCode, message: string) {
    super(message);
    this.name = 'CaptureFormatError';
    this.code = code;
  }
}

/** Sample rates a capture may have (Hz); the pipeline's filters are designed for this span. */
export const MIN_SAMPLE_RATE_HZ = 1000;
export const MAX_SAMPLE_RATE_HZ = 1_000_000;

/** Throws `rate_out_of_range` unless 1 kHz ≤ fs ≤ 1 MHz. */
export function checkSampleRate(sampleRateHz: number, where: string): void {
  if (!(sampleRateHz >= MIN_SAMPLE_RATE_HZ && sampleRateHz <= MAX_SAMPLE_RATE_HZ)) {
    throw new CaptureFormatError(
      'rate_out_of_range',
      `${where}: sample rate ${formatHz(sampleRateHz)} is outside 1 kHz … 1 MHz; record again at 10–200 kHz (or fix the time column)`,
    );
  }
}

function formatHz(hz: number): string {
  if (!Number.isFinite(hz)) return String(hz);
  return hz >= 1000 ? `${(hz / 1000).toPrecision(4)} kHz` : `${hz.toPrecision(4)} Hz`;
}
