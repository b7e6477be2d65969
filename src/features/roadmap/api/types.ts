import type { GoalKindName, RoadmapStageName } from '@shared/schemas/roadmap';

/*
 * The roadmap as GET /api/accounts/:id/roadmap answers it (server/modules/roadmap/roadmap.service.ts).
 * Money is USD, seasons are planting years.
 */

export interface RoadmapItem {
  id: number;
  season: number;
  componentId: number;
  partNumber: string | null;
  partName: string;
  category: string | null;
  planterId: number;
  planterName: string | null;
  quantity: number;
  partsUsd: number;
  labourHours: number;
  labourUsd: number;
  costUsd: number;
  stage: RoadmapStageName;
  /** 0–1: the stage's probability from settings, or the item's own override. */
  probability: number;
  locked: boolean;
  goalIds: number[];
  explanation: string;
  installWeek: string | null;
  version: number;
}

export interface RoadmapSeason {
  season: number;
  budgetUsd: number | null;
  /** Parts + labour of the season's items that are not declined. */
  costUsd: number;
  items: RoadmapItem[];
}

export interface WasteItem {
  partId: string;
  partName: string;
  planterId: string;
  season: number;
  cause: 'superseded' | 'stranded';
  byPartId?: string;
  installedSeason: number;
  pricePaidUsd: number;
  remainingValueUsd: number;
  explanation: string;
}

export interface UnmetGoal {
  goalId: string;
  status: 'late' | 'unmet';
  metSeason: number | null;
  reason: string;
}

export interface GoalOutcome {
  goalId: string;
  planterId: string;
  bySeason: number;
  metSeason: number | null;
  status: 'met' | 'late' | 'unmet' | 'beyond-horizon';
}

export type StrategyName = 'planner' | 'cheapest-first' | 'as-asked';

export interface StrategySummary {
  strategy: StrategyName;
  wasteUsd: number;
  totalCostUsd: number;
  /** Goal id → the season it is met (null: not within the roadmap). */
  goalMetSeasons: Record<string, number | null>;
  wasteItems: WasteItem[];
  seasons: { season: number; costUsd: number; items: { partId: string; partName: string; planterId: string; costUsd: number }[] }[];
}

export interface RoadmapGoal {
  id: number;
  kind: GoalKindName;
  label: string;
  planterId: number | null;
  targetSeason: number;
  priority: number;
  capabilities: string[];
  targetValue: number | null;
  notes: string | null;
  version: number;
}

export interface RoadmapReplacement {
  id: number;
  planterId: number;
  season: number;
  kind: 'toolbar' | 'planter';
  notes: string | null;
}

export interface Roadmap {
  accountId: number | null;
  firstSeason: number;
  horizonSeasons: number;
  shopRateUsdPerHour: number;
  valuation: string;
  seasons: RoadmapSeason[];
  /** False when the stored order does not work (a part before what it needs, a budget exceeded…). */
  feasible: boolean;
  problem: string | null;
  /** Null while the order does not work: waste is only defined for a workable order. */
  wasteUsd: number | null;
  wasteItems: WasteItem[];
  unmetGoals: UnmetGoal[];
  goalOutcomes: GoalOutcome[];
  capabilityTimeline: { season: number; planterId: string; capabilities: string[] }[];
  naive: { strategy: StrategyName; wasteUsd: number; totalCostUsd: number } | null;
  compare: StrategySummary[];
  goals: RoadmapGoal[];
  budgets: { season: number; budgetUsd: number }[];
  replacements: RoadmapReplacement[];
  planters: { id: number; name: string; rows: number }[];
}

/** POST /api/accounts/:id/roadmap/evaluate — a what-if; nothing is saved. */
export interface MoveEvaluation {
  /** Null when the order after the move does not work. */
  wasteUsd: number | null;
  /** Null when either order (before or after) does not work. */
  wasteDeltaUsd: number | null;
  feasible: boolean;
  wasFeasible?: boolean;
  warnings: string[];
}

export interface RoadmapVersionSummary {
  id: number;
  name: string;
  createdAt: string;
  createdBy: string | null;
}

export interface RoadmapSnapshot {
  firstSeason: number;
  wasteUsd: number;
  seasons: { season: number; costUsd: number; budgetUsd: number | null; items: RoadmapItem[] }[];
  unmetGoals: UnmetGoal[];
}

export interface RoadmapVersionDetail {
  id: number;
  accountId: number;
  name: string;
  createdAt: string;
  snapshot: RoadmapSnapshot;
}
