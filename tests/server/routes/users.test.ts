import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../../server/models';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let admin: ApiAgent;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
});
afterAll(async () => t.close());

describe('team management', () => {
  it("changes another user's role and name", async () => {
    const target = shop.users.tech.user;
    const res = await admin.patch(`/api/users/${target.id}`, { role: 'specialist', name: 'Renamed Person' });
    expect(res.status).toBe(200);
    expect(res.body.user).toMatchObject({ id: target.id, role: 'specialist', name: 'Renamed Person' });
    expect((await User.findByPk(target.id))!.role).toBe('specialist');
    await admin.patch(`/api/users/${target.id}`, { role: 'tech' });
  });

  it('does not let an admin demote or deactivate themselves', async () => {
    const self = shop.users.admin.user;
    for (const body of [{ role: 'lead' }, { active: false }]) {
      const res = await admin.patch(`/api/users/${self.id}`, body);
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('cannot_change_self');
    }
    expect((await User.findByPk(self.id))!).toMatchObject({ role: 'admin', active: true });
  });

  it('names the field in a 400 for a bad role, an empty name or an unknown field, and changes nothing', async () => {
    const target = shop.users.lead.user;
    const bad = [
      [{ role: 'owner' }, /^role/],
      [{ name: '   ' }, /^name/],
      [{ password: 'x' }, /password|Unrecognized/i],
      [{}, /at least one/],
    ] as const;
    for (const [body, pattern] of bad) {
      const res = await admin.patch(`/api/users/${target.id}`, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(res.body.error.code).toBe('validation_failed');
      expect(res.body.error.message).toMatch(pattern);
    }
    const fresh = await User.findByPk(target.id);
    expect(fresh).toMatchObject({ role: 'lead', name: target.name, active: true });
  });

  it('answers 404 (never 500) for an id that is not a number: it names no user', async () => {
    const res = await admin.patch('/api/users/abc', { name: 'X' });
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('API errors', () => {
  it('answers an unknown API path with a JSON 404', async () => {
    const res = await admin.get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });

  it('answers malformed JSON with a 400', async () => {
    const res = await admin.http
      .post('/api/invites')
      .set('x-csrf-token', admin.token)
      .set('content-type', 'application/json')
      .send('{"email": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_request');
  });
});

describe('the shop', () => {
  it('shows every role its own shop and lets only the admin rename it, naming a bad name', async () => {
    const tech = await t.signIn(shop.users.tech.email, shop.users.tech.password);
    expect((await tech.get('/api/shop')).body.shop).toEqual({ id: shop.shop.id, name: shop.shop.name, isDemo: false });
    const bad = await admin.patch('/api/shop', { name: ' ' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toMatch(/^name/);
    const renamed = await admin.patch('/api/shop', { name: 'Renamed Garage' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.shop.name).toBe('Renamed Garage');
    expect((await tech.get('/api/auth/me')).body.user.shop.name).toBe('Renamed Garage');
  });
});
