import type { CsvImportProblemDto } from '../../../../shared/schemas/engines-api';
import { ApiError } from '../../../lib/api-client';

/** Problems of a rejected import as lines of text: "line 4, pulleyMm: …" or "components[2].kind: …". */
export function importProblemLines(error: unknown): string[] {
  if (!(error instanceof ApiError)) return [error instanceof Error ? error.message : 'The import failed.'];
  if (!Array.isArray(error.details)) return [error.message];
  return (error.details as (CsvImportProblemDto & { path?: string })[]).map((p) => {
    const where = p.line !== undefined ? `line ${p.line}${p.field ? `, ${p.field}` : ''}` : p.path ?? '';
    return where ? `${where}: ${p.message}` : p.message;
  });
}

/** The list of problems under an import; nothing was imported. */
export function ImportProblems({ lines }: { lines: string[] }) {
  if (lines.length === 0) return null;
  return (
    <div role="alert" className="grid gap-2">
      <p className="text-sm font-medium text-destructive">Nothing was imported. Fix these {lines.length} problem(s) and try again:</p>
      <ul className="max-h-64 list-disc overflow-y-auto pl-5 font-mono text-xs leading-relaxed">
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
