// The shop's bearing table. Reads for every role; writes for lead and admin.
import { LEAD_AND_ADMIN } from '../../shared/auth/access';
import { ROLES } from '../../shared/auth/roles';
import { normaliseDesignation } from '../../shared/drive/bearing-table';
import { BearingTypeInputSchema, type BearingTypeInput } from '../../shared/schemas/bearings';
import { validate } from '../middleware/validate';
import type { BearingType } from '../models/bearing-type';
import { presentBearing } from '../presenters/present-bearing';
import { bearingUsage, createBearing, deleteBearing, listBearings, updateBearing } from '../services/bearings';
import type { RouteRow } from './route-row';

const owned = (res: { locals: Record<string, unknown> }) => res.locals.owned as BearingType;

async function present(shopId: number, row: BearingType) {
  const usage = await bearingUsage(shopId);
  return { bearing: presentBearing(row, usage.get(normaliseDesignation(row.designation)) ?? 0) };
}

/** Rows of the route access table for /api/bearings. */
export const bearingRoutes: RouteRow[] = [
  {
    method: 'get', path: '/bearings', roles: ROLES, summary: "the shop's bearing table",
    handlers: [
      async (req, res) => {
        const { rows, usage } = await listBearings(req.user!.shopId);
        res.json({ items: rows.map((r) => presentBearing(r, usage.get(r.designationKey) ?? 0)) });
      },
    ],
  },
  {
    method: 'get', path: '/bearings/:id', roles: ROLES, ownedParam: 'id', resource: 'bearing', summary: 'one bearing type',
    handlers: [async (req, res) => void res.json(await present(req.user!.shopId, owned(res)))],
  },
  {
    method: 'post', path: '/bearings', roles: LEAD_AND_ADMIN, summary: 'add a bearing type',
    handlers: [
      validate({ body: BearingTypeInputSchema }),
      async (req, res) => void res.status(201).json(await present(req.user!.shopId, await createBearing(req.user!.shopId, req.body as BearingTypeInput))),
    ],
  },
  {
    method: 'put', path: '/bearings/:id', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'bearing', summary: 'edit a bearing type',
    handlers: [
      validate({ body: BearingTypeInputSchema }),
      async (req, res) => void res.json(await present(req.user!.shopId, await updateBearing(req.user!.shopId, owned(res).id, req.body as BearingTypeInput))),
    ],
  },
  {
    method: 'delete', path: '/bearings/:id', roles: LEAD_AND_ADMIN, ownedParam: 'id', resource: 'bearing', summary: 'delete a bearing type no part names',
    handlers: [async (req, res) => { await deleteBearing(req.user!.shopId, owned(res).id); res.status(204).end(); }],
  },
];
