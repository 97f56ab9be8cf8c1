/**
 * Import and export of an engine: the drive JSON document (the `analyze --drive` file, with shop
 * designations written out with their geometry and source), the whole engine as one CSV file
 * (shared/drive-io/engine-csv.ts) and the component table alone. An import that has any problem
 * writes nothing and reports every problem at once (CSV line and column); a preview shows what
 * an import would change (rows added, changed, removed) without writing.
 */
import { findBearing } from '../../shared/drive/bearing-table';
import type { DriveDocument } from '../../shared/drive/types';
import { toAnalyzeDocument, UnknownDesignationError } from '../../shared/drive-io/analyze-document';
import type { CsvImportProblem } from '../../shared/drive-io/component-table';
import { componentsToCsv } from '../../shared/drive-io/component-table';
import { countChanges, diffEngines } from '../../shared/drive-io/engine-diff';
import { engineToCsv, isEngineCsv, parseEngineCsv } from '../../shared/drive-io/engine-csv';
import { importComponentCsv } from '../../shared/drive-io/import-components';
import type { CsvImportPreviewDto } from '../../shared/schemas/engines-api';
import { AppError } from '../errors';
import { createEngine, getEngine, replaceEngine, type EngineDocument, type EngineWriter } from './engines';

/** The engine as the drive document `analyze --drive` reads (designations with their geometry and source). */
export async function exportEngineJson(shopId: number, id: number): Promise<DriveDocument> {
  const { doc, shopTable } = await getEngine(shopId, id);
  try {
    const out = toAnalyzeDocument(doc, (d) => findBearing(d, shopTable));
    delete (out as DriveDocument & { notes?: string }).notes;
    return out;
  } catch (error) {
    if (error instanceof UnknownDesignationError) throw new AppError(409, 'bearing_unknown', error.message);
    throw error;
  }
}

/** The whole engine as CSV text (engine, belts, components), with its name for the download. */
export async function exportEngineCsv(shopId: number, id: number): Promise<{ name: string; csv: string }> {
  const { doc } = await getEngine(shopId, id);
  return { name: doc.name, csv: engineToCsv(doc) };
}

/** The component table alone as CSV text. */
export async function exportComponentsCsv(shopId: number, id: number): Promise<{ name: string; csv: string }> {
  const { doc } = await getEngine(shopId, id);
  return { name: doc.name, csv: componentsToCsv(doc.components) };
}

function csvError(problems: CsvImportProblem[] | { line?: number; field?: string; path?: string; message: string }[]): AppError {
  const first = problems[0];
  const where = first.line !== undefined ? `Line ${first.line}${first.field ? `, column ${first.field}` : ''}: ` : '';
  const more = problems.length > 1 ? ` (and ${problems.length - 1} more problem${problems.length > 2 ? 's' : ''})` : '';
  return new AppError(400, 'validation_failed', `${where}${first.message}${more}; nothing was imported`, problems);
}

/**
 * The document a CSV text gives when imported into `current`: a whole-engine file replaces the
 * whole engine; a component table replaces the components and keeps the engine and its belts.
 * Throws 400 with every problem (line, column, message).
 */
export function documentFromCsv(current: EngineDocument | null, csvText: string): { doc: EngineDocument; rows: number } {
  if (isEngineCsv(csvText)) {
    const read = parseEngineCsv(csvText);
    if (!read.ok) throw csvError(read.problems);
    return { doc: read.document, rows: read.document.components.length + read.document.belts.length };
  }
  if (!current) {
    throw new AppError(400, 'validation_failed', 'To create an engine, the file must start with the [engine] block (export an engine as CSV to see the layout)',
      [{ line: 1, message: 'the file is a component table only; a new engine needs the [engine] and [belts] blocks too' }]);
  }
  const result = importComponentCsv(current, csvText);
  if (!result.ok) throw csvError(result.problems);
  return { doc: { ...result.document, ...(current.notes ? { notes: current.notes } : {}) }, rows: result.document.components.length };
}

/** Maps a designation problem of the shop's table back to the CSV line of its component. */
function withLines(error: unknown, csvText: string): unknown {
  if (!(error instanceof AppError) || error.code !== 'validation_failed' || !Array.isArray(error.details)) return error;
  const lines = isEngineCsv(csvText) ? (() => { const r = parseEngineCsv(csvText); return r.ok ? r.lines.components : []; })() : [];
  const problems = (error.details as { path?: string; message: string; line?: number }[]).map((p) => {
    const m = p.path ? /^components\[(\d+)\]/.exec(p.path) : null;
    return m && p.line === undefined && lines[Number(m[1])] !== undefined ? { line: lines[Number(m[1])], field: 'designation', message: p.message } : p;
  });
  return new AppError(400, 'validation_failed', `${error.message}; nothing was imported`, problems);
}

/** What importing `csvText` into the engine would change, without writing (the import dialog's preview). */
export async function previewEngineCsv(shopId: number, id: number, csvText: string): Promise<CsvImportPreviewDto> {
  const { engine, doc: current } = await getEngine(shopId, id);
  const { doc, rows } = documentFromCsv(current, csvText);
  const changes = diffEngines(current, doc);
  return { version: engine.version, rows, wholeEngine: isEngineCsv(csvText), changes, parts: countChanges(changes, 'part'), belts: countChanges(changes, 'belt') };
}

/** Imports a CSV into an engine (every problem in one 400; nothing written unless all rows are good). */
export async function importEngineCsv(shopId: number, id: number, csvText: string, expectedVersion: number | undefined, writer: EngineWriter) {
  let rows = 0;
  try {
    const result = await replaceEngine(shopId, id, expectedVersion, writer, (current) => {
      const read = documentFromCsv(current, csvText);
      rows = read.rows;
      return read.doc;
    });
    return { ...result, rows };
  } catch (error) {
    throw withLines(error, csvText);
  }
}

/** Creates an engine from a whole-engine CSV. */
export async function createEngineFromCsv(shopId: number, csvText: string, writer: EngineWriter) {
  const { doc, rows } = documentFromCsv(null, csvText);
  try {
    return { ...(await createEngine(shopId, doc, writer, 'import')), rows };
  } catch (error) {
    throw withLines(error, csvText);
  }
}
