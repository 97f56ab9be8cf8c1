import { useRef, useState } from 'react';
import type { CsvImportPreviewDto, EngineDetailDto } from '../../../../shared/schemas/engines-api';
import { Button, buttonVariants } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { toast } from '../../../components/ui/toast';
import { engineExportUrl } from '../api/engine-queries';
import { useDeleteEngine, useDuplicateEngine, useImportComponentsCsv, usePreviewEngineCsv } from '../api/use-engine-mutations';
import { describeChange } from './engine-history';
import { ImportProblems, importProblemLines, readFileText } from './import-problems';

/** What an import will do, before the user confirms it. */
function ImportPreview({ preview }: { preview: CsvImportPreviewDto }) {
  const { parts, belts } = preview;
  const none = preview.changes.length === 0;
  return (
    <div className="grid gap-3 text-sm">
      <p>
        The file has {preview.rows} row{preview.rows === 1 ? '' : 's'}{preview.wholeEngine ? ' and holds the whole engine (its fields and belts too)' : ' of parts; the engine and its belts stay as they are'}.
      </p>
      {none ? <p className="font-medium">Nothing would change: the file matches the engine.</p> : (
        <>
          <p className="font-medium">
            Parts: {parts.added} added, {parts.changed} changed, {parts.removed} removed
            {preview.wholeEngine ? ` · Belts: ${belts.added} added, ${belts.changed} changed, ${belts.removed} removed` : ''}
          </p>
          <ul className="max-h-64 list-disc overflow-y-auto pl-5 text-xs leading-relaxed" aria-label="Changes">
            {preview.changes.map((c, i) => <li key={i}>{describeChange(c)}</li>)}
          </ul>
        </>
      )}
    </div>
  );
}

/**
 * Export (JSON for `analyze --drive`, the whole engine as CSV), import a CSV (previewed: rows
 * added, changed, removed, then confirmed), duplicate and delete. Writers only see the last three.
 */
export function EngineActions({ engine, canWrite, onDuplicated, onDeleted }: {
  engine: EngineDetailDto; canWrite: boolean; onDuplicated: (copy: EngineDetailDto) => void; onDeleted: () => void;
}) {
  const fileRef = useRef<HTMLInputElement>(null);
  const [problems, setProblems] = useState<string[] | null>(null);
  const [pending, setPending] = useState<{ csv: string; preview: CsvImportPreviewDto } | null>(null);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const previewCsv = usePreviewEngineCsv(engine.id);
  const importCsv = useImportComponentsCsv(engine.id);
  const duplicate = useDuplicateEngine();
  const remove = useDeleteEngine();

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    try {
      const csv = await readFileText(file);
      setPending({ csv, preview: await previewCsv.mutateAsync(csv) });
      setProblems(null);
    } catch (error) {
      setProblems(importProblemLines(error));
    } finally {
      if (fileRef.current) fileRef.current.value = '';
    }
  };

  const confirmImport = async () => {
    if (!pending) return;
    try {
      const result = await importCsv.mutateAsync({ csv: pending.csv, version: pending.preview.version });
      toast({ title: `Imported ${result.imported.rows} row${result.imported.rows === 1 ? '' : 's'}`, description: `${engine.name} is now version ${result.engine.version}.` });
      setPending(null);
    } catch (error) {
      setPending(null);
      setProblems(importProblemLines(error));
    }
  };

  return (
    <>
      <a className={buttonVariants({ variant: 'outline', size: 'sm' })} href={engineExportUrl(engine.id, 'json')} download>Export JSON</a>
      <a className={buttonVariants({ variant: 'outline', size: 'sm' })} href={engineExportUrl(engine.id, 'csv')} download>Export CSV</a>
      {canWrite ? (
        <>
          <Button variant="outline" size="sm" pending={previewCsv.isPending} onClick={() => fileRef.current?.click()}>Import CSV</Button>
          <input ref={fileRef} type="file" accept=".csv,text/csv" className="hidden" aria-label="Engine CSV file" onChange={(e) => void onFile(e.target.files?.[0])} />
          <Button variant="outline" size="sm" pending={duplicate.isPending} onClick={() => duplicate.mutate(engine.id, { onSuccess: onDuplicated })}>Duplicate</Button>
          <Button variant="destructive" size="sm" onClick={() => setConfirmDelete(true)}>Delete</Button>
        </>
      ) : null}
      <Dialog open={pending !== null} onClose={() => setPending(null)} title="Import this CSV?" className="max-w-2xl"
        description="Check what will change. Nothing is written until you confirm."
        footer={(
          <>
            <Button variant="outline" onClick={() => setPending(null)}>Cancel</Button>
            <Button pending={importCsv.isPending} disabled={pending?.preview.changes.length === 0} onClick={() => void confirmImport()}>Replace with the file</Button>
          </>
        )}>
        {pending ? <ImportPreview preview={pending.preview} /> : null}
      </Dialog>
      <Dialog open={problems !== null} onClose={() => setProblems(null)} title="The CSV was not imported" className="max-w-2xl"
        footer={<Button onClick={() => setProblems(null)}>Close</Button>}>
        <ImportProblems lines={problems ?? []} />
      </Dialog>
      <Dialog open={confirmDelete} onClose={() => setConfirmDelete(false)} title={`Delete ${engine.name}?`}
        description="The engine, its belts and its components are removed. An engine that cases use cannot be deleted."
        footer={(
          <>
            <Button variant="outline" onClick={() => setConfirmDelete(false)}>Keep it</Button>
            <Button variant="destructive" pending={remove.isPending}
              onClick={() => remove.mutate(engine.id, { onSuccess: onDeleted, onSettled: () => setConfirmDelete(false) })}>Delete engine</Button>
          </>
        )} />
    </>
  );
}
