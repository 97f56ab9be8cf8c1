import { useQueryClient, type QueryClient } from '@tanstack/react-query';
import { useEffect } from 'react';
import { Link, redirect, useLoaderData, useNavigate, useSearchParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { meQueryOptions } from '../../features/auth/api/auth-queries';
import { SignInForm } from '../../features/auth/components/sign-in-form';
import { setupStatusQueryOptions } from '../../features/setup/api/setup-queries';
import { buttonVariants } from '../../components/ui/button';
import { paths, safeNext } from '../paths';

interface SignInData {
  needsSetup: boolean;
}

/** Already signed in → straight on; otherwise learn whether a first shop still has to be set up. */
export const signInLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs): Promise<SignInData> => {
    // Ask the server, not the cache: a cached user may belong to a session that just ended.
    const me = await queryClient.fetchQuery({ ...meQueryOptions(), staleTime: 0 }).catch(() => null);
    if (me) throw redirect(safeNext(new URL(request.url).searchParams.get('next')));
    const status = await queryClient.fetchQuery(setupStatusQueryOptions()).catch(() => null);
    return { needsSetup: status?.needsSetup ?? false };
  };

/** The sign-in page. */
export function SignInRoute() {
  const { needsSetup } = useLoaderData() as SignInData;
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const signedOut = params.get('signedOut') === '1';
  // Nobody is signed in here: whatever a previous session cached goes (the signed-in layout has
  // unmounted by now, so nothing refetches it).
  useEffect(() => queryClient.clear(), [queryClient]);
  return (
    <div className="grid gap-4">
      {signedOut ? (
        <p role="status" className="rounded-md border border-border bg-card px-4 py-2.5 text-sm text-muted-foreground">
          You are signed out.
        </p>
      ) : null}
      <Card>
        <CardHeader>
          <CardTitle>Sign in</CardTitle>
          <title>Sign in · Crankwise</title>
          <CardDescription>Use the e-mail address your shop's admin invited.</CardDescription>
        </CardHeader>
        <CardContent>
          <SignInForm
            onSignedIn={() => navigate(safeNext(params.get('next')), { replace: true })}
            footer={
              <Link to={paths.resetPassword} className="justify-self-center text-sm text-primary underline-offset-4 hover:underline">
                Forgot your password?
              </Link>
            }
          />
        </CardContent>
      </Card>
      {needsSetup ? (
        <Card className="border-dashed">
          <CardHeader>
            <CardTitle className="text-sm">First time here?</CardTitle>
            <CardDescription>
              No shop of your own is set up yet. Create your shop and its admin account; the demo shop stays available to try
              things out.
            </CardDescription>
          </CardHeader>
          <CardContent>
            <Link to={paths.setup} className={buttonVariants({ variant: 'outline', size: 'sm' })}>
              Set up your shop
            </Link>
          </CardContent>
        </Card>
      ) : null}
    </div>
  );
}
