import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { Link, useLoaderData, useNavigate } from 'react-router-dom';
import { buttonVariants } from '../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { EmptyState } from '../../components/ui/states';
import { authKeys } from '../../features/auth/api/auth-keys';
import { setupStatusQueryOptions } from '../../features/setup/api/setup-queries';
import { SetupForm } from '../../features/setup/components/setup-form';
import { paths } from '../paths';

/** Whether a first shop still has to be created (GET /api/setup/status). */
export const setupLoader = (queryClient: QueryClient) => async () => queryClient.fetchQuery(setupStatusQueryOptions());

/** First-run set-up: creates the shop and its admin, then opens the app signed in as that admin. */
export function SetupRoute() {
  const { needsSetup } = useLoaderData() as Awaited<ReturnType<ReturnType<typeof setupLoader>>>;
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  if (!needsSetup) {
    return (
      <EmptyState
        title="This installation is set up"
        action={
          <Link to={paths.signIn} className={buttonVariants({ size: 'sm' })}>
            Go to sign-in
          </Link>
        }
      >
        Your shop already exists. Its admin invites new people from the Team page; another shop is created with
        <code className="mx-1 font-mono text-xs">npm run create-shop</code>.
      </EmptyState>
    );
  }
  return (
    <Card>
      <CardHeader>
        <CardTitle>Set up your shop</CardTitle>
          <title>Set up your shop · Crankwise</title>
        <CardDescription>
          Create your shop and its first admin. Everything your shop enters stays separate from the demo shop and any other shop.
        </CardDescription>
      </CardHeader>
      <CardContent>
        <SetupForm
          onCreated={(response) => {
            queryClient.setQueryData(authKeys.me(), response);
            navigate(paths.team, { replace: true });
          }}
        />
        <p className="mt-4 text-center text-sm text-muted-foreground">
          Just looking?{' '}
          <Link to={paths.signIn} className="text-primary underline-offset-4 hover:underline">
            Sign in to the demo shop
          </Link>
        </p>
      </CardContent>
    </Card>
  );
}
