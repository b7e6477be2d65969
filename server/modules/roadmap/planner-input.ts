// Reads one account's fleet, goals, budgets, replacements and the catalog rules, and shapes them as
// the pure planner's input (shared/calc/planner-types.ts). A fixed number of queries per account.
import { Op, type Transaction } from 'sequelize';
import type { CatalogPart, PartRule, PlannerGoal, PlannerInput, RoadmapPurchase } from '../../../shared/calc/planner-types.js';
import { COMMITTED_STAGES, GOAL_CAPABILITIES, type GoalKindName } from '../../../shared/schemas/roadmap.js';
import { Component, ComponentRule, Goal, Install, PlannedReplacement, Planter, RoadmapItem, SeasonBudget, Toolbar } from '../../db/models/index.js';
import { getSettings } from '../settings/settings.service.js';

/** The first season a plan can still change: next year's planting once this year's is past (after June). */
export function currentPlanningSeason(today = new Date()): number {
  return today.getUTCMonth() >= 6 ? today.getUTCFullYear() + 1 : today.getUTCFullYear();
}

export function catalogPart(c: Component): CatalogPart {
  return {
    id: String(c.id),
    category: c.category,
    name: c.name,
    unit: c.unit,
    priceUsd: Number(c.priceUsd),
    labourHours: Number(c.labourHours),
    expectedLifeYears: Number(c.expectedLifeYears),
    movesToNewToolbar: c.movesToNewToolbar,
    ...(c.ratedMaxSpeedMph ? { ratedMaxSpeedMph: Number(c.ratedMaxSpeedMph) } : {}),
    ...(c.hydraulicGpm ? { hydraulicGpm: Number(c.hydraulicGpm) } : {}),
  };
}

export function partRule(r: ComponentRule): PartRule | null {
  const partId = String(r.componentId);
  const target = r.targetComponentId ? String(r.targetComponentId) : null;
  switch (r.kind) {
    case 'provides':
      return r.capability ? { kind: 'provides', partId, capability: r.capability } : null;
    case 'requires':
      if (target) return { kind: 'requires', partId, requiredPartId: target };
      return r.capability ? { kind: 'requires', partId, requiredCapability: r.capability } : null;
    case 'conflicts-with':
      return target ? { kind: 'conflictsWith', partId, otherPartId: target } : null;
    case 'supersedes':
      return target ? { kind: 'supersedes', partId, supersededPartId: target } : null;
    case 'prepares-for':
      return target
        ? { kind: 'preparesFor', partId, laterPartId: target, labourHoursSavedPerUnit: Number(r.labourHoursSavedPerUnit ?? 0), partsUsdSavedPerUnit: Number(r.partsUsdSavedPerUnit ?? 0) }
        : null;
    default:
      return null;
  }
}

export async function loadCatalog(transaction?: Transaction) {
  const [components, rules] = await Promise.all([Component.findAll({ transaction }), ComponentRule.findAll({ transaction })]);
  return { components, catalog: components.map(catalogPart), rules: rules.map(partRule).filter((r): r is PartRule => r !== null) };
}

export interface AccountPlanningData {
  input: PlannerInput;
  /** Stored roadmap items (not declined) as purchases, for evaluating the roadmap as it stands. */
  storedPurchases: RoadmapPurchase[];
  items: RoadmapItem[];
  goals: Goal[];
  planters: Planter[];
  components: Map<number, Component>;
  budgets: SeasonBudget[];
  replacements: PlannedReplacement[];
}

/**
 * Builds the planner input for an account. Items the grower has committed to (accepted, ordered,
 * installed) or that are locked are fixed purchases: they are planned as given, never moved.
 */
export async function loadAccountPlanningData(accountId: number, opts: { horizonSeasons?: number; firstSeason?: number } = {}, transaction?: Transaction): Promise<AccountPlanningData> {
  const settings = await getSettings();
  const firstSeason = opts.firstSeason ?? currentPlanningSeason();
  const [planters, goals, budgets, replacements, items, { components, catalog, rules }] = await Promise.all([
    Planter.findAll({ where: { accountId }, order: [['id', 'ASC']], transaction }),
    // In the order the grower asked for them: the naive comparison walks goals in this order.
    Goal.findAll({ where: { accountId }, order: [['id', 'ASC']], transaction }),
    SeasonBudget.findAll({ where: { accountId }, transaction }),
    PlannedReplacement.findAll({ where: { accountId }, transaction }),
    RoadmapItem.findAll({ where: { accountId, stage: { [Op.ne]: 'declined' } }, order: [['season', 'ASC'], ['id', 'ASC']], transaction }),
    loadCatalog(transaction),
  ]);
  const planterIds = planters.map((p) => p.id);
  const [installs, toolbars] = planterIds.length
    ? await Promise.all([
        Install.findAll({ where: { planterId: planterIds, status: 'installed' }, transaction }),
        Toolbar.findAll({ where: { planterId: planterIds }, attributes: ['planterId'], transaction }),
      ])
    : [[], []];
  const byId = new Map(components.map((c) => [c.id, c]));
  const latestItemSeason = Math.max(0, ...items.map((i) => i.season));
  const latestGoal = Math.max(0, ...goals.map((g) => g.targetSeason));
  const horizonSeasons = Math.min(10, Math.max(1, opts.horizonSeasons ?? Math.max(5, latestGoal - firstSeason + 1, latestItemSeason - firstSeason + 1)));

  const plannerGoals: PlannerGoal[] = goals
    .filter((g) => (g.planterId ?? planters[0]?.id) !== undefined)
    .map((g) => ({
      id: String(g.id),
      kind: g.kind as PlannerGoal['kind'],
      label: g.label,
      planterId: String(g.planterId ?? planters[0].id),
      capabilities: g.capabilities?.length ? g.capabilities : GOAL_CAPABILITIES[g.kind as GoalKindName] ?? [],
      bySeason: g.targetSeason,
      priority: g.priority,
    }))
    .filter((g) => g.capabilities.length > 0);

  const installedSeason = (i: Install) => Number((i.installDate ?? '').slice(0, 4)) || i.createdAt.getUTCFullYear();
  const input: PlannerInput = {
    fleet: {
      planters: planters.map((p) => ({ id: String(p.id), name: p.name, rows: p.rows, toolbars: Math.max(1, toolbars.filter((t) => t.planterId === p.id).length) })),
      installed: installs
        .filter((i) => byId.has(i.componentId))
        .map((i) => ({
          partId: String(i.componentId),
          planterId: String(i.planterId),
          installedSeason: installedSeason(i),
          pricePaidUsd: i.pricePaidUsd !== null ? Number(i.pricePaidUsd) : Number(byId.get(i.componentId)!.priceUsd) * i.quantity,
        })),
    },
    goals: plannerGoals,
    catalog,
    rules,
    budgetsUsdBySeason: Object.fromEntries(budgets.map((b) => [b.season, Number(b.budgetUsd)])),
    firstSeason,
    horizonSeasons,
    replacements: replacements.map((r) => ({ season: r.season, planterId: String(r.planterId), kind: r.kind })),
    shopRateUsdPerHour: settings.shopRateUsdPerHour,
    valuation: settings.valuation,
  };
  const storedPurchases = items
    .filter((i) => i.season >= firstSeason && i.season < firstSeason + horizonSeasons)
    .map((i) => ({ season: i.season, partId: String(i.componentId), planterId: String(i.planterId) }));
  return { input, storedPurchases, items, goals, planters, components: byId, budgets, replacements };
}

export function isFixed(item: RoadmapItem) {
  return item.locked || COMMITTED_STAGES.includes(item.stage as (typeof COMMITTED_STAGES)[number]);
}
