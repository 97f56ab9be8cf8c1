import { useRef, useState, type FormEvent } from 'react';
import { ROLES, ROLE_LABELS } from '../../../../shared/auth/roles';
import { CreateInviteSchema } from '../../../../shared/schemas/invites';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { Label } from '../../../components/ui/label';
import { Select } from '../../../components/ui/select';
import { ErrorState } from '../../../components/ui/states';
import { toast } from '../../../components/ui/toast';
import { checkWith, formErrorsFrom, formValues } from '../../../lib/form';
import { useCreateInvite } from '../api/use-team-mutations';

/** Invites a person by e-mail with a role; the e-mail carries a one-time link. */
export function InviteForm() {
  const create = useCreateInvite();
  const formRef = useRef<HTMLFormElement>(null);
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const checked = checkWith(CreateInviteSchema, formValues(event.currentTarget));
    if (!checked.ok) {
      setFieldErrors(checked.errors);
      return;
    }
    setFieldErrors({});
    create.mutate(checked.data, {
      onSuccess: () => {
        formRef.current?.reset();
        toast({ title: `Invite sent to ${checked.data.email}`, variant: 'success' });
      },
      onError: (error) => setFieldErrors(formErrorsFrom(error).fields),
    });
  };

  const serverMessage = create.error ? formErrorsFrom(create.error).message : undefined;
  return (
    <form ref={formRef} onSubmit={onSubmit} noValidate className="grid gap-3 sm:grid-cols-[1fr_13rem_auto] sm:items-start">
      <Field label="E-mail" name="email" type="email" placeholder="name@example.com" required error={fieldErrors.email} />
      <div className="grid gap-1.5">
        <Label htmlFor="invite-role">Role</Label>
        <Select id="invite-role" name="role" defaultValue="tech" aria-invalid={fieldErrors.role ? true : undefined}>
          {ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_LABELS[role]}
            </option>
          ))}
        </Select>
        {fieldErrors.role ? <p className="text-xs font-medium text-destructive">{fieldErrors.role}</p> : null}
      </div>
      <Button type="submit" pending={create.isPending} className="sm:mt-6">
        Send invite
      </Button>
      {serverMessage ? (
        <ErrorState title="Could not send the invite" className="sm:col-span-3">
          {serverMessage}
        </ErrorState>
      ) : null}
    </form>
  );
}
