// Types of the upgrade-roadmap planner. Seasons are planting years (e.g. 2027). Money is USD.
import type { RemainingValueCoefficients, ValuationMethod } from './depreciation';

export type { RemainingValueCoefficients, ValuationMethod } from './depreciation';

/** What one unit of a part is fitted to: every row unit, every toolbar, or the planter once. */
export type PartUnit = 'row' | 'toolbar' | 'planter';

/** A catalog component. Prices and hours are per unit (per row, per toolbar or per planter). */
export interface CatalogPart {
  id: string;
  category: string;
  name: string;
  unit: PartUnit;
  priceUsd: number;
  labourHours: number;
  expectedLifeYears: number;
  /** Row-unit parts usually move to a new toolbar; some bar-level parts cannot. */
  movesToNewToolbar: boolean;
  ratedMaxSpeedMph?: number;
  hydraulicGpm?: number;
}

/**
 * Rules between parts. Capabilities are free-form words such as 'electric-drive', 'rate-control',
 * 'high-speed-delivery', 'in-furrow-liquid', 'section-control'.
 * - requires: the part works only while the named part (or some part providing the capability) is on the same planter;
 * - conflictsWith: the two parts cannot be on the same planter at once (symmetric);
 * - supersedes: installing `partId` removes `supersededPartId` (its remaining value is wasted);
 * - provides: the part gives the planter a capability while it works;
 * - preparesFor: while `partId` is on the planter, a later install of `laterPartId` saves these amounts per unit.
 */
export type PartRule =
  | { kind: 'requires'; partId: string; requiredPartId: string }
  | { kind: 'requires'; partId: string; requiredCapability: string }
  | { kind: 'conflictsWith'; partId: string; otherPartId: string }
  | { kind: 'supersedes'; partId: string; supersededPartId: string }
  | { kind: 'provides'; partId: string; capability: string }
  | {
      kind: 'preparesFor';
      partId: string;
      laterPartId: string;
      labourHoursSavedPerUnit: number;
      partsUsdSavedPerUnit: number;
    };

export interface PlanterSpec {
  id: string;
  name: string;
  rows: number;
  /** Number of toolbars (quantity of 'toolbar' parts). */
  toolbars: number;
}

/** A part already on a planter. `pricePaidUsd` is for the whole install (all units). */
export interface InstalledPart {
  partId: string;
  planterId: string;
  installedSeason: number;
  pricePaidUsd: number;
}

export interface FleetInput {
  planters: PlanterSpec[];
  installed: InstalledPart[];
}

export type GoalKind =
  | 'planting-speed'
  | 'acres-per-day'
  | 'add-crop'
  | 'in-furrow-starter'
  | 'rates-by-zone'
  | 'fertilizer-capacity'
  | 'replace-toolbar'
  | 'less-labour'
  | 'other';

/**
 * A grower's goal as the planter sees it: these capabilities on this planter from `bySeason` on
 * (and kept to the end of the roadmap). `priority` is a weight: higher matters more.
 */
export interface PlannerGoal {
  id: string;
  kind: GoalKind;
  label: string;
  planterId: string;
  capabilities: string[];
  bySeason: number;
  priority: number;
}

/**
 * A toolbar (or whole planter) the grower will replace at the start of `season`. Parts on it that
 * cannot move to a new toolbar are stranded: removed, their remaining value wasted.
 */
export interface PlannedReplacement {
  season: number;
  planterId: string;
  kind: 'toolbar' | 'planter';
}

/** A part the planner may buy for a planter. Listing a pair twice allows buying it twice (e.g. again after a toolbar replacement). */
export interface PlannerCandidate {
  partId: string;
  planterId: string;
}

export interface PlannerInput {
  fleet: FleetInput;
  goals: PlannerGoal[];
  catalog: CatalogPart[];
  rules: PartRule[];
  /** Spend limit of each season (parts + labour), keyed by planting year. A season not listed has no budget. */
  budgetsUsdBySeason: Record<number, number>;
  firstSeason: number;
  /** 1–10 seasons. */
  horizonSeasons: number;
  replacements: PlannedReplacement[];
  shopRateUsdPerHour: number;
  valuation: ValuationMethod;
  /** For 'remaining-value'; defaults to the row-crop planter coefficients. */
  remainingValueCoefficients?: RemainingValueCoefficients;
  /** Parts the planner may buy; derived from the goals and rules when absent. */
  candidates?: PlannerCandidate[];
  /**
   * Node limit of the exact search on instances too large to be guaranteed exact (default 3,000;
   * with more than 30 candidates the search is skipped unless this is given).
   */
  maxSearchNodes?: number;
}

/** One purchase in a roadmap: a part for a planter in a season. */
export interface RoadmapPurchase {
  season: number;
  partId: string;
  planterId: string;
}

export interface RoadmapItem {
  partId: string;
  partName: string;
  planterId: string;
  unit: PartUnit;
  /** Rows, toolbars, or 1 for a planter-level part. */
  quantity: number;
  partsUsd: number;
  labourUsd: number;
  costUsd: number;
  /** Goals this purchase serves, directly or as a prerequisite or preparation of a part that does. */
  goalIds: string[];
  /** Parts this purchase removes (supersedes). */
  removesPartIds: string[];
  explanation: string;
}

export interface RoadmapSeason {
  season: number;
  budgetUsd: number;
  costUsd: number;
  items: RoadmapItem[];
}

export interface WasteItem {
  partId: string;
  partName: string;
  planterId: string;
  /** Season the part leaves the planter. */
  season: number;
  cause: 'superseded' | 'stranded';
  /** The part that superseded it (cause 'superseded'). */
  byPartId?: string;
  installedSeason: number;
  pricePaidUsd: number;
  remainingValueUsd: number;
  explanation: string;
}

export type GoalStatus = 'met' | 'late' | 'unmet' | 'beyond-horizon';

export interface GoalOutcome {
  goalId: string;
  planterId: string;
  bySeason: number;
  /** First season from which the capabilities stay on the planter to the end of the roadmap; null if not at the end. */
  metSeason: number | null;
  status: GoalStatus;
}

export interface UnmetGoal {
  goalId: string;
  /** 'late' when met after its season, 'unmet' when not met within the roadmap. */
  status: 'late' | 'unmet';
  metSeason: number | null;
  reason: string;
}

export interface CapabilitySnapshot {
  season: number;
  planterId: string;
  /** Capabilities working on the planter at the end of the season, sorted. */
  capabilities: string[];
}

/** The lexicographic objective: more goal priority by deadline, then late, then less waste, then less cost. */
export interface RoadmapObjective {
  goalPriorityMetByDeadline: number;
  goalPriorityMetLate: number;
  wasteUsd: number;
  totalCostUsd: number;
}

export type RuleProblemCode =
  | 'unknown-part'
  | 'self-reference'
  | 'requires-cycle'
  | 'requires-and-conflicts'
  | 'requirements-conflict'
  | 'capability-without-provider'
  | 'supersedes-cycle'
  | 'supersedes-required-part'
  | 'prepares-for-conflicting-part'
  | 'saving-exceeds-part'
  | 'duplicate-rule';

export interface RuleProblem {
  code: RuleProblemCode;
  severity: 'error' | 'warning';
  partIds: string[];
  message: string;
}

export interface SearchReport {
  /**
   * 'exact': branch-and-bound finished (the plan is optimal); 'heuristic': best plan found within the
   * node limit; 'naive' / 'evaluated': a plan given from outside, only evaluated.
   */
  method: 'exact' | 'heuristic' | 'naive' | 'evaluated';
  nodesExplored: number;
  candidateCount: number;
}

export interface RoadmapPlan {
  seasons: RoadmapSeason[];
  wasteUsd: number;
  wasteItems: WasteItem[];
  unmetGoals: UnmetGoal[];
  goalOutcomes: GoalOutcome[];
  capabilityTimeline: CapabilitySnapshot[];
  totalCostUsd: number;
  objective: RoadmapObjective;
  search: SearchReport;
  ruleProblems: RuleProblem[];
}

export type NaiveOrder = 'cheapest-first' | 'as-asked';

export interface StrategyComparison {
  strategy: 'planner' | NaiveOrder;
  wasteUsd: number;
  totalCostUsd: number;
  goalPriorityMetByDeadline: number;
  /** Season each goal is met (null: not met within the roadmap). */
  goalMetSeasons: Record<string, number | null>;
  plan: RoadmapPlan;
}
