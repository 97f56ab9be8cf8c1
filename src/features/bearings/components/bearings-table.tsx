import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { factorsFromGeometry } from '../../../../shared/drive/bearing-factors';
import { BUILT_IN_BEARINGS, normaliseDesignation, type BearingGeometry } from '../../../../shared/drive/bearing-table';
import type { BearingSource, BearingTypeDto } from '../../../../shared/schemas/bearings';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { LoadingState } from '../../../components/ui/spinner';
import { EmptyState } from '../../../components/ui/states';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { bearingsQueryOptions } from '../api/bearing-queries';
import { useDeleteBearing } from '../api/use-bearing-mutations';
import { BearingForm } from './bearing-form';

const SOURCE_VARIANT: Record<BearingSource, 'success' | 'default' | 'warning'> = { published: 'success', measured: 'default', estimated: 'warning' };

/** A bearing's source as a badge: published (a source states it), measured, estimated. */
export function SourceBadge({ source }: { source: BearingSource }) {
  return <Badge variant={SOURCE_VARIANT[source]}>{source}</Badge>;
}

const n = (v: number, d: number) => <span className="font-mono tabular-nums">{v.toFixed(d)}</span>;

/**
 * The shop's bearing table with the defect factors each row gives (inner ring turning); writers
 * add, edit and delete rows (a row a component names cannot be deleted).
 */
export function BearingsTable({ canWrite }: { canWrite: boolean }) {
  const { data, isPending } = useQuery(bearingsQueryOptions());
  const [editing, setEditing] = useState<BearingTypeDto | 'new' | null>(null);
  const [copying, setCopying] = useState<BearingGeometry | null>(null);
  const [deleting, setDeleting] = useState<BearingTypeDto | null>(null);
  const remove = useDeleteBearing();
  if (isPending) return <LoadingState label="Loading bearings…" />;
  const items = data?.items ?? [];
  // Built-in designations the shop's table does not override: listed too, to be copied and edited.
  const own = new Set(items.map((b) => normaliseDesignation(b.designation)));
  const builtIns = BUILT_IN_BEARINGS.filter((b) => !own.has(normaliseDesignation(b.designation)));
  return (
    <div className="grid gap-4">
      {canWrite ? <div className="flex justify-end"><Button onClick={() => setEditing('new')}>Add bearing</Button></div> : null}
      {items.length === 0 && builtIns.length === 0 ? <EmptyState title="No bearings in the table">Add the bearings your engines use by designation.</EmptyState> : (
        <Table aria-label="Bearings">
          <TableHeader>
            <TableRow>
              <TableHead>Designation</TableHead>
              <TableHead className="text-right">Balls</TableHead>
              <TableHead className="text-right">Ball mm</TableHead>
              <TableHead className="text-right">Pitch mm</TableHead>
              <TableHead className="text-right">Contact °</TableHead>
              <TableHead>Source</TableHead>
              <TableHead className="border-l border-border text-right">FTF</TableHead>
              <TableHead className="text-right">BPFO</TableHead>
              <TableHead className="text-right">BPFI</TableHead>
              <TableHead className="text-right">BSF</TableHead>
              <TableHead className="text-right">Used by</TableHead>
              <TableHead className="min-w-72">Notes</TableHead>
              {canWrite ? <TableHead className="sr-only">Actions</TableHead> : null}
            </TableRow>
          </TableHeader>
          <TableBody>
            {items.map((b) => (
              <TableRow key={b.id}>
                <TableCell className="font-medium">{b.designation}</TableCell>
                <TableCell className="text-right">{n(b.balls, 0)}</TableCell>
                <TableCell className="text-right">{n(b.ballMm, 3)}</TableCell>
                <TableCell className="text-right">{n(b.pitchMm, 3)}</TableCell>
                <TableCell className="text-right">{n(b.contactDeg, 1)}</TableCell>
                <TableCell><SourceBadge source={b.source} /></TableCell>
                <TableCell className="border-l border-border text-right">{n(b.factors.ftf, 4)}</TableCell>
                <TableCell className="text-right">{n(b.factors.bpfo, 4)}</TableCell>
                <TableCell className="text-right">{n(b.factors.bpfi, 4)}</TableCell>
                <TableCell className="text-right">{n(b.factors.bsf, 4)}</TableCell>
                <TableCell className="text-right">{n(b.usedBy, 0)}</TableCell>
                <TableCell className="min-w-72 max-w-md whitespace-normal text-sm leading-snug">{b.notes || <span className="text-muted-foreground">—</span>}</TableCell>
                {canWrite ? (
                  <TableCell>
                    <div className="flex gap-1">
                      <Button variant="ghost" size="sm" onClick={() => setEditing(b)}>Edit</Button>
                      <Button variant="ghost" size="sm" disabled={b.usedBy > 0} title={b.usedBy > 0 ? 'Components name this bearing' : undefined} onClick={() => setDeleting(b)}>Delete</Button>
                    </div>
                  </TableCell>
                ) : null}
              </TableRow>
            ))}
            {builtIns.map((b) => {
              const f = factorsFromGeometry(b, 'inner');
              return (
                <TableRow key={`built-in-${b.designation}`} className="bg-muted/30">
                  <TableCell className="font-medium">{b.designation} <Badge variant="outline">built-in</Badge></TableCell>
                  <TableCell className="text-right">{n(b.balls, 0)}</TableCell>
                  <TableCell className="text-right">{n(b.ballMm, 3)}</TableCell>
                  <TableCell className="text-right">{n(b.pitchMm, 3)}</TableCell>
                  <TableCell className="text-right">{n(b.contactDeg, 1)}</TableCell>
                  <TableCell><SourceBadge source={b.source} /></TableCell>
                  <TableCell className="border-l border-border text-right">{n(f.ftf, 4)}</TableCell>
                  <TableCell className="text-right">{n(f.bpfo, 4)}</TableCell>
                  <TableCell className="text-right">{n(f.bpfi, 4)}</TableCell>
                  <TableCell className="text-right">{n(f.bsf, 4)}</TableCell>
                  <TableCell className="text-right text-muted-foreground">—</TableCell>
                  <TableCell className="min-w-72 max-w-md whitespace-normal text-sm leading-snug">{b.note}</TableCell>
                  {canWrite ? (
                    <TableCell>
                      <Button variant="ghost" size="sm" onClick={() => setCopying(b)} aria-label={`Copy ${b.designation} to edit`}>Copy to edit</Button>
                    </TableCell>
                  ) : null}
                </TableRow>
              );
            })}
          </TableBody>
        </Table>
      )}
      <p className="text-xs text-muted-foreground">
        Factors are multiples of the inner ring's speed (outer ring fixed); for a part whose outer ring turns the engine page uses the
        cage factor ½(1 + r). Published rows: Case Western Reserve University Bearing Data Center. Rows marked built-in come with
        Crankwise and are used when your table has no row of that designation{canWrite ? '; copy one to change it' : ''}.
      </p>
      <Dialog open={copying !== null} onClose={() => setCopying(null)} title={`Copy ${copying?.designation ?? ''} into your table`} className="max-w-lg">
        {copying !== null ? <BearingForm copyOf={{ ...copying, notes: copying.note }} onDone={() => setCopying(null)} /> : null}
      </Dialog>
      <Dialog open={editing !== null} onClose={() => setEditing(null)} title={editing === 'new' ? 'Add a bearing' : `Edit ${editing?.designation ?? ''}`} className="max-w-lg">
        {editing !== null ? <BearingForm bearing={editing === 'new' ? undefined : editing} onDone={() => setEditing(null)} /> : null}
      </Dialog>
      <Dialog open={deleting !== null} onClose={() => setDeleting(null)} title={`Delete ${deleting?.designation ?? ''}?`}
        description="Engines can no longer name this designation; their parts keep whatever geometry they give themselves."
        footer={(
          <>
            <Button variant="outline" onClick={() => setDeleting(null)}>Keep it</Button>
            <Button variant="destructive" pending={remove.isPending} onClick={() => deleting && remove.mutate(deleting.id, { onSettled: () => setDeleting(null) })}>Delete</Button>
          </>
        )} />
    </div>
  );
}
