/**
 * The component table of a drive document as CSV: one row per component, headers equal to the
 * JSON keys (bearing keys flattened), so that a document's components survive
 * export → edit in a spreadsheet → import unchanged. Empty cells mean "not given"; `false` is
 * written out, so `backside: false` and a missing `backside` stay distinct.
 */
import type { BearingSpec, BeltSpec, ComponentKind, ComponentSpec, RotatingRing } from '../drive/types';
import { cleanNumber } from '../drive/measured-diameter';
import { formatCsvText, parseCsvText, type CsvRecord } from './csv-text';

/** The CSV header row, in order. */
export const COMPONENT_CSV_HEADERS = [
  'name', 'kind', 'belt', 'pulleyMm', 'backside', 'fixedRatio', 'overrunning',
  'designation', 'balls', 'ballMm', 'pitchMm', 'contactDeg',
  'ftf', 'bpfo', 'bpfi', 'bsf', 'rotatingRing', 'outsideMm', 'source',
] as const;

/** Columns a table written before they existed may lack (read as empty). */
const OPTIONAL_HEADERS: readonly string[] = ['outsideMm', 'source'];
const SOURCES = ['published', 'measured', 'estimated'] as const;

/** One header of the component table. */
export type ComponentCsvHeader = (typeof COMPONENT_CSV_HEADERS)[number];

/** Every component kind the drive document accepts (docs/design.md "Domain model"). */
export const COMPONENT_KINDS: readonly ComponentKind[] = [
  'crankshaft', 'alternator', 'water_pump', 'power_steering', 'ac_compressor',
  'idler', 'tensioner', 'fan', 'vacuum_pump', 'other',
];

const RINGS: readonly RotatingRing[] = ['inner', 'outer'];
const FACTOR_KEYS = ['ftf', 'bpfo', 'bpfi', 'bsf'] as const;

/** One problem in an imported table: the 1-based line of the CSV text and, when known, the column. */
export interface CsvImportProblem {
  line: number;
  field?: string;
  message: string;
}

/** Result of reading a component table: the components with their lines, or every problem found. */
export type ComponentCsvResult =
  | { ok: true; components: ComponentSpec[]; lines: number[] }
  | { ok: false; problems: CsvImportProblem[]; components?: ComponentSpec[]; lines?: number[] };

// Written with 12 significant digits at most, so that binary noise (0.2656 × 25.4 = 6.746239999999999)
// leaves as the number entered (6.74624); what a user typed has far fewer digits than that.
const num = (v: number | undefined): string => (v === undefined ? '' : String(cleanNumber(v)));
const bool = (v: boolean | undefined): string => (v === undefined ? '' : v ? 'true' : 'false');

/** The CSV cells of one component, in header order. */
export function componentToCsvRow(c: ComponentSpec): string[] {
  const b: BearingSpec = c.bearing ?? {};
  const cells: Record<ComponentCsvHeader, string> = {
    name: c.name, kind: c.kind, belt: c.belt ?? '', pulleyMm: num(c.pulleyMm),
    backside: bool(c.backside), fixedRatio: num(c.fixedRatio), overrunning: bool(c.overrunning),
    designation: b.designation ?? '', balls: num(b.balls), ballMm: num(b.ballMm),
    pitchMm: num(b.pitchMm), contactDeg: num(b.contactDeg),
    ftf: num(b.factors?.ftf), bpfo: num(b.factors?.bpfo), bpfi: num(b.factors?.bpfi),
    bsf: num(b.factors?.bsf), rotatingRing: b.rotatingRing ?? '', outsideMm: num(c.outsideMm), source: b.source ?? '',
  };
  return COMPONENT_CSV_HEADERS.map((h) => cells[h]);
}

/**
 * Writes a document's components as CSV (header row first, CRLF line ends). Numbers are written
 * with JavaScript's shortest round-trip form, so reading them back gives the same doubles.
 */
export function componentsToCsv(components: readonly ComponentSpec[]): string {
  return formatCsvText([[...COMPONENT_CSV_HEADERS], ...components.map(componentToCsvRow)]);
}

/** What each column holds, in the user's words (for messages). */
export const COLUMN_LABELS: Record<string, string> = {
  name: 'Name', kind: 'Kind', belt: 'Belt', pulleyMm: 'Pulley diameter', backside: 'Backside', fixedRatio: 'Fixed ratio',
  overrunning: 'Overrunning', designation: 'Bearing designation', balls: 'Number of balls', ballMm: 'Ball diameter',
  pitchMm: 'Pitch diameter', contactDeg: 'Contact angle', ftf: 'FTF factor', bpfo: 'BPFO factor', bpfi: 'BPFI factor',
  bsf: 'BSF factor', rotatingRing: 'Turning ring', outsideMm: 'Measured outside diameter', source: 'Bearing source',
  cylinders: 'Cylinders', firingOrder: 'Firing order', idleRpm: 'Idle speed', notes: 'Notes', lengthMm: 'Belt length',
  driver: 'Driver', driverPulleyMm: 'Driver groove diameter',
};
const label = (field: string): string => COLUMN_LABELS[field] ?? field;

/** Reads a number cell ('' = not given); a problem in the user's words otherwise. */
export function parseNumber(raw: string, field: string, line: number, problems: CsvImportProblem[]): number | undefined {
  if (raw === '') return undefined;
  // Number('') and Number(' ') are 0 and Number('0x10') is 16: accept plain decimals only.
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(raw)) {
    const hint = /^\d+,\d+$/.test(raw) ? ' (use a decimal point, not a comma)' : '';
    problems.push({ line, field, message: `${label(field)} must be a number, got "${raw}"${hint}` });
    return undefined;
  }
  return Number(raw);
}

function parseBool(raw: string, field: string, line: number, problems: CsvImportProblem[]): boolean | undefined {
  const v = raw.toLowerCase();
  if (v === '') return undefined;
  if (v === 'true' || v === 'yes' || v === '1') return true;
  if (v === 'false' || v === 'no' || v === '0') return false;
  problems.push({ line, field, message: `${label(field)} must be yes or no (or empty), got "${raw}"` });
  return undefined;
}

function readHeader(fields: string[], line: number, problems: CsvImportProblem[]): Map<ComponentCsvHeader, number> | null {
  const before = problems.length;
  const index = new Map<ComponentCsvHeader, number>();
  const known = new Set<string>(COMPONENT_CSV_HEADERS);
  fields.forEach((f, i) => {
    if (!known.has(f)) {
      problems.push({ line, field: f, message: `Crankwise does not know the column "${f}"; the headers are ${COMPONENT_CSV_HEADERS.join(',')}` });
    } else if (index.has(f as ComponentCsvHeader)) {
      problems.push({ line, field: f, message: `The column "${f}" appears twice` });
    } else {
      index.set(f as ComponentCsvHeader, i);
    }
  });
  const missing = COMPONENT_CSV_HEADERS.filter((h) => !index.has(h) && !OPTIONAL_HEADERS.includes(h));
  if (missing.length > 0) {
    problems.push({ line, message: `The column(s) ${missing.join(', ')} are missing; the header row must be ${COMPONENT_CSV_HEADERS.join(',')}` });
  }
  return problems.length === before ? index : null;
}

/**
 * Reads a component table. Each row is checked on its own (numbers, booleans, kind, turning
 * ring, belt among `belts`, a complete set of factors) and every problem is reported with its
 * line; the caller validates the assembled document against the drive schema and maps those
 * problems back through `lines`. Belt names match case-insensitively and are rewritten in the
 * belt's own spelling.
 */
export function parseComponentCsv(text: string, belts: readonly Pick<BeltSpec, 'name'>[]): ComponentCsvResult {
  const { records, problems: syntax } = parseCsvText(text);
  const problems: CsvImportProblem[] = syntax.map((p) => ({ line: p.line, message: p.message }));
  if (records.length === 0) {
    problems.push({ line: 1, message: `The file is empty; the first row must be the column headers ${COMPONENT_CSV_HEADERS.join(',')}` });
    return { ok: false, problems };
  }
  const [head, ...rows] = records;
  return readComponentRecords(head, rows, belts, problems);
}

/**
 * Reads the component rows under a header record (the component table alone, or the [components]
 * block of a whole-engine file). `problems` may already hold problems; they are kept and sorted.
 */
export function readComponentRecords(
  head: CsvRecord, rows: readonly CsvRecord[], belts: readonly Pick<BeltSpec, 'name'>[], problems: CsvImportProblem[],
): ComponentCsvResult {
  const before = problems.length;
  const index = readHeader(head.fields, head.line, problems);
  if (!index) return { ok: false, problems };
  if (rows.length === 0) problems.push({ line: head.line, message: 'There are no part rows after the header; a drive needs at least the crankshaft' });
  const beltByLower = new Map(belts.map((b) => [b.name.toLowerCase(), b.name]));
  const components: ComponentSpec[] = [];
  const lines: number[] = [];
  // Rows written before the optional columns existed may stop short of them when they come last.
  let shortest = head.fields.length;
  while (shortest > 0 && OPTIONAL_HEADERS.includes(head.fields[shortest - 1])) shortest -= 1;
  for (const { line, fields } of rows) {
    if (fields.length > head.fields.length || fields.length < shortest) {
      problems.push({ line, message: `This row has ${fields.length} fields, the header has ${head.fields.length}; check for a missing or stray comma` });
      continue;
    }
    const cell = (h: ComponentCsvHeader): string => {
      const at = index.get(h);
      return at === undefined ? '' : fields[at] ?? '';
    };
    // A row with a bad cell is still read (without that cell), so that the drive schema can
    // report the row's other problems in the same pass.
    components.push(readRow(cell, line, beltByLower, problems));
    lines.push(line);
  }
  problems.sort((a, b) => a.line - b.line);
  return problems.length > before || problems.length > 0 ? { ok: false, problems, components, lines } : { ok: true, components, lines };
}

function readRow(
  cell: (h: ComponentCsvHeader) => string,
  line: number,
  beltByLower: Map<string, string>,
  problems: CsvImportProblem[],
): ComponentSpec {
  const name = cell('name');
  if (name === '') problems.push({ line, field: 'name', message: 'The name is empty; every part needs a name' });
  const kind = cell('kind');
  if (!COMPONENT_KINDS.includes(kind as ComponentKind)) {
    problems.push({ line, field: 'kind', message: `The kind "${kind}" is not one of ${COMPONENT_KINDS.join(', ')}` });
  }
  let belt: string | undefined;
  if (cell('belt') !== '') {
    belt = beltByLower.get(cell('belt').toLowerCase());
    if (belt === undefined) {
      belt = cell('belt');
      const known = [...beltByLower.values()];
      problems.push({
        line, field: 'belt',
        message: `There is no belt "${cell('belt')}" on this engine (${known.length ? `its belts: ${known.join(', ')}` : 'it has no belts'}); add the belt first`,
      });
    }
  }
  const pulleyMm = parseNumber(cell('pulleyMm'), 'pulleyMm', line, problems);
  const backside = parseBool(cell('backside'), 'backside', line, problems);
  const fixedRatio = parseNumber(cell('fixedRatio'), 'fixedRatio', line, problems);
  const overrunning = parseBool(cell('overrunning'), 'overrunning', line, problems);
  const balls = parseNumber(cell('balls'), 'balls', line, problems);
  const ballMm = parseNumber(cell('ballMm'), 'ballMm', line, problems);
  const pitchMm = parseNumber(cell('pitchMm'), 'pitchMm', line, problems);
  const contactDeg = parseNumber(cell('contactDeg'), 'contactDeg', line, problems);
  const factorValues = FACTOR_KEYS.map((k) => parseNumber(cell(k), k, line, problems));
  const givenFactors = FACTOR_KEYS.filter((k) => cell(k) !== '');
  if (givenFactors.length > 0 && givenFactors.length < FACTOR_KEYS.length) {
    const missing = FACTOR_KEYS.filter((k) => cell(k) === '');
    problems.push({ line, field: missing[0], message: `Give all four factors (ftf, bpfo, bpfi, bsf) or none; ${missing.join(', ')} missing` });
  }
  const ring = cell('rotatingRing').toLowerCase();
  if (ring !== '' && !RINGS.includes(ring as RotatingRing)) {
    problems.push({ line, field: 'rotatingRing', message: `The turning ring must be inner or outer (or empty), got "${cell('rotatingRing')}"` });
  }
  const outsideMm = parseNumber(cell('outsideMm'), 'outsideMm', line, problems);
  const source = cell('source').toLowerCase();
  if (source !== '' && !SOURCES.includes(source as (typeof SOURCES)[number])) {
    problems.push({ line, field: 'source', message: `The bearing source must be published, measured or estimated (or empty), got "${cell('source')}"` });
  }
  const bearing: BearingSpec = {};
  if (cell('designation') !== '') bearing.designation = cell('designation');
  if (balls !== undefined) bearing.balls = balls;
  if (ballMm !== undefined) bearing.ballMm = ballMm;
  if (pitchMm !== undefined) bearing.pitchMm = pitchMm;
  if (contactDeg !== undefined) bearing.contactDeg = contactDeg;
  if (givenFactors.length === FACTOR_KEYS.length && factorValues.every((v) => v !== undefined)) {
    const [ftf, bpfo, bpfi, bsf] = factorValues as number[];
    bearing.factors = { ftf, bpfo, bpfi, bsf };
  }
  if (RINGS.includes(ring as RotatingRing)) bearing.rotatingRing = ring as RotatingRing;
  if (SOURCES.includes(source as (typeof SOURCES)[number])) bearing.source = source as (typeof SOURCES)[number];

  const c: ComponentSpec = { name, kind: kind as ComponentKind };
  if (belt !== undefined) c.belt = belt;
  if (pulleyMm !== undefined) c.pulleyMm = pulleyMm;
  if (outsideMm !== undefined) c.outsideMm = outsideMm;
  if (backside !== undefined) c.backside = backside;
  if (fixedRatio !== undefined) c.fixedRatio = fixedRatio;
  if (overrunning !== undefined) c.overrunning = overrunning;
  if (Object.keys(bearing).length > 0) c.bearing = bearing;
  return c;
}
