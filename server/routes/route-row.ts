// The shape of one row of the route access table (route-table.ts).
import type { RequestHandler } from 'express';
import type { RouteAccess } from '../../shared/auth/access';
import type { OwnedResource } from './owned-resources';

/** HTTP methods the API uses. */
export type RouteMethod = 'get' | 'post' | 'patch' | 'put' | 'delete';

/**
 * One API route, declared once. The router is built from these rows (build-router.ts):
 * `roles` becomes the 401/403 check; `ownedParam` + `resource` make the router load the record
 * named by that path parameter within the signed-in user's shop (404 otherwise) into
 * res.locals.owned before `handlers` run. tests/server/routes/route-table.test.ts walks every row.
 */
export type RouteRow = {
  method: RouteMethod;
  /** Path under /api, Express syntax (`/users/:id`). */
  path: string;
  roles: RouteAccess;
  /** validate → service → presenter; run after the access and ownership checks. */
  handlers: RequestHandler[];
  /** A one-line description (docs and test names). */
  summary: string;
} & ({ ownedParam?: undefined; resource?: undefined } | { ownedParam: string; resource: OwnedResource });
