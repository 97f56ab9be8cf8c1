import { useState, type FormEvent, type ReactNode } from 'react';
import { PasswordResetCompleteSchema } from '../../../../shared/schemas/auth';
import { PASSWORD_MIN_LENGTH } from '../../../../shared/schemas/common';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { ApiError } from '../../../lib/api-client';
import { checkWith, formErrorsFrom, formValues } from '../../../lib/form';
import { useCompletePasswordReset } from '../api/use-password-reset';

export interface ResetCompleteFormProps {
  token: string;
  /** Shown once the password is set (a link to sign in). */
  done: ReactNode;
  /** Shown under the error when the link no longer works (a link to ask for a new one). */
  expiredAction: ReactNode;
}

/** Sets a new password from an e-mailed one-time link; the two entries must match. */
export function ResetCompleteForm({ token, done, expiredAction }: ResetCompleteFormProps) {
  const complete = useCompletePasswordReset();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const values = formValues(event.currentTarget);
    const checked = checkWith(PasswordResetCompleteSchema, { token, password: values.password });
    if (!checked.ok) {
      setFieldErrors(checked.errors);
      return;
    }
    if (values.confirm !== values.password) {
      setFieldErrors({ confirm: 'The two passwords differ; type the same one twice' });
      return;
    }
    setFieldErrors({});
    complete.mutate(checked.data, { onError: (error) => setFieldErrors(formErrorsFrom(error).fields) });
  };

  if (complete.isSuccess) return <>{done}</>;
  const tokenInvalid = complete.error instanceof ApiError && complete.error.code === 'token_invalid';
  const serverMessage = complete.error ? formErrorsFrom(complete.error).message : undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4">
      <Field
        label="New password"
        name="password"
        type="password"
        autoComplete="new-password"
        autoFocus
        required
        hint={`At least ${PASSWORD_MIN_LENGTH} characters.`}
        error={fieldErrors.password}
      />
      <Field label="New password again" name="confirm" type="password" autoComplete="new-password" required error={fieldErrors.confirm} />
      {fieldErrors.token ? <ErrorState title="This link is incomplete">{fieldErrors.token}</ErrorState> : null}
      {serverMessage ? (
        <ErrorState title={tokenInvalid ? 'This link no longer works' : 'Could not set the password'} action={tokenInvalid ? expiredAction : undefined}>
          {serverMessage}
        </ErrorState>
      ) : null}
      <Button type="submit" pending={complete.isPending} className="w-full">
        Set new password
      </Button>
    </form>
  );
}
