// The first-run set-up is open only while no shop but the demo exists, so this file starts by
// removing the other shops (test files run one after another in the server project).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Op } from 'sequelize';
import { Shop, User } from '../../../server/models';
import { removeDemoShop, seedDemoShop, DEMO_USERS } from '../../../server/services/demo-shop';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { uniq } from '../../helpers/factories';

let t: TestApp;

beforeAll(async () => {
  t = await createTestApp();
  await Shop.destroy({ where: { isDemo: false } });
  await seedDemoShop(t.sequelize, 4);
});
afterAll(async () => t.close());

describe('first-run set-up', () => {
  it('is offered while only the demo shop exists, creates the shop and signs its admin in, then closes', async () => {
    const visitor = await t.agent();
    expect((await visitor.get('/api/setup/status')).body).toEqual({ needsSetup: true });

    const adminEmail = `first.admin.${uniq()}@example.test`;
    const res = await visitor.post('/api/setup', {
      shopName: 'Quarry Road Garage',
      adminName: 'Mira Holt',
      adminEmail,
      password: 'first-admin-password',
    });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email: adminEmail, role: 'admin', shop: { name: 'Quarry Road Garage', isDemo: false } });
    await visitor.refreshCsrf();
    expect((await visitor.get('/api/auth/me')).body.user.email).toBe(adminEmail);
    // The new admin sees only their own shop.
    const users = await visitor.get('/api/users');
    expect(users.body.items.map((u: { email: string }) => u.email)).toEqual([adminEmail]);

    expect((await visitor.get('/api/setup/status')).body).toEqual({ needsSetup: false });
    const again = await (await t.agent()).post('/api/setup', {
      shopName: 'Second Try',
      adminName: 'Someone',
      adminEmail: `second.${uniq()}@example.test`,
      password: 'second-admin-password',
    });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('setup_done');
    expect(await Shop.count({ where: { name: 'Second Try' } })).toBe(0);
  });

  it('names the bad field and writes nothing', async () => {
    const before = await Shop.count();
    const res = await (await t.agent()).post('/api/setup', { shopName: 'X', adminName: 'Ok Name', adminEmail: 'nope', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.message).toMatch(/^(shopName|adminEmail|password)/);
    const paths = res.body.error.details.map((d: { path: string }) => d.path).sort();
    expect(paths).toEqual(['adminEmail', 'password', 'shopName']);
    expect(await Shop.count()).toBe(before);
  });
});

describe('demo shop', () => {
  it('is seeded once with one user per role and removed by DEMO=off without touching other shops', async () => {
    expect(await seedDemoShop(t.sequelize, 4)).toBe(false);
    const demo = await Shop.findOne({ where: { isDemo: true } });
    const demoUsers = await User.findAll({ where: { shopId: demo!.id } });
    expect(demoUsers.map((u) => u.role).sort()).toEqual(['admin', 'lead', 'specialist', 'tech']);
    const signIn = await (await t.agent()).post('/api/auth/sign-in', { email: DEMO_USERS[0]!.email, password: DEMO_USERS[0]!.password });
    expect(signIn.status).toBe(200);
    expect(signIn.body.user.shop.isDemo).toBe(true);

    const others = await Shop.count({ where: { isDemo: false } });
    expect(others).toBeGreaterThan(0);
    expect(await removeDemoShop()).toBe(1);
    expect(await Shop.count({ where: { isDemo: true } })).toBe(0);
    expect(await User.count({ where: { email: { [Op.like]: '%@demo.crankwise.test' } } })).toBe(0);
    expect(await Shop.count({ where: { isDemo: false } })).toBe(others);
  });
});
