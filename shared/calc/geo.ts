// Great-circle and road distances between farms and the dealership, and drive times.
// Pure functions: degrees and kilometres in, kilometres and minutes out.

export interface LatLng {
  lat: number;
  lng: number;
}

/** Earth radius used by the published haversine worked example (Rosetta Code, "Haversine formula"). */
export const HAVERSINE_RADIUS_KM = 6372.8;

/**
 * Rural road distance over great-circle distance; about 1.2 is the commonly cited value
 * (Wikibooks, Transportation Geography and Network Science / Circuity; 1.21–1.23 in the
 * studies it quotes).
 */
export const RURAL_CIRCUITY_FACTOR = 1.2;

const DEG_TO_RAD = Math.PI / 180;

/** Great-circle distance on a sphere (haversine formula). */
export function haversineKm(a: LatLng, b: LatLng, radiusKm: number = HAVERSINE_RADIUS_KM): number {
  const dLatRad = (b.lat - a.lat) * DEG_TO_RAD;
  const dLngRad = (b.lng - a.lng) * DEG_TO_RAD;
  const h =
    Math.sin(dLatRad / 2) ** 2 +
    Math.cos(a.lat * DEG_TO_RAD) * Math.cos(b.lat * DEG_TO_RAD) * Math.sin(dLngRad / 2) ** 2;
  // min() guards asin against rounding just above 1 for antipodal points.
  return 2 * radiusKm * Math.asin(Math.min(1, Math.sqrt(h)));
}

/** Road distance estimated from the great-circle distance; roads never beat a straight line. */
export function roadKm(greatCircleKm: number, circuityFactor: number = RURAL_CIRCUITY_FACTOR): number {
  if (!(circuityFactor >= 1)) throw new RangeError(`circuityFactor must be at least 1, got ${circuityFactor}`);
  if (!(greatCircleKm >= 0)) throw new RangeError(`greatCircleKm must be zero or more, got ${greatCircleKm}`);
  return greatCircleKm * circuityFactor;
}

/** Minutes to drive a distance at an average speed. */
export function travelMinutes(km: number, avgSpeedKmh: number): number {
  if (!(avgSpeedKmh > 0) || !Number.isFinite(avgSpeedKmh)) {
    throw new RangeError(`avgSpeedKmh must be a positive number, got ${avgSpeedKmh}`);
  }
  if (!(km >= 0)) throw new RangeError(`km must be zero or more, got ${km}`);
  return (km / avgSpeedKmh) * 60;
}

/** Square matrix of road kilometres between every pair of points (symmetric, zero diagonal). */
export function roadKmMatrix(points: readonly LatLng[], circuityFactor: number = RURAL_CIRCUITY_FACTOR): number[][] {
  const n = points.length;
  const matrixKm: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const km = roadKm(haversineKm(points[i], points[j]), circuityFactor);
      matrixKm[i][j] = km;
      matrixKm[j][i] = km;
    }
  }
  return matrixKm;
}
