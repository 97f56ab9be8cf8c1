// Builds createApp() against the test MariaDB with its own mail fake on a free port, and gives
// agents that keep cookies and send the CSRF token (refetched after sign-in, as the client does).
import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import request from 'supertest';
import { inject } from 'vitest';
import { createApp } from '../../server/app';
import { createSequelize } from '../../server/db/sequelize';
import { parseEnv, type Env } from '../../server/env';
import { createLogger, silentLogger, type Logger } from '../../server/logger';
import { startMailFake, type MailFake } from '../../server/mail/fake-smtp';
import { createSmtpMailer, type Mailer } from '../../server/mail/mailer';
import { MailMessage } from '../../server/models';
import { Op } from 'sequelize';

/** A test app and what it runs on. */
export interface TestApp {
  app: Express;
  sequelize: Sequelize;
  env: Env;
  mailFake: MailFake;
  /** A fresh signed-out agent that has fetched a CSRF token. */
  agent(): Promise<ApiAgent>;
  /** A fresh agent signed in as `email`; fails the test when sign-in does not answer 200. */
  signIn(email: string, password: string): Promise<ApiAgent>;
  close(): Promise<void>;
}

type Method = 'get' | 'post' | 'patch' | 'put' | 'delete';

/** A cookie-keeping client that adds `x-csrf-token` to every request (omit it with `{ csrf: false }`). */
export class ApiAgent {
  readonly http: ReturnType<typeof request.agent>;
  token = '';

  constructor(app: Express) {
    this.http = request.agent(app);
  }

  /** Fetches a CSRF token for the current session. */
  async refreshCsrf(): Promise<void> {
    const res = await this.http.get('/api/csrf');
    if (res.status !== 200) throw new Error(`GET /api/csrf answered ${res.status}`);
    this.token = res.body.token as string;
  }

  /** Sends a request; `body` as JSON. */
  send(method: Method, path: string, body?: unknown, options: { csrf?: boolean } = {}) {
    let req = this.http[method](path);
    if (options.csrf !== false && this.token) req = req.set('x-csrf-token', this.token);
    return body === undefined ? req : req.send(body as object);
  }

  get = (path: string) => this.send('get', path);
  post = (path: string, body?: unknown) => this.send('post', path, body ?? {});
  patch = (path: string, body?: unknown) => this.send('patch', path, body ?? {});
  delete = (path: string) => this.send('delete', path);
}

/** The env tests run with: cheap bcrypt, silent logs; `overrides` as environment strings. */
export function testEnv(overrides: Record<string, string> = {}): Env {
  return parseEnv({ NODE_ENV: 'test', LOG_LEVEL: 'silent', BCRYPT_ROUNDS: '4', DEMO: 'off', PUBLIC_URL: 'http://127.0.0.1:3999', ...overrides });
}

// Sequelize models are process-wide classes bound to one instance, so every app in a test file
// shares one connection; it closes when the last app of the file closes.
let shared: { sequelize: Promise<Sequelize>; refs: number } | null = null;

function sharedSequelize(): Promise<Sequelize> {
  shared ??= { sequelize: createSequelize(inject('databaseUrl')), refs: 0 };
  shared.refs += 1;
  return shared.sequelize;
}

async function releaseSequelize(): Promise<void> {
  if (!shared) return;
  shared.refs -= 1;
  if (shared.refs > 0) return;
  const done = shared.sequelize;
  shared = null;
  await (await done).close();
}

/** Creates the app on the test database (from the global set-up) with a mail fake on a free port. */
export async function createTestApp(overrides: Record<string, string> = {}, options: { mailer?: Mailer; logger?: Logger } = {}): Promise<TestApp> {
  const env = testEnv(overrides);
  const sequelize = await sharedSequelize();
  const mailFake = await startMailFake(0, silentLogger);
  const mailer = options.mailer ?? createSmtpMailer(mailFake.url, env.MAIL_FROM);
  // Unexpected 500s are logged (to stderr) so a failing test shows why; TEST_LOG=debug shows more.
  const logger = options.logger ?? createLogger((process.env.TEST_LOG as 'debug' | undefined) ?? 'error', false);
  const app = createApp({ sequelize, env, mailer, logger, sessionSecret: 'test-secret-test-secret-test-secret-0123' });
  const agent = async () => {
    const a = new ApiAgent(app);
    await a.refreshCsrf();
    return a;
  };
  return {
    app,
    sequelize,
    env,
    mailFake,
    agent,
    async signIn(email, password) {
      const a = await agent();
      const res = await a.post('/api/auth/sign-in', { email, password });
      if (res.status !== 200) throw new Error(`sign-in as ${email} answered ${res.status} ${JSON.stringify(res.body)}`);
      await a.refreshCsrf();
      return a;
    },
    async close() {
      mailer.close();
      await mailFake.stop();
      await releaseSequelize();
    },
  };
}

/**
 * Waits for the mail fake to have stored a message to `to` created after `since`, and returns it
 * (password-reset mail is sent after the 202 reply, so it may arrive a moment later).
 */
export async function waitForMail(to: string, since: Date, timeoutMs = 10_000): Promise<MailMessage> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const found = await MailMessage.findOne({
      where: { to: { [Op.like]: `%${to}%` }, createdAt: { [Op.gte]: new Date(since.getTime() - 1000) } },
      order: [['id', 'DESC']],
    });
    if (found) return found;
    if (Date.now() > deadline) throw new Error(`no mail to ${to} within ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** The one-time token in a link like `<base>/invite/<token>` or `<base>/reset-password/<token>`. */
export function linkToken(text: string, kind: 'invite' | 'reset-password'): string {
  const match = new RegExp(`/${kind}/([A-Za-z0-9_-]+)`).exec(text);
  if (!match?.[1]) throw new Error(`no /${kind}/<token> link in the mail text`);
  return match[1];
}
