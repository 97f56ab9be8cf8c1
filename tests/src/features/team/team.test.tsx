import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import type { InviteDto } from '../../../../shared/schemas/invites';
import type { UserDto } from '../../../../shared/schemas/users';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';

/** A tiny in-memory shop behind the Team endpoints, so the page's refetch shows what changed. */
function fakeTeam(users: UserDto[], invites: InviteDto[] = []) {
  const patches: Array<{ id: number; body: unknown }> = [];
  const created: unknown[] = [];
  const revoked: number[] = [];
  server.use(
    http.get('*/api/users', () => HttpResponse.json({ items: users })),
    http.patch('*/api/users/:id', async ({ params, request }) => {
      const id = Number(params.id);
      const body = (await request.json()) as Partial<UserDto>;
      patches.push({ id, body });
      users = users.map((u) => (u.id === id ? { ...u, ...body } : u));
      return HttpResponse.json({ user: users.find((u) => u.id === id) });
    }),
    http.get('*/api/invites', () => HttpResponse.json({ items: invites })),
    http.post('*/api/invites', async ({ request }) => {
      const body = (await request.json()) as { email: string; role: InviteDto['role'] };
      created.push(body);
      const invite: InviteDto = {
        id: 900 + created.length,
        ...body,
        createdAt: '2026-03-02T08:00:00.000Z',
        expiresAt: '2099-03-04T08:00:00.000Z',
        acceptedAt: null,
      };
      invites = [...invites, invite];
      return HttpResponse.json({ invite }, { status: 201 });
    }),
    http.delete('*/api/invites/:id', ({ params }) => {
      revoked.push(Number(params.id));
      invites = invites.filter((i) => i.id !== Number(params.id));
      return new HttpResponse(null, { status: 204 });
    }),
  );
  return { patches, created, revoked };
}

describe('Team page', () => {
  const admin = makeUser({ role: 'admin', name: 'Odile Ferrant' });
  const tech = makeUser({ role: 'tech', name: 'Bram Kessel' });

  it('changes a role through PATCH /api/users/:id and shows the new role', async () => {
    const { patches } = fakeTeam([admin, tech]);
    renderApp('/team', { user: admin });
    const select = await screen.findByLabelText('Role of Bram Kessel');
    await userEvent.setup().selectOptions(select, 'specialist');
    await waitFor(() => expect(patches).toEqual([{ id: tech.id, body: { role: 'specialist' } }]));
    await waitFor(() => expect((screen.getByLabelText('Role of Bram Kessel') as HTMLSelectElement).value).toBe('specialist'));
    expect(await screen.findByText('Bram Kessel is now Diagnostic specialist')).toBeTruthy();
  });

  it("does not offer to change the admin's own role", async () => {
    fakeTeam([admin, tech]);
    renderApp('/team', { user: admin });
    const own = (await screen.findByLabelText('Role of Odile Ferrant')) as HTMLSelectElement;
    expect(own.disabled).toBe(true);
    expect((screen.getByLabelText('Role of Bram Kessel') as HTMLSelectElement).disabled).toBe(false);
  });

  it('deactivates a user after confirming, and offers to reactivate', async () => {
    const { patches } = fakeTeam([admin, tech]);
    renderApp('/team', { user: admin });
    const user = userEvent.setup();
    const row = (await screen.findByText('Bram Kessel')).closest('tr')!;
    await user.click(within(row).getByRole('button', { name: 'Deactivate' }));
    const dialog = await screen.findByRole('dialog', { name: 'Deactivate Bram Kessel?' });
    await user.click(within(dialog).getByRole('button', { name: 'Deactivate' }));
    await waitFor(() => expect(patches).toEqual([{ id: tech.id, body: { active: false } }]));
    expect(await within(row).findByRole('button', { name: 'Reactivate' })).toBeTruthy();
    expect(within(row).getByText('Deactivated')).toBeTruthy();
  });

  it('shows the server refusal as a toast when a change is not allowed', async () => {
    fakeTeam([admin, tech]);
    server.use(http.patch('*/api/users/:id', () => apiError(409, 'last_admin', 'The shop needs at least one active admin.')));
    renderApp('/team', { user: admin });
    await userEvent.setup().selectOptions(await screen.findByLabelText('Role of Bram Kessel'), 'lead');
    expect(await screen.findByText('The shop needs at least one active admin.')).toBeTruthy();
    expect((screen.getByLabelText('Role of Bram Kessel') as HTMLSelectElement).value).toBe('tech');
  });

  it('sends an invite and lists it as open; revoking removes it', async () => {
    const { created, revoked } = fakeTeam([admin]);
    renderApp('/team', { user: admin });
    const user = userEvent.setup();
    expect(await screen.findByText('No open invites')).toBeTruthy();
    await user.type(screen.getByLabelText('E-mail'), 'new.tech@lugnut-garage.test');
    await user.selectOptions(screen.getByLabelText('Role'), 'lead');
    await user.click(screen.getByRole('button', { name: 'Send invite' }));
    expect(created).toEqual([{ email: 'new.tech@lugnut-garage.test', role: 'lead' }]);
    const cell = await screen.findByRole('cell', { name: 'new.tech@lugnut-garage.test' });
    await user.click(within(cell.closest('tr')!).getByRole('button', { name: 'Revoke' }));
    await user.click(within(await screen.findByRole('dialog')).getByRole('button', { name: 'Revoke invite' }));
    await waitFor(() => expect(revoked).toEqual([901]));
    expect(await screen.findByText('No open invites')).toBeTruthy();
  });

  it('shows field messages from a 400 validation_failed next to the invite inputs', async () => {
    fakeTeam([admin]);
    server.use(
      http.post('*/api/invites', () =>
        // The server's shape (server/middleware/error-handler.ts): dotted path strings.
        apiError(400, 'validation_failed', 'email: This address already belongs to a user of your shop', [
          { path: 'email', message: 'This address already belongs to a user of your shop' },
        ]),
      ),
    );
    renderApp('/team', { user: admin });
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), 'odile@lugnut-garage.test');
    await user.click(screen.getByRole('button', { name: 'Send invite' }));
    expect(await screen.findByText('This address already belongs to a user of your shop')).toBeTruthy();
    expect(screen.getByLabelText('E-mail').getAttribute('aria-invalid')).toBe('true');
  });
});
