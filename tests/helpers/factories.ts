// Factories: each test builds its own rows. E-mails carry a random suffix so files never collide.
import { randomBytes } from 'node:crypto';
import { ROLES, type Role } from '../../shared/auth/roles';
import { hashPassword } from '../../server/auth/passwords';
import { hashToken } from '../../server/auth/tokens';
import { Invite, MailMessage, Shop, User } from '../../server/models';
import type { OwnedResource } from '../../server/routes/owned-resources';
import { BearingType } from '../../server/models';
import { createEngine } from '../../server/services/engines';
import { DEMO_I4 } from '../../server/db/seeders/demo-engines';
import { createCaptureRow, createCaseRow, createFindingRow } from './case-factories';

/** A unique suffix for names and e-mails. */
export const uniq = () => randomBytes(4).toString('hex');

/** A user with the password it was created with. */
export interface TestUser {
  user: User;
  email: string;
  password: string;
}

/** A shop with one user per role. */
export interface TestShop {
  shop: Shop;
  users: Record<Role, TestUser>;
}

/** Creates a user in `shop` with `role` (bcrypt cost 4: tests only). */
export async function createUser(shop: Shop, role: Role, overrides: { active?: boolean; email?: string } = {}): Promise<TestUser> {
  const password = `pw-${uniq()}-${role}`;
  const email = overrides.email ?? `${role}.${uniq()}@shop${shop.id}.test`;
  const user = await User.create({
    shopId: shop.id,
    email,
    name: `${role} ${uniq()}`,
    role,
    passwordHash: await hashPassword(password, 4),
    active: overrides.active ?? true,
  });
  user.shop = shop;
  return { user, email, password };
}

/** Creates a shop (not the demo) and one user per role. */
export async function createTestShop(name = `Test Shop ${uniq()}`): Promise<TestShop> {
  const shop = await Shop.create({ name });
  const users = {} as Record<Role, TestUser>;
  for (const role of ROLES) users[role] = await createUser(shop, role);
  return { shop, users };
}

/** Creates a pending invite; returns it with its clear token. */
export async function createInviteRow(shop: Shop, role: Role = 'tech', opts: { expiresAt?: Date } = {}) {
  const token = randomBytes(32).toString('base64url');
  const invite = await Invite.create({
    shopId: shop.id,
    email: `invitee.${uniq()}@example.test`,
    role,
    tokenHash: hashToken(token),
    invitedById: null,
    expiresAt: opts.expiresAt ?? new Date(Date.now() + 3_600_000),
  });
  return { invite, token };
}

/** Stores a message as the mail fake would, for `shop`. */
export async function createMailRow(shop: Shop): Promise<MailMessage> {
  return MailMessage.create({
    shopId: shop.id,
    to: `someone.${uniq()}@example.test`,
    from: 'Crankwise <no-reply@crankwise.test>',
    subject: `Subject ${uniq()}`,
    text: 'Hello',
    html: null,
  });
}

/**
 * Creates one record of a route-table resource in `shop` and returns its id. The route-table walk
 * uses it to check that another shop's id answers 404; a new OwnedResource needs a case here.
 */
export const ownedFactories: Record<OwnedResource, (shop: Shop) => Promise<number>> = {
  user: async (shop) => (await createUser(shop, 'tech')).user.id,
  invite: async (shop) => (await createInviteRow(shop)).invite.id,
  mail: async (shop) => (await createMailRow(shop)).id,
  engine: async (shop) => (await createEngine(shop.id, { ...DEMO_I4, name: `Engine ${uniq()}` })).engine.id,
  bearing: async (shop) =>
    (await BearingType.create({ shopId: shop.id, designation: `T${uniq()}`, designationKey: `T${uniq()}`.toUpperCase(), balls: 8, ballMm: 6, pitchMm: 30, contactDeg: 0, source: 'measured', notes: '' })).id,
  case: async (shop) => (await createCaseRow(shop)).id,
  capture: async (shop) => (await createCaptureRow(shop, await createCaseRow(shop))).capture.id,
  analysis: async (shop) => (await createCaptureRow(shop, await createCaseRow(shop))).analysis.id,
  finding: async (shop) => (await createFindingRow(shop, await createCaseRow(shop))).id,
};
