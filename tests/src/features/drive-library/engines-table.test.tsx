import { screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import type { EngineSummaryDto } from '../../../../shared/schemas/engines-api';
import { DEMO_DIESEL_I4, DEMO_I4, DEMO_V6 } from '../../../../server/db/seeders/demo-engines';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';
import { BEARINGS, SETTINGS, engineDto, summary } from './fixtures';

/** A fake GET /api/engines that searches, sorts and pages like the server, recording each query. */
function fakeEngines(items: EngineSummaryDto[]) {
  const queries: URLSearchParams[] = [];
  server.use(
    http.get('*/api/engines', ({ request }) => {
      const q = new URL(request.url).searchParams;
      queries.push(q);
      const search = (q.get('search') ?? '').toLowerCase();
      const sort = q.get('sort') ?? 'name';
      const page = Number(q.get('page') ?? 1);
      const pageSize = Number(q.get('pageSize') ?? 20);
      let rows = items.filter((e) => e.name.toLowerCase().includes(search));
      rows = rows.sort((a, b) => a.name.localeCompare(b.name));
      if (sort === '-name') rows.reverse();
      return HttpResponse.json({ items: rows.slice((page - 1) * pageSize, page * pageSize), total: rows.length, page, pageSize });
    }),
  );
  return queries;
}

const ENGINES = [summary(DEMO_I4, 1), summary(DEMO_V6, 2), summary(DEMO_DIESEL_I4, 3)];

describe('engines table', () => {
  it('lists the engines with their numbers and links to each engine page', async () => {
    fakeEngines(ENGINES);
    renderApp('/drive-library', { user: makeUser({ role: 'tech' }) });
    const link = await screen.findByRole('link', { name: 'Demo 3.0 V6 petrol' }, { timeout: 5000 });
    expect(link.getAttribute('href')).toBe('/drive-library/2');
    expect(screen.getByText('1-2-3-4-5-6')).toBeTruthy();
    // Read-only roles get no import or new-engine button.
    expect(screen.queryByRole('button', { name: 'Import JSON' })).toBeNull();
    expect(screen.queryByRole('link', { name: 'New engine' })).toBeNull();
  });

  it('searches, sorts and pages through the API', async () => {
    const many = Array.from({ length: 25 }, (_, i) => summary({ ...DEMO_I4, name: `Bench engine ${String(i).padStart(2, '0')}` }, 100 + i));
    const queries = fakeEngines([...many, ...ENGINES]);
    renderApp('/drive-library', { user: makeUser({ role: 'lead' }) });
    await screen.findByRole('link', { name: 'Bench engine 00' });
    expect(screen.getByText('1–20 of 28')).toBeTruthy();
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Next' }));
    expect(await screen.findByText('21–28 of 28')).toBeTruthy();
    expect(queries.at(-1)?.get('page')).toBe('2');
    await user.click(screen.getByRole('button', { name: /Engine/ }));
    await waitFor(() => expect(queries.at(-1)?.get('sort')).toBe('-name'));
    await user.type(screen.getByRole('searchbox', { name: 'Search engines' }), 'diesel');
    expect(await screen.findByRole('link', { name: 'Demo 2.0 I4 diesel' })).toBeTruthy();
    expect(queries.at(-1)?.get('search')).toBe('diesel');
    expect(queries.at(-1)?.get('page')).toBe('1');
  });

  it('imports a drive document and opens the new engine; a rejected file lists every problem', async () => {
    fakeEngines(ENGINES);
    let calls = 0;
    server.use(
      http.post('*/api/engines/import.json', async ({ request }) => {
        calls += 1;
        const body = (await request.json()) as { name: string };
        if (body.name === '') {
          return apiError(400, 'validation_failed', 'The engine name must not be empty (and 1 more)', [
            { path: 'name', message: 'The engine name must not be empty' },
            { path: 'components[1].pulleyMm', message: 'Pulley diameter must be between 20 and 400 mm (got 5)' },
          ]);
        }
        return HttpResponse.json({ engine: engineDto(DEMO_V6, 77) }, { status: 201 });
      }),
      http.get('*/api/engines/77', () => HttpResponse.json({ engine: engineDto(DEMO_V6, 77) })),
      http.get('*/api/bearings', () => HttpResponse.json({ items: BEARINGS })),
      http.get('*/api/shop/settings', () => HttpResponse.json({ settings: SETTINGS })),
      http.get('*/api/engines/77/history', () => HttpResponse.json({ items: [] })),
    );
    const { router } = renderApp('/drive-library', { user: makeUser({ role: 'admin' }) });
    await screen.findByRole('link', { name: 'Demo 1.6 I4 petrol' });
    const user = userEvent.setup();
    const bad = new File([JSON.stringify({ ...DEMO_V6, name: '' })], 'bad.drive.json', { type: 'application/json' });
    await user.upload(screen.getByLabelText('Drive document file'), bad);
    expect(await screen.findByText('The engine name must not be empty')).toBeTruthy();
    expect(screen.getByText('Part 2: Pulley diameter must be between 20 and 400 mm (got 5)')).toBeTruthy();
    await user.click(screen.getByRole('button', { name: 'Close' }));
    const good = new File([JSON.stringify(DEMO_V6)], 'v6.drive.json', { type: 'application/json' });
    await user.upload(screen.getByLabelText('Drive document file'), good);
    await waitFor(() => expect(router.state.location.pathname).toBe('/drive-library/77'));
    expect(calls).toBe(2);
  });
});
