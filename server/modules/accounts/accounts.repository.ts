import { Op, type Order, type WhereOptions } from 'sequelize';
import type { AccountListQuery } from '../../../shared/schemas/accounts.js';
import { Account, Territory, User } from '../../db/models/index.js';

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
  const { rows, count } = await Account.findAndCountAll({
    where: { [Op.and]: where },
    include,
    order,
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    distinct: true,
  });
  return { items: rows.map((r) => toSummary(r as Loaded)), total: count };
}

export async function findAccount(scope: WhereOptions, id: number) {
  const account = await Account.findOne({ where: { [Op.and]: [scope, { id }] }, include });
  return account ? toDetail(account as Loaded) : null;
}
