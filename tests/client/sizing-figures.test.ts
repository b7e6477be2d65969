import { describe, expect, it } from 'vitest';
import { computeSizing, sizingDelta, type SizingResult } from '@shared/calc/sizing';
import type { SizingInput } from '@shared/schemas/sizing';
import {
  AUX_PUMP_FIGURES,
  CAPACITY_FIGURES,
  HYDRAULIC_FIGURES,
  LIQUID_FIGURES,
  SEED_FIGURES,
  SUPPLY_KINDS,
  auxPumpHp,
  formatFigure,
  hoursLostForSupply,
  limitingSupplyText,
  stopFigures,
  viewFigure,
  type FigureDef,
} from '@/features/sizing/model/figures';

const byKey = (list: FigureDef[], key: string) => list.find((f) => f.key === key)!;

// An invented 16-row 30-in planter at Rowpath's default assumptions.
const base: SizingInput = {
  rows: 16,
  rowSpacingIn: 30,
  speedMph: 5,
  fieldEfficiency: 0.65,
  populationPerAcre: 32_000,
  fieldHoursPerDay: 12,
  cellsPerDisc: 40,
  meterMaxSeedsPerSecond: 15,
  seedCapacityUnits: 60,
  seedStopMinutes: 20,
  liquidGpa: 5,
  tankGallons: 400,
  liquidStopMinutes: 20,
  sectionRows: 8,
  hydraulicLoads: [
    { name: 'Vacuum fan', flowGpm: 8 },
    { name: 'Downforce', flowGpm: 1.6 },
  ],
  tractorFlowGpm: 40,
  tractorPressurePsi: 2750,
  tractorRemoteValves: 3,
};

describe('figures read from the calculator', () => {
  it('when the AEN-73 example is sized, then the capacity figures show 30.0 ft, 18.2 ac/h and 10.9 ac/h', () => {
    // Hancock, Swetnam & Benson, AEN-73 (Univ. of Kentucky 1991): 30 ft at 5 mph → 18.2 ac/h;
    // × 60 % → 10.9 ac/h (trade-press example, Progressive Forage).
    const input: SizingInput = { rows: 12, rowSpacingIn: 30, speedMph: 5, fieldEfficiency: 0.6 };
    const d = sizingDelta(input, input);
    const text = (key: string) => viewFigure(byKey(CAPACITY_FIGURES, key), d, input, input).text;
    expect(text('workingWidthFt')).toBe('30.0 ft');
    expect(text('theoreticalCapacityAcPerHr')).toBe('18.2 ac/h');
    expect(text('effectiveCapacityAcPerHr')).toBe('10.9 ac/h');
  });

  it('when 30-in rows are planted at 32,000 seeds/ac, then seed spacing shows 6.5 in', () => {
    // Purdue Corn & Soybean Field Guide: 30-in rows at 32,000 → 6.5 in.
    const d = sizingDelta(base, base);
    expect(viewFigure(byKey(SEED_FIGURES, 'seedSpacingIn'), d, base, base).text).toBe('6.5 in');
  });

  it('when 15-in rows are planted at 200,000 seeds/ac, then seeds per foot shows 5.74', () => {
    // Iowa State University, Agron 212 (Gibson 2003): 15-in rows at 200,000/ac → 5.74 seeds/ft.
    const input: SizingInput = { rowSpacingIn: 15, populationPerAcre: 200_000 };
    const d = sizingDelta(input, input);
    expect(viewFigure(byKey(SEED_FIGURES, 'seedsPerFt'), d, input, input).text).toBe('5.74 seeds/ft');
  });

  it('when an auxiliary pump of 20 gpm works at 1,500 psi, then it takes 17.5 hp', () => {
    // Standard fluid-power relation (Engineering ToolBox): 20 GPM at 1,500 psi → 17.5 hp.
    const result = { warnings: [], cautions: [], hydraulic: { recommendAuxPump: true, auxPumpGpm: 20 } } as unknown as SizingResult;
    expect(auxPumpHp({ result, input: { tractorPressurePsi: 1500 } })).toBeCloseTo(17.5, 1);
    const none = { warnings: [], cautions: [], hydraulic: { recommendAuxPump: false, auxPumpGpm: 0 } } as unknown as SizingResult;
    expect(auxPumpHp({ result: none, input: { tractorPressurePsi: 1500 } })).toBeUndefined();
  });

  it('when refills are counted, then the hours lost per supply add up to the calculator’s total', () => {
    // Same model as acresPerDay: hours lost = stops × minutes ÷ 60 for each supply (common practice).
    const result = computeSizing(base);
    const sum = SUPPLY_KINDS.reduce((s, k) => s + (hoursLostForSupply({ result, input: base }, k) ?? 0), 0);
    expect(sum).toBeCloseTo(result.hoursLostToStops!, 9);
    expect(hoursLostForSupply({ result, input: base }, 'seed')).toBeCloseTo((result.stopsPerDay!.seed! * 20) / 60, 9);
    expect(hoursLostForSupply({ result, input: base }, 'dry')).toBeUndefined();
  });

  it('when the calculator answers, then every direct figure reads the value at its own path', () => {
    const result = computeSizing(base) as unknown as Record<string, unknown>;
    const all = [...CAPACITY_FIGURES, ...SEED_FIGURES, ...LIQUID_FIGURES, ...HYDRAULIC_FIGURES, ...AUX_PUMP_FIGURES.filter((f) => f.inAnswer)];
    for (const def of all.filter((f) => f.inAnswer && f.key !== 'hydraulic.auxPumpGpm')) {
      const fromPath = def.key.split('.').reduce<unknown>((v, k) => (v as Record<string, unknown> | undefined)?.[k], result);
      expect(def.read({ result: result as unknown as SizingResult, input: base }), def.key).toBe(fromPath);
    }
  });
});

describe('changes against the planter as stored', () => {
  it('when the tank doubles, then liquid acres per fill shows "+80 ac" and the change equals sizingDelta’s', () => {
    // Acres per fill = tank gallons ÷ GPA (common practice): 400 → 80 ac, 800 → 160 ac at 5 GPA.
    const changed = { ...base, tankGallons: 800 };
    const d = sizingDelta(base, changed);
    const view = viewFigure(stopFigures('liquid').acresPerFill, d, base, changed);
    expect(view.text).toBe('160 ac');
    expect(view.delta).toBe(d.delta['acresPerFill.liquid']);
    expect(view.deltaText).toBe('+80 ac');
    expect(view.presence).toBe('both');
  });

  it('when speed rises, then acres per day gains and the derived hours lost change by their own difference', () => {
    const changed = { ...base, speedMph: 6 };
    const d = sizingDelta(base, changed);
    const acres = viewFigure(byKey(CAPACITY_FIGURES, 'acresPerDay'), d, base, changed);
    expect(acres.delta).toBeGreaterThan(0);
    expect(acres.deltaText).toMatch(/^\+\d+ ac\/day$/);
    const seedHours = viewFigure(stopFigures('seed').hoursLost, d, base, changed);
    expect(seedHours.delta).toBeCloseTo(seedHours.value! - seedHours.baseValue!, 12);
  });

  it('when nothing changes, then no change text is shown', () => {
    const d = sizingDelta(base, base);
    for (const def of CAPACITY_FIGURES) expect(viewFigure(def, d, base, base).deltaText).toBeNull();
  });

  it('when demand changes, then the share of supply shows as a percentage and its change in points', () => {
    const changed = { ...base, hydraulicLoads: [...base.hydraulicLoads!, { name: 'Drive', flowGpm: 9.6 }] };
    const d = sizingDelta(base, changed);
    const view = viewFigure(byKey(HYDRAULIC_FIGURES, 'hydraulic.utilisation'), d, base, changed);
    // 9.6 / 40 → 24 % → +24 points; 19.2 / 40 = 48 %.
    expect(view.text).toBe('48 %');
    expect(view.deltaText).toBe('+24 pts');
  });

  it('when a figure appears only in the what-if, then it is marked new; when it disappears, then it shows what it was', () => {
    const noCells = { ...base, cellsPerDisc: undefined };
    const appeared = viewFigure(byKey(SEED_FIGURES, 'meterDiscRpm'), sizingDelta(noCells, base), noCells, base);
    expect(appeared.presence).toBe('new');
    const gone = viewFigure(byKey(SEED_FIGURES, 'meterDiscRpm'), sizingDelta(base, noCells), base, noCells);
    expect(gone.presence).toBe('gone');
    expect(gone.text).toBeNull();
  });

  it('when the meter limit is shown, then it is rounded down so the screen never advises past it', () => {
    const def = byKey(SEED_FIGURES, 'maxSpeedMph');
    expect(formatFigure(def, 6.2999)).toBe('6.2 mph');
  });
});

describe('the limiting supply in words', () => {
  it('when seed refills cost the most time, then the text names seed with its stops and hours', () => {
    const input: SizingInput = { ...base, seedCapacityUnits: 10, tankGallons: 2000 };
    const result = computeSizing(input);
    expect(result.limitingSupply).toBe('seed');
    expect(limitingSupplyText({ result, input })).toMatch(/^Seed refills limit the day: \d+\.\d stops and \d+\.\d h lost a day\.$/);
  });

  it('when no supply is counted, then the text says no stops are counted; without acres per day it says nothing', () => {
    const input: SizingInput = { rows: 16, rowSpacingIn: 30, speedMph: 5, fieldEfficiency: 0.65, fieldHoursPerDay: 12 };
    expect(limitingSupplyText({ result: computeSizing(input), input })).toMatch(/^No refill stops are counted/);
    const bare: SizingInput = { rows: 16, rowSpacingIn: 30 };
    expect(limitingSupplyText({ result: computeSizing(bare), input: bare })).toBeNull();
  });
});

describe('a change too small for the figure’s precision', () => {
  it('when the shown values differ but the change rounds to nothing, then the change shows with more decimals', () => {
    // 1.56 h shows as 1.6 h and 1.53 h as 1.5 h, yet the change (−0.03 h) rounds to 0.0 h.
    const def = byKey(CAPACITY_FIGURES, 'hoursLostToStops');
    const d = { base: { warnings: [], cautions: [], hoursLostToStops: 1.56 }, changed: { warnings: [], cautions: [], hoursLostToStops: 1.53 }, delta: { hoursLostToStops: -0.03 }, onlyInBase: [], onlyInChanged: [] };
    const view = viewFigure(def, d, base, base);
    expect(view.text).toBe('1.5 h/day');
    expect(view.deltaText).toBe('−0.03 h/day');
    const same = { ...d, changed: { warnings: [], cautions: [], hoursLostToStops: 1.58 }, delta: { hoursLostToStops: 0.02 } };
    expect(viewFigure(def, same, base, base).deltaText).toBeNull();
  });
});
