import { CaptureFormatError } from './capture-format-error';

/**
 * Works out the layout of a CSV/TSV capture from its first lines: separator, decimal mark,
 * preamble (free lines and "key;value;unit" lines such as a scope's sample interval), header and
 * unit rows, whether the first column is time, and the time unit. Scope exports write all of
 * these in different ways; the rules are: data starts at the first run of lines that all parse as
 * numbers with one field count; the one or two non-numeric lines right before it with that field
 * count are the header and the unit row.
 */

export type TimeUnit = 's' | 'ms' | 'us';

export interface CsvLayout {
  separator: string;
  decimalComma: boolean;
  /** Index (into the sampled lines) of the first data line. */
  dataStart: number;
  fields: number;
  hasTimeColumn: boolean;
  timeUnit: TimeUnit;
  /** How the time unit was decided: 'header', 'setting', 'preamble', 'default'. */
  timeUnitSource: 'header' | 'setting' | 'preamble' | 'default';
  channelNames: string[];
  channelUnits: (string | null)[];
  /** Sample interval and start time from the preamble, in seconds, when given. */
  preambleIntervalS: number | null;
  preambleStartS: number | null;
}

const SEPARATORS = ['\t', ';', ','];
const UNIT_FACTORS: Record<TimeUnit, number> = { s: 1, ms: 1e-3, us: 1e-6 };

/** Seconds per unit of a time column. */
export function timeUnitFactor(u: TimeUnit): number {
  return UNIT_FACTORS[u];
}

/** Splits one line by the separator and removes surrounding quotes and blanks. */
export function splitFields(line: string, sep: string): string[] {
  const parts = line.split(sep);
  for (let i = 0; i < parts.length; i++) {
    let p = parts[i].trim();
    if (p.length >= 2 && p.charCodeAt(0) === 34 && p.charCodeAt(p.length - 1) === 34) p = p.slice(1, -1).trim();
    parts[i] = p;
  }
  // A trailing separator (some scopes write one) leaves an empty last field: drop it.
  if (parts.length > 1 && parts[parts.length - 1] === '') parts.pop();
  return parts;
}

/** Parses a number cell; returns NaN for text (and for an empty cell). */
export function parseCell(cell: string, decimalComma: boolean): number {
  if (cell.length === 0) return NaN;
  const s = decimalComma ? cell.replace(',', '.') : cell;
  const v = Number(s);
  if (Number.isNaN(v)) {
    const low = s.toLowerCase();
    if (low === 'inf' || low === '+inf' || low === 'infinity' || low === '+infinity') return Infinity;
    if (low === '-inf' || low === '-infinity') return -Infinity;
  }
  return v;
}

/** True when the cell spells NaN or infinity (non_finite rather than not_a_number). */
export function isNonFiniteWord(cell: string): boolean {
  return /^[+-]?(nan|inf|infinity)$/i.test(cell.trim());
}

function numericRow(line: string, sep: string, dc: boolean): number {
  const f = splitFields(line, sep);
  for (const c of f) {
    const v = parseCell(c, dc);
    if (Number.isNaN(v) && !isNonFiniteWord(c)) return -1;
  }
  return f.length;
}

const isComment = (line: string) => /^\s*(#|\/\/|%)/.test(line);

function unitOf(text: string): TimeUnit | null {
  const t = text.toLowerCase().replace(/[()[\]{}"]/g, ' ');
  if (/(^|[^a-z])(us|µs|μs|usec|microsec\w*)([^a-z]|$)/.test(t)) return 'us';
  if (/(^|[^a-z])(ms|msec|millisec\w*)([^a-z]|$)/.test(t)) return 'ms';
  if (/(^|[^a-z])(s|sec|secs|second|seconds)([^a-z]|$)/.test(t)) return 's';
  return null;
}

const isTimeName = (name: string) => /^(t|x|time|zeit|temps|tiempo|seconds?|sec|s|ms|us|x-axis)\b|time/i.test(name.replace(/^"|"$/g, '').trim());

function parsePreamble(lines: string[], sep: string, dc: boolean): { intervalS: number | null; startS: number | null; unit: TimeUnit | null } {
  let intervalS: number | null = null;
  let startS: number | null = null;
  let unit: TimeUnit | null = null;
  for (const raw of lines) {
    const line = raw.replace(/^\s*(#|\/\/|%)\s*/, '');
    const f = splitFields(line, sep).length > 1 ? splitFields(line, sep) : line.split(/\s*[:=]\s*|\s{2,}/);
    if (f.length < 2) continue;
    const key = f[0].toLowerCase();
    const value = parseCell(f[1].trim().split(/\s+/)[0], dc || /^\s*-?\d+,\d+/.test(f[1]));
    if (!Number.isFinite(value)) continue;
    const unitText = [f[2] ?? '', f[1].trim().split(/\s+/)[1] ?? ''].join(' ');
    if (/sample.?rate|sampling.?(rate|freq)/.test(key)) {
      const k = /mhz/i.test(unitText) ? 1e6 : /khz/i.test(unitText) ? 1e3 : 1;
      if (value > 0) intervalS = 1 / (value * k);
    } else if (/interval|increment|sample.?period|\bdt\b|delta.?t|time.?step|x.?incr/.test(key)) {
      const u = unitOf(unitText) ?? 's';
      unit = unit ?? u;
      intervalS = value * UNIT_FACTORS[u];
    } else if (/start|t0|x.?origin|trigger.?time|first.?time/.test(key)) {
      startS = value * UNIT_FACTORS[unitOf(unitText) ?? 's'];
    }
  }
  return { intervalS, startS, unit };
}

/**
 * Decides the layout from the first lines of the file (a few hundred are enough).
 * `timeUnitSetting` (the --time-unit flag) overrides the header's unit.
 * Throws `no_data` when no run of numeric lines exists.
 */
export function detectCsvLayout(lines: string[], name: string, timeUnitSetting: TimeUnit | null, atEof: boolean): CsvLayout {
  let best: { sep: string; dc: boolean; start: number; fields: number } | null = null;
  const need = 3;
  for (const sep of SEPARATORS) {
    for (const dc of sep === ',' ? [false] : [false, true]) {
      for (let i = 0; i < lines.length; i++) {
        if (lines[i].trim() === '' || isComment(lines[i])) continue;
        const n = numericRow(lines[i], sep, dc);
        if (n < 1) continue;
        let run = 1;
        for (let j = i + 1; j < lines.length && run < need; j++) {
          if (lines[j].trim() === '') continue;
          if (numericRow(lines[j], sep, dc) !== n) break;
          run++;
        }
        const enough = run >= need || (atEof && run >= 1 && i + run >= lines.filter((l) => l.trim() !== '').length - 0);
        if (!enough) continue;
        if (!best || i < best.start || (i === best.start && n > best.fields)) best = { sep, dc, start: i, fields: n };
        break;
      }
    }
  }
  if (!best) {
    throw new CaptureFormatError('no_data',
      `${name}: no rows of numbers found (expected a time column and one column per channel, separated by , ; or tab); export the capture as CSV with data rows`);
  }
  const { sep, dc, start, fields } = best;
  // Header and unit row: the non-numeric lines with the same field count right before the data.
  const before: string[] = [];
  for (let i = start - 1; i >= 0 && before.length < 2; i--) {
    if (lines[i].trim() === '') continue;
    if (isComment(lines[i]) || splitFields(lines[i], sep).length !== fields) break;
    before.unshift(lines[i]);
  }
  let header: string[] | null = null;
  let units: string[] | null = null;
  if (before.length === 2) { header = splitFields(before[0], sep); units = splitFields(before[1], sep); }
  else if (before.length === 1) {
    const f = splitFields(before[0], sep);
    if (f.every((c) => c === '' || /^[([].*[)\]]$/.test(c))) units = f;
    else header = f;
  }
  const preambleLines = lines.slice(0, Math.max(0, start - before.length));
  const pre = parsePreamble(preambleLines, sep, dc);
  const hasTimeColumn = header ? isTimeName(header[0]) || (pre.intervalS === null) : pre.intervalS === null;
  if (!hasTimeColumn && pre.intervalS === null) {
    throw new CaptureFormatError('bad_header', `${name}: no time column and no sample interval in the preamble; add a time column (first) or a "sample interval" line`);
  }
  let timeUnit: TimeUnit = 's';
  let timeUnitSource: CsvLayout['timeUnitSource'] = 'default';
  const fromHeader = hasTimeColumn ? (unitOf(units?.[0] ?? '') ?? (header ? unitOf(header[0].replace(/^time[ _-]?/i, ' ')) ?? unitOf(header[0]) : null)) : null;
  if (timeUnitSetting) { timeUnit = timeUnitSetting; timeUnitSource = 'setting'; }
  else if (fromHeader) { timeUnit = fromHeader; timeUnitSource = 'header'; }
  else if (hasTimeColumn && pre.unit) { timeUnit = pre.unit; timeUnitSource = 'preamble'; }
  const first = hasTimeColumn ? 1 : 0;
  const channelNames: string[] = [];
  const channelUnits: (string | null)[] = [];
  for (let c = first; c < fields; c++) {
    channelNames.push(header?.[c] || `channel ${c - first + 1}`);
    const u = units?.[c]?.replace(/^[([]|[)\]]$/g, '') ?? '';
    channelUnits.push(u === '' ? null : u);
  }
  return {
    separator: sep, decimalComma: dc, dataStart: start, fields, hasTimeColumn, timeUnit, timeUnitSource,
    channelNames, channelUnits, preambleIntervalS: pre.intervalS, preambleStartS: pre.startS,
  };
}
