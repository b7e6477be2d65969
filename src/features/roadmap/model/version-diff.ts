import type { RoadmapStageName } from '@shared/schemas/roadmap';
import type { RoadmapItem } from '../api/types';

/*
 * Two roadmaps side by side (a saved version and another, or the roadmap now). Re-planning gives
 * proposals new ids, so an item is matched first by id and then by what it is: the same part on
 * the same planter, earliest season with earliest season.
 */

export interface DiffableRoadmap {
  wasteUsd: number;
  /** False when the order does not work: its waste cannot be valued (absent in saved snapshots). */
  feasible?: boolean;
  seasons: { season: number; costUsd: number; budgetUsd?: number | null; items: RoadmapItem[] }[];
}

export interface ItemMove {
  before: RoadmapItem;
  after: RoadmapItem;
}

export interface RoadmapDiff {
  added: RoadmapItem[];
  removed: RoadmapItem[];
  moved: ItemMove[];
  restaged: ItemMove[];
  unchangedCount: number;
  costBeforeUsd: number;
  costAfterUsd: number;
  costDeltaUsd: number;
  wasteBeforeUsd: number | null;
  wasteAfterUsd: number | null;
  /** Null when either side is a broken order, whose waste is not valued. */
  wasteDeltaUsd: number | null;
  seasons: { season: number; costBeforeUsd: number; costAfterUsd: number }[];
}

const cents = (n: number) => Math.round(n * 100) / 100;
const itemsOf = (r: DiffableRoadmap) => r.seasons.flatMap((s) => s.items).sort((a, b) => a.season - b.season || a.id - b.id);
const identity = (i: RoadmapItem) => `${i.planterId}:${i.componentId}`;
const counts = (stage: RoadmapStageName) => stage !== 'declined';

export function diffRoadmaps(before: DiffableRoadmap, after: DiffableRoadmap): RoadmapDiff {
  const left = itemsOf(before);
  const right = itemsOf(after);
  const pairs: ItemMove[] = [];
  const rightById = new Map(right.map((i) => [i.id, i]));
  const unmatchedLeft: RoadmapItem[] = [];
  const usedRight = new Set<number>();
  for (const item of left) {
    const same = rightById.get(item.id);
    if (same && identity(same) === identity(item)) {
      pairs.push({ before: item, after: same });
      usedRight.add(same.id);
    } else unmatchedLeft.push(item);
  }
  const removed: RoadmapItem[] = [];
  for (const item of unmatchedLeft) {
    const match = right.find((r) => !usedRight.has(r.id) && identity(r) === identity(item));
    if (match) {
      pairs.push({ before: item, after: match });
      usedRight.add(match.id);
    } else removed.push(item);
  }
  const added = right.filter((r) => !usedRight.has(r.id));
  const moved = pairs.filter((p) => p.before.season !== p.after.season);
  const restaged = pairs.filter((p) => p.before.stage !== p.after.stage);
  const unchangedCount = pairs.filter((p) => p.before.season === p.after.season && p.before.stage === p.after.stage).length;

  const total = (items: RoadmapItem[]) => cents(items.filter((i) => counts(i.stage)).reduce((s, i) => s + i.costUsd, 0));
  const seasonNumbers = [...new Set([...before.seasons, ...after.seasons].map((s) => s.season))].sort((a, b) => a - b);
  const seasonCost = (items: RoadmapItem[], season: number) => total(items.filter((i) => i.season === season));
  const costBeforeUsd = total(left);
  const costAfterUsd = total(right);
  return {
    added,
    removed,
    moved,
    restaged,
    unchangedCount,
    costBeforeUsd,
    costAfterUsd,
    costDeltaUsd: cents(costAfterUsd - costBeforeUsd),
    wasteBeforeUsd: before.feasible === false ? null : before.wasteUsd,
    wasteAfterUsd: after.feasible === false ? null : after.wasteUsd,
    wasteDeltaUsd: before.feasible === false || after.feasible === false ? null : cents(after.wasteUsd - before.wasteUsd),
    seasons: seasonNumbers.map((season) => ({ season, costBeforeUsd: seasonCost(left, season), costAfterUsd: seasonCost(right, season) })),
  };
}
