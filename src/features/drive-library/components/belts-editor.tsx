import { get, useFormContext, useWatch, type UseFieldArrayReturn } from 'react-hook-form';
import type { BeltKinematicsDto } from '../../../../shared/schemas/engines-api';
import { Button } from '../../../components/ui/button';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import { cn } from '../../../lib/cn';
import type { EngineDraft } from '../lib/draft';
import { CellInput, invalidCls, Num, Shown } from './cells';

const selectCls = cn('h-8 w-full rounded-md border border-input bg-card px-1.5 text-sm shadow-xs', invalidCls);

/**
 * The belts of an engine: name, length, the component whose groove drives it and that groove's
 * effective diameter; belt speed at idle and belt-pass order beside each. Renaming a belt carries
 * the parts that ride it along (only parts that named it; a new, still unnamed belt carries none).
 */
export function BeltsEditor({ array, computed, readOnly, unitLabel }: {
  array: UseFieldArrayReturn<EngineDraft, 'belts', 'key'>;
  computed: Map<string, BeltKinematicsDto> | null;
  readOnly: boolean;
  unitLabel: string;
}) {
  const { register, control, getValues, setValue, formState: { errors } } = useFormContext<EngineDraft>();
  const belts = useWatch({ control, name: 'belts' }) ?? [];
  const components = useWatch({ control, name: 'components' }) ?? [];
  const drivers = components.map((c) => c?.name ?? '').filter((n) => n.trim() !== '');
  if (array.fields.length === 0) {
    return <p className="px-4 py-3 text-sm text-muted-foreground">No belts yet.{readOnly ? '' : ' A drive with belt-driven parts needs at least one, driven by the crankshaft.'}</p>;
  }
  return (
    <Table aria-label="Belts">
      <TableHeader>
        <TableRow>
          <TableHead className="min-w-36">Belt</TableHead>
          <TableHead className="text-right">Length mm</TableHead>
          <TableHead className="min-w-36">Driven by</TableHead>
          <TableHead className="text-right">Driver groove {unitLabel}</TableHead>
          <TableHead className="border-l border-border text-right">Speed at idle m/s</TableHead>
          <TableHead className="text-right">Belt-pass order</TableHead>
          {readOnly ? null : <TableHead className="sr-only">Remove</TableHead>}
        </TableRow>
      </TableHeader>
      <TableBody>
        {array.fields.map((field, i) => {
          const b = belts[i] ?? {};
          const err = (f: string): string | undefined => (get(errors, `belts.${i}.${f}`) as { message?: string } | undefined)?.message;
          const k = computed?.get((b.name ?? '').trim().toLowerCase());
          const name = register(`belts.${i}.name`);
          return (
            <TableRow key={field.key}>
              <TableCell>
                {readOnly ? <Shown>{b.name}</Shown> : (
                  <CellInput aria-label={`Belt ${i + 1} name`} error={err('name')} {...name}
                    onChange={(e) => {
                      const old = (getValues(`belts.${i}.name`) ?? '').trim();
                      void name.onChange(e);
                      const next = e.target.value;
                      if (old === '') return;
                      getValues('components').forEach((c, j) => {
                        if (c.kind !== 'crankshaft' && c.belt.trim() === old) setValue(`components.${j}.belt`, next, { shouldDirty: true });
                      });
                    }} />
                )}
              </TableCell>
              <TableCell className="w-28">{readOnly ? <Shown mono>{b.lengthMm}</Shown> : <CellInput numeric aria-label={`Belt ${i + 1} length`} error={err('lengthMm')} {...register(`belts.${i}.lengthMm`)} />}</TableCell>
              <TableCell>
                {readOnly ? <Shown>{b.driver}</Shown> : (
                  <>
                    <select aria-label={`Belt ${i + 1} driver`} className={selectCls} aria-invalid={err('driver') ? true : undefined} {...register(`belts.${i}.driver`)}>
                      <option value="">— choose —</option>
                      {drivers.map((d) => <option key={d} value={d}>{d}</option>)}
                    </select>
                    {err('driver') ? <span role="status" className="text-[11px] text-destructive">{err('driver')}</span> : null}
                  </>
                )}
              </TableCell>
              <TableCell className="w-32">{readOnly ? <Shown mono>{b.driverPulleyMm}</Shown> : <CellInput numeric aria-label={`Belt ${i + 1} driver groove`} error={err('driverPulleyMm')} {...register(`belts.${i}.driverPulleyMm`)} />}</TableCell>
              <TableCell className="border-l border-border text-right"><Num value={k?.speedMs} digits={2} /></TableCell>
              <TableCell className="text-right"><Num value={k?.passOrder} digits={4} /></TableCell>
              {readOnly ? null : <TableCell><Button variant="ghost" size="sm" aria-label={`Remove belt ${b.name || i + 1}`} onClick={() => array.remove(i)}>✕</Button></TableCell>}
            </TableRow>
          );
        })}
      </TableBody>
    </Table>
  );
}
