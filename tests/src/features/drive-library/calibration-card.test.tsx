import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import type { CalibrationDecision, CalibrationDto } from '../../../../shared/schemas/calibration';
import { DEMO_I4 } from '../../../../server/db/seeders/demo-engines';
import { makeUser } from '../../helpers/factories';
import { server } from '../../helpers/msw-server';
import { renderApp } from '../../helpers/render-app';
import { BEARINGS, SETTINGS, engineDto } from './fixtures';

const measured = (correctionPct: number, offered: boolean, name: string) => ({
  correctionPct, scatterPct: 0.4, standardErrorPct: 0.2, captures: offered ? 4 : 2, cases: offered ? 4 : 2, offered,
  sentence: offered ? `measured on 4 cases: ${name} turns ${Math.abs(correctionPct).toFixed(1)} % ${correctionPct < 0 ? 'slower' : 'faster'} than its nominal ratio ± 0.4 %` : `${name}: 2 captures on 2 cases so far; a correction is offered from 4 captures on 2 cases`,
});

function fake(initial: CalibrationDto) {
  let current = initial;
  const puts: CalibrationDecision[] = [];
  server.use(
    http.get('*/api/engines/41', () => HttpResponse.json({ engine: engineDto(DEMO_I4) })),
    http.get('*/api/bearings', () => HttpResponse.json({ items: BEARINGS })),
    http.get('*/api/shop/settings', () => HttpResponse.json({ settings: SETTINGS })),
    http.get('*/api/engines/41/history', () => HttpResponse.json({ items: [] })),
    http.get('*/api/engines/41/calibration', () => HttpResponse.json(current)),
    http.put('*/api/engines/41/calibration', async ({ request }) => {
      const body = (await request.json()) as CalibrationDecision;
      puts.push(body);
      current = { ...current, parts: current.parts.map((p) => (p.component === body.component ? { ...p, accepted: body.accept ? { correctionPct: p.measured!.correctionPct, scatterPct: 0.4, captures: 4, cases: 4, acceptedAt: '2026-12-03T09:00:00Z' } : null } : p)) };
      return HttpResponse.json(current);
    }),
  );
  return puts;
}

const DTO: CalibrationDto = {
  engineId: 41, minCaptures: 4,
  parts: [
    { component: 'Alternator', measured: measured(-1.6, true, 'Alternator'), accepted: null },
    { component: 'Upper idler', measured: measured(-1.2, false, 'Upper idler'), accepted: null },
  ],
};

describe('Calibration card on the engine page', { timeout: 30_000 }, () => {
  it('shows each part\'s sentence and lets a lead accept an offered correction', async () => {
    const puts = fake(DTO);
    renderApp('/drive-library/41', { user: makeUser({ role: 'lead' }) });
    const list = await screen.findByRole('list', { name: 'Ratio corrections' }, { timeout: 15_000 });
    expect(within(list).getByText('measured on 4 cases: Alternator turns 1.6 % slower than its nominal ratio ± 0.4 %')).toBeTruthy();
    // Not enough captures: the button is there but disabled.
    expect((within(list).getByRole('button', { name: 'Accept −1.2 %' }) as HTMLButtonElement).disabled).toBe(true);
    await userEvent.setup().click(within(list).getByRole('button', { name: 'Accept −1.6 %' }));
    await waitFor(() => expect(puts).toEqual([{ component: 'Alternator', accept: true }]));
    expect(await within(list).findByText('in use: −1.6 % ± 0.4 %')).toBeTruthy();
    expect(within(list).getByRole('button', { name: 'Withdraw' })).toBeTruthy();
  });

  it('is read-only for a technician', async () => {
    fake(DTO);
    renderApp('/drive-library/41', { user: makeUser({ role: 'tech' }) });
    const list = await screen.findByRole('list', { name: 'Ratio corrections' }, { timeout: 15_000 });
    expect(within(list).queryByRole('button')).toBeNull();
  });

  it('says what is needed when nothing was measured yet', async () => {
    fake({ engineId: 41, minCaptures: 4, parts: [] });
    renderApp('/drive-library/41', { user: makeUser({ role: 'lead' }) });
    expect(await screen.findByText(/Corrections appear once 4 captures on two cases/, {}, { timeout: 15_000 })).toBeTruthy();
  });
});
