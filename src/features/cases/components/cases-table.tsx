import { useQuery } from '@tanstack/react-query';
import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useDeferredValue, useId, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { Pager } from '../../../components/ui/pager';
import { CASE_STATUSES, type CaseListItemDto, type CaseListQuery, type CaseStatus } from '../../../../shared/schemas/cases';
import { Button } from '../../../components/ui/button';
import { Input } from '../../../components/ui/input';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { LoadingState } from '../../../components/ui/spinner';
import { EmptyState, ErrorState } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { casesQueryOptions, DEFAULT_CASE_FILTERS } from '../api/case-queries';
import { STATUS_LABELS, suspectName, when } from '../lib/case-words';
import { StatusBadge } from './status-badge';

const column = createColumnHelper<CaseListItemDto>();
/** Columns the server sorts by (CASE_SORTS); the others are not sortable. */
const SERVER_SORTS: Record<string, string> = { status: 'status', roNumber: 'roNumber', updatedAt: 'updatedAt' };

/**
 * The shop's cases: status filter, search (RO number, vehicle, complaint), sortable columns and
 * paging — all done by the server (GET /api/cases), the table (TanStack Table) in manual mode.
 * The table scrolls inside its card on a narrow screen; the RO link stays the first column.
 */
export function CasesTable({ casePath }: { casePath: (id: number) => string }) {
  const [filters, setFilters] = useState<CaseListQuery>(DEFAULT_CASE_FILTERS);
  const [search, setSearch] = useState('');
  const deferredSearch = useDeferredValue(search.trim());
  const effective = { ...filters, search: deferredSearch, page: deferredSearch === filters.search ? filters.page : 1 };
  const { data, isPending, isError, error, refetch } = useQuery(casesQueryOptions(effective));
  const statusId = useId();

  const sorting: SortingState = useMemo(() => {
    const desc = effective.sort.startsWith('-');
    return [{ id: effective.sort.replace('-', ''), desc }];
  }, [effective.sort]);

  const columns = useMemo(() => [
    column.accessor('status', { header: 'Status', cell: (c) => <StatusBadge status={c.getValue()} /> }),
    column.accessor('roNumber', {
      header: 'RO number',
      cell: (c) => <Link className="font-mono text-base font-semibold text-primary hover:underline" to={casePath(c.row.original.id)}>{c.getValue()}</Link>,
    }),
    column.accessor('vehicleLabel', { header: 'Vehicle', enableSorting: false, cell: (c) => <span className="whitespace-nowrap">{c.getValue()}</span> }),
    column.accessor('complaint', {
      header: 'Complaint', enableSorting: false,
      cell: (c) => <span className="line-clamp-2 max-w-72 text-foreground/85" title={c.getValue()}>{c.getValue()}</span>,
    }),
    column.accessor('topSuspect', {
      header: 'Top suspect', enableSorting: false,
      cell: (c) => {
        const s = c.getValue();
        return s ? (
          <span className="whitespace-nowrap">{suspectName(s.component, s.fault)} <span className="font-mono font-semibold tabular-nums">{s.score.toFixed(2)}</span></span>
        ) : <span className="text-muted-foreground">—</span>;
      },
    }),
    column.accessor((r) => r.technician?.name ?? '—', { id: 'technician', header: 'Technician', enableSorting: false, cell: (c) => <span className="whitespace-nowrap">{c.getValue()}</span> }),
    column.accessor((r) => r.lead?.name ?? '—', { id: 'lead', header: 'Lead', enableSorting: false, cell: (c) => <span className="whitespace-nowrap">{c.getValue()}</span> }),
    column.accessor('updatedAt', {
      header: 'Last change',
      cell: (c) => <span className="whitespace-nowrap font-mono text-sm tabular-nums">{when(c.getValue())}</span>,
    }),
  ], [casePath]);

  const table = useReactTable({
    data: data?.items ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    state: { sorting },
    enableSortingRemoval: false,
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sorting) : updater;
      const s = next[0];
      if (!s || !SERVER_SORTS[s.id]) return;
      setFilters({ ...effective, sort: `${s.desc ? '-' : ''}${SERVER_SORTS[s.id]}` as CaseListQuery['sort'], page: 1 });
    },
  });

  const total = data?.total ?? 0;
  const filtered = effective.search !== '' || effective.status.length > 0;
  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-end gap-3">
        <div className="grid gap-1.5">
          <Label htmlFor={`${statusId}-search`}>Search</Label>
          <Input id={`${statusId}-search`} type="search" placeholder="RO number, vehicle, VIN or complaint" className="w-80 max-w-full" value={search} onChange={(e) => setSearch(e.target.value)} />
        </div>
        <div className="grid gap-1.5">
          <Label htmlFor={statusId}>Status</Label>
          <Select id={statusId} className="w-44" value={effective.status[0] ?? ''}
            onChange={(e) => setFilters({ ...effective, status: e.target.value ? [e.target.value as CaseStatus] : [], page: 1 })}>
            <option value="">Every status</option>
            {CASE_STATUSES.map((s) => <option key={s} value={s}>{STATUS_LABELS[s]}</option>)}
          </Select>
        </div>
      </div>
      {isPending ? <LoadingState label="Loading cases…" /> : isError ? (
        <ErrorState title="The cases could not be loaded" action={<Button variant="outline" onClick={() => void refetch()}>Try again</Button>}>{error.message}</ErrorState>
      ) : data.items.length === 0 ? (
        <EmptyState title={filtered ? 'No case matches' : 'No cases yet'}>
          {filtered ? 'Clear the search or choose every status.' : 'Open a case for a repair order with “New case”.'}
        </EmptyState>
      ) : (
        <Table aria-label="Cases">
          <TableHeader>
            {table.getHeaderGroups().map((g) => (
              <TableRow key={g.id}>
                {g.headers.map((h) => {
                  const sortable = h.column.getCanSort() && !!SERVER_SORTS[h.column.id];
                  const dir = h.column.getIsSorted();
                  return (
                    <TableHead key={h.id} aria-sort={dir === 'asc' ? 'ascending' : dir === 'desc' ? 'descending' : sortable ? 'none' : undefined} className="whitespace-nowrap text-foreground/75">
                      {sortable ? (
                        <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-foreground" onClick={h.column.getToggleSortingHandler()}>
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <span aria-hidden>{dir === 'asc' ? '↑' : dir === 'desc' ? '↓' : '↕'}</span>
                        </button>
                      ) : flexRender(h.column.columnDef.header, h.getContext())}
                    </TableHead>
                  );
                })}
              </TableRow>
            ))}
          </TableHeader>
          <TableBody>
            {table.getRowModel().rows.map((r) => (
              <TableRow key={r.id}>
                {r.getVisibleCells().map((c) => <TableCell key={c.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</TableCell>)}
              </TableRow>
            ))}
          </TableBody>
        </Table>
      )}
      <Pager page={effective.page} pageSize={effective.pageSize} total={total} onPage={(page) => setFilters({ ...effective, page })} />
    </div>
  );
}
