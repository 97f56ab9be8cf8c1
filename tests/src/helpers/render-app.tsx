import { render } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { createMemoryRouter, RouterProvider } from 'react-router-dom';
import type { UserDto } from '../../../shared/schemas/users';
import { AppProvider } from '../../../src/app/provider';
import { createRoutes } from '../../../src/app/router';
import { createQueryClient } from '../../../src/lib/query-client';
import { apiError, server } from './msw-server';

export interface RenderAppOptions {
  /** The signed-in user; omit for a visitor without a session (GET /api/auth/me answers 401). */
  user?: UserDto;
  needsSetup?: boolean;
}

/**
 * Renders the real routes at `path` in a memory router with a fresh QueryClient (no retries), the
 * network faked by MSW. Returns the router so a test can read where the app went.
 */
export function renderApp(path: string, { user, needsSetup = false }: RenderAppOptions = {}) {
  server.use(
    http.get('*/api/auth/me', () => (user ? HttpResponse.json({ user }) : apiError(401, 'unauthenticated', 'Sign in first.'))),
    http.get('*/api/setup/status', () => HttpResponse.json({ needsSetup })),
  );
  const queryClient = createQueryClient({ retry: 0 });
  const router = createMemoryRouter(createRoutes(queryClient), { initialEntries: [path] });
  const view = render(
    <AppProvider queryClient={queryClient}>
      <RouterProvider router={router} />
    </AppProvider>,
  );
  return { ...view, router, queryClient };
}
