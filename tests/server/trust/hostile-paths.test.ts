// Requests an attacker or a careless client sends before any route's validation runs: malformed
// %-encoding, ids that are not canonical positive integers. Each must answer a 4xx in the one error
// shape `{ error: { code, message } }`, never a 500 and never another record.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, ownedFactories, type TestShop } from '../../helpers/factories';
import { User } from '../../../server/models';

let t: TestApp;
let shop: TestShop;
let admin: ApiAgent;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
});
afterAll(async () => t.close());

function expectErrorShape(body: unknown): void {
  expect(body).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });
}

describe('malformed percent-encoding', () => {
  it.each([
    ['get', '/api/engines/%E0%A4%A'],
    ['get', '/api/bearings/%'],
    ['get', '/api/invites/%C0%AF'],
    ['delete', '/api/invites/%C0%AF'],
    ['patch', '/api/users/%FF'],
    ['get', '/api/invites/%E0%A4%A/info'],
  ] as const)('%s %s answers 400 bad_request', async (method, path) => {
    const res = await admin.send(method, path, method === 'get' ? undefined : {});
    expect(res.status, JSON.stringify(res.body)).toBe(400);
    expectErrorShape(res.body);
    expect(res.body.error.code).toBe('bad_request');
  });

  it('answers 400 signed out too (the decoding fails before the access check)', async () => {
    const anon = await t.agent();
    const res = await anon.get('/api/engines/%E0%A4%A');
    expect([400, 401]).toContain(res.status);
    expectErrorShape(res.body);
  });
});

describe('record ids: canonical positive integers only', () => {
  it.each(['0x1', '1e0', '+1', '%201', '%20%31', '01', '1.0', '1%00', '-1', '0', '2147483648', '99999999999', 'abc'])(
    '/api/engines/%s answers 404 not_found like an unknown id',
    async (segment) => {
      const res = await admin.get(`/api/engines/${segment}`);
      expect(res.status, `${segment}: ${JSON.stringify(res.body)}`).toBe(404);
      expectErrorShape(res.body);
      expect(res.body.error.code).toBe('not_found');
    },
  );

  it("never loads the shop's own record through a non-canonical spelling of its id", async () => {
    const engineId = await ownedFactories.engine(shop.shop);
    expect((await admin.get(`/api/engines/${engineId}`)).status).toBe(200);
    for (const spelling of [`0x${engineId.toString(16)}`, `${engineId}e0`, `+${engineId}`, `%20${engineId}`, `0${engineId}`, `${engineId}.0`]) {
      const res = await admin.get(`/api/engines/${spelling}`);
      expect(res.status, spelling).toBe(404);
      expect(res.body.error.code).toBe('not_found');
    }
    const target = shop.users.tech.user;
    for (const spelling of [`0x${target.id.toString(16)}`, `+${target.id}`]) {
      const res = await admin.patch(`/api/users/${spelling}`, { name: 'Should Not Change' });
      expect(res.status, spelling).toBe(404);
    }
    expect((await User.findByPk(target.id))!.name).toBe(target.name);
  });
});

describe('bodies the parser refuses before validation', () => {
  it.each([
    ['application/json; charset=latin1', '{"name":"x"}', 415],
    ['application/json', '{"name":', 400],
    ['application/json', '"\\ud800', 400],
  ] as const)('%s %j answers %i in the one error shape', async (type, body, status) => {
    const res = await admin.http.patch(`/api/users/${shop.users.tech.user.id}`).set('x-csrf-token', admin.token).set('content-type', type).send(body);
    expect(res.status, JSON.stringify(res.body)).toBe(status);
    expectErrorShape(res.body);
  });

  it('answers 400 for a gzip body that is not gzip, and 413 for a body over the limit', async () => {
    const id = shop.users.tech.user.id;
    const gz = await admin.http.patch(`/api/users/${id}`).set('x-csrf-token', admin.token).set('content-type', 'application/json').set('content-encoding', 'gzip').send('not gzip at all');
    expect(gz.status).toBeGreaterThanOrEqual(400);
    expect(gz.status).toBeLessThan(500);
    expectErrorShape(gz.body);
    const big = await admin.patch(`/api/users/${id}`, { name: 'x'.repeat(300_000) });
    expect(big.status).toBe(413);
    expect(big.body.error.code).toBe('payload_too_large');
  });
});
