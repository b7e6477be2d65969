// Seasons and planting-window days as the reminder screens show them. Window days are 'MM-DD'
// (they recur every season); the date boxes hold a full date in the season being looked at.
import { parseMonthDay } from '@shared/calc/season-calendar';

/**
 * The season reminders are being prepared for: after midsummer the next year's planting is the
 * one ahead (common practice: pre-season work starts after harvest).
 */
export function comingSeason(todayIso: string): number {
  const year = Number(todayIso.slice(0, 4));
  const month = Number(todayIso.slice(5, 7));
  return month >= 7 ? year + 1 : year;
}

/** Today in UTC as YYYY-MM-DD: the server decides what is due by the UTC day. */
export function todayUtcIso(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}

/** '04-15' in season 2027 → '2027-04-15' for a date box; '' when the day is not valid. */
export function dateInputFromMonthDay(season: number, monthDay: string): string {
  const md = parseMonthDay(monthDay);
  if (!md) return '';
  return `${String(season).padStart(4, '0')}-${String(md.month).padStart(2, '0')}-${String(md.day).padStart(2, '0')}`;
}

/** '2027-04-15' from a date box → '04-15'; '' when the box is empty or malformed. */
export function monthDayFromDateInput(value: string): string {
  const m = /^\d{4}-(\d{2})-(\d{2})$/.exec(value);
  return m ? `${m[1]}-${m[2]}` : '';
}

const MONTH_DAY = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', timeZone: 'UTC' });
const LONG_DATE = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' });
const WEEKDAY_DATE = new Intl.DateTimeFormat('en-US', { weekday: 'short', month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' });

/** '04-15' → 'Apr 15'. */
export function formatMonthDay(monthDay: string): string {
  const md = parseMonthDay(monthDay);
  if (!md) return monthDay;
  return MONTH_DAY.format(new Date(Date.UTC(2027, md.month - 1, md.day)));
}

/** '2027-04-15' → 'Apr 15, 2027' (a calendar day, never shifted by the browser's zone). */
export function formatIsoDay(iso: string, withWeekday = false): string {
  const d = new Date(`${iso.slice(0, 10)}T00:00:00Z`);
  if (Number.isNaN(d.getTime())) return iso;
  return (withWeekday ? WEEKDAY_DATE : LONG_DATE).format(d);
}
