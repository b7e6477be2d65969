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

/**
 * accountScope as a plain SQL condition on an accounts table alias, for the few hot reads written
 * in SQL (the list pages). Same rule, same deny-by-default; kept next to accountScope so that the
 * two change together (tests/server/access-sql.test.ts checks they agree).
 */
export function accountScopeSql(user: SessionUser, alias: string): { sql: string; replacements: unknown[] } {
  switch (user.role) {
    case 'admin':
      return { sql: '1 = 1', replacements: [] };
    case 'manager':
    case 'specialist':
      return { sql: `${alias}.territory_id IN (?)`, replacements: [user.territoryIds.length ? user.territoryIds : [-1]] };
    case 'grower':
      return { sql: `${alias}.id = ?`, replacements: [user.accountId ?? -1] };
    default:
      return { sql: '1 = 0', replacements: [] };
  }
}
