import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Invite, User } from '../../../server/models';
import { createTestApp, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createInviteRow, createMailRow, createTestShop, type TestShop } from '../../helpers/factories';

let t: TestApp;
let a: TestShop;
let b: TestShop;
let adminA: ApiAgent;

beforeAll(async () => {
  t = await createTestApp();
  a = await createTestShop();
  b = await createTestShop();
  adminA = await t.signIn(a.users.admin.email, a.users.admin.password);
});
afterAll(async () => t.close());

describe("a shop's admin and another shop's records", () => {
  it('lists only their own users', async () => {
    const res = await adminA.get('/api/users');
    expect(res.status).toBe(200);
    const ids = res.body.items.map((u: { id: number }) => u.id).sort();
    expect(ids).toEqual(Object.values(a.users).map((u) => u.user.id).sort());
    for (const item of res.body.items) expect(item.shop.id).toBe(a.shop.id);
  });

  it("gets 404 when changing another shop's user, and the user is unchanged", async () => {
    const target = b.users.tech.user;
    const res = await adminA.patch(`/api/users/${target.id}`, { role: 'admin' });
    expect(res.status).toBe(404);
    expect((await User.findByPk(target.id))!.role).toBe('tech');
  });

  it("gets 404 when revoking another shop's invite, and the invite stays", async () => {
    const { invite } = await createInviteRow(b.shop);
    const res = await adminA.delete(`/api/invites/${invite.id}`);
    expect(res.status).toBe(404);
    expect(await Invite.findByPk(invite.id)).not.toBeNull();
  });

  it("sees only their own shop's invites and mail", async () => {
    const inviteB = (await createInviteRow(b.shop)).invite;
    const inviteA = (await createInviteRow(a.shop)).invite;
    const mailB = await createMailRow(b.shop);
    const mailA = await createMailRow(a.shop);
    const invites = (await adminA.get('/api/invites')).body.items.map((i: { id: number }) => i.id);
    expect(invites).toContain(inviteA.id);
    expect(invites).not.toContain(inviteB.id);
    const outbox = await adminA.get('/api/outbox');
    const ids = outbox.body.items.map((m: { id: number }) => m.id);
    expect(ids).toContain(mailA.id);
    expect(ids).not.toContain(mailB.id);
    expect((await adminA.get(`/api/outbox/${mailB.id}`)).status).toBe(404);
    const own = await adminA.get(`/api/outbox/${mailA.id}`);
    expect(own.status).toBe(200);
    expect(own.body.message).toMatchObject({ id: mailA.id, subject: mailA.subject, text: 'Hello' });
  });
});
