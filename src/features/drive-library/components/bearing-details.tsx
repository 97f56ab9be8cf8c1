import type { DraftComponent, FieldErrors } from '../lib/draft';
import { CellInput, Shown } from './cells';

/** One line saying how a row's bearing is given. */
export function bearingSummary(row: DraftComponent): string {
  if (row.designation.trim()) return row.designation.trim();
  if (row.balls && row.ballMm && row.pitchMm) return `${row.balls} × ${row.ballMm} on ${row.pitchMm} mm`;
  if (row.ftf || row.bpfo || row.bpfi || row.bsf) return 'factors';
  return 'unknown (rule of thumb)';
}

const GEOMETRY = [
  ['designation', 'Designation', false, 'designation'],
  ['balls', 'Balls', true, 'balls'],
  ['ballMm', 'Ball mm', true, 'ballMm'],
  ['pitchMm', 'Pitch mm', true, 'pitchMm'],
  ['contactDeg', 'Contact °', true, 'contactDeg'],
] as const;
const FACTORS = [['ftf', 'FTF'], ['bpfo', 'BPFO'], ['bpfi', 'BPFI'], ['bsf', 'BSF']] as const;

/**
 * The bearing of one row: a designation from the Bearings page, or geometry, or entered factors
 * (multiples of the turning ring's speed). Left empty, a stated rule of thumb gives approximate orders.
 */
export function BearingDetails({ row, index, errors, readOnly, onChange }: {
  row: DraftComponent; index: number; errors: FieldErrors; readOnly: boolean; onChange: (patch: Partial<DraftComponent>) => void;
}) {
  const at = `components[${index}].bearing`;
  return (
    <div className="flex flex-wrap items-start gap-x-6 gap-y-3 py-1 text-sm">
      <div className="flex flex-wrap items-start gap-2">
        {GEOMETRY.map(([field, label, numeric, path]) => (
          <label key={field} className="grid w-28 gap-1 text-xs text-muted-foreground">
            {label}
            {readOnly ? <Shown mono={numeric}>{row[field]}</Shown> : (
              <CellInput numeric={numeric} value={row[field]} error={errors[`${at}.${path}`]} onChange={(e) => onChange({ [field]: e.target.value })} />
            )}
          </label>
        ))}
      </div>
      <label className="grid w-32 gap-1 text-xs text-muted-foreground">
        Turning ring
        {readOnly ? <Shown>{row.rotatingRing || 'inner'}</Shown> : (
          <select aria-label={`Turning ring of row ${index + 1}`} value={row.rotatingRing}
            className="h-8 rounded-md border border-input bg-card px-1.5 text-sm text-foreground shadow-xs"
            onChange={(e) => onChange({ rotatingRing: e.target.value as DraftComponent['rotatingRing'] })}>
            <option value="">inner (default)</option>
            <option value="inner">inner</option>
            <option value="outer">outer (most idlers)</option>
          </select>
        )}
      </label>
      <div className="flex flex-wrap items-start gap-2 border-l border-border pl-4">
        {FACTORS.map(([field, label]) => (
          <label key={field} className="grid w-24 gap-1 text-xs text-muted-foreground">
            {label}
            {readOnly ? <Shown mono>{row[field]}</Shown> : (
              <CellInput numeric value={row[field]} error={errors[`${at}.factors.${field}`]} onChange={(e) => onChange({ [field]: e.target.value })} />
            )}
          </label>
        ))}
      </div>
      {errors[`${at}.factors`] || errors[at] ? (
        <p className="w-full text-xs text-destructive">{errors[`${at}.factors`] ?? errors[at]}</p>
      ) : null}
      <p className="w-full text-xs text-muted-foreground">
        Give a designation from the Bearings page, or the geometry, or the defect factors as multiples of the turning ring's speed.
        Left empty, approximate orders come from a rule of thumb (the 6203's geometry) and are marked ≈.
      </p>
    </div>
  );
}
