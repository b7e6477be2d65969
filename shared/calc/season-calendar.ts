// Planting windows and reminder dates. A reminder is sent a number of days before the planting
// window opens; the window start comes from a published planting-date summary (defaults below)
// or from the dealership's own calendar. Dates are ISO calendar days ('2027-04-15'), computed in
// UTC so that a day never shifts with the server's time zone.
import type { Crop } from '../schemas/accounts.js';

/** A month and day that recurs every season, written 'MM-DD' (e.g. '04-15'). */
export type MonthDay = string;

export interface PlantingWindowDefault {
  regionKey: string;
  regionLabel: string;
  crop: Crop;
  windowStart: MonthDay;
  windowEnd: MonthDay;
  /** The publication the dates come from. */
  source: string;
  /** What the source says, in brief, shown beside the dates. */
  sourceText: string;
}

const ISU = 'Iowa State University Integrated Crop Management, Abendroth & Elmore (2010)';
const NASS_KSU = 'USDA-NASS, Agricultural Handbook 628 (2010), as summarised by K-State Extension';

/** Published planting windows (see REFERENCES.md). The demo dealership is in north-central Kansas. */
export const PLANTING_WINDOW_DEFAULTS: readonly PlantingWindowDefault[] = Object.freeze([
  {
    regionKey: 'ks-north-central',
    regionLabel: 'North-central Kansas',
    crop: 'corn',
    windowStart: '04-15',
    windowEnd: '05-15',
    source: NASS_KSU,
    sourceText: 'Kansas corn planting is most active from April 15 to May 15. Statewide dates, used here for the north-central region.',
  },
  {
    regionKey: 'ks-north-central',
    regionLabel: 'North-central Kansas',
    crop: 'soybean',
    windowStart: '05-15',
    windowEnd: '06-20',
    source: NASS_KSU,
    sourceText: 'Kansas soybean planting runs from May 15 to June 20. Statewide dates, used here for the north-central region.',
  },
  {
    regionKey: 'ia-northeast',
    regionLabel: 'Iowa, north-east',
    crop: 'corn',
    windowStart: '04-12',
    windowEnd: '05-02',
    source: ISU,
    sourceText: 'North-east Iowa: corn planted from about April 12 to May 2 reaches 95 % of maximum yield.',
  },
  {
    regionKey: 'ia-northwest-central',
    regionLabel: 'Iowa, north-west and central',
    crop: 'corn',
    windowStart: '04-15',
    windowEnd: '05-18',
    source: ISU,
    sourceText: 'North-west and central Iowa: corn planted from April 15 to May 18 reaches 95 % of maximum yield.',
  },
]);

const DAY_MS = 86_400_000;
const MONTH_DAY = /^(\d{2})-(\d{2})$/;
const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** 'MM-DD' → month and day, or null when it is not a day every year has (Feb 29 is refused). */
export function parseMonthDay(monthDay: string): { month: number; day: number } | null {
  const m = MONTH_DAY.exec(monthDay);
  if (!m) return null;
  const month = Number(m[1]);
  const day = Number(m[2]);
  // 2027 is not a leap year: a window start must exist in every season.
  const probe = new Date(Date.UTC(2027, month - 1, day));
  if (month < 1 || month > 12 || probe.getUTCMonth() !== month - 1 || probe.getUTCDate() !== day) return null;
  return { month, day };
}

function isoToUtcMs(isoDate: string): number {
  const m = ISO_DATE.exec(isoDate);
  if (!m) throw new RangeError(`Not an ISO date: ${isoDate}`);
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  if (new Date(ms).toISOString().slice(0, 10) !== isoDate) throw new RangeError(`Not a calendar date: ${isoDate}`);
  return ms;
}

function utcMsToIso(ms: number): string {
  return new Date(ms).toISOString().slice(0, 10);
}

/** The calendar day of a Date in UTC, as 'YYYY-MM-DD'. */
export function isoDateUtc(at: Date): string {
  return at.toISOString().slice(0, 10);
}

/** The window's first day in a given season: season 2027 + '04-15' → '2027-04-15'. */
export function windowStartIso(season: number, windowStart: MonthDay): string {
  const md = parseMonthDay(windowStart);
  if (!md || !Number.isInteger(season)) throw new RangeError(`Not a window start: ${season} ${windowStart}`);
  return utcMsToIso(Date.UTC(season, md.month - 1, md.day));
}

/** Whole days from one ISO date to another (negative when `toIso` is earlier). */
export function daysBetween(fromIso: string, toIso: string): number {
  return Math.round((isoToUtcMs(toIso) - isoToUtcMs(fromIso)) / DAY_MS);
}

/** The day a reminder goes out: the window start minus the offset in days. */
export function reminderSendDate(windowStartDateIso: string, offsetDays: number): string {
  if (!Number.isInteger(offsetDays) || offsetDays < 0) throw new RangeError(`Offset must be a whole number of days ≥ 0: ${offsetDays}`);
  return utcMsToIso(isoToUtcMs(windowStartDateIso) - offsetDays * DAY_MS);
}

export type ScheduleState = 'upcoming' | 'due' | 'superseded' | 'closed';
export interface ScheduledReminder {
  offsetDays: number;
  sendOn: string;
  /** upcoming: later; due: the one to send today; superseded: a later reminder is already due; closed: the window has opened. */
  state: ScheduleState;
}

/**
 * Every offset's send date and its state on `todayIso`. Only one reminder is due at a time —
 * the one with the latest send date not after today — so a campaign started late sends one
 * message, not a burst of the ones it missed. Nothing is due once the window has opened.
 */
export function reminderSchedule(windowStartDateIso: string, offsetsDays: readonly number[], todayIso: string): ScheduledReminder[] {
  const windowOpened = daysBetween(windowStartDateIso, todayIso) > 0;
  const rows = [...new Set(offsetsDays)]
    .sort((a, b) => b - a)
    .map((offsetDays) => ({ offsetDays, sendOn: reminderSendDate(windowStartDateIso, offsetDays), state: 'upcoming' as ScheduleState }));
  let dueIndex = -1;
  rows.forEach((row, i) => {
    if (daysBetween(row.sendOn, todayIso) >= 0) dueIndex = i;
  });
  rows.forEach((row, i) => {
    if (windowOpened) row.state = 'closed';
    else if (i === dueIndex) row.state = 'due';
    else if (i < dueIndex) row.state = 'superseded';
  });
  return rows;
}

/** The reminder to send on `todayIso`, or null when none is due. */
export function dueReminder(windowStartDateIso: string, offsetsDays: readonly number[], todayIso: string): ScheduledReminder | null {
  return reminderSchedule(windowStartDateIso, offsetsDays, todayIso).find((r) => r.state === 'due') ?? null;
}

/** The default planting window for a region and crop, if one is published. */
export function defaultPlantingWindow(regionKey: string, crop: Crop): PlantingWindowDefault | null {
  return PLANTING_WINDOW_DEFAULTS.find((w) => w.regionKey === regionKey && w.crop === crop) ?? null;
}
