/**
 * Claiming analysis jobs in MariaDB (issue 15 item 5, STYLE.md §4). A raw
 * `SELECT … FOR UPDATE SKIP LOCKED` (Sequelize 6 drops `skipLocked` on MariaDB without a word), so
 * runners on any number of machines never take the same row; lease times come from the database
 * clock (`NOW(3)`), never a machine's. A claimable job is `queued`, or `running` with an expired
 * lease (its runner died or its worker crashed); one that has already used its three attempts is
 * failed instead of taken.
 */
import { QueryTypes, type Sequelize } from 'sequelize';

/** Attempts a job gets before a crash or an expired lease fails it. */
export const MAX_ATTEMPTS = 3;

/** Claims one job for `holder` with a lease of `leaseMs`; returns its id, or null when none is claimable. */
export async function claimJob(sequelize: Sequelize, holder: string, leaseMs: number): Promise<number | null> {
  for (let guard = 0; guard < 20; guard++) {
    const result = await retryOnDeadlock(() => sequelize.transaction(async (t) => {
      const rows = await sequelize.query<{ id: number; status: string; attempts: number }>(
        `SELECT id, status, attempts FROM analyses
          WHERE status = 'queued' OR (status = 'running' AND leaseExpiresAt < NOW(3))
          ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
        { type: QueryTypes.SELECT, transaction: t },
      );
      const row = rows[0];
      if (!row) return { kind: 'none' as const };
      if (row.status === 'running' && row.attempts >= MAX_ATTEMPTS) {
        await sequelize.query(
          `UPDATE analyses SET status = 'failed', stage = 'done', progress = 100, errorCode = 'worker_crashed',
             errorMessage = :message, leasedBy = NULL, leaseExpiresAt = NULL, finishedAt = NOW(3), updatedAt = NOW(3) WHERE id = :id`,
          {
            replacements: {
              id: row.id,
              message: `The analysis stopped ${MAX_ATTEMPTS} times before finishing (its worker crashed or its runner was stopped); retry it, and if it stops again, send the file to your admin`,
            },
            transaction: t,
          },
        );
        return { kind: 'failed' as const, id: row.id };
      }
      await sequelize.query(
        `UPDATE analyses SET status = 'running', stage = 'fetching', progress = 10, attempts = attempts + 1, leasedBy = :holder,
           leaseExpiresAt = DATE_ADD(NOW(3), INTERVAL :us MICROSECOND), startedAt = NOW(3), updatedAt = NOW(3) WHERE id = :id`,
        { replacements: { holder, us: Math.round(leaseMs * 1000), id: row.id }, transaction: t },
      );
      return { kind: 'claimed' as const, id: row.id };
    }));
    if (result.kind === 'claimed') return result.id;
    if (result.kind === 'none') return null;
  }
  return null;
}

/** Renews the lease while the job runs; false when the lease was lost (another runner took the job). */
export async function renewLease(sequelize: Sequelize, id: number, holder: string, leaseMs: number): Promise<boolean> {
  const result = await sequelize.query(
    `UPDATE analyses SET leaseExpiresAt = DATE_ADD(NOW(3), INTERVAL :us MICROSECOND)
      WHERE id = :id AND leasedBy = :holder AND status = 'running'`,
    { replacements: { id, holder, us: Math.round(leaseMs * 1000) } },
  );
  return affected(result) > 0;
}

/**
 * Number of rows a raw UPDATE changed. Sequelize's mariadb dialect answers a raw query with
 * [okPacket, meta]: the count is the packet's affectedRows (the second element is not it).
 */
export function affected(result: unknown): number {
  const [first, second] = result as [unknown, unknown];
  for (const m of [first, second]) {
    if (typeof m === 'number') return m;
    const n = (m as { affectedRows?: number } | undefined)?.affectedRows;
    if (typeof n === 'number') return n;
  }
  return 0;
}

/**
 * Runs `fn` (a whole transaction) again when MariaDB chose it as a deadlock victim (1213) or a
 * lock wait timed out (1205): both roll the transaction back whole, so running it again is safe.
 */
export async function retryOnDeadlock<T>(fn: () => Promise<T>, tries = 4): Promise<T> {
  for (let i = 1; ; i++) {
    try {
      return await fn();
    } catch (e) {
      const errno = (e as { parent?: { errno?: number }; original?: { errno?: number } }).parent?.errno ?? (e as { original?: { errno?: number } }).original?.errno;
      if (i >= tries || (errno !== 1213 && errno !== 1205)) throw e;
      await new Promise((r) => setTimeout(r, 20 * i + Math.floor(Math.random() * 30)));
    }
  }
}

