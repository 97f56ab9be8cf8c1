/**
 * CSV encoder for generated captures, written the way bench scopes export them: optional preamble
 * lines, a header row (time column, then one column per channel), optionally a unit row, then one
 * row per sample. Time in seconds (`time_s`) or milliseconds (`time_ms`); separator `,` `;` or tab;
 * decimal point or decimal comma (a comma decimal needs `;` or tab as separator). Values keep six
 * significant digits; time keeps enough decimals to resolve a tenth of a sample. Pure: returns text.
 */

/** How the CSV is written. */
export interface CsvEncodeOptions {
  timeUnit: 's' | 'ms';
  /** Lines written before the header, each prefixed with "# " (scope exports start this way). */
  preamble?: string[];
  separator?: ',' | ';' | '\t';
  decimalComma?: boolean;
  /** Header names of the channels (default ch1, ch2, …). */
  names?: string[];
  /** Units written as a second header row, e.g. ['V', 'g']; none when absent. */
  units?: string[];
}

/**
 * Encodes equal-length channels as CSV text. Throws RangeError for no channels, unequal lengths,
 * a non-positive sample rate, or a decimal comma with a comma separator.
 */
export function encodeCsv(channels: readonly Float32Array[], sampleRateHz: number, options: CsvEncodeOptions): string {
  if (channels.length < 1) throw new RangeError('a CSV capture needs at least one channel');
  const frames = channels[0].length;
  if (channels.some((c) => c.length !== frames)) throw new RangeError(`all channels must have the same length, got ${channels.map((c) => c.length).join(', ')}`);
  if (!(sampleRateHz > 0 && Number.isFinite(sampleRateHz))) throw new RangeError(`sample rate must be a positive number of hertz, got ${sampleRateHz}`);
  const separator = options.separator ?? (options.decimalComma ? ';' : ',');
  if (options.decimalComma && separator === ',') throw new RangeError('a decimal comma needs ";" or tab as the separator, got ","');
  const names = options.names ?? channels.map((_, i) => `ch${i + 1}`);
  if (names.length !== channels.length) throw new RangeError(`names must give one name per channel (${channels.length}), got ${names.length}`);
  const scale = options.timeUnit === 'ms' ? 1000 : 1;
  const timeDecimals = Math.max(0, Math.ceil(Math.log10((10 * sampleRateHz) / scale)));
  const comma = options.decimalComma === true;
  const num = (text: string) => (comma ? text.replace('.', ',') : text);
  const lines: string[] = [];
  for (const line of options.preamble ?? []) lines.push(`# ${line}`);
  lines.push([options.timeUnit === 'ms' ? 'time_ms' : 'time_s', ...names].join(separator));
  if (options.units) lines.push([`(${options.timeUnit})`, ...options.units.map((u) => `(${u})`)].join(separator));
  const row: string[] = new Array(channels.length + 1);
  for (let i = 0; i < frames; i++) {
    row[0] = num(((i / sampleRateHz) * scale).toFixed(timeDecimals));
    for (let c = 0; c < channels.length; c++) row[c + 1] = num(formatValue(channels[c][i]));
    lines.push(row.join(separator));
  }
  return `${lines.join('\n')}\n`;
}

function formatValue(x: number): string {
  if (x === 0) return '0';
  // Six significant digits without exponent notation (readers accept plain decimals everywhere).
  const decimals = Math.max(0, Math.min(12, 5 - Math.floor(Math.log10(Math.abs(x)))));
  return x.toFixed(decimals);
}
