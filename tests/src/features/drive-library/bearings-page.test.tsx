import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import type { BearingTypeDto } from '../../../../shared/schemas/bearings';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';
import { BEARINGS } from './fixtures';

describe('Bearings page', { timeout: 30_000 }, () => {
  it('lists the table with source badges and factors; a technician cannot edit', async () => {
    server.use(http.get('*/api/bearings', () => HttpResponse.json({ items: BEARINGS })));
    renderApp('/bearings', { user: makeUser({ role: 'tech' }) });
    const table = await screen.findByRole('table', { name: 'Bearings' }, { timeout: 5000 });
    const row6205 = within(table).getByText('6205').closest('tr')!;
    expect(within(row6205).getByText('published')).toBeTruthy();
    // CWRU 6205 BPFO 3.5848 (docs/references.md §1, published), shown to four decimals.
    expect(within(row6205).getByText('3.5848')).toBeTruthy();
    expect(screen.queryByRole('button', { name: 'Add bearing' })).toBeNull();
  });

  it('adds a bearing after a client-side range check and a server conflict are shown', async () => {
    let items = [...BEARINGS];
    const posts: unknown[] = [];
    server.use(
      http.get('*/api/bearings', () => HttpResponse.json({ items })),
      http.post('*/api/bearings', async ({ request }) => {
        const body = (await request.json()) as BearingTypeDto;
        posts.push(body);
        if (posts.length === 1) return apiError(409, 'designation_taken', 'Designation "6203" is already in this shop\'s table', [{ path: 'designation', message: '"6203" is already in the table' }]);
        const row = { ...BEARINGS[0], ...body, id: 99 };
        items = [...items, row];
        return HttpResponse.json({ bearing: row }, { status: 201 });
      }),
    );
    renderApp('/bearings', { user: makeUser({ role: 'lead' }) });
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Add bearing' }, { timeout: 5000 }));
    const form = screen.getByRole('form', { name: 'New bearing' });
    await user.type(within(form).getByLabelText('Designation'), '6203');
    await user.type(within(form).getByLabelText('Balls'), '8');
    await user.type(within(form).getByLabelText('Ball diameter (mm)'), '40');
    await user.type(within(form).getByLabelText('Pitch diameter (mm)'), '30');
    await user.click(within(form).getByRole('button', { name: 'Add bearing' }));
    // Checked on the client with the server's schema: the ball must be smaller than the pitch circle.
    expect(await within(form).findByText('Ball diameter must be smaller than the pitch diameter')).toBeTruthy();
    expect(posts).toHaveLength(0);
    await user.clear(within(form).getByLabelText('Ball diameter (mm)'));
    await user.type(within(form).getByLabelText('Ball diameter (mm)'), '6.5');
    await user.click(within(form).getByRole('button', { name: 'Add bearing' }));
    expect((await within(form).findByRole('alert')).textContent).toMatch(/"6203" is already in this shop's table/);
    await user.clear(within(form).getByLabelText('Designation'));
    await user.type(within(form).getByLabelText('Designation'), 'SHOP-7');
    await user.click(within(form).getByRole('button', { name: 'Add bearing' }));
    await waitFor(() => expect(screen.queryByRole('form', { name: 'New bearing' })).toBeNull());
    expect(posts[1]).toMatchObject({ designation: 'SHOP-7', balls: 8, ballMm: 6.5, pitchMm: 30, source: 'measured' });
    expect(await screen.findByText('SHOP-7')).toBeTruthy();
  });
});
