/**
 * Importing a component table into an existing engine: read the CSV (field by field, every row),
 * put the rows in place of the document's components, then validate the whole document against
 * the drive schema (ranges, unique names, one crankshaft, chained belts) and map each problem back
 * to the CSV line it came from. Nothing is returned unless every row is good.
 */
import type { DriveDocument } from '../drive/types';
import { DriveDocumentError, describeDrivePath, parseDriveDocument } from '../schemas/drive';
import { parseComponentCsv, type CsvImportProblem } from './component-table';

/** A problem of an import: its CSV line (absent when it lies outside the file, e.g. a belt's driver) and JSON path. */
export interface ComponentImportProblem extends Omit<CsvImportProblem, 'line'> {
  line?: number;
  /** JSON path in the resulting document, e.g. `components[2].pulleyMm`, when the drive schema found it. */
  path?: string;
}

/** The new document with the CSV line of each component, or every problem found. */
export type ComponentImportResult =
  | { ok: true; document: DriveDocument; lines: number[] }
  | { ok: false; problems: ComponentImportProblem[] };

const COMPONENT_PATH = /^components\[(\d+)\](?:\.(.+))?$/;

/**
 * Replaces `doc`'s components with the rows of `csvText`. Belts stay as they are; rows must name
 * them. Problems carry the CSV line (1-based, header = line 1) and, from the schema, the JSON path
 * and the column (the path's last segment: `bearing.ballMm` → `ballMm`).
 */
export function importComponentCsv(doc: DriveDocument, csvText: string): ComponentImportResult {
  const read = parseComponentCsv(csvText, doc.belts);
  const components = read.components ?? [];
  const lines = read.lines ?? [];
  const problems: ComponentImportProblem[] = read.ok ? [] : [...read.problems];
  // The header itself is wrong: no row can be read, so there is nothing more to check.
  if (!read.ok && !read.components) return { ok: false, problems };
  const candidate: DriveDocument = { ...doc, components };
  try {
    const parsed = parseDriveDocument(candidate);
    return problems.length > 0 ? { ok: false, problems } : { ok: true, document: parsed, lines };
  } catch (error) {
    if (!(error instanceof DriveDocumentError)) throw error;
    // Every row's problems in one pass: the schema's are added unless that line and column already has one.
    const seen = new Set(problems.map((p) => `${p.line}:${p.field ?? ''}`));
    const seenLines = new Set(problems.filter((p) => !p.field).map((p) => p.line));
    for (const issue of error.issues) {
      const m = COMPONENT_PATH.exec(issue.path);
      if (!m) {
        problems.push({ path: issue.path, message: `${describeDrivePath(issue.path, candidate)}: ${issue.message}` });
        continue;
      }
      const line = lines[Number(m[1])];
      const rest = m[2];
      const field = rest ? rest.split('.').pop()!.replace(/\[\d+\]$/, '') : undefined;
      if (seen.has(`${line}:${field ?? ''}`) || seenLines.has(line)) continue;
      seen.add(`${line}:${field ?? ''}`);
      problems.push({ line, path: issue.path, ...(field ? { field } : {}), message: issue.message });
    }
    problems.sort((a, b) => (a.line ?? Infinity) - (b.line ?? Infinity));
    return { ok: false, problems };
  }
}
