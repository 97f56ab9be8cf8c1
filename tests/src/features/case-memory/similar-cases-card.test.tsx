import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { MemoryRouter } from 'react-router-dom';
import { describe, expect, it } from 'vitest';
import type { SimilarCasesDto } from '../../../../shared/schemas/calibration';
import { SimilarCasesCard } from '../../../../src/features/case-memory/components/similar-cases-card';
import { createQueryClient } from '../../../../src/lib/query-client';
import { server } from '../../helpers/msw-server';

function show(dto: SimilarCasesDto) {
  server.use(http.get('*/api/cases/12/similar', () => HttpResponse.json(dto)));
  render(
    <QueryClientProvider client={createQueryClient({ retry: 0 })}>
      <MemoryRouter><SimilarCasesCard caseId={12} caseHref={(id) => `/cases/${id}`} /></MemoryRouter>
    </QueryClientProvider>,
  );
}

describe('Similar cases card', () => {
  it('lists the confirmed cases with their cause, likeness and a link, same engine first as the API orders them', async () => {
    show({ items: [
      { caseId: 3, roNumber: 'RO-20458', vehicleLabel: '2019 Nordfahrt Kestrel', engine: { id: 1, name: 'Demo 1.6 I4 petrol' }, sameEngine: true, distance: 0.22, confirmed: { component: 'Alternator', fault: 'outer_race' }, cause: 'rear bearing outer race spalled' },
      { caseId: 9, roNumber: 'RO-20990', vehicleLabel: '2015 Velmora Tessa', engine: { id: 2, name: 'Demo 3.0 V6 petrol' }, sameEngine: false, distance: 0.15, confirmed: { component: 'Alternator', fault: 'outer_race' }, cause: 'bearing' },
    ] });
    const list = await screen.findByRole('list', { name: 'Similar confirmed cases' });
    const items = within(list).getAllByRole('listitem');
    expect(within(items[0]).getByRole('link', { name: 'RO-20458' }).getAttribute('href')).toBe('/cases/3');
    expect(within(items[0]).getByText('78 % alike')).toBeTruthy();
    expect(within(items[0]).getByText('same engine')).toBeTruthy();
    expect(within(items[0]).getByText(/Confirmed: Alternator, outer race — rear bearing outer race spalled/)).toBeTruthy();
    expect(within(items[1]).getByText('other engine')).toBeTruthy();
  });

  it('says so when no confirmed case looks alike', async () => {
    show({ items: [] });
    expect(await screen.findByText('No confirmed case of this shop looks alike yet.')).toBeTruthy();
  });
});
