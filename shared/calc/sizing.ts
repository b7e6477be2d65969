/**
 * Planter sizing: field capacity, seed spacing and meter speed, liquid and dry rates, refill
 * stops and acres per day, and the hydraulic budget against the tractor.
 *
 * Pure functions: numbers in, numbers out, no I/O. Units are in every name. Results are not
 * rounded here; screens round for display.
 */
import type { SizingInput } from '../schemas/sizing';

// ---------------------------------------------------------------------------------------------
// Constants
// ---------------------------------------------------------------------------------------------

/** Square feet in an acre. */
export const SQ_FT_PER_ACRE = 43_560;
/** 43,560 ft²/ac ÷ 5,280 ft/mi: turns ft × mph into ac/h (Hancock, Swetnam & Benson, AEN-73). */
export const CAPACITY_DIVISOR = 8.25;
/** 43,560 ft²/ac × 144 in²/ft²: turns in × seeds/ac into in-row spacing (Purdue field guide). */
export const SEED_SPACING_CONSTANT = 6_272_640;
/** Unit constant of GPA = 5,940 × GPM / (mph × W in) (UF/IFAS EDIS WG013, eq. 1). */
export const LIQUID_RATE_CONSTANT = 5_940;
/** Unit constant of hp = GPM × psi / 1,714 (standard fluid-power relation). */
export const HYDRAULIC_HP_CONSTANT = 1_714;
/** mph → ft/s: 5,280 ft per mile over 3,600 s per hour. */
export const FT_PER_S_PER_MPH = 5_280 / 3_600;
/** A corn seed unit holds 80,000 kernels (common practice). Soybean units differ: pass your own. */
export const DEFAULT_SEEDS_PER_UNIT = 80_000;
/**
 * Rowpath's own threshold: above 85 % of the tractor's flow a budget is "tight", since oil
 * warms, the fold or a lift at the headland can starve the fan, and there is no room to grow.
 */
export const TIGHT_UTILISATION = 0.85;
/** Rowpath's own reserve added to an auxiliary pump's size, so it is not run at its limit. */
export const AUX_PUMP_RESERVE = 0.15;

// ---------------------------------------------------------------------------------------------
// Guards: the pure functions refuse inputs that would yield NaN or Infinity silently.
// ---------------------------------------------------------------------------------------------

function requirePositive(name: string, value: number): void {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`${name} must be a finite number above 0 (got ${value})`);
  }
}

function requireNonNegative(name: string, value: number): void {
  if (!Number.isFinite(value) || value < 0) {
    throw new RangeError(`${name} must be a finite number of 0 or more (got ${value})`);
  }
}

// ---------------------------------------------------------------------------------------------
// Width and field capacity
// ---------------------------------------------------------------------------------------------

/** Working width in feet = rows × row spacing (in) / 12 (common practice). */
export function workingWidthFt(rows: number, rowSpacingIn: number): number {
  requirePositive('rows', rows);
  requirePositive('rowSpacingIn', rowSpacingIn);
  return (rows * rowSpacingIn) / 12;
}

/** Theoretical field capacity, ac/h = width ft × speed mph / 8.25 (AEN-73, Univ. of Kentucky 1991). */
export function theoreticalCapacityAcPerHr(widthFt: number, speedMph: number): number {
  requirePositive('widthFt', widthFt);
  requirePositive('speedMph', speedMph);
  return (widthFt * speedMph) / CAPACITY_DIVISOR;
}

/** Effective field capacity, ac/h = theoretical × field efficiency (0–1]; turns, fills and overlap eat the rest. */
export function effectiveCapacityAcPerHr(theoreticalAcPerHr: number, fieldEfficiency: number): number {
  requirePositive('theoreticalAcPerHr', theoreticalAcPerHr);
  if (!(fieldEfficiency > 0 && fieldEfficiency <= 1)) {
    throw new RangeError(`fieldEfficiency must be above 0 and at most 1 (got ${fieldEfficiency})`);
  }
  return theoreticalAcPerHr * fieldEfficiency;
}

// ---------------------------------------------------------------------------------------------
// Seed placement and the meter
// ---------------------------------------------------------------------------------------------

/** In-row seed spacing, in = 6,272,640 / (row spacing in × seeds/ac) (Purdue Corn & Soybean Field Guide). */
export function seedSpacingIn(populationPerAcre: number, rowSpacingIn: number): number {
  requirePositive('populationPerAcre', populationPerAcre);
  requirePositive('rowSpacingIn', rowSpacingIn);
  return SEED_SPACING_CONSTANT / (rowSpacingIn * populationPerAcre);
}

/** Seeds per foot of row = seeds/ac / 43,560 × row spacing in / 12 (Iowa State, Agron 212). */
export function seedsPerFt(populationPerAcre: number, rowSpacingIn: number): number {
  requirePositive('populationPerAcre', populationPerAcre);
  requirePositive('rowSpacingIn', rowSpacingIn);
  return (populationPerAcre / SQ_FT_PER_ACRE) * (rowSpacingIn / 12);
}

/** Seeds each row unit must place per second = seeds/ft × ground speed in ft/s (mph × 5,280 / 3,600). */
export function seedsPerSecondPerRow(populationPerAcre: number, rowSpacingIn: number, speedMph: number): number {
  requirePositive('speedMph', speedMph);
  return seedsPerFt(populationPerAcre, rowSpacingIn) * speedMph * FT_PER_S_PER_MPH;
}

/** Seed disc speed, rpm = seeds/s × 60 / cells per disc (one seed per cell). */
export function meterDiscRpm(seedsPerSecond: number, cellsPerDisc: number): number {
  requirePositive('seedsPerSecond', seedsPerSecond);
  requirePositive('cellsPerDisc', cellsPerDisc);
  return (seedsPerSecond * 60) / cellsPerDisc;
}

export interface MeterLimitInput {
  populationPerAcre: number;
  rowSpacingIn: number;
  /** The meter's rated ceiling in seeds per second per row. */
  meterMaxSeedsPerSecond?: number;
  /** A rated top speed, valid at `ratedAtPopulationPerAcre` (and the same row spacing). */
  meterRatedMaxSpeedMph?: number;
  ratedAtPopulationPerAcre?: number;
}

/**
 * Highest ground speed (mph) at which a meter still holds its rated limit at this population.
 *
 * Assumption (Rowpath's): a meter's limit is a seed rate — it singulates well up to a certain
 * number of seeds per second per row, whatever mix of speed and population produces it. So
 * speed × population is constant along the limit: a meter rated to 5 mph at 32,000 seeds/ac is
 * taken to hold 4 mph at 40,000. A rated top speed is assumed to be stated for the same row
 * spacing. When both a seed-rate ceiling and a rated speed are given, the lower speed governs.
 */
export function maxSpeedMphForMeter(input: MeterLimitInput): number {
  const { populationPerAcre, rowSpacingIn, meterMaxSeedsPerSecond, meterRatedMaxSpeedMph, ratedAtPopulationPerAcre } =
    input;
  const candidatesMph: number[] = [];
  if (meterMaxSeedsPerSecond !== undefined) {
    requirePositive('meterMaxSeedsPerSecond', meterMaxSeedsPerSecond);
    candidatesMph.push(meterMaxSeedsPerSecond / (seedsPerFt(populationPerAcre, rowSpacingIn) * FT_PER_S_PER_MPH));
  }
  if (meterRatedMaxSpeedMph !== undefined || ratedAtPopulationPerAcre !== undefined) {
    if (meterRatedMaxSpeedMph === undefined || ratedAtPopulationPerAcre === undefined) {
      throw new RangeError('A rated top speed needs the population it was rated at, and the reverse');
    }
    requirePositive('meterRatedMaxSpeedMph', meterRatedMaxSpeedMph);
    requirePositive('ratedAtPopulationPerAcre', ratedAtPopulationPerAcre);
    requirePositive('populationPerAcre', populationPerAcre);
    candidatesMph.push((meterRatedMaxSpeedMph * ratedAtPopulationPerAcre) / populationPerAcre);
  }
  if (candidatesMph.length === 0) {
    throw new RangeError('Give the meter a seed-rate ceiling or a rated top speed with its population');
  }
  return Math.min(...candidatesMph);
}

// ---------------------------------------------------------------------------------------------
// Liquid and dry product
// ---------------------------------------------------------------------------------------------

/**
 * Flow per row, GPM = GPA × mph × W / 5,940 with W the row spacing in inches for a per-row
 * (in-furrow or banded) rate (UF/IFAS EDIS WG013 eq. 1; Univ. of Missouri Extension G1270a).
 */
export function gpmPerRow(gpa: number, speedMph: number, rowSpacingIn: number): number {
  requirePositive('gpa', gpa);
  requirePositive('speedMph', speedMph);
  requirePositive('rowSpacingIn', rowSpacingIn);
  return (gpa * speedMph * rowSpacingIn) / LIQUID_RATE_CONSTANT;
}

/** Rate from flow, GPA = 5,940 × GPM / (mph × W in) (UF/IFAS EDIS WG013 eq. 1). */
export function gpaFromGpm(gpm: number, speedMph: number, rowSpacingIn: number): number {
  requirePositive('gpm', gpm);
  requirePositive('speedMph', speedMph);
  requirePositive('rowSpacingIn', rowSpacingIn);
  return (LIQUID_RATE_CONSTANT * gpm) / (speedMph * rowSpacingIn);
}

/** Flow a section valve must pass = flow per row × rows in the section. */
export function gpmPerSection(gpmPerRowValue: number, rowsInSection: number): number {
  requirePositive('gpmPerRow', gpmPerRowValue);
  requirePositive('rowsInSection', rowsInSection);
  return gpmPerRowValue * rowsInSection;
}

/** Acres one liquid tank covers = tank gallons / GPA (common practice). */
export function acresPerFill(tankGallons: number, gpa: number): number {
  requirePositive('tankGallons', tankGallons);
  requirePositive('gpa', gpa);
  return tankGallons / gpa;
}

/** Acres one dry box covers = capacity lb / lb per acre (common practice). */
export function acresPerDryFill(capacityLb: number, lbPerAcre: number): number {
  requirePositive('capacityLb', capacityLb);
  requirePositive('lbPerAcre', lbPerAcre);
  return capacityLb / lbPerAcre;
}

export interface SeedFillInput {
  /** Seed the planter carries when full (row hoppers together, or the central-fill tanks), in seed units. */
  seedCapacityUnits: number;
  /** Seeds in one unit; defaults to 80,000 (a corn unit, common practice). */
  seedsPerUnit?: number;
  populationPerAcre: number;
}

/**
 * Acres one seed fill covers = capacity units × seeds per unit / seeds per acre.
 *
 * Seed is counted in units of seeds rather than bushels or pounds: seed size varies from lot to
 * lot, so weight says little about seeds, and the unit is how seed is sold and planted.
 */
export function seedAcresPerFill({ seedCapacityUnits, seedsPerUnit = DEFAULT_SEEDS_PER_UNIT, populationPerAcre }: SeedFillInput): number {
  requirePositive('seedCapacityUnits', seedCapacityUnits);
  requirePositive('seedsPerUnit', seedsPerUnit);
  requirePositive('populationPerAcre', populationPerAcre);
  return (seedCapacityUnits * seedsPerUnit) / populationPerAcre;
}

// ---------------------------------------------------------------------------------------------
// Hydraulics
// ---------------------------------------------------------------------------------------------

/**
 * Hydraulic power, hp = GPM × psi / 1,714; divided by pump efficiency (0–1] it is the power the
 * pump draws (standard fluid-power relation, Engineering ToolBox "Hydraulic pumps — horsepower").
 */
export function hydraulicHp(flowGpm: number, pressurePsi: number, pumpEfficiency = 1): number {
  requireNonNegative('flowGpm', flowGpm);
  requirePositive('pressurePsi', pressurePsi);
  if (!(pumpEfficiency > 0 && pumpEfficiency <= 1)) {
    throw new RangeError(`pumpEfficiency must be above 0 and at most 1 (got ${pumpEfficiency})`);
  }
  return (flowGpm * pressurePsi) / HYDRAULIC_HP_CONSTANT / pumpEfficiency;
}

export interface HydraulicLoad {
  name: string;
  flowGpm: number;
  /** Working pressure the load needs; when absent the tractor's pressure is assumed. */
  pressurePsi?: number;
  /** Loads naming the same circuit share one remote valve; a load without one takes its own. */
  circuit?: string;
}

export interface TractorHydraulics {
  hydraulicFlowGpm: number;
  pressurePsi: number;
  remoteValves: number;
}

export interface HydraulicBudgetInput {
  /** Loads that run at the same time while planting (fan, downforce, drives…); leave out the fold. */
  loads: HydraulicLoad[];
  tractor: TractorHydraulics;
}

export type HydraulicVerdict = 'ok' | 'tight' | 'over';

export interface HydraulicBudget {
  demandGpm: number;
  supplyGpm: number;
  /** Supply − demand; negative when the tractor falls short. */
  marginGpm: number;
  /** Demand / supply. */
  utilisation: number;
  remotesNeeded: number;
  remotesAvailable: number;
  verdict: HydraulicVerdict;
  recommendAuxPump: boolean;
  /** Smallest auxiliary pump flow that closes the gap, plus the 15 % reserve; 0 when none is needed. */
  auxPumpGpm: number;
  /** Hydraulic power delivered to the loads (at the load pressure, or the tractor's when not given). */
  hydraulicHpDemand: number;
  reasons: string[];
}

const fmt = (value: number, digits = 1): string =>
  value.toLocaleString('en-US', { minimumFractionDigits: digits, maximumFractionDigits: digits });

/**
 * Weighs the planter's hydraulic loads against the tractor: flow, remote valves and pressure.
 *
 * Verdict: "over" when flow demand exceeds supply, more remotes are needed than the tractor has,
 * or a load needs more pressure than the tractor delivers; "tight" above 85 % of supply
 * (Rowpath's own threshold); otherwise "ok". An auxiliary PTO-driven pump is recommended when
 * demand exceeds what the tractor's remote circuits supply, in flow or in number of circuits
 * (common practice). Its size is the larger of the flow shortfall and the flow of the smallest
 * circuits that do not fit on the remotes, plus a 15 % reserve — a minimum: the pump carries
 * whole circuits, so the circuits moved to it may call for more.
 */
export function hydraulicBudget({ loads, tractor }: HydraulicBudgetInput): HydraulicBudget {
  requirePositive('tractor.hydraulicFlowGpm', tractor.hydraulicFlowGpm);
  requirePositive('tractor.pressurePsi', tractor.pressurePsi);
  requireNonNegative('tractor.remoteValves', tractor.remoteValves);
  for (const load of loads) {
    requireNonNegative(`${load.name} flowGpm`, load.flowGpm);
    if (load.pressurePsi !== undefined) requirePositive(`${load.name} pressurePsi`, load.pressurePsi);
  }

  const supplyGpm = tractor.hydraulicFlowGpm;
  const demandGpm = loads.reduce((sum, load) => sum + load.flowGpm, 0);
  const marginGpm = supplyGpm - demandGpm;
  const utilisation = demandGpm / supplyGpm;

  // One remote per named circuit, one per unnamed load.
  const circuitFlowGpm = new Map<string, number>();
  loads.forEach((load, index) => {
    const key = load.circuit !== undefined ? `circuit:${load.circuit}` : `load:${index}`;
    circuitFlowGpm.set(key, (circuitFlowGpm.get(key) ?? 0) + load.flowGpm);
  });
  const remotesNeeded = circuitFlowGpm.size;
  const remotesAvailable = tractor.remoteValves;
  const extraCircuits = Math.max(0, remotesNeeded - remotesAvailable);
  const extraCircuitFlowGpm = [...circuitFlowGpm.values()]
    .sort((a, b) => a - b)
    .slice(0, extraCircuits)
    .reduce((sum, flow) => sum + flow, 0);

  const hydraulicHpDemand = loads.reduce(
    (sum, load) => sum + hydraulicHp(load.flowGpm, load.pressurePsi ?? tractor.pressurePsi),
    0,
  );

  const reasons: string[] = [];
  const flowOver = demandGpm > supplyGpm;
  const remotesShort = extraCircuits > 0;
  const underPressured = loads.filter((load) => load.pressurePsi !== undefined && load.pressurePsi > tractor.pressurePsi);

  if (flowOver) {
    reasons.push(
      `The loads need ${fmt(demandGpm)} gpm; the tractor supplies ${fmt(supplyGpm)} gpm, ${fmt(-marginGpm)} gpm short.`,
    );
  } else if (utilisation > TIGHT_UTILISATION) {
    reasons.push(
      `The loads use ${fmt(utilisation * 100, 0)} % of the tractor's ${fmt(supplyGpm)} gpm, above Rowpath's ${fmt(TIGHT_UTILISATION * 100, 0)} % comfort line.`,
    );
  }
  if (remotesShort) {
    reasons.push(`The loads need ${remotesNeeded} remote valves; the tractor has ${remotesAvailable}.`);
  }
  for (const load of underPressured) {
    reasons.push(`${load.name} needs ${fmt(load.pressurePsi ?? 0, 0)} psi; the tractor delivers ${fmt(tractor.pressurePsi, 0)} psi.`);
  }

  const verdict: HydraulicVerdict =
    flowOver || remotesShort || underPressured.length > 0 ? 'over' : utilisation > TIGHT_UTILISATION ? 'tight' : 'ok';

  const recommendAuxPump = flowOver || remotesShort;
  const auxPumpGpm = recommendAuxPump ? Math.max(Math.max(0, -marginGpm), extraCircuitFlowGpm) * (1 + AUX_PUMP_RESERVE) : 0;
  if (recommendAuxPump) {
    reasons.push(
      `An auxiliary PTO-driven pump of at least ${fmt(auxPumpGpm)} gpm (with a ${fmt(AUX_PUMP_RESERVE * 100, 0)} % reserve) would carry the excess.`,
    );
  }

  return {
    demandGpm,
    supplyGpm,
    marginGpm,
    utilisation,
    remotesNeeded,
    remotesAvailable,
    verdict,
    recommendAuxPump,
    auxPumpGpm,
    hydraulicHpDemand,
    reasons,
  };
}

// ---------------------------------------------------------------------------------------------
// Acres per day with refill stops
// ---------------------------------------------------------------------------------------------

export type SupplyKind = 'seed' | 'liquid' | 'dry';

export interface Supply {
  kind: SupplyKind;
  acresPerFill: number;
  /** Minutes the planter stands still for one refill (travel to the tender included). */
  stopMinutes: number;
}

export interface AcresPerDayInput {
  effectiveCapacityAcPerHr: number;
  fieldHoursPerDay: number;
  supplies: Supply[];
}

export interface SupplyStops {
  /** Average refills in a day; fractional, since a fill carries over to the next day. */
  stopsPerDay: number;
  hoursLostToStops: number;
  acresPerFill: number;
}

export interface AcresPerDay {
  acresPerDay: number;
  /** Stops per day, one entry per supply in the order given. */
  stopsPerDay: number[];
  hoursLostToStops: number;
  /** The kind of supply whose refills cost the most time; null with no stops. */
  limitingSupply: SupplyKind | null;
  byKind: Partial<Record<SupplyKind, SupplyStops>>;
}

/**
 * Acres a day once refill stops are paid for. The working hours and the stop time together fill
 * the field day: A / effCap + Σ (A / acresPerFill_i) × stopHours_i = fieldHours, so
 * A = fieldHours / (1 / effCap + Σ stopHours_i / acresPerFill_i). Field efficiency already holds
 * turns and overlap; these stops come on top. Each supply's stops are counted on their own (no
 * credit for filling seed and liquid in one stop), which errs on the side of fewer acres.
 */
export function acresPerDay({ effectiveCapacityAcPerHr: effCap, fieldHoursPerDay, supplies }: AcresPerDayInput): AcresPerDay {
  requirePositive('effectiveCapacityAcPerHr', effCap);
  requirePositive('fieldHoursPerDay', fieldHoursPerDay);
  for (const supply of supplies) {
    requirePositive(`${supply.kind} acresPerFill`, supply.acresPerFill);
    requireNonNegative(`${supply.kind} stopMinutes`, supply.stopMinutes);
  }

  // Hours of stopping per acre planted, supply by supply.
  const stopHoursPerAcre = supplies.map((supply) => supply.stopMinutes / 60 / supply.acresPerFill);
  const acres = fieldHoursPerDay / (1 / effCap + stopHoursPerAcre.reduce((sum, h) => sum + h, 0));

  const stopsPerDay = supplies.map((supply) => acres / supply.acresPerFill);
  const hoursLost = supplies.map((_, i) => acres * stopHoursPerAcre[i]);
  const hoursLostToStops = hoursLost.reduce((sum, h) => sum + h, 0);

  const byKind: Partial<Record<SupplyKind, SupplyStops>> = {};
  supplies.forEach((supply, i) => {
    const prior = byKind[supply.kind];
    byKind[supply.kind] = prior
      ? {
          stopsPerDay: prior.stopsPerDay + stopsPerDay[i],
          hoursLostToStops: prior.hoursLostToStops + hoursLost[i],
          // Two supplies of one kind: report the one that runs out first.
          acresPerFill: Math.min(prior.acresPerFill, supply.acresPerFill),
        }
      : { stopsPerDay: stopsPerDay[i], hoursLostToStops: hoursLost[i], acresPerFill: supply.acresPerFill };
  });

  let limitingSupply: SupplyKind | null = null;
  let worstHours = 0;
  for (const [kind, stops] of Object.entries(byKind) as [SupplyKind, SupplyStops][]) {
    if (stops.hoursLostToStops > worstHours) {
      worstHours = stops.hoursLostToStops;
      limitingSupply = kind;
    }
  }

  return { acresPerDay: acres, stopsPerDay, hoursLostToStops, limitingSupply, byKind };
}

// ---------------------------------------------------------------------------------------------
// The whole calculator
// ---------------------------------------------------------------------------------------------

export const CAUTIONS = {
  hydraulic: [
    'Oil under pressure can pierce skin: never feel along a hose or fitting for a leak — hold a piece of card near it instead, and get medical help at once if oil gets under the skin.',
    'Lower the planter and relieve pressure in every circuit before you uncouple a hose or loosen a fitting.',
    'These figures are for planning: the flows, pressures and fittings in the planter and tractor makers’ manuals come first.',
  ],
  starter: [
    'Starter fertilizer: wear the protective gear the product label calls for, follow the label for rates and mixing, and keep to local rules on storage, transport and spills.',
  ],
  raisedToolbar: [
    'Never work under a raised toolbar or row unit held up by hydraulics alone: shut the tractor off, take the key, set the transport locks and block the frame first.',
  ],
} as const;

export interface SizingResult {
  workingWidthFt?: number;
  theoreticalCapacityAcPerHr?: number;
  effectiveCapacityAcPerHr?: number;
  seedSpacingIn?: number;
  seedsPerFt?: number;
  seedsPerSecondPerRow?: number;
  meterDiscRpm?: number;
  /** Highest speed the meter holds at this population (from meterMaxSeedsPerSecond). */
  maxSpeedMph?: number;
  gpmPerRow?: number;
  gpmPerSection?: number;
  /** Flow for the whole planter (every row), for sizing the liquid pump. */
  gpmTotal?: number;
  acresPerFill?: Partial<Record<SupplyKind, number>>;
  acresPerDay?: number;
  hoursLostToStops?: number;
  stopsPerDay?: Partial<Record<SupplyKind, number>>;
  limitingSupply?: SupplyKind | null;
  /** Hydraulic power delivered to the listed loads. */
  hydraulicHp?: number;
  hydraulic?: HydraulicBudget;
  /** Points about the figures themselves (speed above the meter's limit, a stop time missing…). */
  warnings: string[];
  /** Safety notes that belong with the figures asked for. */
  cautions: string[];
}

const SUPPLY_LABEL: Record<SupplyKind, string> = { seed: 'Seed', liquid: 'Liquid', dry: 'Dry' };

/**
 * Answers every figure whose inputs are present in the body and leaves the rest out. The body is
 * expected to have passed `sizingInputSchema`; the functions above still refuse bad numbers.
 */
export function computeSizing(input: SizingInput): SizingResult {
  const result: SizingResult = { warnings: [], cautions: [] };
  const { rows, rowSpacingIn: spacingIn, speedMph, populationPerAcre } = input;

  if (rows !== undefined && spacingIn !== undefined) {
    result.workingWidthFt = workingWidthFt(rows, spacingIn);
    if (speedMph !== undefined) {
      result.theoreticalCapacityAcPerHr = theoreticalCapacityAcPerHr(result.workingWidthFt, speedMph);
      if (input.fieldEfficiency !== undefined) {
        result.effectiveCapacityAcPerHr = effectiveCapacityAcPerHr(result.theoreticalCapacityAcPerHr, input.fieldEfficiency);
      }
    }
  }

  if (populationPerAcre !== undefined && spacingIn !== undefined) {
    result.seedSpacingIn = seedSpacingIn(populationPerAcre, spacingIn);
    result.seedsPerFt = seedsPerFt(populationPerAcre, spacingIn);
    if (speedMph !== undefined) {
      result.seedsPerSecondPerRow = seedsPerSecondPerRow(populationPerAcre, spacingIn, speedMph);
      if (input.cellsPerDisc !== undefined) {
        result.meterDiscRpm = meterDiscRpm(result.seedsPerSecondPerRow, input.cellsPerDisc);
      }
    }
    if (input.meterMaxSeedsPerSecond !== undefined) {
      result.maxSpeedMph = maxSpeedMphForMeter({
        populationPerAcre,
        rowSpacingIn: spacingIn,
        meterMaxSeedsPerSecond: input.meterMaxSeedsPerSecond,
      });
      if (speedMph !== undefined && speedMph > result.maxSpeedMph) {
        // The advised speed is rounded down: rounding a limit up would advise a speed past it.
        result.warnings.push(
          `At ${fmt(speedMph)} mph each meter must place ${fmt(result.seedsPerSecondPerRow ?? 0)} seeds/s, above its ${fmt(input.meterMaxSeedsPerSecond)} seeds/s limit: slow to ${fmt(Math.floor(result.maxSpeedMph * 10) / 10)} mph or lower the population.`,
        );
      }
    }
  }

  // Liquid flow per row and per section.
  if (input.liquidGpa !== undefined && speedMph !== undefined && spacingIn !== undefined) {
    result.gpmPerRow = gpmPerRow(input.liquidGpa, speedMph, spacingIn);
    if (input.sectionRows !== undefined) result.gpmPerSection = gpmPerSection(result.gpmPerRow, input.sectionRows);
    if (rows !== undefined) result.gpmTotal = result.gpmPerRow * rows;
  }

  // Acres per fill, supply by supply, and the refill stops they bring.
  const fills: Partial<Record<SupplyKind, number>> = {};
  if (input.seedCapacityUnits !== undefined && populationPerAcre !== undefined) {
    fills.seed = seedAcresPerFill({
      seedCapacityUnits: input.seedCapacityUnits,
      seedsPerUnit: input.seedsPerUnit,
      populationPerAcre,
    });
  }
  if (input.tankGallons !== undefined && input.liquidGpa !== undefined) {
    fills.liquid = acresPerFill(input.tankGallons, input.liquidGpa);
  }
  if (input.dryCapacityLb !== undefined && input.dryLbPerAcre !== undefined) {
    fills.dry = acresPerDryFill(input.dryCapacityLb, input.dryLbPerAcre);
  }
  if (Object.keys(fills).length > 0) result.acresPerFill = fills;

  if (result.effectiveCapacityAcPerHr !== undefined && input.fieldHoursPerDay !== undefined) {
    const stopMinutes: Record<SupplyKind, number | undefined> = {
      seed: input.seedStopMinutes,
      liquid: input.liquidStopMinutes,
      dry: input.dryStopMinutes,
    };
    const supplies: Supply[] = [];
    for (const kind of ['seed', 'liquid', 'dry'] as const) {
      const fill = fills[kind];
      if (fill === undefined) continue;
      const minutes = stopMinutes[kind];
      if (minutes === undefined) {
        result.warnings.push(`${SUPPLY_LABEL[kind]} refills are not counted in acres per day: give the minutes one refill takes.`);
        continue;
      }
      supplies.push({ kind, acresPerFill: fill, stopMinutes: minutes });
    }
    const day = acresPerDay({
      effectiveCapacityAcPerHr: result.effectiveCapacityAcPerHr,
      fieldHoursPerDay: input.fieldHoursPerDay,
      supplies,
    });
    result.acresPerDay = day.acresPerDay;
    result.hoursLostToStops = day.hoursLostToStops;
    result.limitingSupply = day.limitingSupply;
    const stops: Partial<Record<SupplyKind, number>> = {};
    for (const [kind, s] of Object.entries(day.byKind) as [SupplyKind, SupplyStops][]) stops[kind] = s.stopsPerDay;
    result.stopsPerDay = stops;
  }

  // Hydraulics.
  const loads = input.hydraulicLoads;
  if (loads !== undefined && loads.length > 0) {
    const pressureKnown = loads.every((load) => load.pressurePsi !== undefined) || input.tractorPressurePsi !== undefined;
    if (pressureKnown) {
      result.hydraulicHp = loads.reduce(
        (sum, load) => sum + hydraulicHp(load.flowGpm, (load.pressurePsi ?? input.tractorPressurePsi) as number),
        0,
      );
    }
    if (input.tractorFlowGpm !== undefined && input.tractorPressurePsi !== undefined && input.tractorRemoteValves !== undefined) {
      result.hydraulic = hydraulicBudget({
        loads,
        tractor: {
          hydraulicFlowGpm: input.tractorFlowGpm,
          pressurePsi: input.tractorPressurePsi,
          remoteValves: input.tractorRemoteValves,
        },
      });
    }
  }

  // Safety notes go with the figures they concern.
  const hydraulicsAsked =
    (loads !== undefined && loads.length > 0) ||
    input.tractorFlowGpm !== undefined ||
    input.tractorPressurePsi !== undefined ||
    input.tractorRemoteValves !== undefined;
  const fertilizerAsked =
    input.liquidGpa !== undefined ||
    input.tankGallons !== undefined ||
    input.dryCapacityLb !== undefined ||
    input.dryLbPerAcre !== undefined;
  if (hydraulicsAsked) result.cautions.push(...CAUTIONS.hydraulic);
  if (fertilizerAsked) result.cautions.push(...CAUTIONS.starter);
  if (hydraulicsAsked || rows !== undefined) result.cautions.push(...CAUTIONS.raisedToolbar);

  return result;
}

// ---------------------------------------------------------------------------------------------
// What if…
// ---------------------------------------------------------------------------------------------

export interface SizingDelta {
  base: SizingResult;
  changed: SizingResult;
  /**
   * changed − base for every numeric figure present in both, keyed by its path
   * ("acresPerDay", "acresPerFill.liquid", "hydraulic.marginGpm"…).
   */
  delta: Record<string, number>;
  /** Figures that appear in only one of the two answers. */
  onlyInBase: string[];
  onlyInChanged: string[];
}

function numericFigures(value: unknown, prefix: string, out: Map<string, number>): void {
  if (typeof value === 'number') {
    out.set(prefix, value);
  } else if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
    for (const [key, inner] of Object.entries(value)) numericFigures(inner, prefix ? `${prefix}.${key}` : key, out);
  }
}

/** Sizes both bodies and returns the change in every figure (a bigger tank, a faster speed…). */
export function sizingDelta(baseInput: SizingInput, changedInput: SizingInput): SizingDelta {
  const base = computeSizing(baseInput);
  const changed = computeSizing(changedInput);
  const baseFigures = new Map<string, number>();
  const changedFigures = new Map<string, number>();
  numericFigures(base, '', baseFigures);
  numericFigures(changed, '', changedFigures);

  const delta: Record<string, number> = {};
  for (const [path, before] of baseFigures) {
    const after = changedFigures.get(path);
    if (after !== undefined) delta[path] = after - before;
  }
  return {
    base,
    changed,
    delta,
    onlyInBase: [...baseFigures.keys()].filter((path) => !changedFigures.has(path)),
    onlyInChanged: [...changedFigures.keys()].filter((path) => !baseFigures.has(path)),
  };
}

/** One change on top of a base body, e.g. whatIf(body, { tankGallons: 1000 }). */
export function whatIf(baseInput: SizingInput, change: Partial<SizingInput>): SizingDelta {
  return sizingDelta(baseInput, { ...baseInput, ...change });
}

/** What a bigger (or smaller) liquid tank does to acres per day. */
export function whatIfTankGallons(baseInput: SizingInput, tankGallons: number): SizingDelta {
  return whatIf(baseInput, { tankGallons });
}

/** What a different planting speed does (capacity rises; the meter may not keep up — see warnings). */
export function whatIfSpeedMph(baseInput: SizingInput, speedMph: number): SizingDelta {
  return whatIf(baseInput, { speedMph });
}

/** What a different seed fill method does, e.g. central-fill tanks (more units, a quicker stop) in place of row hoppers. */
export function whatIfSeedFill(
  baseInput: SizingInput,
  fill: { seedCapacityUnits: number; seedStopMinutes: number },
): SizingDelta {
  return whatIf(baseInput, fill);
}
