import { Op, type Order, type WhereOptions } from 'sequelize';
import type { AccountListQuery } from '../../../shared/schemas/accounts.js';
import { Account, AuditEvent, Contact, FarmSite, Planter, Territory, Tractor, User } from '../../db/models/index.js';
import { literal } from 'sequelize';
import { plain } from '../fleet/plain.js';
import { PLANTER_NUMBERS, TRACTOR_NUMBERS } from '../fleet/planters.service.js';

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

const sortColumns: Record<string, string> = { name: 'name', town: 'town', status: 'status', updatedAt: 'updatedAt' };

export async function listAccounts(scope: WhereOptions, query: AccountListQuery) {
  const where: WhereOptions[] = [scope];
  if (query.q) {
    const like = `%${query.q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
    where.push({ [Op.or]: [{ name: { [Op.like]: like } }, { town: { [Op.like]: like } }] });
  }
  if (query.territoryId) where.push({ territoryId: query.territoryId });
  if (query.status) where.push({ status: query.status });
  const desc = query.sort.startsWith('-');
  const column = sortColumns[query.sort.replace(/^-/, '')] ?? 'name';
  const order: Order = [[column, desc ? 'DESC' : 'ASC'], ['id', 'ASC']];
  const whereAll = { [Op.and]: where };
  // The count needs no joins and the page only the list's columns: both stay cheap on large books.
  const [count, rows] = await Promise.all([
    Account.count({ where: whereAll }),
    Account.findAll({
      where: whereAll,
      attributes: ['id', 'name', 'status', 'town', 'state', 'territoryId', 'specialistId', 'lat', 'lng'],
      include,
      order,
      limit: query.pageSize,
      offset: (query.page - 1) * query.pageSize,
    }),
  ]);
  return { items: rows.map((r) => toSummary(r as Loaded)), total: count };
}

export async function findAccount(scope: WhereOptions, id: number) {
  const account = await Account.findOne({ where: { [Op.and]: [scope, { id }] }, include });
  return account ? toDetail(account as Loaded) : null;
}

/**
 * The account with its whole fleet summary. A fixed number of queries whatever the fleet's size
 * (one per kind of record), never one per planter.
 */
export async function findAccountWithFleet(scope: WhereOptions, id: number) {
  const account = await findAccount(scope, id);
  if (!account) return null;
  const [contacts, farmSites, tractors, planters] = await Promise.all([
    Contact.findAll({ where: { accountId: id }, order: [['name', 'ASC']] }),
    FarmSite.findAll({ where: { accountId: id }, order: [['name', 'ASC']] }),
    Tractor.findAll({ where: { accountId: id }, order: [['name', 'ASC']] }),
    Planter.findAll({
      where: { accountId: id },
      attributes: { include: [[literal("(SELECT COUNT(*) FROM installs i WHERE i.planter_id = `Planter`.`id` AND i.status = 'installed')"), 'installCount']] },
      order: [['name', 'ASC']],
    }),
  ]);
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
