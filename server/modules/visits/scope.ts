import type { SessionUser } from '../../../shared/schemas/auth.js';
import { AppError, forbidden } from '../../http/errors.js';
import { User, UserTerritory } from '../../db/models/index.js';
import type { Transaction } from 'sequelize';

/**
 * The accounts a user may see, as a SQL condition on an `accounts` alias, for the raw queries
 * that aggregate (map, candidates, feeds). Mirrors accountScope in server/auth/access.ts: deny
 * by default; admin all; manager and specialist their territories; grower their own account.
 */
export function accountScopeSql(user: Pick<SessionUser, 'role' | 'territoryIds' | 'accountId'>, alias = 'a'): { sql: string; replacements: Record<string, unknown> } {
  switch (user.role) {
    case 'admin':
      return { sql: '1 = 1', replacements: {} };
    case 'manager':
    case 'specialist':
      return { sql: `${alias}.territory_id IN (:scopeTerritoryIds)`, replacements: { scopeTerritoryIds: user.territoryIds.length ? user.territoryIds : [-1] } };
    case 'grower':
      return { sql: `${alias}.id = :scopeAccountId`, replacements: { scopeAccountId: user.accountId ?? -1 } };
    default:
      return { sql: '1 = 0', replacements: {} };
  }
}

/**
 * Whose week or route a user may work on: a specialist only their own; a manager a specialist
 * who shares one of their territories; an admin anyone staff. Growers never reach here (routers
 * refuse them). Returns the specialist's id; 400 when none is named and none can be assumed.
 */
export async function resolveSpecialist(user: SessionUser, requested: number | undefined, transaction?: Transaction): Promise<{ id: number; name: string; territoryIds: number[] }> {
  const id = requested ?? (user.role === 'specialist' ? user.id : undefined);
  if (id === undefined) throw new AppError('validation', 400, 'Some fields need attention.', { fields: { specialistId: 'Choose whose visits these are' } });
  if (user.role === 'specialist' && id !== user.id) throw new AppError('forbidden', 403, 'Specialists plan their own visits only.');
  const person = await User.findByPk(id, { attributes: ['id', 'name', 'role', 'disabled'], transaction });
  if (!person || person.disabled || !['specialist', 'manager'].includes(person.role)) {
    throw new AppError('validation', 400, 'Some fields need attention.', { fields: { specialistId: 'No active specialist has that id' } });
  }
  const territoryIds = (await UserTerritory.findAll({ where: { userId: id }, attributes: ['territoryId'], transaction })).map((t) => t.territoryId);
  if (user.role === 'manager' && !territoryIds.some((t) => user.territoryIds.includes(t)) && id !== user.id) throw forbidden();
  if (user.role !== 'admin' && user.role !== 'manager' && user.role !== 'specialist') throw forbidden();
  return { id, name: person.name, territoryIds };
}
