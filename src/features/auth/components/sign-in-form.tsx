import { useState, type FormEvent, type ReactNode } from 'react';
import { SignInSchema } from '../../../../shared/schemas/auth';
import type { UserDto } from '../../../../shared/schemas/users';
import { Button } from '../../../components/ui/button';
import { Field } from '../../../components/ui/field';
import { ErrorState } from '../../../components/ui/states';
import { checkWith, formErrorsFrom, formValues } from '../../../lib/form';
import { useSignIn } from '../api/use-sign-in';

export interface SignInFormProps {
  onSignedIn: (user: UserDto) => void;
  /** Links under the button (forgotten password). */
  footer?: ReactNode;
}

/** E-mail + password; the server's answer (wrong password, too many attempts) shows above the button. */
export function SignInForm({ onSignedIn, footer }: SignInFormProps) {
  const signIn = useSignIn();
  const [fieldErrors, setFieldErrors] = useState<Record<string, string>>({});

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    event.preventDefault();
    const checked = checkWith(SignInSchema, formValues(event.currentTarget));
    if (!checked.ok) {
      setFieldErrors(checked.errors);
      return;
    }
    setFieldErrors({});
    signIn.mutate(checked.data, {
      onSuccess: ({ user }) => onSignedIn(user),
      onError: (error) => setFieldErrors(formErrorsFrom(error).fields),
    });
  };

  const serverMessage = signIn.error ? formErrorsFrom(signIn.error).message : undefined;
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4">
      <Field label="E-mail" name="email" type="email" autoComplete="username" autoFocus required error={fieldErrors.email} />
      <Field
        label="Password"
        name="password"
        type="password"
        autoComplete="current-password"
        required
        error={fieldErrors.password}
      />
      {serverMessage ? <ErrorState title="Could not sign in">{serverMessage}</ErrorState> : null}
      <Button type="submit" pending={signIn.isPending} className="w-full">
        Sign in
      </Button>
      {footer}
    </form>
  );
}
