/** Where a season's cost stands against the grower's budget for it. */
export type BudgetStatusKind = 'no-budget' | 'within' | 'near' | 'over';

export interface BudgetStatus {
  kind: BudgetStatusKind;
  /** Cost ÷ budget, 0 when there is no budget (a zero budget with any cost is over). */
  usedFraction: number;
  /** Positive when over budget. */
  overByUsd: number;
  /** Positive while there is budget left. */
  leftUsd: number;
}

/** Within 10 % of the budget counts as near: one more part would likely break it (common practice for a planning margin). */
export const NEAR_BUDGET_FRACTION = 0.9;

export function budgetStatus(costUsd: number, budgetUsd: number | null): BudgetStatus {
  if (budgetUsd === null) return { kind: 'no-budget', usedFraction: 0, overByUsd: 0, leftUsd: 0 };
  const cents = (n: number) => Math.round(n * 100) / 100;
  const overByUsd = cents(Math.max(0, costUsd - budgetUsd));
  const leftUsd = cents(Math.max(0, budgetUsd - costUsd));
  const usedFraction = budgetUsd > 0 ? costUsd / budgetUsd : costUsd > 0 ? Infinity : 0;
  const kind: BudgetStatusKind = overByUsd > 0.005 ? 'over' : usedFraction >= NEAR_BUDGET_FRACTION && costUsd > 0 ? 'near' : 'within';
  return { kind, usedFraction, overByUsd, leftUsd };
}
