// Orders stops into a short route: exact (Held–Karp) for a handful of stops, otherwise
// nearest-neighbour construction, 2-opt and Or-opt local search, then iterated local search
// (double-bridge kicks, random run reversals, restarts when stuck) inside a time budget.
// Deterministic for a given seed and iteration count. Pure: a matrix in, an order out.

import { roadKmMatrix, type LatLng } from './geo';

export interface TourOptions {
  /** Index of the fixed first point (the dealership). */
  startIndex?: number;
  /** true: a closed tour back to the start; false: an open path ending at any point. */
  returnToStart?: boolean;
  /** Wall-clock cap on the improvement phase; the search also stops after maxIterations. */
  timeBudgetMs?: number;
  /** Number of perturbation rounds; the default grows with the number of points. */
  maxIterations?: number;
  /** Seed for the perturbations, so that a run can be repeated exactly. */
  seed?: number;
  /** Up to this many points (start included) the exact solver is used instead. */
  exactMaxPoints?: number;
}

export interface Tour {
  /** Point indices in visiting order, starting with startIndex (the return leg is implied). */
  order: number[];
  /** Sum of the matrix entries along the order, plus the return leg for a closed tour. */
  length: number;
}

/** Largest problem solveExact accepts: Held–Karp needs 2^(n−1)·n cells. */
export const EXACT_SOLVER_MAX_POINTS = 16;
/** solveTour switches to the exact solver up to 10 stops plus the start. */
export const DEFAULT_EXACT_MAX_POINTS = 11;
const DEFAULT_TIME_BUDGET_MS = 1000;
const EPS = 1e-9;

/** Small fast PRNG (mulberry32) so a seed reproduces a run on any machine. */
export function createRng(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Length of a given order over a matrix (closed tours add the leg back to the first point). */
export function tourLength(distanceMatrix: readonly (readonly number[])[], order: readonly number[], returnToStart = true): number {
  let length = 0;
  for (let k = 1; k < order.length; k++) length += distanceMatrix[order[k - 1]][order[k]];
  if (returnToStart && order.length > 1) length += distanceMatrix[order[order.length - 1]][order[0]];
  return length;
}

function checkMatrix(distanceMatrix: readonly (readonly number[])[], startIndex: number): void {
  const n = distanceMatrix.length;
  if (n === 0) throw new RangeError('distanceMatrix is empty');
  for (const row of distanceMatrix) {
    if (row.length !== n) throw new RangeError('distanceMatrix must be square');
    for (const value of row) if (!Number.isFinite(value)) throw new RangeError('distanceMatrix holds a value that is not finite');
  }
  if (!Number.isInteger(startIndex) || startIndex < 0 || startIndex >= n) {
    throw new RangeError(`startIndex ${startIndex} is outside the matrix`);
  }
}

/** Exact shortest tour or path from startIndex by Held–Karp dynamic programming (works for asymmetric matrices too). */
export function solveExact(
  distanceMatrix: readonly (readonly number[])[],
  { startIndex = 0, returnToStart = true }: Pick<TourOptions, 'startIndex' | 'returnToStart'> = {},
): Tour {
  checkMatrix(distanceMatrix, startIndex);
  const n = distanceMatrix.length;
  if (n > EXACT_SOLVER_MAX_POINTS) {
    throw new RangeError(`solveExact takes at most ${EXACT_SOLVER_MAX_POINTS} points, got ${n}`);
  }
  if (n === 1) return { order: [startIndex], length: 0 };

  const others = [...Array(n).keys()].filter((i) => i !== startIndex);
  const k = others.length;
  const full = (1 << k) - 1;
  // cost[mask * k + j]: shortest path from the start through the set `mask`, ending at others[j].
  const cost = new Float64Array((full + 1) * k).fill(Infinity);
  const parent = new Int8Array((full + 1) * k).fill(-1);
  for (let j = 0; j < k; j++) cost[(1 << j) * k + j] = distanceMatrix[startIndex][others[j]];

  for (let mask = 1; mask <= full; mask++) {
    for (let j = 0; j < k; j++) {
      if (!(mask & (1 << j))) continue;
      const here = cost[mask * k + j];
      if (here === Infinity) continue;
      const from = others[j];
      for (let next = 0; next < k; next++) {
        if (mask & (1 << next)) continue;
        const nextMask = mask | (1 << next);
        const candidate = here + distanceMatrix[from][others[next]];
        if (candidate < cost[nextMask * k + next]) {
          cost[nextMask * k + next] = candidate;
          parent[nextMask * k + next] = j;
        }
      }
    }
  }

  let bestLength = Infinity;
  let bestEnd = 0;
  for (let j = 0; j < k; j++) {
    const length = cost[full * k + j] + (returnToStart ? distanceMatrix[others[j]][startIndex] : 0);
    if (length < bestLength) {
      bestLength = length;
      bestEnd = j;
    }
  }

  const reversed: number[] = [];
  let mask = full;
  let j = bestEnd;
  while (j >= 0) {
    reversed.push(others[j]);
    const previous = parent[mask * k + j];
    mask &= ~(1 << j);
    j = previous;
  }
  return { order: [startIndex, ...reversed.reverse()], length: bestLength };
}

/**
 * The search works on a path with both ends fixed: the start, the stops, then a virtual end
 * point whose distance from any stop is the leg back to the start (closed tour) or zero (open
 * path). One set of moves then serves both kinds of route.
 */
class PathSearch {
  private readonly size: number; // matrix side including the virtual end
  private readonly dist: Float64Array;
  private readonly scratch: Int32Array;

  constructor(distanceMatrix: readonly (readonly number[])[], startIndex: number, returnToStart: boolean) {
    const n = distanceMatrix.length;
    this.size = n + 1;
    this.dist = new Float64Array(this.size * this.size);
    this.scratch = new Int32Array(this.size);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) this.dist[i * this.size + j] = distanceMatrix[i][j];
      const endLeg = returnToStart ? distanceMatrix[i][startIndex] : 0;
      this.dist[i * this.size + n] = endLeg;
      this.dist[n * this.size + i] = endLeg;
    }
  }

  length(path: Int32Array): number {
    let total = 0;
    for (let k = 1; k < path.length; k++) total += this.dist[path[k - 1] * this.size + path[k]];
    return total;
  }

  /** 2-opt with first improvement: reverse path[i..j] when that shortens the path. */
  private twoOpt(path: Int32Array): void {
    const { dist, size } = this;
    const last = path.length - 2; // last movable position
    let improved = true;
    while (improved) {
      improved = false;
      for (let i = 1; i < last; i++) {
        const a = path[i - 1];
        for (let j = i + 1; j <= last; j++) {
          const b = path[i];
          const c = path[j];
          const d = path[j + 1];
          const delta = dist[a * size + c] + dist[b * size + d] - dist[a * size + b] - dist[c * size + d];
          if (delta < -EPS) {
            for (let lo = i, hi = j; lo < hi; lo++, hi--) {
              const t = path[lo];
              path[lo] = path[hi];
              path[hi] = t;
            }
            improved = true;
          }
        }
      }
    }
  }

  /** Or-opt: move a run of 1–3 stops, either way round, to the best other place. */
  private orOpt(path: Int32Array): boolean {
    const { dist, size } = this;
    const last = path.length - 2;
    let improvedAny = false;
    for (let segLen = 1; segLen <= 3; segLen++) {
      for (let i = 1; i + segLen - 1 <= last; i++) {
        const prev = path[i - 1];
        const first = path[i];
        const tail = path[i + segLen - 1];
        const next = path[i + segLen];
        const removeGain = dist[prev * size + first] + dist[tail * size + next] - dist[prev * size + next];
        let bestDelta = -EPS;
        let bestK = -1;
        let bestReversed = false;
        for (let k = 0; k <= last; k++) {
          if (k >= i - 1 && k <= i + segLen - 1) continue;
          const x = path[k];
          const y = path[k + 1];
          const base = removeGain + dist[x * size + y];
          const forward = dist[x * size + first] + dist[tail * size + y] - base;
          const backward = dist[x * size + tail] + dist[first * size + y] - base;
          if (forward < bestDelta) {
            bestDelta = forward;
            bestK = k;
            bestReversed = false;
          }
          if (backward < bestDelta) {
            bestDelta = backward;
            bestK = k;
            bestReversed = true;
          }
        }
        if (bestK >= 0) {
          this.moveSegment(path, i, segLen, bestK, bestReversed);
          improvedAny = true;
        }
      }
    }
    return improvedAny;
  }

  /** Moves path[i..i+segLen-1] to sit between path[k] and path[k+1] (indices before the move). */
  private moveSegment(path: Int32Array, i: number, segLen: number, k: number, reversed: boolean): void {
    const out = this.scratch;
    let w = 0;
    const emitSegment = () => {
      for (let s = 0; s < segLen; s++) out[w++] = path[reversed ? i + segLen - 1 - s : i + s];
    };
    for (let r = 0; r < path.length; r++) {
      if (r >= i && r < i + segLen) continue;
      out[w++] = path[r];
      if (r === k) emitSegment();
    }
    path.set(out.subarray(0, path.length));
  }

  localSearch(path: Int32Array): void {
    // Alternate the two neighbourhoods until neither finds a gain.
    for (;;) {
      this.twoOpt(path);
      if (!this.orOpt(path)) return;
    }
  }

  nearestNeighbour(startIndex: number): Int32Array {
    const { dist, size } = this;
    const n = size - 1;
    const path = new Int32Array(size);
    const used = new Uint8Array(n);
    path[0] = startIndex;
    used[startIndex] = 1;
    for (let pos = 1; pos < n; pos++) {
      const from = path[pos - 1];
      let best = -1;
      for (let c = 0; c < n; c++) {
        if (!used[c] && (best < 0 || dist[from * size + c] < dist[from * size + best])) best = c;
      }
      path[pos] = best;
      used[best] = 1;
    }
    path[n] = n;
    return path;
  }

  randomPath(startIndex: number, random: () => number): Int32Array {
    const n = this.size - 1;
    const path = new Int32Array(this.size);
    path[0] = startIndex;
    let w = 1;
    for (let c = 0; c < n; c++) if (c !== startIndex) path[w++] = c;
    path[n] = n;
    for (let k = n - 1; k > 1; k--) {
      const r = 1 + Math.floor(random() * k);
      const t = path[k];
      path[k] = path[r];
      path[r] = t;
    }
    return path;
  }

  /**
   * Perturbation: half the time a double bridge (A B C D → A C B D, a 4-opt move that 2-opt
   * cannot undo), otherwise the reversal of a random run of stops, which opens the pairs of
   * reversals that no single improving move reaches.
   */
  kick(path: Int32Array, random: () => number): Int32Array {
    const movable = path.length - 2;
    const next = path.slice();
    if (movable < 4 || random() < 0.5) {
      let i = 1 + Math.floor(random() * movable);
      let j = 1 + Math.floor(random() * movable);
      if (i > j) [i, j] = [j, i];
      for (; i < j; i++, j--) {
        next[i] = path[j];
        next[j] = path[i];
      }
      return next;
    }
    const cuts = new Set<number>();
    while (cuts.size < 3) cuts.add(1 + Math.floor(random() * (movable - 1)));
    const [p, q, r] = [...cuts].sort((x, y) => x - y).map((c) => c + 1);
    let w = p;
    for (let k = q; k < r; k++) next[w++] = path[k];
    for (let k = p; k < q; k++) next[w++] = path[k];
    return next;
  }
}

/**
 * Short route through every point of a symmetric distance matrix, from startIndex.
 * Small problems are solved exactly; larger ones by iterated local search.
 */
export function solveTour(distanceMatrix: readonly (readonly number[])[], options: TourOptions = {}): Tour {
  const {
    startIndex = 0,
    returnToStart = true,
    timeBudgetMs = DEFAULT_TIME_BUDGET_MS,
    seed = 1,
    exactMaxPoints = DEFAULT_EXACT_MAX_POINTS,
  } = options;
  checkMatrix(distanceMatrix, startIndex);
  const n = distanceMatrix.length;
  // Three points or fewer have a single route shape; the exact solver settles them at once.
  if (n <= Math.max(3, Math.min(exactMaxPoints, EXACT_SOLVER_MAX_POINTS))) {
    return solveExact(distanceMatrix, { startIndex, returnToStart });
  }
  const maxIterations = options.maxIterations ?? 1000 + 20 * n;
  const restartAfter = Math.max(20, 4 * n);

  const deadline = performance.now() + timeBudgetMs;
  const random = createRng(seed);
  const search = new PathSearch(distanceMatrix, startIndex, returnToStart);

  let current = search.nearestNeighbour(startIndex);
  search.localSearch(current);
  let currentLength = search.length(current);
  let best = current;
  let bestLength = currentLength;

  let sinceImprovement = 0;
  for (let iteration = 0; iteration < maxIterations && performance.now() < deadline; iteration++) {
    // A long run without gain means the search is stuck in one basin: start afresh from a random order.
    const restart = ++sinceImprovement > restartAfter;
    const candidate = restart ? search.randomPath(startIndex, random) : search.kick(current, random);
    if (restart) sinceImprovement = 0;
    search.localSearch(candidate);
    const candidateLength = search.length(candidate);
    // Accepting equal lengths lets the search drift across plateaus.
    if (restart || candidateLength <= currentLength + EPS) {
      current = candidate;
      currentLength = candidateLength;
      if (candidateLength < bestLength - EPS) {
        best = candidate;
        bestLength = candidateLength;
        sinceImprovement = 0;
      }
    }
  }
  const order = Array.from(best.subarray(0, n));
  return { order, length: tourLength(distanceMatrix, order, returnToStart) };
}

export interface RouteStop extends LatLng {
  id: string;
  /** Accepted so visits can be passed as they are; time on a farm does not change a distance order. */
  serviceMin?: number;
}

export interface RouteInput {
  start: LatLng;
  stops: readonly RouteStop[];
  returnToStart?: boolean;
  /** 1 gives great-circle kilometres; RURAL_CIRCUITY_FACTOR gives estimated road kilometres. */
  circuityFactor?: number;
  timeBudgetMs?: number;
  seed?: number;
}

export interface RouteResult {
  /** Stop ids in visiting order (the start is not listed). */
  order: string[];
  distanceKm: number;
}

/** Orders stops from a start point by haversine distance (scaled by the circuity factor). */
export function optimizeRoute({ start, stops, returnToStart = true, circuityFactor = 1, timeBudgetMs, seed }: RouteInput): RouteResult {
  const ids = new Set(stops.map((s) => s.id));
  if (ids.size !== stops.length) throw new RangeError('stop ids must be unique');
  if (stops.length === 0) return { order: [], distanceKm: 0 };
  const points: LatLng[] = [start, ...stops];
  const matrixKm = roadKmMatrix(points, circuityFactor);
  const tour = solveTour(matrixKm, { startIndex: 0, returnToStart, timeBudgetMs, seed });
  return { order: tour.order.slice(1).map((i) => stops[i - 1].id), distanceKm: tour.length };
}
