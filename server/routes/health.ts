import { appContext } from '../context';
import type { RouteRow } from './route-row';

/** Liveness and the CSRF token. */
export const healthRoutes: RouteRow[] = [
  {
    method: 'get',
    path: '/health',
    roles: 'public',
    summary: 'the server is up',
    handlers: [(_req, res) => void res.json({ ok: true })],
  },
  {
    method: 'get',
    path: '/csrf',
    roles: 'public',
    summary: 'a CSRF token for the x-csrf-token header',
    handlers: [(req, res, next) => appContext(req).csrf.issue(req, res, next)],
  },
];
