// Order tracks of a swept capture (issue 20 item 5).
import { ROLES } from '../../shared/auth/roles';
import type { Analysis } from '../models/analysis';
import { orderTracksFor } from '../services/order-tracks';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Analysis;

/** Rows of the route access table for /api/analyses/:id/order-tracks. */
export const orderTrackRoutes: RouteRow[] = [
  {
    method: 'get', path: '/analyses/:id/order-tracks', roles: ROLES, ownedParam: 'id', resource: 'analysis',
    summary: "each suspect's line amplitude against rpm over a speed sweep, and where it peaks",
    handlers: [async (_req, res) => void res.json(await orderTracksFor(owned(res)))],
  },
];
