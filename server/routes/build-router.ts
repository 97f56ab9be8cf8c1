// Builds the /api router from the route access table: each row gets its access check, its
// ownership check (when it names a shop-owned id) and then its own handlers.
import { Router, type RequestHandler } from 'express';
import { z } from 'zod';
import { AppError, notFound } from '../errors';
import { requireAccess } from '../middleware/require-access';
import { ownedResources } from './owned-resources';
import type { RouteRow } from './route-row';

const IdSchema = z.coerce.number().int().positive().max(2_147_483_647);

/** Loads the row's shop-owned record into res.locals.owned, or 404s (another shop's id looks missing). */
function loadOwned(row: RouteRow & { ownedParam: string }): RequestHandler {
  const find = ownedResources[row.resource];
  return async (req, res, next) => {
    const parsed = IdSchema.safeParse(req.params[row.ownedParam]);
    if (!parsed.success) {
      next(new AppError(400, 'validation_failed', `params.${row.ownedParam}: expected a positive whole number`));
      return;
    }
    const record = await find(req.user!.shopId, parsed.data);
    if (!record) {
      next(notFound());
      return;
    }
    res.locals.owned = record;
    next();
  };
}

/** An Express router with one route per row. */
export function buildRouter(rows: readonly RouteRow[]): Router {
  const router = Router();
  for (const row of rows) {
    const chain: RequestHandler[] = [requireAccess(row.roles)];
    if (row.ownedParam !== undefined) {
      if (row.roles === 'public') throw new Error(`Route ${row.method} ${row.path}: a public row cannot name a shop-owned id`);
      chain.push(loadOwned(row));
    }
    router[row.method](row.path, ...chain, ...row.handlers);
  }
  return router;
}
