// Similar cases (issue 20 item 4): confirmed earlier cases whose order signatures are most alike.
import { ROLES } from '../../shared/auth/roles';
import type { Case } from '../models/case';
import { similarCasesFor } from '../services/similar-cases';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Case;

/** Rows of the route access table for /api/cases/:id/similar. */
export const similarCaseRoutes: RouteRow[] = [
  {
    method: 'get', path: '/cases/:id/similar', roles: ROLES, ownedParam: 'id', resource: 'case',
    summary: 'confirmed earlier cases with the most alike order signatures (same engine first, top three)',
    handlers: [async (req, res) => void res.json(await similarCasesFor(req.user!.shopId, owned(res).id))],
  },
];
