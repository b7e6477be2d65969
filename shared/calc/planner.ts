// The upgrade-roadmap planner: which part goes on which planter in which season so that the
// grower's goals are met by their seasons within each season's budget, nothing bought is thrown
// away sooner than it must be, and the total is as low as possible — in that order.
//
// Model (documented here once; the tests' brute force re-implements it independently):
// - A season runs: planned toolbar replacements first (parts that cannot move are stranded and
//   their remaining value wasted), then the season's purchases are fitted together.
// - A purchase costs (price − preparation savings) × quantity + (labour hours − savings) ×
//   quantity × shop rate. Savings apply when the preparing part is on the planter at the start of
//   the season. The season's purchases must fit its budget (a season without a budget gets none).
// - Fitting part A removes every part A supersedes (waste = remaining value). A purchase is refused
//   if the same part is already on the planter, if a part on the planter afterwards supersedes it
//   or conflicts with it, if it would be superseded in the season it is bought, or if it does not
//   work at the end of the season (its required parts/capabilities absent).
// - A part works while its requirements are met by working parts (greatest fixed point); working
//   parts give the planter their capabilities.
// - A goal is met by its season when its capabilities are on the planter at the end of every
//   season from its season to the end of the roadmap; met late when they are there at the end of
//   the roadmap (from some later season). Goals due before the first season are due in the first;
//   goals due after the last season are outside the roadmap and ignored.
// - Objective, lexicographic: priority met by deadline (max), priority met late (max), waste
//   (min), total cost (min). Each candidate (part, planter) is bought at most once; list it twice
//   to allow a second purchase. A rule listed twice counts once (the first); rules naming unknown
//   parts or the part itself are ignored (validateRuleSet reports both).
import { remainingValueUsd, ROW_CROP_PLANTER_RV_COEFFICIENTS } from './depreciation';
import { validateRuleSet } from './catalog-rules';
import type {
  CatalogPart,
  GoalOutcome,
  NaiveOrder,
  PlannerCandidate,
  PlannerGoal,
  PlannerInput,
  PlannedReplacement,
  PlanterSpec,
  RoadmapItem,
  RoadmapObjective,
  RoadmapPlan,
  RoadmapPurchase,
  RoadmapSeason,
  SearchReport,
  StrategyComparison,
  UnmetGoal,
  WasteItem,
} from './planner-types';

const MONEY_EPS_USD = 1e-6;
const WEIGHT_EPS = 1e-9;
/** Instances with at most this many assignments ((seasons + 1) ^ candidates) are always searched to the end. */
const EXACT_ASSIGNMENT_LIMIT = 2_000_000;
const DEFAULT_MAX_SEARCH_NODES = 3_000;
const SEARCH_FROM_EMPTY_LIMIT = 100_000;
const BOUNDED_SEARCH_MAX_CANDIDATES = 30;
const HEURISTIC_EVALUATION_BUDGET = 6_000;
const DOMINANCE_MEMO_LIMIT = 400_000;

// ---------------------------------------------------------------------------------------------
// Compiled model

interface Slot {
  year: number;
  priceUsd: number;
  fleet: boolean;
}
type Slots = (Slot | null)[];

interface PlanterState {
  slots: Slots;
  caps: Uint8Array;
}

interface Saving {
  from: number;
  hours: number;
  usd: number;
}

interface CompiledGoal {
  goal: PlannerGoal;
  index: number;
  planter: number;
  caps: number[];
  deadlineIdx: number;
  priority: number;
  beyond: boolean;
}

interface Model {
  input: PlannerInput;
  S: number;
  years: number[];
  budgets: number[];
  parts: readonly CatalogPart[];
  m: number;
  partIndex: Map<string, number>;
  planters: readonly PlanterSpec[];
  P: number;
  planterIndex: Map<string, number>;
  capNames: string[];
  capIndex: Map<string, number>;
  provides: number[][];
  reqParts: number[][];
  reqCaps: number[][];
  conflicts: number[][];
  supersedes: number[][];
  supersededBy: number[][];
  preparedBy: Saving[][];
  providersOfCap: number[][];
  qty: number[][];
  replaceAt: (PlannedReplacement | null)[][];
  goals: CompiledGoal[];
  goalsByPlanter: number[][];
  initial: PlanterState[];
}

function pushUnique(list: number[], value: number): void {
  if (!list.includes(value)) list.push(value);
}

function compile(input: PlannerInput): Model {
  const S = input.horizonSeasons;
  if (!Number.isInteger(S) || S < 1 || S > 10) throw new RangeError(`horizonSeasons must be an integer 1–10 (got ${S})`);
  if (!Number.isFinite(input.shopRateUsdPerHour) || input.shopRateUsdPerHour < 0) {
    throw new RangeError('shopRateUsdPerHour must be ≥ 0');
  }
  const years = Array.from({ length: S }, (_, k) => input.firstSeason + k);
  const budgets = years.map((y) => Math.max(0, input.budgetsUsdBySeason[y] ?? 0));

  const parts = input.catalog;
  const partIndex = new Map<string, number>();
  parts.forEach((part, i) => {
    if (partIndex.has(part.id)) throw new Error(`catalog lists part ${part.id} twice`);
    if (!(part.priceUsd >= 0) || !(part.labourHours >= 0)) throw new RangeError(`part ${part.id} has a negative price or labour`);
    partIndex.set(part.id, i);
  });
  const m = parts.length;
  const planters = input.fleet.planters;
  const planterIndex = new Map<string, number>();
  planters.forEach((planter, i) => {
    if (planterIndex.has(planter.id)) throw new Error(`fleet lists planter ${planter.id} twice`);
    planterIndex.set(planter.id, i);
  });
  const P = planters.length;
  const planterOf = (id: string, what: string): number => {
    const p = planterIndex.get(id);
    if (p === undefined) throw new Error(`${what} names planter ${id}, which is not in the fleet`);
    return p;
  };
  const partOf = (id: string, what: string): number => {
    const x = partIndex.get(id);
    if (x === undefined) throw new Error(`${what} names part ${id}, which is not in the catalog`);
    return x;
  };

  const capNames: string[] = [];
  const capIndex = new Map<string, number>();
  const capOf = (name: string): number => {
    let c = capIndex.get(name);
    if (c === undefined) {
      c = capNames.length;
      capNames.push(name);
      capIndex.set(name, c);
    }
    return c;
  };

  const empty = (): number[][] => Array.from({ length: m }, () => []);
  const provides = empty();
  const reqParts = empty();
  const reqCaps = empty();
  const conflicts = empty();
  const supersedes = empty();
  const supersededBy = empty();
  const preparedBy: Saving[][] = Array.from({ length: m }, () => []);
  for (const rule of input.rules) {
    // Rules naming unknown parts or themselves are reported by validateRuleSet and left out here.
    const x = partIndex.get(rule.partId);
    if (x === undefined) continue;
    switch (rule.kind) {
      case 'provides':
        pushUnique(provides[x], capOf(rule.capability));
        break;
      case 'requires':
        if ('requiredPartId' in rule) {
          const y = partIndex.get(rule.requiredPartId);
          if (y !== undefined && y !== x) pushUnique(reqParts[x], y);
        } else {
          pushUnique(reqCaps[x], capOf(rule.requiredCapability));
        }
        break;
      case 'conflictsWith': {
        const y = partIndex.get(rule.otherPartId);
        if (y !== undefined && y !== x) {
          pushUnique(conflicts[x], y);
          pushUnique(conflicts[y], x);
        }
        break;
      }
      case 'supersedes': {
        const y = partIndex.get(rule.supersededPartId);
        if (y !== undefined && y !== x) {
          pushUnique(supersedes[x], y);
          pushUnique(supersededBy[y], x);
        }
        break;
      }
      case 'preparesFor': {
        const y = partIndex.get(rule.laterPartId);
        if (y !== undefined && y !== x && !preparedBy[y].some((s) => s.from === x)) {
          preparedBy[y].push({
            from: x,
            hours: Math.max(0, rule.labourHoursSavedPerUnit),
            usd: Math.max(0, rule.partsUsdSavedPerUnit),
          });
        }
        break;
      }
    }
  }

  const goals: CompiledGoal[] = input.goals.map((goal, index) => {
    if (!Number.isFinite(goal.priority) || goal.priority < 0) throw new RangeError(`goal ${goal.id} has a negative priority`);
    const beyond = goal.bySeason > years[S - 1];
    return {
      goal,
      index,
      planter: planterOf(goal.planterId, `goal ${goal.id}`),
      caps: [...new Set(goal.capabilities)].map(capOf),
      deadlineIdx: beyond ? S - 1 : Math.max(0, goal.bySeason - input.firstSeason),
      priority: goal.priority,
      beyond,
    };
  });
  const providersOfCap: number[][] = capNames.map(() => []);
  provides.forEach((caps, x) => caps.forEach((c) => providersOfCap[c].push(x)));

  const qty = planters.map((planter) =>
    parts.map((part) => (part.unit === 'row' ? planter.rows : part.unit === 'toolbar' ? planter.toolbars : 1)),
  );
  const replaceAt: (PlannedReplacement | null)[][] = planters.map(() => years.map(() => null));
  for (const r of input.replacements) {
    const p = planterOf(r.planterId, 'a planned replacement');
    const k = r.season - input.firstSeason;
    if (k >= 0 && k < S) replaceAt[p][k] = r;
  }
  const goalsByPlanter: number[][] = planters.map(() => []);
  goals.forEach((g, i) => goalsByPlanter[g.planter].push(i));

  const model: Model = {
    input,
    S,
    years,
    budgets,
    parts,
    m,
    partIndex,
    planters,
    P,
    planterIndex,
    capNames,
    capIndex,
    provides,
    reqParts,
    reqCaps,
    conflicts,
    supersedes,
    supersededBy,
    preparedBy,
    providersOfCap,
    qty,
    replaceAt,
    goals,
    goalsByPlanter,
    initial: [],
  };
  const initialSlots: Slots[] = planters.map(() => new Array<Slot | null>(m).fill(null));
  for (const inst of input.fleet.installed) {
    const p = planterOf(inst.planterId, `installed part ${inst.partId}`);
    const x = partOf(inst.partId, `an installed part on planter ${inst.planterId}`);
    if (inst.installedSeason > input.firstSeason) {
      throw new RangeError(`installed part ${inst.partId} on ${inst.planterId} is dated after the first season`);
    }
    const existing = initialSlots[p][x];
    // Two records of one part on one planter (e.g. rows done in two seasons) count as one install:
    // prices add up, and the later date is kept so that waste is not understated.
    initialSlots[p][x] = existing
      ? { year: Math.max(existing.year, inst.installedSeason), priceUsd: existing.priceUsd + inst.pricePaidUsd, fleet: true }
      : { year: inst.installedSeason, priceUsd: inst.pricePaidUsd, fleet: true };
  }
  model.initial = initialSlots.map((slots) => ({ slots, caps: functioning(model, slots).caps }));
  return model;
}

// ---------------------------------------------------------------------------------------------
// Season mechanics

// Hot path (called for every simulated season): plain loops, no closures.
function functioning(M: Model, slots: Slots): { func: Uint8Array; caps: Uint8Array } {
  const func = new Uint8Array(M.m);
  const caps = new Uint8Array(M.capNames.length);
  for (let x = 0; x < M.m; x += 1) if (slots[x]) func[x] = 1;
  for (;;) {
    caps.fill(0);
    for (let x = 0; x < M.m; x += 1) {
      if (!func[x]) continue;
      const provides = M.provides[x];
      for (let i = 0; i < provides.length; i += 1) caps[provides[i]] = 1;
    }
    let changed = false;
    for (let x = 0; x < M.m; x += 1) {
      if (!func[x]) continue;
      let ok = true;
      const reqParts = M.reqParts[x];
      for (let i = 0; ok && i < reqParts.length; i += 1) ok = func[reqParts[i]] === 1;
      const reqCaps = M.reqCaps[x];
      for (let i = 0; ok && i < reqCaps.length; i += 1) ok = caps[reqCaps[i]] === 1;
      if (!ok) {
        func[x] = 0;
        changed = true;
      }
    }
    if (!changed) return { func, caps };
  }
}

function valueAt(M: Model, x: number, slot: Slot, year: number): number {
  return remainingValueUsd(
    { pricePaidUsd: slot.priceUsd, installedSeason: slot.year, expectedLifeYears: M.parts[x].expectedLifeYears },
    year,
    M.input.valuation,
    { coefficients: M.input.remainingValueCoefficients ?? ROW_CROP_PLANTER_RV_COEFFICIENTS },
  );
}

function costAt(M: Model, p: number, x: number, startSlots: Slots): { partsUsd: number; labourUsd: number } {
  let savedUsd = 0;
  let savedHours = 0;
  for (const s of M.preparedBy[x]) {
    if (startSlots[s.from]) {
      savedUsd += s.usd;
      savedHours += s.hours;
    }
  }
  const part = M.parts[x];
  const q = M.qty[p][x];
  return {
    partsUsd: q * Math.max(0, part.priceUsd - savedUsd),
    labourUsd: q * Math.max(0, part.labourHours - savedHours) * M.input.shopRateUsdPerHour,
  };
}

function minCostUsd(M: Model, p: number, x: number): number {
  const all = new Array<Slot | null>(M.m).fill(null);
  for (const s of M.preparedBy[x]) all[s.from] = { year: 0, priceUsd: 0, fleet: true };
  const c = costAt(M, p, x, all);
  return c.partsUsd + c.labourUsd;
}

function goalPresent(caps: Uint8Array, g: CompiledGoal): boolean {
  for (const c of g.caps) if (!caps[c]) return false;
  return true;
}

type FailureKind =
  | 'budget'
  | 'already-installed'
  | 'bought-twice'
  | 'same-season-supersede'
  | 'superseded-by-installed'
  | 'conflict'
  | 'requirement';

interface Failure {
  kind: FailureKind;
  k: number;
  planter: number;
  part: number;
  other?: number;
  plannedUsd?: number;
}

interface DetailItem {
  k: number;
  p: number;
  x: number;
  partsUsd: number;
  labourUsd: number;
  removes: number[];
}
interface DetailWaste {
  k: number;
  p: number;
  x: number;
  cause: 'superseded' | 'stranded';
  by?: number;
  slot: Slot;
  valueUsd: number;
}
interface Detail {
  items: DetailItem[];
  waste: DetailWaste[];
  caps: Uint8Array[][]; // [k][p]
}

function strand(M: Model, p: number, k: number, start: PlanterState, detail: Detail | null): { state: PlanterState; wasteUsd: number } {
  if (!M.replaceAt[p][k]) return { state: start, wasteUsd: 0 };
  const year = M.years[k];
  const slots = start.slots.slice();
  let wasteUsd = 0;
  for (let x = 0; x < M.m; x += 1) {
    const slot = slots[x];
    if (!slot || M.parts[x].movesToNewToolbar) continue;
    const valueUsd = valueAt(M, x, slot, year);
    wasteUsd += valueUsd;
    slots[x] = null;
    detail?.waste.push({ k, p, x, cause: 'stranded', slot, valueUsd });
  }
  return { state: { slots, caps: functioning(M, slots).caps }, wasteUsd };
}

type PurchaseResult = { ok: true; state: PlanterState; costUsd: number; wasteUsd: number } | { ok: false; failure: Failure };

function purchase(M: Model, p: number, k: number, start: PlanterState, buys: readonly number[], detail: Detail | null): PurchaseResult {
  const year = M.years[k];
  const slots = start.slots.slice();
  const n = buys.length;
  for (let i = 0; i < n; i += 1) {
    const x = buys[i];
    if (buys.indexOf(x) !== i) return failed('bought-twice', k, p, x);
    if (slots[x]) return failed('already-installed', k, p, x);
  }
  let costUsd = 0;
  let wasteUsd = 0;
  const partsUsd: number[] = new Array<number>(n);
  for (let i = 0; i < n; i += 1) {
    const c = costAt(M, p, buys[i], start.slots);
    partsUsd[i] = c.partsUsd;
    costUsd += c.partsUsd + c.labourUsd;
    if (detail) detail.items.push({ k, p, x: buys[i], partsUsd: c.partsUsd, labourUsd: c.labourUsd, removes: [] });
  }
  const firstItem = detail ? detail.items.length - n : 0;
  for (let i = 0; i < n; i += 1) {
    const x = buys[i];
    const supersedes = M.supersedes[x];
    for (let j = 0; j < supersedes.length; j += 1) {
      const y = supersedes[j];
      if (buys.includes(y)) return failed('same-season-supersede', k, p, y, x);
      const slot = slots[y];
      if (!slot) continue;
      const valueUsd = valueAt(M, y, slot, year);
      wasteUsd += valueUsd;
      slots[y] = null;
      if (detail) {
        detail.items[firstItem + i].removes.push(y);
        detail.waste.push({ k, p, x: y, cause: 'superseded', by: x, slot, valueUsd });
      }
    }
  }
  for (let i = 0; i < n; i += 1) slots[buys[i]] = { year, priceUsd: partsUsd[i], fleet: false };
  for (let i = 0; i < n; i += 1) {
    const x = buys[i];
    const supersededBy = M.supersededBy[x];
    for (let j = 0; j < supersededBy.length; j += 1) if (slots[supersededBy[j]]) return failed('superseded-by-installed', k, p, x, supersededBy[j]);
    const conflicts = M.conflicts[x];
    for (let j = 0; j < conflicts.length; j += 1) if (slots[conflicts[j]]) return failed('conflict', k, p, x, conflicts[j]);
  }
  const { func, caps } = functioning(M, slots);
  for (let i = 0; i < n; i += 1) if (!func[buys[i]]) return failed('requirement', k, p, buys[i]);
  return { ok: true, state: { slots, caps }, costUsd, wasteUsd };
}

function failed(kind: FailureKind, k: number, planter: number, part: number, other?: number): PurchaseResult {
  return { ok: false, failure: { kind, k, planter, part, other } };
}

// ---------------------------------------------------------------------------------------------
// Whole-roadmap simulation

interface Obj {
  met: number;
  late: number;
  waste: number;
  cost: number;
}

function better(a: Obj, b: Obj): boolean {
  if (a.met > b.met + WEIGHT_EPS) return true;
  if (a.met < b.met - WEIGHT_EPS) return false;
  if (a.late > b.late + WEIGHT_EPS) return true;
  if (a.late < b.late - WEIGHT_EPS) return false;
  if (a.waste < b.waste - MONEY_EPS_USD) return true;
  if (a.waste > b.waste + MONEY_EPS_USD) return false;
  return a.cost < b.cost - MONEY_EPS_USD;
}

const WORST: Obj = { met: -Infinity, late: -Infinity, waste: Infinity, cost: Infinity };

interface PlanterSim {
  failure: Failure | null;
  costByK: number[];
  wasteUsd: number;
  costUsd: number;
  /** Aligned with M.goalsByPlanter[p]: season index from which the goal holds to the end, or null. */
  goalMetIdx: (number | null)[];
  met: number;
  late: number;
}

function simulatePlanter(M: Model, p: number, buysByK: readonly (readonly number[])[], detail: Detail | null): PlanterSim {
  const S = M.S;
  const goalIdxs = M.goalsByPlanter[p];
  const presence = new Uint8Array(goalIdxs.length * S);
  const costByK = new Array<number>(S).fill(0);
  let state = M.initial[p];
  let wasteUsd = 0;
  let costUsd = 0;
  for (let k = 0; k < S; k += 1) {
    const stranded = strand(M, p, k, state, detail);
    state = stranded.state;
    wasteUsd += stranded.wasteUsd;
    const buys = buysByK[k];
    if (buys && buys.length > 0) {
      const r = purchase(M, p, k, state, buys, detail);
      if (!r.ok) return { failure: r.failure, costByK, wasteUsd, costUsd, goalMetIdx: [], met: 0, late: 0 };
      state = r.state;
      wasteUsd += r.wasteUsd;
      costByK[k] = r.costUsd;
      costUsd += r.costUsd;
    }
    if (detail) detail.caps[k][p] = state.caps;
    for (let j = 0; j < goalIdxs.length; j += 1) presence[j * S + k] = goalPresent(state.caps, M.goals[goalIdxs[j]]) ? 1 : 0;
  }
  let met = 0;
  let late = 0;
  const goalMetIdx = goalIdxs.map((gi, j) => {
    if (!presence[j * S + S - 1]) return null;
    let k = S - 1;
    while (k > 0 && presence[j * S + k - 1]) k -= 1;
    const g = M.goals[gi];
    if (!g.beyond) {
      if (k <= g.deadlineIdx) met += g.priority;
      else late += g.priority;
    }
    return k;
  });
  return { failure: null, costByK, wasteUsd, costUsd, goalMetIdx, met, late };
}

function combine(M: Model, sims: readonly PlanterSim[]): { obj: Obj; failure: null } | { obj: null; failure: Failure } {
  for (const sim of sims) if (sim.failure) return { obj: null, failure: sim.failure };
  for (let k = 0; k < M.S; k += 1) {
    let totalUsd = 0;
    for (const sim of sims) totalUsd += sim.costByK[k];
    if (totalUsd > M.budgets[k] + MONEY_EPS_USD) {
      return { obj: null, failure: { kind: 'budget', k, planter: -1, part: -1, plannedUsd: totalUsd } };
    }
  }
  const obj: Obj = { met: 0, late: 0, waste: 0, cost: 0 };
  for (const sim of sims) {
    obj.met += sim.met;
    obj.late += sim.late;
    obj.waste += sim.wasteUsd;
    obj.cost += sim.costUsd;
  }
  return { obj, failure: null };
}

/** Internal purchase: season index, planter index, part index. */
interface Buy {
  k: number;
  p: number;
  x: number;
}

function buysByPlanter(M: Model, buys: readonly Buy[]): number[][][] {
  const grid: number[][][] = Array.from({ length: M.P }, () => Array.from({ length: M.S }, () => []));
  for (const b of buys) grid[b.p][b.k].push(b.x);
  return grid;
}

interface PlanSim {
  sims: PlanterSim[];
  obj: Obj | null;
  failure: Failure | null;
  detail: Detail | null;
}

function simulatePlan(M: Model, buys: readonly Buy[], withDetail: boolean): PlanSim {
  const grid = buysByPlanter(M, buys);
  const detail: Detail | null = withDetail
    ? { items: [], waste: [], caps: M.years.map(() => M.initial.map((s) => s.caps)) }
    : null;
  const sims = grid.map((byK, p) => simulatePlanter(M, p, byK, detail));
  const c = combine(M, sims);
  return { sims, obj: c.obj, failure: c.failure, detail };
}

// ---------------------------------------------------------------------------------------------
// Candidates

interface Cand {
  part: number;
  planter: number;
  /** Index of the previous copy of the same (part, planter), or −1. */
  prevCopy: number;
  minCostUsd: number;
}

interface Space {
  cands: Cand[];
  byPlanter: number[][];
  /** [planter][cap] → candidates providing it. */
  capProviders: number[][][];
  /** [planter][part] → candidates whose part supersedes it. */
  supersederCands: number[][][];
  /** Candidates on the same planter that can stand in for or remove each other. */
  related: number[][];
}

function relevantParts(M: Model, p: number): number[] {
  const relevant = new Set<number>();
  const queue: number[] = [];
  const add = (x: number): void => {
    if (!relevant.has(x)) {
      relevant.add(x);
      queue.push(x);
    }
  };
  for (const gi of M.goalsByPlanter[p]) {
    const g = M.goals[gi];
    if (g.beyond || g.priority <= 0) continue;
    for (const c of g.caps) M.providersOfCap[c].forEach(add);
  }
  while (queue.length > 0) {
    const x = queue.shift()!;
    M.reqParts[x].forEach(add);
    for (const c of M.reqCaps[x]) M.providersOfCap[c].forEach(add);
    for (const s of M.preparedBy[x]) add(s.from);
    // A part that removes a conflicting part can open the way for a needed one.
    for (const y of M.conflicts[x]) M.supersededBy[y].forEach(add);
  }
  return [...relevant].sort((a, b) => a - b);
}

function buildSpace(M: Model, list: readonly PlannerCandidate[] | null): Space {
  const pairs: { p: number; x: number }[] = [];
  if (list) {
    for (const c of list) {
      const p = M.planterIndex.get(c.planterId);
      const x = M.partIndex.get(c.partId);
      if (p === undefined) throw new Error(`candidate names planter ${c.planterId}, which is not in the fleet`);
      if (x === undefined) throw new Error(`candidate names part ${c.partId}, which is not in the catalog`);
      pairs.push({ p, x });
    }
  } else {
    for (let p = 0; p < M.P; p += 1) {
      const replacements = M.replaceAt[p].filter((r) => r !== null).length;
      for (const x of relevantParts(M, p)) {
        // A part that cannot move may be needed again on the new toolbar: one more copy per replacement.
        const copies = M.parts[x].movesToNewToolbar ? 1 : 1 + replacements;
        for (let i = 0; i < copies; i += 1) pairs.push({ p, x });
      }
    }
  }
  const lastCopy = new Map<string, number>();
  const cands: Cand[] = pairs.map(({ p, x }, i) => {
    const key = `${p}:${x}`;
    const prevCopy = lastCopy.get(key) ?? -1;
    lastCopy.set(key, i);
    return { part: x, planter: p, prevCopy, minCostUsd: minCostUsd(M, p, x) };
  });
  const byPlanter: number[][] = Array.from({ length: M.P }, () => []);
  const capProviders: number[][][] = Array.from({ length: M.P }, () => M.capNames.map(() => []));
  const supersederCands: number[][][] = Array.from({ length: M.P }, () => Array.from({ length: M.m }, () => []));
  cands.forEach((c, i) => {
    byPlanter[c.planter].push(i);
    for (const cap of M.provides[c.part]) capProviders[c.planter][cap].push(i);
    for (const y of M.supersedes[c.part]) supersederCands[c.planter][y].push(i);
  });
  const related = cands.map((c, i) =>
    byPlanter[c.planter].filter((j) => {
      if (j === i) return false;
      const x = c.part;
      const y = cands[j].part;
      return M.provides[x].some((cap) => M.provides[y].includes(cap)) || M.supersedes[x].includes(y) || M.supersedes[y].includes(x);
    }),
  );
  return { cands, byPlanter, capProviders, supersederCands, related };
}

function assignmentToBuys(space: Space, seasonOf: ArrayLike<number>): Buy[] {
  const buys: Buy[] = [];
  space.cands.forEach((c, i) => {
    const k = seasonOf[i];
    if (k >= 0) buys.push({ k, p: c.planter, x: c.part });
  });
  return buys.sort((a, b) => a.k - b.k || a.p - b.p || a.x - b.x);
}

// ---------------------------------------------------------------------------------------------
// Heuristic: goal-by-goal insertion, then local search over single and paired moves

interface Trial {
  seasonOf: Int16Array;
  sims: PlanterSim[];
  obj: Obj | null;
  failure: Failure | null;
}

class AssignmentEvaluator {
  evaluations = 0;
  seasonOf: Int16Array;
  sims: PlanterSim[];
  obj: Obj;

  constructor(
    private readonly M: Model,
    private readonly space: Space,
    seasonOf: Int16Array,
  ) {
    this.seasonOf = seasonOf;
    this.sims = Array.from({ length: M.P }, (_, p) => this.simulate(p, seasonOf));
    this.obj = combine(M, this.sims).obj ?? WORST;
  }

  private simulate(p: number, seasonOf: Int16Array): PlanterSim {
    this.evaluations += 1;
    const byK: number[][] = [];
    for (let k = 0; k < this.M.S; k += 1) byK.push([]);
    const list = this.space.byPlanter[p];
    for (let i = 0; i < list.length; i += 1) {
      const c = list[i];
      if (seasonOf[c] >= 0) byK[seasonOf[c]].push(this.space.cands[c].part);
    }
    return simulatePlanter(this.M, p, byK, null);
  }

  trial(changes: readonly (readonly [number, number])[]): Trial {
    const seasonOf = this.seasonOf.slice();
    const touched = new Set<number>();
    for (const [c, k] of changes) {
      if (seasonOf[c] === k) continue;
      seasonOf[c] = k;
      touched.add(this.space.cands[c].planter);
    }
    const sims = this.sims.slice();
    for (const p of touched) sims[p] = this.simulate(p, seasonOf);
    const c = combine(this.M, sims);
    return { seasonOf, sims, obj: c.obj, failure: c.failure };
  }

  commit(t: Trial): void {
    this.seasonOf = t.seasonOf;
    this.sims = t.sims;
    this.obj = t.obj ?? WORST;
  }

  goalMetIdx(gi: number): number | null {
    const g = this.M.goals[gi];
    return this.sims[g.planter].goalMetIdx[this.M.goalsByPlanter[g.planter].indexOf(gi)] ?? null;
  }
}

/** Ways to give planter g.planter the goal's capabilities: one provider per capability plus prerequisites. */
function bundlesFor(M: Model, space: Space, gi: number, seasonOf: Int16Array): number[][] {
  const g = M.goals[gi];
  const p = g.planter;
  const fleetParts = new Set<number>();
  M.initial[p].slots.forEach((s, x) => {
    if (s) fleetParts.add(x);
  });
  const representative = (x: number): number | undefined => {
    const copies = space.byPlanter[p].filter((c) => space.cands[c].part === x);
    return copies.find((c) => seasonOf[c] >= 0) ?? copies[0];
  };
  const rank = (c: number): number => (seasonOf[c] >= 0 ? 0 : space.cands[c].minCostUsd);
  const optionsPerCap: number[][] = g.caps.map((cap) => {
    const parts = [...new Set(space.capProviders[p][cap].map((c) => space.cands[c].part))];
    const reps = parts
      .map(representative)
      .filter((c): c is number => c !== undefined)
      .sort((a, b) => rank(a) - rank(b))
      .slice(0, 3);
    return M.initial[p].caps[cap] ? [-1, ...reps.slice(0, 2)] : reps;
  });
  if (optionsPerCap.some((o) => o.length === 0)) return [];
  const combos: number[][] = [];
  const walk = (i: number, chosen: number[]): void => {
    if (combos.length >= 12) return;
    if (i === optionsPerCap.length) {
      combos.push(chosen.filter((c) => c >= 0));
      return;
    }
    for (const o of optionsPerCap[i]) walk(i + 1, [...chosen, o]);
  };
  walk(0, []);
  const seen = new Set<string>();
  const bundles: number[][] = [];
  for (const combo of combos) {
    const set = new Set(combo);
    const partsIn = new Set<number>([...fleetParts, ...combo.map((c) => space.cands[c].part)]);
    const stack = [...combo];
    while (stack.length > 0) {
      const x = space.cands[stack.pop()!].part;
      const need: number[] = [];
      for (const y of M.reqParts[x]) if (!partsIn.has(y)) need.push(y);
      for (const cap of M.reqCaps[x]) {
        if ([...partsIn].some((y) => M.provides[y].includes(cap))) continue;
        const best = M.providersOfCap[cap]
          .map(representative)
          .filter((c): c is number => c !== undefined)
          .sort((a, b) => rank(a) - rank(b))[0];
        if (best !== undefined) need.push(space.cands[best].part);
      }
      for (const y of need) {
        const c = representative(y);
        if (c === undefined || set.has(c)) continue;
        set.add(c);
        partsIn.add(y);
        stack.push(c);
      }
    }
    const bundle = [...set].sort((a, b) => a - b);
    const key = bundle.join(',');
    if (bundle.length > 0 && !seen.has(key)) {
      seen.add(key);
      bundles.push(bundle);
    }
  }
  return bundles;
}

function insertGoal(M: Model, space: Space, ev: AssignmentEvaluator, gi: number, budget: number): void {
  const g = M.goals[gi];
  const metIdx = ev.goalMetIdx(gi);
  if (metIdx !== null && metIdx <= g.deadlineIdx) return;
  let best: Trial | null = null;
  const consider = (t: Trial): void => {
    if (t.obj && (best === null || better(t.obj, best.obj!))) best = t;
  };
  const bundles = bundlesFor(M, space, gi, ev.seasonOf);
  const budgetFailures: { changes: [number, number][]; k: number; bundle: number[] }[] = [];
  for (const bundle of bundles) {
    // Latest season first: on a tie the part is bought as late as it can be.
    for (let k = M.S - 1; k >= 0; k -= 1) {
      if (ev.evaluations > budget) break;
      const changes = bundle.filter((c) => ev.seasonOf[c] < 0 || ev.seasonOf[c] > k).map((c): [number, number] => [c, k]);
      if (changes.length === 0) continue;
      const t = ev.trial(changes);
      consider(t);
      if (!t.obj && t.failure?.kind === 'budget') budgetFailures.push({ changes, k: t.failure.k, bundle });
    }
  }
  if (best === null) {
    // Nothing fitted: try making room by moving one already-planned purchase out of the full season.
    for (const f of budgetFailures.slice(0, 6)) {
      for (let d = 0; d < space.cands.length; d += 1) {
        if (ev.seasonOf[d] !== f.k || f.bundle.includes(d)) continue;
        for (let v = -1; v < M.S; v += 1) {
          if (v === f.k || ev.evaluations > budget) continue;
          consider(ev.trial([...f.changes, [d, v]]));
        }
      }
    }
  }
  if (best !== null && better((best as Trial).obj!, ev.obj)) ev.commit(best);
}

function localSearch(M: Model, space: Space, ev: AssignmentEvaluator, budget: number): void {
  const n = space.cands.length;
  const tryCommit = (changes: [number, number][]): boolean => {
    if (ev.evaluations > budget) return false;
    const t = ev.trial(changes);
    if (t.obj && better(t.obj, ev.obj)) {
      ev.commit(t);
      return true;
    }
    return false;
  };
  let improved = true;
  while (improved && ev.evaluations <= budget) {
    improved = false;
    for (let c = 0; c < n; c += 1) {
      for (let v = -1; v < M.S; v += 1) if (v !== ev.seasonOf[c] && tryCommit([[c, v]])) improved = true;
    }
    for (let p = 0; p < M.P; p += 1) {
      for (let a = 0; a < M.S; a += 1) {
        const group = space.byPlanter[p].filter((c) => ev.seasonOf[c] === a);
        if (group.length < 2) continue;
        for (let b = 0; b < M.S; b += 1) if (b !== a && tryCommit(group.map((c): [number, number] => [c, b]))) improved = true;
      }
    }
    for (let c = 0; c < n; c += 1) {
      if (ev.seasonOf[c] < 0) continue;
      for (const d of space.related[c]) {
        for (let v = -1; v < M.S; v += 1) {
          if (ev.seasonOf[c] < 0) break;
          if (v !== ev.seasonOf[d] && tryCommit([[c, -1], [d, v]])) improved = true;
        }
      }
    }
  }
}

function emptyAssignment(M: Model, space: Space): { seasonOf: Int16Array; obj: Obj } {
  const ev = new AssignmentEvaluator(M, space, new Int16Array(space.cands.length).fill(-1));
  return { seasonOf: ev.seasonOf, obj: ev.obj };
}

function heuristicAssignment(M: Model, space: Space, goalIndexes?: number[]): { seasonOf: Int16Array; obj: Obj } {
  const live = (goalIndexes ?? M.goals.map((_, i) => i)).filter((i) => !M.goals[i].beyond && M.goals[i].priority > 0);
  const byDeadline = [...live].sort((a, b) => M.goals[a].deadlineIdx - M.goals[b].deadlineIdx || M.goals[b].priority - M.goals[a].priority || a - b);
  const byPriority = [...live].sort((a, b) => M.goals[b].priority - M.goals[a].priority || M.goals[a].deadlineIdx - M.goals[b].deadlineIdx || a - b);
  const orders = byDeadline.join() === byPriority.join() ? [byDeadline] : [byDeadline, byPriority];
  let best: { seasonOf: Int16Array; obj: Obj } | null = null;
  const perRun = HEURISTIC_EVALUATION_BUDGET / orders.length;
  for (const order of orders) {
    const ev = new AssignmentEvaluator(M, space, new Int16Array(space.cands.length).fill(-1));
    const budget = ev.evaluations + perRun;
    for (const gi of order) insertGoal(M, space, ev, gi, budget);
    if (!goalIndexes) localSearch(M, space, ev, budget);
    if (best === null || better(ev.obj, best.obj)) best = { seasonOf: ev.seasonOf, obj: ev.obj };
  }
  return best!;
}

// ---------------------------------------------------------------------------------------------
// Exact search: depth-first over seasons, every affordable subset of the candidates still open,
// pruned by an optimistic bound and by dominance (same state reached with no better prefix).

interface ExactResult {
  seasonOf: Int16Array;
  obj: Obj;
  complete: boolean;
  nodes: number;
}

function exactSearch(M: Model, space: Space, incumbent: { seasonOf: Int16Array; obj: Obj }, nodeLimit: number | null): ExactResult {
  const { cands } = space;
  const n = cands.length;
  const S = M.S;
  const goals = M.goals.filter((g) => !g.beyond && g.priority > 0);
  let best = incumbent.obj;
  let bestSeasonOf = incumbent.seasonOf.slice();
  const seasonOf = new Int16Array(n).fill(-1);
  const bought = new Uint8Array(n);
  let nodes = 0;
  let aborted = false;
  const memo = new Map<string, { waste: number; cost: number }>();
  // maxBudget[a][b]: the largest single-season budget in seasons a..b.
  const maxBudget = M.years.map((_, a) => M.years.map((__, b) => (b < a ? 0 : Math.max(...M.budgets.slice(a, b + 1)))));
  const replacementFrom = M.planters.map((_, p) => {
    const next = new Array<number>(S + 1).fill(-1);
    for (let k = S - 1; k >= 0; k -= 1) next[k] = M.replaceAt[p][k] ? k : next[k + 1];
    return next;
  });

  const cheapestOpenProvider = (p: number, cap: number, maxUsd: number): number => {
    let min = Infinity;
    for (const c of space.capProviders[p][cap]) {
      if (!bought[c] && cands[c].minCostUsd <= maxUsd + MONEY_EPS_USD && cands[c].minCostUsd < min) min = cands[c].minCostUsd;
    }
    return min;
  };

  const bound = (k: number, states: PlanterState[], alive: Uint8Array, wasteUsd: number, costUsd: number): Obj => {
    let met = 0;
    let late = 0;
    const neededMax = new Array<number>(M.P).fill(0);
    const reachable = (g: CompiledGoal, lastIdx: number): number => {
      // Extra cost lower bound to have the goal's capabilities, or −1 when impossible.
      let extra = 0;
      for (const cap of g.caps) {
        if (states[g.planter].caps[cap]) continue;
        // A provider already fitted but not working may start working once its prerequisites arrive.
        if (M.providersOfCap[cap].some((x) => states[g.planter].slots[x])) continue;
        if (lastIdx < k) return -1;
        const min = cheapestOpenProvider(g.planter, cap, maxBudget[k][lastIdx]);
        if (min === Infinity) return -1;
        extra = Math.max(extra, min);
      }
      return extra;
    };
    for (const g of goals) {
      let extra = -1;
      if (alive[g.index]) {
        extra = reachable(g, Math.max(g.deadlineIdx, k - 1));
        if (extra >= 0) met += g.priority;
      }
      if (extra < 0) {
        extra = reachable(g, S - 1);
        if (extra >= 0) late += g.priority;
      }
      if (extra > 0) neededMax[g.planter] = Math.max(neededMax[g.planter], extra);
    }
    let waste = wasteUsd;
    for (let p = 0; p < M.P; p += 1) {
      const r = replacementFrom[p][k];
      if (r < 0) continue;
      states[p].slots.forEach((slot, x) => {
        if (slot && !M.parts[x].movesToNewToolbar) waste += valueAt(M, x, slot, M.years[r]);
      });
    }
    return { met, late, waste, cost: costUsd + neededMax.reduce((a, b) => a + b, 0) };
  };

  const stateKey = (k: number, states: PlanterState[], alive: Uint8Array): string => {
    let key = `${k}|${alive.join('')}|${bought.join('')}`;
    for (let p = 0; p < M.P; p += 1) {
      key += '|';
      const replacementAhead = replacementFrom[p][k] >= 0;
      states[p].slots.forEach((slot, x) => {
        if (!slot) return;
        const removable =
          (replacementAhead && !M.parts[x].movesToNewToolbar) || space.supersederCands[p][x].some((c) => !bought[c]);
        key += removable ? `${x}@${slot.year}@${slot.priceUsd};` : `${x};`;
      });
    }
    return key;
  };

  const dfs = (k: number, states: PlanterState[], alive: Uint8Array, wasteUsd: number, costUsd: number): void => {
    if (aborted) return;
    nodes += 1;
    if (nodeLimit !== null && nodes > nodeLimit) {
      aborted = true;
      return;
    }
    if (k === S) {
      const obj: Obj = { met: 0, late: 0, waste: wasteUsd, cost: costUsd };
      for (const g of goals) {
        if (alive[g.index]) obj.met += g.priority;
        else if (goalPresent(states[g.planter].caps, g)) obj.late += g.priority;
      }
      if (better(obj, best)) {
        best = obj;
        bestSeasonOf = seasonOf.slice();
      }
      return;
    }
    if (!better(bound(k, states, alive, wasteUsd, costUsd), best)) return;
    const key = stateKey(k, states, alive);
    const seen = memo.get(key);
    if (seen && (seen.waste < wasteUsd - MONEY_EPS_USD || (seen.waste <= wasteUsd + MONEY_EPS_USD && seen.cost <= costUsd + MONEY_EPS_USD))) {
      return;
    }
    if (seen || memo.size < DOMINANCE_MEMO_LIMIT) memo.set(key, { waste: wasteUsd, cost: costUsd });

    const current = states.slice();
    let waste = wasteUsd;
    for (let p = 0; p < M.P; p += 1) {
      const s = strand(M, p, k, current[p], null);
      current[p] = s.state;
      waste += s.wasteUsd;
    }
    const open: number[] = [];
    const openCost: number[] = [];
    for (let c = 0; c < n; c += 1) {
      const cand = cands[c];
      if (bought[c] || (cand.prevCopy >= 0 && !bought[cand.prevCopy])) continue;
      if (current[cand.planter].slots[cand.part]) continue;
      const cost = costAt(M, cand.planter, cand.part, current[cand.planter].slots);
      const usd = cost.partsUsd + cost.labourUsd;
      if (usd > M.budgets[k] + MONEY_EPS_USD) continue;
      open.push(c);
      openCost.push(usd);
    }
    const chosen: number[] = [];
    const leaf = (spentUsd: number): void => {
      const next = current.slice();
      let w = waste;
      const byPlanter = new Map<number, number[]>();
      for (const c of chosen) {
        const list = byPlanter.get(cands[c].planter) ?? [];
        list.push(cands[c].part);
        byPlanter.set(cands[c].planter, list);
      }
      for (const [p, parts] of byPlanter) {
        const r = purchase(M, p, k, current[p], parts, null);
        if (!r.ok) return;
        next[p] = r.state;
        w += r.wasteUsd;
      }
      let nextAlive = alive;
      for (const g of goals) {
        if (g.deadlineIdx <= k && nextAlive[g.index] && !goalPresent(next[g.planter].caps, g)) {
          if (nextAlive === alive) nextAlive = alive.slice();
          nextAlive[g.index] = 0;
        }
      }
      for (const c of chosen) {
        bought[c] = 1;
        seasonOf[c] = k;
      }
      dfs(k + 1, next, nextAlive, w, costUsd + spentUsd);
      for (const c of chosen) {
        bought[c] = 0;
        seasonOf[c] = -1;
      }
    };
    const enumerate = (i: number, spentUsd: number): void => {
      if (aborted) return;
      if (i === open.length) {
        leaf(spentUsd);
        return;
      }
      if (spentUsd + openCost[i] <= M.budgets[k] + MONEY_EPS_USD) {
        chosen.push(open[i]);
        enumerate(i + 1, spentUsd + openCost[i]);
        chosen.pop();
      }
      enumerate(i + 1, spentUsd);
    };
    enumerate(0, 0);
  };

  const alive = new Uint8Array(M.goals.length).fill(1);
  dfs(0, M.initial, alive, 0, 0);
  return { seasonOf: bestSeasonOf, obj: best, complete: !aborted, nodes };
}

// ---------------------------------------------------------------------------------------------
// Words

function usd(value: number): string {
  return `$${Math.round(value).toLocaleString('en-US')}`;
}

function roundCents(value: number): number {
  return Math.round(value * 100) / 100;
}

function listWords(words: string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`;
}

function goalName(g: CompiledGoal): string {
  return `"${g.goal.label || g.goal.id}"`;
}

function failureWords(M: Model, f: Failure, baseCostByK: number[], itemCostUsd: number, movedPart: number): string {
  const year = M.years[f.k];
  const name = (x: number | undefined): string => (x === undefined || x < 0 ? 'another part' : M.parts[x].name);
  // When the failing part is not the one moved, say which part the move breaks.
  const subject = f.part === movedPart || f.part < 0 ? 'it' : `${name(f.part)} (${year})`;
  switch (f.kind) {
    case 'budget':
      return `the ${year} budget of ${usd(M.budgets[f.k])} would be exceeded (${usd(baseCostByK[f.k])} already planned there, this costs ${usd(itemCostUsd)})`;
    case 'requirement': {
      const needs = [
        ...M.reqParts[f.part].map((y) => M.parts[y].name),
        ...M.reqCaps[f.part].map((c) => `"${M.capNames[c]}"`),
      ];
      return `${subject} would not work: it needs ${listWords(needs)} on the planter, which would not be there in ${year}`;
    }
    case 'already-installed':
      return `${name(f.part)} is still on the planter in ${year}`;
    case 'superseded-by-installed':
      return `${name(f.other)} would be on the planter in ${year} and supersedes ${subject === 'it' ? 'it' : name(f.part)}`;
    case 'conflict':
      return `${subject} cannot share the planter with ${name(f.other)}, which would still be there in ${year}`;
    case 'same-season-supersede':
      return `${name(f.other)} would remove ${name(f.part)} in the same season`;
    case 'bought-twice':
      return `${name(f.part)} would be bought twice in ${year}`;
  }
}

interface Narrator {
  M: Model;
  buys: Buy[];
  base: PlanSim;
}

function goalChanges(M: Model, base: PlanSim, moved: PlanSim, kind: 'met' | 'late'): string[] {
  const out: string[] = [];
  M.goals.forEach((g, gi) => {
    if (g.beyond) return;
    const j = M.goalsByPlanter[g.planter].indexOf(gi);
    const a = base.sims[g.planter].goalMetIdx[j] ?? null;
    const b = moved.sims[g.planter].goalMetIdx[j] ?? null;
    const ok = (idx: number | null): boolean => (kind === 'met' ? idx !== null && idx <= g.deadlineIdx : idx !== null);
    if (ok(a) && !ok(b)) out.push(`${goalName(g)} (due ${g.goal.bySeason})`);
  });
  return out;
}

function strandHint(M: Model, b: Buy, toK: number): string {
  const r = M.replaceAt[b.p].findIndex((rep, k) => rep !== null && k > toK && k <= b.k);
  if (r >= 0 && !M.parts[b.x].movesToNewToolbar) {
    return `it would be stranded by the ${M.replaceAt[b.p][r]!.kind} replacement at the start of ${M.years[r]}`;
  }
  return toK < b.k && M.supersedes[b.x].length > 0 ? 'what it supersedes would be thrown away younger' : '';
}

/** Why moving purchase `index` to season index `toK` is worse (or not), in words. */
function moveWords(nar: Narrator, index: number, toK: number): string {
  const { M, buys, base } = nar;
  const b = buys[index];
  let sim = simulatePlan(M, buys.map((x, i) => (i === index ? { ...x, k: toK } : x)), false);
  const year = M.years[toK];
  let together = '';
  if (!sim.obj && sim.failure!.kind === 'requirement' && sim.failure!.part === b.x && toK < b.k) {
    // Its prerequisites arrive in the same season: judge the move of the whole group instead.
    const group = buys
      .map((y, i) => ({ y, i }))
      .filter(({ y }) => y.p === b.p && y.k === b.k && y !== b && (M.reqParts[b.x].includes(y.x) || M.reqCaps[b.x].some((c) => M.provides[y.x].includes(c))));
    const members = new Set([index, ...group.map((g) => g.i)]);
    const groupSim = simulatePlan(M, buys.map((x, i) => (members.has(i) ? { ...x, k: toK } : x)), false);
    const names = listWords(group.map((g) => M.parts[g.y.x].name));
    if (group.length > 0 && groupSim.obj) {
      sim = groupSim;
      together = `, even with ${names} moved too`;
    } else if (group.length > 0 && groupSim.failure!.kind === 'budget' && groupSim.failure!.k === toK) {
      const plannedUsd = base.sims.reduce((sum, s) => sum + s.costByK[toK], 0);
      const groupUsd = (groupSim.failure!.plannedUsd ?? 0) - plannedUsd;
      return `the ${year} budget of ${usd(M.budgets[toK])} would be exceeded (${usd(plannedUsd)} already planned there; this with ${names}, which it needs, costs ${usd(groupUsd)})`;
    }
  }
  if (!sim.obj) {
    const f = sim.failure!;
    if (f.kind === 'budget' && f.k !== toK) {
      return `the ${M.years[f.k]} budget of ${usd(M.budgets[f.k])} would be exceeded (parts bought then would lose a saving)`;
    }
    const baseCostByK = M.years.map((_, k) => base.sims.reduce((sum, s) => sum + s.costByK[k], 0));
    const d = base.detail?.items.find((it) => it.k === b.k && it.p === b.p && it.x === b.x);
    return failureWords(M, f, baseCostByK, d ? d.partsUsd + d.labourUsd : 0, b.x);
  }
  const a = base.obj!;
  const o = sim.obj;
  const cause = strandHint(M, b, toK);
  const because = cause ? `: ${cause}` : '';
  if (o.met < a.met - WEIGHT_EPS) return `it would miss ${listWords(goalChanges(M, base, sim, 'met'))}${because}${together}`;
  if (o.late < a.late - WEIGHT_EPS) return `it would leave ${listWords(goalChanges(M, base, sim, 'late'))} unmet${because}${together}`;
  if (o.waste > a.waste + MONEY_EPS_USD) return `it would waste ${usd(o.waste - a.waste)} more${because}${together}`;
  if (o.cost > a.cost + MONEY_EPS_USD) {
    const preparers = M.preparedBy[b.x].filter((s) => buys.some((y) => y.p === b.p && y.x === s.from && y.k < b.k && y.k >= toK));
    const hint = preparers.length > 0 ? `: ${listWords(preparers.map((s) => M.parts[s.from].name))} would not be fitted yet` : '';
    return `it would cost ${usd(o.cost - a.cost)} more${hint}${together}`;
  }
  if (better(o, a)) return `${year} would also work${together}`;
  return `${year} would do just as well${together}`;
}

function purposeWords(nar: Narrator, index: number): { words: string; directGoals: number[] } {
  const { M, buys } = nar;
  const b = buys[index];
  const year = M.years[b.k];
  const phrases: string[] = [];
  const directGoals: number[] = [];
  for (const gi of M.goalsByPlanter[b.p]) {
    const g = M.goals[gi];
    const caps = g.caps.filter((c) => M.provides[b.x].includes(c));
    if (caps.length === 0 || g.beyond) continue;
    directGoals.push(gi);
    const when = g.goal.bySeason < year ? `was due in ${g.goal.bySeason} and can be met from ${year} at the earliest` : `needs ${listWords(caps.map((c) => `"${M.capNames[c]}"`))} by ${g.goal.bySeason}`;
    phrases.push(`goal ${goalName(g)} ${when}`);
  }
  for (const y of buys) {
    if (y.p !== b.p || y.k < b.k || y === b) continue;
    const needs = M.reqParts[y.x].includes(b.x) || M.reqCaps[y.x].some((c) => M.provides[b.x].includes(c));
    if (needs) phrases.push(`${M.parts[y.x].name} (${M.years[y.k]}) needs it`);
  }
  for (const y of buys) {
    if (y.p !== b.p || y.k <= b.k) continue;
    const s = M.preparedBy[y.x].find((sv) => sv.from === b.x);
    if (!s) continue;
    const q = M.qty[b.p][y.x];
    const savedUsd = q * (Math.min(s.usd, M.parts[y.x].priceUsd) + Math.min(s.hours, M.parts[y.x].labourHours) * M.input.shopRateUsdPerHour);
    phrases.push(`it prepares the planter for ${M.parts[y.x].name} in ${M.years[y.k]}, saving about ${usd(savedUsd)}`);
  }
  let lastReplacement = -1;
  for (let k = 0; k <= b.k; k += 1) if (M.replaceAt[b.p][k]) lastReplacement = k;
  if (lastReplacement >= 0 && !M.parts[b.x].movesToNewToolbar) {
    const kind = M.replaceAt[b.p][lastReplacement]!.kind;
    phrases.push(`it goes on after the ${kind} replacement at the start of ${M.years[lastReplacement]}, so it is not stranded`);
  }
  if (phrases.length === 0) phrases.push('it lowers the roadmap\'s cost');
  return { words: phrases.join('; '), directGoals };
}

function explainItem(nar: Narrator, index: number): string {
  const { M, buys } = nar;
  const b = buys[index];
  const year = M.years[b.k];
  let text = `In ${year} because ${purposeWords(nar, index).words}.`;
  if (b.k > 0) text += ` Not in ${year - 1}: ${moveWords(nar, index, b.k - 1)}.`;
  else text += ` ${year} is the first season of the roadmap.`;
  if (b.k < M.S - 1) {
    const later = moveWords(nar, index, b.k + 1);
    if (!later.endsWith('would do just as well') && !later.endsWith('would also work')) text += ` Not in ${year + 1}: ${later}.`;
  }
  return text;
}

function goalIdsOfItems(M: Model, buys: Buy[], direct: number[][]): string[][] {
  const served: Set<number>[] = direct.map((d) => new Set(d));
  let changed = true;
  while (changed) {
    changed = false;
    buys.forEach((b, i) => {
      buys.forEach((y, j) => {
        if (i === j || y.p !== b.p || y.k < b.k) return;
        const supports =
          M.reqParts[y.x].includes(b.x) ||
          M.reqCaps[y.x].some((c) => M.provides[b.x].includes(c)) ||
          (y.k > b.k && M.preparedBy[y.x].some((s) => s.from === b.x));
        if (!supports) return;
        for (const g of served[j]) {
          if (!served[i].has(g)) {
            served[i].add(g);
            changed = true;
          }
        }
      });
    });
  }
  return served.map((set) => [...set].sort((a, b) => a - b).map((gi) => M.goals[gi].goal.id));
}

function wasteWords(M: Model, w: DetailWaste): string {
  const year = M.years[w.k];
  const part = M.parts[w.x];
  const age = year - w.slot.year;
  const how = M.input.valuation === 'straight-line' ? 'straight-line' : 'remaining-value curve';
  const bought = w.slot.fleet ? `On the planter since ${w.slot.year}` : `Bought in ${w.slot.year}`;
  const cause =
    w.cause === 'superseded'
      ? `Removed in ${year} when ${M.parts[w.by!].name} supersedes it`
      : `Stranded by the ${M.replaceAt[w.p][w.k]!.kind} replacement at the start of ${year}: it cannot move to the new toolbar`;
  return `${cause}. ${bought} for ${usd(w.slot.priceUsd)}, ${age} of ${part.expectedLifeYears} years used: ${usd(w.valueUsd)} of value left (${how}).`;
}

function unmetReason(M: Model, space: Space, nar: Narrator, gi: number, metIdx: number | null): string {
  const g = M.goals[gi];
  const p = g.planter;
  const deadline = M.years[g.deadlineIdx];
  // A late goal is explained against its own season; a goal never met, against the whole roadmap.
  const targetIdx = metIdx !== null ? g.deadlineIdx : M.S - 1;
  const target = M.years[targetIdx];
  const prefix =
    metIdx !== null
      ? `Met from ${M.years[metIdx]}, ${M.years[metIdx] - deadline} season(s) after ${deadline}, because `
      : `Not met within the roadmap (due ${g.goal.bySeason}, roadmap to ${M.years[M.S - 1]}) because `;
  const noProvider = g.caps.filter((c) => M.providersOfCap[c].length === 0).map((c) => `"${M.capNames[c]}"`);
  if (noProvider.length > 0) return `${prefix}no part in the catalog provides ${listWords(noProvider)}.`;
  const noCandidate = g.caps
    .filter((c) => !M.initial[p].caps[c] && space.capProviders[p][c].length === 0)
    .map((c) => `"${M.capNames[c]}"`);
  if (noCandidate.length > 0) return `${prefix}no part the planner may buy for this planter provides ${listWords(noCandidate)}.`;
  const early = g.goal.bySeason < M.years[0] ? ` (it was due in ${g.goal.bySeason}, before the roadmap starts)` : '';
  if (g.priority <= 0) return `${prefix}its priority is 0, so the roadmap spends nothing on it.`;

  // Could the goal be met on its own, with every season's budget to itself?
  const alone = heuristicAssignment(M, space, [gi]);
  const aloneSims = simulatePlan(M, assignmentToBuys(space, alone.seasonOf), false);
  const aloneIdx = aloneSims.sims[p].goalMetIdx[M.goalsByPlanter[p].indexOf(gi)] ?? null;
  if (aloneIdx === null || aloneIdx > targetIdx) {
    const bundles = bundlesFor(M, space, gi, new Int16Array(space.cands.length).fill(-1));
    const costs = bundles.map((bundle) => bundle.reduce((sum, c) => sum + space.cands[c].minCostUsd, 0));
    if (costs.length === 0) {
      return `${prefix}the parts that provide its capabilities cannot be fitted to this planter (a prerequisite is missing or they conflict with what is on it)${early}.`;
    }
    const cheapest = Math.min(...costs);
    const bundle = bundles[costs.indexOf(cheapest)];
    const names = listWords(bundle.map((c) => M.parts[space.cands[c].part].name));
    const totalUsd = M.budgets.slice(0, targetIdx + 1).reduce((a, b) => a + b, 0);
    const largestUsd = Math.max(...M.budgets.slice(0, targetIdx + 1));
    const dearest = bundle.reduce((a, c) => (space.cands[c].minCostUsd > space.cands[a].minCostUsd ? c : a), bundle[0]);
    if (cheapest > totalUsd + MONEY_EPS_USD) {
      return `${prefix}the cheapest way (${names}) costs ${usd(cheapest)}, more than all budgets through ${target} together (${usd(totalUsd)})${early}.`;
    }
    if (space.cands[dearest].minCostUsd > largestUsd + MONEY_EPS_USD) {
      return `${prefix}${M.parts[space.cands[dearest].part].name} alone costs ${usd(space.cands[dearest].minCostUsd)}, more than any season's budget through ${target} (at most ${usd(largestUsd)})${early}.`;
    }
    return `${prefix}no order of purchases fits its parts (${names}, about ${usd(cheapest)}) into the budgets through ${target} together with their prerequisites and conflicts${early}.`;
  }
  // It fits alone: the roadmap spends those budgets on goals that weigh more.
  const rivals = new Set<number>();
  for (const b of nar.buys) {
    if (b.k > targetIdx) continue;
    for (const other of M.goals) {
      if (other.index === gi || other.beyond || other.planter !== b.p) continue;
      if (other.caps.some((c) => M.provides[b.x].includes(c))) rivals.add(other.index);
    }
  }
  const rivalNames = [...rivals].map((r) => `${goalName(M.goals[r])} (priority ${M.goals[r].priority})`);
  return rivalNames.length > 0
    ? `${prefix}the budgets through ${target} go to goals that weigh more together: ${listWords(rivalNames)}${early}.`
    : `${prefix}meeting it by ${target} would take budget or parts from goals that weigh more${early}.`;
}

// ---------------------------------------------------------------------------------------------
// Building the result

type PlanMode = { kind: 'planner'; search: SearchReport; space: Space } | { kind: 'naive'; notes: string[]; space: Space } | { kind: 'evaluated'; space: Space };

function buildPlan(M: Model, buysIn: Buy[], mode: PlanMode): RoadmapPlan {
  const buys = [...buysIn].sort((a, b) => a.k - b.k || a.p - b.p || a.x - b.x);
  const order = buysIn.map((b) => buys.indexOf(b));
  const base = simulatePlan(M, buys, true);
  if (!base.obj) throw new Error('internal: a planned roadmap does not simulate');
  const nar: Narrator = { M, buys, base };
  const detail = base.detail!;

  const direct = buys.map((_, i) => purposeWords(nar, i).directGoals);
  const goalIds = goalIdsOfItems(M, buys, direct);
  const items: RoadmapItem[] = buys.map((b, i) => {
    const d = detail.items.find((it) => it.k === b.k && it.p === b.p && it.x === b.x)!;
    const part = M.parts[b.x];
    let explanation: string;
    if (mode.kind === 'naive') explanation = mode.notes[order.indexOf(i)] ?? '';
    else explanation = explainItem(nar, i);
    return {
      partId: part.id,
      partName: part.name,
      planterId: M.planters[b.p].id,
      unit: part.unit,
      quantity: M.qty[b.p][b.x],
      partsUsd: roundCents(d.partsUsd),
      labourUsd: roundCents(d.labourUsd),
      costUsd: roundCents(d.partsUsd + d.labourUsd),
      goalIds: goalIds[i],
      removesPartIds: d.removes.map((y) => M.parts[y].id),
      explanation,
    };
  });
  const seasons: RoadmapSeason[] = M.years.map((season, k) => {
    const seasonItems = items.filter((_, i) => buys[i].k === k);
    return {
      season,
      budgetUsd: M.budgets[k],
      costUsd: roundCents(seasonItems.reduce((sum, it) => sum + it.partsUsd + it.labourUsd, 0)),
      items: seasonItems,
    };
  });
  const wasteItems: WasteItem[] = detail.waste
    .filter((w) => w.valueUsd > MONEY_EPS_USD)
    .map((w) => ({
      partId: M.parts[w.x].id,
      partName: M.parts[w.x].name,
      planterId: M.planters[w.p].id,
      season: M.years[w.k],
      cause: w.cause,
      ...(w.by !== undefined ? { byPartId: M.parts[w.by].id } : {}),
      installedSeason: w.slot.year,
      pricePaidUsd: roundCents(w.slot.priceUsd),
      remainingValueUsd: roundCents(w.valueUsd),
      explanation: wasteWords(M, w),
    }));
  const goalOutcomes: GoalOutcome[] = M.goals.map((g, gi) => {
    const idx = base.sims[g.planter].goalMetIdx[M.goalsByPlanter[g.planter].indexOf(gi)] ?? null;
    const status = g.beyond ? 'beyond-horizon' : idx === null ? 'unmet' : idx <= g.deadlineIdx ? 'met' : 'late';
    return { goalId: g.goal.id, planterId: g.goal.planterId, bySeason: g.goal.bySeason, metSeason: idx === null ? null : M.years[idx], status };
  });
  const unmetGoals: UnmetGoal[] = [];
  goalOutcomes.forEach((o, gi) => {
    if (o.status !== 'late' && o.status !== 'unmet') return;
    const idx = o.metSeason === null ? null : o.metSeason - M.years[0];
    unmetGoals.push({ goalId: o.goalId, status: o.status, metSeason: o.metSeason, reason: unmetReason(M, mode.space, nar, gi, idx) });
  });
  const capabilityTimeline = M.years.flatMap((season, k) =>
    M.planters.map((planter, p) => ({
      season,
      planterId: planter.id,
      capabilities: M.capNames.filter((_, c) => detail.caps[k][p][c]).sort(),
    })),
  );
  const objective: RoadmapObjective = {
    goalPriorityMetByDeadline: base.obj.met,
    goalPriorityMetLate: base.obj.late,
    wasteUsd: roundCents(base.obj.waste),
    totalCostUsd: roundCents(base.obj.cost),
  };
  const search: SearchReport =
    mode.kind === 'planner'
      ? mode.search
      : { method: mode.kind === 'naive' ? 'naive' : 'evaluated', nodesExplored: 0, candidateCount: mode.space.cands.length };
  return {
    seasons,
    wasteUsd: objective.wasteUsd,
    wasteItems,
    unmetGoals,
    goalOutcomes,
    capabilityTimeline,
    totalCostUsd: objective.totalCostUsd,
    objective,
    search,
    ruleProblems: validateRuleSet(M.parts, M.input.rules),
  };
}

// ---------------------------------------------------------------------------------------------
// Public API

/** The (part, planter) pairs the planner considers when the input gives none: parts that serve a goal, their prerequisites, preparations and the parts that clear conflicts. */
export function deriveCandidates(input: PlannerInput): PlannerCandidate[] {
  const M = compile(input);
  return buildSpace(M, null).cands.map((c) => ({ partId: M.parts[c.part].id, planterId: M.planters[c.planter].id }));
}

/** Plans the roadmap: exact branch-and-bound where the instance is small, heuristic plus bounded search otherwise. */
export function planRoadmap(input: PlannerInput): RoadmapPlan {
  const M = compile(input);
  const space = buildSpace(M, input.candidates ?? null);
  const n = space.cands.length;
  const assignments = Math.pow(M.S + 1, n);
  // Tiny instances are searched from the empty plan: the search alone is quick there, and its
  // result then owes nothing to the heuristic.
  const heuristic =
    assignments <= SEARCH_FROM_EMPTY_LIMIT ? emptyAssignment(M, space) : heuristicAssignment(M, space);
  const nodeLimit = assignments <= EXACT_ASSIGNMENT_LIMIT ? null : (input.maxSearchNodes ?? DEFAULT_MAX_SEARCH_NODES);
  // With many candidates a bounded search cannot get past the first season's subsets: skip it
  // unless asked for by an explicit node limit.
  const searchWorthwhile = nodeLimit === null || n <= BOUNDED_SEARCH_MAX_CANDIDATES || input.maxSearchNodes !== undefined;
  const exact = searchWorthwhile
    ? exactSearch(M, space, heuristic, nodeLimit)
    : { seasonOf: heuristic.seasonOf, obj: heuristic.obj, complete: false, nodes: 0 };
  const search: SearchReport = { method: exact.complete ? 'exact' : 'heuristic', nodesExplored: exact.nodes, candidateCount: n };
  return buildPlan(M, assignmentToBuys(space, exact.seasonOf), { kind: 'planner', search, space });
}

export type RoadmapEvaluation =
  | { feasible: true; plan: RoadmapPlan }
  | { feasible: false; season: number; partId: string | null; planterId: string | null; reason: string };

/** Evaluates a roadmap someone wrote by hand (or another strategy): the same costs, waste and goal outcomes as planRoadmap. */
export function evaluateRoadmap(input: PlannerInput, purchases: readonly RoadmapPurchase[]): RoadmapEvaluation {
  const M = compile(input);
  const buys: Buy[] = purchases.map((pu) => {
    const p = M.planterIndex.get(pu.planterId);
    const x = M.partIndex.get(pu.partId);
    const k = pu.season - M.years[0];
    if (p === undefined || x === undefined) throw new Error(`purchase names an unknown part or planter (${pu.partId} on ${pu.planterId})`);
    if (k < 0 || k >= M.S) throw new RangeError(`purchase of ${pu.partId} in ${pu.season} is outside the roadmap`);
    return { k, p, x };
  });
  const sim = simulatePlan(M, buys, false);
  if (!sim.obj) {
    const f = sim.failure!;
    const baseCostByK = M.years.map((_, k) => sim.sims.reduce((sum, s) => sum + s.costByK[k], 0));
    const reason = f.kind === 'budget'
      ? `the ${M.years[f.k]} budget of ${usd(M.budgets[f.k])} is exceeded (${usd(f.plannedUsd ?? 0)} planned)`
      : failureWords(M, f, baseCostByK, 0, -1);
    return {
      feasible: false,
      season: M.years[f.k],
      partId: f.part >= 0 ? M.parts[f.part].id : null,
      planterId: f.planter >= 0 ? M.planters[f.planter].id : null,
      reason,
    };
  }
  return { feasible: true, plan: buildPlan(M, buys, { kind: 'evaluated', space: buildSpace(M, input.candidates ?? null) }) };
}

/**
 * What a grower buying without looking ahead would do: each goal's cheapest provider for each
 * missing capability (with prerequisites), bought season by season as budget allows —
 * 'cheapest-first' in order of cost, 'as-asked' in the order the goals were given, stopping for
 * the season at the first purchase that does not fit.
 */
export function naivePlan(input: PlannerInput, order: NaiveOrder): RoadmapPlan {
  const M = compile(input);
  const baseCost = (p: number, x: number): number => {
    const c = costAt(M, p, x, new Array<Slot | null>(M.m).fill(null));
    return c.partsUsd + c.labourUsd;
  };
  const wanted: { p: number; x: number }[] = [];
  const has = (p: number, x: number): boolean => wanted.some((w) => w.p === p && w.x === x);
  const goalsInOrder = M.goals.filter((g) => !g.beyond);
  for (const g of goalsInOrder) {
    const p = g.planter;
    const providedNow = (cap: number): boolean =>
      M.initial[p].caps[cap] === 1 || wanted.some((w) => w.p === p && M.provides[w.x].includes(cap));
    const cheapest = (cap: number): number | undefined =>
      [...M.providersOfCap[cap]].sort((a, b) => baseCost(p, a) - baseCost(p, b) || a - b)[0];
    const visiting = new Set<number>();
    const visit = (x: number): void => {
      if (visiting.has(x) || has(p, x)) return;
      visiting.add(x);
      for (const y of M.reqParts[x]) if (!M.initial[p].slots[y]) visit(y);
      for (const cap of M.reqCaps[x]) {
        if (providedNow(cap)) continue;
        const y = cheapest(cap);
        if (y !== undefined) visit(y);
      }
      wanted.push({ p, x });
    };
    for (const cap of g.caps) {
      if (providedNow(cap)) continue;
      const x = cheapest(cap);
      if (x !== undefined) visit(x);
    }
  }
  const list =
    order === 'cheapest-first'
      ? wanted.map((w, i) => ({ w, i })).sort((a, b) => baseCost(a.w.p, a.w.x) - baseCost(b.w.p, b.w.x) || a.i - b.i).map((e) => e.w)
      : wanted;

  const buys: Buy[] = [];
  const notes: string[] = [];
  let states = M.initial.slice();
  for (let k = 0; k < M.S; k += 1) {
    states = states.map((st, p) => strand(M, p, k, st, null).state);
    const season: Buy[] = [];
    let leftUsd = M.budgets[k];
    let progress = true;
    while (progress) {
      progress = false;
      for (const w of list) {
        if (states[w.p].slots[w.x] || season.some((b) => b.p === w.p && b.x === w.x)) continue;
        const c = costAt(M, w.p, w.x, states[w.p].slots);
        const usdNeeded = c.partsUsd + c.labourUsd;
        if (usdNeeded > leftUsd + MONEY_EPS_USD) {
          if (order === 'as-asked') break;
          continue;
        }
        const parts = [...season.filter((b) => b.p === w.p).map((b) => b.x), w.x];
        if (!purchase(M, w.p, k, states[w.p], parts, null).ok) continue;
        season.push({ k, p: w.p, x: w.x });
        notes.push(
          `Bought in ${M.years[k]}: next in ${order === 'cheapest-first' ? 'cheapest-first' : 'as-asked'} order and it fitted the ${usd(leftUsd)} left of the ${M.years[k]} budget (no look-ahead).`,
        );
        leftUsd -= usdNeeded;
        progress = order === 'cheapest-first';
      }
    }
    for (let p = 0; p < M.P; p += 1) {
      const parts = season.filter((b) => b.p === p).map((b) => b.x);
      if (parts.length === 0) continue;
      const r = purchase(M, p, k, states[p], parts, null);
      if (r.ok) states[p] = r.state;
    }
    buys.push(...season);
  }
  return buildPlan(M, buys, { kind: 'naive', notes, space: buildSpace(M, input.candidates ?? null) });
}

/** The planner against both naive orders: money each wastes and spends, and the season each goal is met. */
export function compareWithNaive(input: PlannerInput): StrategyComparison[] {
  const rows: { strategy: StrategyComparison['strategy']; plan: RoadmapPlan }[] = [
    { strategy: 'planner', plan: planRoadmap(input) },
    { strategy: 'cheapest-first', plan: naivePlan(input, 'cheapest-first') },
    { strategy: 'as-asked', plan: naivePlan(input, 'as-asked') },
  ];
  return rows.map(({ strategy, plan }) => ({
    strategy,
    wasteUsd: plan.wasteUsd,
    totalCostUsd: plan.totalCostUsd,
    goalPriorityMetByDeadline: plan.objective.goalPriorityMetByDeadline,
    goalMetSeasons: Object.fromEntries(plan.goalOutcomes.map((o) => [o.goalId, o.metSeason])),
    plan,
  }));
}
