import type { EngineDraft, FieldErrors } from '../lib/draft';
import { Field } from '../../../components/ui/field';
import { Label } from '../../../components/ui/label';

/** Name, cylinders, firing order, idle speed and notes of an engine. */
export function EngineFields({ draft, errors, readOnly, onChange }: {
  draft: EngineDraft; errors: FieldErrors; readOnly: boolean; onChange: (patch: Partial<EngineDraft>) => void;
}) {
  return (
    <div className="grid gap-4 md:grid-cols-[2fr_1fr_1fr_1fr]">
      <Field label="Engine name" value={draft.name} error={errors.name} readOnly={readOnly} onChange={(e) => onChange({ name: e.target.value })} />
      <Field label="Cylinders" inputMode="numeric" className="font-mono" value={draft.cylinders} error={errors.cylinders} readOnly={readOnly}
        onChange={(e) => onChange({ cylinders: e.target.value })} />
      <Field label="Firing order" className="font-mono" value={draft.firingOrder} error={errors.firingOrder} readOnly={readOnly}
        hint="e.g. 1-3-4-2" onChange={(e) => onChange({ firingOrder: e.target.value })} />
      <Field label="Idle rpm" inputMode="decimal" className="font-mono" value={draft.idleRpm} error={errors.idleRpm} readOnly={readOnly}
        onChange={(e) => onChange({ idleRpm: e.target.value })} />
      <div className="grid gap-1.5 md:col-span-4">
        <Label htmlFor="engine-notes">Notes</Label>
        <textarea id="engine-notes" rows={2} value={draft.notes} readOnly={readOnly} onChange={(e) => onChange({ notes: e.target.value })}
          className="rounded-md border border-input bg-card px-3 py-2 text-sm shadow-xs focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30"
          aria-invalid={errors.notes ? true : undefined} />
        {errors.notes ? <p className="text-xs font-medium text-destructive">{errors.notes}</p> : null}
      </div>
    </div>
  );
}
