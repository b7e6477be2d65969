import { describe, expect, it } from 'vitest';
import { DEFAULT_ASSUMPTIONS, planterSizingInput } from '@shared/calc/planter-sizing';
import { computeSizing, seedSpacingIn } from '@shared/calc/sizing';
import { sizingAssumptionsQuerySchema } from '@shared/schemas/sizing-assumptions';
import {
  DEFAULT_CELLS_PER_DISC,
  changeWhatIf,
  defaultSectionRows,
  initialWhatIf,
  startWhatIf,
  storedInput,
  tractorChoices,
  whatIfInput,
  type PlanterSizingRecord,
  type SizingTractor,
  type WhatIfValues,
} from '@/features/sizing/model/planter-what-if';

const component = (over: Partial<NonNullable<PlanterSizingRecord['installs'][number]['component']>>) => ({
  name: 'Part',
  category: 'other',
  unit: 'row',
  hydraulicGpm: null,
  maxSeedsPerSecond: null,
  ratedMaxSpeedMph: null,
  ...over,
});

const smallTractor: SizingTractor = { id: 7, name: 'Row-crop tractor', hydraulicFlowGpm: 12, hydraulicPressurePsi: 2750, remoteValves: 3, ptoHp: 160 };
const bigTractor: SizingTractor = { id: 8, name: 'Big tractor', hydraulicFlowGpm: 60, hydraulicPressurePsi: 3000, remoteValves: 5, ptoHp: 300 };

/** An invented 16-row 30-in planter: central fill, two 200-gal tanks, a fan and half-width hydraulic downforce. */
function planter(over: Partial<PlanterSizingRecord> = {}): PlanterSizingRecord {
  return {
    id: 11,
    name: '16-row planter',
    accountId: 3,
    accountName: 'Invented Farms',
    maker: null,
    seedSupplyType: 'central-fill',
    rows: 16,
    rowSpacingIn: 30,
    seedCapacityUnits: 60,
    liquidTankCount: 2,
    liquidTankGallons: 200,
    dryCapacityLb: 0,
    tractorId: smallTractor.id,
    tractor: smallTractor,
    toolbars: [{ id: 1, name: 'Main bar', firstRow: 1, lastRow: 16 }],
    installs: [
      { status: 'installed', quantity: 16, component: component({ name: 'Vacuum seed meter', category: 'seed-meter', maxSeedsPerSecond: 15 }) },
      { status: 'installed', quantity: 1, component: component({ name: 'Vacuum fan', category: 'hydraulic-supply', unit: 'planter', hydraulicGpm: 8 }) },
      { status: 'installed', quantity: 8, component: component({ name: 'Hydraulic downforce', category: 'downforce', hydraulicGpm: 0.2 }) },
    ],
    ...over,
  };
}

const edit = (p: PlanterSizingRecord, change: Partial<WhatIfValues>, tractors: SizingTractor[] = [smallTractor, bigTractor]) =>
  whatIfInput(p, { ...initialWhatIf(p), ...change }, tractors);

describe('the planter as stored', () => {
  it('when nothing is changed, then the input is the server’s mapping at the default assumptions plus cells and section rows', () => {
    const p = planter();
    const input = storedInput(p);
    const server = planterSizingInput(p, DEFAULT_ASSUMPTIONS);
    expect(input).toEqual({ ...server, sectionRows: 16, cellsPerDisc: DEFAULT_CELLS_PER_DISC });
    // So every figure the server's GET answers is the same here.
    const a = computeSizing(input);
    const b = computeSizing(server);
    for (const key of ['workingWidthFt', 'effectiveCapacityAcPerHr', 'acresPerDay', 'seedSpacingIn', 'gpmPerRow', 'hydraulicHp', 'maxSpeedMph'] as const) {
      expect(a[key], key).toBe(b[key]);
    }
    expect(a.hydraulic).toEqual(b.hydraulic);
  });

  it('when row-by-row clutches are fitted, then a section starts at 1 row; otherwise at the first toolbar’s rows', () => {
    const clutches = planter({
      installs: [{ status: 'installed', quantity: 16, component: component({ name: 'Row clutch', category: 'section-control', unit: 'row' }) }],
    });
    expect(defaultSectionRows(clutches)).toBe(1);
    const split = planter({ rows: 31, toolbars: [{ id: 1, name: 'Front', firstRow: 1, lastRow: 16 }, { id: 2, name: 'Rear', firstRow: 17, lastRow: 31 }] });
    expect(defaultSectionRows(split)).toBe(16);
    const removed = planter({
      installs: [{ status: 'removed', quantity: 16, component: component({ name: 'Row clutch', category: 'section-control', unit: 'row' }) }],
    });
    expect(defaultSectionRows(removed)).toBe(16);
  });

  it('when the operation’s tractors fail to load, then the stored tractor is still offered', () => {
    expect(tractorChoices(planter(), undefined).map((t) => t.id)).toEqual([smallTractor.id]);
    expect(tractorChoices(planter(), [bigTractor, smallTractor]).map((t) => t.id)).toEqual([bigTractor.id, smallTractor.id]);
    expect(tractorChoices(planter({ tractor: null, tractorId: null }), undefined)).toEqual([]);
  });
});

describe('what-if changes', () => {
  it('when a population of "34,000" is typed, then it is read as 34,000 and seed spacing on 30-in rows is 6.1 in', () => {
    // Purdue Corn & Soybean Field Guide: 30-in rows at 34,000 → 6.1 in.
    const { input, errors } = edit(planter(), { populationPerAcre: '34,000' });
    expect(errors).toEqual({});
    expect(input!.populationPerAcre).toBe(34_000);
    expect(seedSpacingIn(input!.populationPerAcre!, input!.rowSpacingIn!)).toBeCloseTo(6.1, 1);
  });

  it('when each tank grows to 500 gal, then the planter carries 1,000 gal and one fill covers 200 ac at 5 gal/ac', () => {
    // Acres per fill = tank gallons ÷ GPA (common practice): 2 × 500 ÷ 5 = 200.
    const { input } = edit(planter(), { liquidTankGallons: '500' });
    expect(input!.tankGallons).toBe(1000);
    expect(computeSizing(input!).acresPerFill!.liquid).toBe(200);
  });

  it('when field efficiency is typed as 60 %, then the calculator gets 0.6 and the AEN-73 example holds', () => {
    // AEN-73: 12-row 30-in planter at 5 mph, 60 % → 10.9 ac/h (trade-press worked example).
    const { input } = edit(planter({ rows: 12, toolbars: [{ id: 1, name: 'Main', firstRow: 1, lastRow: 12 }] }), { fieldEfficiencyPct: '60' });
    expect(input!.fieldEfficiency).toBeCloseTo(0.6, 12);
    expect(computeSizing(input!).effectiveCapacityAcPerHr).toBeCloseTo(10.9, 1);
  });

  it('when the bigger tractor is chosen, then the hydraulic verdict goes from over to ok', () => {
    const p = planter();
    // 8 gpm fan + 8 × 0.2 gpm downforce = 9.6 gpm on a 12-gpm tractor: 80 %, ok; add a 9-gpm drive to make it over.
    const heavy = planter({
      installs: [...p.installs, { status: 'installed', quantity: 1, component: component({ name: 'Drive alternator', unit: 'planter', hydraulicGpm: 9 }) }],
    });
    expect(computeSizing(storedInput(heavy)).hydraulic!.verdict).toBe('over');
    const { input } = edit(heavy, { tractorId: String(bigTractor.id) });
    expect(input!.tractorFlowGpm).toBe(60);
    expect(computeSizing(input!).hydraulic!.verdict).toBe('ok');
  });

  it('when no tractor is chosen, then the hydraulic budget is left out but the loads stay', () => {
    const { input } = edit(planter(), { tractorId: '' });
    expect(input!.tractorFlowGpm).toBeUndefined();
    expect(input!.hydraulicLoads).toHaveLength(2);
    expect(computeSizing(input!).hydraulic).toBeUndefined();
  });

  it('when the tanks are set to 0, then the liquid figures go and a bad tank-size box no longer blocks', () => {
    const { input, errors } = edit(planter(), { liquidTankCount: '0', liquidTankGallons: 'big' });
    expect(errors).toEqual({});
    expect(input!.liquidGpa).toBeUndefined();
    expect(input!.tankGallons).toBeUndefined();
  });

  it('when tanks are added to a planter without liquid, then liquid figures appear', () => {
    const dry = planter({ liquidTankCount: 0, liquidTankGallons: 0 });
    expect(storedInput(dry).tankGallons).toBeUndefined();
    const { input } = edit(dry, { liquidTankCount: '2', liquidTankGallons: '300' });
    expect(input!.tankGallons).toBe(600);
    expect(computeSizing(input!).gpmPerRow).toBeGreaterThan(0);
  });
});

describe('what the browser refuses, as the server does', () => {
  it('when speed is words, zero or empty, then the box shows the server’s own message and no input is made', () => {
    const serverMessage = sizingAssumptionsQuerySchema.safeParse({ speedMph: 'x' }).error!.issues[0].message;
    for (const speedMph of ['fast', '0', '', '-4']) {
      const { input, errors } = edit(planter(), { speedMph });
      expect(input, speedMph).toBeNull();
      expect(errors.speedMph, speedMph).toBe(serverMessage);
    }
  });

  it('when speed is above 20 mph, then the server’s limit message shows', () => {
    expect(edit(planter(), { speedMph: '25' }).errors.speedMph).toBe('Speed must be at most 20 mph');
  });

  it('when field efficiency is above 100 %, then the message speaks in percent', () => {
    const { errors } = edit(planter(), { fieldEfficiencyPct: '150' });
    expect(errors.fieldEfficiencyPct).toMatch(/percentage above 0 and at most 100/);
  });

  it('when a section has more rows than the planter, then the calculator’s rule is shown on that box', () => {
    expect(edit(planter(), { sectionRows: '17' }).errors.sectionRows).toBe('Rows per section cannot be more than the planter’s rows');
    expect(edit(planter(), { sectionRows: '2.5' }).errors.sectionRows).toMatch(/whole number/);
  });

  it('when cells per disc, tank size or tank count are wrong, then each box names its own problem', () => {
    const { errors } = edit(planter(), { cellsPerDisc: '0', liquidTankGallons: '', liquidTankCount: '2' });
    expect(errors.cellsPerDisc).toBe('Cells per disc must be a whole number of 1 or more');
    expect(errors.liquidTankGallons).toBe('Tank size must be a number of gallons above 0');
    expect(edit(planter(), { liquidTankCount: '9' }).errors.liquidTankCount).toBe('Liquid tanks must be from 0 to 8');
  });

  it('when a tractor id is not the operation’s, then the choice is refused', () => {
    expect(edit(planter(), { tractorId: '999' }).errors.tractorId).toMatch(/tractors/);
  });

  it('when a box is refused, then the figures keep the last good input until it is fixed', () => {
    const p = planter();
    const tractors = [smallTractor, bigTractor];
    let state = startWhatIf(p);
    state = changeWhatIf(state, p, tractors, 'speedMph', '6');
    expect(state.input.speedMph).toBe(6);
    state = changeWhatIf(state, p, tractors, 'speedMph', '6x');
    expect(state.errors.speedMph).toBeDefined();
    expect(state.input.speedMph).toBe(6);
    state = changeWhatIf(state, p, tractors, 'speedMph', '7');
    expect(state.errors).toEqual({});
    expect(state.input.speedMph).toBe(7);
  });
});
