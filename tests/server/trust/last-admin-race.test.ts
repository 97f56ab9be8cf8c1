// Issue 19 item 1: two admins demoting or deactivating each other at the same moment must leave the
// shop with an admin. Before the shop-row lock both PATCHes counted two admins in their own
// snapshot and both succeeded. Each round fires both requests together (no timing assumed) and
// checks the outcome: exactly one succeeds, the other is refused, one active admin remains.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { User } from '../../../server/models';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, createUser, type TestShop, type TestUser } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let second: TestUser;
let a: ApiAgent;
let b: ApiAgent;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  second = await createUser(shop.shop, 'admin');
  a = await t.signIn(shop.users.admin.email, shop.users.admin.password);
  b = await t.signIn(second.email, second.password);
});
afterAll(async () => t.close());

async function activeAdmins(): Promise<number> {
  return User.count({ where: { shopId: shop.shop.id, role: 'admin', active: true } });
}

async function restoreBoth(): Promise<void> {
  await User.update({ role: 'admin', active: true }, { where: { id: { [Op.in]: [shop.users.admin.user.id, second.user.id] } } });
}

const ROUNDS = 4;

describe('the last admin under concurrent changes', () => {
  it.each([
    ['demote each other', { role: 'tech' }, { role: 'lead' }],
    ['deactivate each other', { active: false }, { active: false }],
    ['one demotes, the other deactivates', { role: 'specialist' }, { active: false }],
  ] as const)('two admins who %s at once leave exactly one active admin', async (_label, bodyForB, bodyForA) => {
    for (let round = 0; round < ROUNDS; round += 1) {
      await restoreBoth();
      // Deactivation ends sessions: sign both in again each round.
      a = await t.signIn(shop.users.admin.email, shop.users.admin.password);
      b = await t.signIn(second.email, second.password);
      const [ra, rb] = await Promise.all([a.patch(`/api/users/${second.user.id}`, bodyForB), b.patch(`/api/users/${shop.users.admin.user.id}`, bodyForA)]);
      const statuses = [ra.status, rb.status].sort();
      expect(statuses.filter((s) => s === 200), `round ${round}: ${JSON.stringify([ra.body, rb.body])}`).toHaveLength(1);
      // The loser sees either the count (409 last_admin) or that it was itself demoted first (403).
      const loser = ra.status === 200 ? rb : ra;
      expect([403, 409], JSON.stringify(loser.body)).toContain(loser.status);
      expect(['last_admin', 'forbidden', 'unauthenticated']).toContain(loser.body.error.code);
      expect(await activeAdmins(), `round ${round}`).toBe(1);
    }
    await restoreBoth();
  });

  it('a third admin still lets one of two parallel demotions of different admins through, never both of the last two', async () => {
    const third = await createUser(shop.shop, 'admin');
    await restoreBoth();
    a = await t.signIn(shop.users.admin.email, shop.users.admin.password);
    b = await t.signIn(second.email, second.password);
    // A demotes the third admin while B demotes A: with three admins both may succeed, leaving B.
    const [r1, r2] = await Promise.all([a.patch(`/api/users/${third.user.id}`, { role: 'tech' }), b.patch(`/api/users/${shop.users.admin.user.id}`, { role: 'tech' })]);
    expect(r1.status === 200 || r2.status === 200).toBe(true);
    expect(await activeAdmins()).toBeGreaterThanOrEqual(1);
    await User.update({ role: 'tech' }, { where: { id: third.user.id } });
    await restoreBoth();
  });
});
