import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  AUX_PUMP_RESERVE,
  CAUTIONS,
  acresPerDay,
  acresPerDryFill,
  acresPerFill,
  computeSizing,
  effectiveCapacityAcPerHr,
  gpaFromGpm,
  gpmPerRow,
  gpmPerSection,
  hydraulicBudget,
  hydraulicHp,
  maxSpeedMphForMeter,
  meterDiscRpm,
  seedAcresPerFill,
  seedSpacingIn,
  seedsPerFt,
  seedsPerSecondPerRow,
  sizingDelta,
  theoreticalCapacityAcPerHr,
  whatIf,
  whatIfSeedFill,
  whatIfSpeedMph,
  whatIfTankGallons,
  workingWidthFt,
  type Supply,
} from '@shared/calc/sizing';
import { sizingInputSchema, type SizingInput } from '@shared/schemas/sizing';

/** Relative closeness for property tests, where values span several orders of magnitude. */
function expectRelClose(actual: number, expected: number, rel = 1e-9): void {
  expect(Math.abs(actual - expected)).toBeLessThanOrEqual(rel * Math.abs(expected));
}

describe('working width and field capacity', () => {
  it('when a planter has 16 rows at 30 in, then it works 40 ft', () => {
    // common practice: working width = rows × row spacing (16 × 30 in = 40 ft)
    expect(workingWidthFt(16, 30)).toBe(40);
  });

  it('when 30 ft runs at 5 mph, then theoretical capacity is 18.2 ac/h', () => {
    // Hancock, Swetnam & Benson, AEN-73, Univ. of Kentucky 1991: ac/h = ft × mph / 8.25
    expect(theoreticalCapacityAcPerHr(30, 5)).toBeCloseTo(18.2, 1);
  });

  it('when a 12-row 30-in planter runs at 5 mph at 60 % efficiency, then it covers 10.9 ac/h', () => {
    // AEN-73 formula; worked example from "Farm field equipment efficiency versus capacity" (Progressive Forage)
    const widthFt = workingWidthFt(12, 30);
    expect(widthFt).toBe(30);
    expect(effectiveCapacityAcPerHr(theoreticalCapacityAcPerHr(widthFt, 5), 0.6)).toBeCloseTo(10.9, 1);
  });

  it('when field efficiency is above 1 or speed is 0, then the computation refuses it', () => {
    // guard: a planter cannot cover more than its theoretical capacity (AEN-73 definition)
    expect(() => effectiveCapacityAcPerHr(18, 1.2)).toThrow(RangeError);
    expect(() => theoreticalCapacityAcPerHr(30, 0)).toThrow(RangeError);
    expect(() => workingWidthFt(Number.NaN, 30)).toThrow(RangeError);
  });

  it('when speed doubles, then theoretical capacity doubles (property)', () => {
    // AEN-73: capacity is proportional to speed
    fc.assert(
      fc.property(fc.double({ min: 1, max: 200, noNaN: true }), fc.double({ min: 0.5, max: 20, noNaN: true }), (widthFt, speedMph) => {
        expectRelClose(theoreticalCapacityAcPerHr(widthFt, 2 * speedMph), 2 * theoreticalCapacityAcPerHr(widthFt, speedMph));
      }),
    );
  });
});

describe('seed spacing, seeds per foot and the meter', () => {
  it('when 30-in rows are planted at 30,000, 32,000 and 34,000, then spacing is 7.0, 6.5 and 6.1 in', () => {
    // Purdue University, Corn & Soybean Field Guide (as quoted by Indiana Prairie Farmer, 2015)
    expect(seedSpacingIn(30_000, 30)).toBeCloseTo(7.0, 1);
    expect(seedSpacingIn(32_000, 30)).toBeCloseTo(6.5, 1);
    expect(seedSpacingIn(34_000, 30)).toBeCloseTo(6.1, 1);
  });

  it('when 15-in rows are planted at 32,000, then spacing is 13.1 in', () => {
    // Purdue University, Corn & Soybean Field Guide
    expect(seedSpacingIn(32_000, 15)).toBeCloseTo(13.1, 1);
  });

  it('when 15-in rows are planted at 200,000 seeds/ac, then each foot of row holds 5.74 seeds', () => {
    // Iowa State University, Agron 212, "Calculations: seeds per row" (L. Gibson, 2003)
    expect(seedsPerFt(200_000, 15)).toBeCloseTo(5.74, 2);
  });

  it('when spacing, population and row width are multiplied, then the product is always 6,272,640 (property)', () => {
    // Purdue University, Corn & Soybean Field Guide: spacing in = 6,272,640 / (row in × seeds/ac)
    fc.assert(
      fc.property(
        fc.double({ min: 1_000, max: 400_000, noNaN: true }),
        fc.double({ min: 5, max: 60, noNaN: true }),
        (populationPerAcre, rowSpacingIn) => {
          expectRelClose(seedSpacingIn(populationPerAcre, rowSpacingIn) * populationPerAcre * rowSpacingIn, 6_272_640);
          // Iowa State Agron 212 and the Purdue guide agree: seeds per foot × inches per seed = 12
          expectRelClose(seedsPerFt(populationPerAcre, rowSpacingIn) * seedSpacingIn(populationPerAcre, rowSpacingIn), 12);
        },
      ),
    );
  });

  it('when 30-in rows at 32,000 run at 5 mph, then each row places about 13.5 seeds/s', () => {
    // Iowa State Agron 212 seeds/ft (1.84) × 5 mph in ft/s (5 × 5,280 / 3,600 = 7.33): unit conversion
    expect(seedsPerSecondPerRow(32_000, 30, 5)).toBeCloseTo(13.47, 2);
  });

  it('when a 40-cell disc places 13.47 seeds/s, then it turns about 20.2 rpm', () => {
    // one seed per cell: rpm = seeds/s × 60 / cells (common practice)
    expect(meterDiscRpm(seedsPerSecondPerRow(32_000, 30, 5), 40)).toBeCloseTo(20.2, 1);
  });

  it('when a meter is rated to 5 mph at 32,000, then it holds 4 mph at 40,000', () => {
    // Rowpath's stated assumption: the meter's limit is a seed rate, so speed × population is constant
    expect(maxSpeedMphForMeter({ populationPerAcre: 40_000, rowSpacingIn: 30, meterRatedMaxSpeedMph: 5, ratedAtPopulationPerAcre: 32_000 })).toBeCloseTo(4, 10);
  });

  it('when a meter is limited to the seed rate it reaches at 5 mph, then its top speed is 5 mph', () => {
    // Iowa State Agron 212 seeds/ft with mph → ft/s; the limit inverts seedsPerSecondPerRow
    const limit = seedsPerSecondPerRow(34_000, 30, 5);
    expect(maxSpeedMphForMeter({ populationPerAcre: 34_000, rowSpacingIn: 30, meterMaxSeedsPerSecond: limit })).toBeCloseTo(5, 10);
  });

  it('when both a seed-rate ceiling and a rated speed are given, then the lower speed governs', () => {
    // Rowpath's choice: the stricter rating wins
    const ceiling = seedsPerSecondPerRow(32_000, 30, 8); // would allow 8 mph
    const mph = maxSpeedMphForMeter({
      populationPerAcre: 32_000,
      rowSpacingIn: 30,
      meterMaxSeedsPerSecond: ceiling,
      meterRatedMaxSpeedMph: 6,
      ratedAtPopulationPerAcre: 32_000,
    });
    expect(mph).toBeCloseTo(6, 10);
  });

  it('when a meter has no rating, then the top speed cannot be computed', () => {
    // guard: no rating, no answer
    expect(() => maxSpeedMphForMeter({ populationPerAcre: 32_000, rowSpacingIn: 30 })).toThrow(RangeError);
    expect(() => maxSpeedMphForMeter({ populationPerAcre: 32_000, rowSpacingIn: 30, meterRatedMaxSpeedMph: 6 })).toThrow(RangeError);
  });
});

describe('liquid and dry product', () => {
  it('when 0.5 GPM per row flows at 5 mph on 30-in rows, then the rate is 19.8 GPA, and back', () => {
    // UF/IFAS EDIS WG013 eq. 1: GPA = 5,940 × GPM / (mph × W); Univ. of Missouri G1270a: W = row spacing for row rates
    expect(gpaFromGpm(0.5, 5, 30)).toBeCloseTo(19.8, 10);
    expect(gpmPerRow(19.8, 5, 30)).toBeCloseTo(0.5, 10);
  });

  it('when 5 GPA in-furrow is applied at 6 mph on 30-in rows, then each row needs about 0.152 GPM', () => {
    // UF/IFAS EDIS WG013 eq. 1 rearranged: GPM = GPA × mph × W / 5,940 = 5 × 6 × 30 / 5,940 (Missouri G1270a, W = row spacing)
    expect(gpmPerRow(5, 6, 30)).toBeCloseTo(0.1515, 4);
  });

  it('when GPA becomes GPM and back, then the input returns (property)', () => {
    // UF/IFAS EDIS WG013 eq. 1 is its own inverse
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 100, noNaN: true }),
        fc.double({ min: 0.5, max: 20, noNaN: true }),
        fc.double({ min: 5, max: 60, noNaN: true }),
        (gpa, speedMph, rowSpacingIn) => {
          expectRelClose(gpaFromGpm(gpmPerRow(gpa, speedMph, rowSpacingIn), speedMph, rowSpacingIn), gpa);
        },
      ),
    );
  });

  it('when a section holds 8 rows at 0.15 GPM, then its valve passes 1.2 GPM', () => {
    // common practice: section flow = rows × flow per row
    expect(gpmPerSection(0.15, 8)).toBeCloseTo(1.2, 10);
  });

  it('when a 300-gal tank applies 5 GPA, then it covers 60 ac a fill; a 3,000-lb box at 150 lb/ac covers 20 ac', () => {
    // common practice: acres per fill = tank gallons / GPA; dry = tank pounds / lb per acre
    expect(acresPerFill(300, 5)).toBe(60);
    expect(acresPerDryFill(3_000, 150)).toBe(20);
  });

  it('when the planter carries 12 corn units at 34,000 seeds/ac, then one fill covers about 28.2 ac', () => {
    // common practice: a corn unit is 80,000 seeds; 12 × 80,000 / 34,000 = 28.24
    expect(seedAcresPerFill({ seedCapacityUnits: 12, populationPerAcre: 34_000 })).toBeCloseTo(28.24, 2);
    // common practice (memory): a soybean unit is 140,000 seeds, passed explicitly
    expect(seedAcresPerFill({ seedCapacityUnits: 12, seedsPerUnit: 140_000, populationPerAcre: 140_000 })).toBe(12);
  });
});

describe('hydraulics', () => {
  it('when 20 GPM flows at 1,500 psi, then it carries 17.5 hp', () => {
    // standard fluid-power relation (Engineering ToolBox, "Hydraulic pumps — horsepower"): hp = GPM × psi / 1,714
    expect(hydraulicHp(20, 1_500)).toBeCloseTo(17.5, 1);
  });

  it('when the pump is 85 % efficient, then the input power is the hydraulic power / 0.85', () => {
    // Engineering ToolBox: divide by pump efficiency for input power (17.50 / 0.85 = 20.6 hp)
    expect(hydraulicHp(20, 1_500, 0.85)).toBeCloseTo(20.6, 1);
    expect(() => hydraulicHp(20, 1_500, 0)).toThrow(RangeError);
  });

  const tractor = { hydraulicFlowGpm: 40, pressurePsi: 3_000, remoteValves: 4 };

  it('when loads use 75 % of the flow on enough remotes, then the budget is ok', () => {
    // Rowpath's own threshold: tight above 85 % of supply
    const budget = hydraulicBudget({
      loads: [
        { name: 'Vacuum fan', flowGpm: 18, pressurePsi: 2_000 },
        { name: 'Downforce', flowGpm: 6 },
        { name: 'Row drives', flowGpm: 6 },
      ],
      tractor,
    });
    expect(budget.demandGpm).toBe(30);
    expect(budget.marginGpm).toBe(10);
    expect(budget.utilisation).toBeCloseTo(0.75, 10);
    expect(budget.remotesNeeded).toBe(3);
    expect(budget.verdict).toBe('ok');
    expect(budget.recommendAuxPump).toBe(false);
    expect(budget.auxPumpGpm).toBe(0);
    expect(budget.reasons).toEqual([]);
    // Engineering ToolBox relation: 18 × 2,000 / 1,714 + 12 × 3,000 / 1,714 = 42.0 hp
    expect(budget.hydraulicHpDemand).toBeCloseTo(42.0, 1);
  });

  it('when loads use exactly 85 % of the flow, then the budget is still ok; at 87.5 % it is tight', () => {
    // Rowpath's own threshold: "tight" strictly above 85 %
    const at85 = hydraulicBudget({ loads: [{ name: 'Vacuum fan', flowGpm: 34 }], tractor });
    expect(at85.verdict).toBe('ok');
    const at875 = hydraulicBudget({ loads: [{ name: 'Vacuum fan', flowGpm: 35 }], tractor });
    expect(at875.verdict).toBe('tight');
    expect(at875.recommendAuxPump).toBe(false);
    expect(at875.reasons.join(' ')).toMatch(/88 %/);
  });

  it('when loads need more flow than the tractor supplies, then it is over and an auxiliary pump is sized with its reserve', () => {
    // common practice: an auxiliary PTO pump when demand exceeds what the tractor's remotes supply
    const budget = hydraulicBudget({
      loads: [
        { name: 'Vacuum fan', flowGpm: 30 },
        { name: 'Downforce', flowGpm: 10 },
        { name: 'Row drives', flowGpm: 5 },
      ],
      tractor,
    });
    expect(budget.verdict).toBe('over');
    expect(budget.marginGpm).toBe(-5);
    expect(budget.recommendAuxPump).toBe(true);
    expect(budget.auxPumpGpm).toBeCloseTo(5 * (1 + AUX_PUMP_RESERVE), 10);
    expect(budget.auxPumpGpm).toBeCloseTo(5.75, 10);
    expect(budget.reasons[0]).toMatch(/5\.0 gpm short/);
  });

  it('when loads need more circuits than the tractor has remotes, then it is over and the pump carries the smallest extra circuits', () => {
    // common practice: too few remotes is also a reason for an auxiliary pump
    const budget = hydraulicBudget({
      loads: [
        { name: 'Vacuum fan', flowGpm: 12, circuit: 'A' },
        { name: 'Fill fan', flowGpm: 3, circuit: 'A' },
        { name: 'Downforce', flowGpm: 6, circuit: 'B' },
        { name: 'Row drives', flowGpm: 4, circuit: 'C' },
        { name: 'Marker', flowGpm: 2 },
      ],
      tractor: { hydraulicFlowGpm: 40, pressurePsi: 3_000, remoteValves: 3 },
    });
    expect(budget.remotesNeeded).toBe(4);
    expect(budget.remotesAvailable).toBe(3);
    expect(budget.verdict).toBe('over');
    expect(budget.recommendAuxPump).toBe(true);
    // the smallest extra circuit is the 2-gpm marker: 2 × 1.15
    expect(budget.auxPumpGpm).toBeCloseTo(2.3, 10);
  });

  it('when a load needs more pressure than the tractor delivers, then it is over, with the load named', () => {
    // the tractor's relief pressure caps what any remote can deliver (standard fluid-power practice)
    const budget = hydraulicBudget({
      loads: [{ name: 'Lift assist', flowGpm: 5, pressurePsi: 3_200 }],
      tractor,
    });
    expect(budget.verdict).toBe('over');
    expect(budget.recommendAuxPump).toBe(false);
    expect(budget.reasons.join(' ')).toMatch(/Lift assist needs 3,200 psi/);
  });
});

describe('acres per day with refill stops', () => {
  const effCap = effectiveCapacityAcPerHr(theoreticalCapacityAcPerHr(30, 5), 0.6); // 10.9 ac/h (AEN-73 example)

  it('when there are no refill stops, then acres per day is effective capacity × field hours', () => {
    // AEN-73 effective capacity × hours; 10.91 × 12 = 130.9 ac
    const day = acresPerDay({ effectiveCapacityAcPerHr: effCap, fieldHoursPerDay: 12, supplies: [] });
    expect(day.acresPerDay).toBeCloseTo(130.9, 1);
    expect(day.hoursLostToStops).toBe(0);
    expect(day.limitingSupply).toBeNull();
  });

  it('when a 100-ac liquid fill takes 30 min, then working hours plus stops fill the 12-h day', () => {
    // common practice: extra tank capacity helps only through fewer stops; A = 12 / (1/10.91 + 0.5/100) = 124.1 ac
    const day = acresPerDay({
      effectiveCapacityAcPerHr: effCap,
      fieldHoursPerDay: 12,
      supplies: [{ kind: 'liquid', acresPerFill: 100, stopMinutes: 30 }],
    });
    expect(day.acresPerDay).toBeCloseTo(124.1, 1);
    expect(day.stopsPerDay[0]).toBeCloseTo(1.241, 3);
    expect(day.acresPerDay / effCap + day.hoursLostToStops).toBeCloseTo(12, 10);
    expect(day.limitingSupply).toBe('liquid');
    expect(day.byKind.liquid?.hoursLostToStops).toBeCloseTo(0.62, 2);
  });

  it('when seed refills cost more time than liquid ones, then seed is the limiting supply', () => {
    // Rowpath's model: the supply losing the most hours limits the day
    const day = acresPerDay({
      effectiveCapacityAcPerHr: effCap,
      fieldHoursPerDay: 12,
      supplies: [
        { kind: 'liquid', acresPerFill: 100, stopMinutes: 20 },
        { kind: 'seed', acresPerFill: 28, stopMinutes: 15 },
      ],
    });
    expect(day.limitingSupply).toBe('seed');
    expect(day.stopsPerDay).toHaveLength(2);
    expect(day.byKind.seed!.hoursLostToStops).toBeGreaterThan(day.byKind.liquid!.hoursLostToStops);
  });

  const supplyArb: fc.Arbitrary<Supply> = fc.record({
    kind: fc.constantFrom('seed' as const, 'liquid' as const, 'dry' as const),
    acresPerFill: fc.double({ min: 1, max: 1_000, noNaN: true }),
    stopMinutes: fc.double({ min: 1, max: 90, noNaN: true }),
  });

  it('when refill stops are modelled, then acres per day never exceeds effective capacity × field hours (property)', () => {
    // AEN-73: effective capacity × hours is the ceiling; stops only take time away
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 150, noNaN: true }),
        fc.double({ min: 1, max: 24, noNaN: true }),
        fc.array(supplyArb, { maxLength: 4 }),
        (cap, hours, supplies) => {
          const day = acresPerDay({ effectiveCapacityAcPerHr: cap, fieldHoursPerDay: hours, supplies });
          expect(day.acresPerDay).toBeLessThanOrEqual(cap * hours * (1 + 1e-12));
          expectRelClose(day.acresPerDay / cap + day.hoursLostToStops, hours, 1e-9);
        },
      ),
    );
  });

  it('when any tank grows, then acres per day rises (property)', () => {
    // common practice: a bigger tank means fewer refill stops, hence more acres
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 150, noNaN: true }),
        fc.double({ min: 1, max: 24, noNaN: true }),
        fc.array(supplyArb, { minLength: 1, maxLength: 4 }),
        fc.nat(),
        fc.double({ min: 1.01, max: 10, noNaN: true }),
        (cap, hours, supplies, pick, growth) => {
          const index = pick % supplies.length;
          const bigger = supplies.map((s, i) => (i === index ? { ...s, acresPerFill: s.acresPerFill * growth } : s));
          const before = acresPerDay({ effectiveCapacityAcPerHr: cap, fieldHoursPerDay: hours, supplies }).acresPerDay;
          const after = acresPerDay({ effectiveCapacityAcPerHr: cap, fieldHoursPerDay: hours, supplies: bigger }).acresPerDay;
          expect(after).toBeGreaterThan(before);
        },
      ),
    );
  });
});

describe('computeSizing', () => {
  const fullBody: SizingInput = {
    rows: 16,
    rowSpacingIn: 30,
    speedMph: 5,
    fieldEfficiency: 0.6,
    populationPerAcre: 32_000,
    cellsPerDisc: 40,
    meterMaxSeedsPerSecond: 20,
    liquidGpa: 5,
    tankGallons: 500,
    liquidStopMinutes: 30,
    dryCapacityLb: 3_000,
    dryLbPerAcre: 150,
    dryStopMinutes: 20,
    seedCapacityUnits: 40,
    seedStopMinutes: 25,
    fieldHoursPerDay: 12,
    sectionRows: 4,
    hydraulicLoads: [
      { name: 'Vacuum fan', flowGpm: 20, pressurePsi: 1_500 },
      { name: 'Downforce', flowGpm: 6, pressurePsi: 2_000 },
    ],
    tractorFlowGpm: 40,
    tractorPressurePsi: 3_000,
    tractorRemoteValves: 3,
  };

  it('when the body is empty, then no figure is answered and no caution is given', () => {
    // Rowpath's contract: only figures whose inputs are given
    expect(computeSizing({})).toEqual({ warnings: [], cautions: [] });
  });

  it('when only rows and spacing are given, then only the working width is answered, with the toolbar caution', () => {
    // common practice: 16 × 30 in = 40 ft
    const answer = computeSizing({ rows: 16, rowSpacingIn: 30 });
    expect(answer.workingWidthFt).toBe(40);
    expect(answer.theoreticalCapacityAcPerHr).toBeUndefined();
    expect(answer.seedSpacingIn).toBeUndefined();
    expect(answer.acresPerDay).toBeUndefined();
    expect(answer.cautions).toEqual([...CAUTIONS.raisedToolbar]);
  });

  it('when every field is given, then every figure agrees with its own function', () => {
    // each figure is the published relation above: AEN-73, Purdue, Iowa State Agron 212, UF/IFAS WG013, fluid-power hp
    const a = computeSizing(fullBody);
    expect(a.workingWidthFt).toBe(40);
    expect(a.theoreticalCapacityAcPerHr).toBeCloseTo(24.2, 1); // AEN-73: 40 × 5 / 8.25 = 24.24
    expect(a.effectiveCapacityAcPerHr).toBeCloseTo(14.5, 1);
    expect(a.seedSpacingIn).toBeCloseTo(6.5, 1); // Purdue: 30-in rows at 32,000
    expect(a.seedsPerFt).toBeCloseTo(1.84, 2); // Iowa State Agron 212 formula
    expect(a.seedsPerSecondPerRow).toBeCloseTo(13.47, 2);
    expect(a.meterDiscRpm).toBeCloseTo(20.2, 1);
    expect(a.maxSpeedMph).toBeCloseTo(maxSpeedMphForMeter({ populationPerAcre: 32_000, rowSpacingIn: 30, meterMaxSeedsPerSecond: 20 }), 10);
    expect(a.gpmPerRow).toBeCloseTo(gpmPerRow(5, 5, 30), 10);
    expect(a.gpmPerSection).toBeCloseTo(4 * gpmPerRow(5, 5, 30), 10);
    expect(a.gpmTotal).toBeCloseTo(16 * gpmPerRow(5, 5, 30), 10);
    expect(a.acresPerFill).toEqual({ seed: 100, liquid: 100, dry: 20 });
    const expected = acresPerDay({
      effectiveCapacityAcPerHr: a.effectiveCapacityAcPerHr!,
      fieldHoursPerDay: 12,
      supplies: [
        { kind: 'seed', acresPerFill: 100, stopMinutes: 25 },
        { kind: 'liquid', acresPerFill: 100, stopMinutes: 30 },
        { kind: 'dry', acresPerFill: 20, stopMinutes: 20 },
      ],
    });
    expect(a.acresPerDay).toBeCloseTo(expected.acresPerDay, 10);
    expect(a.limitingSupply).toBe('dry');
    expect(a.hydraulicHp).toBeCloseTo((20 * 1_500 + 6 * 2_000) / 1_714, 10); // Engineering ToolBox relation
    expect(a.hydraulic?.verdict).toBe('ok');
    expect(a.warnings).toEqual([]);
    expect(a.cautions).toEqual([...CAUTIONS.hydraulic, ...CAUTIONS.starter, ...CAUTIONS.raisedToolbar]);
  });

  it('when the speed is above the meter limit, then a warning says how fast it may go', () => {
    // Rowpath's meter assumption: 13.47 seeds/s at 5 mph; a 12 seeds/s limit allows 4.455 mph
    const a = computeSizing({ rowSpacingIn: 30, populationPerAcre: 32_000, speedMph: 5, meterMaxSeedsPerSecond: 12 });
    expect(a.maxSpeedMph).toBeCloseTo(4.455, 3);
    expect(a.warnings).toHaveLength(1);
    // the advised speed is rounded down, never up past the limit
    expect(a.warnings[0]).toMatch(/slow to 4\.4 mph/);
    expect(computeSizing({ rowSpacingIn: 30, populationPerAcre: 32_000, speedMph: 4, meterMaxSeedsPerSecond: 12 }).warnings).toEqual([]);
  });

  it('when a tank is given without a refill time, then acres per day leaves it out and says so', () => {
    // Rowpath's contract: a missing input is reported, not guessed
    const a = computeSizing({ rows: 12, rowSpacingIn: 30, speedMph: 5, fieldEfficiency: 0.6, fieldHoursPerDay: 12, liquidGpa: 5, tankGallons: 300 });
    expect(a.acresPerFill).toEqual({ liquid: 60 });
    expect(a.acresPerDay).toBeCloseTo(130.9, 1); // AEN-73 10.9 ac/h × 12 h, no stops counted
    expect(a.limitingSupply).toBeNull();
    expect(a.warnings.join(' ')).toMatch(/Liquid refills are not counted/);
    expect(a.cautions).toEqual([...CAUTIONS.starter, ...CAUTIONS.raisedToolbar]);
  });

  it('when tractor figures are missing, then hydraulic hp is answered but not the budget', () => {
    // Engineering ToolBox relation needs flow and pressure only; the budget needs the tractor
    const a = computeSizing({ hydraulicLoads: [{ name: 'Vacuum fan', flowGpm: 20, pressurePsi: 1_500 }] });
    expect(a.hydraulicHp).toBeCloseTo(17.5, 1);
    expect(a.hydraulic).toBeUndefined();
    expect(a.cautions).toEqual([...CAUTIONS.hydraulic, ...CAUTIONS.raisedToolbar]);
  });

  it('when computing, then cautions are in Rowpath words covering leaks, pressure relief, manuals, PPE, label and blocking', () => {
    // safety content required of Rowpath (common practice)
    const text = computeSizing(fullBody).cautions.join(' ');
    expect(text).toMatch(/never feel/i);
    expect(text).toMatch(/relieve pressure/i);
    expect(text).toMatch(/manuals/i);
    expect(text).toMatch(/protective gear/i);
    expect(text).toMatch(/label/i);
    expect(text).toMatch(/block the frame/i);
  });
});

describe('what if', () => {
  const base: SizingInput = {
    rows: 16,
    rowSpacingIn: 30,
    speedMph: 5,
    fieldEfficiency: 0.6,
    fieldHoursPerDay: 12,
    populationPerAcre: 34_000,
    seedCapacityUnits: 16,
    seedStopMinutes: 30,
    liquidGpa: 5,
    tankGallons: 300,
    liquidStopMinutes: 30,
  };

  it('when the tank grows from 300 to 600 gal, then acres per fill doubles and acres per day rises', () => {
    // common practice: acres per fill = gallons / GPA; more capacity only saves stops
    const d = whatIfTankGallons(base, 600);
    expect(d.delta['acresPerFill.liquid']).toBeCloseTo(60, 10);
    expect(d.delta.acresPerDay).toBeGreaterThan(0);
    expect(d.delta.acresPerDay).toBeCloseTo(d.changed.acresPerDay! - d.base.acresPerDay!, 10);
    expect(d.delta['stopsPerDay.liquid']).toBeLessThan(0);
    expect(d.delta.workingWidthFt).toBe(0);
  });

  it('when speed rises from 5 to 6 mph, then capacity rises by a fifth', () => {
    // AEN-73: capacity proportional to speed
    const d = whatIfSpeedMph(base, 6);
    expect(d.delta.theoreticalCapacityAcPerHr).toBeCloseTo(d.base.theoreticalCapacityAcPerHr! / 5, 10);
    expect(d.delta.acresPerDay).toBeGreaterThan(0);
  });

  it('when hoppers give way to central fill with more seed and quicker stops, then seed stops fall', () => {
    // common practice: a central-fill system carries more seed per fill
    const d = whatIfSeedFill(base, { seedCapacityUnits: 50, seedStopMinutes: 15 });
    expect(d.delta['acresPerFill.seed']).toBeGreaterThan(0);
    expect(d.delta['stopsPerDay.seed']).toBeLessThan(0);
    expect(d.delta.acresPerDay).toBeGreaterThan(0);
  });

  it('when a change adds a figure, then it is listed as only in the changed answer', () => {
    // Rowpath's contract: a delta exists only where both answers have the figure
    const d = whatIf({ rows: 16, rowSpacingIn: 30 }, { speedMph: 5 });
    expect(d.onlyInChanged).toContain('theoreticalCapacityAcPerHr');
    expect(d.delta.theoreticalCapacityAcPerHr).toBeUndefined();
    expect(sizingDelta(base, base).delta.acresPerDay).toBe(0);
  });
});

describe('sizingInputSchema', () => {
  const pathsOf = (body: unknown): string[] => {
    const parsed = sizingInputSchema.safeParse(body);
    return parsed.success ? [] : parsed.error.issues.map((issue) => issue.path.join('.'));
  };
  const messageFor = (body: unknown, path: string): string | undefined => {
    const parsed = sizingInputSchema.safeParse(body);
    return parsed.success ? undefined : parsed.error.issues.find((issue) => issue.path.join('.') === path)?.message;
  };

  it('when the body is empty or complete and sound, then it passes', () => {
    // Rowpath's contract: every field optional
    expect(sizingInputSchema.safeParse({}).success).toBe(true);
    const parsed = sizingInputSchema.safeParse({
      rows: 24,
      rowSpacingIn: 30,
      speedMph: 6,
      fieldEfficiency: 1,
      hydraulicLoads: [{ name: 'Vacuum fan', flowGpm: 20, circuit: 'A' }],
      tractorRemoteValves: 4,
    });
    expect(parsed.success).toBe(true);
  });

  it('when rows is 0 or 97, then it fails on rows with a plain message', () => {
    // Rowpath's bound: 1 to 96 rows
    expect(pathsOf({ rows: 0 })).toEqual(['rows']);
    expect(pathsOf({ rows: 97 })).toEqual(['rows']);
    expect(pathsOf({ rows: 12.5 })).toEqual(['rows']);
    expect(messageFor({ rows: 97 }, 'rows')).toBe('Rows must be a whole number from 1 to 96');
  });

  it('when a number is zero, negative, not a number or not finite, then it fails on that field', () => {
    // Rowpath's contract: finite numbers above 0
    expect(pathsOf({ speedMph: 0 })).toEqual(['speedMph']);
    expect(pathsOf({ rowSpacingIn: -30 })).toEqual(['rowSpacingIn']);
    expect(pathsOf({ liquidGpa: 'five' })).toEqual(['liquidGpa']);
    expect(pathsOf({ tankGallons: Number.POSITIVE_INFINITY })).toEqual(['tankGallons']);
    expect(pathsOf({ populationPerAcre: Number.NaN })).toEqual(['populationPerAcre']);
    expect(messageFor({ speedMph: 0 }, 'speedMph')).toBe('Speed must be a number of miles per hour above 0');
    expect(messageFor({ liquidGpa: 'five' }, 'liquidGpa')).toBe('Liquid rate must be a number of gallons per acre above 0');
  });

  it('when field efficiency is above 1 or 0, then it fails on fieldEfficiency', () => {
    // AEN-73: efficiency is a fraction of theoretical capacity
    expect(pathsOf({ fieldEfficiency: 1.2 })).toEqual(['fieldEfficiency']);
    expect(pathsOf({ fieldEfficiency: 0 })).toEqual(['fieldEfficiency']);
    expect(messageFor({ fieldEfficiency: 65 }, 'fieldEfficiency')).toMatch(/at most 1/);
  });

  it('when counts are fractional or zero, then they fail with the field path', () => {
    // Rowpath's contract: counts are whole numbers
    expect(pathsOf({ cellsPerDisc: 40.5 })).toEqual(['cellsPerDisc']);
    expect(pathsOf({ tractorRemoteValves: 0 })).toEqual(['tractorRemoteValves']);
    expect(pathsOf({ sectionRows: 97 })).toEqual(['sectionRows']);
  });

  it('when a hydraulic load is bad, then the failure points inside the list', () => {
    // Rowpath's contract: each load needs a name and a positive flow
    expect(pathsOf({ hydraulicLoads: [{ name: 'Fan', flowGpm: -1 }] })).toEqual(['hydraulicLoads.0.flowGpm']);
    expect(pathsOf({ hydraulicLoads: [{ name: '  ', flowGpm: 5 }] })).toEqual(['hydraulicLoads.0.name']);
  });

  it('when a section has more rows than the planter, then it fails on sectionRows', () => {
    // common practice: a section is part of the toolbar
    expect(pathsOf({ rows: 12, sectionRows: 16 })).toEqual(['sectionRows']);
  });
});
