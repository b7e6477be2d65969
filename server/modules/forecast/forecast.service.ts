// Revenue forecast, drill-down and CSV export. Callers: admin, manager (their territories) and
// specialist (their own items); the router turns growers away before anything here runs.
import type { Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { StageProbabilities } from '../../../shared/calc/forecast-reference.js';
import {
  forecastStages,
  type ForecastExportQuery,
  type ForecastFigures,
  type ForecastGroupBy,
  type ForecastItem,
  type ForecastItemsQuery,
  type ForecastQuery,
  type ForecastResult,
  type ForecastRow,
} from '../../../shared/schemas/forecast.js';
import { getSettings, SETTING_DEFAULTS } from '../settings/settings.service.js';
import { cachedAggregate } from './forecast-cache.js';
import { itemScope, type ItemScope } from './forecast-scope.js';
import { aggregate, listItems, type GroupFigures, type ItemFilters } from './forecast.repository.js';
import { toCsv } from './csv.js';

export const cents = (usd: number) => Math.round((usd + Number.EPSILON) * 100) / 100;

/** Stage probabilities from the settings; a stored value that is not a number from 0 to 1 falls back to the default. */
export async function stageProbabilities(): Promise<StageProbabilities> {
  const stored = (await getSettings()).stageProbabilities as Partial<Record<string, unknown>> | undefined;
  const out = { ...SETTING_DEFAULTS.stageProbabilities } as StageProbabilities;
  for (const stage of forecastStages) {
    const v = stored?.[stage];
    if (typeof v === 'number' && Number.isFinite(v) && v >= 0 && v <= 1) out[stage] = v;
  }
  out.declined = 0;
  return out;
}

/** The SQL aggregate, through the cache (see forecast-cache.ts for when it is fresh). */
export async function groupFigures(sequelize: Sequelize, groupBy: ForecastGroupBy, scope: ItemScope, filters: ItemFilters): Promise<GroupFigures[]> {
  const probabilities = await stageProbabilities();
  const key = JSON.stringify([groupBy, scope, filters, probabilities]);
  return cachedAggregate(sequelize, key, () => aggregate(sequelize, groupBy, scope, filters, probabilities));
}

function filtersOf(q: ForecastQuery): ItemFilters {
  return { fromMonth: q.from, toMonth: q.to, season: q.season, category: q.category };
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
const STAGE_ORDER = new Map<string, number>(forecastStages.map((s, i) => [s, i]));
const TIME_GROUPS = new Set<ForecastGroupBy>(['season', 'month', 'quarter']);

/** A readable name for a group key (time keys are formatted; named records carry their name). */
export function groupLabel(groupBy: ForecastGroupBy, key: string, name: string | null): string {
  switch (groupBy) {
    case 'season':
      return `${key} season`;
    case 'month':
      return `${MONTHS[Number(key.slice(5, 7)) - 1]} ${key.slice(0, 4)}`;
    case 'quarter':
      return `${key.slice(5)} ${key.slice(0, 4)}`;
    case 'specialist':
      return key === 'none' ? 'No specialist' : (name ?? `Specialist ${key}`);
    case 'territory':
      return name ?? `Territory ${key}`;
    case 'account':
      return name ?? `Account ${key}`;
    case 'category':
    case 'stage':
      return key.charAt(0).toUpperCase() + key.slice(1).replace(/-/g, ' ');
  }
}

function toRows(groupBy: ForecastGroupBy, groups: GroupFigures[]): { rows: ForecastRow[]; totals: ForecastFigures } {
  const totals = { pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 0 };
  const rows = groups.map((g) => {
    totals.pipelineUsd += g.pipelineUsd;
    totals.weightedUsd += g.weightedUsd;
    totals.actualUsd += g.actualUsd;
    totals.itemCount += g.itemCount;
    const key = g.key === null ? 'none' : String(g.key);
    return {
      key,
      label: groupLabel(groupBy, key, g.name),
      pipelineUsd: cents(g.pipelineUsd),
      weightedUsd: cents(g.weightedUsd),
      actualUsd: cents(g.actualUsd),
      itemCount: g.itemCount,
    };
  });
  // Time runs left to right; stages in pipeline order; everything else largest expected revenue first.
  if (TIME_GROUPS.has(groupBy)) rows.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  else if (groupBy === 'stage') rows.sort((a, b) => (STAGE_ORDER.get(a.key) ?? 99) - (STAGE_ORDER.get(b.key) ?? 99));
  else rows.sort((a, b) => b.weightedUsd - a.weightedUsd || b.pipelineUsd - a.pipelineUsd || a.label.localeCompare(b.label));
  // Totals add the unrounded group sums, so a total may differ by a cent from the sum of rounded rows.
  return { rows, totals: { pipelineUsd: cents(totals.pipelineUsd), weightedUsd: cents(totals.weightedUsd), actualUsd: cents(totals.actualUsd), itemCount: totals.itemCount } };
}

/** GET /api/forecast — one row per group with pipeline, weighted and actual revenue. */
export async function forecast(sequelize: Sequelize, user: SessionUser, q: ForecastQuery): Promise<ForecastResult> {
  const scope = itemScope(user, q);
  const groups = await groupFigures(sequelize, q.groupBy, scope, filtersOf(q));
  return { groupBy: q.groupBy, ...toRows(q.groupBy, groups) };
}

/** GET /api/forecast/items — the items behind one bar or cell (`key` of the grouping), a page at a time. */
export async function forecastItems(sequelize: Sequelize, user: SessionUser, q: ForecastItemsQuery) {
  const scope = itemScope(user, q);
  const key = q.key === undefined ? undefined : { groupBy: q.groupBy, key: q.key };
  const { items, total } = await listItems(
    sequelize,
    scope,
    filtersOf(q),
    await stageProbabilities(),
    key,
    { limit: q.pageSize, offset: (q.page - 1) * q.pageSize, sort: q.sort },
    (cacheKey, compute) => cachedAggregate(sequelize, `items-count\u0000${cacheKey}`, compute),
  );
  return { items, total, page: q.page, pageSize: q.pageSize };
}

export const EXPORT_MAX_ITEMS = 50_000;

/** GET /api/forecast/export.csv — the grouped rows with a total line; with `key`, the items behind that key. */
export async function forecastCsv(sequelize: Sequelize, user: SessionUser, q: ForecastExportQuery): Promise<{ filename: string; csv: string }> {
  const stamp = `${q.groupBy}${q.season ? `-${q.season}` : ''}${q.key ? `-${q.key}` : ''}`.replace(/[^A-Za-z0-9-]/g, '_');
  if (q.key === undefined) {
    const result = await forecast(sequelize, user, q);
    const lines: (string | number)[][] = [[q.groupBy, 'label', 'pipeline_usd', 'weighted_usd', 'actual_usd', 'item_count']];
    for (const r of result.rows) lines.push([r.key, r.label, r.pipelineUsd.toFixed(2), r.weightedUsd.toFixed(2), r.actualUsd.toFixed(2), r.itemCount]);
    const t = result.totals;
    lines.push(['total', 'Total', t.pipelineUsd.toFixed(2), t.weightedUsd.toFixed(2), t.actualUsd.toFixed(2), t.itemCount]);
    return { filename: `forecast-${stamp}.csv`, csv: toCsv(lines) };
  }
  const { items } = await listItems(sequelize, itemScope(user, q), filtersOf(q), await stageProbabilities(), { groupBy: q.groupBy, key: q.key }, {
    limit: EXPORT_MAX_ITEMS,
    offset: 0,
    sort: '-weightedUsd',
  });
  const header = ['item_id', 'account', 'territory', 'planter', 'component', 'category', 'season', 'month', 'install_week', 'stage', 'probability', 'quantity', 'parts_usd', 'labour_usd', 'labour_hours', 'total_usd', 'weighted_usd', 'specialist', 'locked'];
  const lines: (string | number)[][] = [header, ...items.map(itemLine)];
  return { filename: `forecast-items-${stamp}.csv`, csv: toCsv(lines) };
}

function itemLine(i: ForecastItem): (string | number)[] {
  return [
    i.id,
    i.accountName,
    i.territoryName ?? '',
    i.planterName ?? '',
    i.componentName,
    i.category,
    i.season,
    i.month,
    i.installWeek ?? '',
    i.stage,
    i.probability,
    i.quantity,
    i.partsUsd.toFixed(2),
    i.labourUsd.toFixed(2),
    i.labourHours,
    i.totalUsd.toFixed(2),
    i.weightedUsd.toFixed(2),
    i.specialistName ?? '',
    i.locked ? 'yes' : 'no',
  ];
}
