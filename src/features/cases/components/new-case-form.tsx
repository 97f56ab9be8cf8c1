import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery } from '@tanstack/react-query';
import { useId, useState } from 'react';
import { useForm, type FieldPath } from 'react-hook-form';
import type { z } from 'zod';
import { CreateCaseSchema, type CaseDto } from '../../../../shared/schemas/cases';
import type { EngineListResponse } from '../../../../shared/schemas/engines-api';
import { Button } from '../../../components/ui/button';
import { FormRow } from '../../../components/ui/form-row';
import { Input } from '../../../components/ui/input';
import { Select } from '../../../components/ui/select';
import { ErrorState } from '../../../components/ui/states';
import { Textarea } from '../../../components/ui/textarea';
import { api } from '../../../lib/api-client';
import { apiFieldErrors } from '../../../lib/api-field-errors';
import { casePeopleQueryOptions } from '../api/case-queries';
import { useCreateCase } from '../api/use-case-mutations';

type FormIn = z.input<typeof CreateCaseSchema>;
type FormOut = z.output<typeof CreateCaseSchema>;

const numberOrNull = (v: unknown) => (v === '' || v === null || v === undefined ? null : Number(v));

/**
 * The new-case form: RO number, vehicle, engine from the Drive library, complaint, technician,
 * lead and service advisor. Checked with the same schema the server uses (react-hook-form + zod),
 * and the server's field messages land next to their inputs.
 */
export function NewCaseForm({ onCreated, onCancel, me, advisorDefaults }: {
  onCreated: (c: CaseDto) => void;
  onCancel: () => void;
  me: { id: number };
  /** The shop's usual service advisor, where Shop setup has one. */
  advisorDefaults?: { name?: string | null; email?: string | null; leadId?: number | null };
}) {
  const id = useId();
  const people = useQuery(casePeopleQueryOptions());
  const engines = useQuery({
    queryKey: ['engines', 'pick'],
    queryFn: ({ signal }) => api.get<EngineListResponse>('/api/engines?pageSize=100&sort=name', { signal }),
  });
  const create = useCreateCase();
  const [formError, setFormError] = useState<string | null>(null);
  const { register, handleSubmit, setError, formState: { errors, isSubmitting } } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(CreateCaseSchema),
    defaultValues: {
      roNumber: '', complaint: '', engineId: null, technicianId: me.id, leadId: advisorDefaults?.leadId ?? null,
      vehicle: { year: null, make: '', model: '', vin: '', odometer: null, odometerUnit: 'km' },
      advisorName: advisorDefaults?.name ?? '', advisorEmail: advisorDefaults?.email ?? '',
    },
  });
  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    try {
      onCreated(await create.mutateAsync(values));
    } catch (error) {
      const { fields, message } = apiFieldErrors(error);
      for (const [path, text] of Object.entries(fields)) setError(path as FieldPath<FormIn>, { message: text });
      setFormError(message);
    }
  });
  const err = (m: { message?: string } | undefined) => m?.message;
  const aria = (name: string, m: unknown) => ({ id: `${id}-${name}`, 'aria-invalid': m ? true : undefined, 'aria-describedby': `${id}-${name}-message` });
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-5" aria-label="New case">
      <div className="grid gap-4 sm:grid-cols-3">
        <FormRow id={`${id}-ro`} label="RO number" error={err(errors.roNumber)}>
          <Input {...aria('ro', errors.roNumber)} autoFocus {...register('roNumber')} placeholder="e.g. RO-48213" />
        </FormRow>
        <FormRow id={`${id}-year`} label="Year" error={err(errors.vehicle?.year)}>
          <Input {...aria('year', errors.vehicle?.year)} inputMode="numeric" {...register('vehicle.year', { setValueAs: numberOrNull })} />
        </FormRow>
        <FormRow id={`${id}-vin`} label="VIN (optional)" error={err(errors.vehicle?.vin)}>
          <Input {...aria('vin', errors.vehicle?.vin)} className="font-mono uppercase" {...register('vehicle.vin')} />
        </FormRow>
        <FormRow id={`${id}-make`} label="Make" error={err(errors.vehicle?.make)}>
          <Input {...aria('make', errors.vehicle?.make)} {...register('vehicle.make')} />
        </FormRow>
        <FormRow id={`${id}-model`} label="Model" error={err(errors.vehicle?.model)}>
          <Input {...aria('model', errors.vehicle?.model)} {...register('vehicle.model')} />
        </FormRow>
        <div className="grid grid-cols-[1fr_5rem] gap-2">
          <FormRow id={`${id}-odo`} label="Odometer" error={err(errors.vehicle?.odometer)}>
            <Input {...aria('odo', errors.vehicle?.odometer)} inputMode="numeric" {...register('vehicle.odometer', { setValueAs: numberOrNull })} />
          </FormRow>
          <FormRow id={`${id}-unit`} label="Unit">
            <Select id={`${id}-unit`} {...register('vehicle.odometerUnit')}><option value="km">km</option><option value="mi">mi</option></Select>
          </FormRow>
        </div>
      </div>
      <FormRow id={`${id}-engine`} label="Engine (from the Drive library)" error={err(errors.engineId)} hint="Needed to rank suspects; you can choose it later.">
        <Select {...aria('engine', errors.engineId)} {...register('engineId', { setValueAs: numberOrNull })}>
          <option value="">{engines.isPending ? 'Loading engines…' : 'Not chosen yet'}</option>
          {engines.data?.items.map((e) => <option key={e.id} value={e.id}>{e.name}</option>)}
        </Select>
      </FormRow>
      <FormRow id={`${id}-complaint`} label="Complaint (the customer's words)" error={err(errors.complaint)}>
        <Textarea {...aria('complaint', errors.complaint)} rows={3} {...register('complaint')} placeholder="e.g. Whine at idle, worse with the lights on" />
      </FormRow>
      <div className="grid gap-4 sm:grid-cols-2">
        <FormRow id={`${id}-tech`} label="Technician" error={err(errors.technicianId)}>
          <Select {...aria('tech', errors.technicianId)} {...register('technicianId', { setValueAs: numberOrNull })}>
            {people.data?.technicians.map((p) => <option key={p.id} value={p.id}>{p.name}</option>) ?? <option value={me.id}>Me</option>}
          </Select>
        </FormRow>
        <FormRow id={`${id}-lead`} label="Lead technician" error={err(errors.leadId)}>
          <Select {...aria('lead', errors.leadId)} {...register('leadId', { setValueAs: numberOrNull })}>
            <option value="">Not assigned yet</option>
            {people.data?.leads.map((p) => <option key={p.id} value={p.id}>{p.name}</option>)}
          </Select>
        </FormRow>
        <FormRow id={`${id}-adv`} label="Service advisor" error={err(errors.advisorName)}>
          <Input {...aria('adv', errors.advisorName)} {...register('advisorName')} />
        </FormRow>
        <FormRow id={`${id}-advmail`} label="Service advisor's e-mail" error={err(errors.advisorEmail)} hint="The report is sent here.">
          <Input {...aria('advmail', errors.advisorEmail)} type="email" {...register('advisorEmail')} />
        </FormRow>
      </div>
      {formError ? <ErrorState title="The case was not opened">{formError}</ErrorState> : null}
      <div className="flex gap-2">
        <Button type="submit" pending={isSubmitting}>Open case</Button>
        <Button variant="outline" onClick={onCancel}>Cancel</Button>
      </div>
    </form>
  );
}
