// `npm start`: starts the project's own MariaDB (unless DATABASE_URL is set), then the server in
// this same process; prints the URL and, on first run, the demo users' passwords. Ctrl-C stops both.
import { startDatabase, type RunningDatabase } from './db';
import { bootServer, type BootedServer } from '../server/boot';
import { parseEnv } from '../server/env';
import { createLogger } from '../server/logger';
import { DEMO_SHOP_NAME, DEMO_USERS } from '../server/services/demo-shop';
import { ROLE_LABELS } from '../shared/auth/roles';

async function main(): Promise<void> {
  const env = parseEnv();
  const logger = createLogger(env.LOG_LEVEL, env.NODE_ENV === 'production');
  let db: RunningDatabase | null = null;
  let server: BootedServer | null = null;
  let stopping = false;
  const stop = async (code: number) => {
    if (stopping) return;
    stopping = true;
    try {
      await server?.close();
    } catch (error) {
      logger.error('server shutdown failed', { error });
    }
    await db?.stop();
    process.exit(code);
  };
  for (const signal of ['SIGINT', 'SIGTERM', 'SIGHUP'] as const) process.once(signal, () => void stop(0));

  try {
    let url = env.DATABASE_URL;
    if (!url) {
      db = await startDatabase({
        name: 'dev-db',
        port: env.DB_PORT,
        dataDir: env.DB_DATA_DIR,
        log: (m) => logger.info(`database: ${m}`),
      });
      url = db.url;
    }
    server = await bootServer(env, url, logger);
  } catch (error) {
    logger.error(error instanceof Error ? error.message : String(error));
    await stop(1);
    return;
  }

  const lines = ['', `  Crankwise is running: ${server.url}`, ''];
  if (server.demoCreated) {
    lines.push(`  Demo shop "${DEMO_SHOP_NAME}" created. Sign in as:`);
    for (const u of DEMO_USERS) lines.push(`    ${ROLE_LABELS[u.role].padEnd(22)} ${u.email.padEnd(38)} ${u.password}`);
    lines.push('  (also in the README; DEMO=off starts without the demo shop)', '');
  }
  if (server.mailFakeUrl) lines.push(`  Mail is not sent anywhere: admins read it on the Outbox page.`, '');
  lines.push('  Ctrl-C stops the server and its database.', '');
  process.stdout.write(`${lines.join('\n')}\n`);
}

void main();
