// Marker clustering on a screen grid: at the map's current zoom every marker has a pixel position;
// markers that share a grid cell become one cluster, and a cluster then takes in the clusters of
// the eight cells around it whose centres lie within one cell of its own. One pass, no
// randomness, so the same view always clusters the same way. Pure: pixels in, groups out.

export interface ScreenPoint<T> {
  item: T;
  /** Pixel position at the current zoom (Leaflet's map.project). */
  x: number;
  y: number;
}

export interface Cluster<T> {
  /** Stable for the same view: the grid cell the cluster grew from. */
  key: string;
  items: T[];
  /** Centroid of the members, in pixels. */
  x: number;
  y: number;
}

interface Cell<T> {
  key: string;
  cx: number;
  cy: number;
  points: ScreenPoint<T>[];
  sumX: number;
  sumY: number;
  taken: boolean;
}

function centre<T>(cell: Cell<T>) {
  return { x: cell.sumX / cell.points.length, y: cell.sumY / cell.points.length };
}

/**
 * Groups points whose pixels lie close together. cellPx is the grid size: about a marker's
 * width and a half keeps markers from overlapping. Every point ends up in exactly one cluster;
 * two points further apart than 3·√2·cellPx are never grouped (a cluster spans at most 3 × 3 cells).
 */
export function clusterByGrid<T>(points: readonly ScreenPoint<T>[], cellPx: number): Cluster<T>[] {
  if (!(cellPx > 0)) throw new RangeError('cellPx must be a positive number of pixels');
  const cells = new Map<string, Cell<T>>();
  for (const p of points) {
    if (!Number.isFinite(p.x) || !Number.isFinite(p.y)) continue;
    const cx = Math.floor(p.x / cellPx);
    const cy = Math.floor(p.y / cellPx);
    const key = `${cx}:${cy}`;
    let cell = cells.get(key);
    if (!cell) {
      cell = { key, cx, cy, points: [], sumX: 0, sumY: 0, taken: false };
      cells.set(key, cell);
    }
    cell.points.push(p);
    cell.sumX += p.x;
    cell.sumY += p.y;
  }

  // The fullest cells grow first, so a crowded town pulls in its stragglers, not the reverse.
  const order = [...cells.values()].sort((a, b) => b.points.length - a.points.length || a.cy - b.cy || a.cx - b.cx);
  const clusters: Cluster<T>[] = [];
  for (const seed of order) {
    if (seed.taken) continue;
    seed.taken = true;
    const members = [...seed.points];
    let sumX = seed.sumX;
    let sumY = seed.sumY;
    const seedCentre = centre(seed);
    for (let dy = -1; dy <= 1; dy++) {
      for (let dx = -1; dx <= 1; dx++) {
        if (dx === 0 && dy === 0) continue;
        const next = cells.get(`${seed.cx + dx}:${seed.cy + dy}`);
        if (!next || next.taken) continue;
        const c = centre(next);
        if (Math.hypot(c.x - seedCentre.x, c.y - seedCentre.y) > cellPx) continue;
        next.taken = true;
        members.push(...next.points);
        sumX += next.sumX;
        sumY += next.sumY;
      }
    }
    clusters.push({ key: seed.key, items: members.map((m) => m.item), x: sumX / members.length, y: sumY / members.length });
  }
  return clusters;
}
