import { describe, expect, it } from 'vitest';
import type { RoadmapItem, RoadmapSeason, StrategySummary } from '@/features/roadmap/api/types';
import { budgetStatus } from '@/features/roadmap/model/budget';
import { goalFate, summariseCompare } from '@/features/roadmap/model/compare';
import { formatProbability, formatUsd, formatUsdChange, formatUsdExact } from '@/features/roadmap/model/format';
import { describeMove, seasonSpendAfterMove, warningsAfterMove } from '@/features/roadmap/model/move-preview';
import { diffRoadmaps } from '@/features/roadmap/model/version-diff';

function item(over: Partial<RoadmapItem> & { id: number; season: number }): RoadmapItem {
  return {
    componentId: 9,
    partNumber: 'KR-SD-500',
    partName: 'Belt seed delivery',
    category: 'seed-delivery',
    planterId: 1,
    planterName: '16-row planter',
    quantity: 16,
    partsUsd: 1000,
    labourHours: 2,
    labourUsd: 250,
    costUsd: 1250,
    stage: 'proposed',
    probability: 0.25,
    locked: false,
    goalIds: [],
    explanation: '',
    installWeek: null,
    version: 0,
    ...over,
  };
}

describe('the words of a move confirmation', () => {
  it('when a move adds waste to a working roadmap, then it says how much it throws away and lists the reasons', () => {
    const preview = describeMove({
      partName: 'Belt seed delivery',
      toSeason: 2027,
      currentFeasible: true,
      evaluation: { feasible: true, wasteUsd: 3088, wasteDeltaUsd: 1240, warnings: ['This order throws away $1,240 more of parts before the end of their life: …'] },
    });
    expect(preview.verdict).toBe('wastes');
    expect(preview.headline).toBe('Moving Belt seed delivery to 2027 throws away $1,240:');
    expect(preview.warnings).toHaveLength(1);
    expect(preview.harmful).toBe(true);
  });

  it('when a move puts a part before what it needs, then it says the order breaks, whatever the waste figure', () => {
    // The server values a broken order's waste at $0, so the delta looks like a saving: it must not read as one.
    const preview = describeMove({
      partName: 'Belt seed delivery',
      toSeason: 2027,
      currentFeasible: true,
      evaluation: { feasible: false, wasteUsd: 0, wasteDeltaUsd: -1848, warnings: ['This roadmap no longer works: Belt seed delivery (2027) would not work.'] },
    });
    expect(preview.verdict).toBe('breaks');
    expect(preview.headline).toBe('Moving Belt seed delivery to 2027 breaks the order:');
    expect(preview.headline).not.toMatch(/less/);
    expect(preview.harmful).toBe(true);
  });

  it('when a move repairs a broken roadmap, then it says so with the total waste and drops the "more waste" sentence measured against $0', () => {
    const preview = describeMove({
      partName: 'Belt seed delivery',
      toSeason: 2029,
      currentFeasible: false,
      evaluation: { feasible: true, wasteUsd: 1848, wasteDeltaUsd: 1848, warnings: ['This order throws away $1,848 more of parts before the end of their life: Removed in 2028…'] },
    });
    expect(preview.verdict).toBe('repairs');
    expect(preview.headline).toBe('Moving Belt seed delivery to 2029 makes the order work again. It throws away $1,848 in all.');
    expect(preview.warnings).toEqual([]);
    expect(preview.harmful).toBe(false);
  });

  it('when a move makes a goal late without adding waste, then it is still harmful and says why', () => {
    const preview = describeMove({
      partName: 'Electric row drive',
      toSeason: 2030,
      currentFeasible: true,
      evaluation: { feasible: true, wasteUsd: 0, wasteDeltaUsd: 0, warnings: ['A goal is no longer met on time: …'] },
    });
    expect(preview.verdict).toBe('late');
    expect(preview.harmful).toBe(true);
  });

  it('when a move removes waste, then it reads as a saving; when it changes nothing, it says that', () => {
    expect(describeMove({ partName: 'X', toSeason: 2028, currentFeasible: true, evaluation: { feasible: true, wasteUsd: 0, wasteDeltaUsd: -2417.33, warnings: [] } }).headline).toBe(
      'Moving X to 2028 throws away $2,417 less.',
    );
    expect(describeMove({ partName: 'X', toSeason: 2028, currentFeasible: true, evaluation: { feasible: true, wasteUsd: 0, wasteDeltaUsd: 0.2, warnings: [] } }).verdict).toBe('neutral');
  });

  it('when a saved move repairs a broken roadmap, then only the waste sentence is dropped from its warnings', () => {
    const warnings = ['This order throws away $1,848 more of parts…', 'A goal is no longer met on time: x'];
    expect(warningsAfterMove(false, warnings)).toEqual(['A goal is no longer met on time: x']);
    expect(warningsAfterMove(true, warnings)).toEqual(warnings);
  });
});

describe('season spend after a move', () => {
  const seasons: RoadmapSeason[] = [
    { season: 2027, budgetUsd: 22000, costUsd: 16665, items: [] },
    { season: 2029, budgetUsd: 20000, costUsd: 16240, items: [] },
  ];

  it('when an item moves, then its cost leaves one season and joins the other', () => {
    const moving = item({ id: 5, season: 2029, costUsd: 16240 });
    expect(seasonSpendAfterMove(seasons, moving, 2027)).toEqual([
      { season: 2029, beforeUsd: 16240, afterUsd: 0, budgetUsd: 20000 },
      { season: 2027, beforeUsd: 16665, afterUsd: 32905, budgetUsd: 22000 },
    ]);
  });

  it('when a declined item moves, then no season’s spend changes (declined items cost nothing)', () => {
    const declined = item({ id: 6, season: 2029, costUsd: 500, stage: 'declined' });
    const spend = seasonSpendAfterMove(seasons, declined, 2027);
    expect(spend.map((s) => s.afterUsd)).toEqual([16240, 16665]);
  });
});

describe('budget status', () => {
  it('when the cost passes the budget, then it is over by the difference', () => {
    expect(budgetStatus(32905, 22000)).toMatchObject({ kind: 'over', overByUsd: 10905, leftUsd: 0 });
  });

  it('when the cost is within 10 % of the budget, then it is near; below, within with what is left', () => {
    expect(budgetStatus(18500, 20000).kind).toBe('near');
    expect(budgetStatus(9520, 12000)).toMatchObject({ kind: 'within', leftUsd: 2480 });
  });

  it('when there is no budget, or a zero budget with spending, then it says so', () => {
    expect(budgetStatus(100, null).kind).toBe('no-budget');
    expect(budgetStatus(100, 0).kind).toBe('over');
    expect(budgetStatus(0, 0).kind).toBe('within');
  });
});

describe('comparing orders', () => {
  const strategy = (name: StrategySummary['strategy'], wasteUsd: number): StrategySummary => ({ strategy: name, wasteUsd, totalCostUsd: 0, goalMetSeasons: {}, wasteItems: [], seasons: [] });

  it('when two naive orders waste different amounts, then the worse one is set against Rowpath’s', () => {
    const s = summariseCompare([strategy('planner', 1848), strategy('cheapest-first', 6104), strategy('as-asked', 4872)]);
    expect(s.worstNaive?.strategy).toBe('cheapest-first');
    expect(s.avoidedUsd).toBe(4256);
  });

  it('when a goal is met after its season or not at all, then it reads late or not met', () => {
    expect(goalFate(2027, 2027)).toBe('on-time');
    expect(goalFate(2030, 2029)).toBe('late');
    expect(goalFate(null, 2029)).toBe('not-met');
    expect(goalFate(undefined, 2029)).toBe('not-met');
  });
});

describe('two versions side by side', () => {
  it('when proposals were re-planned under new ids, then the same part on the same planter counts as moved, not removed and added', () => {
    const before = { wasteUsd: 4880.67, seasons: [{ season: 2027, costUsd: 1250, items: [item({ id: 1, season: 2027 })] }, { season: 2028, costUsd: 0, items: [] }] };
    const after = {
      wasteUsd: 1848,
      seasons: [
        { season: 2027, costUsd: 0, items: [] },
        { season: 2028, costUsd: 2250, items: [item({ id: 11, season: 2028 }), item({ id: 12, season: 2028, componentId: 4, partName: 'Electric row drive', costUsd: 1000 })] },
      ],
    };
    const diff = diffRoadmaps(before, after);
    expect(diff.moved.map((m) => [m.before.id, m.after.id, m.before.season, m.after.season])).toEqual([[1, 11, 2027, 2028]]);
    expect(diff.added.map((i) => i.id)).toEqual([12]);
    expect(diff.removed).toEqual([]);
    expect(diff.costDeltaUsd).toBe(1000);
    expect(diff.wasteDeltaUsd).toBe(-3032.67);
    expect(diff.seasons).toEqual([
      { season: 2027, costBeforeUsd: 1250, costAfterUsd: 0 },
      { season: 2028, costBeforeUsd: 0, costAfterUsd: 2250 },
    ]);
  });

  it('when an item keeps its id but changes stage, then it is re-staged, not moved, and a declined one stops counting in the cost', () => {
    const before = { wasteUsd: 0, seasons: [{ season: 2027, costUsd: 1250, items: [item({ id: 1, season: 2027 })] }] };
    const after = { wasteUsd: 0, seasons: [{ season: 2027, costUsd: 0, items: [item({ id: 1, season: 2027, stage: 'declined' })] }] };
    const diff = diffRoadmaps(before, after);
    expect(diff.moved).toEqual([]);
    expect(diff.restaged).toHaveLength(1);
    expect(diff.costAfterUsd).toBe(0);
  });

  it('when one side is an order that does not work, then its waste is not valued and no waste change is claimed', () => {
    const saved = { wasteUsd: 1848, seasons: [{ season: 2027, costUsd: 1250, items: [item({ id: 1, season: 2029 })] }] };
    const broken = { wasteUsd: 0, feasible: false, seasons: [{ season: 2027, costUsd: 1250, items: [item({ id: 1, season: 2027 })] }] };
    const diff = diffRoadmaps(saved, broken);
    expect(diff.wasteBeforeUsd).toBe(1848);
    expect(diff.wasteAfterUsd).toBeNull();
    expect(diff.wasteDeltaUsd).toBeNull();
    expect(diff.moved).toHaveLength(1);
  });

  it('when a part appears twice and once less later, then one is removed', () => {
    const two = { wasteUsd: 0, seasons: [{ season: 2027, costUsd: 2500, items: [item({ id: 1, season: 2027 }), item({ id: 2, season: 2029 })] }] };
    const one = { wasteUsd: 0, seasons: [{ season: 2027, costUsd: 1250, items: [item({ id: 1, season: 2027 })] }] };
    const diff = diffRoadmaps(two, one);
    expect(diff.removed.map((i) => i.id)).toEqual([2]);
    expect(diff.unchangedCount).toBe(1);
  });
});

describe('money on the roadmap', () => {
  it('when amounts are shown, then summaries round to the dollar and changes carry a sign', () => {
    expect(formatUsd(4880.67)).toBe('$4,881');
    expect(formatUsd(-0.2)).toBe('$0');
    expect(formatUsdExact(4880.67)).toBe('$4,880.67');
    expect(formatUsdExact(16665)).toBe('$16,665');
    expect(formatUsdChange(1240)).toBe('+$1,240');
    expect(formatUsdChange(-1848)).toBe('−$1,848');
    expect(formatUsdChange(0.3)).toBe('$0');
    expect(formatProbability(0.25)).toBe('25%');
  });
});
