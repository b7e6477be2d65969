// Turns a stored planter (with its tractor and installs) plus the specialist's assumptions into
// the sizing calculator's input. Shared by the server's GET /api/planters/:id/sizing and the
// browser's Sizing panel, so both compute the same figures from the same record.
import type { HydraulicLoadInput, SizingInput } from '../schemas/sizing.js';

export interface SizingAssumptions {
  speedMph: number;
  populationPerAcre: number;
  fieldEfficiency: number;
  fieldHoursPerDay: number;
  liquidGpa: number;
  dryLbPerAcre: number;
  seedStopMinutes: number;
  liquidStopMinutes: number;
  dryStopMinutes: number;
  sectionRows?: number;
  /** A tank size to try instead of the planter's own (what-if), in gallons per tank. */
  liquidTankGallonsOverride?: number;
}

/**
 * Defaults for the Sizing panel. Field efficiency 0.65: planters are tended machines, typically
 * about 65 % (ASABE D497, from memory: range 50–75 %). Speed, population, rates and stop times
 * are common practice for 30-in corn, for the specialist to change.
 */
export const DEFAULT_ASSUMPTIONS: SizingAssumptions = {
  speedMph: 5,
  populationPerAcre: 32_000,
  fieldEfficiency: 0.65,
  fieldHoursPerDay: 12,
  liquidGpa: 5,
  dryLbPerAcre: 150,
  seedStopMinutes: 20,
  liquidStopMinutes: 20,
  dryStopMinutes: 30,
};

export interface PlanterForSizing {
  rows: number;
  rowSpacingIn: number;
  seedCapacityUnits: number | null;
  liquidTankCount: number;
  liquidTankGallons: number;
  dryCapacityLb: number;
  tractor: { name?: string; hydraulicFlowGpm: number; hydraulicPressurePsi: number; remoteValves: number } | null;
  installs: {
    status: string;
    quantity: number;
    component: { name: string; category: string; unit: string; hydraulicGpm: number | null; maxSeedsPerSecond: number | null; ratedMaxSpeedMph: number | null } | null;
  }[];
}

/** Hydraulic loads from installed parts: per-row demand × rows fitted, per-toolbar/planter as listed. */
export function hydraulicLoadsFromInstalls(planter: PlanterForSizing): HydraulicLoadInput[] {
  const loads = new Map<string, number>();
  for (const i of planter.installs) {
    const c = i.component;
    if (i.status !== 'installed' || !c?.hydraulicGpm) continue;
    const flow = c.unit === 'row' ? c.hydraulicGpm * i.quantity : c.hydraulicGpm * Math.max(1, i.quantity);
    loads.set(c.name, (loads.get(c.name) ?? 0) + flow);
  }
  return [...loads.entries()].map(([name, flowGpm]) => ({ name, flowGpm: Math.round(flowGpm * 100) / 100 }));
}

/** The slowest installed meter or delivery sets the limit: the lowest rated seeds per second. */
export function meterLimitSeedsPerSecond(planter: PlanterForSizing): number | undefined {
  const limits = planter.installs
    .filter((i) => i.status === 'installed' && i.component?.maxSeedsPerSecond)
    .map((i) => i.component!.maxSeedsPerSecond!);
  return limits.length ? Math.min(...limits) : undefined;
}

export function planterSizingInput(planter: PlanterForSizing, a: SizingAssumptions = DEFAULT_ASSUMPTIONS): SizingInput {
  const tankGallonsEach = a.liquidTankGallonsOverride ?? planter.liquidTankGallons;
  const input: SizingInput = {
    rows: planter.rows,
    rowSpacingIn: planter.rowSpacingIn,
    speedMph: a.speedMph,
    fieldEfficiency: a.fieldEfficiency,
    populationPerAcre: a.populationPerAcre,
    fieldHoursPerDay: a.fieldHoursPerDay,
    ...(a.sectionRows ? { sectionRows: Math.min(a.sectionRows, planter.rows) } : {}),
  };
  const meterLimit = meterLimitSeedsPerSecond(planter);
  if (meterLimit) input.meterMaxSeedsPerSecond = meterLimit;
  if (planter.seedCapacityUnits) Object.assign(input, { seedCapacityUnits: planter.seedCapacityUnits, seedStopMinutes: a.seedStopMinutes });
  if (planter.liquidTankCount > 0 && tankGallonsEach > 0)
    Object.assign(input, { liquidGpa: a.liquidGpa, tankGallons: planter.liquidTankCount * tankGallonsEach, liquidStopMinutes: a.liquidStopMinutes });
  if (planter.dryCapacityLb > 0) Object.assign(input, { dryCapacityLb: planter.dryCapacityLb, dryLbPerAcre: a.dryLbPerAcre, dryStopMinutes: a.dryStopMinutes });
  const loads = hydraulicLoadsFromInstalls(planter);
  if (loads.length) input.hydraulicLoads = loads;
  if (planter.tractor)
    Object.assign(input, {
      tractorFlowGpm: planter.tractor.hydraulicFlowGpm,
      tractorPressurePsi: planter.tractor.hydraulicPressurePsi,
      tractorRemoteValves: Math.max(1, planter.tractor.remoteValves),
    });
  return input;
}
