// Ratio calibration of an engine's parts (issue 20 item 3): read by everyone, accepted by leads.
import { LEAD_AND_ADMIN } from '../../shared/auth/access';
import { ROLES } from '../../shared/auth/roles';
import { CalibrationDecisionSchema } from '../../shared/schemas/calibration';
import { validate } from '../middleware/validate';
import type { Engine } from '../models/engine';
import { decideCalibration, engineCalibration } from '../services/ratio-calibration';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Engine;

/** Rows of the route access table for /api/engines/:id/calibration. */
export const calibrationRoutes: RouteRow[] = [
  {
    method: 'get', path: '/engines/:id/calibration', roles: ROLES, ownedParam: 'id', resource: 'engine',
    summary: "the engine's measured ratio corrections and the accepted ones",
    handlers: [async (req, res) => void res.json(await engineCalibration(req.user!.shopId, owned(res).id))],
  },
  {
    method: 'put', path: '/engines/:id/calibration', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'engine',
    summary: "accept or withdraw a part's ratio correction",
    handlers: [validate({ body: CalibrationDecisionSchema }), async (req, res) =>
      void res.json(await decideCalibration(req.user!, owned(res).id, req.body.component, req.body.accept))],
  },
];
