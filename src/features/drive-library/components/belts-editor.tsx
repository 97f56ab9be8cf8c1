import type { BeltKinematicsDto } from '../../../../shared/schemas/engines-api';
import { Button } from '../../../components/ui/button';
import { Table, TableBody, TableCell, TableHead, TableHeader, TableRow } from '../../../components/ui/table';
import type { DraftBelt, DraftComponent, FieldErrors } from '../lib/draft';
import { CellInput, Num, Shown } from './cells';

const selectCls = 'h-8 w-full rounded-md border border-input bg-card px-1.5 text-sm shadow-xs aria-invalid:border-destructive';

/**
 * The belts of an engine: name, length, the component whose groove drives it and that groove's
 * effective diameter; belt speed at idle and belt-pass order beside each.
 */
export function BeltsEditor({ belts, components, errors, computed, readOnly, onChange, onRemove }: {
  belts: DraftBelt[];
  components: DraftComponent[];
  errors: FieldErrors;
  computed: Map<string, BeltKinematicsDto> | null;
  readOnly: boolean;
  onChange: (index: number, patch: Partial<DraftBelt>) => void;
  onRemove: (index: number) => void;
}) {
  const drivers = components.map((c) => c.name).filter(Boolean);
  if (belts.length === 0) return <p className="px-4 py-3 text-sm text-muted-foreground">No belts yet. A drive with belt-driven parts needs at least one, driven by the crankshaft.</p>;
  return (
    <Table aria-label="Belts">
      <TableHeader>
        <TableRow>
          <TableHead className="min-w-36">Belt</TableHead>
          <TableHead className="text-right">Length mm</TableHead>
          <TableHead className="min-w-36">Driven by</TableHead>
          <TableHead className="text-right">Driver groove mm</TableHead>
          <TableHead className="border-l border-border text-right">Speed at idle m/s</TableHead>
          <TableHead className="text-right">Belt-pass order</TableHead>
          {readOnly ? null : <TableHead className="sr-only">Remove</TableHead>}
        </TableRow>
      </TableHeader>
      <TableBody>
        {belts.map((b, i) => {
          const err = (f: string) => errors[`belts[${i}].${f}`];
          const k = computed?.get(b.name.trim().toLowerCase());
          return (
            <TableRow key={b.id}>
              <TableCell>{readOnly ? <Shown>{b.name}</Shown> : <CellInput aria-label={`Belt ${i + 1} name`} value={b.name} error={err('name')} onChange={(e) => onChange(i, { name: e.target.value })} />}</TableCell>
              <TableCell className="w-28">{readOnly ? <Shown mono>{b.lengthMm}</Shown> : <CellInput numeric aria-label={`Belt ${i + 1} length`} value={b.lengthMm} error={err('lengthMm')} onChange={(e) => onChange(i, { lengthMm: e.target.value })} />}</TableCell>
              <TableCell>
                {readOnly ? <Shown>{b.driver}</Shown> : (
                  <>
                    <select aria-label={`Belt ${i + 1} driver`} className={selectCls} value={b.driver} aria-invalid={err('driver') ? true : undefined} onChange={(e) => onChange(i, { driver: e.target.value })}>
                      <option value="">— choose —</option>
                      {drivers.map((d) => <option key={d} value={d}>{d}</option>)}
                    </select>
                    {err('driver') ? <span className="text-[11px] text-destructive">{err('driver')}</span> : null}
                  </>
                )}
              </TableCell>
              <TableCell className="w-32">{readOnly ? <Shown mono>{b.driverPulleyMm}</Shown> : <CellInput numeric aria-label={`Belt ${i + 1} driver groove`} value={b.driverPulleyMm} error={err('driverPulleyMm')} onChange={(e) => onChange(i, { driverPulleyMm: e.target.value })} />}</TableCell>
              <TableCell className="border-l border-border text-right"><Num value={k?.speedMs} digits={2} /></TableCell>
              <TableCell className="text-right"><Num value={k?.passOrder} digits={4} /></TableCell>
              {readOnly ? null : <TableCell><Button variant="ghost" size="sm" aria-label={`Remove belt ${b.name || i + 1}`} onClick={() => onRemove(i)}>✕</Button></TableCell>}
            </TableRow>
          );
        })}
      </TableBody>
    </Table>
  );
}
