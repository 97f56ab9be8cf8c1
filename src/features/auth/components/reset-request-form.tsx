import { useState, type FormEvent } from 'react';
import { PasswordResetRequestSchema } from '../../../../shared/schemas/auth';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { checkWith, formErrorsFrom, formValues } from '../../../lib/form';
import { useRequestPasswordReset } from '../api/use-password-reset';

/**
 * Asks for the address to send a reset link to. The answer is the same whether or not the
 * address is known, so the page never reveals who has an account.
 */
export function ResetRequestForm() {
  const request = useRequestPasswordReset();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});
  const [sentTo, setSentTo] = useState<string | null>(null);

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const checked = checkWith(PasswordResetRequestSchema, formValues(event.currentTarget));
    if (!checked.ok) {
      setFieldErrors(checked.errors);
      return;
    }
    setFieldErrors({});
    request.mutate(checked.data, {
      onSuccess: () => setSentTo(checked.data.email),
      onError: (error) => setFieldErrors(formErrorsFrom(error).fields),
    });
  };

  if (sentTo) {
    return (
      <div role="status" className="rounded-md bg-muted px-4 py-3 text-sm">
        <p className="font-medium">Check your e-mail</p>
        <p className="mt-1 text-muted-foreground">
          If <span className="font-medium text-foreground">{sentTo}</span> belongs to a Crankwise account, a link to set a new
          password is on its way. The link works once and expires.
        </p>
      </div>
    );
  }
  const serverMessage = request.error ? formErrorsFrom(request.error).message : undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4">
      <Field label="E-mail" name="email" type="email" autoComplete="username" autoFocus required error={fieldErrors.email} />
      {serverMessage ? <ErrorState title="Could not send the link">{serverMessage}</ErrorState> : null}
      <Button type="submit" pending={request.isPending} className="w-full">
        Send reset link
      </Button>
    </form>
  );
}
