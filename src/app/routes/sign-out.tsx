import type { QueryClient } from '@tanstack/react-query';
import { Form, Link, redirect, useNavigation } from 'react-router-dom';
import { Button, buttonVariants } from '../../components/ui/button';
import { Card, CardContent, CardDescription, CardHeader, CardTitle } from '../../components/ui/card';
import { signOut } from '../../features/auth/api/sign-out';
import { paths } from '../paths';

/** POST /sign-out (the layout's button): stops running queries, ends the session, goes to sign-in. */
export const signOutAction = (queryClient: QueryClient) => async () => {
  await queryClient.cancelQueries();
  await signOut();
  return redirect(`${paths.signIn}?signedOut=1`);
};

/** GET /sign-out: a page with one button, for a bookmarked or typed address. */
export function SignOutRoute() {
  const navigation = useNavigation();
  return (
    <Card>
      <CardHeader>
        <CardTitle>Sign out</CardTitle>
          <title>Sign out · Crankwise</title>
        <CardDescription>End your session on this computer. Unsaved form entries are lost.</CardDescription>
      </CardHeader>
      <CardContent>
        <Form method="post" action={paths.signOut} className="flex gap-2">
          <Button type="submit" pending={navigation.state !== 'idle'}>
            Sign out
          </Button>
          <Link to={paths.cases} className={buttonVariants({ variant: 'ghost' })}>
            Stay signed in
          </Link>
        </Form>
      </CardContent>
    </Card>
  );
}
