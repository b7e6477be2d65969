// Visits are stored as UTC instants, but the dealership works in its own wall-clock time
// (working hours, grower windows and week plans are minutes after local midnight). The browser
// may sit in another zone (a laptop set to UTC, a manager travelling), so every conversion names
// the dealership's zone instead of trusting the browser's.

/** The demo dealership's zone (north-central Kansas); the server uses the same default. */
export const DEALERSHIP_TIME_ZONE = 'America/Chicago';

const MS_PER_MIN = 60_000;
const formatters = new Map<string, Intl.DateTimeFormat>();

function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    formatters.set(timeZone, f);
  }
  return f;
}

interface WallClock {
  year: number;
  month: number;
  day: number;
  hour: number;
  minute: number;
  second: number;
}

function wallClockOf(instant: Date, timeZone: string): WallClock {
  const parts = Object.fromEntries(formatter(timeZone).formatToParts(instant).map((p) => [p.type, p.value]));
  return { year: Number(parts.year), month: Number(parts.month), day: Number(parts.day), hour: Number(parts.hour), minute: Number(parts.minute), second: Number(parts.second) };
}

/** How far the zone's clocks are ahead of UTC at that instant, in ms (negative west of Greenwich). */
function zoneOffsetMs(instant: Date, timeZone: string): number {
  const w = wallClockOf(instant, timeZone);
  return Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second) - Math.floor(instant.getTime() / 1000) * 1000;
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** The zone's date (YYYY-MM-DD) and minutes after its midnight at an instant. */
export function toZoneLocal(instant: Date, timeZone = DEALERSHIP_TIME_ZONE): { date: string; minute: number } {
  const w = wallClockOf(instant, timeZone);
  return { date: `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}`, minute: w.hour * 60 + w.minute + w.second / 60 };
}

/**
 * The instant of a date and minute on the zone's clocks. A wall time skipped by the spring-forward
 * change (02:00–03:00 on that Sunday) falls next to the gap, on the same instant the server picks.
 */
export function fromZoneLocal(dateIso: string, minuteOfDay: number, timeZone = DEALERSHIP_TIME_ZONE): Date {
  const [y, m, d] = dateIso.split('-').map(Number);
  const wallMs = Date.UTC(y, m - 1, d) + Math.round(minuteOfDay * MS_PER_MIN);
  let guess = wallMs - zoneOffsetMs(new Date(wallMs), timeZone);
  const second = wallMs - zoneOffsetMs(new Date(guess), timeZone);
  if (second !== guess) guess = second;
  return new Date(guess);
}

/**
 * A browser Date whose local fields (getHours, getDate…) show the zone's wall clock at the
 * instant. Calendar widgets lay events out by the browser's local fields, so they get these.
 */
export function toWallDate(instant: Date, timeZone = DEALERSHIP_TIME_ZONE): Date {
  const w = wallClockOf(instant, timeZone);
  return new Date(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
}

/** The inverse of toWallDate: the instant a wall-clock Date (local fields) stands for. */
export function fromWallDate(wall: Date, timeZone = DEALERSHIP_TIME_ZONE): Date {
  return fromZoneLocal(wallDateIso(wall), wall.getHours() * 60 + wall.getMinutes() + wall.getSeconds() / 60, timeZone);
}

/** YYYY-MM-DD of a Date's local fields. */
export function wallDateIso(wall: Date): string {
  return `${pad(wall.getFullYear(), 4)}-${pad(wall.getMonth() + 1)}-${pad(wall.getDate())}`;
}

/** A local-fields Date at midnight of an ISO date (for calendar navigation). */
export function wallDateOf(dateIso: string): Date {
  const [y, m, d] = dateIso.split('-').map(Number);
  return new Date(y, m - 1, d);
}

/** The ISO date n calendar days after dateIso. */
export function addDaysIso(dateIso: string, days: number): string {
  const [y, m, d] = dateIso.split('-').map(Number);
  const t = new Date(Date.UTC(y, m - 1, d + days));
  return `${pad(t.getUTCFullYear(), 4)}-${pad(t.getUTCMonth() + 1)}-${pad(t.getUTCDate())}`;
}

/** 0 Sunday … 6 Saturday for an ISO date. */
export function weekdayOf(dateIso: string): number {
  return new Date(`${dateIso}T12:00:00Z`).getUTCDay();
}

/** The Monday on or before the date: Rowpath's weeks run Monday to Sunday. */
export function mondayOf(dateIso: string): string {
  return addDaysIso(dateIso, -((weekdayOf(dateIso) + 6) % 7));
}

/** Today's date at the dealership. */
export function todayAtDealership(now = new Date(), timeZone = DEALERSHIP_TIME_ZONE): string {
  return toZoneLocal(now, timeZone).date;
}

/** "07:30" for 450 minutes after midnight (fractions round to the nearest minute). */
export function clockText(minuteOfDay: number): string {
  const total = Math.round(minuteOfDay);
  return `${pad(Math.floor(total / 60) % 24)}:${pad(total % 60)}`;
}

/** Minutes after midnight from "HH:MM"; null when the text is not a time of day. */
export function minutesFromClock(text: string): number | null {
  const match = /^(\d{1,2}):(\d{2})$/.exec(text.trim());
  if (!match) return null;
  const hours = Number(match[1]);
  const minutes = Number(match[2]);
  if (hours > 24 || minutes > 59 || (hours === 24 && minutes > 0)) return null;
  return hours * 60 + minutes;
}

const weekdayNames = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const monthNames = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "Mon 7 Dec" for 2026-12-07. */
export function shortDateText(dateIso: string): string {
  const [, m, d] = dateIso.split('-').map(Number);
  return `${weekdayNames[weekdayOf(dateIso)]} ${d} ${monthNames[m - 1]}`;
}

/** "Mon 7 Dec, 10:00" at the dealership for an instant; "Mon 2 Mar 2026, 08:00" outside the current year. */
export function instantText(instantIso: string, timeZone = DEALERSHIP_TIME_ZONE, now = new Date()): string {
  const local = toZoneLocal(new Date(instantIso), timeZone);
  const year = local.date.slice(0, 4);
  const sameYear = year === toZoneLocal(now, timeZone).date.slice(0, 4);
  return `${shortDateText(local.date)}${sameYear ? '' : ` ${year}`}, ${clockText(local.minute)}`;
}

/** "1 h 30 min", "45 min", "3 h" for a number of minutes. */
export function durationText(minutes: number): string {
  const total = Math.round(minutes);
  const h = Math.floor(total / 60);
  const m = total % 60;
  if (h === 0) return `${m} min`;
  return m === 0 ? `${h} h` : `${h} h ${m} min`;
}
