import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';

const TOKEN = 'k3y-Abcdefghijklmnopqrstuvwxyz0123456789AB';

describe('invite link', () => {
  it('shows the shop and address, then signs the new user in', async () => {
    const newUser = makeUser({ role: 'specialist', name: 'Ines Warde' });
    let body: unknown;
    server.use(
      http.get(`*/api/invites/${TOKEN}/info`, () =>
        HttpResponse.json({ email: 'ines@lugnut-garage.test', role: 'specialist', shopName: 'Lugnut Garage' }),
      ),
      http.post('*/api/invites/accept', async ({ request }) => {
        body = await request.json();
        return HttpResponse.json({ user: newUser });
      }),
    );
    const { router } = renderApp(`/invite/${TOKEN}`);
    expect(await screen.findByRole('heading', { name: 'Join Lugnut Garage' })).toBeTruthy();
    expect(screen.getByText('ines@lugnut-garage.test')).toBeTruthy();
    expect(screen.getByText('Diagnostic specialist')).toBeTruthy();
    const user = userEvent.setup();
    await user.type(screen.getByLabelText('Your name'), 'Ines Warde');
    await user.type(screen.getByLabelText('Choose a password'), 'quiet bearing hum');
    await user.click(screen.getByRole('button', { name: 'Join Lugnut Garage' }));
    expect(await screen.findByRole('heading', { name: 'Cases' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/cases');
    expect(body).toEqual({ token: TOKEN, name: 'Ines Warde', password: 'quiet bearing hum' });
  });

  it('explains a used or expired link', async () => {
    server.use(http.get(`*/api/invites/${TOKEN}/info`, () => apiError(404, 'token_invalid', 'This invite link is not valid.')));
    renderApp(`/invite/${TOKEN}`);
    expect(await screen.findByText('This invite link no longer works')).toBeTruthy();
  });
});

describe('password reset', () => {
  it('asks for the address and answers the same whether or not it is known', async () => {
    let body: unknown;
    server.use(
      http.post('*/api/auth/password-reset', async ({ request }) => {
        body = await request.json();
        return new HttpResponse(null, { status: 202 });
      }),
    );
    renderApp('/reset-password');
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'bram@lugnut-garage.test');
    await user.click(screen.getByRole('button', { name: 'Send reset link' }));
    expect(await screen.findByText('Check your e-mail')).toBeTruthy();
    expect(body).toEqual({ email: 'bram@lugnut-garage.test' });
  });

  it('sets the new password from the link', async () => {
    let body: unknown;
    server.use(
      http.post('*/api/auth/password-reset/complete', async ({ request }) => {
        body = await request.json();
        return new HttpResponse(null, { status: 204 });
      }),
    );
    renderApp(`/reset-password/${TOKEN}`);
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('New password'), 'fresh belt tension');
    await user.type(screen.getByLabelText('New password again'), 'fresh belt tension');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByText('Your password is set.')).toBeTruthy();
    expect(body).toEqual({ token: TOKEN, password: 'fresh belt tension' });
  });

  it('refuses two different entries before sending', async () => {
    renderApp(`/reset-password/${TOKEN}`);
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('New password'), 'fresh belt tension');
    await user.type(screen.getByLabelText('New password again'), 'fresh belt tensioN');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByText('The two passwords differ; type the same one twice')).toBeTruthy();
  });

  it('offers a new link when the token was used already (400 token_invalid)', async () => {
    server.use(
      http.post('*/api/auth/password-reset/complete', () =>
        apiError(400, 'token_invalid', 'This link was used already or has expired.'),
      ),
    );
    renderApp(`/reset-password/${TOKEN}`);
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('New password'), 'fresh belt tension');
    await user.type(screen.getByLabelText('New password again'), 'fresh belt tension');
    await user.click(screen.getByRole('button', { name: 'Set new password' }));
    expect(await screen.findByText('This link no longer works')).toBeTruthy();
    expect(screen.getByRole('link', { name: 'Send a new link' })).toBeTruthy();
  });
});
