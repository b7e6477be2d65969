import { optimizeRoute } from '../../../shared/calc/route-optimizer.js';
import type { OptimizeRouteInput } from '../../../shared/schemas/visits.js';
import { getSettings } from '../settings/settings.service.js';

/** Fixed seed and budget, so the same stops always give the same order. */
export const OPTIMIZE_OPTIONS = { timeBudgetMs: 2000, seed: 1 } as const;

/**
 * Staff. Orders the stops from the start by estimated road distance (great-circle × the
 * circuity factor in settings). Ids come back as they were sent (text or number).
 */
export async function optimizeStops(input: OptimizeRouteInput): Promise<{ order: (string | number)[]; distanceKm: number }> {
  const { circuityFactor } = await getSettings();
  // The optimiser keys stops by text; the position keeps 7 and "7" apart.
  const result = optimizeRoute({
    start: input.start,
    stops: input.stops.map((s, k) => ({ id: String(k), lat: s.lat, lng: s.lng, serviceMin: s.serviceMin })),
    returnToStart: input.returnToStart,
    circuityFactor,
    ...OPTIMIZE_OPTIONS,
  });
  return { order: result.order.map((k) => input.stops[Number(k)].id), distanceKm: Math.round(result.distanceKm * 1000) / 1000 };
}
