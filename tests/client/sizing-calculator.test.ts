import { describe, expect, it } from 'vitest';
import { computeSizing } from '@shared/calc/sizing';
import { sizingInputSchema } from '@shared/schemas/sizing';
import {
  CALCULATOR_EXAMPLE,
  calculatorInput,
  changeCalculator,
  emptyLoad,
  startCalculator,
  type CalculatorValues,
} from '@/features/sizing/model/calculator-form';

const blank: CalculatorValues = {
  ...(Object.fromEntries(Object.keys(CALCULATOR_EXAMPLE).map((k) => [k, ''])) as unknown as CalculatorValues),
  hydraulicLoads: [],
};

describe('the explicit calculator', () => {
  it('when the example is used, then it passes the server’s schema and every headline figure is answered', () => {
    const { input, errors } = calculatorInput(CALCULATOR_EXAMPLE);
    expect(errors).toEqual({});
    expect(sizingInputSchema.safeParse(input).success).toBe(true);
    const result = computeSizing(input!);
    expect(result.acresPerDay).toBeGreaterThan(0);
    expect(result.hydraulic?.verdict).toBeDefined();
    expect(result.meterDiscRpm).toBeGreaterThan(0);
    expect(result.gpmPerSection).toBeGreaterThan(0);
  });

  it('when the AEN-73 example is entered, then effective capacity is 10.9 ac/h', () => {
    // AEN-73 (Univ. of Kentucky 1991) formula; 12 rows × 30 in at 5 mph and 60 % → 10.9 ac/h (Progressive Forage example).
    const { input } = calculatorInput({ ...blank, rows: '12', rowSpacingIn: '30', speedMph: '5', fieldEfficiencyPct: '60' });
    expect(computeSizing(input!).effectiveCapacityAcPerHr).toBeCloseTo(10.9, 1);
  });

  it('when boxes are empty, then they are left out, as the API leaves out omitted figures', () => {
    const { input } = calculatorInput({ ...blank, rowSpacingIn: '30', populationPerAcre: '32000' });
    expect(input).toEqual({ rowSpacingIn: 30, populationPerAcre: 32_000 });
    expect(computeSizing(input!).workingWidthFt).toBeUndefined();
  });

  it('when rows, spacing, speed, efficiency and population are bad, then the same five fields are named as the API names', () => {
    // The API test posts rows 97, spacing 0, speed −3, efficiency 1.2 and population "lots" and expects these five fields.
    const { input, errors } = calculatorInput({ ...blank, rows: '97', rowSpacingIn: '0', speedMph: '-3', fieldEfficiencyPct: '120', populationPerAcre: 'lots' });
    expect(input).toBeNull();
    expect(Object.keys(errors).sort()).toEqual(['fieldEfficiencyPct', 'populationPerAcre', 'rowSpacingIn', 'rows', 'speedMph']);
    expect(errors.rows).toBe('Rows must be a whole number from 1 to 96');
    expect(errors.fieldEfficiencyPct).toMatch(/percentage/);
  });

  it('when a load row is blank it is ignored, and when one is half filled the message points at its own row', () => {
    const loads = [{ name: 'Fan', flowGpm: '8', pressurePsi: '', circuit: '' }, emptyLoad(), { name: 'Drive', flowGpm: 'x', pressurePsi: '', circuit: '' }];
    const { errors } = calculatorInput({ ...blank, hydraulicLoads: loads });
    expect(errors).toEqual({ 'hydraulicLoads.2.flowGpm': 'Load flow must be a number of gallons per minute above 0' });
    const ok = calculatorInput({ ...blank, hydraulicLoads: [loads[0], emptyLoad()] });
    expect(ok.input!.hydraulicLoads).toEqual([{ name: 'Fan', flowGpm: 8 }]);
  });

  it('when loads share a circuit, then they take one remote valve', () => {
    const loads = [
      { name: 'Fan', flowGpm: '8', pressurePsi: '', circuit: 'A' },
      { name: 'Drive', flowGpm: '6', pressurePsi: '2500', circuit: 'A' },
    ];
    const { input } = calculatorInput({ ...blank, tractorFlowGpm: '40', tractorPressurePsi: '2750', tractorRemoteValves: '2', hydraulicLoads: loads });
    expect(computeSizing(input!).hydraulic!.remotesNeeded).toBe(1);
  });

  it('when a section has more rows than the planter, then the calculator’s rule is shown', () => {
    expect(calculatorInput({ ...blank, rows: '8', sectionRows: '12' }).errors.sectionRows).toBe('Rows per section cannot be more than the planter’s rows');
  });

  it('when a box is refused, then the last good input stays, and the comparison base is not moved by changes', () => {
    let state = startCalculator();
    const base = state.baseInput;
    state = changeCalculator(state, { ...state.values, speedMph: '7' });
    expect(state.input.speedMph).toBe(7);
    state = changeCalculator(state, { ...state.values, speedMph: 'seven' });
    expect(state.input.speedMph).toBe(7);
    expect(state.errors.speedMph).toBe('Speed must be a number of miles per hour above 0');
    expect(state.baseInput).toBe(base);
  });
});
