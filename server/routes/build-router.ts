// Builds the /api router from the route access table: each row gets its access check, its
// ownership check (when it names a shop-owned id) and then its own handlers.
import { Router, type RequestHandler } from 'express';
import { notFound } from '../errors';
import { requireAccess } from '../middleware/require-access';
import { ownedResources } from './owned-resources';
import type { RouteRow } from './route-row';

/** A canonical positive id as it appears in a path: no sign, no leading zero, no spaces, no 0x, no exponent. */
const CANONICAL_ID = /^[1-9][0-9]{0,9}$/;

/**
 * The record id a path segment names, or null when it is not a canonical positive integer that fits
 * an INT column. `0x1`, `1e0`, `+1`, ` 1`, `01` name no record (Number() would read them all as 1).
 */
export function parseRecordId(segment: unknown): number | null {
  if (typeof segment !== 'string' || !CANONICAL_ID.test(segment)) return null;
  const id = Number(segment);
  return id <= 2_147_483_647 ? id : null;
}

/** Loads the row's shop-owned record into res.locals.owned, or 404s (another shop's id looks missing). */
function loadOwned(row: RouteRow & { ownedParam: string }): RequestHandler {
  const find = ownedResources[row.resource];
  return async (req, res, next) => {
    // Anything but a canonical id answers like an unknown id: it names no record.
    const id = parseRecordId(req.params[row.ownedParam]);
    const record = id === null ? null : await find(req.user!.shopId, id);
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
