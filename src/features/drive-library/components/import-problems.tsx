import { describeCsvProblem } from '../../../../shared/drive-io/engine-csv';
import { describeDrivePath } from '../../../../shared/schemas/drive';
import type { CsvImportProblemDto } from '../../../../shared/schemas/engines-api';
import { ApiError } from '../../../lib/api-client';

/** Problems of a rejected import as lines of text: "Line 4, column pulleyMm (Pulley diameter): …". */
export function importProblemLines(error: unknown): string[] {
  if (!(error instanceof ApiError)) return [error instanceof Error ? error.message : 'The import failed.'];
  if (!Array.isArray(error.details)) return [error.message];
  return (error.details as (CsvImportProblemDto & { path?: string })[]).map((p) => {
    if (p.line !== undefined || !p.path) return describeCsvProblem(p);
    // A JSON document's problem: say which part or belt, in words ("Part 2 "Alternator": …").
    const where = describeDrivePath(p.path);
    if (where === 'the engine') return p.message;
    return `${where[0].toUpperCase()}${where.slice(1)}: ${p.message}`;
  });
}

/** The list of problems under an import; nothing was imported. */
export function ImportProblems({ lines }: { lines: string[] }) {
  if (lines.length === 0) return null;
  return (
    <div role="alert" className="grid gap-2">
      <p className="text-sm font-medium text-destructive">Nothing was imported. Fix these {lines.length} problem(s) and try again:</p>
      <ul className="max-h-64 list-disc overflow-y-auto pl-5 text-xs leading-relaxed">
        {lines.map((l, i) => <li key={i}>{l}</li>)}
      </ul>
    </div>
  );
}

/** Reads a chosen file as text. */
export function readFileText(file: File): Promise<string> {
  if (typeof file.text === 'function') return file.text();
  return new Promise((resolve, reject) => {
    const reader = new FileReader();
    reader.onload = () => resolve(String(reader.result));
    reader.onerror = () => reject(reader.error);
    reader.readAsText(file);
  });
}
