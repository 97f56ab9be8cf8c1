import { CaptureFormatError } from './capture-format-error';
import { type TimeUnit, allEmpty, isNumericCell, isUnitCell, parseCell, splitCells, timeUnitOf, unitInName } from './csv-cells';
import { isPreambleKey, readPreambleFacts } from './csv-preamble';

export type { TimeUnit } from './csv-cells';

/**
 * Works out the layout of a CSV/TSV capture from its first lines. Scope and logger exports differ
 * in separator (`,` `;` tab), decimal mark, quoting, preamble (free lines, or key/value columns to
 * the left or right of the data), header and unit rows, extra header columns such as `Start` /
 * `Increment`, and whether the first data column is time, a sample index or a channel. The rules:
 * the data columns are the run of numeric cells most rows near the end of the sample share; data
 * starts at the first run of rows numeric in those columns; the one or two text rows right above
 * are the header and the unit row; everything else feeds the preamble facts (csv-preamble.ts).
 */
export interface CsvLayout {
  separator: string;
  decimalComma: boolean;
  /** Index (into the sampled lines) of the first data line. */
  dataStart: number;
  /** Cell index of the time or sample-index column, or null (rate from the preamble alone). */
  timeColumn: number | null;
  /** 'time': a time column in `timeUnit`; 'index': a sample counter, time = start + index × interval. */
  timeKind: 'time' | 'index' | 'none';
  timeUnit: TimeUnit;
  /** How the time unit was decided (the parser may still infer it from the preamble interval). */
  timeUnitSource: 'header' | 'setting' | 'preamble' | 'default';
  /** Cell indices of the channels, in order (channel 1 first). */
  channelColumns: number[];
  /** A data row needs at least this many cells. */
  minCells: number;
  /** Cells outside the data columns (preamble columns, Start/Increment) are ignored, not ragged. */
  allowSideCells: boolean;
  channelNames: string[];
  channelUnits: (string | null)[];
  /** Sample interval and start time from the preamble, in seconds, when given. */
  preambleIntervalS: number | null;
  preambleStartS: number | null;
}

const SEPARATORS = ['\t', ';', ','];
const TAIL_LINES = 60;

const isComment = (line: string) => /^\s*(#|\/\/|%)/.test(line);

interface Row { index: number; cells: string[] }

/** Rows of the sample split by `sep`, without blank, separator-only and comment lines. */
function rowsOf(lines: string[], sep: string): Row[] {
  const rows: Row[] = [];
  for (let i = 0; i < lines.length; i++) {
    if (lines[i].trim() === '' || isComment(lines[i])) continue;
    const cells = splitCells(lines[i], sep);
    if (!allEmpty(cells)) rows.push({ index: i, cells });
  }
  return rows;
}

/** The widest run of adjacent numeric cells that most rows near the end share, and its score. */
function dataColumns(rows: Row[]): { cols: number[]; score: number } {
  const counts = new Map<string, number>();
  for (const r of rows.slice(-TAIL_LINES)) {
    const set: number[] = [];
    r.cells.forEach((c, i) => { if (isNumericCell(c, false)) set.push(i); });
    if (set.length === 0) continue;
    const key = set.join(',');
    counts.set(key, (counts.get(key) ?? 0) + 1);
  }
  let best: number[] = [];
  let bestCount = 0;
  for (const [key, n] of counts) {
    if (n <= bestCount) continue;
    const set = key.split(',').map(Number);
    let run: number[] = [set[0]];
    let longest = run;
    for (let k = 1; k < set.length; k++) {
      run = set[k] === set[k - 1] + 1 ? [...run, set[k]] : [set[k]];
      if (run.length > longest.length) longest = run;
    }
    best = longest;
    bestCount = n;
  }
  return { cols: best, score: best.length * bestCount };
}

const isDataRow = (cells: string[], cols: number[]) => cols.every((c) => c < cells.length && isNumericCell(cells[c], false));

const INDEX_NAME = /^(no\.?|nr\.?|index|idx|samples?|points?|pt|n|#|seq|sequence|num|number)$/i;
const TIME_NAME = /time|zeit|temps|tiempo|^t\b|^sec\b|^seconds?$|^x-axis$/i;

/**
 * Decides the layout from the first lines of the file (a few hundred are enough).
 * `timeUnitSetting` (the --time-unit flag) overrides the header's unit.
 * Throws `no_data` when no run of numeric lines exists, `bad_header` when no time can be found.
 */
export function detectCsvLayout(lines: string[], name: string, timeUnitSetting: TimeUnit | null, atEof: boolean): CsvLayout {
  let best: { sep: string; rows: Row[]; cols: number[]; score: number } | null = null;
  for (const sep of SEPARATORS) {
    const rows = rowsOf(lines, sep);
    const { cols, score } = dataColumns(rows);
    if (cols.length > 0 && (!best || score > best.score)) best = { sep, rows, cols, score };
  }
  const noData = () => new CaptureFormatError('no_data',
    `${name}: no rows of numbers found (expected a time column and one column per channel, separated by , ; or tab); export the capture as CSV with data rows`);
  if (!best) throw noData();
  const { sep, rows, cols } = best;
  let start = -1;
  for (let r = 0; r < rows.length && start < 0; r++) {
    if (!isDataRow(rows[r].cells, cols)) continue;
    let run = 1;
    while (run < 3 && r + run < rows.length && isDataRow(rows[r + run].cells, cols)) run++;
    if (run >= 3 || (atEof && r + run === rows.length)) start = r;
  }
  if (start < 0) throw noData();
  const dataRows = rows.slice(start, start + 200).filter((r) => isDataRow(r.cells, cols));
  const decimalComma = sep !== ',' && dataRows.some((r) => cols.some((c) => r.cells[c].includes(',')));

  // Header and unit row: up to two text rows right above the data, filled in the data columns.
  const above: Row[] = [];
  for (let r = start - 1; r >= 0 && above.length < 2; r--) {
    const { cells } = rows[r];
    const has = (c: number) => (cells[c] ?? '') !== '';
    const filled = cols.slice(1).every(has) && (cols.length > 1 || has(cols[0]));
    const kv = isPreambleKey(cells[cols[0]] ?? '');
    if (!filled || kv || isDataRow(cells, cols)) break;
    above.unshift(rows[r]);
  }
  const unitLike = (r: Row) => cols.every((c) => isUnitCell(r.cells[c] ?? '')) && cols.some((c) => (r.cells[c] ?? '') !== '');
  let header: string[] | null = null;
  let units: string[] | null = null;
  if (above.length === 2) {
    const swap = unitLike(above[0]) && !unitLike(above[1]);
    header = above[swap ? 1 : 0].cells; units = above[swap ? 0 : 1].cells;
  } else if (above.length === 1) {
    if (unitLike(above[0])) units = above[0].cells; else header = above[0].cells;
  }

  // Preamble facts: free lines above, key/value cells beside the data, parameter header columns.
  const firstAbove = above[0]?.index ?? rows[start].index;
  const entries: string[][] = [];
  for (const r of rows) {
    if (r.index >= firstAbove) break;
    entries.push(r.cells.length > 1 ? r.cells : r.cells[0].replace(/^\s*(#|\/\/|%)\s*/, '').split(/\s*[:=]\s*|\s{2,}/));
  }
  for (let i = 0; i < firstAbove; i++) {
    if (isComment(lines[i]) && !rows.some((r) => r.index === i)) {
      const cells = splitCells(lines[i], sep);
      entries.push(cells.length > 1 ? cells : lines[i].replace(/^\s*(#|\/\/|%)\s*/, '').split(/\s*[:=]\s*|\s{2,}/));
    }
  }
  const lo = cols[0];
  const hi = cols[cols.length - 1];
  const side = (cells: string[]) => [cells.slice(0, lo), cells.slice(hi + 1)].filter((s) => !allEmpty(s)).map((s) => s.slice(s.findIndex((c) => c !== '')));
  if (header) {
    const below = units ?? dataRows[0]?.cells ?? [];
    header.forEach((h, c) => { if ((c < lo || c > hi) && h !== '' && (below[c] ?? '') !== '') entries.push([h, below[c]]); });
  }
  for (const r of dataRows.slice(0, 100)) entries.push(...side(r.cells));
  const facts = readPreambleFacts(entries);
  const allowSideCells = [header, units, dataRows[0]?.cells].some((cells) => cells !== null && cells !== undefined && side(cells).length > 0);

  // Roles of the data columns.
  const nameOf = (c: number) => header?.[c] ?? '';
  const unitOf = (c: number) => units?.[c] ?? '';
  const firstValues = dataRows.map((r) => parseCell(r.cells[lo], decimalComma));
  const diffs = firstValues.slice(1).map((v, i) => v - firstValues[i]);
  const consecutive = diffs.length > 0 && firstValues.every(Number.isInteger) && diffs.every((d) => d === 1);
  const increasing = diffs.length > 0 && diffs.every((d) => d > 0);
  const unitOfTime = (c: number) => timeUnitOf(unitOf(c).replace(/^[([]|[)\]]$/g, '')) ?? (nameOf(c) ? timeUnitOf(nameOf(c).replace(/^time[ _-]?/i, ' ')) : null);
  const isIndex = (c: number) => INDEX_NAME.test(nameOf(c)) || /^[([]?(sequence|index|samples?|pts|points?|#)[)\]]?$/i.test(unitOf(c));
  const isTime = (c: number) => TIME_NAME.test(nameOf(c)) || unitOfTime(c) !== null;
  const ambiguous = nameOf(lo) === '' || /^x$/i.test(nameOf(lo));
  let timeKind: CsvLayout['timeKind'];
  let timeColumn: number | null = lo;
  if (isIndex(lo) && !unitOfTime(lo)) {
    if (cols.length > 1 && isTime(cols[1])) { timeKind = 'time'; timeColumn = cols[1]; } else timeKind = 'index';
  } else if (ambiguous && !unitOfTime(lo) && !timeUnitSetting) {
    if (consecutive && facts.intervalS !== null) timeKind = 'index';
    else if (consecutive && facts.intervalS === null && header === null && units === null) {
      throw new CaptureFormatError('bad_header', `${name}: the first column counts samples (${firstValues[0]}, ${firstValues[1]}, …) and no sample interval is given; export with a time column, or add a "sample interval" line (or --time-unit if the column is time)`);
    } else timeKind = increasing || facts.intervalS === null ? 'time' : 'none';
  } else timeKind = isTime(lo) || facts.intervalS === null ? 'time' : 'none';
  if (timeKind === 'none') timeColumn = null;
  if (timeKind === 'index' && facts.intervalS === null) {
    throw new CaptureFormatError('bad_header', `${name}: the first column is a sample index but the file gives no sample interval (e.g. an "Increment" or "Sample Interval" entry); export with a time column or with the interval`);
  }

  let timeUnit: TimeUnit = 's';
  let timeUnitSource: CsvLayout['timeUnitSource'] = 'default';
  const fromColumn = timeKind === 'time' ? unitOfTime(timeColumn!) : null;
  if (timeUnitSetting) { timeUnit = timeUnitSetting; timeUnitSource = 'setting'; }
  else if (fromColumn) { timeUnit = fromColumn; timeUnitSource = 'header'; }
  else if (facts.timeUnit) { timeUnit = facts.timeUnit; timeUnitSource = 'preamble'; }

  const channelColumns = timeColumn === null ? cols : cols.filter((c) => c > timeColumn!);
  const channelNames: string[] = [];
  const channelUnits: (string | null)[] = [];
  channelColumns.forEach((c, k) => {
    channelNames.push(nameOf(c) || `channel ${k + 1}`);
    const u = unitOf(c).replace(/^[([]|[)\]]$/g, '') || unitInName(nameOf(c)) || '';
    channelUnits.push(u === '' ? null : u);
  });
  return {
    separator: sep, decimalComma, dataStart: rows[start].index, timeColumn, timeKind, timeUnit, timeUnitSource,
    channelColumns, minCells: hi + 1, allowSideCells, channelNames, channelUnits,
    preambleIntervalS: facts.intervalS, preambleStartS: facts.startS,
  };
}
