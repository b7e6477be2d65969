// Week plans: the chosen visits go to the pure planner (shared/calc/week-planner.ts) with the
// dealership as depot and the working hours, circuity and speed from settings. The specialist's
// visits already planned that week are passed as fixed stops, so the plan routes around them.
// Committing writes the times onto the visits in one transaction, under the schedule rules.
import { Op, type Sequelize } from 'sequelize';
import { haversineKm, roadKm, travelMinutes } from '../../../shared/calc/geo.js';
import { planWeek, validatePlanInput, type PlanProgress, type PlanVisitInput, type PlanWeekInput } from '../../../shared/calc/week-planner.js';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { PlanDayView, PlanStopView, VisitPurpose, VisitView, WeekPlanCommitInput, WeekPlanInput, WeekPlanView, WeekRoutesQuery } from '../../../shared/schemas/visits.js';
import { accountScope, canEditAccount, canSeeAccount } from '../../auth/access.js';
import { Account, Visit } from '../../db/models/index.js';
import { forbidden, notFound, validationError } from '../../http/errors.js';
import { audit, mapLockError, staleRecord } from '../fleet/fleet-access.js';
import { getSettings, type Settings } from '../settings/settings.service.js';
import { addDays, clock, fromLocal, timeZoneOf, toLocal } from '../visits/local-time.js';
import { assertNoOverlap, assertSlotFits, lockDiary, overlapError } from '../visits/schedule-rules.js';
import { resolveSpecialist } from '../visits/scope.js';
import { loadViews, visitIncludes } from '../visits/visits.service.js';
import { depotOf, type Depot } from './depot.js';

type VisitRow = Visit & { account: Account };
const EPS = 1e-6;
/** Stored times are whole seconds; a warning needs more than rounding to be real. */
const WARN_TOLERANCE_MIN = 0.5;
/** Planned visits already in the week go first and never move. */
const KEPT_PRIORITY = 100;

/** Troubleshooting is urgent; a grower's own request comes before visits Rowpath suggested. */
function priorityOf(row: Visit): number {
  if (row.purpose === 'troubleshooting') return 2;
  return row.requestedByContactId ? 1 : 0;
}

export interface PreparedPlan {
  weekStart: string;
  specialist: { id: number; name: string };
  settings: Settings;
  timeZone: string;
  depot: Depot;
  input: PlanWeekInput;
  rows: Map<number, VisitRow>;
  kept: Set<number>;
}

const hasLocation = (row: VisitRow) => row.account.lat !== null && row.account.lng !== null;

/**
 * Staff. Loads and checks everything the planner needs; 400 names the visit (visitIds.<k>) that
 * cannot be planned and why, 404 for a visit outside the user's scope.
 */
export async function prepareWeekPlan(user: SessionUser, body: WeekPlanInput): Promise<PreparedPlan> {
  const settings = await getSettings();
  const timeZone = timeZoneOf(settings);
  const depot = depotOf(settings);
  const specialist = await resolveSpecialist(user, body.specialistId);
  const dates = Array.from({ length: body.days }, (_, i) => addDays(body.weekStart, i));
  const weekFrom = fromLocal(dates[0], 0, timeZone);
  const weekTo = fromLocal(addDays(body.weekStart, body.days), 0, timeZone);

  const found = (await Visit.findAll({ where: { id: body.visitIds }, include: visitIncludes() })) as VisitRow[];
  const byId = new Map(found.map((r) => [r.id, r]));
  const fields: Record<string, string> = {};
  const selected: { row: VisitRow; fixed?: { dayIndex: number; startMin: number } }[] = [];
  body.visitIds.forEach((id, k) => {
    const row = byId.get(id);
    if (!row || !canSeeAccount(user, row.account)) throw notFound(`Visit ${id}`);
    if (!canEditAccount(user, row.account)) throw forbidden();
    const name = row.account.name;
    const key = `visitIds.${k}`;
    if (row.status === 'done' || row.status === 'cancelled') fields[key] = `${name}: the visit is already ${row.status}`;
    else if (row.specialistId && row.specialistId !== specialist.id) fields[key] = `${name}: the visit is assigned to another specialist`;
    else if (!specialist.territoryIds.includes(row.account.territoryId)) fields[key] = `${name}: ${specialist.name} does not cover this account's territory`;
    else if (!hasLocation(row)) fields[key] = `${name}: the account has no map location; add it on the account first`;
    else if (row.fixed) {
      if (!row.startsAt) fields[key] = `${name}: a fixed appointment needs a start time`;
      else {
        const local = toLocal(new Date(row.startsAt), timeZone);
        const dayIndex = dates.indexOf(local.date);
        if (dayIndex < 0) fields[key] = `${name}: its appointment is on ${local.date}, outside the days being planned`;
        else selected.push({ row, fixed: { dayIndex, startMin: local.minute } });
      }
    } else selected.push({ row });
  });
  if (Object.keys(fields).length) throw validationError(fields, 'Some visits cannot be planned.');

  // The specialist's other visits that week hold their times; ones that could not be routed
  // (no location, outside the day, overlapping an earlier one) are left out of the plan.
  const others = (await Visit.findAll({
    where: { specialistId: specialist.id, status: { [Op.in]: ['planned', 'done'] }, startsAt: { [Op.gte]: weekFrom, [Op.lt]: weekTo }, id: { [Op.notIn]: body.visitIds } },
    include: visitIncludes(),
    order: [['startsAt', 'ASC']],
  })) as VisitRow[];
  const kept: { row: VisitRow; dayIndex: number; startMin: number }[] = [];
  for (const row of others) {
    if (!hasLocation(row)) continue;
    const local = toLocal(new Date(row.startsAt!), timeZone);
    const dayIndex = dates.indexOf(local.date);
    if (dayIndex < 0 || local.minute < settings.dayStartMin || local.minute + row.durationMin > settings.dayEndMin) continue;
    const previous = kept[kept.length - 1];
    if (previous && previous.dayIndex === dayIndex && previous.startMin + previous.row.durationMin > local.minute) continue;
    kept.push({ row, dayIndex, startMin: local.minute });
  }

  const point = (row: VisitRow) => ({ id: String(row.id), lat: Number(row.account.lat), lng: Number(row.account.lng), serviceMin: row.durationMin });
  const visits: PlanVisitInput[] = [
    ...selected.map(({ row, fixed }) => ({
      ...point(row),
      ...(row.windowStartMin !== null && row.windowEndMin !== null ? { window: { startMin: row.windowStartMin, endMin: row.windowEndMin } } : {}),
      ...(fixed ? { fixed } : {}),
      priority: priorityOf(row),
    })),
    ...kept.map(({ row, dayIndex, startMin }) => ({ ...point(row), fixed: { dayIndex, startMin }, priority: KEPT_PRIORITY })),
  ];
  const input: PlanWeekInput = {
    depot: { lat: depot.lat, lng: depot.lng },
    days: dates.map((date) => ({ date, startMin: settings.dayStartMin, endMin: settings.dayEndMin })),
    visits,
    circuityFactor: settings.circuityFactor,
    avgSpeedKmh: settings.avgSpeedKmh,
  };

  const issues = validatePlanInput(input);
  if (issues.length) {
    const out: Record<string, string> = {};
    for (const issue of issues) {
      let key = issue.path.join('.');
      let message = issue.message;
      if (issue.path[0] === 'visits' && typeof issue.path[1] === 'number') {
        const v = issue.path[1];
        const row = v < selected.length ? selected[v].row : kept[v - selected.length].row;
        key = v < selected.length ? `visitIds.${body.visitIds.indexOf(row.id)}` : `planned.${row.id}`;
        message = `${row.account.name}: ${issue.message}`;
      } else if (['avgSpeedKmh', 'circuityFactor', 'days', 'depot'].includes(String(issue.path[0]))) {
        message = `Settings: ${issue.message}`;
      }
      out[key] ??= message;
    }
    throw validationError(out, 'Some visits cannot be planned.');
  }

  return {
    weekStart: body.weekStart,
    specialist: { id: specialist.id, name: specialist.name },
    settings,
    timeZone,
    depot,
    input,
    rows: new Map([...selected.map(({ row }) => [row.id, row] as const), ...kept.map(({ row }) => [row.id, row] as const)]),
    kept: new Set(kept.map(({ row }) => row.id)),
  };
}

const round2 = (v: number) => Math.round(v * 100) / 100;

interface StopTime {
  arriveMin: number;
  startMin: number;
  departMin: number;
}

/**
 * The day's times in whole minutes: the same walk as the planner's (leave at the day's start,
 * wait for windows, keep appointments), with each start rounded up to the minute. Null when
 * rounding would break a window, an appointment or the return before the day ends.
 */
function wholeMinuteTimes(prepared: PreparedPlan, dayIndex: number, ids: readonly string[]): StopTime[] | null {
  const { input } = prepared;
  const day = input.days[dayIndex];
  const visitById = new Map(input.visits.map((v) => [v.id, v]));
  const driveMin = (a: { lat: number; lng: number }, b: { lat: number; lng: number }) => travelMinutes(roadKm(haversineKm(a, b), input.circuityFactor), input.avgSpeedKmh);
  const out: StopTime[] = [];
  let clockMin = day.startMin;
  let at: { lat: number; lng: number } = input.depot;
  for (const id of ids) {
    const visit = visitById.get(id)!;
    const arriveMin = clockMin + driveMin(at, visit);
    let startMin = Math.ceil(arriveMin - EPS);
    if (visit.window) startMin = Math.max(startMin, visit.window.startMin);
    if (visit.fixed) {
      if (arriveMin > visit.fixed.startMin + EPS || !Number.isInteger(visit.fixed.startMin)) return null;
      startMin = visit.fixed.startMin;
    }
    const departMin = startMin + visit.serviceMin;
    if (visit.window && departMin > visit.window.endMin + EPS) return null;
    out.push({ arriveMin, startMin, departMin });
    clockMin = departMin;
    at = visit;
  }
  return clockMin + driveMin(at, input.depot) <= day.endMin + EPS ? out : null;
}

/**
 * Runs the planner and shapes its answer. Times are whole minutes; on the rare day where
 * rounding up would break a limit, that day keeps the planner's exact (fractional) minutes.
 */
export function runWeekPlan(prepared: PreparedPlan, onProgress?: (progress: PlanProgress) => void): WeekPlanView {
  const plan = planWeek(prepared.input, onProgress);
  const days: PlanDayView[] = plan.days.map((day, dayIndex) => {
    const inputDay = prepared.input.days[dayIndex];
    const whole = wholeMinuteTimes(prepared, dayIndex, day.stops.map((s) => s.id));
    const times: StopTime[] = whole ?? day.stops.map((s) => ({ arriveMin: s.arriveMin, startMin: s.arriveMin + s.waitMin, departMin: s.departMin }));
    const last = day.stops.length ? prepared.input.visits.find((v) => v.id === day.stops[day.stops.length - 1].id)! : null;
    const returnMin = last
      ? times[times.length - 1].departMin + travelMinutes(roadKm(haversineKm(last, prepared.input.depot), prepared.input.circuityFactor), prepared.input.avgSpeedKmh)
      : inputDay.startMin;
    const stops: PlanStopView[] = day.stops.map((stop, k) => {
      const row = prepared.rows.get(Number(stop.id))!;
      const { arriveMin, startMin, departMin } = times[k];
      return {
        visitId: row.id,
        accountId: row.accountId,
        accountName: row.account.name,
        purpose: row.purpose as VisitPurpose,
        lat: Number(row.account.lat),
        lng: Number(row.account.lng),
        arriveMin: round2(arriveMin),
        waitMin: round2(startMin - arriveMin),
        startMin,
        departMin,
        fixed: Boolean(row.fixed) || prepared.kept.has(row.id),
        kept: prepared.kept.has(row.id),
        version: row.version,
      };
    });
    return {
      date: day.date,
      startMin: inputDay.startMin,
      endMin: inputDay.endMin,
      stops,
      distanceKm: round2(day.distanceKm),
      driveMin: round2(day.driveMin),
      workMin: round2(day.workMin),
      returnMin: round2(returnMin),
    };
  });
  const unplaced = plan.unplaced.map((u) => {
    const row = prepared.rows.get(Number(u.id))!;
    return { visitId: row.id, accountName: row.account.name, reason: prepared.kept.has(row.id) ? `already planned, but ${u.reason}` : u.reason };
  });
  return {
    weekStart: prepared.weekStart,
    specialistId: prepared.specialist.id,
    depot: prepared.depot,
    days,
    unplaced,
    totals: {
      visits: days.reduce((n, d) => n + d.stops.filter((s) => !s.kept).length, 0),
      distanceKm: round2(days.reduce((n, d) => n + d.distanceKm, 0)),
      driveMin: round2(days.reduce((n, d) => n + d.driveMin, 0)),
    },
  };
}

/** The assignments a plan would write: every placed stop that is not already planned. */
export function assignmentsOf(plan: WeekPlanView): WeekPlanCommitInput['assignments'] {
  return plan.days.flatMap((day) => day.stops.filter((s) => !s.kept).map((s) => ({ visitId: s.visitId, date: day.date, startMin: s.startMin, version: s.version })));
}

/**
 * Staff. Writes the times (status planned, assigned to the specialist) in one transaction: a
 * stale version is 409 'stale', a time outside hours or the window 400, an overlap 409
 * 'overlap'; any refusal leaves every visit as it was.
 */
export async function commitAssignments(sequelize: Sequelize, user: SessionUser, body: WeekPlanCommitInput): Promise<VisitView[]> {
  const settings = await getSettings();
  const timeZone = timeZoneOf(settings);
  const ids = body.assignments.map((a) => a.visitId);
  await sequelize
    .transaction(async (transaction) => {
      const specialist = await resolveSpecialist(user, body.specialistId, transaction);
      await lockDiary(specialist.id, transaction);
      const rows = await Visit.findAll({ where: { id: ids }, lock: transaction.LOCK.UPDATE, transaction });
      const accounts = await Account.findAll({ where: { id: [...new Set(rows.map((r) => r.accountId))] }, attributes: ['id', 'name', 'territoryId'], transaction });
      const accountById = new Map(accounts.map((a) => [a.id, a]));
      const byId = new Map(rows.map((r) => [r.id, r]));
      const fields: Record<string, string> = {};
      const slots: { k: number; row: Visit; account: Account; startsAt: Date }[] = [];
      body.assignments.forEach((a, k) => {
        const row = byId.get(a.visitId);
        const account = row && accountById.get(row.accountId);
        if (!row || !account || !canSeeAccount(user, account)) throw notFound(`Visit ${a.visitId}`);
        if (!canEditAccount(user, account)) throw forbidden();
        if (row.version !== a.version) throw staleRecord();
        const startsAt = fromLocal(a.date, a.startMin, timeZone);
        if (row.status === 'done' || row.status === 'cancelled') fields[`assignments.${k}.visitId`] = `${account.name}: the visit is already ${row.status}`;
        else if (row.specialistId && row.specialistId !== specialist.id) fields[`assignments.${k}.visitId`] = `${account.name}: the visit is assigned to another specialist`;
        else if (!specialist.territoryIds.includes(account.territoryId)) fields[`assignments.${k}.visitId`] = `${account.name}: ${specialist.name} does not cover this account's territory`;
        else if (row.fixed && row.startsAt && Math.abs(new Date(row.startsAt).getTime() - startsAt.getTime()) >= 60_000) {
          fields[`assignments.${k}.startMin`] = `${account.name}: a fixed appointment keeps its time; change it on the visit itself`;
        }
        slots.push({ k, row, account, startsAt });
      });
      if (Object.keys(fields).length) throw validationError(fields);
      for (const s of slots) {
        assertSlotFits({ startsAt: s.startsAt, durationMin: s.row.durationMin, windowStartMin: s.row.windowStartMin, windowEndMin: s.row.windowEndMin }, settings, timeZone, `assignments.${s.k}.startMin`);
      }
      // Within the plan itself, then against the rest of the diary.
      const ordered = [...slots].sort((x, y) => x.startsAt.getTime() - y.startsAt.getTime());
      for (let i = 1; i < ordered.length; i++) {
        const prev = ordered[i - 1];
        if (prev.startsAt.getTime() + prev.row.durationMin * 60_000 > ordered[i].startsAt.getTime()) {
          const other = Object.assign(prev.row, { account: prev.account, startsAt: prev.startsAt });
          throw overlapError(other, timeZone, `assignments.${ordered[i].k}.startMin`);
        }
      }
      for (const s of slots) await assertNoOverlap(specialist.id, { startsAt: s.startsAt, durationMin: s.row.durationMin }, ids, timeZone, transaction, `assignments.${s.k}.startMin`);

      for (const s of slots) {
        const before = s.row.startsAt ? new Date(s.row.startsAt).toISOString() : null;
        s.row.set({ startsAt: s.startsAt, status: 'planned', specialistId: specialist.id });
        await s.row.save({ transaction });
        const local = toLocal(s.startsAt, timeZone);
        await audit(transaction, {
          accountId: s.row.accountId,
          userId: user.id,
          entity: 'visit',
          entityId: s.row.id,
          action: 'update',
          summary: `Planned the visit for ${local.date} at ${clock(local.minute)} (week plan)`,
          changes: { startsAt: [before, s.startsAt.toISOString()] },
        });
      }
    })
    .catch(mapLockError);
  return loadViews(ids);
}

/**
 * Anyone staff: the specialist's planned and done visits of the week as day routes from the
 * dealership, with distance, driving time and a warning wherever the times leave too little
 * room to drive (after a calendar drag, for instance).
 */
export async function currentWeekRoutes(user: SessionUser, query: WeekRoutesQuery) {
  const settings = await getSettings();
  const timeZone = timeZoneOf(settings);
  const depot = depotOf(settings);
  const specialist = await resolveSpecialist(user, query.specialistId);
  const dates = Array.from({ length: query.days }, (_, i) => addDays(query.weekStart, i));
  const rows = (await Visit.findAll({
    where: {
      specialistId: specialist.id,
      status: { [Op.in]: ['planned', 'done'] },
      startsAt: { [Op.gte]: fromLocal(dates[0], 0, timeZone), [Op.lt]: fromLocal(addDays(query.weekStart, query.days), 0, timeZone) },
    },
    include: visitIncludes(accountScope(user)),
    order: [['startsAt', 'ASC'], ['id', 'ASC']],
  })) as VisitRow[];
  const leg = (a: { lat: number; lng: number }, b: { lat: number; lng: number }) => {
    const km = roadKm(haversineKm(a, b), settings.circuityFactor);
    return { km, min: travelMinutes(km, settings.avgSpeedKmh) };
  };

  const days = dates.map((date) => {
    const warnings: string[] = [];
    const stops: {
      visitId: number;
      accountId: number;
      accountName: string;
      purpose: VisitPurpose;
      status: Visit['status'];
      lat: number;
      lng: number;
      startMin: number;
      departMin: number;
      legKm: number;
      legDriveMin: number;
      fixed: boolean;
      version: number;
    }[] = [];
    let at: { lat: number; lng: number; departMin: number; name: string } = { ...depot, departMin: settings.dayStartMin, name: 'the dealership' };
    let distanceKm = 0;
    let driveMin = 0;
    let serviceMin = 0;
    for (const row of rows) {
      const local = toLocal(new Date(row.startsAt!), timeZone);
      if (local.date !== date) continue;
      if (!hasLocation(row)) {
        warnings.push(`${row.account.name} has no map location, so it is left off the route.`);
        continue;
      }
      const here = { lat: Number(row.account.lat), lng: Number(row.account.lng) };
      const { km, min } = leg(at, here);
      const startMin = local.minute;
      if (stops.length === 0 && startMin - min < settings.dayStartMin - WARN_TOLERANCE_MIN) {
        warnings.push(`Reaching ${row.account.name} by ${clock(startMin)} means leaving the dealership at ${clock(Math.max(0, startMin - min))}, before the day starts (${clock(settings.dayStartMin)}).`);
      } else if (stops.length > 0 && startMin < at.departMin + min - WARN_TOLERANCE_MIN) {
        const free = Math.max(0, startMin - at.departMin);
        warnings.push(`Not enough time to drive from ${at.name} to ${row.account.name}: ${Math.ceil(min)} min needed, ${Math.round(free)} min free.`);
      }
      distanceKm += km;
      driveMin += min;
      serviceMin += row.durationMin;
      stops.push({
        visitId: row.id,
        accountId: row.accountId,
        accountName: row.account.name,
        purpose: row.purpose as VisitPurpose,
        status: row.status,
        lat: here.lat,
        lng: here.lng,
        startMin: round2(startMin),
        departMin: round2(startMin + row.durationMin),
        legKm: round2(km),
        legDriveMin: round2(min),
        fixed: Boolean(row.fixed),
        version: row.version,
      });
      at = { ...here, departMin: startMin + row.durationMin, name: row.account.name };
    }
    let returnMin: number | null = null;
    if (stops.length) {
      const back = leg(at, depot);
      distanceKm += back.km;
      driveMin += back.min;
      returnMin = round2(at.departMin + back.min);
      if (returnMin > settings.dayEndMin + WARN_TOLERANCE_MIN) warnings.push(`Back at the dealership at ${clock(returnMin)}, after the day ends (${clock(settings.dayEndMin)}).`);
    }
    return {
      date,
      startMin: settings.dayStartMin,
      endMin: settings.dayEndMin,
      stops,
      distanceKm: round2(distanceKm),
      driveMin: round2(driveMin),
      workMin: round2(driveMin + serviceMin),
      returnMin,
      warnings,
    };
  });
  return { weekStart: query.weekStart, specialistId: specialist.id, depot, days };
}
