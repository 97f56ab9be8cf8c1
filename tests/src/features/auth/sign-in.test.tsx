import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';
import { SETTINGS } from '../drive-library/fixtures';

describe('sign-in page', () => {
  it("shows the server's message when the password is wrong (401)", async () => {
    server.use(
      http.post('*/api/auth/sign-in', () => apiError(401, 'invalid_credentials', 'That e-mail and password do not match an active account.')),
    );
    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'ada@lugnut-garage.test');
    await user.type(screen.getByLabelText('Password'), 'not-the-password');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('That e-mail and password do not match an active account.')).toBeTruthy();
    expect(screen.getByText('Could not sign in')).toBeTruthy();
  });

  it('sends the CSRF token and the credentials, then opens the page asked for', async () => {
    const me = makeUser({ role: 'lead', email: 'ada@lugnut-garage.test' });
    let received: { body: unknown; csrf: string | null } | null = null;
    server.use(
      http.post('*/api/auth/sign-in', async ({ request }) => {
        received = { body: await request.json(), csrf: request.headers.get('x-csrf-token') };
        return HttpResponse.json({ user: me });
      }),
      // The planner reads the shop's analysis defaults once it opens.
      http.get('*/api/shop/settings', () => HttpResponse.json({ settings: SETTINGS })),
    );
    const { router } = renderApp('/sign-in?next=%2Fcapture-planner');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), '  Ada@Lugnut-Garage.test ');
    await user.type(screen.getByLabelText('Password'), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { name: 'Capture planner' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/capture-planner');
    // The shared schema trims and lower-cases the address before it is sent.
    expect(received).toEqual({ body: { email: 'ada@lugnut-garage.test', password: 'correct horse battery' }, csrf: 'csrf-test-token' });
  });

  it('checks the fields before sending anything', async () => {
    let requests = 0;
    server.use(
      http.post('*/api/auth/sign-in', () => {
        requests += 1;
        return HttpResponse.json({});
      }),
    );
    renderApp('/sign-in');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'not an address');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByText('Enter a valid e-mail address')).toBeTruthy();
    expect(screen.getByText('Enter your password')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
    expect(requests).toBe(0);
  });

  it('offers the first-run set-up while no shop of its own exists', async () => {
    renderApp('/sign-in', { needsSetup: true });
    expect(await screen.findByRole('link', { name: 'Set up your shop' })).toBeTruthy();
  });

  it('signs out from the layout and lands on sign-in', async () => {
    let signedOut = false;
    server.use(
      http.post('*/api/auth/sign-out', () => {
        signedOut = true;
        return new HttpResponse(null, { status: 204 });
      }),
    );
    const { router } = renderApp('/cases', { user: makeUser({ role: 'tech' }) });
    const user = userEvent.setup();
    // The phone header and the sidebar each carry a Sign out button (CSS shows one); use the first.
    const [signOutButton] = await screen.findAllByRole('button', { name: 'Sign out' });
    // From here on the server no longer knows the session.
    server.use(http.get('*/api/auth/me', () => apiError(401, 'unauthenticated', 'Sign in first.')));
    await user.click(signOutButton);
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(signedOut).toBe(true);
    expect(await screen.findByText('You are signed out.')).toBeTruthy();
  });
});
