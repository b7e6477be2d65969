// Farm visits: list within the user's scope, create (staff, or a grower's request), change with
// the version the client loaded, delete. Every change to a time passes the schedule rules.
import { Op, literal, type Includeable, type Sequelize, type Transaction, type WhereOptions } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import { VISIT_PURPOSE_LABELS, type VisitCreateInput, type VisitListQuery, type VisitUpdateInput, type VisitView } from '../../../shared/schemas/visits.js';
import { accountScope } from '../../auth/access.js';
import { Account, Contact, Planter, RoadmapItem, User, UserTerritory, Visit } from '../../db/models/index.js';
import { AppError, notFound, validationError } from '../../http/errors.js';
import { accountFor, assertVersion, audit, diff, mapLockError } from '../fleet/fleet-access.js';
import { getSettings, type Settings } from '../settings/settings.service.js';
import { clock, fromLocal, timeZoneOf, toLocal } from './local-time.js';
import { assertNoOverlap, assertSlotFits, lockDiary, SCHEDULED_STATUSES } from './schedule-rules.js';

type VisitRow = Visit & { account: Account; specialist: User | null };

export function visitIncludes(accountWhere?: WhereOptions): Includeable[] {
  return [
    { model: Account, as: 'account', attributes: ['id', 'name', 'town', 'lat', 'lng', 'territoryId', 'address', 'state'], where: accountWhere, required: true },
    { model: User, as: 'specialist', attributes: ['id', 'name'], required: false },
  ];
}

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

/** A visit as the API sends it (never a model instance). */
export function toView(row: Visit): VisitView {
  const v = row as VisitRow;
  const startsAt = v.startsAt ? new Date(v.startsAt) : null;
  return {
    id: v.id,
    accountId: v.accountId,
    accountName: v.account?.name ?? '',
    town: v.account?.town ?? null,
    lat: num(v.account?.lat),
    lng: num(v.account?.lng),
    specialistId: v.specialistId,
    specialistName: v.specialist?.name ?? null,
    planterId: v.planterId,
    purpose: v.purpose,
    status: v.status,
    startsAt: startsAt ? startsAt.toISOString() : null,
    endsAt: startsAt ? new Date(startsAt.getTime() + v.durationMin * 60_000).toISOString() : null,
    durationMin: v.durationMin,
    windowStartMin: v.windowStartMin,
    windowEndMin: v.windowEndMin,
    fixed: Boolean(v.fixed),
    notes: v.notes,
    checklist: v.checklist ?? [],
    roadmapItemIds: v.roadmapItemIds ?? [],
    requestedByContactId: v.requestedByContactId,
    version: v.version,
    updatedAt: new Date(v.updatedAt).toISOString(),
  };
}

export async function loadViews(ids: number[], transaction?: Transaction): Promise<VisitView[]> {
  if (!ids.length) return [];
  const rows = await Visit.findAll({ where: { id: ids }, include: visitIncludes(), transaction });
  const byId = new Map(rows.map((r) => [r.id, toView(r)]));
  return ids.map((id) => byId.get(id)!).filter(Boolean);
}

function boundary(value: string, timeZone: string): Date {
  return value.length === 10 ? fromLocal(value, 0, timeZone) : new Date(value);
}

/** Anyone signed in: visits on the accounts they may see, filtered and paged. */
export async function listVisits(user: SessionUser, query: VisitListQuery) {
  const timeZone = timeZoneOf(await getSettings());
  const where: WhereOptions[] = [];
  if (query.from || query.to) {
    const range: Record<symbol, Date> = {};
    if (query.from) range[Op.gte] = boundary(query.from, timeZone);
    if (query.to) range[Op.lt] = boundary(query.to, timeZone);
    where.push({ startsAt: range });
  }
  if (query.specialistId) where.push({ specialistId: query.specialistId });
  if (query.accountId) where.push({ accountId: query.accountId });
  if (query.status?.length) where.push({ status: { [Op.in]: query.status } });
  const { rows, count } = await Visit.findAndCountAll({
    where: { [Op.and]: where },
    include: visitIncludes(accountScope(user)),
    // Scheduled visits in time order, then the unscheduled requests.
    order: [[literal('`Visit`.`starts_at` IS NULL'), 'ASC'], ['startsAt', 'ASC'], ['id', 'ASC']],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    distinct: true,
  });
  return { items: rows.map(toView), total: count };
}

export async function getVisit(user: SessionUser, id: number): Promise<VisitView> {
  const row = await Visit.findByPk(id, { include: visitIncludes() });
  if (!row) throw notFound('That visit');
  await accountFor(user, row.accountId, 'read');
  return toView(row);
}

/** Planter, contact and roadmap items named by a visit must belong to its account. */
async function checkRefs(accountId: number, v: { planterId?: number | null; requestedByContactId?: number | null; roadmapItemIds?: number[] }, transaction: Transaction) {
  const fields: Record<string, string> = {};
  if (v.planterId && !(await Planter.findOne({ where: { id: v.planterId, accountId }, attributes: ['id'], transaction }))) fields.planterId = 'That planter is not in this operation';
  if (v.requestedByContactId && !(await Contact.findOne({ where: { id: v.requestedByContactId, accountId }, attributes: ['id'], transaction }))) {
    fields.requestedByContactId = 'That contact is not in this operation';
  }
  if (v.roadmapItemIds?.length) {
    const found = await RoadmapItem.count({ where: { id: v.roadmapItemIds, accountId }, transaction });
    if (found !== new Set(v.roadmapItemIds).size) fields.roadmapItemIds = 'Some of those roadmap items are not in this operation';
  }
  if (Object.keys(fields).length) throw validationError(fields);
}

async function coversTerritory(userId: number, territoryId: number, transaction: Transaction) {
  const person = await User.findByPk(userId, { attributes: ['id', 'role', 'disabled'], transaction });
  if (!person || person.disabled || !['specialist', 'manager'].includes(person.role)) return false;
  return Boolean(await UserTerritory.findOne({ where: { userId, territoryId }, transaction }));
}

/** The assignee must be an active specialist or manager covering the account's territory. */
async function checkAssignee(specialistId: number, territoryId: number, transaction: Transaction) {
  const person = await User.findByPk(specialistId, { attributes: ['id', 'role', 'disabled'], transaction });
  if (!person || person.disabled || !['specialist', 'manager'].includes(person.role)) throw validationError({ specialistId: 'No active specialist has that id' });
  if (!(await UserTerritory.findOne({ where: { userId: specialistId, territoryId }, transaction }))) {
    throw validationError({ specialistId: "That specialist does not cover this account's territory" });
  }
}

interface Merged {
  status: Visit['status'];
  startsAt: Date | null;
  durationMin: number;
  windowStartMin: number | null;
  windowEndMin: number | null;
  fixed: boolean;
  specialistId: number | null;
}

/** Rules over the whole visit after a change (a PATCH may send one end of a pair only). */
function checkMerged(v: Merged, settings: Settings) {
  const fields: Record<string, string> = {};
  if ((v.windowStartMin === null) !== (v.windowEndMin === null)) fields[v.windowStartMin === null ? 'windowStartMin' : 'windowEndMin'] = 'Give both ends of the time window, or neither';
  else if (v.windowStartMin !== null && v.windowEndMin !== null) {
    if (v.windowEndMin <= v.windowStartMin) fields.windowEndMin = 'The time window closes before it opens';
    else if (v.windowEndMin - v.windowStartMin < v.durationMin) fields.durationMin = 'The visit is longer than its time window';
  }
  const dayMin = settings.dayEndMin - settings.dayStartMin;
  if (v.durationMin > dayMin) fields.durationMin = `The visit is longer than a working day (${dayMin} minutes)`;
  if (v.fixed && !v.startsAt) fields.startsAt = 'A fixed appointment needs a start time';
  if ((v.status === 'planned' || v.status === 'done') && !v.startsAt) fields.startsAt = `A ${v.status} visit needs a start time`;
  if (Object.keys(fields).length) throw validationError(fields);
}

/** Hours, window and overlap, when the visit holds a time that planning cares about. */
async function checkSchedule(v: Merged & { id?: number }, settings: Settings, timeZone: string, transaction: Transaction) {
  if (!v.startsAt || !(SCHEDULED_STATUSES as readonly string[]).includes(v.status)) return;
  const slot = { startsAt: v.startsAt, durationMin: v.durationMin, windowStartMin: v.windowStartMin, windowEndMin: v.windowEndMin };
  assertSlotFits(slot, settings, timeZone);
  if (v.specialistId) {
    await lockDiary(v.specialistId, transaction);
    await assertNoOverlap(v.specialistId, slot, v.id ? [v.id] : [], timeZone, transaction);
  }
}

function visitLabel(purpose: Visit['purpose'], startsAt: Date | null, timeZone: string) {
  if (!startsAt) return VISIT_PURPOSE_LABELS[purpose];
  const local = toLocal(startsAt, timeZone);
  return `${VISIT_PURPOSE_LABELS[purpose]} on ${local.date} at ${clock(local.minute)}`;
}

/** Re-keys field errors of one item of a batch ("startsAt" → "visits.2.startsAt"). */
function withPrefix<T>(prefix: string | null, work: () => Promise<T>): Promise<T> {
  if (!prefix) return work();
  return work().catch((err: unknown) => {
    if (err instanceof AppError && err.details?.fields) {
      const fields = Object.fromEntries(Object.entries(err.details.fields).map(([k, m]) => [`${prefix}.${k}`, m]));
      throw new AppError(err.code, err.status, err.message, { ...err.details, fields });
    }
    throw err;
  });
}

async function createOne(user: SessionUser, input: VisitCreateInput, settings: Settings, timeZone: string, transaction: Transaction): Promise<number> {
  const isGrower = user.role === 'grower';
  const account = await accountFor(user, input.accountId, isGrower ? 'read' : 'edit', transaction);
  const accountSpecialist = (await Account.findByPk(input.accountId, { attributes: ['specialistId'], transaction }))!.specialistId;
  let values = { ...input, startsAt: input.startsAt ? new Date(input.startsAt) : null };
  if (isGrower) {
    // Growers book a check-up or ask for help; the specialist decides when and who.
    if (input.status !== 'requested' || input.startsAt || input.fixed || input.specialistId || input.requestedByContactId) {
      throw new AppError('forbidden', 403, 'Growers can request a visit; your specialist sets its time.');
    }
    values = { ...values, specialistId: accountSpecialist };
  } else if (!values.specialistId) {
    values.specialistId = user.role === 'specialist' && user.territoryIds.includes(account.territoryId) ? user.id : accountSpecialist;
  }
  checkMerged(values, settings);
  await checkRefs(account.id, values, transaction);
  if (input.specialistId) await checkAssignee(input.specialistId, account.territoryId, transaction);
  else if (values.specialistId && !(await coversTerritory(values.specialistId, account.territoryId, transaction))) {
    // The account's recorded specialist may have left the territory: leave the visit unassigned.
    values.specialistId = null;
  }
  await checkSchedule(values, settings, timeZone, transaction);
  const row = await Visit.create(values, { transaction });
  await audit(transaction, { accountId: account.id, userId: user.id, entity: 'visit', entityId: row.id, action: 'create', summary: `${isGrower ? 'Requested' : 'Added'} ${visitLabel(row.purpose, row.startsAt, timeZone)}` });
  return row.id;
}

/** Staff of the account's territory, or a grower requesting a visit on their own account. */
export async function createVisits(sequelize: Sequelize, user: SessionUser, inputs: VisitCreateInput[], batch = false): Promise<VisitView[]> {
  const settings = await getSettings();
  const timeZone = timeZoneOf(settings);
  const ids = await sequelize.transaction(async (transaction) => {
    const created: number[] = [];
    for (const [k, input] of inputs.entries()) created.push(await withPrefix(batch ? `visits.${k}` : null, () => createOne(user, input, settings, timeZone, transaction)));
    return created;
  });
  return loadViews(ids);
}

/** Staff only. Any change of time, length or specialist is checked; a refusal changes nothing. */
export async function updateVisit(sequelize: Sequelize, user: SessionUser, id: number, input: VisitUpdateInput): Promise<VisitView> {
  const settings = await getSettings();
  const timeZone = timeZoneOf(settings);
  await sequelize
    .transaction(async (transaction) => {
      const visit = await Visit.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
      if (!visit) throw notFound('That visit');
      const account = await accountFor(user, visit.accountId, 'edit', transaction);
      assertVersion(visit.version, input.version);
      const { version: _v, ...sent } = input;
      const changes: Record<string, unknown> = { ...sent, ...(sent.startsAt !== undefined ? { startsAt: sent.startsAt ? new Date(sent.startsAt) : null } : {}) };
      const merged: Merged & { id: number } = {
        id,
        status: (changes.status as Visit['status']) ?? visit.status,
        startsAt: changes.startsAt !== undefined ? (changes.startsAt as Date | null) : visit.startsAt ? new Date(visit.startsAt) : null,
        durationMin: sent.durationMin ?? visit.durationMin,
        windowStartMin: sent.windowStartMin !== undefined ? sent.windowStartMin : visit.windowStartMin,
        windowEndMin: sent.windowEndMin !== undefined ? sent.windowEndMin : visit.windowEndMin,
        fixed: sent.fixed ?? Boolean(visit.fixed),
        specialistId: sent.specialistId !== undefined ? sent.specialistId : visit.specialistId,
      };
      checkMerged(merged, settings);
      await checkRefs(visit.accountId, sent, transaction);
      if (sent.specialistId && sent.specialistId !== visit.specialistId) await checkAssignee(sent.specialistId, account.territoryId, transaction);
      const before = toView(visit);
      const moved =
        (changes.startsAt !== undefined && (changes.startsAt as Date | null)?.getTime() !== (visit.startsAt ? new Date(visit.startsAt).getTime() : undefined)) ||
        (sent.durationMin !== undefined && sent.durationMin !== visit.durationMin) ||
        (sent.specialistId !== undefined && sent.specialistId !== visit.specialistId) ||
        (sent.status !== undefined && sent.status !== visit.status) ||
        sent.windowStartMin !== undefined ||
        sent.windowEndMin !== undefined;
      if (moved) await checkSchedule(merged, settings, timeZone, transaction);
      const recorded = diff(before as unknown as Record<string, unknown>, { ...sent, ...(changes.startsAt !== undefined ? { startsAt: merged.startsAt?.toISOString() ?? null } : {}) });
      visit.set(changes as never);
      await visit.save({ transaction });
      await audit(transaction, { accountId: visit.accountId, userId: user.id, entity: 'visit', entityId: id, action: 'update', summary: `Changed ${visitLabel(visit.purpose, merged.startsAt, timeZone)}`, changes: recorded });
    })
    .catch(mapLockError);
  return (await loadViews([id]))[0];
}

export async function deleteVisit(sequelize: Sequelize, user: SessionUser, id: number) {
  const timeZone = timeZoneOf(await getSettings());
  await sequelize.transaction(async (transaction) => {
    const visit = await Visit.findByPk(id, { transaction });
    if (!visit) throw notFound('That visit');
    await accountFor(user, visit.accountId, 'edit', transaction);
    await visit.destroy({ transaction });
    await audit(transaction, { accountId: visit.accountId, userId: user.id, entity: 'visit', entityId: id, action: 'delete', summary: `Removed ${visitLabel(visit.purpose, visit.startsAt, timeZone)}` });
  });
}
