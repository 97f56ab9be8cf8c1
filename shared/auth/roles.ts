import { z } from 'zod';

/**
 * The four roles of a shop's users (docs/design.md "Who uses it"), least to most privileged.
 * A role grants only what the route access table (server/routes/route-table.ts) lists for it;
 * the order here is used for display and for "at least" checks, never as a substitute for the table.
 */
export const ROLES = ['tech', 'specialist', 'lead', 'admin'] as const;

/** Validates a role name; the client's forms and the server's validate() share it. */
export const RoleSchema = z.enum(ROLES);
/** One of `tech`, `specialist`, `lead`, `admin`. */
export type Role = z.infer<typeof RoleSchema>;

/** Human labels for each role, as the Team screen and the navigation show them. */
export const ROLE_LABELS: Record<Role, string> = {
  tech: 'Technician',
  specialist: 'Diagnostic specialist',
  lead: 'Lead technician',
  admin: 'Admin',
};

/**
 * The client's top-level navigation sections. The client maps each to a path; which roles may
 * open a section is decided here so that the navigation and the server's access table agree.
 */
export const NAV_SECTIONS = [
  'cases',
  'drive-library',
  'bearings',
  'capture-planner',
  'team',
  'outbox',
  'shop-setup',
] as const;

/** One navigation section key. */
export type NavSection = (typeof NAV_SECTIONS)[number];

/** Labels for the navigation sections (Crankwise's own screen names, docs/design.md "Screens"). */
export const NAV_LABELS: Record<NavSection, string> = {
  cases: 'Cases',
  'drive-library': 'Drive library',
  bearings: 'Bearings',
  'capture-planner': 'Capture planner',
  team: 'Team',
  outbox: 'Outbox',
  'shop-setup': 'Shop setup',
};

/** Which roles may use each navigation section: work sections for everyone, shop administration for admins. */
export const NAV_ACCESS: Record<NavSection, readonly Role[]> = {
  cases: ROLES,
  'drive-library': ROLES,
  bearings: ROLES,
  'capture-planner': ROLES,
  team: ['admin'],
  outbox: ['admin'],
  'shop-setup': ['admin'],
};

/**
 * The navigation sections a role may use, in display order.
 * @param role the signed-in user's role
 */
export function navSectionsFor(role: Role): NavSection[] {
  return NAV_SECTIONS.filter((section) => NAV_ACCESS[section].includes(role));
}

/**
 * Whether a role may use a navigation section.
 * @param role the signed-in user's role
 * @param section the section key
 */
export function canUseSection(role: Role, section: NavSection): boolean {
  return NAV_ACCESS[section].includes(role);
}
