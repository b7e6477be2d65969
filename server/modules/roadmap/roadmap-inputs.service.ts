// Goals, season budgets and planned replacements: what the grower wants and can spend.
import type { Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { GOAL_CAPABILITIES, type BudgetInput, type GoalInput, type ReplacementInput } from '../../../shared/schemas/roadmap.js';
import { Goal, PlannedReplacement, Planter, SeasonBudget } from '../../db/models/index.js';
import { notFound, validationError } from '../../http/errors.js';
import { accountFor, assertVersion, audit, diff, mapLockError } from '../fleet/fleet-access.js';
import { currentPlanningSeason } from './planner-input.js';

async function checkPlanter(accountId: number, planterId: number | null) {
  if (planterId && !(await Planter.findOne({ where: { id: planterId, accountId }, attributes: ['id'] }))) throw validationError({ planterId: 'That planter is not in this operation' });
}

function checkSeason(season: number, field = 'targetSeason') {
  const first = currentPlanningSeason();
  if (season < first) throw validationError({ [field]: `That season has passed: choose ${first} or later` });
  if (season > first + 9) throw validationError({ [field]: `Plan at most ten seasons ahead (to ${first + 9})` });
}

const goalView = (g: Goal) => ({ id: g.id, accountId: g.accountId, kind: g.kind, label: g.label, planterId: g.planterId, capabilities: g.capabilities, targetSeason: g.targetSeason, priority: g.priority, targetValue: g.targetValue === null ? null : Number(g.targetValue), notes: g.notes, version: g.version });

export async function listGoals(user: SessionUser, accountId: number) {
  await accountFor(user, accountId, 'read');
  return (await Goal.findAll({ where: { accountId }, order: [['targetSeason', 'ASC'], ['priority', 'DESC']] })).map(goalView);
}

export async function createGoal(sequelize: Sequelize, user: SessionUser, accountId: number, input: GoalInput) {
  await accountFor(user, accountId, 'edit');
  await checkPlanter(accountId, input.planterId);
  checkSeason(input.targetSeason);
  return sequelize.transaction(async (transaction) => {
    const goal = await Goal.create({ ...input, accountId, capabilities: input.capabilities ?? GOAL_CAPABILITIES[input.kind] }, { transaction });
    await audit(transaction, { accountId, userId: user.id, entity: 'goal', entityId: goal.id, action: 'create', summary: `Recorded the goal "${input.label}" for ${input.targetSeason}` });
    return goalView(goal);
  });
}

export async function updateGoal(sequelize: Sequelize, user: SessionUser, id: number, input: Partial<GoalInput> & { version: number }) {
  return sequelize
    .transaction(async (transaction) => {
      const goal = await Goal.findByPk(id, { transaction });
      if (!goal) throw notFound('That goal');
      await accountFor(user, goal.accountId, 'edit', transaction);
      assertVersion(goal.version, input.version);
      const { version: _v, ...fields } = input;
      if (fields.planterId !== undefined) await checkPlanter(goal.accountId, fields.planterId);
      if (fields.targetSeason !== undefined) checkSeason(fields.targetSeason);
      if (fields.kind && !fields.capabilities) fields.capabilities = GOAL_CAPABILITIES[fields.kind];
      const changes = diff(goalView(goal), fields);
      goal.set(fields);
      await goal.save({ transaction });
      await audit(transaction, { accountId: goal.accountId, userId: user.id, entity: 'goal', entityId: id, action: 'update', summary: `Changed the goal "${goal.label}"`, changes });
      return goalView(goal);
    })
    .catch(mapLockError);
}

export async function deleteGoal(sequelize: Sequelize, user: SessionUser, id: number) {
  await sequelize.transaction(async (transaction) => {
    const goal = await Goal.findByPk(id, { transaction });
    if (!goal) throw notFound('That goal');
    await accountFor(user, goal.accountId, 'edit', transaction);
    await goal.destroy({ transaction });
    await audit(transaction, { accountId: goal.accountId, userId: user.id, entity: 'goal', entityId: id, action: 'delete', summary: `Removed the goal "${goal.label}"` });
  });
}

export async function putBudget(sequelize: Sequelize, user: SessionUser, accountId: number, input: BudgetInput) {
  await accountFor(user, accountId, 'edit');
  checkSeason(input.season, 'season');
  await sequelize.transaction(async (transaction) => {
    await SeasonBudget.upsert({ accountId, season: input.season, budgetUsd: input.budgetUsd }, { transaction });
    await audit(transaction, { accountId, userId: user.id, entity: 'budget', entityId: null, action: 'update', summary: `Set the ${input.season} budget to $${input.budgetUsd.toLocaleString('en-US')}` });
  });
  return { season: input.season, budgetUsd: input.budgetUsd };
}

export async function createReplacement(sequelize: Sequelize, user: SessionUser, accountId: number, input: ReplacementInput) {
  await accountFor(user, accountId, 'edit');
  await checkPlanter(accountId, input.planterId);
  checkSeason(input.season, 'season');
  return sequelize.transaction(async (transaction) => {
    const r = await PlannedReplacement.create({ ...input, accountId }, { transaction });
    await audit(transaction, { accountId, userId: user.id, entity: 'replacement', entityId: r.id, action: 'create', summary: `Planned a ${input.kind} replacement in ${input.season}` });
    return { id: r.id, planterId: r.planterId, season: r.season, kind: r.kind, notes: r.notes };
  });
}

export async function deleteReplacement(sequelize: Sequelize, user: SessionUser, id: number) {
  await sequelize.transaction(async (transaction) => {
    const r = await PlannedReplacement.findByPk(id, { transaction });
    if (!r) throw notFound('That planned replacement');
    await accountFor(user, r.accountId, 'edit', transaction);
    await r.destroy({ transaction });
    await audit(transaction, { accountId: r.accountId, userId: user.id, entity: 'replacement', entityId: id, action: 'delete', summary: `Cancelled the ${r.kind} replacement in ${r.season}` });
  });
}
