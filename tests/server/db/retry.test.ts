// transactionWithRetry: a real InnoDB deadlock and a real lock-wait timeout on the test MariaDB are
// retried to completion instead of surfacing as errors (issue 19 item 1). Barriers order the steps,
// so no timing is assumed: each transaction waits for the other to hold its first lock.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Shop } from '../../../server/models';
import { isLockConflict, transactionWithRetry } from '../../../server/db/retry';
import { createTestApp, type TestApp } from '../../helpers/test-app';
import { createTestShop } from '../../helpers/factories';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(async () => t.close());

function barrier(): { wait: Promise<void>; open: () => void } {
  let open!: () => void;
  const wait = new Promise<void>((resolve) => (open = resolve));
  return { wait, open };
}

describe('transactionWithRetry', () => {
  it('reruns the deadlock victim: both transactions finish, three attempts in all (MariaDB errno 1213)', async () => {
    const [s1, s2] = [(await createTestShop()).shop.id, (await createTestShop()).shop.id];
    const firstHeld = barrier();
    const secondHeld = barrier();
    let attempts = 0;
    const lockInOrder = (first: number, then: number, mine: ReturnType<typeof barrier>, theirs: ReturnType<typeof barrier>, name: string) =>
      transactionWithRetry(t.sequelize, async (transaction) => {
        attempts += 1;
        await Shop.findByPk(first, { transaction, lock: transaction.LOCK.UPDATE });
        mine.open();
        await theirs.wait;
        await Shop.update({ name: `${name} ${Date.now()}` }, { where: { id: then }, transaction });
        return name;
      });
    const results = await Promise.all([lockInOrder(s1, s2, firstHeld, secondHeld, 'one'), lockInOrder(s2, s1, secondHeld, firstHeld, 'two')]);
    expect(results).toEqual(['one', 'two']);
    expect(attempts).toBe(3);
  });

  it('reruns after a lock-wait timeout (errno 1205) once the holder lets go', async () => {
    const shopId = (await createTestShop()).shop.id;
    const holderLocked = barrier();
    const release = barrier();
    const holder = t.sequelize.transaction(async (transaction) => {
      await Shop.findByPk(shopId, { transaction, lock: transaction.LOCK.UPDATE });
      holderLocked.open();
      await release.wait;
    });
    await holderLocked.wait;
    let attempts = 0;
    const name = await transactionWithRetry(t.sequelize, async (transaction) => {
      attempts += 1;
      if (attempts === 2) release.open();
      await t.sequelize.query('SET SESSION innodb_lock_wait_timeout = 1', { transaction });
      const shop = await Shop.findByPk(shopId, { transaction, lock: transaction.LOCK.UPDATE });
      return shop!.name;
    });
    await holder;
    expect(attempts).toBe(2);
    expect(typeof name).toBe('string');
  });

  it('does not retry other errors, and gives up after the attempts allowed', async () => {
    let calls = 0;
    await expect(
      transactionWithRetry(t.sequelize, async () => {
        calls += 1;
        throw new Error('not a lock conflict');
      }),
    ).rejects.toThrow('not a lock conflict');
    expect(calls).toBe(1);
    calls = 0;
    const deadlock = Object.assign(new Error('deadlock'), { original: { errno: 1213 } });
    await expect(
      transactionWithRetry(
        t.sequelize,
        async () => {
          calls += 1;
          throw deadlock;
        },
        3,
      ),
    ).rejects.toBe(deadlock);
    expect(calls).toBe(3);
    expect(isLockConflict({ parent: { errno: 1205 } })).toBe(true);
    expect(isLockConflict({ errno: 1062 })).toBe(false);
  });
});
