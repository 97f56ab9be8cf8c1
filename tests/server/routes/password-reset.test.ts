import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MailMessage, PasswordReset } from '../../../server/models';
import { createTestApp, linkToken, waitForMail, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
});
afterAll(async () => t.close());

describe('password reset', () => {
  it('answers 202 for an unknown address and sends nothing', async () => {
    const email = `ghost.${uniq()}@example.test`;
    const res = await (await t.agent()).post('/api/auth/password-reset', { email });
    expect(res.status).toBe(202);
    await new Promise((r) => setTimeout(r, 300));
    expect(await MailMessage.count({ where: { to: email } })).toBe(0);
  });

  it('e-mails a one-time link that sets a new password and ends the old sessions', async () => {
    const { email, password, user } = shop.users.lead;
    const oldSession = await t.signIn(email, password);
    const since = new Date();
    const res = await (await t.agent()).post('/api/auth/password-reset', { email });
    expect(res.status).toBe(202);
    const token = linkToken((await waitForMail(email, since)).text, 'reset-password');
    const reset = await PasswordReset.findOne({ where: { userId: user.id }, order: [['id', 'DESC']] });
    const minutes = (reset!.expiresAt.getTime() - reset!.createdAt.getTime()) / 60_000;
    expect(minutes).toBeCloseTo(60, 0);

    const done = await (await t.agent()).post('/api/auth/password-reset/complete', { token, password: 'brand-new-password' });
    expect(done.status).toBe(204);
    expect((await oldSession.get('/api/auth/me')).status).toBe(401);
    expect((await (await t.agent()).post('/api/auth/sign-in', { email, password })).status).toBe(401);
    expect((await (await t.agent()).post('/api/auth/sign-in', { email, password: 'brand-new-password' })).status).toBe(200);

    const reuse = await (await t.agent()).post('/api/auth/password-reset/complete', { token, password: 'yet-another-password' });
    expect(reuse.status).toBe(400);
    expect(reuse.body.error.code).toBe('token_invalid');
  });

  it('refuses an unknown token with 400 token_invalid', async () => {
    const res = await (await t.agent()).post('/api/auth/password-reset/complete', { token: 'B'.repeat(43), password: 'long-enough-pass' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('token_invalid');
  });

  it('answers 429 after five requests for one address within the window', async () => {
    const a = await t.agent();
    const email = `flood.${uniq()}@example.test`;
    for (let i = 0; i < 5; i++) expect((await a.post('/api/auth/password-reset', { email })).status).toBe(202);
    const sixth = await a.post('/api/auth/password-reset', { email });
    expect(sixth.status).toBe(429);
    expect(sixth.body.error.code).toBe('too_many_attempts');
    expect((await a.post('/api/auth/password-reset', { email: `other.${uniq()}@example.test` })).status).toBe(202);
  });
});
