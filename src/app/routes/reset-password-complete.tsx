import { Link, useParams } from 'react-router-dom';
import { buttonVariants } from '../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { ResetCompleteForm } from '../../features/auth/components/reset-complete-form';
import { paths } from '../paths';

/** /reset-password/:token: the e-mailed link; sets the new password. */
export function ResetPasswordCompleteRoute() {
  const token = useParams().token ?? '';
  return (
    <Card>
      <CardHeader>
        <CardTitle>Choose a new password</CardTitle>
          <title>Choose a new password · Crankwise</title>
        <CardDescription>After this, sign in with the new password.</CardDescription>
      </CardHeader>
      <CardContent>
        <ResetCompleteForm
          token={token}
          done={
            <div role="status" className="grid gap-3 text-sm">
              <p className="font-medium">Your password is set.</p>
              <Link to={paths.signIn} className={buttonVariants({ className: 'w-full' })}>
                Sign in
              </Link>
            </div>
          }
          expiredAction={
            <Link to={paths.resetPassword} className={buttonVariants({ size: 'sm', variant: 'outline' })}>
              Send a new link
            </Link>
          }
        />
      </CardContent>
    </Card>
  );
}
