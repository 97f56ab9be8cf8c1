/**
 * `npm run backup [-- --out <folder>] [--no-objects]`: the database and the capture storage in one
 * dated archive (default folder `.data/backups`). `--no-objects` (for an S3 bucket the shop backs up
 * itself) writes the database and a manifest of object keys with their SHA-256 instead of the
 * objects. Safe while the app runs (the dump is one consistent snapshot). Exit 0 with the archive's
 * path, 1 on failure with the reason.
 */
import { join } from 'node:path';
import { parseArgs } from 'node:util';
import { parseEnv } from '../server/env';
import { createBackup } from '../server/ops/backup';
import { projectRoot } from '../server/paths';
import { opsConnection } from './ops-connection';

async function main(): Promise<void> {
  const { values } = parseArgs({ options: { out: { type: 'string' }, 'no-objects': { type: 'boolean', default: false } } });
  const env = parseEnv();
  const log = (m: string) => console.log(`backup: ${m}`);
  const conn = await opsConnection(env, log);
  try {
    const { archive, manifest, missing } = await createBackup({
      databaseUrl: conn.databaseUrl, sequelize: conn.sequelize, storage: conn.storage,
      outDir: values.out ?? join(projectRoot(), '.data', 'backups'), includeObjects: !values['no-objects'], log,
    });
    console.log(`backup: wrote ${archive} (${manifest.objects.length} capture object(s)${manifest.objectsIncluded ? '' : ' listed, not copied'}${missing.length ? `, ${missing.length} missing` : ''})`);
  } finally {
    await conn.close();
  }
}

main().catch((error: unknown) => {
  console.error(`backup: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
