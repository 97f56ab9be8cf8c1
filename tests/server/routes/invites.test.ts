import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invite, User } from '../../../server/models';
import { hashToken } from '../../../server/auth/tokens';
import { silentLogger } from '../../../server/logger';
import { createTestApp, linkToken, waitForMail, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createInviteRow, createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let admin: ApiAgent;

beforeAll(async () => {
  t = await createTestApp({ INVITE_TTL_HOURS: '48' });
  shop = await createTestShop();
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
});
afterAll(async () => t.close());

describe('invitations', () => {
  it('e-mails a one-time link that sets name and password once and only once', async () => {
    const email = `new.tech.${uniq()}@example.test`;
    const since = new Date();
    const created = await admin.post('/api/invites', { email: email.toUpperCase(), role: 'specialist' });
    expect(created.status).toBe(201);
    expect(created.body.invite).toMatchObject({ email, role: 'specialist', acceptedAt: null });
    const hours = (Date.parse(created.body.invite.expiresAt) - Date.parse(created.body.invite.createdAt)) / 3_600_000;
    expect(hours).toBeCloseTo(48, 1);

    const mail = await waitForMail(email, since);
    expect(mail.shopId).toBe(shop.shop.id);
    expect(mail.subject).toContain(shop.shop.name);
    const token = linkToken(mail.text, 'invite');
    // Only the hash is stored.
    const row = await Invite.findByPk(created.body.invite.id);
    expect(row!.tokenHash).toBe(hashToken(token));
    expect(row!.tokenHash).not.toContain(token);

    const visitor = await t.agent();
    const info = await visitor.get(`/api/invites/${token}/info`);
    expect(info.status).toBe(200);
    expect(info.body).toEqual({ email, role: 'specialist', shopName: shop.shop.name });

    const accepted = await visitor.post('/api/invites/accept', { token, name: 'Nova Quill', password: 'a-long-enough-pass' });
    expect(accepted.status).toBe(200);
    expect(accepted.body.user).toMatchObject({ email, name: 'Nova Quill', role: 'specialist', shop: { id: shop.shop.id } });
    await visitor.refreshCsrf();
    expect((await visitor.get('/api/auth/me')).body.user.email).toBe(email);

    const again = await (await t.agent()).post('/api/invites/accept', { token, name: 'Someone Else', password: 'another-long-pass' });
    expect(again.status).toBe(400);
    expect(again.body.error.code).toBe('token_invalid');
    expect((await (await t.agent()).get(`/api/invites/${token}/info`)).status).toBe(400);
    expect(await User.count({ where: { email } })).toBe(1);

    const signIn = await (await t.agent()).post('/api/auth/sign-in', { email, password: 'a-long-enough-pass' });
    expect(signIn.status).toBe(200);
  });

  it('refuses an expired invitation with 400 token_invalid and creates no user', async () => {
    const { invite, token } = await createInviteRow(shop.shop, 'tech', { expiresAt: new Date(Date.now() - 60_000) });
    const res = await (await t.agent()).post('/api/invites/accept', { token, name: 'Late Comer', password: 'late-but-long-enough' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('token_invalid');
    expect(await User.count({ where: { email: invite.email } })).toBe(0);
  });

  it('names the password field when it is too short and leaves the invitation usable', async () => {
    const { invite, token } = await createInviteRow(shop.shop, 'lead');
    const res = await (await t.agent()).post('/api/invites/accept', { token, name: 'Short Pw', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    expect(res.body.error.message).toMatch(/^password/);
    expect(await User.count({ where: { email: invite.email } })).toBe(0);
    expect((await Invite.findByPk(invite.id))!.acceptedAt).toBeNull();
  });

  it('refuses a bad role with 400 naming the field and writes no invite', async () => {
    const email = `bad.role.${uniq()}@example.test`;
    const res = await admin.post('/api/invites', { email, role: 'owner' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^role/);
    expect(await Invite.count({ where: { email } })).toBe(0);
  });

  it('refuses an address that already belongs to someone of this shop with 409 email_in_use', async () => {
    const res = await admin.post('/api/invites', { email: shop.users.tech.email, role: 'tech' });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('email_in_use');
  });

  it('lists and revokes invitations; a revoked link no longer works', async () => {
    const { invite, token } = await createInviteRow(shop.shop, 'tech');
    const list = await admin.get('/api/invites');
    expect(list.body.items.map((i: { id: number }) => i.id)).toContain(invite.id);
    expect((await admin.delete(`/api/invites/${invite.id}`)).status).toBe(204);
    expect((await (await t.agent()).get(`/api/invites/${token}/info`)).status).toBe(400);
  });

  it('writes no invitation when the e-mail cannot be sent (502 mail_failed)', async () => {
    // The failure is expected here, so its error log is silenced.
    const broken = await createTestApp({}, { mailer: { send: () => Promise.reject(new Error('SMTP down')), close: () => {} }, logger: silentLogger });
    try {
      const brokenAdmin = await broken.signIn(shop.users.admin.email, shop.users.admin.password);
      const email = `unlucky.${uniq()}@example.test`;
      const res = await brokenAdmin.post('/api/invites', { email, role: 'tech' });
      expect(res.status).toBe(502);
      expect(res.body.error.code).toBe('mail_failed');
      expect(await Invite.count({ where: { email } })).toBe(0);
    } finally {
      await broken.close();
    }
  });
});
