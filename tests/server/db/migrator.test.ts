// Every migration runs up, down and up again on an empty scratch database: each `down` undoes its `up`.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import { Sequelize } from 'sequelize';
import { createMigrator } from '../../../server/db/migrator';
import { migrations } from '../../../server/db/migrations';

let sequelize: Sequelize;

beforeAll(async () => {
  // A bare instance: the models stay bound to the shared test database of other files.
  sequelize = new Sequelize(inject('scratchDatabaseUrl'), { dialect: 'mariadb', logging: false, timezone: '+00:00' });
});
afterAll(async () => sequelize.close());

async function tables(): Promise<string[]> {
  const names = (await sequelize.getQueryInterface().showAllTables()) as Array<string | { tableName: string }>;
  return names.map((t) => (typeof t === 'string' ? t : t.tableName)).filter((n) => n !== 'SequelizeMeta').sort();
}

describe('migrations', () => {
  it('are named YYYYMMDDHHmm-verb-noun, unique and in order', () => {
    const names = migrations.map((m) => m.name);
    for (const name of names) expect(name).toMatch(/^\d{12}-[a-z]+(-[a-z0-9]+)+$/);
    expect([...names].sort()).toEqual(names);
    expect(new Set(names).size).toBe(names.length);
  });

  it('run up, all the way down and up again', async () => {
    const migrator = createMigrator(sequelize);
    await migrator.up();
    const created = await tables();
    expect(created).toEqual(expect.arrayContaining(['shops', 'users', 'sessions', 'invites', 'password_resets', 'mail_messages']));
    await migrator.down({ to: 0 });
    expect(await tables()).toEqual([]);
    expect(await migrator.pending()).toHaveLength(migrations.length);
    await migrator.up();
    expect(await tables()).toEqual(created);
  });
});
