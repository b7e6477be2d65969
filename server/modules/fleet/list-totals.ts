// The totals of the accounts and planters lists ("1,000 accounts"), cached in-process. Counting a
// search over a large book scans every row; paging through it asks the same count again and again.
// Each total is checked on every request against a stamp of the accounts and planters tables (see
// server/db/stamped-cache.ts), so a new, changed or removed record shows at once.
import { QueryTypes, type Sequelize } from 'sequelize';
import { Account, Planter } from '../../db/models/index.js';
import { stampedCache } from '../../db/stamped-cache.js';

const cache = stampedCache({ name: 'list-totals', tables: ['accounts', 'planters'], watch: () => [Account, Planter], ttlMs: 30_000, maxEntries: 2_000 });

/** Hooks the models whose writes change the totals; called when the routers are built. */
export function watchListTotals() {
  cache.watch();
}

/** Sets the time a total may be served (0 turns the cache off) and empties it. */
export function configureListTotals(options: { ttlMs: number }) {
  cache.configure(options);
}

/** `SELECT COUNT(*) AS total …` with its replacements, answered from the cache when it is fresh. */
export function countRows(sequelize: Sequelize, sql: string, replacements: unknown[]): Promise<number> {
  return cache.get(sequelize, `${sql}\u0000${JSON.stringify(replacements)}`, async () => {
    const [row] = await sequelize.query<{ total: number | bigint }>(sql, { replacements, type: QueryTypes.SELECT });
    return Number(row.total);
  });
}
