// Visits as calendar events. The calendar lays events out by the browser's local clock, so each
// visit's instant becomes a "wall" Date showing the dealership's time, and a drop converts back.
import type { VisitView } from '@shared/schemas/visits';
import { addDaysIso, DEALERSHIP_TIME_ZONE, fromWallDate, mondayOf, toWallDate, wallDateIso } from '@/features/visits/model/zone-time';

export type CalendarView = 'day' | 'work_week' | 'week' | 'month';
export const CALENDAR_VIEWS: readonly CalendarView[] = ['day', 'work_week', 'week', 'month'];
export const CALENDAR_VIEW_LABELS: Record<CalendarView, string> = { day: 'Day', work_week: 'Work week', week: 'Week', month: 'Month' };

export interface VisitEvent {
  id: number;
  title: string;
  start: Date;
  end: Date;
  visit: VisitView;
  /** Only scheduled visits that are not done can be dragged. */
  draggable: boolean;
}

/** A done or cancelled visit records what happened; requested and planned ones can move. */
export function canMove(visit: Pick<VisitView, 'status' | 'startsAt'>): boolean {
  return visit.startsAt !== null && (visit.status === 'planned' || visit.status === 'requested');
}

/** Scheduled, not cancelled visits as events, in time order. */
export function visitsToEvents(visits: readonly VisitView[], timeZone = DEALERSHIP_TIME_ZONE): VisitEvent[] {
  return visits
    .filter((v) => v.startsAt !== null && v.status !== 'cancelled')
    .map((v) => {
      const startInstant = new Date(v.startsAt!);
      const endInstant = new Date(startInstant.getTime() + v.durationMin * 60_000);
      return { id: v.id, title: v.accountName, start: toWallDate(startInstant, timeZone), end: toWallDate(endInstant, timeZone), visit: v, draggable: canMove(v) };
    })
    .sort((a, b) => a.start.getTime() - b.start.getTime() || a.id - b.id);
}

/** The dates a view shows, [from, to) as ISO dates, for fetching its visits. */
export function rangeOfView(view: CalendarView, dateIso: string): { from: string; to: string } {
  switch (view) {
    case 'day':
      return { from: dateIso, to: addDaysIso(dateIso, 1) };
    case 'work_week':
    case 'week': {
      const monday = mondayOf(dateIso);
      return { from: monday, to: addDaysIso(monday, 7) };
    }
    case 'month': {
      const first = `${dateIso.slice(0, 8)}01`;
      const from = mondayOf(first);
      return { from, to: addDaysIso(from, 42) };
    }
  }
}

export type DropOutcome = { ok: true; startsAt: string; moved: boolean } | { ok: false; reason: string };

/**
 * What a drop asks the server for: the new start as a UTC instant. The calendar snaps a drop to its
 * grid (snapMin), so a visit at 07:32 dragged straight across to another day would land at 07:30;
 * a drop within one grid step of the visit's own time of day keeps that time exactly. A drop onto
 * the all-day row is refused here (a visit has a time); a drop onto the same time changes nothing.
 */
export function dropToStart(event: Pick<VisitEvent, 'visit' | 'start'>, droppedStart: Date, isAllDay: boolean, timeZone = DEALERSHIP_TIME_ZONE, snapMin = 15): DropOutcome {
  if (!canMove(event.visit)) return { ok: false, reason: `This visit is ${event.visit.status}; it keeps its time.` };
  if (isAllDay) return { ok: false, reason: 'Drop the visit on a time of day, not on the all-day row.' };
  const minuteOf = (d: Date) => d.getHours() * 60 + d.getMinutes() + d.getSeconds() / 60;
  let wall = droppedStart;
  if (Math.abs(minuteOf(droppedStart) - minuteOf(event.start)) < snapMin) {
    wall = new Date(droppedStart.getFullYear(), droppedStart.getMonth(), droppedStart.getDate(), event.start.getHours(), event.start.getMinutes(), event.start.getSeconds());
  }
  const instant = fromWallDate(wall, timeZone);
  const startsAt = instant.toISOString();
  const before = event.visit.startsAt ? new Date(event.visit.startsAt).getTime() : NaN;
  return { ok: true, startsAt, moved: instant.getTime() !== before };
}

/** The Monday of the week on screen: its routes are the ones shown beside the calendar. */
export function routesWeekOf(dateIso: string): string {
  return mondayOf(dateIso);
}

export function parseCalendarView(text: string | null): CalendarView {
  return (CALENDAR_VIEWS as readonly string[]).includes(text ?? '') ? (text as CalendarView) : 'week';
}

export function isIsoDate(text: string | null): text is string {
  return !!text && /^\d{4}-\d{2}-\d{2}$/.test(text) && !Number.isNaN(Date.parse(`${text}T00:00:00Z`)) && new Date(`${text}T00:00:00Z`).toISOString().startsWith(text);
}

export { wallDateIso };

/** The date one step back (-1) or forward (+1) in the view: a day, a week, or a month (kept inside the month). */
export function stepDate(view: CalendarView, dateIso: string, direction: -1 | 1): string {
  if (view === 'day') return addDaysIso(dateIso, direction);
  if (view === 'week' || view === 'work_week') return addDaysIso(dateIso, 7 * direction);
  const [y, m, d] = dateIso.split('-').map(Number);
  const first = new Date(Date.UTC(y, m - 1 + direction, 1));
  const daysInMonth = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  return `${first.getUTCFullYear()}-${String(first.getUTCMonth() + 1).padStart(2, '0')}-${String(Math.min(d, daysInMonth)).padStart(2, '0')}`;
}

const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/** The heading of the view: "Tue 8 Dec 2026", "7–11 Dec 2026", "28 Dec 2026 – 3 Jan 2027", "December 2026". */
export function viewTitle(view: CalendarView, dateIso: string): string {
  const [y, m, d] = dateIso.split('-').map(Number);
  if (view === 'month') return `${MONTHS[m - 1]} ${y}`;
  const short = (iso: string) => {
    const [, mm, dd] = iso.split('-').map(Number);
    return `${dd} ${MONTHS[mm - 1].slice(0, 3)}`;
  };
  if (view === 'day') return `${['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'][new Date(Date.UTC(y, m - 1, d)).getUTCDay()]} ${short(dateIso)} ${y}`;
  const from = mondayOf(dateIso);
  const to = addDaysIso(from, view === 'work_week' ? 4 : 6);
  const [fy, fm] = from.split('-').map(Number);
  const [ty, tm, td] = to.split('-').map(Number);
  if (fy !== ty) return `${short(from)} ${fy} – ${short(to)} ${ty}`;
  if (fm !== tm) return `${short(from)} – ${short(to)} ${ty}`;
  return `${Number(from.slice(8))}–${td} ${MONTHS[tm - 1].slice(0, 3)} ${ty}`;
}
