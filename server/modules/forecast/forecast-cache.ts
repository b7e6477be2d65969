// A small in-process cache of forecast aggregates. A manager's forecast reads every roadmap item in
// scope (30,000 on the benchmark set), while items change a few times a minute at most; the cache
// answers repeated reads without running the aggregate again, and is checked on every request
// against a stamp of the roadmap_items table, so that a new, changed or deleted item shows at once.
//
// The stamp is (row count, highest id, latest updated_at), read from indexes in about a millisecond.
// updated_at has one-second resolution, so two changes inside the same second could leave the stamp
// unchanged: results are therefore cached only once the latest change is more than SETTLE_SECONDS
// old by the database clock, and every entry expires after the TTL whatever happens (which also
// bounds staleness for changes the stamp cannot see: account moves, renamed parts, raw SQL writes).
//
// Counting 30,000 rows for the stamp costs a few milliseconds of MariaDB per request, more than the
// rest of a cached answer. So one stamp read serves every request of the next STAMP_REUSE_MS, and
// any write through this instance's models to the tables the figures come from drops it at once
// (after its transaction commits). A change made through another instance shows within that
// quarter second.
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { Account, Component, Planter, RoadmapItem, User } from '../../db/models/index.js';

const SETTLE_SECONDS = 2;
let ttlMs = 30_000;
const MAX_ENTRIES = 500;
const STAMP_REUSE_MS = 250;

interface Entry {
  stamp: string;
  atMs: number;
  value: Promise<unknown>;
}
const entries = new Map<string, Entry>();

/** Sets the time an entry may be served (0 turns the cache off, e.g. for an uncached benchmark run). */
export function configureForecastCache(options: { ttlMs: number }) {
  ttlMs = options.ttlMs;
  entries.clear();
  recentStamp = null;
}

type Stamp = { stamp: string; settled: boolean };
let recentStamp: { atMs: number; value: Promise<Stamp> } | null = null;

/** Forgets the stamp read last, so that the next request reads the table again. */
export function forgetForecastStamp() {
  recentStamp = null;
}

function tableStamp(sequelize: Sequelize): Promise<Stamp> {
  const nowMs = Date.now();
  if (recentStamp && nowMs - recentStamp.atMs < STAMP_REUSE_MS) return recentStamp.value;
  const value = readTableStamp(sequelize);
  const entry = { atMs: nowMs, value };
  recentStamp = entry;
  value.catch(() => {
    if (recentStamp === entry) recentStamp = null;
  });
  return value;
}

/**
 * Drops the remembered stamp whenever this instance writes roadmap items or the records the figures
 * are grouped by (accounts, planters, parts, users), once the write's transaction has committed.
 * Called when the app is built (after the models are initialised, which resets their hooks).
 */
export function watchForecastSources() {
  const changed = (...args: unknown[]) => {
    forgetForecastStamp();
    const options = args.find((a): a is { transaction?: Transaction | null } => typeof a === 'object' && a !== null && 'transaction' in a);
    options?.transaction?.afterCommit(() => forgetForecastStamp());
  };
  const hooks = ['afterCreate', 'afterBulkCreate', 'afterUpdate', 'afterBulkUpdate', 'afterDestroy', 'afterBulkDestroy', 'afterUpsert', 'afterSave'] as const;
  type Hooked = { addHook: (h: string, name: string, fn: (...a: unknown[]) => void) => void; removeHook: (h: string, name: string) => void };
  for (const model of [RoadmapItem, Account, Planter, Component, User] as unknown as Hooked[]) {
    for (const hook of hooks) {
      model.removeHook(hook, 'forecastStamp');
      model.addHook(hook, 'forecastStamp', changed);
    }
  }
}

async function readTableStamp(sequelize: Sequelize): Promise<Stamp> {
  const [row] = await sequelize.query<{ n: number; maxId: number | null; changedAt: string | null; settled: number | null }>(
    `SELECT (SELECT COUNT(*) FROM roadmap_items) AS n, (SELECT MAX(id) FROM roadmap_items) AS maxId,
        DATE_FORMAT(t.changed_at, '%Y-%m-%d %H:%i:%s') AS changedAt,
        t.changed_at IS NULL OR t.changed_at < UTC_TIMESTAMP() - INTERVAL ${SETTLE_SECONDS} SECOND AS settled
     FROM (SELECT MAX(updated_at) AS changed_at FROM roadmap_items) t`,
    { type: QueryTypes.SELECT },
  );
  return { stamp: `${row.n}/${row.maxId ?? 0}/${row.changedAt ?? ''}`, settled: Boolean(Number(row.settled)) };
}

/**
 * The value for `key`, computed by `compute` unless a settled entry with the same table stamp is
 * younger than the TTL. Concurrent requests for the same key share one computation.
 */
export async function cachedAggregate<T>(sequelize: Sequelize, key: string, compute: () => Promise<T>): Promise<T> {
  if (ttlMs <= 0) return compute();
  const { stamp, settled } = await tableStamp(sequelize);
  const nowMs = Date.now();
  const hit = entries.get(key);
  if (hit && hit.stamp === stamp && nowMs - hit.atMs < ttlMs) return hit.value as Promise<T>;
  const value = compute();
  if (!settled) return value;
  const entry: Entry = { stamp, atMs: nowMs, value };
  entries.delete(key);
  entries.set(key, entry);
  value.catch(() => {
    if (entries.get(key) === entry) entries.delete(key);
  });
  // Oldest first in a Map's order: drop the oldest entries past the limit.
  while (entries.size > MAX_ENTRIES) entries.delete(entries.keys().next().value!);
  return value;
}
