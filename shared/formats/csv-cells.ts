/**
 * Cell-level helpers of the CSV/TSV reader: splitting a line (quote-aware), reading a number cell
 * (decimal point or comma, scientific notation), and recognising unit words. No state.
 */

export type TimeUnit = 's' | 'ms' | 'us';

const UNIT_FACTORS: Record<TimeUnit, number> = { s: 1, ms: 1e-3, us: 1e-6 };

/** Seconds per unit of a time column. */
export function timeUnitFactor(u: TimeUnit): number {
  return UNIT_FACTORS[u];
}

/**
 * Splits one line by the separator, honouring double quotes (RFC 4180: a quoted cell may hold the
 * separator, `""` is a quote), and trims each cell. Empty cells are kept in place: the layout
 * addresses columns by position, so leading and trailing empty cells matter.
 */
export function splitCells(line: string, sep: string): string[] {
  if (line.indexOf('"') < 0) {
    const parts = line.split(sep);
    for (let i = 0; i < parts.length; i++) parts[i] = parts[i].trim();
    return parts;
  }
  const out: string[] = [];
  let cell = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"') {
        if (line[i + 1] === '"') { cell += '"'; i++; } else quoted = false;
      } else cell += ch;
    } else if (ch === '"') quoted = true;
    else if (line.startsWith(sep, i)) { out.push(cell.trim()); cell = ''; i += sep.length - 1; }
    else cell += ch;
  }
  out.push(cell.trim());
  return out;
}

/** True when every cell is empty (a blank line, or one made of separators only). */
export function allEmpty(cells: string[]): boolean {
  for (const c of cells) if (c !== '') return false;
  return true;
}

/**
 * Parses a trimmed number cell; NaN for text and for an empty cell. A comma is read as the
 * decimal mark when `decimalComma` is set, and also whenever it is the cell's only mark (a quoted
 * `"1,5E-03"` in a comma-separated file): captures carry no thousands separators.
 */
export function parseCell(cell: string, decimalComma: boolean): number {
  if (cell.length === 0) return NaN;
  let v = Number(decimalComma ? cell.replace(',', '.') : cell);
  if (Number.isNaN(v)) {
    if (!decimalComma && cell.indexOf(',') >= 0 && cell.indexOf('.') < 0) return parseCell(cell, true);
    if (isNonFiniteWord(cell)) v = cell.startsWith('-') ? -Infinity : cell.toLowerCase().includes('inf') || cell.includes('∞') ? Infinity : NaN;
  }
  return v;
}

/** True when the cell spells NaN or infinity (non_finite rather than not_a_number). */
export function isNonFiniteWord(cell: string): boolean {
  return /^[+-]?(nan|inf|infinity|∞|1\.#(inf|ind|qnan)\w*)$/i.test(cell.trim());
}

/** True when the cell is a number or a NaN/infinity word (a data cell, as opposed to text). */
export function isNumericCell(cell: string, decimalComma: boolean): boolean {
  return !Number.isNaN(parseCell(cell, decimalComma)) || isNonFiniteWord(cell);
}

/**
 * The time unit named in a text (a header such as `Time (ms)`, `time_ms`, `t[s]`, a unit row cell
 * `(µs)` or `second`), or null. A micro sign written in Latin-1 arrives as U+FFFD and still counts.
 */
export function timeUnitOf(text: string): TimeUnit | null {
  const t = text.toLowerCase().replace(/[()[\]{}"/]/g, ' ');
  if (/(^|[^a-z])(us|µs|μs|\ufffds|usec|microsec\w*)([^a-z]|$)/.test(t)) return 'us';
  if (/(^|[^a-z])(ms|msec|millisec\w*)([^a-z]|$)/.test(t)) return 'ms';
  if (/(^|[^a-z])(s|sec|secs|second|seconds)([^a-z]|$)/.test(t)) return 's';
  return null;
}

const UNIT_WORD = /^(s|ms|us|µs|μs|\ufffds|ns|sec|secs|seconds?|v|mv|uv|µv|kv|volts?|a|ma|g|mg|m\/s\^?2|m\/s²|pa|kpa|mbar|bar|psi|hz|khz|°c|%|db|dbv|sequence|index|samples?|pts|points?|counts?|raw|adc|div|-)$/i;

/** True when a cell reads as a unit (`(V)`, `[ms]`, `Volt`, `s`, `Sequence`); empty cells pass. */
export function isUnitCell(cell: string): boolean {
  if (cell === '') return true;
  if (/^[([].*[)\]]$/.test(cell)) return true;
  return UNIT_WORD.test(cell);
}

/** A unit written inside a header name (`CH1 (V)`, `Pickup [g]`), or null. */
export function unitInName(name: string): string | null {
  const m = /[([]\s*([^()[\]]{1,12}?)\s*[)\]]\s*$/.exec(name);
  return m ? m[1] : null;
}
