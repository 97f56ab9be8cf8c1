import { type TimeUnit, parseCell, timeUnitOf } from './csv-cells';

/**
 * Reads the key/value facts a capture's preamble gives: sample interval (or rate), start time and
 * the time column's unit. Scope exports write them as free lines (`# sample interval;0,05;ms`,
 * `Sample Interval: 5.00us`), as key/value columns beside the data, or as extra header columns
 * (`Start`, `Increment`) whose values sit in the row below; all arrive here as [key, value, unit?]
 * cell lists.
 */
export interface PreambleFacts {
  intervalS: number | null;
  startS: number | null;
  /** Unit of the time column when the preamble names it (e.g. `Horizontal Units,s`). */
  timeUnit: TimeUnit | null;
}

const PREFIX: Record<string, number> = { '': 1, n: 1e-9, u: 1e-6, 'µ': 1e-6, 'μ': 1e-6, m: 1e-3, k: 1e3, M: 1e6, G: 1e9 };

/** A number with an optional unit glued on or in the next cell: `5.00uS`, `1MSa/s`, `0,05` + `ms`. */
function valueWithUnit(value: string, unitCell: string): { v: number; unit: string } | null {
  const m = /^([+-]?(?:\d+[.,]?\d*|[.,]\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/.exec(value.trim());
  if (!m) return null;
  const v = parseCell(m[1], m[1].includes(',') && !m[1].includes('.'));
  if (!Number.isFinite(v)) return null;
  return { v, unit: (m[2] || unitCell).trim() };
}

function secondsPer(unit: string): number {
  const m = /^([nuµμmkMG]?)(s|sec|second|seconds)?$/.exec(unit.replace(/S$/, 's'));
  if (!m || unit === '') return 1;
  return PREFIX[m[1]] ?? 1;
}

function hertzPer(unit: string): number {
  const m = /^([kMG]?)(hz|sa\/s|s\/s|sps|samples?\/s)?$/i.exec(unit);
  return m ? PREFIX[m[1]] ?? 1 : 1;
}

/** Collects the preamble facts from [key, value, unit?] cell lists (later facts do not override). */
export function readPreambleFacts(entries: string[][]): PreambleFacts {
  const facts: PreambleFacts = { intervalS: null, startS: null, timeUnit: null };
  for (const f of entries) {
    if (f.length < 2) continue;
    const key = f[0].toLowerCase().replace(/^\s*(#|\/\/|%)\s*/, '').trim();
    if (key === '' || /time.?base|per.?div|scale/.test(key)) continue;
    if (/horiz\w*.?unit|x.?unit|time.?unit/.test(key)) {
      facts.timeUnit ??= timeUnitOf(f[1]);
      continue;
    }
    const val = valueWithUnit(f[1], f[2] ?? '');
    if (!val) continue;
    if (/sample.?rate|sampling.?(rate|freq\w*)|^fs$/.test(key)) {
      if (val.v > 0 && facts.intervalS === null) facts.intervalS = 1 / (val.v * hertzPer(val.unit));
    } else if (/interval|increment|^incr|sample.?period|sampling.?period|^dt$|delta.?t|time.?step|^x.?inc|horizontal.?resolution/.test(key)) {
      if (val.v > 0 && facts.intervalS === null) facts.intervalS = val.v * secondsPer(val.unit);
    } else if (/^start|start.?time|^t0$|x.?origin|x.?zero|trigger.?time|first.?time|x.?start|time.?offset/.test(key)) {
      facts.startS ??= val.v * secondsPer(val.unit);
    }
  }
  return facts;
}

/** True when a key names a preamble fact (so a `Sample Interval,5e-05` line is not read as a header). */
export function isPreambleKey(cell: string): boolean {
  return /sample.?rate|sampling|interval|increment|record.?length|trigger|horiz|vertical|source|probe|model|firmware|serial|^start|^t0$|^dt$/i.test(cell);
}
