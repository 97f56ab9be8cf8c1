import type { Role } from './roles';

/**
 * Who may call a route: anyone (`public`), any signed-in user of any role (`signed-in`), or only
 * the listed roles. The server's route access table uses this type for each row, and the client
 * may use it to hide actions a role cannot perform.
 */
export type RouteAccess = 'public' | 'signed-in' | readonly Role[];

/**
 * Whether a visitor with the given role (or `null` when signed out) may call a route with `access`.
 * @param access the row's access rule
 * @param role the caller's role, or null for a signed-out visitor
 */
export function isAllowed(access: RouteAccess, role: Role | null): boolean {
  if (access === 'public') return true;
  if (role === null) return false;
  if (access === 'signed-in') return true;
  return access.includes(role);
}

/** Roles that manage the shop (users, invites, outbox, shop settings). */
export const ADMIN_ONLY: readonly Role[] = ['admin'];
/** Roles that may change a shop's drive library and sign cases off. */
export const LEAD_AND_ADMIN: readonly Role[] = ['lead', 'admin'];
