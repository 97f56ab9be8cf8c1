import { Link } from 'react-router-dom';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { ResetRequestForm } from '../../features/auth/components/reset-request-form';
import { paths } from '../paths';

/** /reset-password: asks for the address to send a one-time link to. */
export function ResetPasswordRoute() {
  return (
    <Card>
      <CardHeader>
        <CardTitle>Reset your password</CardTitle>
          <title>Reset your password · Crankwise</title>
        <CardDescription>We e-mail you a link that sets a new password. It works once.</CardDescription>
      </CardHeader>
      <CardContent className="grid gap-4">
        <ResetRequestForm />
        <Link to={paths.signIn} className="justify-self-center text-sm text-primary underline-offset-4 hover:underline">
          Back to sign-in
        </Link>
      </CardContent>
    </Card>
  );
}
