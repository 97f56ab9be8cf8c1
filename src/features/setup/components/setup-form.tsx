import { useState, type FormEvent } from 'react';
import { PASSWORD_MIN_LENGTH } from '../../../../shared/schemas/common';
import { SetupSchema } from '../../../../shared/schemas/setup';
import type { UserResponse } from '../../../../shared/schemas/users';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { checkWith, formErrorsFrom, formValues } from '../../../lib/form';
import { useCreateShop } from '../api/use-create-shop';

/** The first-run form: the shop's name and its first admin. */
export function SetupForm({ onCreated }: { onCreated: (response: UserResponse) => void }) {
  const create = useCreateShop();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const checked = checkWith(SetupSchema, formValues(event.currentTarget));
    if (!checked.ok) {
      setFieldErrors(checked.errors);
      return;
    }
    setFieldErrors({});
    create.mutate(checked.data, {
      onSuccess: onCreated,
      onError: (error) => setFieldErrors(formErrorsFrom(error).fields),
    });
  };

  const serverMessage = create.error ? formErrorsFrom(create.error).message : undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4">
      <Field label="Shop name" name="shopName" autoComplete="organization" autoFocus required error={fieldErrors.shopName} />
      <div className="grid gap-4 sm:grid-cols-2">
        <Field label="Admin name" name="adminName" autoComplete="name" required error={fieldErrors.adminName} />
        <Field label="Admin e-mail" name="adminEmail" type="email" autoComplete="username" required error={fieldErrors.adminEmail} />
      </div>
      <Field
        label="Admin password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        hint={`At least ${PASSWORD_MIN_LENGTH} characters. The admin invites everyone else from the Team page.`}
        error={fieldErrors.password}
      />
      {serverMessage ? <ErrorState title="Could not create the shop">{serverMessage}</ErrorState> : null}
      <Button type="submit" pending={create.isPending} className="w-full">
        Create shop and sign in
      </Button>
    </form>
  );
}
