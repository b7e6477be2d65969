// Install labour booked per week against the shop's technician hours. The shop is one for the
// whole dealership, so a week's booked hours count every territory; the items listed (and
// `bookedHoursInScope`) are only those the user may see. Callers: admin, manager, specialist
// (reading); admin and manager (setting a week's hours).
import type { Sequelize } from 'sequelize';
import type { SessionUser } from '../../../shared/schemas/auth.js';
import type { ShopCapacityQuery, ShopWeek } from '../../../shared/schemas/forecast.js';
import { forbidden } from '../../http/errors.js';
import { getSettings, SETTING_DEFAULTS } from '../settings/settings.service.js';
import { visibleItems } from './forecast-scope.js';
import { bookedWeeks, movableItems, setShopWeek, storedShopWeeks } from './forecast.repository.js';

const DAY_MS = 86_400_000;
export const MOVABLE_PER_WEEK = 100;

const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);
const dayMs = (day: string) => Date.parse(`${day}T00:00:00Z`);
const hours = (h: number) => Math.round((h + Number.EPSILON) * 100) / 100;

/** The Monday of the week a date falls in (weeks start on Monday). */
export function weekStartOf(day: string): string {
  const ms = dayMs(day);
  const weekday = (new Date(ms).getUTCDay() + 6) % 7; // Monday 0 … Sunday 6
  return isoDay(ms - weekday * DAY_MS);
}

async function defaultTechnicianHours(): Promise<number> {
  const v = (await getSettings()).technicianHoursPerWeek;
  return typeof v === 'number' && Number.isFinite(v) && v >= 0 ? v : SETTING_DEFAULTS.technicianHoursPerWeek;
}

/** GET /api/shop-capacity — every Monday-started week that overlaps [from, to]. */
export async function shopCapacity(sequelize: Sequelize, user: SessionUser, q: ShopCapacityQuery) {
  const scope = visibleItems(user);
  const fromMonday = weekStartOf(q.from);
  const toMonday = weekStartOf(q.to);
  const toSunday = isoDay(dayMs(toMonday) + 6 * DAY_MS);
  const [defaultHours, stored, booked] = await Promise.all([
    defaultTechnicianHours(),
    storedShopWeeks(sequelize, fromMonday, toMonday),
    bookedWeeks(sequelize, scope, fromMonday, toSunday),
  ]);
  const bookedByWeek = new Map(booked.map((b) => [b.weekStart, b]));
  const weeks: ShopWeek[] = [];
  for (let ms = dayMs(fromMonday); ms <= dayMs(toMonday); ms += 7 * DAY_MS) {
    const weekStart = isoDay(ms);
    const b = bookedByWeek.get(weekStart);
    const technicianHours = stored.get(weekStart) ?? defaultHours;
    const bookedHours = hours(b?.bookedHours ?? 0);
    weeks.push({
      weekStart,
      weekEnd: isoDay(ms + 6 * DAY_MS),
      technicianHours,
      technicianHoursSet: stored.has(weekStart),
      bookedHours,
      bookedHoursInScope: hours(b?.bookedHoursInScope ?? 0),
      itemCountInScope: b?.itemCountInScope ?? 0,
      over: bookedHours > technicianHours,
      hoursOver: hours(Math.max(0, bookedHours - technicianHours)),
      movableItems: [],
      movableCount: 0,
    });
  }
  const overWeeks = weeks.filter((w) => w.over);
  if (overWeeks.length) {
    const items = await movableItems(sequelize, scope, overWeeks.map((w) => w.weekStart));
    const byWeek = new Map(overWeeks.map((w) => [w.weekStart, w]));
    for (const { weekStart, ...item } of items) {
      const week = byWeek.get(weekStart);
      if (!week) continue;
      week.movableCount += 1;
      if (week.movableItems.length < MOVABLE_PER_WEEK) week.movableItems.push(item);
    }
  }
  return {
    from: q.from,
    to: q.to,
    defaultTechnicianHours: defaultHours,
    weeks,
    totals: {
      technicianHours: hours(weeks.reduce((n, w) => n + w.technicianHours, 0)),
      bookedHours: hours(weeks.reduce((n, w) => n + w.bookedHours, 0)),
      bookedHoursInScope: hours(weeks.reduce((n, w) => n + w.bookedHoursInScope, 0)),
      overWeeks: overWeeks.length,
    },
  };
}

/** PUT /api/shop-capacity/weeks/:weekStart — a week's technician hours (null returns it to the default). */
export async function putShopWeek(sequelize: Sequelize, user: SessionUser, weekStart: string, technicianHours: number | null): Promise<ShopWeek> {
  if (user.role !== 'admin' && user.role !== 'manager') throw forbidden();
  await setShopWeek(sequelize, weekStart, technicianHours, user.id);
  const { weeks } = await shopCapacity(sequelize, user, { from: weekStart, to: weekStart });
  return weeks[0];
}
