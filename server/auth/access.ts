import { Op, type WhereOptions } from 'sequelize';
import type { SessionUser } from '../../shared/schemas/auth.js';

/**
 * The accounts a user may see, as a Sequelize condition. Deny by default: a role not named here
 * sees nothing. Admin: all; manager and specialist: their territories; grower: their own account.
 */
export function accountScope(user: SessionUser): WhereOptions {
  switch (user.role) {
    case 'admin':
      return {};
    case 'manager':
    case 'specialist':
      return { territoryId: { [Op.in]: user.territoryIds.length ? user.territoryIds : [-1] } };
    case 'grower':
      return { id: user.accountId ?? -1 };
    default:
      return { id: -1 };
  }
}

/** The same rule for one account already loaded (used where a record names its account). */
export function canSeeAccount(user: SessionUser, account: { id: number; territoryId: number }): boolean {
  switch (user.role) {
    case 'admin':
      return true;
    case 'manager':
    case 'specialist':
      return user.territoryIds.includes(account.territoryId);
    case 'grower':
      return user.accountId === account.id;
    default:
      return false;
  }
}

/** Fleet records may be changed by staff who see the account; growers only read. */
export function canEditAccount(user: SessionUser, account: { id: number; territoryId: number }): boolean {
  return user.role !== 'grower' && canSeeAccount(user, account);
}
