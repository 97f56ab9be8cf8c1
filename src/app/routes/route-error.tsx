import { isRouteErrorResponse, Link, useRevalidator, useRouteError } from 'react-router-dom';
import { Button, buttonVariants } from '../../components/ui/button';
import { ErrorState } from '../../components/ui/states';
import { ApiError } from '../../lib/api-client';
import { paths } from '../paths';

function describe(error: unknown): { title: string; message: string; signIn?: boolean; retry?: boolean } {
  if (isRouteErrorResponse(error)) {
    if (error.status === 403) return { title: 'Not available for your role', message: String(error.data) };
    if (error.status === 404) return { title: 'Page not found', message: 'There is no page at this address. Use the navigation to find your way.' };
    return { title: `Error ${error.status}`, message: typeof error.data === 'string' ? error.data : error.statusText, retry: error.status >= 500 };
  }
  if (error instanceof ApiError) {
    if (error.status === 401) return { title: 'You are signed out', message: 'Your session ended. Sign in again to continue.', signIn: true };
    if (error.status === 403) return { title: 'Not available for your role', message: error.message };
    if (error.status === 404) return { title: 'Not found', message: error.message };
    return { title: 'Could not load this page', message: error.message, retry: error.status === 0 || error.status >= 500 };
  }
  return {
    title: 'Something went wrong on this page',
    message: error instanceof Error ? error.message : 'An unexpected error stopped the page. Reload to try again.',
    retry: true,
  };
}

/** The error boundary of every route: what went wrong, and a way on (retry, sign in, or back to Cases). */
export function RouteError() {
  const error = useRouteError();
  const revalidator = useRevalidator();
  const { title, message, signIn, retry } = describe(error);
  return (
    <div className="mx-auto w-full max-w-xl p-6">
      <ErrorState
        title={title}
        action={
          signIn ? (
            <Link to={paths.signIn} className={buttonVariants({ size: 'sm' })}>
              Sign in
            </Link>
          ) : (
            <>
              {retry ? (
                <Button size="sm" variant="outline" pending={revalidator.state === 'loading'} onClick={() => void revalidator.revalidate()}>
                  Try again
                </Button>
              ) : null}
              <Link to={paths.cases} className={buttonVariants({ size: 'sm', variant: 'ghost' })}>
                Go to Cases
              </Link>
            </>
          )
        }
      >
        {message}
      </ErrorState>
    </div>
  );
}
