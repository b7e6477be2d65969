// What the territory map needs to draw a day route: the line's look, and the stops in order.
import type { DayLook } from '@/features/week-plan/model/routes';

export interface MapRouteStop {
  visitId: number;
  lat: number;
  lng: number;
  /** 1-based place in the day. */
  order: number;
  /** Tooltip and spoken text, e.g. "Tue 8 Dec, stop 2: Hesketh Farms, 09:30–11:00". */
  title: string;
}

export interface MapRoute {
  key: string;
  /** "Tue 8 Dec". */
  label: string;
  /** Two letters for the stop badges ("Tu"), so a badge names its day without colour. */
  dayTag: string;
  look: DayLook;
  stops: MapRouteStop[];
}

export interface MapDepot {
  name: string;
  lat: number;
  lng: number;
}

const DAY_TAGS = ['Su', 'Mo', 'Tu', 'We', 'Th', 'Fr', 'Sa'];

/** "Tu" for a Tuesday's ISO date. */
export function dayTagOf(dateIso: string): string {
  return DAY_TAGS[new Date(`${dateIso}T12:00:00Z`).getUTCDay()];
}

export interface RouteDayInput {
  date: string;
  stops: readonly { visitId: number; lat: number; lng: number; accountName: string; startMin: number; departMin: number }[];
}

/** Day routes (a plan's or the week's current ones) as map lines, one look per weekday. */
export function toMapRoutes(days: readonly RouteDayInput[], look: (dayIndex: number) => DayLook, dateText: (dateIso: string) => string, clock: (min: number) => string): MapRoute[] {
  return days.map((day, dayIndex) => {
    const label = dateText(day.date);
    return {
      key: day.date,
      label,
      dayTag: dayTagOf(day.date),
      look: look(dayIndex),
      stops: day.stops.map((s, k) => ({
        visitId: s.visitId,
        lat: s.lat,
        lng: s.lng,
        order: k + 1,
        title: `${label}, stop ${k + 1}: ${s.accountName}, ${clock(s.startMin)}–${clock(s.departMin)}`,
      })),
    };
  });
}
