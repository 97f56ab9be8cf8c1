import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Session } from '../../../server/models';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
});
afterAll(async () => t.close());

describe('sign-in', () => {
  it('signs in with the right password and returns the user DTO without secrets', async () => {
    const { email, password, user } = shop.users.lead;
    const a = await t.agent();
    const res = await a.post('/api/auth/sign-in', { email: email.toUpperCase(), password });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual({
      id: user.id,
      email,
      name: user.name,
      role: 'lead',
      active: true,
      shop: { id: shop.shop.id, name: shop.shop.name, isDemo: false },
    });
    expect(JSON.stringify(res.body)).not.toMatch(/passwordHash|\$2[aby]\$/);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/crankwise\.sid=.*HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('answers the same 401 for a wrong password and for an unknown user', async () => {
    const a = await t.agent();
    const wrong = await a.post('/api/auth/sign-in', { email: shop.users.tech.email, password: 'not-the-password' });
    const unknown = await a.post('/api/auth/sign-in', { email: `nobody.${uniq()}@example.test`, password: 'not-the-password' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body).toEqual(unknown.body);
    expect(wrong.body.error.code).toBe('invalid_credentials');
  });

  it('changes the session id at sign-in (no session fixation)', async () => {
    const a = await t.agent();
    const before = a.http.jar.getCookie('crankwise.sid', { domain: '127.0.0.1', path: '/', secure: false, script: false });
    expect(before).toBeDefined();
    const res = await a.post('/api/auth/sign-in', { email: shop.users.tech.email, password: shop.users.tech.password });
    expect(res.status).toBe(200);
    const after = String(res.headers['set-cookie']).match(/crankwise\.sid=([^;]+)/)?.[1];
    expect(after).toBeDefined();
    expect(after).not.toBe(before!.value);
  });

  it('rejects a state-changing request without the CSRF token with 403 csrf_invalid', async () => {
    const a = await t.agent();
    const res = await a.send('post', '/api/auth/sign-in', { email: shop.users.tech.email, password: shop.users.tech.password }, { csrf: false });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('csrf_invalid');
    const forged = await a.send('post', '/api/auth/sign-in', { email: shop.users.tech.email, password: shop.users.tech.password }, { csrf: false }).set('x-csrf-token', 'forged-token');
    expect(forged.status).toBe(403);
  });

  it('names the field in a 400 for bad input', async () => {
    const a = await t.agent();
    const res = await a.post('/api/auth/sign-in', { email: 'not-an-email', password: 'x' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.message).toMatch(/^email/);
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 to the 11th failure for one IP + e-mail while another e-mail from the same IP still signs in', async () => {
    const limited = await createTestApp({ SIGNIN_MAX_FAILURES: '10', SIGNIN_WINDOW_MIN: '15' });
    try {
      const a = await limited.agent();
      const email = shop.users.specialist.email;
      for (let i = 1; i <= 10; i++) {
        const res = await a.post('/api/auth/sign-in', { email, password: `wrong-${i}` });
        expect(res.status, `attempt ${i}`).toBe(401);
      }
      const eleventh = await a.post('/api/auth/sign-in', { email: email.toUpperCase(), password: 'wrong-11' });
      expect(eleventh.status).toBe(429);
      expect(eleventh.body.error.code).toBe('too_many_attempts');
      // Even the right password is refused while the window lasts.
      const right = await a.post('/api/auth/sign-in', { email, password: shop.users.specialist.password });
      expect(right.status).toBe(429);
      const other = await a.post('/api/auth/sign-in', { email: shop.users.admin.email, password: shop.users.admin.password });
      expect(other.status).toBe(200);
    } finally {
      await limited.close();
    }
  });

  it('stops password spraying: failures across many addresses from one IP hit the per-IP limit (issue 19 item 4)', async () => {
    // Before: only IP + e-mail was counted, so 30 addresses x 9 guesses all reached the password check.
    const limited = await createTestApp({ SIGNIN_MAX_FAILURES: '9', SIGNIN_IP_MAX_FAILURES: '12' });
    try {
      const a = await limited.agent();
      const statuses: number[] = [];
      for (let address = 0; address < 5; address++) {
        for (let guess = 0; guess < 3; guess++) {
          const res = await a.post('/api/auth/sign-in', { email: `sprayed.${address}.${uniq()}@example.test`, password: `guess-${guess}-xx` });
          statuses.push(res.status);
          if (res.status === 429) expect(res.body.error.code).toBe('too_many_attempts');
        }
      }
      // 12 failures reach the password check, then every further attempt is refused.
      expect(statuses.slice(0, 12).every((s) => s === 401)).toBe(true);
      expect(statuses.slice(12).every((s) => s === 429)).toBe(true);
      // While the window lasts this IP cannot sign in any address, not even with its right password.
      const right = await a.post('/api/auth/sign-in', { email: shop.users.lead.email, password: shop.users.lead.password });
      expect(right.status).toBe(429);
      expect(right.body.error.message).toMatch(/this network/);
    } finally {
      await limited.close();
    }
  });

  it('lets a shop behind one address sign many people in: successes never count toward the per-IP limit', async () => {
    const limited = await createTestApp({ SIGNIN_IP_MAX_FAILURES: '3' });
    try {
      const a = await limited.agent();
      for (let i = 0; i < 2; i++) expect((await a.post('/api/auth/sign-in', { email: shop.users.tech.email, password: 'wrong-password' })).status).toBe(401);
      for (const role of ['tech', 'lead', 'specialist', 'admin', 'tech'] as const) {
        const b = await limited.agent();
        expect((await b.post('/api/auth/sign-in', { email: shop.users[role].email, password: shop.users[role].password })).status, role).toBe(200);
      }
    } finally {
      await limited.close();
    }
  });

  it('does not count successful sign-ins', async () => {
    const limited = await createTestApp({ SIGNIN_MAX_FAILURES: '2' });
    try {
      const { email, password } = shop.users.tech;
      for (let i = 0; i < 5; i++) {
        const a = await limited.agent();
        expect((await a.post('/api/auth/sign-in', { email, password })).status).toBe(200);
      }
    } finally {
      await limited.close();
    }
  });
});

describe('me and sign-out', () => {
  it('requires authentication for /api/auth/me', async () => {
    const a = await t.agent();
    const res = await a.get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthenticated');
  });

  it('returns the user after sign-in and 401 after sign-out, with the server session destroyed', async () => {
    const a = await t.signIn(shop.users.admin.email, shop.users.admin.password);
    expect((await a.get('/api/auth/me')).body.user.role).toBe('admin');
    const sessionsBefore = await Session.count({ where: { userId: shop.users.admin.user.id } });
    expect(sessionsBefore).toBeGreaterThan(0);
    const out = await a.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect((await a.get('/api/auth/me')).status).toBe(401);
  });

  it('stops a deactivated user: with the right password told the account is deactivated (403), with a wrong one the same 401 as anyone; sessions end', async () => {
    const victim = shop.users.tech;
    const session = await t.signIn(victim.email, victim.password);
    const admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
    const res = await admin.patch(`/api/users/${victim.user.id}`, { active: false });
    expect(res.status).toBe(200);
    expect(res.body.user.active).toBe(false);
    expect((await session.get('/api/auth/me')).status).toBe(401);
    const again = await (await t.agent()).post('/api/auth/sign-in', { email: victim.email, password: victim.password });
    expect(again.status).toBe(403);
    expect(again.body.error.code).toBe('account_deactivated');
    expect(again.body.error.message).toMatch(/deactivated.*admin/);
    const wrong = await (await t.agent()).post('/api/auth/sign-in', { email: victim.email, password: 'not-the-password-1' });
    const nobody = await (await t.agent()).post('/api/auth/sign-in', { email: `nobody.${Date.now()}@example.test`, password: 'not-the-password-1' });
    expect([wrong.status, wrong.body.error.code, wrong.body.error.message]).toEqual([nobody.status, nobody.body.error.code, nobody.body.error.message]);
    expect(wrong.status).toBe(401);
    await admin.patch(`/api/users/${victim.user.id}`, { active: true });
  });
});

describe('security headers', () => {
  it('sends helmet headers with a CSP that allows only the app itself', async () => {
    const res = await (await t.agent()).get('/api/health');
    expect(res.body).toEqual({ ok: true });
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
