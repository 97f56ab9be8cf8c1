import { http, HttpResponse } from 'msw';
import { setupServer } from 'msw/node';

/** The fake network of the client tests; each test adds its handlers with `server.use(...)`. */
export const server = setupServer(
  http.get('*/api/csrf', () => HttpResponse.json({ token: 'csrf-test-token' })),
  // The engine page's Calibration card (issue 20) asks for this; by default nothing is measured yet.
  http.get('*/api/engines/:id/calibration', ({ params }) => HttpResponse.json({ engineId: Number(params.id), minCaptures: 4, parts: [] })),
);

/** The API's error body, `{ error: { code, message, details? } }`. */
export function apiError(status: number, code: string, message: string, details?: unknown) {
  return HttpResponse.json({ error: { code, message, ...(details === undefined ? {} : { details }) } }, { status });
}
