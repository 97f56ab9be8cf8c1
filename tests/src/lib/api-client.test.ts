import { http, HttpResponse } from 'msw';
import { describe, expect, it } from 'vitest';
import { api, ApiError } from '../../../src/lib/api-client';
import { apiError, server } from '../helpers/msw-server';

describe('api client', () => {
  it('fetches the CSRF token once and sends it on state-changing requests only', async () => {
    let csrfFetches = 0;
    const seen: Array<[string, string | null]> = [];
    server.use(
      http.get('*/api/csrf', () => {
        csrfFetches += 1;
        return HttpResponse.json({ token: `token-${csrfFetches}` });
      }),
      http.get('*/api/things', ({ request }) => {
        seen.push(['GET', request.headers.get('x-csrf-token')]);
        return HttpResponse.json({ items: [] });
      }),
      http.post('*/api/things', ({ request }) => {
        seen.push(['POST', request.headers.get('x-csrf-token')]);
        return HttpResponse.json({ ok: true }, { status: 201 });
      }),
    );
    await api.get('/api/things');
    await api.post('/api/things', { a: 1 });
    await api.post('/api/things', { a: 2 });
    expect(seen).toEqual([
      ['GET', null],
      ['POST', 'token-1'],
      ['POST', 'token-1'],
    ]);
    expect(csrfFetches).toBe(1);
  });

  it('fetches a new token and retries once after 403 csrf_invalid', async () => {
    let csrfFetches = 0;
    const tokensTried: Array<string | null> = [];
    server.use(
      http.get('*/api/csrf', () => {
        csrfFetches += 1;
        return HttpResponse.json({ token: `token-${csrfFetches}` });
      }),
      http.patch('*/api/users/5', ({ request }) => {
        const token = request.headers.get('x-csrf-token');
        tokensTried.push(token);
        return token === 'token-2' ? HttpResponse.json({ user: { id: 5 } }) : apiError(403, 'csrf_invalid', 'The form expired.');
      }),
    );
    await expect(api.patch('/api/users/5', { role: 'lead' })).resolves.toEqual({ user: { id: 5 } });
    expect(tokensTried).toEqual(['token-1', 'token-2']);
  });

  it('gives up after one retry when the token is still refused', async () => {
    let attempts = 0;
    server.use(
      http.delete('*/api/invites/3', () => {
        attempts += 1;
        return apiError(403, 'csrf_invalid', 'The form expired.');
      }),
    );
    await expect(api.delete('/api/invites/3')).rejects.toMatchObject({ status: 403, code: 'csrf_invalid' });
    expect(attempts).toBe(2);
  });

  it('throws ApiError with status, code, message and field details from the error body', async () => {
    server.use(
      http.post('*/api/setup', () =>
        apiError(400, 'validation_failed', 'Check the highlighted fields.', [
          { path: ['adminEmail'], message: 'Enter a valid e-mail address' },
          { path: ['password'], message: 'Use at least 10 characters' },
        ]),
      ),
    );
    const error = await api.post('/api/setup', {}).catch((e: unknown) => e);
    expect(error).toBeInstanceOf(ApiError);
    const apiErr = error as ApiError;
    expect([apiErr.status, apiErr.code, apiErr.message]).toEqual([400, 'validation_failed', 'Check the highlighted fields.']);
    expect(apiErr.fieldErrors()).toEqual({ adminEmail: 'Enter a valid e-mail address', password: 'Use at least 10 characters' });
  });

  it('reads zod-flatten style details as well', () => {
    const error = new ApiError(400, 'validation_failed', 'Bad input', { fieldErrors: { email: ['Enter a valid e-mail address'] } });
    expect(error.fieldErrors()).toEqual({ email: 'Enter a valid e-mail address' });
  });

  it('turns a non-JSON failure into an ApiError with a readable message', async () => {
    server.use(http.get('*/api/health', () => new HttpResponse('<html>Bad gateway</html>', { status: 502, statusText: 'Bad Gateway' })));
    await expect(api.get('/api/health')).rejects.toMatchObject({ status: 502, code: 'http_502', message: 'The server answered 502 Bad Gateway.' });
  });

  it('reports a server that does not answer as a network error', async () => {
    server.use(http.get('*/api/health', () => HttpResponse.error()));
    await expect(api.get('/api/health')).rejects.toMatchObject({ status: 0, code: 'network_error' });
  });
});
