import { screen, waitFor, within } from '@testing-library/react';
import { describe, expect, it } from 'vitest';
import { ROLES } from '../../../shared/auth/roles';
import { http, HttpResponse } from 'msw';
import { makeUser } from '../helpers/factories';
import { server } from '../helpers/msw-server';
import { renderApp } from '../helpers/render-app';

async function navLinks(): Promise<string[]> {
  const nav = await screen.findByRole('navigation', { name: 'Main' });
  return within(nav)
    .getAllByRole('link')
    .map((link) => link.textContent ?? '');
}

describe('app navigation', () => {
  it('shows Team, Outbox and Shop setup to an admin', async () => {
    renderApp('/cases', { user: makeUser({ role: 'admin' }) });
    expect(await navLinks()).toEqual(['Cases', 'Drive library', 'Bearings', 'Capture planner', 'Team', 'Outbox', 'Shop setup']);
    // The page's title names the page (React hoists <title> into the head).
    await waitFor(() => expect(document.title).toBe('Cases · Crankwise'));
  });

  it.each(ROLES.filter((role) => role !== 'admin'))('shows only the workbench sections to a %s', async (role) => {
    renderApp('/cases', { user: makeUser({ role }) });
    const links = await navLinks();
    expect(links).toEqual(['Cases', 'Drive library', 'Bearings', 'Capture planner']);
    expect(links).not.toContain('Team');
  });

  it('sends a visitor without a session to sign-in and remembers the page asked for', async () => {
    const { router } = renderApp('/capture-planner');
    expect(await screen.findByRole('heading', { name: 'Sign in' })).toBeTruthy();
    expect(router.state.location.pathname).toBe('/sign-in');
    expect(router.state.location.search).toBe('?next=%2Fcapture-planner');
  });

  it('tells a technician who opens the Team address that it is for admins', async () => {
    renderApp('/team', { user: makeUser({ role: 'tech' }) });
    expect(await screen.findByText('Not available for your role')).toBeTruthy();
    // The layout stays: the navigation is still there to go elsewhere.
    expect(screen.getByRole('navigation', { name: 'Main' })).toBeTruthy();
  });

  it('shows the safety note under the pages', async () => {
    renderApp('/cases', { user: makeUser({ role: 'tech' }) });
    const note = await screen.findByRole('note');
    expect(note.textContent).toMatch(/keep hands, tools, leads, clothing and hair away from\s+belts, pulleys and fans/);
    expect(note.textContent).toMatch(/Electric cooling fans can start with the engine off/);
  });

  it('shows the full cautions on the capture planner instead of the footer note, and plans a capture with its working', async () => {
    server.use(http.get('*/api/shop/settings', () => HttpResponse.json({ error: { code: 'not_found', message: 'no settings' } }, { status: 404 })));
    renderApp('/capture-planner', { user: makeUser({ role: 'tech' }) });
    expect(await screen.findByText(/Electric cooling fans can start on their own/)).toBeTruthy();
    expect(screen.getByText(/attach pickups with the\s+engine off/)).toBeTruthy();
    expect(screen.getAllByRole('note')).toHaveLength(1);
    // 32 revolutions at 750 rpm = 2.56 s; 2.5 × 9000 Hz = 22.5 kHz → 32 kHz.
    const figures = within(screen.getByText('Record at least').closest('dl') as HTMLElement);
    expect(figures.getByText('2.56')).toBeTruthy();
    expect(figures.getByText('32')).toBeTruthy();
  });
});
