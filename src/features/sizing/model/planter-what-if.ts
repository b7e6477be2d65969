/**
 * The planter panel's what-if: the boxes a specialist edits (as typed text), turned into the
 * calculator's input with the same shared mapping the server uses for GET /api/planters/:id/sizing,
 * and checked with the same shared schemas, so the browser refuses what the server would refuse.
 */
import { DEFAULT_ASSUMPTIONS, planterSizingInput, type PlanterForSizing, type SizingAssumptions } from '@shared/calc/planter-sizing';
import { planterSchema } from '@shared/schemas/fleet';
import { sizingInputSchema, type SizingInput } from '@shared/schemas/sizing';
import { sizingAssumptionsQuerySchema } from '@shared/schemas/sizing-assumptions';
import { numberText, parseNumberText } from './format';

export interface SizingTractor {
  id: number;
  name: string;
  hydraulicFlowGpm: number;
  hydraulicPressurePsi: number;
  remoteValves: number;
  ptoHp?: number | null;
}

/** GET /api/planters/:id, the parts the Sizing panel reads. */
export interface PlanterSizingRecord extends PlanterForSizing {
  id: number;
  name: string;
  accountId: number;
  accountName: string;
  maker: string | null;
  seedSupplyType: 'row-hoppers' | 'central-fill';
  tractorId: number | null;
  tractor: (SizingTractor & { name: string }) | null;
  toolbars: { id: number; name: string; firstRow: number; lastRow: number }[];
}

export interface WhatIfValues {
  speedMph: string;
  populationPerAcre: string;
  /** Typed as a percentage (65), sent to the calculator as a fraction (0.65). */
  fieldEfficiencyPct: string;
  fieldHoursPerDay: string;
  cellsPerDisc: string;
  seedCapacityUnits: string;
  seedStopMinutes: string;
  liquidTankCount: string;
  liquidTankGallons: string;
  liquidGpa: string;
  liquidStopMinutes: string;
  sectionRows: string;
  dryLbPerAcre: string;
  dryStopMinutes: string;
  /** A tractor id, or '' for none. */
  tractorId: string;
}

export type WhatIfField = keyof WhatIfValues;
export type WhatIfErrors = Partial<Record<WhatIfField, string>>;

/**
 * Cells on a common corn seed disc (memory): the catalog does not record discs, so the box
 * starts here for the specialist to set to the disc fitted.
 */
export const DEFAULT_CELLS_PER_DISC = 40;

/**
 * Rows per liquid section to start from: 1 when row-by-row clutches are fitted (each row its
 * own section), otherwise the first toolbar's rows (one section valve per toolbar).
 */
export function defaultSectionRows(planter: Pick<PlanterSizingRecord, 'rows' | 'installs' | 'toolbars'>): number {
  const rowByRow = planter.installs.some((i) => i.status === 'installed' && i.component?.category === 'section-control' && i.component.unit === 'row');
  if (rowByRow) return 1;
  const bar = planter.toolbars[0];
  const barRows = bar ? bar.lastRow - bar.firstRow + 1 : planter.rows;
  return Math.max(1, Math.min(planter.rows, barRows));
}

/** The boxes as they start: the planter as stored, with Rowpath's default assumptions. */
export function initialWhatIf(planter: PlanterSizingRecord): WhatIfValues {
  const a = DEFAULT_ASSUMPTIONS;
  return {
    speedMph: numberText(a.speedMph),
    populationPerAcre: numberText(a.populationPerAcre),
    fieldEfficiencyPct: numberText(a.fieldEfficiency * 100),
    fieldHoursPerDay: numberText(a.fieldHoursPerDay),
    cellsPerDisc: numberText(DEFAULT_CELLS_PER_DISC),
    seedCapacityUnits: numberText(planter.seedCapacityUnits),
    seedStopMinutes: numberText(a.seedStopMinutes),
    liquidTankCount: numberText(planter.liquidTankCount),
    liquidTankGallons: numberText(planter.liquidTankGallons),
    liquidGpa: numberText(a.liquidGpa),
    liquidStopMinutes: numberText(a.liquidStopMinutes),
    sectionRows: numberText(defaultSectionRows(planter)),
    dryLbPerAcre: numberText(a.dryLbPerAcre),
    dryStopMinutes: numberText(a.dryStopMinutes),
    tractorId: planter.tractorId ? String(planter.tractorId) : '',
  };
}

/** Which boxes count for this planter: liquid only with tanks, dry only with a dry box, seed stops only with seed capacity. */
export function relevantFields(planter: Pick<PlanterSizingRecord, 'dryCapacityLb'>, values: WhatIfValues): Record<WhatIfField, boolean> {
  const tanks = parseNumberText(values.liquidTankCount);
  const liquid = tanks !== undefined && tanks > 0;
  const seedUnits = parseNumberText(values.seedCapacityUnits);
  return {
    speedMph: true,
    populationPerAcre: true,
    fieldEfficiencyPct: true,
    fieldHoursPerDay: true,
    cellsPerDisc: true,
    seedCapacityUnits: true,
    seedStopMinutes: seedUnits !== undefined,
    liquidTankCount: true,
    liquidTankGallons: liquid,
    liquidGpa: liquid,
    liquidStopMinutes: liquid,
    sectionRows: liquid,
    dryLbPerAcre: planter.dryCapacityLb > 0,
    dryStopMinutes: planter.dryCapacityLb > 0,
    tractorId: true,
  };
}

const EFFICIENCY_MESSAGE = 'Field efficiency must be a percentage above 0 and at most 100 (65 % is typical for a planter)';

/** The calculator's field names → the box that carries them (per-tank gallons, efficiency as %). */
const SCHEMA_TO_FIELD: Record<string, WhatIfField> = {
  speedMph: 'speedMph',
  populationPerAcre: 'populationPerAcre',
  fieldEfficiency: 'fieldEfficiencyPct',
  fieldHoursPerDay: 'fieldHoursPerDay',
  liquidGpa: 'liquidGpa',
  dryLbPerAcre: 'dryLbPerAcre',
  seedStopMinutes: 'seedStopMinutes',
  liquidStopMinutes: 'liquidStopMinutes',
  dryStopMinutes: 'dryStopMinutes',
  sectionRows: 'sectionRows',
  cellsPerDisc: 'cellsPerDisc',
  tankGallons: 'liquidTankGallons',
  seedCapacityUnits: 'seedCapacityUnits',
};

export interface WhatIfOutcome {
  /** null while any box holds something the server would refuse. */
  input: SizingInput | null;
  errors: WhatIfErrors;
}

/** The text the query string would carry: separators dropped, so "32,000" reads as 32000. */
function queryText(text: string): string {
  return text.replace(/[,\s]/g, '');
}

/**
 * Checks the boxes with the server's own schemas and builds the calculator input.
 * Assumptions are checked as GET /api/planters/:id/sizing checks its query string; the planter
 * changes (tanks, seed capacity, cells, section rows) as POST /api/sizing and PUT /api/planters
 * check theirs.
 */
export function whatIfInput(planter: PlanterSizingRecord, values: WhatIfValues, tractors: readonly SizingTractor[]): WhatIfOutcome {
  const errors: WhatIfErrors = {};
  const relevant = relevantFields(planter, values);
  const put = (field: WhatIfField | undefined, message: string) => {
    if (field && relevant[field] && !errors[field]) errors[field] = message;
  };

  // Assumptions, as the query string: strings the schema coerces. Irrelevant boxes are left
  // out, so their defaults apply and a hidden box never blocks the figures.
  const efficiencyPct = parseNumberText(values.fieldEfficiencyPct);
  const query: Record<string, string | undefined> = {
    speedMph: queryText(values.speedMph),
    populationPerAcre: queryText(values.populationPerAcre),
    fieldEfficiency: efficiencyPct === undefined ? '' : Number.isNaN(efficiencyPct) ? 'not a number' : String(efficiencyPct / 100),
    fieldHoursPerDay: queryText(values.fieldHoursPerDay),
    liquidGpa: relevant.liquidGpa ? queryText(values.liquidGpa) : undefined,
    dryLbPerAcre: relevant.dryLbPerAcre ? queryText(values.dryLbPerAcre) : undefined,
    seedStopMinutes: relevant.seedStopMinutes ? queryText(values.seedStopMinutes) : undefined,
    liquidStopMinutes: relevant.liquidStopMinutes ? queryText(values.liquidStopMinutes) : undefined,
    dryStopMinutes: relevant.dryStopMinutes ? queryText(values.dryStopMinutes) : undefined,
  };
  const assumptions = sizingAssumptionsQuerySchema.safeParse(query);
  if (!assumptions.success) {
    for (const issue of assumptions.error.issues) {
      const field = SCHEMA_TO_FIELD[String(issue.path[0])];
      put(field, field === 'fieldEfficiencyPct' ? EFFICIENCY_MESSAGE : issue.message);
    }
  }

  // Planter changes, as the calculator body checks them (sectionRows against the planter's rows).
  const sectionRows = relevant.sectionRows ? parseNumberText(values.sectionRows) : undefined;
  const cellsPerDisc = parseNumberText(values.cellsPerDisc);
  const seedCapacityUnits = parseNumberText(values.seedCapacityUnits);
  const tankGallons = relevant.liquidTankGallons ? (parseNumberText(values.liquidTankGallons) ?? Number.NaN) : undefined;
  const body = sizingInputSchema.safeParse({ rows: planter.rows, sectionRows, cellsPerDisc, tankGallons, seedCapacityUnits });
  if (!body.success) {
    for (const issue of body.error.issues) put(SCHEMA_TO_FIELD[String(issue.path[0])], issue.message);
  }

  // Tank count, as the planter record checks it.
  const tankCount = parseNumberText(values.liquidTankCount) ?? 0;
  const tanks = planterSchema.shape.liquidTankCount.safeParse(tankCount);
  if (!tanks.success) put('liquidTankCount', tanks.error.issues[0]?.message ?? 'Liquid tanks must be a whole number from 0 to 8');

  const tractor = values.tractorId === '' ? null : tractors.find((t) => String(t.id) === values.tractorId);
  if (tractor === undefined) put('tractorId', 'Choose one of this operation’s tractors, or none');

  if (Object.keys(errors).length > 0 || !assumptions.success || !body.success || !tanks.success || tractor === undefined) {
    return { input: null, errors };
  }

  const changedPlanter: PlanterForSizing = {
    ...planter,
    seedCapacityUnits: seedCapacityUnits ?? null,
    liquidTankCount: tanks.data,
    liquidTankGallons: tanks.data > 0 ? (tankGallons ?? 0) : 0,
    tractor: tractor && {
      name: tractor.name,
      hydraulicFlowGpm: tractor.hydraulicFlowGpm,
      hydraulicPressurePsi: tractor.hydraulicPressurePsi,
      remoteValves: tractor.remoteValves,
    },
  };
  const chosen: SizingAssumptions = { ...assumptions.data, ...(sectionRows !== undefined ? { sectionRows } : {}) };
  const input = planterSizingInput(changedPlanter, chosen);
  if (cellsPerDisc !== undefined) input.cellsPerDisc = cellsPerDisc;
  return { input, errors };
}

/** The planter as stored, sized with the starting boxes: what every what-if is compared with. */
export function storedInput(planter: PlanterSizingRecord): SizingInput {
  const tractors = planter.tractor && planter.tractorId ? [{ ...planter.tractor, id: planter.tractorId }] : [];
  const { input } = whatIfInput(planter, initialWhatIf(planter), tractors);
  if (!input) throw new Error('The stored planter could not be sized with the default assumptions');
  return input;
}

/** The tractors to choose from: the account's, with the planter's own first even if the list failed to load. */
export function tractorChoices(planter: PlanterSizingRecord, accountTractors: readonly SizingTractor[] | undefined): SizingTractor[] {
  const list = [...(accountTractors ?? [])];
  if (planter.tractor && planter.tractorId && !list.some((t) => t.id === planter.tractorId)) {
    list.unshift({ ...planter.tractor, id: planter.tractorId });
  }
  return list;
}

// ---------------------------------------------------------------------------------------------
// The panel's state: what is typed, and the last input that passed the checks
// ---------------------------------------------------------------------------------------------

export interface WhatIfState {
  values: WhatIfValues;
  errors: WhatIfErrors;
  /** The figures keep showing this while a box is being corrected. */
  input: SizingInput;
}

export function startWhatIf(planter: PlanterSizingRecord): WhatIfState {
  return { values: initialWhatIf(planter), errors: {}, input: storedInput(planter) };
}

/** One box changed: check everything again, keep the last good input when the new one is refused. */
export function changeWhatIf(
  state: WhatIfState,
  planter: PlanterSizingRecord,
  tractors: readonly SizingTractor[],
  field: WhatIfField,
  text: string,
): WhatIfState {
  const values = { ...state.values, [field]: text };
  const outcome = whatIfInput(planter, values, tractors);
  return { values, errors: outcome.errors, input: outcome.input ?? state.input };
}
