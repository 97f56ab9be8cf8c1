// Suspects: dismiss or restore with a note (specialists, leads, admins).
import { FindingDecisionSchema } from '../../shared/schemas/cases';
import { validate } from '../middleware/validate';
import type { Finding } from '../models/finding';
import { User } from '../models/user';
import { presentFinding } from '../presenters/present-case';
import { decideFinding } from '../services/case-status';
import { actorOf, SPECIALIST_UP } from './cases';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as Finding;

/** Rows of the route access table for /api/findings. */
export const findingRoutes: RouteRow[] = (['dismiss', 'restore'] as const).map((verb): RouteRow => ({
  method: 'post', path: `/findings/:id/${verb}`, roles: SPECIALIST_UP, ownedParam: 'id', resource: 'finding',
  summary: `${verb} a suspect with a note`,
  handlers: [validate({ body: FindingDecisionSchema }), async (req, res) => {
    const f = await decideFinding(actorOf(req), owned(res).id, verb === 'dismiss' ? 'dismissed' : 'suggested', req.body.note);
    const by = f.decidedById ? await User.findByPk(f.decidedById) : null;
    res.json({ finding: presentFinding(f, by) });
  }],
}));
