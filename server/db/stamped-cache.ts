// A small in-process cache for answers that are costly to compute and change rarely (forecast
// aggregates over 30,000 roadmap items, the totals of the account and planter lists). Every read is
// checked against a stamp of the tables the answer comes from, so that a new, changed or deleted row
// shows at once:
//
// - The stamp is (row count, highest id, latest updated_at) of each table. updated_at has one-second
//   resolution, so two changes inside the same second could leave it unchanged: answers are cached
//   only once the latest change is more than SETTLE_SECONDS old by the database clock, and every
//   entry expires after the TTL whatever happens (which also bounds staleness for changes the stamp
//   cannot see: a row of another table the answer joins, raw SQL writes).
// - Counting rows for the stamp costs a few milliseconds on a large table, more than a cached answer.
//   So one stamp read serves every request of the next STAMP_REUSE_MS, and any write through this
//   instance's models to the watched tables drops it at once (again after its transaction commits).
//   A change made through another instance shows within that quarter second.
import { QueryTypes, type ModelStatic, type Model, type Sequelize, type Transaction } from 'sequelize';

const SETTLE_SECONDS = 2;
const STAMP_REUSE_MS = 250;

type Stamp = { stamp: string; settled: boolean };
interface Entry {
  stamp: string;
  atMs: number;
  value: Promise<unknown>;
}

export interface StampedCache {
  /** `compute()`, unless a settled entry for `key` with the same table stamp is younger than the TTL. */
  get<T>(sequelize: Sequelize, key: string, compute: () => Promise<T>): Promise<T>;
  /** Hooks the watched models (call after the models are initialised: that resets their hooks). */
  watch(): void;
  /** Forgets the remembered stamp: the next read looks at the tables again. */
  forgetStamp(): void;
  /** Sets the TTL (0 turns the cache off) and empties it. */
  configure(options: { ttlMs: number }): void;
}

const WRITE_HOOKS = ['afterCreate', 'afterBulkCreate', 'afterUpdate', 'afterBulkUpdate', 'afterDestroy', 'afterBulkDestroy', 'afterUpsert', 'afterSave'] as const;

export function stampedCache(options: { name: string; tables: string[]; watch: () => ModelStatic<Model>[]; ttlMs: number; maxEntries?: number }): StampedCache {
  let ttlMs = options.ttlMs;
  const maxEntries = options.maxEntries ?? 500;
  const entries = new Map<string, Entry>();
  let recentStamp: { atMs: number; value: Promise<Stamp> } | null = null;
  const stampSql =
    'SELECT ' +
    options.tables
      .map(
        (t, i) =>
          `(SELECT COUNT(*) FROM ${t}) AS n${i}, (SELECT MAX(id) FROM ${t}) AS id${i}, ` +
          `(SELECT DATE_FORMAT(MAX(updated_at), '%Y-%m-%d %H:%i:%s') FROM ${t}) AS at${i}, ` +
          `(SELECT MAX(updated_at) IS NULL OR MAX(updated_at) < UTC_TIMESTAMP() - INTERVAL ${SETTLE_SECONDS} SECOND FROM ${t}) AS settled${i}`,
      )
      .join(', ');

  async function readStamp(sequelize: Sequelize): Promise<Stamp> {
    const [row] = await sequelize.query<Record<string, string | number | null>>(stampSql, { type: QueryTypes.SELECT });
    const parts = options.tables.map((_t, i) => `${row[`n${i}`]}/${row[`id${i}`] ?? 0}/${row[`at${i}`] ?? ''}`);
    return { stamp: parts.join('|'), settled: options.tables.every((_t, i) => Boolean(Number(row[`settled${i}`]))) };
  }

  function stamp(sequelize: Sequelize): Promise<Stamp> {
    const nowMs = Date.now();
    if (recentStamp && nowMs - recentStamp.atMs < STAMP_REUSE_MS) return recentStamp.value;
    const entry = { atMs: nowMs, value: readStamp(sequelize) };
    recentStamp = entry;
    entry.value.catch(() => {
      if (recentStamp === entry) recentStamp = null;
    });
    return entry.value;
  }

  const forgetStamp = () => {
    recentStamp = null;
  };

  return {
    forgetStamp,
    configure(next) {
      ttlMs = next.ttlMs;
      entries.clear();
      recentStamp = null;
    },
    watch() {
      const hookName = `stampedCache:${options.name}`;
      const changed = (...args: unknown[]) => {
        forgetStamp();
        const opts = args.find((a): a is { transaction?: Transaction | null } => typeof a === 'object' && a !== null && 'transaction' in a);
        opts?.transaction?.afterCommit(() => forgetStamp());
      };
      type Hooked = { addHook: (h: string, name: string, fn: (...a: unknown[]) => void) => void; removeHook: (h: string, name: string) => void };
      for (const model of options.watch() as unknown as Hooked[]) {
        for (const hook of WRITE_HOOKS) {
          model.removeHook(hook, hookName);
          model.addHook(hook, hookName, changed);
        }
      }
    },
    async get<T>(sequelize: Sequelize, key: string, compute: () => Promise<T>): Promise<T> {
      if (ttlMs <= 0) return compute();
      const { stamp: current, settled } = await stamp(sequelize);
      const nowMs = Date.now();
      const hit = entries.get(key);
      if (hit && hit.stamp === current && nowMs - hit.atMs < ttlMs) return hit.value as Promise<T>;
      const value = compute();
      if (!settled) return value;
      const entry: Entry = { stamp: current, atMs: nowMs, value };
      entries.delete(key);
      entries.set(key, entry);
      value.catch(() => {
        if (entries.get(key) === entry) entries.delete(key);
      });
      // Oldest first in a Map's order: drop the oldest entries past the limit.
      while (entries.size > maxEntries) entries.delete(entries.keys().next().value!);
      return value;
    },
  };
}
