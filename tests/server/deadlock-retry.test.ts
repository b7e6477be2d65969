// When two instances write the same keys at once, InnoDB may roll one back as a deadlock victim
// (errno 1213, "try restarting transaction"). The work is run again instead of failing the job.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createSequelize } from '../../server/db/sequelize.js';
import { isRetryableLockError, retryOnDeadlock } from '../../server/db/retry.js';
import { testApp, uid, type TestApp } from '../helpers/app.js';

let t: TestApp;
let other: Sequelize;
const table = `deadlock_probe_${uid()}`;

beforeAll(async () => {
  t = await testApp();
  other = createSequelize(inject('databaseUrl'));
  await t.sequelize.query(`CREATE TABLE \`${table}\` (id INT PRIMARY KEY, n INT NOT NULL) ENGINE=InnoDB`);
  await t.sequelize.query(`INSERT INTO \`${table}\` VALUES (1, 0), (2, 0)`);
});
afterAll(async () => {
  await t.sequelize.query(`DROP TABLE IF EXISTS \`${table}\``);
  await other.close();
  await t.close();
});

/** Locks row `first`, waits until the other side holds its row, then asks for row `second`. */
async function crossing(db: Sequelize, first: number, second: number, bothHold: Promise<void>, holding: () => void, attempts: number[]) {
  let round = 0;
  return retryOnDeadlock(() =>
    db.transaction(async (transaction) => {
      attempts.push(++round);
      await db.query(`UPDATE \`${table}\` SET n = n + 1 WHERE id = ?`, { replacements: [first], transaction });
      if (round === 1) {
        holding();
        await bothHold;
      }
      await db.query(`UPDATE \`${table}\` SET n = n + 1 WHERE id = ?`, { replacements: [second], transaction });
    }),
  );
}

describe('deadlock retry', () => {
  it('when two transactions take two rows in opposite order, then the victim runs again and both updates land once', async () => {
    let holds = 0;
    let release!: () => void;
    const bothHold = new Promise<void>((resolve) => (release = resolve));
    const holding = () => {
      if (++holds === 2) release();
    };
    const a: number[] = [];
    const b: number[] = [];
    await Promise.all([crossing(t.sequelize, 1, 2, bothHold, holding, a), crossing(other, 2, 1, bothHold, holding, b)]);
    // Exactly one side was the victim and ran a second time.
    expect([a.length, b.length].sort()).toEqual([1, 2]);
    const rows = await t.sequelize.query<{ id: number; n: number }>(`SELECT id, n FROM \`${table}\` ORDER BY id`, { type: QueryTypes.SELECT });
    expect(rows.map((r) => Number(r.n))).toEqual([2, 2]);
  });

  it('when the error is not a lock error, then it is not retried', async () => {
    let runs = 0;
    await expect(
      retryOnDeadlock(async () => {
        runs++;
        await t.sequelize.query('SELECT * FROM no_such_table_here');
      }),
    ).rejects.toThrow(/no_such_table_here/);
    expect(runs).toBe(1);
  });

  it('when the deadlock persists, then it gives up after the attempts allowed and reports it', async () => {
    let runs = 0;
    const victim = Object.assign(new Error('Deadlock found when trying to get lock; try restarting transaction'), { parent: { errno: 1213 } });
    expect(isRetryableLockError(victim)).toBe(true);
    await expect(
      retryOnDeadlock(
        async () => {
          runs++;
          throw victim;
        },
        3,
        1,
      ),
    ).rejects.toBe(victim);
    expect(runs).toBe(3);
  });
});
