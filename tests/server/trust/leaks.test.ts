// Issue 19 item 5, small leaks: an invite to an address known in another shop answers like any
// invite; a client's X-Request-Id is echoed only when it is safe; a failed statement's SQL (with the
// submitted values Sequelize inlines) never reaches the log at the default level.
import express from 'express';
import request from 'supertest';
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest';
import { Invite, MailMessage } from '../../../server/models';
import { createLogger } from '../../../server/logger';
import { errorHandler } from '../../../server/middleware/error-handler';
import { requestId } from '../../../server/middleware/request-id';
import { mailFakeWarning } from '../../../server/env';
import { createTestApp, testEnv, waitForMail, type ApiAgent, type TestApp } from '../../helpers/test-app';
import { createTestShop, uniq, type TestShop } from '../../helpers/factories';

let t: TestApp;
let shop: TestShop;
let other: TestShop;
let admin: ApiAgent;

beforeAll(async () => {
  t = await createTestApp();
  shop = await createTestShop();
  other = await createTestShop();
  admin = await t.signIn(shop.users.admin.email, shop.users.admin.password);
});
afterAll(async () => t.close());
afterEach(() => vi.restoreAllMocks());

describe('inviting an address that has an account in another shop', () => {
  it('answers exactly as for a new address, and mails the owner a notice without a link', async () => {
    const stranger = `fresh.${uniq()}@example.test`;
    const since = new Date();
    const known = other.users.lead.email;
    const fresh = await admin.post('/api/invites', { email: stranger, role: 'tech' });
    const res = await admin.post('/api/invites', { email: known, role: 'tech' });
    expect(fresh.status).toBe(201);
    expect(res.status).toBe(201);
    // Same fields, same kinds of values: nothing tells the admin the address is known elsewhere.
    expect(Object.keys(res.body.invite).sort()).toEqual(Object.keys(fresh.body.invite).sort());
    expect(res.body.invite).toMatchObject({ email: known, role: 'tech' });
    const list = await admin.get('/api/invites');
    expect(list.body.items.map((i: { email: string }) => i.email)).toEqual(expect.arrayContaining([stranger, known]));

    const notice = await waitForMail(known, since);
    expect(notice.text).toMatch(/already has a Crankwise account in another shop/);
    expect(notice.text).not.toMatch(/\/invite\//);
    // The notice is the other shop's mail (its own Outbox), not the inviting shop's.
    expect(notice.shopId).toBe(other.shop.id);
    expect(await MailMessage.count({ where: { shopId: shop.shop.id, to: known } })).toBe(0);
    // Its pending invite can never be accepted: nobody holds its token.
    expect(await Invite.count({ where: { shopId: shop.shop.id, email: known, acceptedAt: null } })).toBe(1);
  });
});

describe('X-Request-Id from the client', () => {
  function echoApp() {
    const app = express();
    app.use(requestId(createLogger('silent')));
    app.get('/', (req, res) => void res.json({ id: req.id }));
    return app;
  }

  it('keeps a safe id', async () => {
    const res = await request(echoApp()).get('/').set('X-Request-Id', 'abc-123_DEF.456');
    expect(res.headers['x-request-id']).toBe('abc-123_DEF.456');
  });

  it.each([
    ['a log line break', 'abcdefgh\tinfo forged'],
    ['markup', '<script>alert(1)</script>'],
    ['too long', 'a'.repeat(65)],
    ['too short', 'abc'],
    ['a path', '../../etc/passwd'],
    ['spaces', 'abcdefgh ijkl'],
  ])('replaces one with %s by a fresh UUID', async (_label, value) => {
    const res = await request(echoApp()).get('/').set('X-Request-Id', value);
    expect(res.headers['x-request-id']).not.toBe(value);
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.body.id).toBe(res.headers['x-request-id']);
  });
});

describe('a failed statement in the log', () => {
  function captureOutput(): string[] {
    const lines: string[] = [];
    const grab = (chunk: unknown) => {
      lines.push(String(chunk));
      return true;
    };
    vi.spyOn(process.stdout, 'write').mockImplementation(grab);
    vi.spyOn(process.stderr, 'write').mockImplementation(grab);
    return lines;
  }

  function failingApp(level: 'info' | 'debug') {
    const app = express();
    app.use(requestId(createLogger(level, true)));
    app.get('/', async (_req, _res, next) => {
      // A statement that fails in MariaDB with a submitted value inlined, as Sequelize builds them.
      await t.sequelize.query('SELECT no_such_column FROM users WHERE email = ?', { replacements: ['leaky.value@example.test'] }).catch(next);
    });
    app.use(errorHandler);
    return app;
  }

  it('logs the error code but not the SQL or its values at info (the default level)', async () => {
    const lines = captureOutput();
    const res = await request(failingApp('info')).get('/');
    vi.restoreAllMocks();
    expect(res.status).toBe(500);
    const text = lines.join('');
    expect(text).toContain('unhandled error');
    expect(text).toContain('ER_BAD_FIELD_ERROR');
    expect(text).not.toContain('leaky.value@example.test');
    expect(text).not.toMatch(/SELECT no_such_column/);
  });

  it('shows the statement only at debug', async () => {
    const lines = captureOutput();
    await request(failingApp('debug')).get('/');
    vi.restoreAllMocks();
    expect(lines.join('')).toContain('SELECT no_such_column');
  });
});

describe('start-up warning for the mail fake', () => {
  it('warns when DEMO=off runs without MAIL_URL, and only then', () => {
    expect(mailFakeWarning(testEnv({ DEMO: 'off' }))).toMatch(/MAIL_URL is not set while DEMO=off.*Outbox/);
    expect(mailFakeWarning(testEnv({ DEMO: 'off', MAIL_URL: 'smtp://mail.example.test:25' }))).toBeNull();
    expect(mailFakeWarning(testEnv({ DEMO: 'on' }))).toBeNull();
  });
});
