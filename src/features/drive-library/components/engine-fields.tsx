import { useFormContext, useWatch } from 'react-hook-form';
import { Field } from '../../../components/ui/field';
import { Label } from '../../../components/ui/label';
import type { EngineDraft } from '../lib/draft';
import { Shown } from './cells';

/** Name, cylinders, firing order, idle speed and notes of an engine; plain text when read-only. */
export function EngineFields({ readOnly }: { readOnly: boolean }) {
  const { register, control, formState: { errors } } = useFormContext<EngineDraft>();
  const values = useWatch({ control });
  if (readOnly) {
    const items: [string, string | undefined, boolean][] = [
      ['Engine name', values.name, false], ['Cylinders', values.cylinders, true], ['Firing order', values.firingOrder, true],
      ['Idle rpm', values.idleRpm, true],
    ];
    return (
      <dl className="grid gap-4 md:grid-cols-[2fr_1fr_1fr_1fr]">
        {items.map(([label, value, mono]) => (
          <div key={label} className="grid gap-1">
            <dt className="text-xs font-medium text-muted-foreground">{label}</dt>
            <dd className="text-base"><Shown mono={mono}>{value}</Shown></dd>
          </div>
        ))}
        <div className="grid gap-1 md:col-span-4">
          <dt className="text-xs font-medium text-muted-foreground">Notes</dt>
          <dd className="whitespace-pre-wrap text-sm"><Shown>{values.notes}</Shown></dd>
        </div>
      </dl>
    );
  }
  return (
    <div className="grid gap-4 md:grid-cols-[2fr_1fr_1fr_1fr]">
      <Field label="Engine name" error={errors.name?.message} {...register('name')} />
      <Field label="Cylinders" inputMode="numeric" className="font-mono" error={errors.cylinders?.message} {...register('cylinders')} />
      <Field label="Firing order" className="font-mono" error={errors.firingOrder?.message} hint="e.g. 1-3-4-2" {...register('firingOrder')} />
      <Field label="Idle rpm" inputMode="decimal" className="font-mono" error={errors.idleRpm?.message} {...register('idleRpm')} />
      <div className="grid gap-1.5 md:col-span-4">
        <Label htmlFor="engine-notes">Notes</Label>
        <textarea id="engine-notes" rows={2} {...register('notes')}
          className="rounded-md border border-input bg-card px-3 py-2 text-sm shadow-xs focus-visible:border-ring focus-visible:outline-2 focus-visible:outline-ring/30"
          aria-invalid={errors.notes ? true : undefined} />
        {errors.notes ? <p className="text-xs font-medium text-destructive">{errors.notes.message}</p> : null}
      </div>
    </div>
  );
}
