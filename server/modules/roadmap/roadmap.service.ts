import type { Sequelize } from 'sequelize';
import { compareWithNaive, evaluateRoadmap, planRoadmap } from '../../../shared/calc/planner.js';
import type { PlannerInput, RoadmapPlan, RoadmapPurchase, StrategyComparison } from '../../../shared/calc/planner-types.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { RoadmapItemPatch, RoadmapStageName } from '../../../shared/schemas/roadmap.js';
import { Account, RoadmapItem, RoadmapVersion, User } from '../../db/models/index.js';
import { AppError, notFound, validationError } from '../../http/errors.js';
import { accountFor, assertVersion, audit, mapLockError } from '../fleet/fleet-access.js';
import { getSettings } from '../settings/settings.service.js';
import { loadAccountPlanningData, type AccountPlanningData } from './planner-input.js';

/** Items the planner must not move when re-planning: locked, quoted to the grower, or committed. */
const FIXED_FOR_PLANNING: RoadmapStageName[] = ['quoted', 'accepted', 'ordered', 'installed'];
const isFixed = (i: RoadmapItem) => i.locked || FIXED_FOR_PLANNING.includes(i.stage as RoadmapStageName);

type Evaluation = { feasible: true; plan: RoadmapPlan } | { feasible: false; season: number; partId: string | null; planterId: string | null; reason: string };

function evaluate(data: AccountPlanningData, purchases: RoadmapPurchase[] = data.storedPurchases): Evaluation | null {
  if (!purchases.length) return null;
  try {
    return evaluateRoadmap(data.input, purchases) as Evaluation;
  } catch (err) {
    return { feasible: false, season: 0, partId: null, planterId: null, reason: (err as Error).message };
  }
}

function itemView(i: RoadmapItem, data: AccountPlanningData, probabilities: Record<string, number>) {
  const c = data.components.get(i.componentId);
  const planter = data.planters.find((p) => p.id === i.planterId);
  return {
    id: i.id,
    season: i.season,
    componentId: i.componentId,
    partNumber: c?.partNumber ?? null,
    partName: c?.name ?? 'Unknown part',
    category: c?.category ?? null,
    planterId: i.planterId,
    planterName: planter?.name ?? null,
    quantity: i.quantity,
    partsUsd: Number(i.partsUsd),
    labourHours: Number(i.labourHours),
    labourUsd: Number(i.labourUsd),
    costUsd: Math.round((Number(i.partsUsd) + Number(i.labourUsd)) * 100) / 100,
    stage: i.stage,
    probability: i.probabilityOverride !== null ? Number(i.probabilityOverride) : probabilities[i.stage] ?? 0,
    locked: i.locked,
    goalIds: i.goalIds,
    explanation: i.explanation,
    installWeek: i.installWeek,
    version: i.version,
  };
}
export type RoadmapItemView = ReturnType<typeof itemView>;

function strategySummary(s: StrategyComparison) {
  return {
    strategy: s.strategy,
    wasteUsd: s.wasteUsd,
    totalCostUsd: s.totalCostUsd,
    goalMetSeasons: s.goalMetSeasons,
    wasteItems: s.plan.wasteItems,
    seasons: s.plan.seasons.map((season) => ({
      season: season.season,
      costUsd: season.costUsd,
      items: season.items.map((it) => ({ partId: it.partId, partName: it.partName, planterId: it.planterId, costUsd: it.costUsd })),
    })),
  };
}

/** Everything the roadmap screen shows, for anyone who may see the account. */
export async function getRoadmap(user: SessionUser, accountId: number) {
  await accountFor(user, accountId, 'read');
  return buildRoadmap(await loadAccountPlanningData(accountId));
}

async function buildRoadmap(data: AccountPlanningData) {
  const settings = await getSettings();
  const evaluation = evaluate(data);
  let compare: ReturnType<typeof strategySummary>[] = [];
  try {
    compare = data.input.goals.length ? compareWithNaive(data.input).map(strategySummary) : [];
  } catch {
    compare = [];
  }
  const first = data.input.firstSeason;
  const seasons = Array.from({ length: data.input.horizonSeasons }, (_, k) => first + k);
  const items = data.items.filter((i) => i.season >= first).map((i) => itemView(i, data, settings.stageProbabilities));
  const naive = compare.find((c) => c.strategy === 'cheapest-first') ?? null;
  return {
    accountId: data.planters[0]?.accountId ?? null,
    firstSeason: first,
    horizonSeasons: data.input.horizonSeasons,
    shopRateUsdPerHour: settings.shopRateUsdPerHour,
    valuation: settings.valuation,
    seasons: seasons.map((season) => {
      const seasonItems = items.filter((i) => i.season === season);
      return {
        season,
        budgetUsd: data.input.budgetsUsdBySeason[season] ?? null,
        costUsd: Math.round(seasonItems.filter((i) => i.stage !== 'declined').reduce((s, i) => s + i.costUsd, 0) * 100) / 100,
        items: seasonItems,
      };
    }),
    feasible: evaluation ? evaluation.feasible : true,
    problem: evaluation && !evaluation.feasible ? evaluation.reason : null,
    // Null while the order does not work: its waste is not defined until it does.
    wasteUsd: evaluation ? (evaluation.feasible ? evaluation.plan.wasteUsd : null) : 0,
    wasteItems: evaluation?.feasible ? evaluation.plan.wasteItems : [],
    unmetGoals: evaluation?.feasible
      ? evaluation.plan.unmetGoals
      : data.input.goals.map((g) => ({
          goalId: g.id,
          status: 'unmet',
          metSeason: null,
          reason: evaluation ? `Not known while the roadmap's order does not work (${evaluation.reason}).` : 'Nothing is planned yet: plan the roadmap.',
        })),
    goalOutcomes: evaluation?.feasible ? evaluation.plan.goalOutcomes : [],
    capabilityTimeline: evaluation?.feasible ? evaluation.plan.capabilityTimeline : [],
    naive: naive ? { strategy: naive.strategy, wasteUsd: naive.wasteUsd, totalCostUsd: naive.totalCostUsd } : null,
    compare,
    goals: data.goals.map((g) => ({ id: g.id, kind: g.kind, label: g.label, planterId: g.planterId, targetSeason: g.targetSeason, priority: g.priority, capabilities: g.capabilities, targetValue: g.targetValue, notes: g.notes, version: g.version })),
    budgets: data.budgets.map((b) => ({ season: b.season, budgetUsd: Number(b.budgetUsd) })),
    replacements: data.replacements.map((r) => ({ id: r.id, planterId: r.planterId, season: r.season, kind: r.kind, notes: r.notes })),
    planters: data.planters.map((p) => ({ id: p.id, name: p.name, rows: p.rows })),
  };
}
export type RoadmapView = Awaited<ReturnType<typeof buildRoadmap>>;

/** Fixed items become part of the starting fleet and their cost leaves their season's budget. */
function inputWithFixedItems(data: AccountPlanningData): PlannerInput {
  const fixed = data.items.filter((i) => isFixed(i) && i.season >= data.input.firstSeason);
  const budgets = { ...data.input.budgetsUsdBySeason };
  for (const i of fixed) if (budgets[i.season] !== undefined) budgets[i.season] = Math.max(0, budgets[i.season] - Number(i.partsUsd) - Number(i.labourUsd));
  return {
    ...data.input,
    budgetsUsdBySeason: budgets,
    fleet: {
      ...data.input.fleet,
      installed: [
        ...data.input.fleet.installed.map((x) => ({ ...x, installedSeason: Math.min(x.installedSeason, data.input.firstSeason) })),
        ...fixed.map((i) => ({ partId: String(i.componentId), planterId: String(i.planterId), installedSeason: data.input.firstSeason, pricePaidUsd: Number(i.partsUsd) + Number(i.labourUsd) })),
      ],
    },
  };
}

/** Staff of the territory. Replaces the unfixed items with the planner's sequence; fixed items stay. */
export async function replan(sequelize: Sequelize, user: SessionUser, accountId: number, horizonSeasons: number) {
  await sequelize.transaction(async (transaction) => {
    const account = await accountFor(user, accountId, 'edit', transaction);
    const data = await loadAccountPlanningData(accountId, { horizonSeasons }, transaction);
    const plan = planRoadmap(inputWithFixedItems(data));
    const settings = await getSettings();
    const specialistId = (await Account.findByPk(accountId, { attributes: ['specialistId'], transaction }))?.specialistId ?? null;
    const replaceable = data.items.filter((i) => !isFixed(i));
    if (replaceable.length) await RoadmapItem.destroy({ where: { id: replaceable.map((i) => i.id) }, transaction });
    const rows = plan.seasons.flatMap((s) =>
      s.items.map((it) => ({
        accountId,
        planterId: Number(it.planterId),
        componentId: Number(it.partId),
        season: s.season,
        quantity: it.quantity,
        partsUsd: it.partsUsd,
        labourUsd: it.labourUsd,
        labourHours: Math.round((it.labourUsd / settings.shopRateUsdPerHour) * 100) / 100,
        stage: 'proposed' as const,
        probabilityOverride: null,
        goalIds: it.goalIds.map(Number),
        explanation: it.explanation,
        specialistId,
        installWeek: null,
        stageChangedAt: new Date(),
      })),
    );
    if (rows.length) await RoadmapItem.bulkCreate(rows, { transaction });
    await audit(transaction, {
      accountId,
      userId: user.id,
      entity: 'roadmap',
      entityId: accountId,
      action: 'update',
      summary: `Planned the roadmap for ${account.name}: ${rows.length} items over ${horizonSeasons} seasons, ${plan.unmetGoals.length} goals not met on time`,
    });
  });
  return getRoadmap(user, accountId);
}

/** Waste of a workable roadmap; null when the order does not work (its waste is not defined). */
function wasteOf(e: Evaluation | null): number | null {
  if (!e) return 0;
  return e.feasible ? e.plan.wasteUsd : null;
}

const usd = (n: number) => `$${Math.round(n).toLocaleString('en-US')}`;

/** Warnings a move or re-stage brings: the order broken, waste added, goals made late. */
function warningsBetween(before: Evaluation | null, after: Evaluation | null): string[] {
  const warnings: string[] = [];
  if (after && !after.feasible) {
    warnings.push(`This roadmap no longer works: ${after.reason}.`);
    return warnings;
  }
  const wasteBefore = wasteOf(before);
  const wasteAfter = wasteOf(after) ?? 0;
  // From a broken order to a working one there is no fair "before" to compare waste with.
  if (wasteBefore !== null && after?.feasible && wasteAfter - wasteBefore > 0.5) {
    const causes = after.plan.wasteItems.map((w) => w.explanation).slice(0, 3);
    warnings.push(`This order throws away ${usd(wasteAfter - wasteBefore)} more of parts before the end of their life${causes.length ? `: ${causes.join(' ')}` : '.'}`);
  }
  if (before?.feasible && after?.feasible) {
    const lateBefore = new Set(before.plan.unmetGoals.map((g) => g.goalId));
    for (const g of after.plan.unmetGoals) if (!lateBefore.has(g.goalId)) warnings.push(`A goal is no longer met on time: ${g.reason}`);
  }
  return warnings;
}

/** What-if for the drag preview: the roadmap's waste and problems if these items moved, nothing saved. */
export async function evaluateMoves(user: SessionUser, accountId: number, moves: { itemId: number; season: number }[]) {
  await accountFor(user, accountId, 'read');
  const data = await loadAccountPlanningData(accountId);
  const moved = new Map(moves.map((m) => [m.itemId, m.season]));
  for (const m of moves) if (!data.items.some((i) => i.id === m.itemId)) throw validationError({ moves: `Item ${m.itemId} is not on this roadmap` });
  const purchases = data.items
    .map((i) => ({ season: moved.get(i.id) ?? i.season, partId: String(i.componentId), planterId: String(i.planterId) }))
    .filter((p) => p.season >= data.input.firstSeason && p.season < data.input.firstSeason + data.input.horizonSeasons);
  const before = evaluate(data);
  const after = evaluate(data, purchases);
  const wasteBefore = wasteOf(before);
  const wasteAfter = wasteOf(after);
  return {
    wasteUsd: wasteAfter,
    // Null when either order does not work: a difference would mislead.
    wasteDeltaUsd: wasteBefore !== null && wasteAfter !== null ? Math.round((wasteAfter - wasteBefore) * 100) / 100 : null,
    feasible: after ? after.feasible : true,
    wasFeasible: before ? before.feasible : true,
    warnings: warningsBetween(before, after),
  };
}

/** Staff move, re-stage or lock an item; the answer carries the re-computed roadmap and any warnings. */
export async function patchItem(sequelize: Sequelize, user: SessionUser, id: number, patch: RoadmapItemPatch) {
  const item = await RoadmapItem.findByPk(id);
  if (!item) throw notFound('That roadmap item');
  await accountFor(user, item.accountId, 'edit');
  const beforeData = await loadAccountPlanningData(item.accountId);
  const before = evaluate(beforeData);
  const first = beforeData.input.firstSeason;
  if (patch.season !== undefined && patch.season !== item.season) {
    if (item.locked && patch.locked !== false) throw new AppError('locked', 409, 'The grower committed to this item, so it is locked in its season. Unlock it first.');
    if (patch.season < first || patch.season > first + 9) throw validationError({ season: `Choose a season from ${first} to ${first + 9}` });
  }
  await sequelize
    .transaction(async (transaction) => {
      const fresh = (await RoadmapItem.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE }))!;
      assertVersion(fresh.version, patch.version);
      const { version: _v, ...changes } = patch;
      const stageChanged = changes.stage !== undefined && changes.stage !== fresh.stage;
      fresh.set({ ...changes, ...(stageChanged ? { stageChangedAt: new Date() } : {}) });
      await fresh.save({ transaction });
      const what = [
        changes.season !== undefined && changes.season !== item.season ? `moved from ${item.season} to ${changes.season}` : null,
        stageChanged ? `stage ${item.stage} → ${changes.stage}` : null,
        changes.locked !== undefined && changes.locked !== item.locked ? (changes.locked ? 'locked' : 'unlocked') : null,
      ].filter(Boolean);
      await audit(transaction, {
        accountId: item.accountId,
        userId: user.id,
        entity: 'roadmapItem',
        entityId: id,
        action: stageChanged ? 'stage' : 'update',
        summary: `Roadmap item ${id} ${what.join(', ') || 'changed'}`,
        changes: Object.fromEntries(Object.entries(changes).map(([k, v]) => [k, [(item.get(k as never) as unknown) ?? null, v]])),
      });
    })
    .catch(mapLockError);
  const data = await loadAccountPlanningData(item.accountId);
  const after = evaluate(data);
  return { roadmap: await buildRoadmap(data), warnings: warningsBetween(before, after) };
}

// ---------------- versions ----------------

export async function saveVersion(user: SessionUser, accountId: number, name: string) {
  await accountFor(user, accountId, 'edit');
  const roadmap = await getRoadmap(user, accountId);
  const snapshot = {
    firstSeason: roadmap.firstSeason,
    wasteUsd: roadmap.wasteUsd,
    seasons: roadmap.seasons.map((s) => ({ season: s.season, costUsd: s.costUsd, budgetUsd: s.budgetUsd, items: s.items })),
    unmetGoals: roadmap.unmetGoals,
  };
  const v = await RoadmapVersion.create({ accountId, name, snapshot, createdBy: user.id });
  return { id: v.id, name: v.name, createdAt: v.createdAt };
}

export async function listVersions(user: SessionUser, accountId: number) {
  await accountFor(user, accountId, 'read');
  const rows = await RoadmapVersion.findAll({ where: { accountId }, order: [['createdAt', 'DESC']], attributes: ['id', 'name', 'createdAt', 'createdBy'] });
  const users = await User.findAll({ where: { id: rows.map((r) => r.createdBy).filter((x): x is number => !!x) }, attributes: ['id', 'name'] });
  return rows.map((r) => ({ id: r.id, name: r.name, createdAt: r.createdAt, createdBy: users.find((u) => u.id === r.createdBy)?.name ?? null }));
}

export async function getVersion(user: SessionUser, id: number) {
  const v = await RoadmapVersion.findByPk(id);
  if (!v) throw notFound('That roadmap version');
  await accountFor(user, v.accountId, 'read');
  return { id: v.id, accountId: v.accountId, name: v.name, createdAt: v.createdAt, snapshot: v.snapshot };
}
