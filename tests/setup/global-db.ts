// Vitest global set-up for the `server` and `e2e` projects: starts the test MariaDB (port 3308,
// .data/test-db; TEST_DB_PORT / TEST_DB_DATA_DIR override), creates this run's databases, migrates
// them once and provides their URLs (inject('databaseUrl'), inject('e2eDatabaseUrl'),
// inject('scratchDatabaseUrl')).
//
// Two kinds of sharing are handled:
// - Vitest runs a project's globalSetup once per project, in one process and one after the other,
//   so the work is shared through globalThis: the first call prepares, later calls reuse it, and
//   the last teardown cleans up.
// - Several test runs may share one checkout (several people, or a watch run beside `npm test`).
//   Each run therefore gets its own databases, named after its process id, so no run drops another's
//   rows; databases of runs that have died are dropped; and the server is stopped only by the last
//   run to finish (the one that finds no other run's databases left), whoever started it.
import type { TestProject } from 'vitest/node';
import { startDatabase, type RunningDatabase } from '../../scripts/db';
import { createSequelize } from '../../server/db/sequelize';
import { migrate } from '../../server/db/migrator';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The server tests' database (supertest against createApp()). */
    databaseUrl: string;
    /** A separate database for the e2e tests' built server, so the two projects never share rows. */
    e2eDatabaseUrl: string;
    /** An empty database (not migrated) for tests that run migrations up and down. */
    scratchDatabaseUrl: string;
  }
}

interface Urls {
  databaseUrl: string;
  e2eDatabaseUrl: string;
  scratchDatabaseUrl: string;
}

interface Prepared {
  db: RunningDatabase;
  urls: Urls;
  names: string[];
}

interface Shared {
  ready: Promise<Prepared>;
  refs: number;
}

const KEY = Symbol.for('crankwise.test-db');
const store = globalThis as unknown as Record<symbol, Shared | undefined>;
const RUN_DB = /^crankwise_(test|e2e|scratch)_r(\d+)$/;

function alive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

async function prepare(): Promise<Prepared> {
  const port = Number(process.env.TEST_DB_PORT ?? 3308);
  const dataDir = process.env.TEST_DB_DATA_DIR;
  const log = (m: string) => process.stderr.write(`[test-db] ${m}\n`);
  const run = `r${process.pid}`;
  const names = [`crankwise_test_${run}`, `crankwise_e2e_${run}`, `crankwise_scratch_${run}`];
  const [testDb, e2eDb, scratchDb] = names as [string, string, string];
  const db = await startDatabase({ name: 'test-db', port, dataDir, database: testDb, fresh: true, log });
  try {
    for (const name of await db.listDatabases()) {
      const match = RUN_DB.exec(name);
      if (match && !alive(Number(match[2]))) await db.dropDatabase(name);
    }
    const e2e = await startDatabase({ name: 'test-db', port, dataDir, database: e2eDb, fresh: true });
    const scratch = await startDatabase({ name: 'test-db', port, dataDir, database: scratchDb, fresh: true });
    for (const url of [db.url, e2e.url]) {
      const sequelize = await createSequelize(url);
      try {
        await migrate(sequelize);
      } finally {
        await sequelize.close();
      }
    }
    return { db, names, urls: { databaseUrl: db.url, e2eDatabaseUrl: e2e.url, scratchDatabaseUrl: scratch.url } };
  } catch (error) {
    // Clean up (else the run never exits) and report one readable line: the driver's error object
    // carries the connection config, password included.
    await finish({ db, names, urls: { databaseUrl: '', e2eDatabaseUrl: '', scratchDatabaseUrl: '' } }).catch(() => {});
    const cause = error instanceof Error ? `${error.message}${error.cause instanceof Error ? ` (${error.cause.message})` : ''}` : String(error);
    throw new Error(`test database set-up failed: ${cause.split('\n')[0]}`);
  }
}

/** Drops this run's databases and stops the server when no other live run still uses it. */
async function finish({ db, names }: Prepared): Promise<void> {
  for (const name of names) await db.dropDatabase(name);
  const others = (await db.listDatabases()).filter((name) => {
    const match = RUN_DB.exec(name);
    return match !== null && alive(Number(match[2]));
  });
  if (others.length === 0) await db.stopServer();
  // Another run still uses it: leave it running without holding this process open.
  else db.detach();
}

/** Starts (or reuses) the test database and provides this run's URLs to the project's tests. */
export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  let shared = store[KEY];
  if (!shared) {
    shared = { ready: prepare(), refs: 0 };
    store[KEY] = shared;
  }
  shared.refs += 1;
  const { urls } = await shared.ready;
  project.provide('databaseUrl', urls.databaseUrl);
  project.provide('e2eDatabaseUrl', urls.e2eDatabaseUrl);
  project.provide('scratchDatabaseUrl', urls.scratchDatabaseUrl);
  process.env.TEST_DATABASE_URL = urls.databaseUrl;
  process.env.TEST_E2E_DATABASE_URL = urls.e2eDatabaseUrl;
  return async () => {
    const current = store[KEY];
    if (!current) return;
    current.refs -= 1;
    if (current.refs > 0) return;
    store[KEY] = undefined;
    await finish(await current.ready);
  };
}
