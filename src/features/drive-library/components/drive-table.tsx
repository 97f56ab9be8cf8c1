import { Fragment } from 'react';
import { get, useFormContext, useWatch, type UseFieldArrayReturn } from 'react-hook-form';
import { effectiveFromOutside, outsideFromEffective } from '../../../../shared/drive/measured-diameter';
import type { ComponentKind } from '../../../../shared/drive/types';
import { COMPONENT_KINDS } from '../../../../shared/drive-io/component-table';
import type { ComponentKinematicsDto } from '../../../../shared/schemas/engines-api';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { cn } from '../../../lib/cn';
import type { DraftComponent, EngineDraft, PulleyOptions } from '../lib/draft';
import { BearingDetails, bearingSummary } from './bearing-details';
import { CellInput, invalidCls, Num, Shown } from './cells';

/** Labels of the component kinds. */
export const KIND_LABELS: Record<ComponentKind, string> = {
  crankshaft: 'Crankshaft', alternator: 'Alternator', water_pump: 'Water pump', power_steering: 'Power steering',
  ac_compressor: 'A/C compressor', idler: 'Idler', tensioner: 'Tensioner', fan: 'Fan', vacuum_pump: 'Vacuum pump', other: 'Other',
};

export interface DriveTableProps {
  array: UseFieldArrayReturn<EngineDraft, 'components', 'key'>;
  /** Computed columns by component name (lower case); absent while the draft has errors. */
  computed: Map<string, ComponentKinematicsDto> | null;
  readOnly: boolean;
  pulley: PulleyOptions;
  /** Rows whose bearing fields are open (by field key). */
  open: Record<string, boolean>;
  onToggle: (key: string) => void;
}

const selectCls = cn('h-8 w-full rounded-md border border-input bg-card px-1.5 text-sm shadow-xs', invalidCls);

/** The other diameter of a row, shown beside the one entered ("effective 58" or "outside ≈ 56"). */
function otherDiameter(row: Partial<DraftComponent>, pulley: PulleyOptions): string | null {
  const scale = pulley.unit === 'inch' ? 25.4 : 1;
  const read = (s: string | undefined) => (s && /^\s*\d+([.,]\d+)?\s*$/.test(s) ? Number(s.replace(',', '.')) * scale : null);
  const fmt = (mm: number) => (pulley.unit === 'inch' ? `${(mm / 25.4).toFixed(3)} in` : `${mm.toFixed(1)} mm`);
  if (row.pulleyBasis === 'outside') {
    const o = read(row.outsideMm);
    return o !== null && o > 0 ? `effective ${fmt(effectiveFromOutside(o, Boolean(row.backside), pulley))}` : null;
  }
  const e = read(row.pulleyMm);
  return e !== null ? `outside ≈ ${fmt(outsideFromEffective(e, Boolean(row.backside), pulley))}` : null;
}

/**
 * The accessory-drive table: one row per component, edited in place, with the computed ratio,
 * belt speed at idle and defect orders (crank orders) beside it. Bearing fields open under the row.
 * A pulley is entered as its effective diameter or as the outside diameter measured with calipers
 * (converted with the shop's offsets); both values are shown.
 */
export function DriveTable({ array, computed, readOnly, pulley, open, onToggle }: DriveTableProps) {
  const { register, control, getValues, setValue, formState: { errors } } = useFormContext<EngineDraft>();
  const rows = useWatch({ control, name: 'components' }) ?? [];
  const belts = useWatch({ control, name: 'belts' }) ?? [];
  const beltNames = belts.map((b) => b?.name ?? '').filter((n) => n.trim() !== '');
  const unit = pulley.unit === 'inch' ? 'in' : 'mm';
  return (
    <Table aria-label="Accessory drive">
      <TableHeader>
        <TableRow>
          <TableHead className="min-w-40">Name</TableHead>
          <TableHead className="min-w-32">Kind</TableHead>
          <TableHead className="min-w-28">Belt</TableHead>
          <TableHead className="min-w-32 text-right" title="Effective pulley diameter (or the outside diameter as measured); for a part on no belt, its fixed ratio">Pulley {unit} / ratio</TableHead>
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
        {array.fields.map((field, i) => {
          const row = rows[i] ?? {};
          const err = (f: string): string | undefined => (get(errors, `components.${i}.${f}`) as { message?: string } | undefined)?.message;
          const c = computed?.get((row.name ?? '').trim().toLowerCase());
          const crank = row.kind === 'crankshaft';
          const bearingErrors = ['designation', 'balls', 'ballMm', 'pitchMm', 'contactDeg', 'ftf', 'bpfo', 'bpfi', 'bsf'].filter((f) => err(f));
          const expanded = open[field.key] ?? false;
          const name = register(`components.${i}.name`);
          const other = row.belt ? otherDiameter(row, pulley) : null;
          return (
            <Fragment key={field.key}>
              <TableRow data-testid={`component-row-${i}`}>
                <TableCell>
                  {readOnly ? <Shown>{row.name}</Shown> : (
                    <CellInput aria-label={`Name of row ${i + 1}`} error={err('name')} {...name}
                      onChange={(e) => {
                        // Renaming a part carries the belts it drives along (only belts that named it).
                        const old = (getValues(`components.${i}.name`) ?? '').trim();
                        void name.onChange(e);
                        if (old === '') return;
                        getValues('belts').forEach((b, j) => { if (b.driver.trim() === old) setValue(`belts.${j}.driver`, e.target.value, { shouldDirty: true }); });
                      }} />
                  )}
                </TableCell>
                <TableCell>
                  {readOnly ? KIND_LABELS[row.kind ?? 'other'] : (
                    <>
                      <select aria-label={`Kind of row ${i + 1}`} className={selectCls} aria-invalid={err('kind') ? true : undefined}
                        {...register(`components.${i}.kind`, { onChange: (e) => { if (e.target.value === 'crankshaft') setValue(`components.${i}.belt`, ''); } })}>
                        {COMPONENT_KINDS.map((k) => <option key={k} value={k}>{KIND_LABELS[k]}</option>)}
                      </select>
                      {err('kind') ? <span role="status" className="text-[11px] text-destructive">{err('kind')}</span> : null}
                    </>
                  )}
                </TableCell>
                <TableCell>
                  {crank ? <span className="text-xs text-muted-foreground">drives belts</span> : readOnly ? <Shown>{row.belt}</Shown> : (
                    <>
                      <select aria-label={`Belt of row ${i + 1}`} className={selectCls} aria-invalid={err('belt') ? true : undefined} {...register(`components.${i}.belt`)}>
                        <option value="">— none (fixed ratio) —</option>
                        {beltNames.map((b) => <option key={b} value={b}>{b}</option>)}
                      </select>
                      {err('belt') ? <span role="status" className="block max-w-56 text-[11px] leading-tight text-destructive">{err('belt')}</span> : null}
                    </>
                  )}
                </TableCell>
                <TableCell className="w-36">
                  {crank ? null : row.belt ? (
                    readOnly ? (
                      <div className="text-right">
                        <Shown mono>{row.pulleyBasis === 'outside' ? row.outsideMm : row.pulleyMm}</Shown>
                        <span className="block text-[11px] text-muted-foreground">{row.pulleyBasis === 'outside' ? `outside (as measured) · ${other ?? ''}` : 'effective'}</span>
                      </div>
                    ) : (
                      <div className="grid gap-0.5">
                        {row.pulleyBasis === 'outside'
                          ? <CellInput numeric aria-label={`Outside ${unit} of row ${i + 1}`} error={err('outsideMm') ?? err('pulleyMm')} {...register(`components.${i}.outsideMm`)} />
                          : <CellInput numeric aria-label={`Pulley ${unit} of row ${i + 1}`} error={err('pulleyMm')} {...register(`components.${i}.pulleyMm`)} />}
                        <select aria-label={`Pulley measured as, row ${i + 1}`} className="h-6 rounded border border-input bg-card px-1 text-[11px] text-muted-foreground"
                          {...register(`components.${i}.pulleyBasis`)}>
                          <option value="effective">effective diameter</option>
                          <option value="outside">outside, as measured</option>
                        </select>
                        {other ? <span className="text-right font-mono text-[11px] text-muted-foreground">{other}</span> : null}
                      </div>
                    )
                  ) : readOnly ? <Shown mono>{row.fixedRatio ? `×${row.fixedRatio}` : ''}</Shown> : (
                    <CellInput numeric aria-label={`Fixed ratio of row ${i + 1}`} placeholder="ratio" error={err('fixedRatio') ?? err('pulleyMm')}
                      {...register(`components.${i}.fixedRatio`)} />
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
                      <label className="flex items-center gap-1.5"><input type="checkbox" {...register(`components.${i}.backside`)} />backside</label>
                      <label className="flex items-center gap-1.5"><input type="checkbox" {...register(`components.${i}.overrunning`)} />overrun</label>
                      {err('backside') ? <span role="status" className="text-[11px] text-destructive">{err('backside')}</span> : null}
                    </div>
                  )}
                </TableCell>
                <TableCell>
                  {crank ? null : (
                    <button type="button" onClick={() => onToggle(field.key)} aria-expanded={expanded}
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
                    <Button variant="ghost" size="sm" className="h-7 w-7 px-0" aria-label={`Remove ${row.name || `row ${i + 1}`}`} onClick={() => array.remove(i)}>✕</Button>
                  </TableCell>
                )}
              </TableRow>
              {expanded && !crank ? (
                <TableRow className="bg-muted/30 hover:bg-muted/30">
                  <TableCell colSpan={readOnly ? 13 : 14}>
                    <BearingDetails index={i} readOnly={readOnly} />
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
