import type { QueryClient } from '@tanstack/react-query';
import { data, redirect } from 'react-router-dom';
import { canUseSection, NAV_LABELS, type NavSection } from '../../shared/auth/roles';
import type { UserDto } from '../../shared/schemas/users';
import { meQueryOptions } from '../features/auth/api/auth-queries';
import { isUnauthenticated } from '../lib/api-client';
import { paths } from './paths';

/** Where sign-in sends the user back to once they are in. */
function signInRedirect(request: Request): Response {
  const url = new URL(request.url);
  const next = url.pathname + url.search;
  return redirect(next === paths.home ? paths.signIn : `${paths.signIn}?next=${encodeURIComponent(next)}`);
}

/**
 * The signed-in user, from the cache or GET /api/auth/me. Nobody signed in → redirect to sign-in
 * with `?next=` so the user comes back to the page they asked for.
 */
export async function requireUser(queryClient: QueryClient, request: Request): Promise<UserDto> {
  try {
    const { user } = await queryClient.ensureQueryData(meQueryOptions());
    return user;
  } catch (error) {
    if (isUnauthenticated(error)) throw signInRedirect(request);
    throw error;
  }
}

/**
 * Like requireUser, and the user's role must be allowed the section (shared/auth/roles.ts, the
 * same table the server's access table agrees with); otherwise a 403 the route error boundary shows.
 */
export async function requireSection(queryClient: QueryClient, request: Request, section: NavSection): Promise<UserDto> {
  const user = await requireUser(queryClient, request);
  if (!canUseSection(user.role, section)) {
    throw data(`${NAV_LABELS[section]} is for the shop's admins. Ask an admin if you need something changed there.`, {
      status: 403,
    });
  }
  return user;
}
