import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { makeUser } from '../../helpers/factories';
import { server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';

describe('Outbox', () => {
  const admin = makeUser({ role: 'admin' });
  const item = {
    id: 41,
    to: 'new.tech@lugnut-garage.test',
    from: 'Crankwise <no-reply@crankwise.test>',
    subject: 'You are invited to Lugnut Garage',
    createdAt: '2026-03-02T08:00:00.000Z',
  };

  it('lists messages, opens one and renders its invite link as a link', async () => {
    server.use(
      http.get('*/api/outbox', () => HttpResponse.json({ items: [item] })),
      http.get('*/api/outbox/41', () =>
        HttpResponse.json({
          message: {
            ...item,
            text: 'Hello,\n\nOpen http://127.0.0.1:3000/invite/abcDEF123_-xyz0123456789abcdef. to join.\n',
            html: '<p>Hello</p><script>alert(1)</script>',
          },
        }),
      ),
    );
    renderApp('/outbox', { user: admin });
    expect(await screen.findByText('Choose a message to read it.')).toBeTruthy();
    await userEvent.setup().click(screen.getByRole('link', { name: /You are invited to Lugnut Garage/ }));
    const link = await screen.findByRole('link', { name: 'http://127.0.0.1:3000/invite/abcDEF123_-xyz0123456789abcdef' });
    // The sentence's full stop is not part of the link.
    expect(link.getAttribute('href')).toBe('http://127.0.0.1:3000/invite/abcDEF123_-xyz0123456789abcdef');
    expect(document.querySelector('script')).toBeNull();
  });

  it('says plainly that the Outbox is not for real users and names MAIL_URL (issue 19 item 5)', async () => {
    server.use(http.get('*/api/outbox', () => HttpResponse.json({ items: [] })));
    renderApp('/outbox', { user: admin });
    const note = await screen.findByText(/not for a shop serving real users/);
    const box = note.closest('[role="note"]')!;
    expect(box.textContent).toMatch(/including other people’s password-reset links/);
    expect(box.textContent).toMatch(/MAIL_URL/);
  });

  it('says so when no mail has arrived', async () => {
    server.use(http.get('*/api/outbox', () => HttpResponse.json({ items: [] })));
    renderApp('/outbox', { user: admin });
    expect(await screen.findByText('No messages yet')).toBeTruthy();
  });

  it('shows the error boundary when the list cannot be loaded', async () => {
    server.use(http.get('*/api/outbox', () => HttpResponse.json({ error: { code: 'internal_error', message: 'Internal error' } }, { status: 500 })));
    renderApp('/outbox', { user: admin });
    expect(await screen.findByText('Could not load this page')).toBeTruthy();
    expect(screen.getByRole('button', { name: 'Try again' })).toBeTruthy();
  });
});
