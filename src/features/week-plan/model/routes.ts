// Day routes as the screens show them: each leg's road distance and driving time, the day's
// hours, and one look per weekday (a colour and a dash pattern, so routes differ without colour).
import { haversineKm, type LatLng } from '@shared/calc/geo';

export interface RouteStopLike extends LatLng {
  /** Local minutes after midnight the visit starts and ends. */
  startMin: number;
  departMin: number;
  /** When the specialist gets there (the plan's arriveMin); defaults to startMin. */
  arriveMin?: number;
}

export interface RouteDayLike {
  startMin: number;
  stops: readonly RouteStopLike[];
  distanceKm: number;
  driveMin: number;
  returnMin: number | null;
}

export interface RouteLeg {
  /** Index of the stop the leg ends at; stops.length for the drive back to the dealership. */
  toIndex: number;
  km: number;
  driveMin: number;
}

/**
 * The day's legs, dealership → stops → dealership. Road distance is the great-circle distance
 * times the circuity the server used, read back from the day's own total (distanceKm over the
 * straight-line sum), so the legs add up to the day's figure. Driving minutes split the day's
 * total in proportion to distance (one average speed for the whole day).
 */
export function dayLegs(day: RouteDayLike, depot: LatLng): RouteLeg[] {
  if (day.stops.length === 0) return [];
  const points = [depot, ...day.stops, depot];
  const straight = points.slice(1).map((p, k) => haversineKm(points[k], p));
  const straightTotal = straight.reduce((a, b) => a + b, 0);
  const circuity = straightTotal > 0 ? day.distanceKm / straightTotal : 1;
  const minPerKm = day.distanceKm > 0 ? day.driveMin / day.distanceKm : 0;
  return straight.map((km, k) => ({ toIndex: k, km: km * circuity, driveMin: km * circuity * minPerKm }));
}

/** Hours from leaving the dealership to getting back; 0 for a day with no stops. */
export function dayHours(day: Pick<RouteDayLike, 'startMin' | 'returnMin' | 'stops'>): number {
  if (!day.stops.length || day.returnMin === null) return 0;
  return Math.max(0, day.returnMin - day.startMin) / 60;
}

export interface DayLook {
  color: string;
  /** SVG stroke-dasharray; undefined for a solid line. */
  dash: string | undefined;
  /** The dash pattern in words, for the legend. */
  pattern: string;
}

// Palette colours (src/styles.css) that stay apart on the loam base map.
const DAY_LOOKS: DayLook[] = [
  { color: '#363f68', dash: undefined, pattern: 'solid line' },
  { color: '#17776b', dash: '12 7', pattern: 'long dashes' },
  { color: '#ab4a38', dash: '3 7', pattern: 'dots' },
  { color: '#986614', dash: '16 5 3 5', pattern: 'dash-dot' },
  { color: '#5a6592', dash: '7 4', pattern: 'short dashes' },
  { color: '#564c41', dash: '2 4 2 10', pattern: 'paired dots' },
  { color: '#1f9383', dash: '20 6', pattern: 'long strokes' },
];

export function dayLook(dayIndex: number): DayLook {
  return DAY_LOOKS[((dayIndex % DAY_LOOKS.length) + DAY_LOOKS.length) % DAY_LOOKS.length];
}

/** "123 km" / "8.5 km": whole kilometres from 10 up. */
export function kmText(km: number): string {
  return km >= 10 ? `${Math.round(km).toLocaleString('en-US')} km` : `${(Math.round(km * 10) / 10).toLocaleString('en-US')} km`;
}

/** "6.4 h" to one decimal. */
export function hoursText(hours: number): string {
  return `${(Math.round(hours * 10) / 10).toLocaleString('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 })} h`;
}
