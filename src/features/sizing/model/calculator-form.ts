/**
 * The explicit Sizing calculator (no stored planter): every box of POST /api/sizing as typed
 * text, checked with the same shared schema the server uses. An empty box leaves its figure out,
 * as the API does.
 */
import { sizingInputSchema, type SizingInput } from '@shared/schemas/sizing';
import { DEFAULT_ASSUMPTIONS } from '@shared/calc/planter-sizing';
import { numberText, parseNumberText } from './format';

export const CALCULATOR_NUMBER_FIELDS = [
  'rows',
  'rowSpacingIn',
  'speedMph',
  'fieldEfficiencyPct',
  'populationPerAcre',
  'cellsPerDisc',
  'meterMaxSeedsPerSecond',
  'fieldHoursPerDay',
  'seedCapacityUnits',
  'seedsPerUnit',
  'seedStopMinutes',
  'liquidGpa',
  'tankGallons',
  'liquidStopMinutes',
  'sectionRows',
  'dryCapacityLb',
  'dryLbPerAcre',
  'dryStopMinutes',
  'tractorFlowGpm',
  'tractorPressurePsi',
  'tractorRemoteValves',
] as const;

export type CalculatorNumberField = (typeof CALCULATOR_NUMBER_FIELDS)[number];

export interface LoadValues {
  name: string;
  flowGpm: string;
  pressurePsi: string;
  circuit: string;
}

export type CalculatorValues = Record<CalculatorNumberField, string> & { hydraulicLoads: LoadValues[] };

/** Field messages keyed by box: "speedMph", "hydraulicLoads.1.flowGpm", "hydraulicLoads". */
export type CalculatorErrors = Record<string, string>;

export const emptyLoad = (): LoadValues => ({ name: '', flowGpm: '', pressurePsi: '', circuit: '' });

/**
 * The calculator starts on an invented example, so every figure shows at once: a 16-row 30-in
 * planter with central-fill seed, two 200-gal tanks, a vacuum fan and hydraulic downforce, on a
 * 45-gpm tractor with 4 remotes. Assumptions are Rowpath's defaults.
 */
export const CALCULATOR_EXAMPLE: CalculatorValues = {
  rows: '16',
  rowSpacingIn: '30',
  speedMph: numberText(DEFAULT_ASSUMPTIONS.speedMph),
  fieldEfficiencyPct: numberText(DEFAULT_ASSUMPTIONS.fieldEfficiency * 100),
  populationPerAcre: numberText(DEFAULT_ASSUMPTIONS.populationPerAcre),
  cellsPerDisc: '40',
  meterMaxSeedsPerSecond: '15',
  fieldHoursPerDay: numberText(DEFAULT_ASSUMPTIONS.fieldHoursPerDay),
  seedCapacityUnits: '60',
  seedsPerUnit: '80000',
  seedStopMinutes: numberText(DEFAULT_ASSUMPTIONS.seedStopMinutes),
  liquidGpa: numberText(DEFAULT_ASSUMPTIONS.liquidGpa),
  tankGallons: '400',
  liquidStopMinutes: numberText(DEFAULT_ASSUMPTIONS.liquidStopMinutes),
  sectionRows: '8',
  dryCapacityLb: '',
  dryLbPerAcre: '',
  dryStopMinutes: '',
  tractorFlowGpm: '45',
  tractorPressurePsi: '2750',
  tractorRemoteValves: '4',
  hydraulicLoads: [
    { name: 'Vacuum fan', flowGpm: '8', pressurePsi: '', circuit: '' },
    { name: 'Hydraulic downforce', flowGpm: '3.2', pressurePsi: '', circuit: '' },
    { name: 'Row drive alternator', flowGpm: '9', pressurePsi: '', circuit: '' },
  ],
};

const EFFICIENCY_MESSAGE = 'Field efficiency must be a percentage above 0 and at most 100 (65 % is typical for a planter)';

export interface CalculatorOutcome {
  input: SizingInput | null;
  errors: CalculatorErrors;
}

function isBlankLoad(load: LoadValues): boolean {
  return !load.name.trim() && !load.flowGpm.trim() && !load.pressurePsi.trim() && !load.circuit.trim();
}

/** Turns the boxes into the POST /api/sizing body and checks it with the server's schema. */
export function calculatorInput(values: CalculatorValues): CalculatorOutcome {
  const body: Record<string, unknown> = {};
  for (const field of CALCULATOR_NUMBER_FIELDS) {
    const value = parseNumberText(values[field]);
    if (value === undefined) continue;
    if (field === 'fieldEfficiencyPct') body.fieldEfficiency = value / 100;
    else body[field] = value;
  }
  // Blank load rows are ignored; a row with anything in it must be complete.
  const loads = values.hydraulicLoads
    .map((load, index) => ({ load, index }))
    .filter(({ load }) => !isBlankLoad(load));
  if (loads.length > 0) {
    body.hydraulicLoads = loads.map(({ load }) => {
      const pressurePsi = parseNumberText(load.pressurePsi);
      return {
        name: load.name,
        flowGpm: parseNumberText(load.flowGpm) ?? Number.NaN,
        ...(pressurePsi !== undefined ? { pressurePsi } : {}),
        ...(load.circuit.trim() ? { circuit: load.circuit } : {}),
      };
    });
  }

  const parsed = sizingInputSchema.safeParse(body);
  if (parsed.success) return { input: parsed.data, errors: {} };

  const errors: CalculatorErrors = {};
  for (const issue of parsed.error.issues) {
    const [head, index, leaf] = issue.path;
    let key: string;
    if (head === 'fieldEfficiency') key = 'fieldEfficiencyPct';
    else if (head === 'hydraulicLoads' && typeof index === 'number') {
      // Point at the row as the person sees it, blank rows included.
      key = `hydraulicLoads.${loads[index]?.index ?? index}.${String(leaf ?? 'name')}`;
    } else key = String(head);
    if (!errors[key]) errors[key] = head === 'fieldEfficiency' ? EFFICIENCY_MESSAGE : issue.message;
  }
  return { input: null, errors };
}

// ---------------------------------------------------------------------------------------------
// The page's state: what is typed, the last input that passed, and the figures compared with
// ---------------------------------------------------------------------------------------------

export interface CalculatorState {
  values: CalculatorValues;
  errors: CalculatorErrors;
  /** The figures keep showing this while a box is being corrected. */
  input: SizingInput;
  /** What the changes are measured against; "Compare with these" pins the current input. */
  baseInput: SizingInput;
}

export function startCalculator(values: CalculatorValues = CALCULATOR_EXAMPLE): CalculatorState {
  const { input } = calculatorInput(values);
  const safe = input ?? {};
  return { values, errors: {}, input: safe, baseInput: safe };
}

/** Any change to the boxes (a number, a load added or removed): check again, keep the last good input. */
export function changeCalculator(state: CalculatorState, values: CalculatorValues): CalculatorState {
  const outcome = calculatorInput(values);
  return { ...state, values, errors: outcome.errors, input: outcome.input ?? state.input };
}
