import { afterAll, describe, expect, it } from 'vitest';
import { buildUser } from '../../test/factories.js';
import { connect, disconnect } from '../db/connection.js';
import { transactionRetry } from '../db/retryable.js';
import { inTransaction } from './db.js';

afterAll(async () => {
  await disconnect();
});

/** A promise and its resolve function. */
function signal(): { reached: Promise<void>; reach: () => void } {
  let reach = () => {};
  const reached = new Promise<void>((resolve) => (reach = resolve));
  return { reached, reach };
}

describe('inTransaction', () => {
  it('runs a transaction MariaDB picked as a deadlock victim again, whole, so both writers land exactly once', async () => {
    const db = await connect();
    const [a, b] = [await buildUser(), await buildUser()];
    const attempts = { first: 0, second: 0 };
    const firstLocked = signal();
    const secondLocked = signal();

    // Each locks one row, waits until the other holds its row, then wants the other's: a
    // real deadlock, which InnoDB ends at once by rolling one transaction back (ER_LOCK_DEADLOCK,
    // the same error a Galera cluster gives a transaction its certification refused).
    const writer = (name: 'first' | 'second', own: number, other: number, mine: ReturnType<typeof signal>, theirs: ReturnType<typeof signal>) =>
      inTransaction(db, async (manager) => {
        attempts[name] += 1;
        await manager.query('UPDATE users SET name = CONCAT(name, ?) WHERE id = ?', [` ${name}`, own]);
        if (attempts[name] === 1) {
          mine.reach();
          await theirs.reached;
        }
        await manager.query('UPDATE users SET name = CONCAT(name, ?) WHERE id = ?', [` ${name}`, other]);
      });

    const outcomes = await Promise.allSettled([
      writer('first', a.id, b.id, firstLocked, secondLocked),
      writer('second', b.id, a.id, secondLocked, firstLocked),
    ]);

    expect(outcomes.map((o) => o.status)).toEqual(['fulfilled', 'fulfilled']);
    // One of them was the victim and ran a second time; the other ran once.
    expect([attempts.first, attempts.second].sort()).toEqual([1, 2]);
    const rows: { id: number; name: string }[] = await db.query('SELECT id, name FROM users WHERE id IN (?, ?) ORDER BY id', [a.id, b.id]);
    // The victim's first attempt was rolled back: each mark is there once, in commit order.
    for (const row of rows) {
      expect(row.name.match(/ first/g)).toHaveLength(1);
      expect(row.name.match(/ second/g)).toHaveLength(1);
    }
  });

  it('gives up after its attempts when every one is refused, and the error reaches the caller', async () => {
    const db = await connect();
    let tries = 0;
    const refused = Object.assign(new Error('Deadlock found when trying to get lock; try restarting transaction'), { code: 'ER_LOCK_DEADLOCK', errno: 1213 });
    await expect(
      inTransaction(db, async () => {
        tries += 1;
        throw refused;
      }),
    ).rejects.toBe(refused);
    expect(tries).toBe(transactionRetry.attempts);
  });
});
