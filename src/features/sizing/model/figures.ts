/**
 * Every figure the Sizing screens show, defined once: what it is called, its unit and
 * precision, how to read it from the shared calculator's answer, and a one-line explanation
 * with its source. Both the planter panel and the explicit calculator draw from this list.
 */
import { hydraulicHp, type SizingDelta, type SizingResult, type SupplyKind } from '@shared/calc/sizing';
import type { SizingInput } from '@shared/schemas/sizing';
import { formatDelta, formatWithUnit, type Rounding } from './format';

export interface FigureContext {
  result: SizingResult;
  input: SizingInput;
}

export interface FigureDef {
  /** Stable id; for figures the calculator answers directly it is the answer's path ("hydraulic.demandGpm"). */
  key: string;
  label: string;
  unit: string;
  digits: number;
  rounding?: Rounding;
  /** Shown value = raw × scale (a fraction shown as %). */
  scale?: number;
  /** The key is a path in the calculator's answer: its change comes straight from sizingDelta. */
  inAnswer: boolean;
  read: (context: FigureContext) => number | undefined;
  /** The formula in words. */
  explain: string;
  source: string;
  /** Why the figure is absent, when its inputs are missing. */
  missing: string;
}

const SUPPLY_WORDS: Record<SupplyKind, { name: string; stopField: 'seedStopMinutes' | 'liquidStopMinutes' | 'dryStopMinutes' }> = {
  seed: { name: 'Seed', stopField: 'seedStopMinutes' },
  liquid: { name: 'Liquid', stopField: 'liquidStopMinutes' },
  dry: { name: 'Dry fertilizer', stopField: 'dryStopMinutes' },
};

export const SUPPLY_KINDS: readonly SupplyKind[] = ['seed', 'liquid', 'dry'];

export function supplyName(kind: SupplyKind): string {
  return SUPPLY_WORDS[kind].name;
}

/** Hours a supply's refills take in a day: its stops × minutes per stop ÷ 60 (same model as acresPerDay). */
export function hoursLostForSupply({ result, input }: FigureContext, kind: SupplyKind): number | undefined {
  const stops = result.stopsPerDay?.[kind];
  const minutes = input[SUPPLY_WORDS[kind].stopField];
  return stops === undefined || minutes === undefined ? undefined : (stops * minutes) / 60;
}

/** Power an auxiliary pump of the recommended size takes, before its own losses (fluid-power relation). */
export function auxPumpHp({ result, input }: FigureContext): number | undefined {
  const budget = result.hydraulic;
  if (!budget?.recommendAuxPump || input.tractorPressurePsi === undefined) return undefined;
  return hydraulicHp(budget.auxPumpGpm, input.tractorPressurePsi);
}

function answer(
  key: string,
  read: (r: SizingResult) => number | undefined,
  rest: Omit<FigureDef, 'key' | 'read' | 'inAnswer'>,
): FigureDef {
  return { key, inAnswer: true, read: ({ result }) => read(result), ...rest };
}

const AEN73 = 'AEN-73, University of Kentucky (1991)';
const REFILL_MODEL = 'Rowpath’s refill model (common practice: each stop’s time is counted)';

export const CAPACITY_FIGURES: FigureDef[] = [
  answer('workingWidthFt', (r) => r.workingWidthFt, {
    label: 'Working width',
    unit: 'ft',
    digits: 1,
    explain: 'Rows × row spacing (in) ÷ 12.',
    source: 'Common practice',
    missing: 'Needs rows and row spacing.',
  }),
  answer('theoreticalCapacityAcPerHr', (r) => r.theoreticalCapacityAcPerHr, {
    label: 'Theoretical capacity',
    unit: 'ac/h',
    digits: 1,
    explain: 'Width (ft) × speed (mph) ÷ 8.25; 8.25 is 43,560 ft² per acre ÷ 5,280 ft per mile.',
    source: AEN73,
    missing: 'Needs the working width and a speed.',
  }),
  answer('effectiveCapacityAcPerHr', (r) => r.effectiveCapacityAcPerHr, {
    label: 'Effective capacity',
    unit: 'ac/h',
    digits: 1,
    explain: 'Theoretical capacity × field efficiency: turns, overlap and short stops take the rest.',
    source: AEN73,
    missing: 'Needs the theoretical capacity and a field efficiency.',
  }),
  answer('acresPerDay', (r) => r.acresPerDay, {
    label: 'Acres per day',
    unit: 'ac/day',
    digits: 0,
    explain: 'Field hours shared between planting and refills: hours ÷ (1 ÷ effective capacity + each supply’s stop hours ÷ its acres per fill).',
    source: REFILL_MODEL,
    missing: 'Needs the effective capacity and field hours per day.',
  }),
  answer('hoursLostToStops', (r) => r.hoursLostToStops, {
    label: 'Time lost to refills',
    unit: 'h/day',
    digits: 1,
    explain: 'Every supply’s stops per day × minutes per stop ÷ 60.',
    source: REFILL_MODEL,
    missing: 'Needs acres per day.',
  }),
];

const SEED_UNIT_NOTE = 'Seed units carried × seeds per unit (80,000 for a corn unit) ÷ seeds per acre.';

/** Acres per fill, stops per day and hours lost, for one supply. */
export function stopFigures(kind: SupplyKind): { acresPerFill: FigureDef; stopsPerDay: FigureDef; hoursLost: FigureDef } {
  const name = supplyName(kind);
  return {
    acresPerFill: answer(`acresPerFill.${kind}`, (r) => r.acresPerFill?.[kind], {
      label: `${name}: acres per fill`,
      unit: 'ac',
      digits: 0,
      explain:
        kind === 'seed' ? SEED_UNIT_NOTE : kind === 'liquid' ? 'Tank gallons (all tanks) ÷ gallons per acre.' : 'Box capacity (lb) ÷ pounds per acre.',
      source: kind === 'seed' ? 'Common practice (80,000-kernel corn unit)' : 'Common practice',
      missing: `No ${name.toLowerCase()} carried on this set-up.`,
    }),
    stopsPerDay: answer(`stopsPerDay.${kind}`, (r) => r.stopsPerDay?.[kind], {
      label: `${name}: stops per day`,
      unit: 'stops/day',
      digits: 1,
      explain: 'Acres per day ÷ acres per fill; a part stop carries over to the next day.',
      source: REFILL_MODEL,
      missing: 'Needs acres per fill and the minutes one refill takes.',
    }),
    hoursLost: {
      key: `hoursLost.${kind}`,
      inAnswer: false,
      read: (context) => hoursLostForSupply(context, kind),
      label: `${name}: hours lost`,
      unit: 'h/day',
      digits: 1,
      explain: 'Stops per day × minutes per stop ÷ 60.',
      source: REFILL_MODEL,
      missing: 'Needs stops per day.',
    },
  };
}

export const SEED_FIGURES: FigureDef[] = [
  answer('seedSpacingIn', (r) => r.seedSpacingIn, {
    label: 'Seed spacing in the row',
    unit: 'in',
    digits: 1,
    explain: '6,272,640 ÷ (row spacing in × seeds per acre); 6,272,640 is 43,560 ft² × 144 in².',
    source: 'Purdue University, Corn & Soybean Field Guide',
    missing: 'Needs a population and row spacing.',
  }),
  answer('seedsPerFt', (r) => r.seedsPerFt, {
    label: 'Seeds per foot of row',
    unit: 'seeds/ft',
    digits: 2,
    explain: 'Seeds per acre ÷ 43,560 × row spacing (in) ÷ 12.',
    source: 'Iowa State University, Agron 212',
    missing: 'Needs a population and row spacing.',
  }),
  answer('seedsPerSecondPerRow', (r) => r.seedsPerSecondPerRow, {
    label: 'Seeds per second, each row',
    unit: 'seeds/s',
    digits: 1,
    explain: 'Seeds per foot × ground speed in ft/s (mph × 5,280 ÷ 3,600).',
    source: 'Iowa State Agron 212 figure, unit conversion',
    missing: 'Needs seeds per foot and a speed.',
  }),
  answer('meterDiscRpm', (r) => r.meterDiscRpm, {
    label: 'Meter disc speed',
    unit: 'rpm',
    digits: 1,
    explain: 'Seeds per second × 60 ÷ cells per disc (one seed per cell).',
    source: 'Common practice',
    missing: 'Enter the cells per disc.',
  }),
  answer('maxSpeedMph', (r) => r.maxSpeedMph, {
    label: 'Top speed the meter holds here',
    unit: 'mph',
    digits: 1,
    rounding: 'down',
    explain: 'The meter’s rated seeds per second ÷ (seeds per foot × 1.467 ft/s per mph), rounded down.',
    source: 'Catalog rating; Rowpath takes the limit to be a seed rate',
    missing: 'No installed meter has a rated seed rate in the catalog.',
  }),
];

export const LIQUID_FIGURES: FigureDef[] = [
  answer('gpmPerRow', (r) => r.gpmPerRow, {
    label: 'Flow per row',
    unit: 'gpm',
    digits: 3,
    explain: 'Gallons per acre × mph × row spacing (in) ÷ 5,940.',
    source: 'UF/IFAS EDIS WG013, eq. 1; University of Missouri G1270a',
    missing: 'Needs a liquid rate, a speed and row spacing.',
  }),
  answer('gpmPerSection', (r) => r.gpmPerSection, {
    label: 'Flow per section',
    unit: 'gpm',
    digits: 2,
    explain: 'Flow per row × rows one section valve feeds.',
    source: 'Common practice',
    missing: 'Enter the rows per section.',
  }),
  answer('gpmTotal', (r) => r.gpmTotal, {
    label: 'Whole-planter flow',
    unit: 'gpm',
    digits: 2,
    explain: 'Flow per row × rows: what the liquid pump must deliver.',
    source: 'Common practice',
    missing: 'Needs flow per row and rows.',
  }),
  stopFigures('liquid').acresPerFill,
];

export const HYDRAULIC_FIGURES: FigureDef[] = [
  answer('hydraulic.demandGpm', (r) => r.hydraulic?.demandGpm, {
    label: 'Planter demand',
    unit: 'gpm',
    digits: 1,
    explain: 'Flows of the loads that run while planting (fan, downforce, drives…); a per-row part × rows fitted.',
    source: 'Catalog flows, common practice',
    missing: 'Needs hydraulic loads and a tractor.',
  }),
  answer('hydraulic.supplyGpm', (r) => r.hydraulic?.supplyGpm, {
    label: 'Tractor supply',
    unit: 'gpm',
    digits: 1,
    explain: 'The tractor’s rated hydraulic flow.',
    source: 'Tractor record',
    missing: 'Choose a tractor.',
  }),
  answer('hydraulic.marginGpm', (r) => r.hydraulic?.marginGpm, {
    label: 'Flow margin',
    unit: 'gpm',
    digits: 1,
    explain: 'Supply − demand; below zero the tractor falls short.',
    source: 'Common practice',
    missing: 'Needs demand and supply.',
  }),
  answer('hydraulic.utilisation', (r) => r.hydraulic?.utilisation, {
    label: 'Share of supply used',
    unit: '%',
    digits: 0,
    scale: 100,
    explain: 'Demand ÷ supply. Above 85 % is tight: warm oil or a lift at the headland can starve the fan.',
    source: 'Rowpath’s own 85 % comfort line',
    missing: 'Needs demand and supply.',
  }),
  answer('hydraulic.remotesNeeded', (r) => r.hydraulic?.remotesNeeded, {
    label: 'Remote valves needed',
    unit: 'remotes',
    digits: 0,
    explain: 'One remote per load circuit.',
    source: 'Common practice',
    missing: 'Needs hydraulic loads and a tractor.',
  }),
  answer('hydraulic.remotesAvailable', (r) => r.hydraulic?.remotesAvailable, {
    label: 'Remote valves on the tractor',
    unit: 'remotes',
    digits: 0,
    explain: 'From the tractor record.',
    source: 'Tractor record',
    missing: 'Choose a tractor.',
  }),
  answer('hydraulicHp', (r) => r.hydraulicHp, {
    label: 'Hydraulic power',
    unit: 'hp',
    digits: 1,
    explain: 'gpm × psi ÷ 1,714 for each load, at the tractor’s pressure unless the load names its own.',
    source: 'Standard fluid-power relation',
    missing: 'Needs hydraulic loads and a pressure.',
  }),
];

export const AUX_PUMP_FIGURES: FigureDef[] = [
  answer('hydraulic.auxPumpGpm', (r) => (r.hydraulic?.recommendAuxPump ? r.hydraulic.auxPumpGpm : undefined), {
    label: 'Auxiliary pump, at least',
    unit: 'gpm',
    digits: 1,
    explain: 'The flow shortfall, or the flow of the circuits that find no remote, + a 15 % reserve.',
    source: 'Common practice; the 15 % reserve is Rowpath’s own',
    missing: 'No auxiliary pump is needed.',
  }),
  {
    key: 'auxPumpHp',
    inAnswer: false,
    read: auxPumpHp,
    label: 'PTO power the pump takes, at least',
    unit: 'hp',
    digits: 1,
    explain: 'Pump flow × tractor pressure ÷ 1,714, before the pump’s own losses.',
    source: 'Standard fluid-power relation',
    missing: 'No auxiliary pump is needed.',
  },
];

// ---------------------------------------------------------------------------------------------
// One figure, now and as stored
// ---------------------------------------------------------------------------------------------

export interface FigureView {
  def: FigureDef;
  value: number | undefined;
  baseValue: number | undefined;
  /** changed − base, raw (unscaled); undefined when either side is absent. */
  delta: number | undefined;
  text: string | null;
  /** "+42 ac/day"; null when nothing changed at the shown precision or a side is absent. */
  deltaText: string | null;
  /** Present now, absent as stored ("new"), or the reverse. */
  presence: 'both' | 'new' | 'gone' | 'neither';
}

export function formatFigure(def: FigureDef, value: number): string {
  return formatWithUnit(value * (def.scale ?? 1), def.digits, def.unit, def.rounding);
}

/**
 * The change as shown. When it rounds to nothing at the figure's precision but the two shown
 * values differ (1.55 → 1.51 shows as 1.6 → 1.5), more decimals are used, so the screen never
 * says "same" beside two different numbers.
 */
function deltaTextFor(def: FigureDef, delta: number, shownValuesDiffer: boolean): string | null {
  const unit = def.unit === '%' ? 'pts' : def.unit;
  const scaled = delta * (def.scale ?? 1);
  const text = formatDelta(scaled, def.digits, unit);
  if (text !== null || !shownValuesDiffer) return text;
  for (let digits = def.digits + 1; digits <= def.digits + 3; digits++) {
    const finer = formatDelta(scaled, digits, unit);
    if (finer !== null) return finer;
  }
  return null;
}

/**
 * Reads a figure from the stored and the what-if answers. Figures in the answer take their
 * change from sizingDelta; derived ones (hours lost per supply, pump power) subtract directly.
 */
export function viewFigure(def: FigureDef, comparison: SizingDelta, baseInput: SizingInput, changedInput: SizingInput): FigureView {
  const value = def.read({ result: comparison.changed, input: changedInput });
  const baseValue = def.read({ result: comparison.base, input: baseInput });
  let delta: number | undefined;
  if (value !== undefined && baseValue !== undefined) {
    delta = def.inAnswer && comparison.delta[def.key] !== undefined ? comparison.delta[def.key] : value - baseValue;
  }
  const text = value === undefined ? null : formatFigure(def, value);
  return {
    def,
    value,
    baseValue,
    delta,
    text,
    deltaText: delta === undefined ? null : deltaTextFor(def, delta, text !== (baseValue === undefined ? null : formatFigure(def, baseValue))),
    presence: value !== undefined ? (baseValue !== undefined ? 'both' : 'new') : baseValue !== undefined ? 'gone' : 'neither',
  };
}

// ---------------------------------------------------------------------------------------------
// Words for the headline
// ---------------------------------------------------------------------------------------------

/** "Seed refills limit the day: 2.4 stops, 0.8 h lost." — the limiting supply named in words. */
export function limitingSupplyText(context: FigureContext): string | null {
  const { result } = context;
  if (result.acresPerDay === undefined) return null;
  const kind = result.limitingSupply;
  if (!kind) return 'No refill stops are counted: nothing runs out during the day, or no stop time is given.';
  const stops = result.stopsPerDay?.[kind] ?? 0;
  const hours = hoursLostForSupply(context, kind) ?? 0;
  return `${supplyName(kind)} refills limit the day: ${formatWithUnit(stops, 1, stops >= 0.95 && stops < 1.05 ? 'stop' : 'stops')} and ${formatWithUnit(hours, 1, 'h')} lost a day.`;
}

export type VerdictWords = { label: string; detail: string };

export const VERDICT_WORDS: Record<'ok' | 'tight' | 'over', VerdictWords> = {
  ok: { label: 'OK', detail: 'The tractor carries the planter’s hydraulic load with room to spare.' },
  tight: { label: 'Tight', detail: 'Demand is above 85 % of the tractor’s flow: little room for warm oil, a lift or the next part.' },
  over: { label: 'Over', detail: 'The tractor cannot carry this load as it stands.' },
};
