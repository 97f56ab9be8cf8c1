import { useQuery } from '@tanstack/react-query';
import { useDeferredValue, useRef, useState } from 'react';
import { Link } from 'react-router-dom';
import { Pager } from '../../../components/ui/pager';
import type { EngineDetailDto, EngineListQuery } from '../../../../shared/schemas/engines-api';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { Input } from '../../../components/ui/input';
import { LoadingState } from '../../../components/ui/spinner';
import { EmptyState } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { DEFAULT_ENGINE_FILTERS, enginesQueryOptions } from '../api/engine-queries';
import { useImportEngineCsv, useImportEngineJson } from '../api/use-engine-mutations';
import { ImportProblems, importProblemLines, readFileText } from './import-problems';

type SortField = 'name' | 'updatedAt';

function SortHeader({ field, label, sort, onSort, className }: { field: SortField; label: string; sort: EngineListQuery['sort']; onSort: (s: EngineListQuery['sort']) => void; className?: string }) {
  const active = sort.replace('-', '') === field;
  const desc = sort.startsWith('-');
  return (
    <TableHead className={className} aria-sort={active ? (desc ? 'descending' : 'ascending') : 'none'}>
      <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-foreground" onClick={() => onSort(active && !desc ? `-${field}` : field)}>
        {label}<span aria-hidden>{active ? (desc ? '↓' : '↑') : '↕'}</span>
      </button>
    </TableHead>
  );
}

/**
 * The shop's engines: search by name, sort by name or last change, page through, and (writers)
 * import a drive document as a new engine or start a new one.
 */
export function EnginesTable({ enginePath, newEnginePath, canWrite, onImported }: {
  enginePath: (id: number) => string; newEnginePath: string; canWrite: boolean; onImported: (engine: EngineDetailDto) => void;
}) {
  const [filters, setFilters] = useState<EngineListQuery>(DEFAULT_ENGINE_FILTERS);
  const [search, setSearch] = useState('');
  const deferredSearch = useDeferredValue(search.trim());
  const effective = { ...filters, search: deferredSearch, page: deferredSearch === filters.search ? filters.page : 1 };
  const { data, isPending, isError } = useQuery(enginesQueryOptions(effective));
  const fileRef = useRef<HTMLInputElement>(null);
  const [problems, setProblems] = useState<string[] | null>(null);
  const importJson = useImportEngineJson();
  const importCsv = useImportEngineCsv();

  const onFile = async (file: File | undefined) => {
    if (!file) return;
    try {
      const text = await readFileText(file);
      // A whole-engine CSV (the Drive library's CSV export) creates an engine too.
      if (/\.csv$/i.test(file.name) || text.trimStart().startsWith('[engine]')) {
        onImported(await importCsv.mutateAsync(text));
        return;
      }
      let doc: unknown;
      try {
        doc = JSON.parse(text);
      } catch {
        setProblems([`${file.name} is not JSON; export a drive document (.drive.json) and choose that file`]);
        return;
      }
      onImported(await importJson.mutateAsync(doc));
    } catch (error) {
      setProblems(importProblemLines(error));
    } finally {
      if (fileRef.current) fileRef.current.value = '';
    }
  };

  const total = data?.total ?? 0;
  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <Input type="search" aria-label="Search engines" placeholder="Search by name" className="max-w-72" value={search} onChange={(e) => setSearch(e.target.value)} />
        {canWrite ? (
          <div className="ml-auto flex gap-2">
            <Button variant="outline" pending={importJson.isPending || importCsv.isPending} onClick={() => fileRef.current?.click()}>Import JSON or CSV</Button>
            <input ref={fileRef} type="file" accept=".json,application/json,.csv,text/csv" className="hidden" aria-label="Drive document file" onChange={(e) => void onFile(e.target.files?.[0])} />
            <Link to={newEnginePath} className="inline-flex h-9 items-center rounded-md bg-primary px-4 text-sm font-medium text-primary-foreground shadow-sm hover:bg-primary/90">New engine</Link>
          </div>
        ) : null}
      </div>
      {isPending ? <LoadingState label="Loading engines…" /> : isError ? null : data.items.length === 0 ? (
        <EmptyState title={effective.search ? `No engine matches “${effective.search}”` : 'No engines entered yet'}>
          {effective.search ? 'Try part of the name.' : 'Enter an engine once: its belts, effective pulley diameters and bearings.'}
        </EmptyState>
      ) : (
        <Table aria-label="Engines">
          <TableHeader>
            <TableRow>
              <SortHeader field="name" label="Engine" sort={effective.sort} onSort={(sort) => setFilters({ ...filters, sort, page: 1 })} />
              <TableHead className="text-right">Cylinders</TableHead>
              <TableHead>Firing order</TableHead>
              <TableHead className="text-right">Idle rpm</TableHead>
              <TableHead className="text-right">Belts</TableHead>
              <TableHead className="text-right">Components</TableHead>
              <SortHeader field="updatedAt" label="Changed" sort={effective.sort} onSort={(sort) => setFilters({ ...filters, sort, page: 1 })} className="text-right" />
            </TableRow>
          </TableHeader>
          <TableBody>
            {data.items.map((e) => (
              <TableRow key={e.id}>
                <TableCell><Link className="font-medium text-primary hover:underline" to={enginePath(e.id)}>{e.name}</Link></TableCell>
                <TableCell className="text-right font-mono tabular-nums">{e.cylinders}</TableCell>
                <TableCell className="font-mono tabular-nums">{e.firingOrder.join('-')}</TableCell>
                <TableCell className="text-right font-mono tabular-nums">{e.idleRpm ?? '—'}</TableCell>
                <TableCell className="text-right font-mono tabular-nums">{e.belts}</TableCell>
                <TableCell className="text-right font-mono tabular-nums">{e.components}</TableCell>
                <TableCell className="text-right font-mono text-xs tabular-nums text-muted-foreground">{e.updatedAt.slice(0, 16).replace('T', ' ')}</TableCell>
              </TableRow>
            ))}
          </TableBody>
        </Table>
      )}
      <Pager page={effective.page} pageSize={effective.pageSize} total={total} onPage={(page) => setFilters({ ...effective, page })} />
      <Dialog open={problems !== null} onClose={() => setProblems(null)} title="The file was not imported" className="max-w-2xl"
        footer={<Button onClick={() => setProblems(null)}>Close</Button>}>
        <ImportProblems lines={problems ?? []} />
      </Dialog>
    </div>
  );
}
