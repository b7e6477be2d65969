// The rules a visit's time must keep: inside working hours, inside the grower's window, and clear
// of the specialist's other visits. Used by visit changes, calendar drags and week-plan commits,
// so every path refuses the same things with the same reasons.
import { Op, Sequelize as S, type Transaction } from 'sequelize';
import { Account, User, Visit } from '../../db/models/index.js';
import { AppError } from '../../http/errors.js';
import type { Settings } from '../settings/settings.service.js';
import { clock, toLocal } from './local-time.js';

export interface Slot {
  startsAt: Date;
  durationMin: number;
  windowStartMin: number | null;
  windowEndMin: number | null;
}

/** Visit statuses that hold a specialist's time. */
export const BUSY_STATUSES = ['requested', 'planned', 'done'] as const;
/** Statuses whose time is checked when set or moved; a done visit records what happened. */
export const SCHEDULED_STATUSES = ['requested', 'planned'] as const;

function localSpan(slot: Slot, timeZone: string) {
  const start = toLocal(slot.startsAt, timeZone);
  const end = toLocal(new Date(slot.startsAt.getTime() + slot.durationMin * 60_000), timeZone);
  // A visit running past midnight ends at 1440 + minutes of the next day.
  const endMinute = end.date === start.date ? end.minute : end.minute + 1440 * Math.max(1, daysBetween(start.date, end.date));
  return { date: start.date, startMinute: start.minute, endMinute };
}

function daysBetween(a: string, b: string) {
  return Math.round((Date.parse(`${b}T00:00:00Z`) - Date.parse(`${a}T00:00:00Z`)) / 86_400_000);
}

const span = (startMinute: number, endMinute: number) =>
  endMinute > 1440 ? `${clock(startMinute)}–${clock(endMinute - 1440)} the next day` : `${clock(startMinute)}–${clock(endMinute)}`;

/** Why the slot falls outside the dealership's working hours, or null when it fits. */
export function hoursProblem(slot: Slot, settings: Pick<Settings, 'dayStartMin' | 'dayEndMin'>, timeZone: string): string | null {
  const { date, startMinute, endMinute } = localSpan(slot, timeZone);
  if (startMinute >= settings.dayStartMin && endMinute <= settings.dayEndMin) return null;
  return `Outside working hours: visits run ${clock(settings.dayStartMin)}–${clock(settings.dayEndMin)}, and this one would run ${span(startMinute, endMinute)} on ${date}.`;
}

/** Why the slot falls outside the grower's time window, or null when it fits (or there is none). */
export function windowProblem(slot: Slot, timeZone: string): string | null {
  if (slot.windowStartMin === null || slot.windowEndMin === null) return null;
  const { date, startMinute, endMinute } = localSpan(slot, timeZone);
  if (startMinute >= slot.windowStartMin && endMinute <= slot.windowEndMin) return null;
  return `Outside the grower's window of ${clock(slot.windowStartMin)}–${clock(slot.windowEndMin)}: this visit would run ${span(startMinute, endMinute)} on ${date}.`;
}

/** 400 with the reason on the field that moved the visit. */
export function assertSlotFits(slot: Slot, settings: Pick<Settings, 'dayStartMin' | 'dayEndMin'>, timeZone: string, field = 'startsAt') {
  const hours = hoursProblem(slot, settings, timeZone);
  if (hours) throw new AppError('outside_hours', 400, hours, { fields: { [field]: hours } });
  const window = windowProblem(slot, timeZone);
  if (window) throw new AppError('outside_window', 400, window, { fields: { [field]: window } });
}

/**
 * Locks the specialist's user row for the rest of the transaction, so two changes to the same
 * person's diary run one after the other and cannot both pass the overlap check.
 */
export async function lockDiary(specialistId: number, transaction: Transaction) {
  await User.findByPk(specialistId, { attributes: ['id'], lock: transaction.LOCK.UPDATE, transaction });
}

/** The first other visit of the specialist that overlaps the slot, or null. */
export async function findOverlap(specialistId: number, slot: Pick<Slot, 'startsAt' | 'durationMin'>, ignoreIds: number[], transaction?: Transaction) {
  const end = new Date(slot.startsAt.getTime() + slot.durationMin * 60_000);
  return Visit.findOne({
    where: {
      specialistId,
      status: { [Op.in]: [...BUSY_STATUSES] },
      ...(ignoreIds.length ? { id: { [Op.notIn]: ignoreIds } } : {}),
      startsAt: { [Op.lt]: end },
      [Op.and]: [S.where(S.literal('DATE_ADD(`Visit`.`starts_at`, INTERVAL `Visit`.`duration_min` MINUTE)'), Op.gt, slot.startsAt)],
    },
    include: [{ model: Account, as: 'account', attributes: ['id', 'name'] }],
    order: [['startsAt', 'ASC']],
    transaction,
  });
}

/** 409 naming the visit in the way. */
export async function assertNoOverlap(specialistId: number, slot: Pick<Slot, 'startsAt' | 'durationMin'>, ignoreIds: number[], timeZone: string, transaction: Transaction, field = 'startsAt') {
  const other = await findOverlap(specialistId, slot, ignoreIds, transaction);
  if (!other) return;
  throw overlapError(other, timeZone, field);
}

export function overlapError(other: Visit, timeZone: string, field: string) {
  const start = toLocal(other.startsAt!, timeZone);
  const name = (other as Visit & { account?: Account }).account?.name ?? `visit ${other.id}`;
  const message = `Overlaps another visit of the same specialist: ${name}, ${start.date} ${span(start.minute, start.minute + other.durationMin)}.`;
  return new AppError('overlap', 409, message, { fields: { [field]: message }, conflictingVisitId: other.id });
}
