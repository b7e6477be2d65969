// Demo goals, budgets and roadmaps. Three accounts are set up so that buying in a naive order
// throws money away and Rowpath's plan does not:
//  - Hesketh Farms: rates by zone in 2027, then plant faster in 2029. The cheapest rate control (a
//    hydraulic drive) would be superseded by the electric drives that faster planting needs.
//  - Brannigan Acres: more fertilizer in 2027, with the toolbar replaced in 2029. The cheapest tank
//    mounts on the toolbar and cannot move, so it would be stranded.
//  - Oldfield Family Farms: less labour (row shut-off) in 2027, then plant faster in 2029. Row
//    clutches now would be superseded by electric drives later.
import type { Sequelize } from 'sequelize';
import type { SessionUser } from '../shared/schemas/auth.js';
import type { GoalKindName } from '../shared/schemas/roadmap.js';
import { Account, Component, ComponentRule, Goal, Install, PlannedReplacement, Planter, RoadmapItem, SeasonBudget, Toolbar, User } from '../server/db/models/index.js';
import { replan } from '../server/modules/roadmap/roadmap.service.js';
import { createQuote } from '../server/modules/roadmap/quotes.service.js';
import { RULES } from './demo-catalog.js';
import { mulberry32 } from './fleet-generator.js';

export const DEMO_WASTE_ACCOUNTS = ['Hesketh Farms', 'Brannigan Acres', 'Oldfield Family Farms'];

async function seedRules(parts: Map<string, number>) {
  await ComponentRule.bulkCreate(
    RULES.map((r) => ({
      componentId: parts.get(r.part)!,
      kind: r.kind,
      targetComponentId: 'target' in r && r.target ? parts.get(r.target)! : null,
      capability: 'capability' in r && r.capability ? r.capability : null,
      labourHoursSavedPerUnit: r.kind === 'prepares-for' ? r.labourHoursSaved : null,
      partsUsdSavedPerUnit: r.kind === 'prepares-for' ? r.partsUsdSaved : null,
    })),
  );
}

/** Gives a planter a plain, older set-up so the scenario reads the same on every machine. */
async function resetToBaseline(planter: Planter, parts: Map<string, number>) {
  await Install.destroy({ where: { planterId: planter.id } });
  await Toolbar.destroy({ where: { planterId: planter.id } });
  await planter.update({ name: '16-row planter', rows: 16, rowSpacingIn: 30, frameType: 'three-section-flex', foldType: 'stack', liquidTankCount: 0, liquidTankGallons: 0, dryCapacityLb: 0 });
  await Toolbar.create({ planterId: planter.id, position: 1, name: 'Main bar', sizeFt: 40, firstRow: 1, lastRow: 16 });
  const base = ['KR-SM-110', 'KR-CW-010', 'KR-SS-050'];
  await Install.bulkCreate(
    base.map((pn) => ({
      planterId: planter.id,
      componentId: parts.get(pn)!,
      scope: 'all-rows' as const,
      toolbarId: null,
      rowFrom: null,
      rowTo: null,
      quantity: planter.rows,
      installDate: '2021-03-15',
      pricePaidUsd: null,
      serialNumbers: [],
      workOrder: 'WO-2021-0315',
      status: 'installed' as const,
      removedDate: null,
      removedReason: null,
    })),
  );
}

interface Scenario {
  account: string;
  goals: { kind: GoalKindName; label: string; season: number; priority: number }[];
  budgets: Record<number, number>;
  toolbarReplacedIn?: number;
}

const SCENARIOS: Scenario[] = [
  {
    account: 'Hesketh Farms',
    goals: [
      { kind: 'rates-by-zone', label: 'Vary seeding rate by soil zone', season: 2027, priority: 2 },
      { kind: 'planting-speed', label: 'Plant at 9–10 mph', season: 2029, priority: 3 },
    ],
    budgets: { 2027: 22000, 2028: 12000, 2029: 20000, 2030: 12000, 2031: 10000 },
  },
  {
    account: 'Brannigan Acres',
    goals: [{ kind: 'fertilizer-capacity', label: 'Carry starter for a full day', season: 2027, priority: 3 }],
    budgets: { 2027: 8000, 2028: 6000, 2029: 6000, 2030: 6000, 2031: 6000 },
    toolbarReplacedIn: 2029,
  },
  {
    account: 'Oldfield Family Farms',
    goals: [
      { kind: 'less-labour', label: 'Stop overlap on point rows without a second person', season: 2027, priority: 2 },
      { kind: 'planting-speed', label: 'Plant at 9–10 mph', season: 2029, priority: 3 },
    ],
    budgets: { 2027: 22000, 2028: 14000, 2029: 20000, 2030: 12000, 2031: 10000 },
  },
];

const OTHER_GOALS: GoalKindName[] = ['in-furrow-starter', 'rates-by-zone', 'less-labour', 'fertilizer-capacity', 'planting-speed'];

export async function seedDemoRoadmaps(sequelize: Sequelize) {
  const components = await Component.findAll({ attributes: ['id', 'partNumber'] });
  const parts = new Map(components.map((c) => [c.partNumber, c.id]));
  await seedRules(parts);
  const adminRow = await User.findOne({ where: { role: 'admin' } });
  const admin: SessionUser = { id: adminRow!.id, email: adminRow!.email, name: adminRow!.name, role: 'admin', territoryIds: [], accountId: null };

  for (const s of SCENARIOS) {
    const account = (await Account.findOne({ where: { name: s.account } }))!;
    const planter = (await Planter.findOne({ where: { accountId: account.id }, order: [['id', 'ASC']] }))!;
    await resetToBaseline(planter, parts);
    await Goal.bulkCreate(s.goals.map((g) => ({ accountId: account.id, planterId: planter.id, kind: g.kind, label: g.label, capabilities: [], targetSeason: g.season, priority: g.priority, targetValue: null, notes: null })));
    await SeasonBudget.bulkCreate(Object.entries(s.budgets).map(([season, budgetUsd]) => ({ accountId: account.id, season: Number(season), budgetUsd })));
    if (s.toolbarReplacedIn) await PlannedReplacement.create({ accountId: account.id, planterId: planter.id, season: s.toolbarReplacedIn, kind: 'toolbar', notes: 'New 40-ft bar from the grower\'s long-term plan' });
    await replan(sequelize, admin, account.id, 5);
  }
  // The demo grower has a quote for 2027 waiting in their portal.
  const hesketh = (await Account.findOne({ where: { name: 'Hesketh Farms' } }))!;
  if (await RoadmapItem.count({ where: { accountId: hesketh.id, season: 2027 } })) await createQuote(sequelize, admin, hesketh.id, 2027);

  // Other accounts: a goal or two each, planned, then spread over stages as a territory's pipeline is.
  const rand = mulberry32(7);
  const others = await Account.findAll({ where: { status: 'active' }, order: [['id', 'ASC']] });
  const stages = ['idea', 'proposed', 'proposed', 'quoted', 'accepted', 'ordered', 'installed', 'declined'] as const;
  for (const account of others.filter((a) => !DEMO_WASTE_ACCOUNTS.includes(a.name)).slice(0, 18)) {
    const planter = await Planter.findOne({ where: { accountId: account.id }, order: [['id', 'ASC']] });
    if (!planter) continue;
    const kind = OTHER_GOALS[Math.floor(rand() * OTHER_GOALS.length)];
    await Goal.create({ accountId: account.id, planterId: planter.id, kind, label: kind.replace(/-/g, ' '), capabilities: [], targetSeason: 2027 + Math.floor(rand() * 3), priority: 2, targetValue: null, notes: null });
    const budget = 6000 + Math.round(rand() * 20) * 1000;
    await SeasonBudget.bulkCreate([2027, 2028, 2029, 2030, 2031].map((season) => ({ accountId: account.id, season, budgetUsd: budget })));
    await replan(sequelize, admin, account.id, 5);
    const items = await RoadmapItem.findAll({ where: { accountId: account.id } });
    for (const item of items) {
      const stage = item.season === 2027 ? stages[Math.floor(rand() * stages.length)] : stages[Math.floor(rand() * 3)];
      // Installs land in the shop between November and early April before their season.
      const week = new Date(Date.UTC(item.season - 1, 10, 2 + Math.floor(rand() * 150)));
      week.setUTCDate(week.getUTCDate() - ((week.getUTCDay() + 6) % 7));
      await item.update({ stage, installWeek: ['accepted', 'ordered', 'installed'].includes(stage) ? week.toISOString().slice(0, 10) : null, locked: ['accepted', 'ordered', 'installed'].includes(stage) });
    }
  }
}
