// SQL for the forecast, its drill-down, quotas and shop capacity. Every figure is aggregated by
// MariaDB with GROUP BY; JavaScript only receives one row per group (or one page of items).
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { ForecastGroupBy, ForecastItem, ForecastStage, MovableItem } from '../../../shared/schemas/forecast.js';
import { forecastStages } from '../../../shared/schemas/forecast.js';
import type { StageProbabilities } from '../../../shared/calc/forecast-reference.js';
import type { ItemScope } from './forecast-scope.js';

export interface ItemFilters {
  fromMonth?: string;
  toMonth?: string;
  season?: number;
  category?: string;
}

/** One drill-down key: the items of one bar or cell of a grouping. */
export interface GroupKey {
  groupBy: ForecastGroupBy;
  key: string;
}

/** Collects WHERE conditions, their replacements and the joins they need. */
class Conditions {
  readonly clauses: string[] = [];
  readonly params: Record<string, unknown> = {};
  accounts = false;
  components = false;
  private n = 0;

  param(value: unknown): string {
    const name = `p${this.n++}`;
    this.params[name] = value;
    return `:${name}`;
  }
  add(clause: string) {
    this.clauses.push(clause);
  }
  get sql(): string {
    return this.clauses.length ? this.clauses.map((c) => `(${c})`).join(' AND ') : '1 = 1';
  }
}

/**
 * The month an item counts in, in SQL: the month of its install week, or, when it has none,
 * April of its season (the last month before planting). Same rule as `itemMonth` in
 * shared/calc/forecast-reference.ts.
 */
const monthSql = (t: string) => `COALESCE(DATE_FORMAT(${t}.install_week, '%Y-%m'), CONCAT(${t}.season, '-04'))`;
/** Calendar quarter of that month; an unscheduled item's April falls in Q2. */
const quarterSql = (t: string) => `COALESCE(CONCAT(YEAR(${t}.install_week), '-Q', QUARTER(${t}.install_week)), CONCAT(${t}.season, '-Q2'))`;
const VALUE_SQL = '(ri.parts_usd + ri.labour_usd)';

/**
 * Probability of an item as a CASE on its stage: declined is 0 (out of the pipeline), otherwise the
 * item's own probability wins over its stage's. The stage figures come from the settings and are
 * validated numbers, written as fixed-point literals so that the sums stay exact DECIMALs.
 */
export function probabilitySql(probabilities: StageProbabilities, alias = 'ri'): string {
  const whens = forecastStages
    .filter((s) => s !== 'declined')
    .map((s) => `WHEN '${s}' THEN ${probabilities[s].toFixed(6)}`)
    .join(' ');
  return `CASE WHEN ${alias}.stage = 'declined' THEN 0 WHEN ${alias}.probability_override IS NOT NULL THEN ${alias}.probability_override ELSE CASE ${alias}.stage ${whens} ELSE 0 END END`;
}

const nextMonth = (month: string) => {
  const [y, m] = month.split('-').map(Number);
  return m === 12 ? `${y + 1}-01` : `${y}-${String(m + 1).padStart(2, '0')}`;
};

/**
 * Items whose month lies in [from, to], written so that the install_week index serves the
 * scheduled items; unscheduled ones count in April, so only their season is compared.
 */
function addMonthRange(c: Conditions, from?: string, to?: string) {
  if (!from && !to) return;
  const scheduled: string[] = ['ri.install_week IS NOT NULL'];
  const unscheduled: string[] = ['ri.install_week IS NULL'];
  if (from) {
    scheduled.push(`ri.install_week >= ${c.param(`${from}-01`)}`);
    const [y, m] = from.split('-').map(Number);
    unscheduled.push(`ri.season >= ${c.param(m <= 4 ? y : y + 1)}`);
  }
  if (to) {
    scheduled.push(`ri.install_week < ${c.param(`${nextMonth(to)}-01`)}`);
    const [y, m] = to.split('-').map(Number);
    unscheduled.push(`ri.season <= ${c.param(m >= 4 ? y : y - 1)}`);
  }
  c.add(`(${scheduled.join(' AND ')}) OR (${unscheduled.join(' AND ')})`);
}

function addScope(c: Conditions, scope: ItemScope) {
  if (scope.territoryIds !== null) {
    c.accounts = true;
    c.add(scope.territoryIds.length ? `a.territory_id IN (${c.param(scope.territoryIds)})` : '1 = 0');
  }
  if (scope.specialistId !== null) c.add(`ri.specialist_id = ${c.param(scope.specialistId)}`);
}

function addFilters(c: Conditions, f: ItemFilters) {
  addMonthRange(c, f.fromMonth, f.toMonth);
  if (f.season !== undefined) c.add(`ri.season = ${c.param(f.season)}`);
  if (f.category !== undefined) {
    c.components = true;
    c.add(`c.category = ${c.param(f.category)}`);
  }
}

function addKey(c: Conditions, { groupBy, key }: GroupKey) {
  switch (groupBy) {
    case 'season':
      return c.add(`ri.season = ${c.param(Number(key))}`);
    case 'month':
      return addMonthRange(c, key, key);
    case 'quarter': {
      const year = key.slice(0, 4);
      const q = Number(key.slice(6));
      return addMonthRange(c, `${year}-${String(q * 3 - 2).padStart(2, '0')}`, `${year}-${String(q * 3).padStart(2, '0')}`);
    }
    case 'territory':
      c.accounts = true;
      return c.add(`a.territory_id = ${c.param(Number(key))}`);
    case 'specialist':
      return c.add(key === 'none' ? 'ri.specialist_id IS NULL' : `ri.specialist_id = ${c.param(Number(key))}`);
    case 'category':
      c.components = true;
      return c.add(`c.category = ${c.param(key)}`);
    case 'account':
      return c.add(`ri.account_id = ${c.param(Number(key))}`);
    case 'stage':
      return c.add(`ri.stage = ${c.param(key)}`);
  }
}

function conditions(scope: ItemScope, filters: ItemFilters, key?: GroupKey): Conditions {
  const c = new Conditions();
  addScope(c, scope);
  addFilters(c, filters);
  if (key) addKey(c, key);
  return c;
}

function joins(c: Conditions, opts: { accounts?: boolean; components?: boolean } = {}): string {
  return [
    c.accounts || opts.accounts ? 'JOIN accounts a ON a.id = ri.account_id' : '',
    c.components || opts.components ? 'JOIN components c ON c.id = ri.component_id' : '',
  ].join(' ');
}

/**
 * How each grouping is computed in two steps. `raw` are plain columns the inner query groups by
 * (with stage and probability override), so MariaDB can stream the groups off a covering index and
 * sum each DECIMAL column once per row; `key` turns them into the group key in the outer query,
 * where the CASE on stage runs once per small group instead of once per item.
 */
const GROUPINGS: Record<ForecastGroupBy, { raw: string[]; key: string; accounts?: boolean; outerJoin?: string; label?: string }> = {
  season: { raw: ['ri.season'], key: 'x.season' },
  month: { raw: ['ri.install_week', 'ri.season'], key: monthSql('x') },
  quarter: { raw: ['ri.install_week', 'ri.season'], key: quarterSql('x') },
  territory: { raw: ['a.territory_id'], key: 'x.territory_id', accounts: true, label: 'LEFT JOIN territories lbl ON lbl.id = g.k' },
  specialist: { raw: ['ri.specialist_id'], key: 'x.specialist_id', label: 'LEFT JOIN users lbl ON lbl.id = g.k' },
  category: { raw: ['ri.component_id'], key: 'xc.category', outerJoin: 'JOIN components xc ON xc.id = x.component_id' },
  account: { raw: ['ri.account_id'], key: 'x.account_id', label: 'LEFT JOIN accounts lbl ON lbl.id = g.k' },
  stage: { raw: [], key: 'x.stage' },
};

export interface GroupFigures {
  key: string | number | null;
  name: string | null;
  pipelineUsd: number;
  weightedUsd: number;
  actualUsd: number;
  itemCount: number;
}

/**
 * A manager whose territories hold every account needs no per-item territory check (the demo
 * manager, or a one-manager dealership): one index probe on accounts saves a join per item.
 */
async function scopeCoversAllAccounts(sequelize: Sequelize, scope: ItemScope, transaction: Transaction): Promise<boolean> {
  if (scope.territoryIds === null) return true;
  if (!scope.territoryIds.length) return false;
  const outside = await sequelize.query('SELECT 1 FROM accounts WHERE territory_id NOT IN (:ids) LIMIT 1', {
    type: QueryTypes.SELECT,
    replacements: { ids: scope.territoryIds },
    transaction,
  });
  return outside.length === 0;
}

/**
 * One row per group: pipeline, weighted and actual sums and the item count, unrounded. The probe
 * and the aggregate share one transaction, so both read the same snapshot of the data.
 */
export async function aggregate(
  sequelize: Sequelize,
  groupBy: ForecastGroupBy,
  scope: ItemScope,
  filters: ItemFilters,
  probabilities: StageProbabilities,
  key?: GroupKey,
): Promise<GroupFigures[]> {
  const g = GROUPINGS[groupBy];
  const probe = !g.accounts && scope.territoryIds !== null && scope.territoryIds.length > 0;
  const run = async (transaction?: Transaction) => {
    const covered = probe && (await scopeCoversAllAccounts(sequelize, scope, transaction!));
    const c = conditions(covered ? { ...scope, territoryIds: null } : scope, filters, key);
    const raw = [...g.raw, 'ri.stage', 'ri.probability_override'];
    const inner = `
      SELECT ${raw.join(', ')}, SUM(ri.parts_usd) AS parts_usd, SUM(ri.labour_usd) AS labour_usd, COUNT(*) AS n
      FROM roadmap_items ri ${joins(c, { accounts: g.accounts })}
      WHERE ${c.sql}
      GROUP BY ${raw.join(', ')}`;
    const value = '(x.parts_usd + x.labour_usd)';
    const sql = `
      SELECT g.k AS \`key\`, ${g.label ? 'lbl.name' : 'NULL'} AS name, g.pipelineUsd, g.weightedUsd, g.actualUsd, g.itemCount
      FROM (
        SELECT ${g.key} AS k,
          SUM(CASE WHEN x.stage <> 'declined' THEN ${value} ELSE 0 END) AS pipelineUsd,
          SUM(${value} * (${probabilitySql(probabilities, 'x')})) AS weightedUsd,
          SUM(CASE WHEN x.stage = 'installed' THEN ${value} ELSE 0 END) AS actualUsd,
          SUM(x.n) AS itemCount
        FROM (${inner}) x ${g.outerJoin ?? ''}
        GROUP BY k
      ) g ${g.label ?? ''}`;
    return sequelize.query<GroupFigures>(sql, { type: QueryTypes.SELECT, replacements: c.params, transaction });
  };
  const rows = probe ? await sequelize.transaction((t) => run(t)) : await run();
  return rows.map((r) => ({
    key: r.key,
    name: r.name,
    pipelineUsd: Number(r.pipelineUsd),
    weightedUsd: Number(r.weightedUsd),
    actualUsd: Number(r.actualUsd),
    itemCount: Number(r.itemCount),
  }));
}

/** Each sort of the drill-down list as one expression over the item (and its account for `account`), with its direction. */
function itemSort(sort: string, probability: string): { expr: string; dir: 'ASC' | 'DESC'; accounts?: boolean } {
  switch (sort) {
    case 'weightedUsd':
      return { expr: `${VALUE_SQL} * (${probability})`, dir: 'ASC' };
    case '-totalUsd':
      return { expr: VALUE_SQL, dir: 'DESC' };
    case 'totalUsd':
      return { expr: VALUE_SQL, dir: 'ASC' };
    case 'month':
      return { expr: monthSql('ri'), dir: 'ASC' };
    case '-month':
      return { expr: monthSql('ri'), dir: 'DESC' };
    case 'account':
      return { expr: 'a.name', dir: 'ASC', accounts: true };
    case 'stage':
      return { expr: `FIELD(ri.stage, ${forecastStages.map((st) => `'${st}'`).join(', ')})`, dir: 'ASC' };
    case '-labourHours':
      return { expr: 'ri.labour_hours', dir: 'DESC' };
    case 'labourHours':
      return { expr: 'ri.labour_hours', dir: 'ASC' };
    default:
      return { expr: `${VALUE_SQL} * (${probability})`, dir: 'DESC' };
  }
}

type ItemRow = Omit<ForecastItem, 'locked'> & { locked: number | boolean };

/**
 * One page of the items behind a bar or cell. The page's ids are found first on the item rows alone
 * (sorted by one computed key), and only those 25 rows are then joined to their account, territory,
 * planter, part and specialist: sorting 30,000 wide joined rows took over a second. The total is
 * counted through the forecast cache (`countItems`), as the aggregates are.
 */
export async function listItems(
  sequelize: Sequelize,
  scope: ItemScope,
  filters: ItemFilters,
  probabilities: StageProbabilities,
  key: GroupKey | undefined,
  page: { limit: number; offset: number; sort: string },
  countItems: (cacheKey: string, compute: () => Promise<number>) => Promise<number> = (_key, compute) => compute(),
): Promise<{ items: ForecastItem[]; total: number }> {
  const c = conditions(scope, filters, key);
  const probability = probabilitySql(probabilities);
  const countSql = `SELECT COUNT(*) AS total FROM roadmap_items ri ${joins(c)} WHERE ${c.sql}`;
  const countParams = { ...c.params };
  const total = await countItems(`${countSql}\u0000${JSON.stringify(countParams)}`, async () => {
    const [row] = await sequelize.query<{ total: number }>(countSql, { type: QueryTypes.SELECT, replacements: countParams });
    return Number(row.total);
  });
  if (!total) return { items: [], total: 0 };
  const sort = itemSort(page.sort, probability);
  const rows = await sequelize.query<ItemRow>(
    `SELECT ri.id, ri.account_id AS accountId, a.name AS accountName, a.territory_id AS territoryId, t.name AS territoryName,
        ri.planter_id AS planterId, p.name AS planterName, ri.component_id AS componentId, c.name AS componentName, c.category,
        ri.season, ${monthSql('ri')} AS month, DATE_FORMAT(ri.install_week, '%Y-%m-%d') AS installWeek, ri.stage,
        (${probability}) AS probability, ri.quantity, ri.parts_usd AS partsUsd, ri.labour_usd AS labourUsd,
        ri.labour_hours AS labourHours, ${VALUE_SQL} AS totalUsd, ${VALUE_SQL} * (${probability}) AS weightedUsd,
        ri.specialist_id AS specialistId, u.name AS specialistName, ri.locked
     FROM (SELECT ri.id, ${sort.expr} AS sort_key FROM roadmap_items ri ${joins(c, { accounts: sort.accounts })} WHERE ${c.sql}
           ORDER BY sort_key ${sort.dir}, ri.id ASC LIMIT ${c.param(page.limit)} OFFSET ${c.param(page.offset)}) page
       JOIN roadmap_items ri ON ri.id = page.id
       JOIN accounts a ON a.id = ri.account_id
       JOIN components c ON c.id = ri.component_id
       LEFT JOIN territories t ON t.id = a.territory_id
       LEFT JOIN planters p ON p.id = ri.planter_id
       LEFT JOIN users u ON u.id = ri.specialist_id
     ORDER BY page.sort_key ${sort.dir}, ri.id ASC`,
    { type: QueryTypes.SELECT, replacements: c.params },
  );
  return { items: rows.map(toItem), total };
}

const cents = (usd: number) => Math.round((Number(usd) + Number.EPSILON) * 100) / 100;

function toItem(r: ItemRow): ForecastItem {
  return {
    id: Number(r.id),
    accountId: Number(r.accountId),
    accountName: r.accountName,
    territoryId: Number(r.territoryId),
    territoryName: r.territoryName,
    planterId: Number(r.planterId),
    planterName: r.planterName,
    componentId: Number(r.componentId),
    componentName: r.componentName,
    category: r.category,
    season: Number(r.season),
    month: r.month,
    installWeek: r.installWeek,
    stage: r.stage as ForecastStage,
    probability: Number(r.probability),
    quantity: Number(r.quantity),
    partsUsd: cents(r.partsUsd),
    labourUsd: cents(r.labourUsd),
    labourHours: Number(r.labourHours),
    totalUsd: cents(r.totalUsd),
    weightedUsd: cents(r.weightedUsd),
    specialistId: r.specialistId === null ? null : Number(r.specialistId),
    specialistName: r.specialistName,
    locked: Boolean(r.locked),
  };
}

// ---- quotas ----

export interface StoredQuota {
  territoryId: number;
  territoryName: string;
  quotaUsd: number | null;
  updatedAt: string | null;
}

/** Territories in scope (null = all) with their quota for the season, if any, sorted by name. */
export async function quotasForSeason(sequelize: Sequelize, season: number, territoryIds: number[] | null): Promise<StoredQuota[]> {
  if (territoryIds !== null && territoryIds.length === 0) return [];
  const rows = await sequelize.query<{ territoryId: number; territoryName: string; quotaUsd: number | null; updatedAt: Date | null }>(
    `SELECT t.id AS territoryId, t.name AS territoryName, q.quota_usd AS quotaUsd, q.updated_at AS updatedAt
     FROM territories t LEFT JOIN quotas q ON q.territory_id = t.id AND q.season = :season
     ${territoryIds ? 'WHERE t.id IN (:territoryIds)' : ''}
     ORDER BY t.name ASC, t.id ASC`,
    { type: QueryTypes.SELECT, replacements: { season, territoryIds } },
  );
  return rows.map((r) => ({
    territoryId: Number(r.territoryId),
    territoryName: r.territoryName,
    quotaUsd: r.quotaUsd === null ? null : Number(r.quotaUsd),
    updatedAt: r.updatedAt ? new Date(r.updatedAt).toISOString() : null,
  }));
}

export async function upsertQuota(sequelize: Sequelize, q: { territoryId: number; season: number; quotaUsd: number; userId: number }, transaction?: Transaction) {
  await sequelize.query(
    `INSERT INTO quotas (territory_id, season, quota_usd, updated_by, created_at, updated_at)
     VALUES (:territoryId, :season, :quotaUsd, :userId, UTC_TIMESTAMP(3), UTC_TIMESTAMP(3))
     ON DUPLICATE KEY UPDATE quota_usd = VALUES(quota_usd), updated_by = VALUES(updated_by), updated_at = VALUES(updated_at)`,
    { replacements: { ...q, quotaUsd: q.quotaUsd.toFixed(2) }, transaction },
  );
}

export async function territoryExists(sequelize: Sequelize, territoryId: number): Promise<boolean> {
  const rows = await sequelize.query('SELECT id FROM territories WHERE id = :territoryId', { type: QueryTypes.SELECT, replacements: { territoryId } });
  return rows.length > 0;
}

// ---- shop capacity ----

/** Technician hours set for weeks starting in [fromMonday, toMonday], by week start. */
export async function storedShopWeeks(sequelize: Sequelize, fromMonday: string, toMonday: string): Promise<Map<string, number>> {
  const rows = await sequelize.query<{ weekStart: string; technicianHours: number }>(
    "SELECT DATE_FORMAT(week_start, '%Y-%m-%d') AS weekStart, technician_hours AS technicianHours FROM shop_weeks WHERE week_start BETWEEN :fromMonday AND :toMonday",
    { type: QueryTypes.SELECT, replacements: { fromMonday, toMonday } },
  );
  return new Map(rows.map((r) => [r.weekStart, Number(r.technicianHours)]));
}

export async function setShopWeek(sequelize: Sequelize, weekStart: string, technicianHours: number | null, userId: number) {
  if (technicianHours === null) {
    await sequelize.query('DELETE FROM shop_weeks WHERE week_start = :weekStart', { replacements: { weekStart } });
    return;
  }
  await sequelize.query(
    `INSERT INTO shop_weeks (week_start, technician_hours, updated_by, created_at, updated_at)
     VALUES (:weekStart, :technicianHours, :userId, UTC_TIMESTAMP(3), UTC_TIMESTAMP(3))
     ON DUPLICATE KEY UPDATE technician_hours = VALUES(technician_hours), updated_by = VALUES(updated_by), updated_at = VALUES(updated_at)`,
    { replacements: { weekStart, technicianHours: technicianHours.toFixed(2), userId } },
  );
}

/** The week an install date falls in, as its Monday (WEEKDAY: Monday = 0). */
const WEEK_SQL = "DATE_FORMAT(DATE_SUB(ri.install_week, INTERVAL WEEKDAY(ri.install_week) DAY), '%Y-%m-%d')";
const BOOKED_STAGES = "ri.stage IN ('accepted', 'ordered')";

export interface BookedWeek {
  weekStart: string;
  bookedHours: number;
  bookedHoursInScope: number;
  itemCountInScope: number;
}

/**
 * Install labour booked per week (accepted and ordered items by install week) for the whole shop,
 * and the part of it the user may see.
 */
export async function bookedWeeks(sequelize: Sequelize, scope: ItemScope, fromMonday: string, toSunday: string): Promise<BookedWeek[]> {
  const c = new Conditions();
  addScope(c, scope);
  const rows = await sequelize.query<BookedWeek>(
    `SELECT ${WEEK_SQL} AS weekStart, SUM(ri.labour_hours) AS bookedHours,
        SUM(CASE WHEN ${c.sql} THEN ri.labour_hours ELSE 0 END) AS bookedHoursInScope,
        SUM(CASE WHEN ${c.sql} THEN 1 ELSE 0 END) AS itemCountInScope
     FROM roadmap_items ri ${c.accounts ? 'JOIN accounts a ON a.id = ri.account_id' : ''}
     WHERE ${BOOKED_STAGES} AND ri.install_week BETWEEN ${c.param(fromMonday)} AND ${c.param(toSunday)}
     GROUP BY weekStart`,
    { type: QueryTypes.SELECT, replacements: c.params },
  );
  return rows.map((r) => ({
    weekStart: r.weekStart,
    bookedHours: Number(r.bookedHours),
    bookedHoursInScope: Number(r.bookedHoursInScope),
    itemCountInScope: Number(r.itemCountInScope),
  }));
}

/** Unlocked booked items the user may see in the given weeks, smallest labour first. */
export async function movableItems(sequelize: Sequelize, scope: ItemScope, weekStarts: string[]): Promise<(MovableItem & { weekStart: string })[]> {
  if (!weekStarts.length) return [];
  const c = new Conditions();
  addScope(c, scope);
  const weeks = weekStarts.map((w) => {
    const end = new Date(Date.parse(`${w}T00:00:00Z`) + 6 * 86_400_000).toISOString().slice(0, 10);
    return `ri.install_week BETWEEN ${c.param(w)} AND ${c.param(end)}`;
  });
  c.add(weeks.join(' OR '));
  const rows = await sequelize.query<MovableItem & { weekStart: string }>(
    `SELECT ri.id, ri.account_id AS accountId, a.name AS accountName, cp.name AS componentName, cp.category, ri.stage,
        DATE_FORMAT(ri.install_week, '%Y-%m-%d') AS installWeek, ${WEEK_SQL} AS weekStart, ri.labour_hours AS labourHours,
        ${VALUE_SQL} AS totalUsd, ri.specialist_id AS specialistId, u.name AS specialistName
     FROM roadmap_items ri JOIN accounts a ON a.id = ri.account_id JOIN components cp ON cp.id = ri.component_id
       LEFT JOIN users u ON u.id = ri.specialist_id
     WHERE ${BOOKED_STAGES} AND ri.locked = 0 AND ${c.sql}
     ORDER BY ri.labour_hours ASC, ri.id ASC`,
    { type: QueryTypes.SELECT, replacements: c.params },
  );
  return rows.map((r) => ({
    id: Number(r.id),
    accountId: Number(r.accountId),
    accountName: r.accountName,
    componentName: r.componentName,
    category: r.category,
    stage: r.stage,
    installWeek: r.installWeek,
    weekStart: r.weekStart,
    labourHours: Number(r.labourHours),
    totalUsd: cents(r.totalUsd),
    specialistId: r.specialistId === null ? null : Number(r.specialistId),
    specialistName: r.specialistName,
  }));
}
