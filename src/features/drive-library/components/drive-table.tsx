import { Fragment, useState } from 'react';
import type { ComponentKind } from '../../../../shared/drive/types';
import { COMPONENT_KINDS } from '../../../../shared/drive-io/component-table';
import type { ComponentKinematicsDto } from '../../../../shared/schemas/engines-api';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { cn } from '../../../lib/cn';
import { errorsUnder, type DraftBelt, type DraftComponent, type FieldErrors } from '../lib/draft';
import { BearingDetails, bearingSummary } from './bearing-details';
import { CellInput, Num, Shown } from './cells';

/** Labels of the component kinds. */
export const KIND_LABELS: Record<ComponentKind, string> = {
  crankshaft: 'Crankshaft', alternator: 'Alternator', water_pump: 'Water pump', power_steering: 'Power steering',
  ac_compressor: 'A/C compressor', idler: 'Idler', tensioner: 'Tensioner', fan: 'Fan', vacuum_pump: 'Vacuum pump', other: 'Other',
};

export interface DriveTableProps {
  rows: DraftComponent[];
  belts: DraftBelt[];
  errors: FieldErrors;
  /** Computed columns by component name (lower case); absent while the draft has errors. */
  computed: Map<string, ComponentKinematicsDto> | null;
  readOnly: boolean;
  onChange: (index: number, patch: Partial<DraftComponent>) => void;
  onRemove: (index: number) => void;
}

const selectCls = 'h-8 w-full rounded-md border border-input bg-card px-1.5 text-sm shadow-xs aria-invalid:border-destructive';

/**
 * The accessory-drive table: one row per component, edited in place, with the computed ratio,
 * belt speed at idle and defect orders (crank orders) beside it. Bearing fields open under the row.
 */
export function DriveTable({ rows, belts, errors, computed, readOnly, onChange, onRemove }: DriveTableProps) {
  const [open, setOpen] = useState<Record<string, boolean>>({});
  const beltNames = belts.map((b) => b.name).filter(Boolean);
  return (
    <Table aria-label="Accessory drive">
      <TableHeader>
        <TableRow>
          <TableHead className="min-w-40">Name</TableHead>
          <TableHead className="min-w-32">Kind</TableHead>
          <TableHead className="min-w-28">Belt</TableHead>
          <TableHead className="text-right" title="Effective pulley diameter; for a part on no belt, its fixed ratio">Pulley mm / ratio</TableHead>
          <TableHead>Flags</TableHead>
          <TableHead className="min-w-32">Bearing</TableHead>
          <TableHead className="border-l border-border px-1.5 text-right" title="Part speed / crank speed: its shaft line (1×) in crank orders">Ratio 1×</TableHead>
          <TableHead className="px-1.5 text-right">Belt m/s</TableHead>
          <TableHead className="px-1.5 text-right">FTF</TableHead>
          <TableHead className="px-1.5 text-right">BPFO</TableHead>
          <TableHead className="px-1.5 text-right">BPFI</TableHead>
          <TableHead className="px-1.5 text-right">2×BSF</TableHead>
          <TableHead className="px-1.5 text-right">Belt pass</TableHead>
          {readOnly ? null : <TableHead className="sr-only">Remove</TableHead>}
        </TableRow>
      </TableHeader>
      <TableBody>
        {rows.map((row, i) => {
          const at = `components[${i}]`;
          const err = (f: string) => errors[`${at}.${f}`];
          const c = computed?.get(row.name.trim().toLowerCase());
          const crank = row.kind === 'crankshaft';
          const bearingErrors = errorsUnder(errors, `${at}.bearing`);
          const rowLevel = errors[at];
          const expanded = open[row.id] ?? false;
          return (
            <Fragment key={row.id}>
              <TableRow data-testid={`component-row-${i}`} className={cn(rowLevel && 'bg-destructive/5')}>
                <TableCell>
                  {readOnly ? <Shown>{row.name}</Shown> : (
                    <CellInput aria-label={`Name of row ${i + 1}`} value={row.name} error={err('name') ?? rowLevel} onChange={(e) => onChange(i, { name: e.target.value })} />
                  )}
                </TableCell>
                <TableCell>
                  {readOnly ? KIND_LABELS[row.kind] : (
                    <select aria-label={`Kind of row ${i + 1}`} className={selectCls} value={row.kind} aria-invalid={err('kind') ? true : undefined}
                      title={err('kind')} onChange={(e) => onChange(i, { kind: e.target.value as ComponentKind })}>
                      {COMPONENT_KINDS.map((k) => <option key={k} value={k}>{KIND_LABELS[k]}</option>)}
                    </select>
                  )}
                  {!readOnly && err('kind') ? <span className="text-[11px] text-destructive">{err('kind')}</span> : null}
                </TableCell>
                <TableCell>
                  {crank ? <span className="text-xs text-muted-foreground">drives belts</span> : readOnly ? <Shown>{row.belt}</Shown> : (
                    <>
                      <select aria-label={`Belt of row ${i + 1}`} className={selectCls} value={row.belt} aria-invalid={err('belt') ? true : undefined}
                        onChange={(e) => onChange(i, { belt: e.target.value })}>
                        <option value="">— none —</option>
                        {beltNames.map((b) => <option key={b} value={b}>{b}</option>)}
                      </select>
                      {err('belt') ? <span className="text-[11px] text-destructive">{err('belt')}</span> : null}
                    </>
                  )}
                </TableCell>
                <TableCell className="w-24">
                  {crank ? null : row.belt ? (
                    readOnly ? <Shown mono>{row.pulleyMm}</Shown> : (
                      <CellInput numeric aria-label={`Pulley mm of row ${i + 1}`} value={row.pulleyMm} error={err('pulleyMm')} onChange={(e) => onChange(i, { pulleyMm: e.target.value })} />
                    )
                  ) : readOnly ? <Shown mono>{row.fixedRatio ? `×${row.fixedRatio}` : ''}</Shown> : (
                    <CellInput numeric aria-label={`Fixed ratio of row ${i + 1}`} placeholder="ratio" value={row.fixedRatio} error={err('fixedRatio') ?? err('pulleyMm')}
                      onChange={(e) => onChange(i, { fixedRatio: e.target.value })} />
                  )}
                </TableCell>
                <TableCell>
                  {crank ? null : readOnly ? (
                    <div className="flex gap-1">
                      {row.backside ? <Badge variant="outline">backside</Badge> : null}
                      {row.overrunning ? <Badge variant="outline">overrunning</Badge> : null}
                    </div>
                  ) : (
                    <div className="grid gap-0.5 text-xs">
                      <label className="flex items-center gap-1.5"><input type="checkbox" checked={row.backside} onChange={(e) => onChange(i, { backside: e.target.checked })} />backside</label>
                      <label className="flex items-center gap-1.5"><input type="checkbox" checked={row.overrunning} onChange={(e) => onChange(i, { overrunning: e.target.checked })} />overrun</label>
                      {err('backside') ? <span className="text-[11px] text-destructive">{err('backside')}</span> : null}
                    </div>
                  )}
                </TableCell>
                <TableCell>
                  {crank ? null : (
                    <button type="button" onClick={() => setOpen({ ...open, [row.id]: !expanded })} aria-expanded={expanded}
                      className={cn('rounded px-1 text-left text-sm underline-offset-2 hover:underline', bearingErrors.length > 0 && 'text-destructive')}>
                      {bearingSummary(row)}
                      <span className="text-muted-foreground"> · {row.rotatingRing || 'inner'} ring</span>
                      {bearingErrors.length > 0 ? ` (${bearingErrors.length} to fix)` : ''}
                    </button>
                  )}
                </TableCell>
                <TableCell className="whitespace-nowrap border-l border-border px-1.5 text-right text-xs">
                  <Num value={c?.ratio} />
                  {c?.backwards ? <span className="ml-1 text-xs text-muted-foreground" title="Turns opposite to the crank">↺</span> : null}
                </TableCell>
                <TableCell className="px-1.5 text-right text-xs"><Num value={c?.beltSpeedMs} digits={2} /></TableCell>
                <TableCell className="px-1.5 text-right text-xs"><Num value={c?.orders.ftf} approximate={c?.approximate} /></TableCell>
                <TableCell className="px-1.5 text-right text-xs"><Num value={c?.orders.bpfo} approximate={c?.approximate} /></TableCell>
                <TableCell className="px-1.5 text-right text-xs"><Num value={c?.orders.bpfi} approximate={c?.approximate} /></TableCell>
                <TableCell className="px-1.5 text-right text-xs"><Num value={c?.orders.ball} approximate={c?.approximate} /></TableCell>
                <TableCell className="px-1.5 text-right text-xs"><Num value={c?.beltPassOrder} digits={4} /></TableCell>
                {readOnly ? null : (
                  <TableCell>
                    <Button variant="ghost" size="sm" className="h-7 w-7 px-0" aria-label={`Remove ${row.name || `row ${i + 1}`}`} onClick={() => onRemove(i)}>✕</Button>
                  </TableCell>
                )}
              </TableRow>
              {expanded && !crank ? (
                <TableRow className="bg-muted/30 hover:bg-muted/30">
                  <TableCell colSpan={readOnly ? 13 : 14}>
                    <BearingDetails row={row} index={i} errors={errors} readOnly={readOnly} onChange={(patch) => onChange(i, patch)} />
                  </TableCell>
                </TableRow>
              ) : null}
            </Fragment>
          );
        })}
      </TableBody>
    </Table>
  );
}
