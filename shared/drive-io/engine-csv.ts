/**
 * The whole engine as one CSV file, so that a spreadsheet can create an engine and an export
 * round-trips: three blocks, each opened by a title row and its own header row, blank lines
 * between them (one sheet in any spreadsheet):
 *
 *   [engine]
 *   name,cylinders,firingOrder,idleRpm,notes
 *   Demo 1.6 I4,4,1-3-4-2,750,
 *
 *   [belts]
 *   name,lengthMm,driver,driverPulleyMm
 *   Main,1900,Crankshaft,160
 *
 *   [components]
 *   name,kind,belt,pulleyMm,… (COMPONENT_CSV_HEADERS)
 *
 * A file without the [engine] title is the component table alone (component-table.ts). Problems
 * carry the line of the CSV text (1-based) and the column header, and say what to do.
 */
import type { BeltSpec, DriveDocument } from '../drive/types';
import { cleanNumber } from '../drive/measured-diameter';
import { DriveDocumentError, parseDriveDocument } from '../schemas/drive';
import { COLUMN_LABELS, COMPONENT_CSV_HEADERS, componentToCsvRow, parseNumber, readComponentRecords, type CsvImportProblem } from './component-table';
import { formatCsvText, parseCsvText, type CsvRecord } from './csv-text';

/** Columns of the [engine] block. */
export const ENGINE_CSV_HEADERS = ['name', 'cylinders', 'firingOrder', 'idleRpm', 'notes'] as const;
/** Columns of the [belts] block. */
export const BELT_CSV_HEADERS = ['name', 'lengthMm', 'driver', 'driverPulleyMm'] as const;

type Block = 'engine' | 'belts' | 'components';
const TITLE = /^\[(engine|belts|components)\]$/i;

const num = (v: number | undefined): string => (v === undefined ? '' : String(cleanNumber(v)));

/** Writes a whole engine (with its notes) as the three-block CSV. */
export function engineToCsv(doc: DriveDocument & { notes?: string }): string {
  const rows: string[][] = [
    ['[engine]'], [...ENGINE_CSV_HEADERS],
    [doc.name, String(doc.cylinders), doc.firingOrder.join('-'), num(doc.idleRpm), doc.notes ?? ''],
    [''],
    ['[belts]'], [...BELT_CSV_HEADERS],
    ...doc.belts.map((b) => [b.name, num(b.lengthMm), b.driver, num(b.driverPulleyMm)]),
    [''],
    ['[components]'], [...COMPONENT_CSV_HEADERS],
    ...doc.components.map(componentToCsvRow),
  ];
  return formatCsvText(rows);
}

/** Whether a CSV text is the whole-engine form (its first non-blank row is the [engine] title). */
export function isEngineCsv(text: string): boolean {
  const first = parseCsvText(text.slice(0, 2000)).records[0];
  return Boolean(first && TITLE.test(first.fields[0] ?? '') && first.fields[0].toLowerCase() === '[engine]');
}

/** Where each part of the resulting document came from in the file. */
export interface EngineCsvLines {
  engine: number;
  belts: number[];
  components: number[];
  /** Header line of each block (for problems about a whole list). */
  blocks: Partial<Record<Block, number>>;
}

/** The document read from a whole-engine CSV, or every problem found (all rows, one pass). */
export type EngineCsvResult =
  | { ok: true; document: DriveDocument & { notes?: string }; lines: EngineCsvLines }
  | { ok: false; problems: CsvImportProblem[] };

const trimTrailing = (r: CsvRecord): CsvRecord => {
  const fields = [...r.fields];
  while (fields.length > 1 && fields[fields.length - 1] === '') fields.pop();
  return { line: r.line, fields };
};

function headerIndex(padded: CsvRecord, expected: readonly string[], block: string, problems: CsvImportProblem[]): Map<string, number> | null {
  const head = trimTrailing(padded);
  const before = problems.length;
  const index = new Map<string, number>();
  head.fields.forEach((f, i) => {
    if (!expected.includes(f)) problems.push({ line: head.line, field: f, message: `Crankwise does not know the column "${f}" in the [${block}] block; its headers are ${expected.join(',')}` });
    else index.set(f, i);
  });
  const missing = expected.filter((h) => !index.has(h) && h !== 'notes' && h !== 'idleRpm');
  if (missing.length) problems.push({ line: head.line, message: `The [${block}] block lacks the column(s) ${missing.join(', ')}; its header row must be ${expected.join(',')}` });
  return problems.length === before ? index : null;
}

/** Maps a JSON path of the assembled document back to a line and column of the file. */
function locate(path: string, lines: EngineCsvLines): { line?: number; field?: string } {
  const part = /^(components|belts)\[(\d+)\](?:\.(.+))?$/.exec(path);
  if (part) {
    const line = (part[1] === 'components' ? lines.components : lines.belts)[Number(part[2])];
    const field = part[3]?.split('.').pop();
    return { line, ...(field ? { field } : {}) };
  }
  if (path === 'components' || path === 'belts') return { line: lines.blocks[path] };
  const field = path.split('.')[0];
  return { line: lines.engine, ...(field && field !== '$' ? { field } : {}) };
}

/**
 * Reads a whole-engine CSV: every block and every row is checked, and every problem comes back
 * at once with its line and column; then the assembled document is checked by the drive schema
 * and those problems are mapped back to their line and column too.
 */
export function parseEngineCsv(text: string): EngineCsvResult {
  const { records, problems: syntax } = parseCsvText(text);
  const problems: CsvImportProblem[] = syntax.map((p) => ({ line: p.line, message: p.message }));
  const blocks = new Map<Block, CsvRecord[]>();
  const blockLine: Partial<Record<Block, number>> = {};
  let current: Block | null = null;
  for (const r of records) {
    // A spreadsheet pads every row to the widest one: a title row may come with empty cells after it.
    const trimmed = trimTrailing(r);
    const title = trimmed.fields.length === 1 ? TITLE.exec(trimmed.fields[0]) : null;
    if (title) {
      current = title[1].toLowerCase() as Block;
      if (blocks.has(current)) problems.push({ line: r.line, message: `The [${current}] block appears twice; keep one` });
      blocks.set(current, []);
      blockLine[current] = r.line;
      continue;
    }
    if (!current) {
      problems.push({ line: r.line, message: 'A whole-engine file starts with the title row [engine]' });
      continue;
    }
    blocks.get(current)!.push(r);
  }
  for (const b of ['engine', 'components'] as const) {
    if (!blocks.has(b)) problems.push({ line: records.at(-1)?.line ?? 1, message: `The [${b}] block is missing; see the example in the README` });
  }
  const lines: EngineCsvLines = { engine: blockLine.engine ?? 1, belts: [], components: [], blocks: blockLine };

  // [engine]: one header and one row.
  const doc: DriveDocument & { notes?: string } = { name: '', cylinders: Number.NaN, firingOrder: [], belts: [], components: [] };
  const engineRows = blocks.get('engine') ?? [];
  if (engineRows.length > 0) {
    const [head, ...rows] = engineRows;
    const index = headerIndex(head, ENGINE_CSV_HEADERS, 'engine', problems);
    if (rows.length !== 1) problems.push({ line: head.line, message: `The [engine] block holds exactly one row under its header (found ${rows.length})` });
    const row = rows[0];
    if (index && row) {
      lines.engine = row.line;
      const cell = (h: string) => (index.has(h) ? row.fields[index.get(h)!] ?? '' : '');
      doc.name = cell('name');
      const cylinders = parseNumber(cell('cylinders'), 'cylinders', row.line, problems);
      doc.cylinders = cylinders ?? Number.NaN;
      const firing = cell('firingOrder').split(/[\s;-]+/).filter(Boolean);
      if (firing.some((f) => !/^\d+$/.test(f))) {
        problems.push({ line: row.line, field: 'firingOrder', message: `Write the firing order as cylinder numbers with dashes, e.g. 1-3-4-2 (got "${cell('firingOrder')}")` });
      }
      doc.firingOrder = firing.map(Number);
      const idle = parseNumber(cell('idleRpm'), 'idleRpm', row.line, problems);
      if (idle !== undefined) doc.idleRpm = idle;
      if (cell('notes')) doc.notes = cell('notes');
    }
  }

  // [belts]: optional (a drive with only fixed-ratio parts has none).
  const beltRows = blocks.get('belts') ?? [];
  if (beltRows.length > 0) {
    const [head, ...rows] = beltRows;
    const index = headerIndex(head, BELT_CSV_HEADERS, 'belts', problems);
    if (index) {
      for (const row of rows) {
        const cell = (h: string) => row.fields[index.get(h)!] ?? '';
        const lengthMm = parseNumber(cell('lengthMm'), 'lengthMm', row.line, problems);
        const driverPulleyMm = parseNumber(cell('driverPulleyMm'), 'driverPulleyMm', row.line, problems);
        const belt: BeltSpec = { name: cell('name'), lengthMm: lengthMm ?? Number.NaN, driver: cell('driver'), driverPulleyMm: driverPulleyMm ?? Number.NaN };
        doc.belts.push(belt);
        lines.belts.push(row.line);
      }
    }
  }

  // [components]: the component table's rows, belts matched against the [belts] block.
  const componentRows = blocks.get('components') ?? [];
  if (componentRows.length > 0) {
    const [head, ...rows] = componentRows;
    const read = readComponentRecords(head, rows, doc.belts.filter((b) => b.name), problems);
    doc.components = read.components ?? [];
    lines.components = read.lines ?? [];
  }

  // Every row's problems in one pass: the schema's are added unless that line and column already has one.
  try {
    const parsed = parseDriveDocument(doc);
    if (problems.length > 0) return { ok: false, problems: sortProblems(problems) };
    return { ok: true, document: { ...parsed, ...(doc.notes ? { notes: doc.notes } : {}) }, lines };
  } catch (error) {
    if (!(error instanceof DriveDocumentError)) throw error;
    const seen = new Set(problems.map((p) => `${p.line}:${p.field ?? ''}`));
    const seenLines = new Set(problems.filter((p) => !p.field).map((p) => p.line));
    for (const issue of error.issues) {
      const at = locate(issue.path, lines);
      const k = `${at.line}:${at.field ?? ''}`;
      if (seen.has(k) || seenLines.has(at.line ?? -1)) continue;
      seen.add(k);
      problems.push({ line: at.line ?? 1, ...(at.field ? { field: at.field } : {}), message: issue.message });
    }
    return { ok: false, problems: sortProblems(problems) };
  }
}

function sortProblems(problems: CsvImportProblem[]): CsvImportProblem[] {
  return [...problems].sort((a, b) => (a.line ?? 0) - (b.line ?? 0));
}

/** "line 7, Pulley diameter (pulleyMm): …": a problem as one line of text for the user. */
export function describeCsvProblem(p: { line?: number; field?: string; message: string }): string {
  const where = [p.line !== undefined ? `Line ${p.line}` : '', p.field ? `column ${p.field}${COLUMN_LABELS[p.field] ? ` (${COLUMN_LABELS[p.field]})` : ''}` : ''].filter(Boolean).join(', ');
  return where ? `${where}: ${p.message}` : p.message;
}
