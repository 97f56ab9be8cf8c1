// Middleware derived from a route-table row's `roles`: 401 when signed out, 403 when the role may not.
import type { RequestHandler } from 'express';
import { isAllowed, type RouteAccess } from '../../shared/auth/access';
import { forbidden, unauthenticated } from '../errors';

/** Enforces a row's access rule. Public rows pass everyone. */
export function requireAccess(access: RouteAccess): RequestHandler {
  return (req, _res, next) => {
    if (access === 'public') return next();
    if (!req.user) return next(unauthenticated());
    if (!isAllowed(access, req.user.role)) return next(forbidden());
    next();
  };
}
