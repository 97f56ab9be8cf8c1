/**
 * Import and export of an engine: the drive JSON document (the `analyze --drive` file, with shop
 * designations written out as geometry) and the component table as CSV (shared/drive-io). An
 * import that has any problem writes nothing and reports every problem (JSON path, or CSV line).
 */
import { findBearing } from '../../shared/drive/bearing-table';
import type { DriveDocument } from '../../shared/drive/types';
import { toAnalyzeDocument, UnknownDesignationError } from '../../shared/drive-io/analyze-document';
import { componentsToCsv } from '../../shared/drive-io/component-table';
import { importComponentCsv } from '../../shared/drive-io/import-components';
import { AppError } from '../errors';
import { shopBearingTable } from './bearings';
import { loadDriveDocument } from './engine-drive';
import { checkEngineDocument, findEngine, replaceDrive } from './engines';

/** The engine as the drive document `analyze --drive` reads (designations resolved to geometry). */
export async function exportEngineJson(shopId: number, id: number): Promise<DriveDocument> {
  const engine = await findEngine(shopId, id);
  const [doc, shopTable] = await Promise.all([loadDriveDocument(engine), shopBearingTable(shopId)]);
  try {
    const out = toAnalyzeDocument(doc, (d) => findBearing(d, shopTable));
    delete (out as DriveDocument & { notes?: string }).notes;
    return out;
  } catch (error) {
    if (error instanceof UnknownDesignationError) throw new AppError(409, 'bearing_unknown', error.message);
    throw error;
  }
}

/** The engine's component table as CSV text, with its name for the download. */
export async function exportEngineCsv(shopId: number, id: number): Promise<{ name: string; csv: string }> {
  const engine = await findEngine(shopId, id);
  const doc = await loadDriveDocument(engine);
  return { name: engine.name, csv: componentsToCsv(doc.components) };
}

/**
 * Replaces an engine's components with a CSV table. Every bad row or field comes back in one
 * 400 `validation_failed` whose details list `{ line, field?, path?, message }`; nothing is
 * written unless all rows are good (and designations resolve in the shop's table).
 */
export async function importEngineCsv(shopId: number, id: number, csvText: string) {
  const engine = await findEngine(shopId, id);
  const current = await loadDriveDocument(engine);
  const result = importComponentCsv(current, csvText);
  if (!result.ok) {
    const first = result.problems[0];
    const where = first.line !== undefined ? `line ${first.line}` : first.path ?? 'file';
    const more = result.problems.length > 1 ? ` (and ${result.problems.length - 1} more)` : '';
    throw new AppError(400, 'validation_failed', `${where}: ${first.message}${more}; nothing was imported`, result.problems);
  }
  const shopTable = await shopBearingTable(shopId);
  try {
    checkEngineDocument(result.document, shopTable);
  } catch (error) {
    if (error instanceof AppError && Array.isArray(error.details)) {
      // Designation problems point at a component row: give that row's CSV line.
      const problems = (error.details as { path: string; message: string }[]).map((p) => {
        const m = /^components\[(\d+)\]/.exec(p.path);
        return m ? { line: result.lines[Number(m[1])], field: 'designation', path: p.path, message: p.message } : p;
      });
      throw new AppError(400, 'validation_failed', `${error.message}; nothing was imported`, problems);
    }
    throw error;
  }
  return replaceDrive(shopId, id, result.document);
}
