import bcrypt from 'bcryptjs';
import { Op, type Sequelize } from 'sequelize';
import type { CreateUserInput, UpdateUserInput } from '../../../shared/schemas/users.js';
import { Account, Session, Territory, User, UserTerritory } from '../../db/models/index.js';
import { AppError, notFound, validationError } from '../../http/errors.js';

export const BCRYPT_COST = 10;

export async function hashPassword(password: string) {
  return bcrypt.hash(password, BCRYPT_COST);
}

type UserRow = User & { territories?: { id: number }[] };

function toView(u: UserRow) {
  return {
    id: u.id,
    email: u.email,
    name: u.name,
    role: u.role,
    disabled: u.disabled,
    territoryIds: (u.territories ?? []).map((t) => t.id).sort((a, b) => a - b),
    accountId: u.accountId,
    lastSignInAt: u.lastSignInAt,
  };
}

const withTerritories = { include: [{ model: Territory, as: 'territories', attributes: ['id'], through: { attributes: [] } }] };

export async function listUsers() {
  const users = await User.findAll({ ...withTerritories, order: [['name', 'ASC']] });
  return users.map((u) => toView(u as UserRow));
}

async function checkReferences(territoryIds: number[] | undefined, accountId: number | null | undefined) {
  const fields: Record<string, string> = {};
  if (territoryIds?.length) {
    const found = await Territory.count({ where: { id: { [Op.in]: territoryIds } } });
    if (found !== new Set(territoryIds).size) fields.territoryIds = 'One or more territories do not exist';
  }
  if (accountId && !(await Account.findByPk(accountId, { attributes: ['id'] }))) fields.accountId = 'No account has that id';
  if (Object.keys(fields).length) throw validationError(fields);
}

/** Admin only. Creates the user and their territories in one transaction. */
export async function createUser(sequelize: Sequelize, input: CreateUserInput) {
  await checkReferences(input.territoryIds, input.accountId);
  if (await User.findOne({ where: { email: input.email }, attributes: ['id'] })) {
    throw new AppError('conflict', 409, 'A user with that e-mail already exists.', { fields: { email: 'That e-mail is already in use' } });
  }
  const passwordHash = await hashPassword(input.password);
  const id = await sequelize.transaction(async (transaction) => {
    const user = await User.create(
      { email: input.email, name: input.name, role: input.role, passwordHash, accountId: input.role === 'grower' ? input.accountId ?? null : null, lastSignInAt: null },
      { transaction },
    );
    const territoryIds = input.role === 'grower' ? [] : [...new Set(input.territoryIds)];
    if (territoryIds.length) await UserTerritory.bulkCreate(territoryIds.map((territoryId) => ({ userId: user.id, territoryId })), { transaction });
    return user.id;
  });
  return getUser(id);
}

export async function getUser(id: number) {
  const user = await User.findByPk(id, withTerritories);
  if (!user) throw notFound('That user');
  return toView(user as UserRow);
}

/** Admin only. Disabling a user ends every session they hold, at once. */
export async function updateUser(sequelize: Sequelize, id: number, input: UpdateUserInput, actingUserId: number) {
  const user = await User.findByPk(id);
  if (!user) throw notFound('That user');
  if (id === actingUserId && (input.disabled === true || (input.role && input.role !== 'admin'))) {
    throw validationError({ [input.disabled ? 'disabled' : 'role']: 'You cannot disable yourself or remove your own admin role' });
  }
  await checkReferences(input.territoryIds, input.accountId);
  const role = input.role ?? user.role;
  const accountId = input.accountId !== undefined ? input.accountId : user.accountId;
  if (role === 'grower' && !accountId) throw validationError({ accountId: 'A grower must be linked to their account' });
  await sequelize.transaction(async (transaction) => {
    await user.update(
      {
        ...(input.name !== undefined ? { name: input.name } : {}),
        role,
        accountId: role === 'grower' ? accountId : null,
        ...(input.disabled !== undefined ? { disabled: input.disabled } : {}),
      },
      { transaction },
    );
    if (input.territoryIds || role === 'grower') {
      await UserTerritory.destroy({ where: { userId: id }, transaction });
      const ids = role === 'grower' ? [] : [...new Set(input.territoryIds ?? [])];
      if (ids.length) await UserTerritory.bulkCreate(ids.map((territoryId) => ({ userId: id, territoryId })), { transaction });
    }
    if (input.disabled) await Session.destroy({ where: { userId: id }, transaction });
  });
  return getUser(id);
}
