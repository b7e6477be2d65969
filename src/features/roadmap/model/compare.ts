import type { StrategyName, StrategySummary } from '../api/types';

/** Rowpath's words for the orders it compares. */
export const STRATEGY_LABELS: Record<StrategyName, string> = {
  planner: 'Rowpath’s order',
  'cheapest-first': 'Cheapest first',
  'as-asked': 'In the order asked',
};

export const STRATEGY_HINTS: Record<StrategyName, string> = {
  planner: 'Sequenced so nothing bought is thrown away by a later step, within each season’s budget.',
  'cheapest-first': 'Buys the cheapest part that meets each goal, as soon as the budget allows.',
  'as-asked': 'Meets the goals one at a time in the order the grower put them, cheapest part each time.',
};

export interface CompareSummary {
  planner: StrategySummary | null;
  /** The naive order that throws away the most (the one the grower would regret most). */
  worstNaive: StrategySummary | null;
  /** Waste Rowpath's order avoids against that naive order (≥ 0 when Rowpath is better). */
  avoidedUsd: number;
}

export function summariseCompare(compare: StrategySummary[]): CompareSummary {
  const planner = compare.find((c) => c.strategy === 'planner') ?? null;
  const naive = compare.filter((c) => c.strategy !== 'planner').sort((a, b) => b.wasteUsd - a.wasteUsd);
  const worstNaive = naive[0] ?? null;
  const avoidedUsd = planner && worstNaive ? Math.round((worstNaive.wasteUsd - planner.wasteUsd) * 100) / 100 : 0;
  return { planner, worstNaive, avoidedUsd };
}

/** How a goal fares under one order: met on time, late, or not met. */
export function goalFate(metSeason: number | null | undefined, targetSeason: number): 'on-time' | 'late' | 'not-met' {
  if (metSeason === null || metSeason === undefined) return 'not-met';
  return metSeason <= targetSeason ? 'on-time' : 'late';
}
