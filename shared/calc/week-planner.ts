// Plans a specialist's week of farm visits: which day each visit falls on, and the order of
// each day's route from the dealership and back. Respects day hours, visit durations, time
// windows and fixed appointments; whatever cannot fit is listed with a plain-English reason.
// Pure: coordinates and minutes in, a plan out. Times are minutes from midnight.

import { haversineKm, roadKm, travelMinutes, RURAL_CIRCUITY_FACTOR, type LatLng } from './geo';
import { solveTour } from './route-optimizer';

export interface PlanDayInput {
  date: string;
  /** When the specialist leaves the dealership. */
  startMin: number;
  /** When the specialist must be back at the dealership. */
  endMin: number;
}

export interface TimeWindow {
  startMin: number;
  endMin: number;
}

export interface PlanVisitInput extends LatLng {
  id: string;
  serviceMin: number;
  /** The whole visit (start to finish) must fall inside this window. */
  window?: TimeWindow;
  /** An appointment: the visit starts at exactly this time on this day. */
  fixed?: { dayIndex: number; startMin: number };
  /** Higher is more important; visits of a higher priority are placed first. Default 0. */
  priority?: number;
}

export interface PlanWeekInput {
  depot: LatLng;
  days: readonly PlanDayInput[];
  visits: readonly PlanVisitInput[];
  /** Road km over great-circle km; defaults to the commonly cited rural value 1.2. */
  circuityFactor?: number;
  avgSpeedKmh: number;
}

export interface PlannedStop {
  id: string;
  arriveMin: number;
  /** arriveMin + waitMin is when the visit starts. */
  departMin: number;
  waitMin: number;
}

export interface PlannedDay {
  date: string;
  stops: PlannedStop[];
  distanceKm: number;
  driveMin: number;
  /** Driving plus time on the farms (waiting excluded). */
  workMin: number;
  /** Back at the dealership (the day's start when there are no stops). */
  endMin: number;
}

export interface UnplacedVisit {
  id: string;
  reason: string;
}

export interface WeekPlan {
  days: PlannedDay[];
  unplaced: UnplacedVisit[];
}

/** A field-level problem, shaped like a zod issue so the server can answer 400 the same way. */
export interface PlanInputIssue {
  path: (string | number)[];
  message: string;
}

export class PlanInputError extends Error {
  constructor(public readonly issues: PlanInputIssue[]) {
    super(`Plan input is not valid: ${issues.map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`);
    this.name = 'PlanInputError';
  }
}

export interface PlanProgress {
  phase: 'placing' | 'improving' | 'done';
  /** 0 to 1 within the whole run. */
  fraction: number;
}

export const UNPLACED_REASONS = {
  windowUnreachable: 'its time window cannot be reached from the dealership within the day',
  tooFar: 'too far from the dealership to visit and drive back within a day',
  longerThanFreeTime: 'longer than any free time on the chosen days',
  daysFull: 'the chosen days are full: no free time is long enough for the visit and the drive to it',
  fixedUnreachable: 'its fixed time cannot be reached from the dealership within the day',
  fixedNoReturn: 'its fixed time leaves no time to drive back to the dealership before the day ends',
  fixedClash: 'there is not enough time to drive between it and another fixed appointment that day',
} as const;

const MINUTES_PER_DAY = 1440;
const EPS = 1e-6;
const MAX_IMPROVEMENT_ROUNDS = 20;
// Day routes with more stops than this go to the iterated search, kept short and repeatable.
const DAY_TOUR_OPTIONS = { timeBudgetMs: 100, maxIterations: 300, seed: 1 } as const;

function inRange(value: number, low: number, high: number): boolean {
  return Number.isFinite(value) && value >= low && value <= high;
}

/** Field-level checks the server maps to 400; an empty list means the input can be planned. */
export function validatePlanInput(input: PlanWeekInput): PlanInputIssue[] {
  const issues: PlanInputIssue[] = [];
  const add = (path: (string | number)[], message: string) => issues.push({ path, message });

  if (!(Number.isFinite(input.avgSpeedKmh) && input.avgSpeedKmh > 0)) add(['avgSpeedKmh'], 'the average speed must be more than 0 km/h');
  if (input.circuityFactor !== undefined && !(Number.isFinite(input.circuityFactor) && input.circuityFactor >= 1)) {
    add(['circuityFactor'], 'the circuity factor must be 1 or more (roads are never shorter than a straight line)');
  }
  if (!inRange(input.depot.lat, -90, 90)) add(['depot', 'lat'], 'latitude must be between -90 and 90');
  if (!inRange(input.depot.lng, -180, 180)) add(['depot', 'lng'], 'longitude must be between -180 and 180');

  if (input.days.length === 0) add(['days'], 'choose at least one day');
  input.days.forEach((day, d) => {
    if (!inRange(day.startMin, 0, MINUTES_PER_DAY)) add(['days', d, 'startMin'], 'the start must be a time of day (0 to 1440 minutes)');
    if (!inRange(day.endMin, 0, MINUTES_PER_DAY)) add(['days', d, 'endMin'], 'the end must be a time of day (0 to 1440 minutes)');
    else if (day.endMin <= day.startMin) add(['days', d, 'endMin'], 'the day ends before it starts');
  });
  const longestDayMin = Math.max(0, ...input.days.map((d) => d.endMin - d.startMin).filter(Number.isFinite));

  const firstIndexById = new Map<string, number>();
  input.visits.forEach((visit, v) => {
    const at = (...rest: (string | number)[]) => ['visits', v, ...rest];
    if (!visit.id) add(at('id'), 'the visit needs an id');
    else if (firstIndexById.has(visit.id)) add(at('id'), `duplicate id "${visit.id}" (also visit ${firstIndexById.get(visit.id)})`);
    else firstIndexById.set(visit.id, v);
    if (!inRange(visit.lat, -90, 90)) add(at('lat'), 'latitude must be between -90 and 90');
    if (!inRange(visit.lng, -180, 180)) add(at('lng'), 'longitude must be between -180 and 180');
    if (!(Number.isFinite(visit.serviceMin) && visit.serviceMin >= 0)) add(at('serviceMin'), 'the visit length must be 0 minutes or more');
    else if (input.days.length > 0 && visit.serviceMin > longestDayMin) add(at('serviceMin'), `the visit is longer than a day (${longestDayMin} min)`);
    if (visit.priority !== undefined && !Number.isFinite(visit.priority)) add(at('priority'), 'the priority must be a number');

    const { window, fixed } = visit;
    if (window) {
      if (!inRange(window.startMin, 0, MINUTES_PER_DAY)) add(at('window', 'startMin'), 'the window must open at a time of day (0 to 1440 minutes)');
      if (!inRange(window.endMin, 0, MINUTES_PER_DAY)) add(at('window', 'endMin'), 'the window must close at a time of day (0 to 1440 minutes)');
      else if (window.endMin <= window.startMin) add(at('window', 'endMin'), 'the time window closes before it opens');
      else if (window.endMin - window.startMin < visit.serviceMin) add(at('window'), 'the time window is shorter than the visit');
    }
    if (fixed) {
      const day = input.days[fixed.dayIndex];
      if (!Number.isInteger(fixed.dayIndex) || !day) add(at('fixed', 'dayIndex'), 'the appointment is not on one of the chosen days');
      else if (!(fixed.startMin >= day.startMin && fixed.startMin + visit.serviceMin <= day.endMin)) {
        add(at('fixed', 'startMin'), "the appointment falls outside the day's hours");
      }
      if (window && !(fixed.startMin >= window.startMin && fixed.startMin + visit.serviceMin <= window.endMin)) {
        add(at('fixed', 'startMin'), "the appointment falls outside the visit's time window");
      }
    }
  });

  // Two appointments on the same day cannot overlap in time.
  const fixedVisits = input.visits.map((visit, v) => ({ visit, v })).filter(({ visit }) => visit.fixed);
  for (let a = 0; a < fixedVisits.length; a++) {
    for (let b = a + 1; b < fixedVisits.length; b++) {
      const x = fixedVisits[a].visit;
      const y = fixedVisits[b].visit;
      if (x.fixed!.dayIndex !== y.fixed!.dayIndex) continue;
      const overlap = x.fixed!.startMin < y.fixed!.startMin + y.serviceMin && y.fixed!.startMin < x.fixed!.startMin + x.serviceMin;
      if (overlap) add(['visits', fixedVisits[b].v, 'fixed', 'startMin'], `the appointment overlaps the one for "${x.id}"`);
    }
  }
  return issues;
}

/** One stop's timing, or null when the route breaks a window, an appointment or the day's end. */
interface StopTiming {
  arriveMin: number;
  startMin: number;
  departMin: number;
}

/** The planning state: visit v is matrix node v + 1, the dealership is node 0. */
class WeekModel {
  readonly size: number;
  readonly km: Float64Array;
  readonly drive: Float64Array;
  readonly routes: number[][];

  constructor(
    readonly input: PlanWeekInput,
    circuityFactor: number,
  ) {
    const points: LatLng[] = [input.depot, ...input.visits];
    this.size = points.length;
    this.km = new Float64Array(this.size * this.size);
    this.drive = new Float64Array(this.size * this.size);
    for (let a = 0; a < this.size; a++) {
      for (let b = a + 1; b < this.size; b++) {
        const legKm = roadKm(haversineKm(points[a], points[b]), circuityFactor);
        const legMin = travelMinutes(legKm, input.avgSpeedKmh);
        this.km[a * this.size + b] = this.km[b * this.size + a] = legKm;
        this.drive[a * this.size + b] = this.drive[b * this.size + a] = legMin;
      }
    }
    this.routes = input.days.map(() => []);
  }

  legKm(fromNode: number, toNode: number): number {
    return this.km[fromNode * this.size + toNode];
  }

  routeKm(route: readonly number[]): number {
    let total = 0;
    let prev = 0;
    for (const v of route) {
      total += this.legKm(prev, v + 1);
      prev = v + 1;
    }
    return total + this.legKm(prev, 0);
  }

  /** Walks the route from the day's start, waiting where a window or appointment asks for it. */
  timings(dayIndex: number, route: readonly number[]): StopTiming[] | null {
    const day = this.input.days[dayIndex];
    const out: StopTiming[] = [];
    let clockMin = day.startMin;
    let prev = 0;
    for (const v of route) {
      const visit = this.input.visits[v];
      const arriveMin = clockMin + this.drive[prev * this.size + v + 1];
      let startMin = arriveMin;
      if (visit.window && startMin < visit.window.startMin) startMin = visit.window.startMin;
      if (visit.fixed) {
        if (visit.fixed.dayIndex !== dayIndex || arriveMin > visit.fixed.startMin + EPS) return null;
        startMin = visit.fixed.startMin;
      }
      const departMin = startMin + visit.serviceMin;
      if (visit.window && departMin > visit.window.endMin + EPS) return null;
      out.push({ arriveMin, startMin, departMin });
      clockMin = departMin;
      prev = v + 1;
    }
    return clockMin + this.drive[prev * this.size] <= day.endMin + EPS ? out : null;
  }

  feasible(dayIndex: number, route: readonly number[]): boolean {
    return this.timings(dayIndex, route) !== null;
  }

  /** Cheapest feasible place for visit v in a day's route (extra km), or null. */
  bestInsertion(dayIndex: number, route: readonly number[], v: number): { position: number; addedKm: number } | null {
    const fixed = this.input.visits[v].fixed;
    if (fixed && fixed.dayIndex !== dayIndex) return null;
    let best: { position: number; addedKm: number } | null = null;
    for (let position = 0; position <= route.length; position++) {
      const prev = position === 0 ? 0 : route[position - 1] + 1;
      const next = position === route.length ? 0 : route[position] + 1;
      const addedKm = this.legKm(prev, v + 1) + this.legKm(v + 1, next) - this.legKm(prev, next);
      if (best && addedKm >= best.addedKm) continue;
      const candidate = [...route.slice(0, position), v, ...route.slice(position)];
      if (this.feasible(dayIndex, candidate)) best = { position, addedKm };
    }
    return best;
  }

  insert(dayIndex: number, v: number, position: number): void {
    this.routes[dayIndex].splice(position, 0, v);
  }
}

const priorityOf = (visit: PlanVisitInput) => visit.priority ?? 0;

/**
 * Places flexible visits by regret: within a priority tier, the visit that would lose most by
 * not getting its best day goes first, at its cheapest feasible place. Returns those left over.
 */
function placeByRegret(model: WeekModel, candidates: number[], onPlaced: () => void): number[] {
  const visits = model.input.visits;
  const left: number[] = [];
  const tiers = [...new Set(candidates.map((v) => priorityOf(visits[v])))].sort((a, b) => b - a);
  for (const tier of tiers) {
    let pending = candidates.filter((v) => priorityOf(visits[v]) === tier);
    while (pending.length > 0) {
      let pick: { v: number; day: number; position: number; addedKm: number; regretKm: number } | null = null;
      const stillPending: number[] = [];
      for (const v of pending) {
        const options = model.routes
          .map((route, day) => ({ day, insertion: model.bestInsertion(day, route, v) }))
          .filter((o) => o.insertion !== null)
          .sort((a, b) => a.insertion!.addedKm - b.insertion!.addedKm);
        // Routes only fill up while placing, so a visit that fits nowhere now never will.
        if (options.length === 0) {
          left.push(v);
          continue;
        }
        stillPending.push(v);
        const best = options[0];
        const regretKm = options.length > 1 ? options[1].insertion!.addedKm - best.insertion!.addedKm : Infinity;
        const sameRegret = pick !== null && (regretKm === pick.regretKm || Math.abs(regretKm - pick.regretKm) <= EPS);
        const better = !pick || (sameRegret ? best.insertion!.addedKm < pick.addedKm - EPS : regretKm > pick.regretKm);
        if (better) pick = { v, day: best.day, position: best.insertion!.position, addedKm: best.insertion!.addedKm, regretKm };
      }
      if (!pick) break;
      model.insert(pick.day, pick.v, pick.position);
      onPlaced();
      pending = stillPending.filter((v) => v !== pick!.v);
    }
  }
  return left;
}

/** Shortens one day's route without breaking its times: exact/iterated reorder, then 2-opt and Or-opt. */
function improveDay(model: WeekModel, dayIndex: number): boolean {
  let route = model.routes[dayIndex];
  let routeKm = model.routeKm(route);
  let improvedAny = false;
  const tryRoute = (candidate: number[]) => {
    const candidateKm = model.routeKm(candidate);
    if (candidateKm < routeKm - EPS && model.feasible(dayIndex, candidate)) {
      route = candidate;
      routeKm = candidateKm;
      improvedAny = true;
      return true;
    }
    return false;
  };

  if (route.length >= 3) {
    const nodes = [0, ...route.map((v) => v + 1)];
    const matrixKm = nodes.map((a) => nodes.map((b) => model.legKm(a, b)));
    const tour = solveTour(matrixKm, DAY_TOUR_OPTIONS).order.slice(1).map((i) => route[i - 1]);
    // Windows may favour one direction round the loop, so try both.
    if (!tryRoute(tour)) tryRoute([...tour].reverse());
  }

  let improved = true;
  while (improved) {
    improved = false;
    for (let i = 0; i < route.length - 1 && !improved; i++) {
      for (let j = i + 1; j < route.length && !improved; j++) {
        improved = tryRoute([...route.slice(0, i), ...route.slice(i, j + 1).reverse(), ...route.slice(j + 1)]);
      }
    }
    for (let segLen = 1; segLen <= 3 && !improved; segLen++) {
      for (let i = 0; i + segLen <= route.length && !improved; i++) {
        const segment = route.slice(i, i + segLen);
        const rest = [...route.slice(0, i), ...route.slice(i + segLen)];
        for (let k = 0; k <= rest.length && !improved; k++) {
          if (k === i) continue;
          improved = tryRoute([...rest.slice(0, k), ...segment, ...rest.slice(k)]);
          if (!improved && segLen > 1) improved = tryRoute([...rest.slice(0, k), ...[...segment].reverse(), ...rest.slice(k)]);
        }
      }
    }
  }
  model.routes[dayIndex] = route;
  return improvedAny;
}

/** Moves one visit to another day, or swaps two visits between days, when that saves km. */
function improveAcrossDays(model: WeekModel): boolean {
  const visits = model.input.visits;
  const dayCount = model.routes.length;
  let improvedAny = false;

  for (let a = 0; a < dayCount; a++) {
    for (let i = 0; i < model.routes[a].length; i++) {
      const v = model.routes[a][i];
      if (visits[v].fixed) continue;
      const routeA = model.routes[a];
      const withoutV = routeA.filter((_, k) => k !== i);
      if (!model.feasible(a, withoutV)) continue;
      const savedKm = model.routeKm(routeA) - model.routeKm(withoutV);
      for (let b = 0; b < dayCount; b++) {
        if (b === a) continue;
        const insertion = model.bestInsertion(b, model.routes[b], v);
        if (insertion && insertion.addedKm < savedKm - EPS) {
          model.routes[a] = withoutV;
          model.insert(b, v, insertion.position);
          improvedAny = true;
          i--;
          break;
        }
      }
    }
  }

  for (let a = 0; a < dayCount; a++) {
    for (let b = a + 1; b < dayCount; b++) {
      for (let i = 0; i < model.routes[a].length; i++) {
        for (let j = 0; j < model.routes[b].length; j++) {
          const u = model.routes[a][i];
          const w = model.routes[b][j];
          if (visits[u].fixed || visits[w].fixed) continue;
          const restA = model.routes[a].filter((_, k) => k !== i);
          const restB = model.routes[b].filter((_, k) => k !== j);
          const inA = model.bestInsertion(a, restA, w);
          const inB = inA && model.bestInsertion(b, restB, u);
          if (!inA || !inB) continue;
          const beforeKm = model.routeKm(model.routes[a]) + model.routeKm(model.routes[b]);
          const afterKm = model.routeKm(restA) + model.routeKm(restB) + inA.addedKm + inB.addedKm;
          if (afterKm < beforeKm - EPS) {
            restA.splice(inA.position, 0, w);
            restB.splice(inB.position, 0, u);
            model.routes[a] = restA;
            model.routes[b] = restB;
            improvedAny = true;
          }
        }
      }
    }
  }
  return improvedAny;
}

/** Makes room for a left-over visit by moving one placed visit to another day. */
function placeByMovingOne(model: WeekModel, u: number): boolean {
  const visits = model.input.visits;
  let best: { a: number; i: number; inA: { position: number }; b: number; inB: { position: number }; costKm: number } | null = null;
  for (let a = 0; a < model.routes.length; a++) {
    for (let i = 0; i < model.routes[a].length; i++) {
      const v = model.routes[a][i];
      if (visits[v].fixed) continue;
      const restA = model.routes[a].filter((_, k) => k !== i);
      const inA = model.bestInsertion(a, restA, u);
      if (!inA) continue;
      for (let b = 0; b < model.routes.length; b++) {
        if (b === a) continue;
        const inB = model.bestInsertion(b, model.routes[b], v);
        if (!inB) continue;
        const costKm = model.routeKm(restA) - model.routeKm(model.routes[a]) + inA.addedKm + inB.addedKm;
        if (!best || costKm < best.costKm) best = { a, i, inA, b, inB, costKm };
      }
    }
  }
  if (!best) return false;
  const v = model.routes[best.a][best.i];
  const restA = model.routes[best.a].filter((_, k) => k !== best.i);
  restA.splice(best.inA.position, 0, u);
  model.routes[best.a] = restA;
  model.insert(best.b, v, best.inB.position);
  return true;
}

/** Free minutes between consecutive stops once every stop is pushed as late as it can go. */
function longestFreeMin(model: WeekModel): number {
  const visits = model.input.visits;
  let longest = 0;
  model.routes.forEach((route, dayIndex) => {
    const day = model.input.days[dayIndex];
    const timings = model.timings(dayIndex, route)!;
    // Latest start of each stop that still lets the rest of the day run (backward pass).
    const latestStart = new Array<number>(route.length);
    let latestNext = day.endMin;
    let nextNode = 0;
    for (let k = route.length - 1; k >= 0; k--) {
      const visit = visits[route[k]];
      let latest = latestNext - model.drive[(route[k] + 1) * model.size + nextNode] - visit.serviceMin;
      if (visit.window) latest = Math.min(latest, visit.window.endMin - visit.serviceMin);
      if (visit.fixed) latest = visit.fixed.startMin;
      latestStart[k] = latest;
      latestNext = latest;
      nextNode = route[k] + 1;
    }
    for (let k = 0; k <= route.length; k++) {
      const freeFrom = k === 0 ? day.startMin : timings[k - 1].departMin;
      const freeUntil = k === route.length ? day.endMin : latestStart[k];
      longest = Math.max(longest, freeUntil - freeFrom);
    }
  });
  return longest;
}

function reasonForLeftOver(model: WeekModel, v: number): string {
  const visit = model.input.visits[v];
  const dayIndices = visit.fixed ? [visit.fixed.dayIndex] : model.input.days.map((_, d) => d);
  const fitsAlone = dayIndices.some((d) => model.feasible(d, [v]));
  if (visit.fixed) {
    if (fitsAlone) return UNPLACED_REASONS.fixedClash;
    const arriveMin = model.input.days[visit.fixed.dayIndex].startMin + model.drive[v + 1];
    return arriveMin > visit.fixed.startMin + EPS ? UNPLACED_REASONS.fixedUnreachable : UNPLACED_REASONS.fixedNoReturn;
  }
  if (!fitsAlone) return visit.window ? UNPLACED_REASONS.windowUnreachable : UNPLACED_REASONS.tooFar;
  if (visit.serviceMin > longestFreeMin(model) + EPS) return UNPLACED_REASONS.longerThanFreeTime;
  return UNPLACED_REASONS.daysFull;
}

/**
 * Plans the week: fixed appointments first, then the other visits by priority and regret at
 * their cheapest feasible place, then routes are shortened within and across days and left-over
 * visits are tried again. Throws PlanInputError when validatePlanInput finds problems.
 */
export function planWeek(input: PlanWeekInput, onProgress?: (progress: PlanProgress) => void): WeekPlan {
  const issues = validatePlanInput(input);
  if (issues.length > 0) throw new PlanInputError(issues);

  const model = new WeekModel(input, input.circuityFactor ?? RURAL_CIRCUITY_FACTOR);
  const visits = input.visits;
  const total = visits.length;
  let placedCount = 0;
  const reportPlacing = () => onProgress?.({ phase: 'placing', fraction: total === 0 ? 0.5 : (0.5 * placedCount) / total });
  const leftFixed = new Map<number, string>();

  // Appointments first, higher priority first; each goes where its time puts it in the day.
  const fixedOrder = visits
    .map((_, v) => v)
    .filter((v) => visits[v].fixed)
    .sort((x, y) => priorityOf(visits[y]) - priorityOf(visits[x]) || visits[x].fixed!.startMin - visits[y].fixed!.startMin);
  for (const v of fixedOrder) {
    const { dayIndex, startMin } = visits[v].fixed!;
    const route = model.routes[dayIndex];
    const position = route.filter((w) => visits[w].fixed!.startMin < startMin).length;
    const candidate = [...route.slice(0, position), v, ...route.slice(position)];
    if (model.feasible(dayIndex, candidate)) {
      model.routes[dayIndex] = candidate;
      placedCount++;
      reportPlacing();
    } else {
      leftFixed.set(v, reasonForLeftOver(model, v));
    }
  }

  const flexible = visits.map((_, v) => v).filter((v) => !visits[v].fixed);
  let leftOver = placeByRegret(model, flexible, () => {
    placedCount++;
    reportPlacing();
  });

  for (let round = 0; round < MAX_IMPROVEMENT_ROUNDS; round++) {
    onProgress?.({ phase: 'improving', fraction: 0.5 + (0.5 * round) / MAX_IMPROVEMENT_ROUNDS });
    let changed = false;
    for (let d = 0; d < model.routes.length; d++) changed = improveDay(model, d) || changed;
    changed = improveAcrossDays(model) || changed;
    // Shorter routes may have freed room: retry the left-overs, highest priority first.
    const before = leftOver.length;
    leftOver = placeByRegret(model, leftOver, () => undefined);
    const stillLeft: number[] = [];
    for (const u of [...leftOver].sort((x, y) => priorityOf(visits[y]) - priorityOf(visits[x]))) {
      if (!placeByMovingOne(model, u)) stillLeft.push(u);
    }
    leftOver = stillLeft;
    if (leftOver.length < before) changed = true;
    if (!changed) break;
  }

  const days: PlannedDay[] = model.routes.map((route, dayIndex) => {
    const day = input.days[dayIndex];
    const timings = model.timings(dayIndex, route)!;
    let driveMin = 0;
    let serviceMin = 0;
    let prev = 0;
    for (const v of route) {
      driveMin += model.drive[prev * model.size + v + 1];
      serviceMin += visits[v].serviceMin;
      prev = v + 1;
    }
    driveMin += model.drive[prev * model.size];
    return {
      date: day.date,
      stops: route.map((v, k) => ({
        id: visits[v].id,
        arriveMin: timings[k].arriveMin,
        departMin: timings[k].departMin,
        waitMin: timings[k].startMin - timings[k].arriveMin,
      })),
      distanceKm: model.routeKm(route),
      driveMin,
      workMin: driveMin + serviceMin,
      endMin: route.length === 0 ? day.startMin : timings[route.length - 1].departMin + model.drive[prev * model.size],
    };
  });

  const unplaced: UnplacedVisit[] = [
    ...[...leftFixed].map(([v, reason]) => ({ id: visits[v].id, reason })),
    ...leftOver.map((v) => ({ id: visits[v].id, reason: reasonForLeftOver(model, v) })),
  ];
  onProgress?.({ phase: 'done', fraction: 1 });
  return { days, unplaced };
}
