import type { Transaction } from 'sequelize';
import { OptimisticLockError } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { canEditAccount, canSeeAccount } from '../../auth/access.js';
import { Account, AuditEvent } from '../../db/models/index.js';
import { AppError, notFound } from '../../http/errors.js';

/**
 * Loads the account a fleet record belongs to and checks the user's right to it: outside their
 * scope reads as 404 (no hint it exists); a grower may read but never change (403).
 */
export async function accountFor(user: SessionUser, accountId: number, mode: 'read' | 'edit', transaction?: Transaction) {
  const account = await Account.findByPk(accountId, { attributes: ['id', 'territoryId', 'name'], transaction });
  if (!account || !canSeeAccount(user, account)) throw notFound('That account');
  if (mode === 'edit' && !canEditAccount(user, account)) throw new AppError('forbidden', 403, 'Growers can read their fleet but not change it. Ask your specialist.');
  return account;
}

export function staleRecord(): AppError {
  return new AppError('stale', 409, 'Someone else changed this record since you opened it. Reload to see their changes, then make yours again.');
}

/** Compares the version the client loaded with the stored one; the save itself re-checks in SQL. */
export function assertVersion(stored: number, sent: number | undefined) {
  if (sent === undefined) throw new AppError('validation', 400, 'Some fields need attention.', { fields: { version: 'The record version is missing: reload and try again' } });
  if (stored !== sent) throw staleRecord();
}

export function mapLockError(err: unknown): never {
  if (err instanceof OptimisticLockError) throw staleRecord();
  throw err;
}

/** One line in the account's audit trail, written in the same transaction as the change. */
export async function audit(
  transaction: Transaction,
  entry: { accountId: number | null; userId: number; entity: string; entityId: number | null; action: 'create' | 'update' | 'delete' | 'upload' | 'import' | 'stage'; summary: string; changes?: Record<string, unknown> | null },
) {
  await AuditEvent.create({ at: new Date(), changes: null, ...entry }, { transaction });
}

/** The fields that differ between a stored record and an update, as { field: [before, after] }. */
export function diff(before: Record<string, unknown>, after: Record<string, unknown>) {
  const changes: Record<string, [unknown, unknown]> = {};
  for (const [key, value] of Object.entries(after)) {
    if (key === 'version') continue;
    if (JSON.stringify(before[key] ?? null) !== JSON.stringify(value ?? null)) changes[key] = [before[key] ?? null, value ?? null];
  }
  return changes;
}
