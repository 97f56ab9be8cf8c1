/**
 * `npm run restore -- <archive>`: brings back a backup made by `npm run backup` — the whole
 * database as it was, and the capture objects. Stop the app and its job runners first: the script
 * refuses while the app answers on HOST:PORT. The archive is checked (manifest, every object's
 * SHA-256) before anything is changed.
 */
import { parseArgs } from 'node:util';
import { parseEnv } from '../server/env';
import { restoreBackup } from '../server/ops/backup';
import { opsConnection } from './ops-connection';

async function main(): Promise<void> {
  const { positionals } = parseArgs({ allowPositionals: true, options: {} });
  const archive = positionals[0];
  if (!archive) throw new Error('give the archive to restore: npm run restore -- .data/backups/crankwise-backup-….tar.gz');
  const env = parseEnv();
  const running = await fetch(`http://${env.HOST}:${env.PORT}/api/health`, { signal: AbortSignal.timeout(2000) }).then((r) => r.ok, () => false);
  if (running) throw new Error(`Crankwise is running on http://${env.HOST}:${env.PORT}; stop it (and any npm run jobs) before restoring`);
  const log = (m: string) => console.log(`restore: ${m}`);
  const conn = await opsConnection(env, log);
  try {
    const { manifest, restoredObjects, missing } = await restoreBackup({ archive, databaseUrl: conn.databaseUrl, sequelize: conn.sequelize, storage: conn.storage, log });
    console.log(`restore: database as of ${manifest.createdAt}, ${restoredObjects} object(s) written back${missing.length ? `, ${missing.length} not available` : ''}`);
  } finally {
    await conn.close();
  }
}

main().catch((error: unknown) => {
  console.error(`restore: ${error instanceof Error ? error.message : String(error)}`);
  process.exit(1);
});
