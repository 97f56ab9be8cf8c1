/**
 * The component table of a drive document as CSV: one row per component, headers equal to the
 * JSON keys (bearing keys flattened), so that a document's components survive
 * export → edit in a spreadsheet → import unchanged. Empty cells mean "not given"; `false` is
 * written out, so `backside: false` and a missing `backside` stay distinct.
 */
import type { BearingSpec, BeltSpec, ComponentKind, ComponentSpec, RotatingRing } from '../drive/types';
import { formatCsvText, parseCsvText } from './csv-text';

/** The CSV header row, in order. */
export const COMPONENT_CSV_HEADERS = [
  'name', 'kind', 'belt', 'pulleyMm', 'backside', 'fixedRatio', 'overrunning',
  'designation', 'balls', 'ballMm', 'pitchMm', 'contactDeg',
  'ftf', 'bpfo', 'bpfi', 'bsf', 'rotatingRing',
] as const;

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
  | { ok: false; problems: CsvImportProblem[] };

const num = (v: number | undefined): string => (v === undefined ? '' : String(v));
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
    bsf: num(b.factors?.bsf), rotatingRing: b.rotatingRing ?? '',
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

function parseNumber(raw: string, field: string, line: number, problems: CsvImportProblem[]): number | undefined {
  if (raw === '') return undefined;
  // Number('') and Number(' ') are 0 and Number('0x10') is 16: accept plain decimals only.
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(raw)) {
    const hint = /^\d+,\d+$/.test(raw) ? ' (use a decimal point, not a comma)' : '';
    problems.push({ line, field, message: `${field} must be a number, got "${raw}"${hint}` });
    return undefined;
  }
  return Number(raw);
}

function parseBool(raw: string, field: string, line: number, problems: CsvImportProblem[]): boolean | undefined {
  const v = raw.toLowerCase();
  if (v === '') return undefined;
  if (v === 'true' || v === 'yes' || v === '1') return true;
  if (v === 'false' || v === 'no' || v === '0') return false;
  problems.push({ line, field, message: `${field} must be true or false (or empty), got "${raw}"` });
  return undefined;
}

function readHeader(fields: string[], line: number, problems: CsvImportProblem[]): Map<ComponentCsvHeader, number> | null {
  const index = new Map<ComponentCsvHeader, number>();
  const known = new Set<string>(COMPONENT_CSV_HEADERS);
  fields.forEach((f, i) => {
    if (!known.has(f)) {
      problems.push({ line, field: f, message: `unknown column "${f}"; the headers are ${COMPONENT_CSV_HEADERS.join(',')}` });
    } else if (index.has(f as ComponentCsvHeader)) {
      problems.push({ line, field: f, message: `column "${f}" appears twice` });
    } else {
      index.set(f as ComponentCsvHeader, i);
    }
  });
  const missing = COMPONENT_CSV_HEADERS.filter((h) => !index.has(h));
  if (missing.length > 0) {
    problems.push({ line, message: `missing column(s) ${missing.join(', ')}; the header row must be ${COMPONENT_CSV_HEADERS.join(',')}` });
  }
  return problems.length === 0 ? index : null;
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
    problems.push({ line: 1, message: `the file is empty; the first row must be the headers ${COMPONENT_CSV_HEADERS.join(',')}` });
    return { ok: false, problems };
  }
  const [head, ...rows] = records;
  const index = readHeader(head.fields, head.line, problems);
  if (!index) return { ok: false, problems };
  if (rows.length === 0) problems.push({ line: head.line, message: 'no component rows after the header; a drive needs at least the crankshaft' });
  const beltByLower = new Map(belts.map((b) => [b.name.toLowerCase(), b.name]));
  const components: ComponentSpec[] = [];
  const lines: number[] = [];
  for (const { line, fields } of rows) {
    if (fields.length !== head.fields.length) {
      problems.push({ line, message: `row has ${fields.length} fields, the header has ${head.fields.length}` });
      continue;
    }
    const cell = (h: ComponentCsvHeader): string => fields[index.get(h)!];
    const c = readRow(cell, line, beltByLower, problems);
    if (c) { components.push(c); lines.push(line); }
  }
  problems.sort((a, b) => a.line - b.line);
  return problems.length > 0 ? { ok: false, problems } : { ok: true, components, lines };
}

function readRow(
  cell: (h: ComponentCsvHeader) => string,
  line: number,
  beltByLower: Map<string, string>,
  problems: CsvImportProblem[],
): ComponentSpec | null {
  const before = problems.length;
  const name = cell('name');
  if (name === '') problems.push({ line, field: 'name', message: 'name is empty; every component needs a name' });
  const kind = cell('kind');
  if (!COMPONENT_KINDS.includes(kind as ComponentKind)) {
    problems.push({ line, field: 'kind', message: `kind "${kind}" is not one of ${COMPONENT_KINDS.join(', ')}` });
  }
  let belt: string | undefined;
  if (cell('belt') !== '') {
    belt = beltByLower.get(cell('belt').toLowerCase());
    if (belt === undefined) {
      const known = [...beltByLower.values()];
      problems.push({
        line, field: 'belt',
        message: `belt "${cell('belt')}" is not defined for this engine (${known.length ? `belts: ${known.join(', ')}` : 'it has no belts'}); add the belt first`,
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
    problems.push({ line, field: missing[0], message: `factors need all of ftf, bpfo, bpfi, bsf; ${missing.join(', ')} missing` });
  }
  const ring = cell('rotatingRing').toLowerCase();
  if (ring !== '' && !RINGS.includes(ring as RotatingRing)) {
    problems.push({ line, field: 'rotatingRing', message: `rotatingRing must be inner or outer (or empty), got "${cell('rotatingRing')}"` });
  }
  if (problems.length > before) return null;

  const bearing: BearingSpec = {};
  if (cell('designation') !== '') bearing.designation = cell('designation');
  if (balls !== undefined) bearing.balls = balls;
  if (ballMm !== undefined) bearing.ballMm = ballMm;
  if (pitchMm !== undefined) bearing.pitchMm = pitchMm;
  if (contactDeg !== undefined) bearing.contactDeg = contactDeg;
  if (givenFactors.length === FACTOR_KEYS.length) {
    const [ftf, bpfo, bpfi, bsf] = factorValues as number[];
    bearing.factors = { ftf, bpfo, bpfi, bsf };
  }
  if (ring !== '') bearing.rotatingRing = ring as RotatingRing;

  const c: ComponentSpec = { name, kind: kind as ComponentKind };
  if (belt !== undefined) c.belt = belt;
  if (pulleyMm !== undefined) c.pulleyMm = pulleyMm;
  if (backside !== undefined) c.backside = backside;
  if (fixedRatio !== undefined) c.fixedRatio = fixedRatio;
  if (overrunning !== undefined) c.overrunning = overrunning;
  if (Object.keys(bearing).length > 0) c.bearing = bearing;
  return c;
}
