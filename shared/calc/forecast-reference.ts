// A plain-JavaScript computation of the forecast aggregates over an array of roadmap items. The
// server computes the same figures in SQL (GROUP BY); tests compare the two on random data.
import type { ForecastFigures, ForecastGroupBy, ForecastStage } from '../schemas/forecast.js';

export type StageProbabilities = Record<ForecastStage, number>;

export interface ForecastItemInput {
  season: number;
  /** Monday (or any day) of the planned install week, YYYY-MM-DD; null when not scheduled. */
  installWeek: string | null;
  stage: ForecastStage;
  partsUsd: number;
  labourUsd: number;
  probabilityOverride: number | null;
  accountId: number;
  territoryId: number;
  specialistId: number | null;
  category: string;
}

export interface ForecastFilters {
  fromMonth?: string;
  toMonth?: string;
  season?: number;
  territoryIds?: number[];
  specialistId?: number;
  category?: string;
}

export interface ForecastReferenceRow extends ForecastFigures {
  key: string;
}

/**
 * The month an item counts in: the month of its install week, or, when it has none, April of its
 * season (the last month before planting, when unscheduled work has to be done at the latest).
 */
export function itemMonth(installWeek: string | null, season: number): string {
  return installWeek ? installWeek.slice(0, 7) : `${season}-04`;
}

/** Calendar quarter of the item's month, e.g. "2026-Q4" for a November 2026 install. */
export function itemQuarter(installWeek: string | null, season: number): string {
  const month = itemMonth(installWeek, season);
  return `${month.slice(0, 4)}-Q${Math.ceil(Number(month.slice(5, 7)) / 3)}`;
}

/**
 * The chance an item turns into revenue: declined items are out of the pipeline (0); otherwise a
 * probability set on the item wins over its stage's probability from the settings.
 */
export function itemProbability(stage: ForecastStage, probabilityOverride: number | null, probabilities: StageProbabilities): number {
  if (stage === 'declined') return 0;
  if (probabilityOverride !== null) return probabilityOverride;
  return probabilities[stage] ?? 0;
}

export function itemKey(item: ForecastItemInput, groupBy: ForecastGroupBy): string {
  switch (groupBy) {
    case 'season':
      return String(item.season);
    case 'month':
      return itemMonth(item.installWeek, item.season);
    case 'quarter':
      return itemQuarter(item.installWeek, item.season);
    case 'territory':
      return String(item.territoryId);
    case 'specialist':
      return item.specialistId === null ? 'none' : String(item.specialistId);
    case 'category':
      return item.category;
    case 'account':
      return String(item.accountId);
    case 'stage':
      return item.stage;
  }
}

export function matchesFilters(item: ForecastItemInput, f: ForecastFilters): boolean {
  const month = itemMonth(item.installWeek, item.season);
  if (f.fromMonth && month < f.fromMonth) return false;
  if (f.toMonth && month > f.toMonth) return false;
  if (f.season !== undefined && item.season !== f.season) return false;
  if (f.territoryIds && !f.territoryIds.includes(item.territoryId)) return false;
  if (f.specialistId !== undefined && item.specialistId !== f.specialistId) return false;
  if (f.category !== undefined && item.category !== f.category) return false;
  return true;
}

const round2 = (usd: number) => Math.round((usd + Number.EPSILON) * 100) / 100;

/**
 * Pipeline = parts + labour of items not declined; weighted = Σ (parts + labour) × probability;
 * actual = parts + labour of installed items; itemCount counts every matching item, declined too.
 * Rows come sorted by key; money is rounded to the cent at the end only.
 */
export function forecastReference(
  items: ForecastItemInput[],
  groupBy: ForecastGroupBy,
  probabilities: StageProbabilities,
  filters: ForecastFilters = {},
): { rows: ForecastReferenceRow[]; totals: ForecastFigures } {
  const groups = new Map<string, ForecastFigures>();
  const totals: ForecastFigures = { pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 0 };
  for (const item of items) {
    if (!matchesFilters(item, filters)) continue;
    const key = itemKey(item, groupBy);
    const g = groups.get(key) ?? { pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 0 };
    const valueUsd = item.partsUsd + item.labourUsd;
    const pipelineUsd = item.stage === 'declined' ? 0 : valueUsd;
    const weightedUsd = valueUsd * itemProbability(item.stage, item.probabilityOverride, probabilities);
    const actualUsd = item.stage === 'installed' ? valueUsd : 0;
    for (const target of [g, totals]) {
      target.pipelineUsd += pipelineUsd;
      target.weightedUsd += weightedUsd;
      target.actualUsd += actualUsd;
      target.itemCount += 1;
    }
    groups.set(key, g);
  }
  const rounded = (f: ForecastFigures): ForecastFigures => ({
    pipelineUsd: round2(f.pipelineUsd),
    weightedUsd: round2(f.weightedUsd),
    actualUsd: round2(f.actualUsd),
    itemCount: f.itemCount,
  });
  const rows = [...groups.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)).map(([key, f]) => ({ key, ...rounded(f) }));
  return { rows, totals: rounded(totals) };
}
