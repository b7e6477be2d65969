// The forecast's aggregates, cached in-process. A manager's forecast reads every roadmap item in
// scope (30,000 on the benchmark set), while items change a few times a minute at most. Answers are
// checked on every request against a stamp of roadmap_items (see server/db/stamped-cache.ts); writes
// through this instance to items, accounts, planters, parts or users drop the remembered stamp.
import type { Sequelize } from 'sequelize';
import { Account, Component, Planter, RoadmapItem, User } from '../../db/models/index.js';
import { stampedCache } from '../../db/stamped-cache.js';

const cache = stampedCache({ name: 'forecast', tables: ['roadmap_items'], watch: () => [RoadmapItem, Account, Planter, Component, User], ttlMs: 30_000 });

/** Sets the time an entry may be served (0 turns the cache off, e.g. for an uncached benchmark run). */
export function configureForecastCache(options: { ttlMs: number }) {
  cache.configure(options);
}

/** Hooks the models whose writes change the figures; called when the app is built. */
export function watchForecastSources() {
  cache.watch();
}

/** Forgets the stamp read last, so that the next request reads the table again. */
export function forgetForecastStamp() {
  cache.forgetStamp();
}

/** The value for `key`, computed by `compute` unless a fresh cached answer exists. Concurrent requests share one computation. */
export function cachedAggregate<T>(sequelize: Sequelize, key: string, compute: () => Promise<T>): Promise<T> {
  return cache.get(sequelize, key, compute);
}
