import type { Sequelize } from 'sequelize';
import type { AccountInput } from '../../../shared/schemas/accounts.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { accountScope } from '../../auth/access.js';
import { Account, User, UserTerritory } from '../../db/models/index.js';
import { AppError, notFound, validationError } from '../../http/errors.js';
import { accountFor, assertVersion, audit, diff, mapLockError } from '../fleet/fleet-access.js';
import { plain } from '../fleet/plain.js';
import { findAccountWithFleet } from './accounts.repository.js';

async function checkPlacement(user: SessionUser, input: Pick<AccountInput, 'territoryId' | 'specialistId'>) {
  const fields: Record<string, string> = {};
  if (user.role !== 'admin' && !user.territoryIds.includes(input.territoryId)) fields.territoryId = 'Choose one of your territories';
  if (input.specialistId) {
    const specialist = await User.findOne({ where: { id: input.specialistId, role: 'specialist', disabled: false }, attributes: ['id'] });
    const covers = specialist && (await UserTerritory.findOne({ where: { userId: specialist.id, territoryId: input.territoryId } }));
    if (!covers) fields.specialistId = 'Choose a specialist who covers that territory';
  }
  if (Object.keys(fields).length) throw validationError(fields);
}

/** Admin, manager and specialist, in their own territories. */
export async function createAccount(sequelize: Sequelize, user: SessionUser, input: AccountInput) {
  if (user.role === 'grower') throw new AppError('forbidden', 403, 'Your role does not allow this.');
  await checkPlacement(user, input);
  return sequelize.transaction(async (transaction) => {
    const account = await Account.create(input, { transaction });
    await audit(transaction, { accountId: account.id, userId: user.id, entity: 'account', entityId: account.id, action: 'create', summary: `Opened the account ${input.name}` });
    // The answer is read before the commit, so a saved account is never reported as an error.
    return (await findAccountWithFleet(accountScope(user), account.id, transaction))!;
  });
}

export async function updateAccount(sequelize: Sequelize, user: SessionUser, id: number, input: Partial<AccountInput> & { version?: number }) {
  await sequelize
    .transaction(async (transaction) => {
      await accountFor(user, id, 'edit', transaction);
      const account = (await Account.findByPk(id, { transaction }))!;
      assertVersion(account.version, input.version);
      const { version: _v, ...fields } = input;
      if (fields.territoryId !== undefined || fields.specialistId !== undefined)
        await checkPlacement(user, { territoryId: fields.territoryId ?? account.territoryId, specialistId: fields.specialistId !== undefined ? fields.specialistId : account.specialistId });
      const changes = diff(plain(account, ['lat', 'lng']), fields);
      account.set(fields);
      await account.save({ transaction });
      await audit(transaction, { accountId: id, userId: user.id, entity: 'account', entityId: id, action: 'update', summary: `Changed the account ${account.name}`, changes });
    })
    .catch(mapLockError);
}

/** Admin and manager only: an account's whole fleet goes with it. */
export async function deleteAccount(sequelize: Sequelize, user: SessionUser, id: number) {
  if (user.role !== 'admin' && user.role !== 'manager') throw new AppError('forbidden', 403, 'Only a manager or an admin can delete an account.');
  await sequelize.transaction(async (transaction) => {
    const account = await accountFor(user, id, 'edit', transaction);
    if (!account) throw notFound('That account');
    await User.update({ accountId: null, disabled: true }, { where: { accountId: id }, transaction });
    await Account.destroy({ where: { id }, transaction });
    await audit(transaction, { accountId: null, userId: user.id, entity: 'account', entityId: id, action: 'delete', summary: `Deleted the account ${account.name}` });
  });
}
