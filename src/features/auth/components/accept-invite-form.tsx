import { useState, type FormEvent } from 'react';
import { ROLE_LABELS } from '../../../../shared/auth/roles';
import { PASSWORD_MIN_LENGTH } from '../../../../shared/schemas/common';
import { AcceptInviteSchema, type InviteInfo } from '../../../../shared/schemas/invites';
import type { UserDto } from '../../../../shared/schemas/users';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { checkWith, formErrorsFrom, formValues } from '../../../lib/form';
import { useAcceptInvite } from '../api/use-sign-in';

export interface AcceptInviteFormProps {
  token: string;
  invite: InviteInfo;
  onAccepted: (user: UserDto) => void;
}

/** Shows which shop and address the invite is for, and asks for a name and a password. */
export function AcceptInviteForm({ token, invite, onAccepted }: AcceptInviteFormProps) {
  const accept = useAcceptInvite();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    const checked = checkWith(AcceptInviteSchema, { ...values, token });
    if (!checked.ok) {
      setFieldErrors(checked.errors);
      return;
    }
    setFieldErrors({});
    accept.mutate(checked.data, {
      onSuccess: ({ user }) => onAccepted(user),
      onError: (error) => setFieldErrors(formErrorsFrom(error).fields),
    });
  };

  const serverMessage = accept.error ? formErrorsFrom(accept.error).message : undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 rounded-md bg-muted px-4 py-3 text-sm">
        <dt className="text-muted-foreground">Shop</dt>
        <dd className="font-medium">{invite.shopName}</dd>
        <dt className="text-muted-foreground">E-mail</dt>
        <dd className="font-medium break-all">{invite.email}</dd>
        <dt className="text-muted-foreground">Role</dt>
        <dd className="font-medium">{ROLE_LABELS[invite.role]}</dd>
      </dl>
      <Field label="Your name" name="name" autoComplete="name" autoFocus required error={fieldErrors.name} />
      <Field
        label="Choose a password"
        name="password"
        type="password"
        autoComplete="new-password"
        required
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        error={fieldErrors.password}
      />
      {serverMessage ? <ErrorState title="Could not accept the invite">{serverMessage}</ErrorState> : null}
      <Button type="submit" pending={accept.isPending} className="w-full">
        Join {invite.shopName}
      </Button>
    </form>
  );
}
