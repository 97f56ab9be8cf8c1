import { useQuery, type QueryClient } from '@tanstack/react-query';
import { Link, useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { buttonVariants } from '../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { LoadingState } from '../../components/ui/spinner';
import { ErrorState } from '../../components/ui/states';
import { inviteInfoQueryOptions } from '../../features/auth/api/auth-queries';
import { AcceptInviteForm } from '../../features/auth/components/accept-invite-form';
import { ApiError } from '../../lib/api-client';
import { paths } from '../paths';

/** Warms the invite's info; a dead link is shown by the page itself, not the error boundary. */
export const inviteAcceptLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    await queryClient.prefetchQuery(inviteInfoQueryOptions(params.token ?? ''));
    return null;
  };

/** /invite/:token: the e-mailed link; asks the new user for a name and a password. */
export function InviteAcceptRoute() {
  const token = useParams().token ?? '';
  const navigate = useNavigate();
  const info = useQuery(inviteInfoQueryOptions(token));

  if (info.isPending) return <LoadingState label="Checking the invite…" />;
  if (info.isError) {
    const gone = info.error instanceof ApiError && [400, 404, 410].includes(info.error.status);
    return (
      <ErrorState
        title={gone ? 'This invite link no longer works' : 'Could not check the invite'}
        action={
          <Link to={paths.signIn} className={buttonVariants({ size: 'sm', variant: 'outline' })}>
            Go to sign-in
          </Link>
        }
      >
        {gone
          ? 'It was used already, revoked, or it expired. Ask your shop’s admin to send a new invite.'
          : info.error.message}
      </ErrorState>
    );
  }
  return (
    <Card>
      <CardHeader>
        <CardTitle>Join {info.data.shopName}</CardTitle>
        <CardDescription>You were invited to Crankwise. Choose your name as colleagues will see it, and a password.</CardDescription>
      </CardHeader>
      <CardContent>
        <AcceptInviteForm token={token} invite={info.data} onAccepted={() => navigate(paths.cases, { replace: true })} />
      </CardContent>
    </Card>
  );
}
