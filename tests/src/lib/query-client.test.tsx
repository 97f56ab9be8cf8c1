import { QueryObserver } from '@tanstack/react-query';
import { act, render, screen } from '@testing-library/react';
import { http, HttpResponse } from 'msw';
import { describe, expect, it, vi } from 'vitest';
import { Toaster } from '../../../src/components/ui/toast';
import { api } from '../../../src/lib/api-client';
import { createQueryClient } from '../../../src/lib/query-client';
import { apiError, server } from '../helpers/msw-server';

async function runQuery(client: ReturnType<typeof createQueryClient>, key: string, meta?: { quiet?: boolean }) {
  const observer = new QueryObserver(client, { queryKey: [key], queryFn: () => api.get(`/api/${key}`), meta });
  const unsubscribe = observer.subscribe(() => {});
  await act(async () => {
    await observer.refetch();
  });
  unsubscribe();
}

describe('query client', () => {
  it('sends a lost session to sign-in without an error toast', async () => {
    server.use(http.get('*/api/things', () => apiError(401, 'unauthenticated', 'Sign in to continue')));
    const onUnauthenticated = vi.fn();
    render(<Toaster />);
    await runQuery(createQueryClient({ retry: 0, onUnauthenticated }), 'things');
    expect(onUnauthenticated).toHaveBeenCalledTimes(1);
    expect(screen.queryByRole('status')).toBeNull();
  });

  it('shows a toast with the server message for any other failure', async () => {
    server.use(http.get('*/api/things', () => apiError(500, 'internal_error', 'Something broke on the server; try again')));
    const onUnauthenticated = vi.fn();
    render(<Toaster />);
    await runQuery(createQueryClient({ retry: 0, onUnauthenticated }), 'things');
    expect((await screen.findByRole('status')).textContent).toContain('Something broke on the server; try again');
    expect(onUnauthenticated).not.toHaveBeenCalled();
  });

  it('stays quiet for queries that handle their own errors', async () => {
    server.use(http.get('*/api/things', () => HttpResponse.json({ error: { code: 'not_found', message: 'Gone' } }, { status: 404 })));
    render(<Toaster />);
    await runQuery(createQueryClient({ retry: 0 }), 'things', { quiet: true });
    expect(screen.queryByRole('status')).toBeNull();
  });
});
