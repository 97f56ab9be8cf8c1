import { http, HttpResponse } from 'msw';
import { setupServer } from 'msw/node';

/** The shop's settings with their defaults, as GET /api/shop/settings answers for a new shop. */
export const DEFAULT_SHOP_SETTINGS = {
  id: 1, isDemo: false, name: 'Test Garage', address: '', phone: '', defaultLeadId: null, serviceAdvisorEmail: '',
  analysisDefaults: { envelopeBand: 'auto', envelopeMaxHz: 9000, samplesPerRev: 256, revsPerBlock: 32 },
  groovedOffsetMm: 2, backsideOffsetMm: 3, pulleyUnit: 'mm', leads: [],
};

/**
 * The fake network of the client tests; each test adds its handlers with `server.use(...)`. The
 * CSRF token, the shop's settings (read by several pages in the background), the Cases list and
 * an engine's calibration are always there.
 */
export const server = setupServer(
  http.get('*/api/csrf', () => HttpResponse.json({ token: 'csrf-test-token' })),
  http.get('*/api/shop/settings', () => HttpResponse.json({ settings: DEFAULT_SHOP_SETTINGS })),
  // The engine page's Calibration card (issue 20) asks for this; by default nothing is measured yet.
  // The Cases page is the landing page of every role; by default the shop has no cases.
  http.get('*/api/cases', ({ request }) => {
    const url = new URL(request.url);
    return HttpResponse.json({ items: [], total: 0, page: Number(url.searchParams.get('page') ?? 1), pageSize: Number(url.searchParams.get('pageSize') ?? 20) });
  }),
  http.get('*/api/engines/:id/calibration', ({ params }) => HttpResponse.json({ engineId: Number(params.id), minCaptures: 4, parts: [] })),
);

/** The API's error body, `{ error: { code, message, details? } }`. */
export function apiError(status: number, code: string, message: string, details?: unknown) {
  return HttpResponse.json({ error: { code, message, ...(details === undefined ? {} : { details }) } }, { status });
}
