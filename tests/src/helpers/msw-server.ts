import { http, HttpResponse } from 'msw';
import { setupServer } from 'msw/node';

/** The fake network of the client tests; each test adds its handlers with `server.use(...)`. */
export const server = setupServer(http.get('*/api/csrf', () => HttpResponse.json({ token: 'csrf-test-token' })));

/** The API's error body, `{ error: { code, message, details? } }`. */
export function apiError(status: number, code: string, message: string, details?: unknown) {
  return HttpResponse.json({ error: { code, message, ...(details === undefined ? {} : { details }) } }, { status });
}
