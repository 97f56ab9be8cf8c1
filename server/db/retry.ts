// Transactions that lose a lock conflict are run again instead of answering 500.
import type { Sequelize, Transaction } from 'sequelize';

/** MariaDB error numbers of a lock conflict the loser should simply retry (ER_LOCK_DEADLOCK, ER_LOCK_WAIT_TIMEOUT). */
const RETRYABLE_ERRNO = new Set([1213, 1205]);

/** Whether `error` (a Sequelize error wrapping the driver's, or the driver's own) is a deadlock or a lock-wait timeout. */
export function isLockConflict(error: unknown): boolean {
  let e: unknown = error;
  for (let depth = 0; depth < 3 && typeof e === 'object' && e !== null; depth += 1) {
    const errno = (e as { errno?: unknown }).errno;
    if (typeof errno === 'number' && RETRYABLE_ERRNO.has(errno)) return true;
    e = (e as { original?: unknown; parent?: unknown }).original ?? (e as { parent?: unknown }).parent;
  }
  return false;
}

/**
 * Runs `work` in a transaction; when MariaDB ends it as a deadlock victim or after a lock-wait
 * timeout, the whole transaction is rolled back (by MariaDB / Sequelize) and run again, up to
 * `attempts` times in all, after a short randomised pause. Any other error, or the last conflict,
 * is thrown as it is. `work` must therefore be safe to re-run from the start (read, check, write).
 * @param attempts total tries, at least 1 (default 5)
 */
export async function transactionWithRetry<T>(
  sequelize: Sequelize,
  work: (transaction: Transaction) => Promise<T>,
  attempts = 5,
): Promise<T> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await sequelize.transaction(work);
    } catch (error) {
      if (attempt >= attempts || !isLockConflict(error)) throw error;
      await new Promise((resolve) => setTimeout(resolve, 5 + Math.random() * 20 * attempt));
    }
  }
}
