import { QueryClientProvider } from '@tanstack/react-query';
import { render, screen, within } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import type { OrderTracksDto } from '../../../../shared/schemas/order-tracks';
import { OrderTracksCard } from '../../../../src/features/order-tracks/components/order-tracks-chart';
import { createQueryClient } from '../../../../src/lib/query-client';
import { apiError, server } from '../../helpers/msw-server';

function mount() {
  render(<QueryClientProvider client={createQueryClient({ retry: 0 })}><OrderTracksCard analysisId={5} /></QueryClientProvider>);
}

const DTO: OrderTracksDto = {
  rpmRange: [820, 2980],
  tracks: [
    { label: 'firing order 2', order: 2, rpm: [850, 1250, 1650, 2050, 2450, 2850], amplitude: [0.3, 0.3, 0.31, 0.3, 0.9, 0.32], peak: { rpm: 2450, amplitude: 0.9, rangeRpm: [2400, 2500], prominenceDb: 9.5 }, sentence: 'firing order 2 peaks at 2450 rpm (2400–2500 rpm), 10 dB over its level elsewhere' },
    { label: 'Alternator shaft', order: 2.65, rpm: [850, 1250, 1650, 2050, 2450, 2850], amplitude: [0.1, 0.1, 0.3, 0.1, 0.1, 0.1], peak: null, sentence: 'Alternator shaft stays level over 820–2980 rpm' },
  ],
};

describe('Order tracks card', () => {
  it('draws one line per track with the peak span shaded and names where each peaks', async () => {
    server.use(http.get('*/api/analyses/5/order-tracks', () => HttpResponse.json(DTO)));
    mount();
    const svg = await screen.findByRole('img', { name: 'Order tracks against engine speed' });
    expect(svg.querySelectorAll('polyline')).toHaveLength(2);
    expect(svg.querySelectorAll('rect')).toHaveLength(1);
    const list = screen.getByRole('list', { name: 'Where each line peaks' });
    expect(within(list).getByText(/firing order 2 peaks at 2450 rpm \(2400–2500 rpm\)/)).toBeTruthy();
    expect(within(list).getByText(/Alternator shaft stays level/)).toBeTruthy();
  });

  it('explains what to record when the capture did not sweep', async () => {
    server.use(http.get('*/api/analyses/5/order-tracks', () => apiError(404, 'no_sweep', 'The speed of this capture did not sweep: record a slow run-up.')));
    mount();
    expect(await screen.findByText('The speed of this capture did not sweep: record a slow run-up.')).toBeTruthy();
    expect(screen.queryByRole('alert')).toBeNull();
  });
});
