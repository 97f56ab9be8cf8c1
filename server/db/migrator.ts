// umzug over Sequelize: the migrations are imported statically (db/migrations/index.ts) so the
// esbuild bundle in dist/node carries them; SequelizeStorage records which have run in SequelizeMeta.
import type { QueryInterface, Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';
import type { Logger } from '../logger';
import { migrations } from './migrations';

/** A migration's up or down step. */
export type MigrationFn = (params: { context: QueryInterface }) => Promise<void>;

/** One migration file: its name (`YYYYMMDDHHmm-verb-noun`), up and down. */
export interface MigrationModule {
  name: string;
  up: MigrationFn;
  down: MigrationFn;
}

/** Builds the umzug migrator over the given Sequelize instance. */
export function createMigrator(sequelize: Sequelize, logger?: Logger) {
  return new Umzug<QueryInterface>({
    migrations: migrations.map((m) => ({ name: m.name, up: m.up, down: m.down })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: logger
      ? {
          info: (e) => logger.debug('migration', e),
          warn: (e) => logger.warn('migration', e),
          error: (e) => logger.error('migration', e),
          debug: (e) => logger.debug('migration', e),
        }
      : undefined,
  });
}

/** Runs every pending migration; returns the names it ran. */
export async function migrate(sequelize: Sequelize, logger?: Logger): Promise<string[]> {
  const done = await createMigrator(sequelize, logger).up();
  return done.map((m) => m.name);
}
