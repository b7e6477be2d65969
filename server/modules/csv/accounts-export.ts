// CSV exports of the accounts and contacts a user may see, in the file layout the import reads back.
import { Op, type Order, type WhereOptions } from 'sequelize';
import { crops } from '../../../shared/schemas/accounts.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import {
  accountFileColumns,
  acresColumn,
  contactExportColumns,
  guardFormula,
  toCsv,
  type AccountExportQuery,
  type AccountFileColumn,
  type ContactExportQuery,
} from '../../../shared/schemas/csv.js';
import { accountScope } from '../../auth/access.js';
import { Account, Contact, Territory, User } from '../../db/models/index.js';
import { likeContains } from '../../db/like.js';

type Loaded = Account & { territory?: Territory | null; specialist?: User | null };

const sortColumns: Record<string, string> = { name: 'name', town: 'town', status: 'status', updatedAt: 'updatedAt' };

/** The accounts in the user's scope that match the list filters, with territory and specialist. */
async function accountsFor(user: SessionUser, query: AccountExportQuery & { accountId?: number }) {
  const where: WhereOptions[] = [accountScope(user)];
  if (query.q) {
    const like = likeContains(query.q);
    where.push({ [Op.or]: [{ name: { [Op.like]: like } }, { town: { [Op.like]: like } }] });
  }
  if (query.territoryId) where.push({ territoryId: query.territoryId });
  if (query.status) where.push({ status: query.status });
  if (query.accountId) where.push({ id: query.accountId });
  const desc = query.sort.startsWith('-');
  const order: Order = [[sortColumns[query.sort.replace(/^-/, '')] ?? 'name', desc ? 'DESC' : 'ASC'], ['id', 'ASC']];
  const rows = await Account.findAll({
    where: { [Op.and]: where },
    include: [
      { model: Territory, as: 'territory', attributes: ['id', 'name'] },
      { model: User, as: 'specialist', attributes: ['id', 'email'] },
    ],
    order,
  });
  return rows as Loaded[];
}

/** Contacts of many accounts, a bounded number of queries (ids sent in slices). */
async function contactsOf(accountIds: number[]) {
  const byAccount = new Map<number, Contact[]>();
  for (let i = 0; i < accountIds.length; i += 1000) {
    const slice = accountIds.slice(i, i + 1000);
    const rows = await Contact.findAll({ where: { accountId: { [Op.in]: slice } }, order: [['id', 'ASC']] });
    for (const c of rows) {
      const list = byAccount.get(c.accountId);
      if (list) list.push(c);
      else byAccount.set(c.accountId, [c]);
    }
  }
  return byAccount;
}

const text = (v: string | null | undefined) => guardFormula(v ?? '');
const number = (v: number | string | null | undefined) => (v === null || v === undefined || v === '' ? '' : String(Number(v)));

function acresOf(a: Account): Record<string, number> {
  const raw = a.acresByCrop as unknown;
  // The JSON column may come back as text from the connector; read it either way.
  return (typeof raw === 'string' ? JSON.parse(raw) : raw ?? {}) as Record<string, number>;
}

function accountCells(a: Loaded): Partial<Record<AccountFileColumn, string>> {
  const acres = acresOf(a);
  return {
    account_ref: String(a.id),
    account_name: text(a.name),
    status: a.status,
    territory: text(a.territory?.name),
    specialist_email: text(a.specialist?.email),
    address: text(a.address),
    town: text(a.town),
    state: text(a.state),
    lat: number(a.lat),
    lng: number(a.lng),
    ...Object.fromEntries(crops.map((c) => [acresColumn(c), number(acres[c])])),
    notes: text(a.notes),
  };
}

function contactCells(c: Contact): Partial<Record<AccountFileColumn, string>> {
  return {
    contact_name: text(c.name),
    contact_role: text(c.roleOnFarm),
    contact_email: text(c.email),
    contact_phone: text(c.phone),
    contact_reminders: c.reminderOptIn ? 'yes' : 'no',
    contact_unsubscribed_at: c.unsubscribedAt ? new Date(c.unsubscribedAt).toISOString() : '',
  };
}

/**
 * Every signed-in role, within its scope: one row per contact with the account's columns repeated
 * (an account without contacts gets one row). The file is the one the import reads.
 */
export async function exportAccountsCsv(user: SessionUser, query: AccountExportQuery): Promise<string> {
  const accounts = await accountsFor(user, query);
  const contacts = await contactsOf(accounts.map((a) => a.id));
  const rows: string[][] = [[...accountFileColumns]];
  for (const a of accounts) {
    const account = accountCells(a);
    const list = contacts.get(a.id) ?? [];
    for (const contact of list.length ? list : [null]) {
      const cells = { ...account, ...(contact ? contactCells(contact) : {}) };
      rows.push(accountFileColumns.map((col) => cells[col] ?? ''));
    }
  }
  return toCsv(rows);
}

/** Every signed-in role, within its scope: one row per contact with its account's name and territory. */
export async function exportContactsCsv(user: SessionUser, query: ContactExportQuery): Promise<string> {
  const accounts = await accountsFor(user, query);
  const contacts = await contactsOf(accounts.map((a) => a.id));
  const rows: string[][] = [[...contactExportColumns]];
  for (const a of accounts) {
    for (const c of contacts.get(a.id) ?? []) {
      const cells: Record<string, string> = { account_ref: String(a.id), account_name: text(a.name), territory: text(a.territory?.name), contact_id: String(c.id), ...contactCells(c) };
      rows.push(contactExportColumns.map((col) => cells[col] ?? ''));
    }
  }
  return toCsv(rows);
}
