import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import type { DriveDocument } from '../../../../shared/drive/types';
import { DEMO_I4 } from '../../../../server/db/seeders/demo-engines';
import { makeUser } from '../../helpers/factories';
import { apiError, server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';
import { BEARINGS, SETTINGS, engineDto } from './fixtures';

function fakeEngine(doc: DriveDocument = DEMO_I4) {
  const puts: unknown[] = [];
  let current = engineDto(doc);
  server.use(
    http.get('*/api/engines/41', () => HttpResponse.json({ engine: current })),
    http.get('*/api/bearings', () => HttpResponse.json({ items: BEARINGS })),
    http.get('*/api/shop/settings', () => HttpResponse.json({ settings: SETTINGS })),
    http.get('*/api/engines/41/history', () => HttpResponse.json({ items: [] })),
    http.put('*/api/engines/41', async ({ request }) => {
      const { version, ...body } = (await request.json()) as DriveDocument & { version: number };
      puts.push(body);
      current = { ...engineDto(body), version: version + 1 };
      return HttpResponse.json({ engine: current });
    }),
  );
  return puts;
}

const rowOf = (name: string) => screen.getAllByDisplayValue(name).find((el) => el.tagName === 'INPUT')!.closest('tr') as HTMLElement;

describe('engine page', { timeout: 30_000 }, () => {
  it('shows each row with its computed ratio and defect orders', async () => {
    fakeEngine();
    renderApp('/drive-library/41', { user: makeUser({ role: 'lead' }) });
    await screen.findByLabelText('Name of row 2', {}, { timeout: 5000 });
    // 148 / 56 = 2.643: the alternator's shaft order.
    expect(within(rowOf('Alternator')).getAllByText('2.643').length).toBe(1);
    // The 6203 idler: BPFO = 148/70 × 3.0530 (CWRU published factor) = 6.455.
    expect(within(rowOf('Upper idler')).getByText('6.455')).toBeTruthy();
    expect(screen.getByRole('img', { name: 'Belt layout sketch' })).toBeTruthy();
  });

  it('recomputes the ratio while a pulley is edited and saves the document with PUT', async () => {
    const puts = fakeEngine();
    renderApp('/drive-library/41', { user: makeUser({ role: 'admin' }) });
    await screen.findByLabelText('Name of row 2', {}, { timeout: 5000 });
    const user = userEvent.setup();
    const pulley = within(rowOf('Alternator')).getByLabelText('Pulley mm of row 2');
    await user.clear(pulley);
    await user.type(pulley, '74');
    // 148 / 74 = 2.000
    expect(within(rowOf('Alternator')).getAllByText('2.000').length).toBe(1);
    await user.click(screen.getByRole('button', { name: 'Save engine' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const sent = puts[0] as DriveDocument;
    expect(sent.components[1]).toMatchObject({ name: 'Alternator', pulleyMm: 74 });
    expect(sent.components).toHaveLength(DEMO_I4.components.length);
  });

  it('shows a field error at the cell and sends nothing while it stands', async () => {
    const puts = fakeEngine();
    renderApp('/drive-library/41', { user: makeUser({ role: 'lead' }) });
    await screen.findByLabelText('Name of row 2', {}, { timeout: 5000 });
    const user = userEvent.setup();
    const pulley = within(rowOf('Tensioner')).getByLabelText('Pulley mm of row 7');
    await user.clear(pulley);
    await user.type(pulley, '5');
    await user.click(screen.getByRole('button', { name: 'Save engine' }));
    expect(await within(rowOf('Tensioner')).findByText(/Pulley diameter must be between 20 and 400 mm/)).toBeTruthy();
    expect(pulley.getAttribute('aria-invalid')).toBe('true');
    expect(puts).toHaveLength(0);
  });

  it("puts the server's field errors at their cells", async () => {
    fakeEngine();
    server.use(http.put('*/api/engines/41', () => apiError(400, 'validation_failed', 'components[3].bearing.designation: bearing "X1" is not in the shop\'s bearing table', [
      { path: 'components[3].name', message: 'name is reserved on the server' },
    ])));
    renderApp('/drive-library/41', { user: makeUser({ role: 'lead' }) });
    await screen.findByLabelText('Name of row 2', {}, { timeout: 5000 });
    const user = userEvent.setup();
    await user.type(within(rowOf('Power steering pump')).getByLabelText('Name of row 4'), ' 2');
    await user.click(screen.getByRole('button', { name: 'Save engine' }));
    expect(await within(rowOf('Power steering pump 2')).findByText('name is reserved on the server')).toBeTruthy();
    expect(screen.getByRole('alert').textContent).toMatch(/not in the shop's bearing table/);
  });

  it('adds and removes rows inline', async () => {
    const puts = fakeEngine();
    renderApp('/drive-library/41', { user: makeUser({ role: 'lead' }) });
    await screen.findByLabelText('Name of row 2', {}, { timeout: 5000 });
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Remove Tensioner' }));
    await user.click(screen.getByRole('button', { name: 'Add component' }));
    const name = screen.getByLabelText(`Name of row ${DEMO_I4.components.length}`);
    await user.type(name, 'Fan');
    await user.selectOptions(screen.getByLabelText(`Kind of row ${DEMO_I4.components.length}`), 'fan');
    await user.type(screen.getByLabelText(`Pulley mm of row ${DEMO_I4.components.length}`), '120');
    await user.click(screen.getByRole('button', { name: 'Save engine' }));
    await waitFor(() => expect(puts).toHaveLength(1));
    const names = (puts[0] as DriveDocument).components.map((c) => c.name);
    expect(names).not.toContain('Tensioner');
    expect((puts[0] as DriveDocument).components.at(-1)).toEqual({ name: 'Fan', kind: 'fan', belt: 'Main', pulleyMm: 120 });
  });

  it('is read-only for a technician: values shown, no inputs, no save', async () => {
    fakeEngine();
    renderApp('/drive-library/41', { user: makeUser({ role: 'tech' }) });
    expect(await screen.findByText('read only', {}, { timeout: 5000 })).toBeTruthy();
    expect(screen.queryByLabelText('Pulley mm of row 2')).toBeNull();
    expect(screen.queryByRole('button', { name: 'Save engine' })).toBeNull();
    expect(screen.queryByRole('button', { name: 'Delete' })).toBeNull();
    expect(screen.getByRole('link', { name: 'Export JSON' }).getAttribute('href')).toBe('/api/engines/41/export.json');
    expect(screen.getAllByText('Alternator').length).toBeGreaterThan(0);
  });
});
