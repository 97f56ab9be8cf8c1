import { type Capture, type CaptureParser, GrowableFloat32, GrowableFloat64 } from './capture';
import { CaptureFormatError, checkSampleRate } from './capture-format-error';
import { type TimeUnit, allEmpty, isNonFiniteWord, parseCell, splitCells, timeUnitFactor } from './csv-cells';
import { type CsvLayout, detectCsvLayout } from './csv-layout';
import { fitSampleRate } from './fit-sample-rate';

/**
 * Streaming CSV/TSV capture reader: a time column then one column per channel (or a sample index,
 * or channel columns only, with the interval given in the preamble), separators `,` `;` tab,
 * decimal point or comma, quotes, LF/CRLF/CR line ends, optional preamble and unit rows (see
 * csv-layout.ts). The sample rate is fitted over the whole time column (fit-sample-rate.ts) or
 * computed from the interval. Values stay in the column's units.
 */

export interface CsvParserOptions {
  /** Used in error messages (e.g. the file name). */
  name?: string;
  /** Time unit of the time column; null = from the header, else seconds. */
  timeUnit?: TimeUnit | null;
}

const LAYOUT_LINES = 400;
/** Fields a line of the layout sample may have: far above any scope or logger export, far below what makes layout detection slow. */
const MAX_FIELDS = 1024;
/** Channel columns read at most (8 is the WAV limit; loggers export a few dozen at most). */
const MAX_CHANNELS = 64;

/** How many fields `line` would split into with the commonest separator (`,` `;` tab), counted without splitting. */
function widestFieldCount(line: string): number {
  let comma = 0;
  let semi = 0;
  let tab = 0;
  for (let i = 0; i < line.length; i++) {
    const c = line.charCodeAt(i);
    if (c === 44) comma++;
    else if (c === 59) semi++;
    else if (c === 9) tab++;
  }
  return Math.max(comma, semi, tab) + 1;
}
/** 9.9E37 and above: the IEEE 488.2 / SCPI "not a number" marker instruments write for over range (from memory). */
const OVER_RANGE = 9.9e37;

/** Creates a CSV chunk parser. */
export function createCsvParser(options: CsvParserOptions = {}): CaptureParser {
  const name = options.name ?? 'CSV file';
  let decoder: TextDecoder | null = null;
  let rest = '';
  let lineNo = 0;
  let head: string[] | null = [];
  let headFirstLineNo = 1;
  let layout: CsvLayout | null = null;
  let cols: GrowableFloat32[] = [];
  let time: GrowableFloat64 | null = null;
  let timeDecimals = 0;
  let timeExp = 0;
  let firstTimeCell = '';
  let lastTimeCell = '';
  let pendingCr = false;

  function fail(code: 'not_a_number' | 'ragged_row' | 'non_finite', line: number, msg: string): never {
    throw new CaptureFormatError(code, `${name}, line ${line}: ${msg}`);
  }

  function startData(atEof: boolean) {
    layout = detectCsvLayout(head!, name, options.timeUnit ?? null, atEof);
    if (layout.channelNames.length === 0) {
      throw new CaptureFormatError('too_few_channels', `${name}: only a time column, no channel columns; export the reference and pickup channels too`);
    }
    if (layout.channelNames.length > MAX_CHANNELS) {
      throw new CaptureFormatError('unsupported_encoding',
        `${name}: ${layout.channelNames.length} channel columns; Crankwise reads up to ${MAX_CHANNELS} — export the time, reference and pickup columns only`);
    }
    cols = layout.channelNames.map(() => new GrowableFloat32(1 << 16));
    time = layout.timeColumn !== null ? new GrowableFloat64(1 << 16) : null;
    const lines = head!;
    head = null;
    for (let i = layout.dataStart; i < lines.length; i++) dataLine(lines[i], headFirstLineNo + i);
  }

  function dataLine(line: string, no: number) {
    const L = layout!;
    if (line.length === 0) return;
    const f = splitCells(line, L.separator);
    if (f.length < L.minCells) {
      if (allEmpty(f)) return;
      fail('ragged_row', no, `${f.length} fields where the data rows have ${L.minCells}; fix or remove that row (or export again)`);
    }
    if (!L.allowSideCells && f.length > L.minCells) {
      for (let c = L.minCells; c < f.length; c++) {
        if (f[c] !== '') fail('ragged_row', no, `${f.length} fields where the data rows have ${L.minCells}; fix or remove that row (or export again)`);
      }
    }
    if (time) {
      const cell = f[L.timeColumn!];
      const v = parseCell(cell, L.decimalComma);
      if (!Number.isFinite(v)) { if (allEmpty(f)) return; badCell(cell, no, L.timeColumn! + 1); }
      time.push(v);
      if (time.length <= 4096) trackPrecision(cell);
      lastTimeCell = cell;
    }
    const cc = L.channelColumns;
    for (let k = 0; k < cc.length; k++) {
      const cell = f[cc[k]];
      const v = parseCell(cell, L.decimalComma);
      if (!(Math.abs(v) < OVER_RANGE)) { if (allEmpty(f)) return; badCell(cell, no, cc[k] + 1); }
      cols[k].push(v);
    }
  }

  /** A line of the layout sample with more than MAX_FIELDS fields is refused before layout detection (which is quadratic in width). */
  function checkWidth(line: string, no: number) {
    if (line.length < MAX_FIELDS) return;
    const fields = widestFieldCount(line);
    if (fields > MAX_FIELDS) {
      throw new CaptureFormatError('bad_header',
        `${name}, line ${no}: ${fields} fields; Crankwise reads a time column and up to ${MAX_CHANNELS} channel columns — export the time, reference and pickup columns only`);
    }
  }

  function badCell(cell: string, no: number, col: number): never {
    if (isNonFiniteWord(cell) || Math.abs(parseCell(cell, layout!.decimalComma)) >= OVER_RANGE) fail('non_finite', no, `column ${col} holds "${cell}" (not a finite number); the instrument was probably over range — record again with a larger range`);
    fail('not_a_number', no, cell === '' ? `column ${col} is empty; every row needs a number in every column` : `column ${col} holds "${cell.slice(0, 24)}", which is not a number; remove text from the data rows`);
  }

  /** Step of the last printed digit of a cell in scientific notation (`4.9999E+00` → 1e-4), else 0. */
  function sciQuantum(cell: string): number {
    const m = /^[+-]?\d*(?:[.,](\d*))?[eE]([+-]?\d+)$/.exec(cell);
    return m ? Math.pow(10, Number(m[2]) - (m[1]?.length ?? 0)) : 0;
  }

  function trackPrecision(cell: string) {
    if (time!.length === 1) firstTimeCell = cell;
    const m = /^[+-]?\d*(?:[.,](\d*))?(?:[eE]([+-]?\d+))?$/.exec(cell);
    if (!m) return;
    const dec = m[1]?.length ?? 0;
    const exp = m[2] ? Number(m[2]) : 0;
    if (dec - exp > timeDecimals - timeExp) { timeDecimals = dec; timeExp = exp; }
  }

  function takeLines(raw: string, final: boolean) {
    let text = raw;
    if (pendingCr) { text = '\r' + text; pendingCr = false; }
    if (text.indexOf('\r') >= 0) {
      // CR or CRLF line ends: a CR at the chunk's end may be half of a CRLF, so it waits.
      if (!final && text.endsWith('\r')) { text = text.slice(0, -1); pendingCr = true; }
      text = text.replace(/\r\n?/g, '\n');
    }
    const all = rest + text;
    let start = 0;
    for (;;) {
      const nl = all.indexOf('\n', start);
      if (nl < 0) break;
      const line = all.slice(start, nl);
      start = nl + 1;
      lineNo++;
      if (head) {
        if (head.length === 0) headFirstLineNo = lineNo;
        checkWidth(line, lineNo);
        head.push(line);
        if (head.length >= LAYOUT_LINES) startData(false);
      } else dataLine(line, lineNo);
    }
    rest = all.slice(start);
    if (final && rest.length > 0) {
      lineNo++;
      const line = rest;
      rest = '';
      if (head) { if (head.length === 0) headFirstLineNo = lineNo; checkWidth(line, lineNo); head.push(line); } else dataLine(line, lineNo);
    }
  }

  return {
    feed(chunk: Uint8Array) {
      if (lineNo === 0 && rest === '' && chunk.length >= 4 && chunk[0] === 0x52 && chunk[1] === 0x49 && chunk[2] === 0x46 && chunk[3] === 0x46) {
        throw new CaptureFormatError('bad_magic', `${name}: this is a WAV file, not CSV; give it a .wav name`);
      }
      // UTF-8 (a BOM is dropped) unless a UTF-16 byte-order mark says otherwise (some PC loggers).
      decoder ??= new TextDecoder(chunk[0] === 0xff && chunk[1] === 0xfe ? 'utf-16le' : chunk[0] === 0xfe && chunk[1] === 0xff ? 'utf-16be' : 'utf-8');
      takeLines(decoder.decode(chunk, { stream: true }), false);
    },
    end(): Capture {
      if (decoder) takeLines(decoder.decode(), true);
      if (head) {
        if (head.every((l) => l.trim() === '')) throw new CaptureFormatError('no_data', `${name}: the file is empty; export the capture again`);
        startData(true);
      }
      const L = layout!;
      const n = cols[0].length;
      if (n < 2) throw new CaptureFormatError('no_data', `${name}: ${n} data row${n === 1 ? '' : 's'}; a capture needs at least a second of samples — export the whole record`);
      const notes: string[] = [];
      let sampleRateHz: number;
      let unitSource = L.timeUnitSource;
      if (time && L.timeKind === 'index') {
        // A sample counter: fitted like a time column (gaps show as residuals), one count = one interval.
        const fit = fitSampleRate(time.toArray(), 1, name);
        sampleRateHz = 1 / (fit.intervalUnits * L.preambleIntervalS!);
        unitSource = 'preamble';
      } else if (time) {
        // Fixed-point columns: the finest step printed. Scientific notation with fixed significant
        // digits: the step at the largest magnitude (first or last row) bounds every row's rounding.
        const precision = Math.max(Math.pow(10, -(timeDecimals - timeExp)), sciQuantum(firstTimeCell), sciQuantum(lastTimeCell));
        const fit = fitSampleRate(time.toArray(), precision, name);
        let unitS = timeUnitFactor(L.timeUnit);
        const interval = L.preambleIntervalS;
        if (unitSource === 'default' && interval) {
          // No unit stated: the preamble's interval says whether the column is in s, ms or µs.
          const match = (['s', 'ms', 'us'] as TimeUnit[]).find((u) => Math.abs((fit.intervalUnits * timeUnitFactor(u)) / interval - 1) <= 0.01);
          if (match) { unitS = timeUnitFactor(match); unitSource = 'preamble'; }
        }
        sampleRateHz = 1 / (fit.intervalUnits * unitS);
        if (unitSource === 'default') notes.push('time column unit not stated; read as seconds (use --time-unit ms if it is milliseconds)');
        if (interval && Math.abs(interval * sampleRateHz - 1) > 0.01) {
          notes.push(`the preamble's sample interval (${interval} s) differs from the time column's; used the time column`);
        }
      } else {
        sampleRateHz = 1 / L.preambleIntervalS!;
      }
      if (!(sampleRateHz > 0) || !Number.isFinite(sampleRateHz)) {
        throw new CaptureFormatError('zero_rate', `${name}: the time column does not advance, so the sample rate is zero; export with a time column in seconds or milliseconds`);
      }
      if (unitSource === 'default' && sampleRateHz < 1000 && sampleRateHz * 1000 >= 1000) {
        throw new CaptureFormatError('rate_out_of_range',
          `${name}: read as seconds, the time column gives ${sampleRateHz.toPrecision(4)} Hz (below 1 kHz); if it is in milliseconds, add --time-unit ms`);
      }
      checkSampleRate(sampleRateHz, name);
      return {
        format: 'csv',
        sampleRateHz,
        channels: cols.map((c) => c.toArray().slice()),
        channelNames: L.channelNames,
        channelUnits: L.channelUnits,
        notes,
      };
    },
  };
}
