// Vitest global set-up for the `server` and `e2e` projects: starts the test MariaDB (port 3308,
// .data/test-db; TEST_DB_PORT / TEST_DB_DATA_DIR override), drops and re-creates the test databases,
// migrates them once and provides their URLs to tests (inject('databaseUrl'), inject('e2eDatabaseUrl')).
// Vitest runs a project's globalSetup once per project, in the same process and one after the
// other, so the work is shared through globalThis: the first call starts and migrates, later calls
// reuse it, and the last teardown stops the server (only if this run started it).
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

interface Shared {
  ready: Promise<{ db: RunningDatabase; urls: { databaseUrl: string; e2eDatabaseUrl: string; scratchDatabaseUrl: string } }>;
  refs: number;
}

const KEY = Symbol.for('crankwise.test-db');
const store = globalThis as unknown as Record<symbol, Shared | undefined>;

async function prepare(): Promise<Shared['ready'] extends Promise<infer T> ? T : never> {
  const port = Number(process.env.TEST_DB_PORT ?? 3308);
  const dataDir = process.env.TEST_DB_DATA_DIR;
  const log = (m: string) => process.stderr.write(`[test-db] ${m}\n`);
  const db = await startDatabase({ name: 'test-db', port, dataDir, database: 'crankwise_test', fresh: true, log });
  const e2e = await startDatabase({ name: 'test-db', port, dataDir, database: 'crankwise_e2e', fresh: true });
  const scratch = await startDatabase({ name: 'test-db', port, dataDir, database: 'crankwise_scratch', fresh: true });
  try {
    for (const url of [db.url, e2e.url]) {
      const sequelize = await createSequelize(url);
      try {
        await migrate(sequelize);
      } finally {
        await sequelize.close();
      }
    }
  } catch (error) {
    // Stop what we started (else the run never exits) and report one readable line: the driver's
    // error object carries the connection config, password included.
    await db.stop();
    const cause = error instanceof Error ? `${error.message}${error.cause instanceof Error ? ` (${error.cause.message})` : ''}` : String(error);
    throw new Error(`test database set-up failed: ${cause.split('\n')[0]}`);
  }
  return { db, urls: { databaseUrl: db.url, e2eDatabaseUrl: e2e.url, scratchDatabaseUrl: scratch.url } };
}

/** Starts (or reuses) the test database and provides its URLs to the project's tests. */
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
    const { db } = await current.ready;
    await db.stop();
  };
}
