import { get, useFormContext, useWatch } from 'react-hook-form';
import type { DraftComponent, EngineDraft } from '../lib/draft';
import { CellInput, Shown } from './cells';

/** One line saying how a row's bearing is given. */
export function bearingSummary(row: Partial<DraftComponent>): string {
  if (row.designation?.trim()) return row.designation.trim();
  if (row.balls && row.ballMm && row.pitchMm) return `${row.balls} × ${row.ballMm} on ${row.pitchMm} mm`;
  if (row.ftf || row.bpfo || row.bpfi || row.bsf) return 'factors';
  return 'unknown (rule of thumb)';
}

/** The form fields of the bearing (shown under the row); a problem in one of them opens the row. */
export const BEARING_FIELDS = ['designation', 'balls', 'ballMm', 'pitchMm', 'contactDeg', 'ftf', 'bpfo', 'bpfi', 'bsf', 'rotatingRing', 'source'] as const;

const GEOMETRY = [
  ['designation', 'Designation', false],
  ['balls', 'Balls', true],
  ['ballMm', 'Ball mm', true],
  ['pitchMm', 'Pitch mm', true],
  ['contactDeg', 'Contact °', true],
] as const;
const FACTORS = [['ftf', 'FTF'], ['bpfo', 'BPFO'], ['bpfi', 'BPFI'], ['bsf', 'BSF']] as const;
const SOURCE_LABELS = { '': 'not said', published: 'published', measured: 'measured', estimated: 'estimated' } as const;

/**
 * The bearing of one row: a designation from the Bearings page, or geometry, or entered factors
 * (multiples of the turning ring's speed). Left empty, a stated rule of thumb gives approximate orders.
 */
export function BearingDetails({ index, readOnly }: { index: number; readOnly: boolean }) {
  const { register, control, formState: { errors } } = useFormContext<EngineDraft>();
  const row = useWatch({ control, name: `components.${index}` }) ?? {};
  const err = (f: string): string | undefined => (get(errors, `components.${index}.${f}`) as { message?: string } | undefined)?.message;
  if (readOnly) {
    const shown: [string, string | undefined][] = [
      ['Designation', row.designation], ['Balls', row.balls], ['Ball mm', row.ballMm], ['Pitch mm', row.pitchMm], ['Contact °', row.contactDeg],
      ['Turning ring', row.rotatingRing || 'inner'], ['Source', SOURCE_LABELS[row.source ?? '']],
      ['FTF', row.ftf], ['BPFO', row.bpfo], ['BPFI', row.bpfi], ['BSF', row.bsf],
    ];
    return (
      <dl className="flex flex-wrap gap-x-6 gap-y-2 py-1 text-sm">
        {shown.filter(([, v]) => v).map(([label, value]) => (
          <div key={label}><dt className="text-xs text-muted-foreground">{label}</dt><dd className="font-mono tabular-nums"><Shown>{value}</Shown></dd></div>
        ))}
      </dl>
    );
  }
  return (
    <div className="flex flex-wrap items-start gap-x-6 gap-y-3 py-1 text-sm">
      <div className="flex flex-wrap items-start gap-2">
        {GEOMETRY.map(([field, label, numeric]) => (
          <label key={field} className="grid w-28 gap-1 text-xs text-muted-foreground">
            {label}
            <CellInput numeric={numeric} aria-label={`${label} of row ${index + 1}`} error={err(field)} {...register(`components.${index}.${field}`)} />
          </label>
        ))}
      </div>
      <label className="grid w-32 gap-1 text-xs text-muted-foreground">
        Turning ring
        <select aria-label={`Turning ring of row ${index + 1}`} {...register(`components.${index}.rotatingRing`)}
          className="h-8 rounded-md border border-input bg-card px-1.5 text-sm text-foreground shadow-xs">
          <option value="">inner (default)</option>
          <option value="inner">inner</option>
          <option value="outer">outer (most idlers)</option>
        </select>
      </label>
      <label className="grid w-32 gap-1 text-xs text-muted-foreground">
        Source
        <select aria-label={`Bearing source of row ${index + 1}`} {...register(`components.${index}.source`)}
          className="h-8 rounded-md border border-input bg-card px-1.5 text-sm text-foreground shadow-xs">
          <option value="">not said</option>
          <option value="published">published</option>
          <option value="measured">measured</option>
          <option value="estimated">estimated</option>
        </select>
      </label>
      <div className="flex flex-wrap items-start gap-2 border-l border-border pl-4">
        {FACTORS.map(([field, label]) => (
          <label key={field} className="grid w-24 gap-1 text-xs text-muted-foreground">
            {label}
            <CellInput numeric aria-label={`${label} of row ${index + 1}`} error={err(field)} {...register(`components.${index}.${field}`)} />
          </label>
        ))}
      </div>
      <p className="w-full text-xs text-muted-foreground">
        Give a designation from the Bearings page, or the geometry, or the defect factors as multiples of the turning ring's speed.
        Left empty, approximate orders come from a rule of thumb (the 6203's geometry) and are marked ≈.
      </p>
    </div>
  );
}
