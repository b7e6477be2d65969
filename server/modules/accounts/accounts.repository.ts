import { Op, QueryTypes, type Transaction, type WhereOptions } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { accountScopeSql } from '../../auth/access.js';
import type { AccountListQuery } from '../../../shared/schemas/accounts.js';
import { Account, AuditEvent, Contact, FarmSite, Planter, Territory, Tractor, User } from '../../db/models/index.js';
import { literal } from 'sequelize';
import { plainSelect } from '../../db/plain-select.js';
import { countRows } from '../fleet/list-totals.js';
import { plain } from '../fleet/plain.js';
import { PLANTER_NUMBERS, TRACTOR_NUMBERS } from '../fleet/planters.service.js';
import { likeContains } from '../../db/like.js';

const include = [
  { model: Territory, as: 'territory', attributes: ['id', 'name'] },
  { model: User, as: 'specialist', attributes: ['id', 'name'] },
];

type Loaded = Account & { territory?: Territory | null; specialist?: User | null };

export type AccountSummary = ReturnType<typeof toSummary>;

function toSummary(a: Loaded) {
  return {
    id: a.id,
    name: a.name,
    status: a.status,
    town: a.town,
    state: a.state,
    territoryId: a.territoryId,
    territoryName: a.territory?.name ?? null,
    specialistId: a.specialistId,
    specialistName: a.specialist?.name ?? null,
    lat: a.lat === null ? null : Number(a.lat),
    lng: a.lng === null ? null : Number(a.lng),
  };
}

function toDetail(a: Loaded) {
  return { ...toSummary(a), address: a.address, notes: a.notes, acresByCrop: a.acresByCrop ?? {}, version: a.version, updatedAt: a.updatedAt };
}

const sortColumns: Record<string, string[]> = { name: ['name', 'town'], town: ['town', 'name'], status: ['status', 'name'], updatedAt: ['updated_at'] };

type SummaryRow = { id: number; name: string; status: AccountSummary['status']; town: string | null; state: string | null; territoryId: number; territoryName: string | null; specialistId: number | null; specialistName: string | null; lat: string | number | null; lng: string | number | null };

/**
 * One page of the accounts a user may see. The busiest read of the app, so plain SQL: a count
 * (cached while the tables are unchanged, see list-totals.ts), and a page whose ids are found on the narrow (name, town) index before the rows and their
 * territory and specialist names are read ("deferred join"), so that a deep page or a search
 * does not sort whole rows.
 */
export async function listAccounts(user: SessionUser, query: AccountListQuery) {
  const sequelize = Account.sequelize!;
  const scope = accountScopeSql(user, 'a');
  const conditions = [scope.sql];
  const replacements: unknown[] = [...scope.replacements];
  if (query.q) {
    const like = likeContains(query.q);
    conditions.push('(a.name LIKE ? OR a.town LIKE ?)');
    replacements.push(like, like);
  }
  if (query.territoryId) {
    conditions.push('a.territory_id = ?');
    replacements.push(query.territoryId);
  }
  if (query.status) {
    conditions.push('a.status = ?');
    replacements.push(query.status);
  }
  const where = conditions.join(' AND ');
  const dir = query.sort.startsWith('-') ? 'DESC' : 'ASC';
  // Ties are broken by the next column and then the id, in the same direction, so that an index
  // read backwards serves a descending sort.
  const orderBy = [...(sortColumns[query.sort.replace(/^-/, '')] ?? sortColumns.name), 'id'].map((c) => `a.${c} ${dir}`).join(', ');
  const [total, rows] = await Promise.all([
    countRows(sequelize, `SELECT COUNT(*) AS total FROM accounts a WHERE ${where}`, replacements),
    plainSelect<SummaryRow>(
      sequelize,
      'SELECT a.id, a.name, a.status, a.town, a.state, a.territory_id AS territoryId, t.name AS territoryName, a.specialist_id AS specialistId, s.name AS specialistName, a.lat, a.lng ' +
        `FROM (SELECT a.id FROM accounts a WHERE ${where} ORDER BY ${orderBy} LIMIT ? OFFSET ?) page ` +
        'JOIN accounts a ON a.id = page.id LEFT JOIN territories t ON t.id = a.territory_id LEFT JOIN users s ON s.id = a.specialist_id ' +
        `ORDER BY ${orderBy}`,
      [...replacements, query.pageSize, (query.page - 1) * query.pageSize],
    ),
  ]);
  return {
    items: rows.map((r) => ({ ...r, lat: r.lat === null ? null : Number(r.lat), lng: r.lng === null ? null : Number(r.lng) })),
    total,
  };
}

export async function findAccount(scope: WhereOptions, id: number, transaction?: Transaction) {
  const account = await Account.findOne({ where: { [Op.and]: [scope, { id }] }, include, transaction });
  return account ? toDetail(account as Loaded) : null;
}

/**
 * The account with its whole fleet summary. A fixed number of queries whatever the fleet's size
 * (one per kind of record), never one per planter. Inside a transaction (a create answering with
 * what it saved) the reads go one after another on its connection.
 */
export async function findAccountWithFleet(scope: WhereOptions, id: number, transaction?: Transaction) {
  const account = await findAccount(scope, id, transaction);
  if (!account) return null;
  const reads = [
    () => Contact.findAll({ where: { accountId: id }, order: [['name', 'ASC']], transaction }),
    () => FarmSite.findAll({ where: { accountId: id }, order: [['name', 'ASC']], transaction }),
    () => Tractor.findAll({ where: { accountId: id }, order: [['name', 'ASC']], transaction }),
    () =>
      Planter.findAll({
        where: { accountId: id },
        attributes: { include: [[literal('`Planter`.`installed_count`'), 'installCount']] },
        order: [['name', 'ASC']],
        transaction,
      }),
  ] as const;
  const [contacts, farmSites, tractors, planters] = transaction
    ? [await reads[0](), await reads[1](), await reads[2](), await reads[3]()]
    : await Promise.all([reads[0](), reads[1](), reads[2](), reads[3]()]);
  return {
    ...account,
    contacts: contacts.map((c) => plain(c)),
    farmSites: farmSites.map((f) => plain(f, ['lat', 'lng'])),
    tractors: tractors.map((t) => plain(t, TRACTOR_NUMBERS)),
    planters: planters.map((p) => ({ ...plain(p, PLANTER_NUMBERS), installCount: Number(p.get('installCount')) })),
  };
}

export async function accountAudit(id: number, limit = 200) {
  const rows = await AuditEvent.findAll({ where: { accountId: id }, order: [['at', 'DESC'], ['id', 'DESC']], limit });
  const userIds = [...new Set(rows.map((r) => r.userId).filter((u): u is number => u !== null))];
  const users = userIds.length ? await User.findAll({ where: { id: userIds }, attributes: ['id', 'name'] }) : [];
  const names = new Map(users.map((u) => [u.id, u.name]));
  return rows.map((r) => ({ id: r.id, at: r.at, entity: r.entity, entityId: r.entityId, action: r.action, summary: r.summary, changes: r.changes, userId: r.userId, userName: r.userId ? names.get(r.userId) ?? null : null }));
}
