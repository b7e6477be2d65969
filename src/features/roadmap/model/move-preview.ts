import type { MoveEvaluation, RoadmapItem, RoadmapSeason } from '../api/types';
import { formatUsd } from './format';

/*
 * The words of the move confirmation ("Moving … to 2027 throws away $1,240: …"), from the
 * server's what-if answer. The server measures the waste change against the roadmap as it stands;
 * when that roadmap is itself broken its waste cannot be valued (the server counts it as $0), so a
 * move that repairs it is said as a repair with the total waste, not as "throws away more".
 */

export type MoveVerdict = 'breaks' | 'wastes' | 'late' | 'saves' | 'repairs' | 'neutral';

export interface MovePreview {
  verdict: MoveVerdict;
  headline: string;
  /** The reasons, one sentence each, to list under the headline. */
  warnings: string[];
  /** True when confirming would leave the roadmap worse (the confirm button says so). */
  harmful: boolean;
}

export interface MovePreviewInput {
  partName: string;
  toSeason: number;
  /** Whether the roadmap as it stands is a working order. */
  currentFeasible: boolean;
  evaluation: MoveEvaluation;
}

// The server's sentence for added waste; it is measured against a broken roadmap's $0 when repairing.
const ADDED_WASTE = /^This order throws away /;

export function describeMove({ partName, toSeason, currentFeasible, evaluation }: MovePreviewInput): MovePreview {
  const moving = `Moving ${partName} to ${toSeason}`;
  if (!evaluation.feasible) {
    return {
      verdict: 'breaks',
      headline: currentFeasible ? `${moving} breaks the order:` : `${moving} still leaves the order broken:`,
      warnings: evaluation.warnings,
      harmful: true,
    };
  }
  if (!currentFeasible) {
    const warnings = evaluation.warnings.filter((w) => !ADDED_WASTE.test(w));
    const waste = (evaluation.wasteUsd ?? 0) > 0.5 ? ` It throws away ${formatUsd((evaluation.wasteUsd ?? 0))} in all.` : ' Nothing is thrown away.';
    return { verdict: 'repairs', headline: `${moving} makes the order work again.${waste}`, warnings, harmful: false };
  }
  if ((evaluation.wasteDeltaUsd ?? 0) > 0.5) {
    return { verdict: 'wastes', headline: `${moving} throws away ${formatUsd((evaluation.wasteDeltaUsd ?? 0))}:`, warnings: evaluation.warnings, harmful: true };
  }
  if (evaluation.warnings.length > 0) {
    return { verdict: 'late', headline: `${moving} throws nothing more away, but:`, warnings: evaluation.warnings, harmful: true };
  }
  if ((evaluation.wasteDeltaUsd ?? 0) < -0.5) {
    return { verdict: 'saves', headline: `${moving} throws away ${formatUsd(-(evaluation.wasteDeltaUsd ?? 0))} less.`, warnings: [], harmful: false };
  }
  return { verdict: 'neutral', headline: `${moving} changes no waste and no goal.`, warnings: [], harmful: false };
}

/** Keeps only the warnings that still mean something after a saved move (see describeMove). */
export function warningsAfterMove(wasFeasible: boolean, warnings: string[]): string[] {
  return wasFeasible ? warnings : warnings.filter((w) => !ADDED_WASTE.test(w));
}

export interface SeasonSpend {
  season: number;
  beforeUsd: number;
  afterUsd: number;
  budgetUsd: number | null;
}

const cents = (n: number) => Math.round(n * 100) / 100;

/** The two seasons' spend before and after moving an item (declined items cost nothing). */
export function seasonSpendAfterMove(seasons: RoadmapSeason[], item: RoadmapItem, toSeason: number): SeasonSpend[] {
  const cost = item.stage === 'declined' ? 0 : item.costUsd;
  return [item.season, toSeason].map((season) => {
    const s = seasons.find((x) => x.season === season);
    const beforeUsd = s?.costUsd ?? 0;
    const delta = season === item.season ? -cost : season === toSeason ? cost : 0;
    return { season, beforeUsd, afterUsd: cents(beforeUsd + delta), budgetUsd: s?.budgetUsd ?? null };
  });
}
