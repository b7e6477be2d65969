// Where every day route starts and ends: the dealership's yard. The demo dealership is the
// default; a stored setting `dealership` ({ name, lat, lng }) takes its place in a real install.
import { DEALERSHIP } from '../../../seeders/demo.js';

export interface Depot {
  name: string;
  lat: number;
  lng: number;
}

const inRange = (v: unknown, limit: number): v is number => typeof v === 'number' && Number.isFinite(v) && Math.abs(v) <= limit;

export function depotOf(settings: object): Depot {
  const stored = (settings as { dealership?: Partial<Depot> }).dealership;
  if (stored && inRange(stored.lat, 90) && inRange(stored.lng, 180)) return { name: stored.name || 'Dealership', lat: stored.lat, lng: stored.lng };
  return { name: DEALERSHIP.name, lat: DEALERSHIP.lat, lng: DEALERSHIP.lng };
}
