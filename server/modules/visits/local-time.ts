// Visits are stored as UTC instants; working hours, grower windows and week plans speak the
// dealership's wall-clock time (minutes after local midnight). These helpers convert between the
// two with the platform's time-zone data, so daylight-saving changes fall where they should.

/** The demo dealership's zone (north-central Kansas). A stored setting `timeZone` overrides it. */
export const DEFAULT_TIME_ZONE = 'America/Chicago';

const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(timeZone: string): Intl.DateTimeFormat {
  let f = formatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', second: '2-digit' });
    formatters.set(timeZone, f);
  }
  return f;
}

export function isTimeZone(value: unknown): value is string {
  if (typeof value !== 'string' || !value) return false;
  try {
    formatter(value);
    return true;
  } catch {
    return false;
  }
}

/** The zone from settings when it is a real one, else the default. */
export function timeZoneOf(settings: object): string {
  const stored = (settings as { timeZone?: unknown }).timeZone;
  return isTimeZone(stored) ? stored : DEFAULT_TIME_ZONE;
}

function wallClock(date: Date, timeZone: string) {
  const parts = Object.fromEntries(formatter(timeZone).formatToParts(date).map((p) => [p.type, p.value]));
  return { year: Number(parts.year), month: Number(parts.month), day: Number(parts.day), hour: Number(parts.hour), minute: Number(parts.minute), second: Number(parts.second) };
}

/** Milliseconds the zone is ahead of UTC at that instant (negative west of Greenwich). */
function offsetMs(date: Date, timeZone: string): number {
  const w = wallClock(date, timeZone);
  const asUtc = Date.UTC(w.year, w.month - 1, w.day, w.hour, w.minute, w.second);
  return asUtc - Math.floor(date.getTime() / 1000) * 1000;
}

const pad = (n: number, width = 2) => String(n).padStart(width, '0');

/** The local date (YYYY-MM-DD) and minutes after local midnight of an instant. */
export function toLocal(date: Date, timeZone: string): { date: string; minute: number } {
  const w = wallClock(date, timeZone);
  return { date: `${pad(w.year, 4)}-${pad(w.month)}-${pad(w.day)}`, minute: w.hour * 60 + w.minute + w.second / 60 };
}

/**
 * The instant of a local date and minute. A wall time skipped by a spring-forward change maps to
 * the instant one hour later, the usual reading of such a time.
 */
export function fromLocal(dateIso: string, minuteOfDay: number, timeZone: string): Date {
  const [y, m, d] = dateIso.split('-').map(Number);
  const wallMs = Date.UTC(y, m - 1, d, 0, 0) + Math.round(minuteOfDay * 60_000);
  let guess = wallMs - offsetMs(new Date(wallMs), timeZone);
  const second = wallMs - offsetMs(new Date(guess), timeZone);
  if (second !== guess) guess = second;
  return new Date(guess);
}

/** The ISO date n days after dateIso (calendar days, no zone involved). */
export function addDays(dateIso: string, days: number): string {
  const [y, m, d] = dateIso.split('-').map(Number);
  const t = new Date(Date.UTC(y, m - 1, d + days));
  return `${pad(t.getUTCFullYear(), 4)}-${pad(t.getUTCMonth() + 1)}-${pad(t.getUTCDate())}`;
}

/** "07:30" for 450 minutes after midnight. */
export function clock(minuteOfDay: number): string {
  const total = Math.round(minuteOfDay);
  return `${pad(Math.floor(total / 60))}:${pad(total % 60)}`;
}
