/**
 * A capture that reads fine but cannot be analysed as asked (no reference pulses on the chosen
 * channel, too short, no wheel gap…). Like CaptureFormatError it carries a stable `code` and a
 * one-line message saying what to do; the CLI exits 2 on it.
 */
export type AnalysisInputErrorCode = 'no_reference' | 'too_short' | 'no_wheel_gap' | 'too_few_channels' | 'reference_irregular' | 'channel_conflict'
  | 'flat_channel' | 'speed_implausible' | 'speed_unreadable';

export class AnalysisInputError extends Error {
  readonly code: AnalysisInputErrorCode;

  constructor(code: AnalysisInputErrorCode, message: string) {
    super(message);
    this.name = 'AnalysisInputError';
    this.code = code;
  }
}
