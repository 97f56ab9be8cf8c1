import { useRef, useState } from 'react';
import type { EngineDetailDto } from '../../../../shared/schemas/engines-api';
import { Button, buttonVariants } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { engineExportUrl } from '../api/engine-queries';
import { useDeleteEngine, useDuplicateEngine, useImportComponentsCsv } from '../api/use-engine-mutations';
import { ImportProblems, importProblemLines, readFileText } from './import-problems';

/**
 * Export (JSON for `analyze --drive`, CSV component table), import a CSV table, duplicate and
 * delete. Writers only see the last three.
 */
export function EngineActions({ engine, canWrite, onDuplicated, onDeleted }: {
  engine: EngineDetailDto; canWrite: boolean; onDuplicated: (copy: EngineDetailDto) => void; onDeleted: () => void;
}) {
  const fileRef = useRef<HTMLInputElement>(null);
  const [problems, setProblems] = useState<string[] | null>(null);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const importCsv = useImportComponentsCsv(engine.id);
  const duplicate = useDuplicateEngine();
  const remove = useDeleteEngine();

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    try {
      await importCsv.mutateAsync(await readFileText(file));
      setProblems(null);
    } catch (error) {
      setProblems(importProblemLines(error));
    } finally {
      if (fileRef.current) fileRef.current.value = '';
    }
  };

  return (
    <>
      <a className={buttonVariants({ variant: 'outline', size: 'sm' })} href={engineExportUrl(engine.id, 'json')} download>Export JSON</a>
      <a className={buttonVariants({ variant: 'outline', size: 'sm' })} href={engineExportUrl(engine.id, 'csv')} download>Export CSV</a>
      {canWrite ? (
        <>
          <Button variant="outline" size="sm" pending={importCsv.isPending} onClick={() => fileRef.current?.click()}>Import CSV</Button>
          <input ref={fileRef} type="file" accept=".csv,text/csv" className="hidden" aria-label="Component table CSV file" onChange={(e) => void onFile(e.target.files?.[0])} />
          <Button variant="outline" size="sm" pending={duplicate.isPending} onClick={() => duplicate.mutate(engine.id, { onSuccess: onDuplicated })}>Duplicate</Button>
          <Button variant="destructive" size="sm" onClick={() => setConfirmDelete(true)}>Delete</Button>
        </>
      ) : null}
      <Dialog open={problems !== null} onClose={() => setProblems(null)} title="The CSV table was not imported" className="max-w-2xl"
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
