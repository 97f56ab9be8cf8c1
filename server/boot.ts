// Boots a full server process: database connection, migrations, demo shop, mail, HTTP listener.
// Shared by server/index.ts (DATABASE_URL given) and scripts/start.ts (starts its own MariaDB first).
import type { AddressInfo } from 'node:net';
import { join } from 'node:path';
import { createApp } from './app';
import { createSequelize } from './db/sequelize';
import { migrate } from './db/migrator';
import { mailFakeWarning, type Env } from './env';
import type { Logger } from './logger';
import { startMailFake, type MailFake } from './mail/fake-smtp';
import { createSmtpMailer } from './mail/mailer';
import { projectRoot } from './paths';
import { removeDemoShop, seedDemoShop } from './services/demo-shop';
import { resolveSessionSecret } from './session-secret';
import { listenApp } from './tls';
import { startJobRunner, type JobRunner } from './jobs/job-runner';
import { closePool, getPool, runTask } from './pool';
import { seedDemoCases } from './services/demo-cases';
import { createStorage } from './storage/create-storage';
import { sweepStorage } from './storage/sweep';
import type { AppContext } from './context';

/** How long close() waits for requests in progress before cutting their connections. */
const SHUTDOWN_GRACE_MS = 10_000;

/** A running server. */
export interface BootedServer {
  url: string;
  /** True when the demo shop was created by this boot (first run): print its passwords. */
  demoCreated: boolean;
  /** The mail fake's SMTP URL, when it runs (MAIL_URL unset). */
  mailFakeUrl: string | null;
  close(): Promise<void>;
}

/** Connects, migrates, seeds or removes the demo shop (DEMO), starts mail and listens on HOST:PORT. */
export async function bootServer(env: Env, databaseUrl: string, logger: Logger): Promise<BootedServer> {
  const sequelize = await createSequelize(databaseUrl, logger.child({ component: 'sql' }));
  const ran = await migrate(sequelize, logger);
  if (ran.length) logger.info('migrated', { migrations: ran.length });

  let demoCreated = false;
  if (env.DEMO) demoCreated = await seedDemoShop(sequelize, env.BCRYPT_ROUNDS);
  else if ((await removeDemoShop()) > 0) logger.info('DEMO=off: removed the demo shop and its records');

  let fake: MailFake | null = null;
  let mailUrl = env.MAIL_URL;
  const warning = mailFakeWarning(env);
  if (warning) logger.warn(warning);
  if (!mailUrl) {
    fake = await startMailFake(env.MAIL_FAKE_PORT, logger.child({ component: 'mail-fake' })).catch((error: unknown) => {
      throw portError(error, env.MAIL_FAKE_PORT, 'MAIL_FAKE_PORT');
    });
    mailUrl = fake.url;
    logger.info('mail fake listening (messages go to the Outbox)', { url: fake.url });
  }
  const mailer = createSmtpMailer(mailUrl, env.MAIL_FROM);
  const storage = createStorage(env);
  // The start-up sweep runs beside the server (a large bucket takes a while); it only logs.
  void sweepStorage({ sequelize, storage, logger: logger.child({ component: 'sweep' }), graceMs: env.ORPHAN_GRACE_MIN * 60_000 }).catch((error: unknown) =>
    logger.error('storage sweep failed', { error }));
  if (env.DEMO) {
    const seeded = await seedDemoCases(storage, logger);
    if (seeded > 0) logger.info('seeded the demo cases', { cases: seeded });
  }
  const app = createApp({
    storage,
    sequelize,
    env,
    mailer,
    logger,
    sessionSecret: resolveSessionSecret(env.SESSION_SECRET),
    clientDir: env.CLIENT_DIR ?? join(projectRoot(), 'dist', 'client'),
  });
  // HTTPS when TLS_CERT_FILE / TLS_KEY_FILE are set (recording in the browser needs a secure page).
  const { server, scheme } = await listenApp(app, env).catch((error: unknown) => {
    throw portError(error, env.PORT, 'PORT');
  });
  // Requests in progress, so that close() lets them finish before the database pool closes.
  let inFlight = 0;
  server.on('request', (_req, res: import('node:http').ServerResponse) => {
    inFlight += 1;
    res.once('close', () => (inFlight -= 1));
  });
  let jobs: JobRunner | null = null;
  if (env.JOBS_IN_PROCESS) {
    jobs = startJobRunner({
      sequelize, storage, logger, analyze: (input) => runTask('analyzeFile', input),
      concurrency: env.JOBS_CONCURRENCY ?? getPool().options.maxThreads, leaseMs: env.JOB_LEASE_S * 1000, pollMs: env.JOB_POLL_MS,
    });
    (app.locals.ctx as AppContext).jobs = jobs;
  }
  const { port } = server.address() as AddressInfo;
  const url = `${scheme}://${env.HOST}:${port}`;
  return {
    url,
    demoCreated,
    mailFakeUrl: fake?.url ?? null,
    async close() {
      // Stop accepting, let requests in progress finish (at most SHUTDOWN_GRACE_MS), then cut the
      // rest: a handler must not find the database pool closed under it mid-transaction.
      const closed = new Promise<void>((resolve) => server.close(() => resolve()));
      server.closeIdleConnections();
      const deadline = Date.now() + SHUTDOWN_GRACE_MS;
      while (inFlight > 0 && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
      server.closeAllConnections();
      await closed;
      await jobs?.stop();
      await closePool();
      mailer.close();
      await fake?.stop();
      await sequelize.close();
    },
  };
}

/** Turns "address in use" into a message that says what to do. */
function portError(error: unknown, port: number, variable: string): Error {
  if ((error as NodeJS.ErrnoException)?.code === 'EADDRINUSE') {
    return new Error(`Port ${port} is already in use (another Crankwise?): stop that program or set ${variable} to a free port`);
  }
  return error instanceof Error ? error : new Error(String(error));
}
