import { useState, type FormEvent } from 'react';
import { BEARING_SOURCES, BearingTypeInputSchema, type BearingTypeDto } from '../../../../shared/schemas/bearings';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { formErrorsFrom } from '../../../lib/form';
import { useSaveBearing } from '../api/use-bearing-mutations';

const blank = { designation: '', balls: '', ballMm: '', pitchMm: '', contactDeg: '0', source: 'measured', notes: '' };

/** Adds or edits one bearing type; checked with the same schema as the server. */
export function BearingForm({ bearing, copyOf, onDone }: {
  bearing?: BearingTypeDto;
  /** A built-in row to start a new row from (saved as the shop's own). */
  copyOf?: Pick<BearingTypeDto, 'designation' | 'balls' | 'ballMm' | 'pitchMm' | 'contactDeg' | 'source' | 'notes'>;
  onDone: () => void;
}) {
  const [values, setValues] = useState(() => {
    const from = bearing ?? copyOf;
    return from
      ? { designation: from.designation, balls: String(from.balls), ballMm: String(Number(from.ballMm.toPrecision(12))), pitchMm: String(Number(from.pitchMm.toPrecision(12))),
        contactDeg: String(from.contactDeg), source: from.source, notes: from.notes }
      : blank;
  });
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | undefined>();
  const save = useSaveBearing();
  const set = (k: keyof typeof blank) => (e: { target: { value: string } }) => setValues({ ...values, [k]: e.target.value });

  const submit = async (event: FormEvent) => {
    event.preventDefault();
    const toNum = (s: string) => (s.trim() === '' ? undefined : Number(s.replace(',', '.')));
    const parsed = BearingTypeInputSchema.safeParse({ ...values, balls: toNum(values.balls), ballMm: toNum(values.ballMm), pitchMm: toNum(values.pitchMm), contactDeg: toNum(values.contactDeg) });
    if (!parsed.success) {
      const next: Record<string, string> = {};
      for (const issue of parsed.error.issues) next[String(issue.path[0])] ??= issue.message;
      setErrors(next);
      return;
    }
    try {
      await save.mutateAsync({ id: bearing?.id, body: parsed.data });
      onDone();
    } catch (error) {
      const { fields, message: m } = formErrorsFrom(error);
      setErrors(fields);
      setMessage(m);
    }
  };

  return (
    <form onSubmit={submit} className="grid gap-3" noValidate aria-label={bearing ? `Edit ${bearing.designation}` : 'New bearing'}>
      <div className="grid grid-cols-2 gap-3">
        <Field label="Designation" value={values.designation} error={errors.designation} onChange={set('designation')} />
        <Field label="Balls" inputMode="numeric" className="font-mono" value={values.balls} error={errors.balls} onChange={set('balls')} />
        <Field label="Ball diameter (mm)" inputMode="decimal" className="font-mono" value={values.ballMm} error={errors.ballMm} onChange={set('ballMm')} />
        <Field label="Pitch diameter (mm)" inputMode="decimal" className="font-mono" value={values.pitchMm} error={errors.pitchMm} onChange={set('pitchMm')} />
        <Field label="Contact angle (°)" inputMode="decimal" className="font-mono" value={values.contactDeg} error={errors.contactDeg} onChange={set('contactDeg')} />
        <div className="grid gap-1.5">
          <Label htmlFor="bearing-source">Source</Label>
          <Select id="bearing-source" value={values.source} onChange={set('source')}>
            {BEARING_SOURCES.map((s) => <option key={s} value={s}>{s}</option>)}
          </Select>
        </div>
      </div>
      <Field label="Notes" value={values.notes} error={errors.notes} hint="Where the numbers come from" onChange={set('notes')} />
      {message ? <p role="alert" className="text-sm text-destructive">{message}</p> : null}
      <div className="flex justify-end gap-2">
        <Button variant="outline" onClick={onDone}>Cancel</Button>
        <Button type="submit" pending={save.isPending}>{bearing ? 'Save bearing' : 'Add bearing'}</Button>
      </div>
    </form>
  );
}
