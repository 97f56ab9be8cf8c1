import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';

async function fillSetup() {
  const user = userEvent.setup();
  await user.type(await screen.findByLabelText('Shop name'), 'Lugnut Garage');
  await user.type(screen.getByLabelText('Admin name'), 'Odile Ferrant');
  await user.type(screen.getByLabelText('Admin e-mail'), 'odile@lugnut-garage.test');
  await user.type(screen.getByLabelText('Admin password'), 'a long enough secret');
  await user.click(screen.getByRole('button', { name: 'Create shop and sign in' }));
}

describe('first-run set-up', () => {
  it('creates the shop, signs the admin in and opens the Team page', async () => {
    const admin = makeUser({ role: 'admin', name: 'Odile Ferrant', shop: { id: 9, name: 'Lugnut Garage', isDemo: false } });
    let body: unknown;
    server.use(
      http.post('*/api/setup', async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ user: admin }, { status: 201 });
      }),
      http.get('*/api/users', () => HttpResponse.json({ items: [admin] })),
      http.get('*/api/invites', () => HttpResponse.json({ items: [] })),
    );
    const { router } = renderApp('/setup', { needsSetup: true });
    await fillSetup();
    expect(await screen.findByRole('heading', { name: 'Team' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/team');
    expect(body).toEqual({ shopName: 'Lugnut Garage', adminName: 'Odile Ferrant', adminEmail: 'odile@lugnut-garage.test', password: 'a long enough secret' });
  });

  it('refuses a short password before sending', async () => {
    renderApp('/setup', { needsSetup: true });
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('Admin password'), 'short');
    await user.click(screen.getByRole('button', { name: 'Create shop and sign in' }));
    expect(await screen.findByText('Use at least 10 characters')).toBeTruthy();
    expect(screen.getByText('Enter the shop name (at least 2 characters)')).toBeTruthy();
  });

  it('shows the server message when another admin finished set-up first (409)', async () => {
    server.use(http.post('*/api/setup', () => apiError(409, 'setup_done', 'This installation already has a shop. Sign in instead.')));
    renderApp('/setup', { needsSetup: true });
    await fillSetup();
    expect(await screen.findByText('This installation already has a shop. Sign in instead.')).toBeTruthy();
  });

  it('says the installation is set up when no set-up is needed', async () => {
    renderApp('/setup', { needsSetup: false });
    expect(await screen.findByText('This installation is set up')).toBeTruthy();
  });
});
