// The database and storage `npm run backup` / `npm run restore` work on: DATABASE_URL when set,
// else the project's own MariaDB (started for the run when it is not running, and stopped again).
import { startDatabase, type RunningDatabase } from './db';
import { createSequelize } from '../server/db/sequelize';
import type { Env } from '../server/env';
import { createStorage } from '../server/storage/create-storage';
import type { Sequelize } from 'sequelize';
import type { ObjectStorage } from '../server/storage/storage';

/** What the backup scripts need, and how to let go of it. */
export interface OpsConnection {
  databaseUrl: string;
  sequelize: Sequelize;
  storage: ObjectStorage;
  close(): Promise<void>;
}

/** Connects to the shop's database and capture storage as the server would. */
export async function opsConnection(env: Env, log: (m: string) => void): Promise<OpsConnection> {
  let db: RunningDatabase | null = null;
  let databaseUrl = env.DATABASE_URL;
  if (!databaseUrl) {
    db = await startDatabase({ name: 'dev-db', port: env.DB_PORT, dataDir: env.DB_DATA_DIR, log: (m) => log(`database: ${m}`) });
    databaseUrl = db.url;
  }
  const sequelize = await createSequelize(databaseUrl);
  return {
    databaseUrl,
    sequelize,
    storage: createStorage(env),
    async close() {
      await sequelize.close();
      await db?.stop();
    },
  };
}
