import { describe, expect, it } from 'vitest';
import {
  remainingValuePct,
  remainingValueUsd,
  ROW_CROP_PLANTER_RV_COEFFICIENTS,
  straightLinePerYearUsd,
  straightLineValueUsd,
} from '@shared/calc/depreciation';

describe('straight-line depreciation', () => {
  it('when a $130,000 machine with 23 % of a $150,000 list as salvage lasts 15 years, then it loses $6,367 a year', () => {
    // Iowa State University, Ag Decision Maker A3-29, "Estimating Farm Machinery Costs": (130,000 − 34,500) / 15 = $6,367.
    const salvageUsd = 0.23 * 150_000;
    expect(salvageUsd).toBeCloseTo(34_500, 6);
    expect(straightLinePerYearUsd(130_000, salvageUsd, 15)).toBeCloseTo(6_367, 0);
  });

  it('when the same machine is 15 years old or older, then its book value stays at the salvage value', () => {
    // Iowa State University, Ag Decision Maker A3-29: depreciation stops at salvage value.
    expect(straightLineValueUsd(130_000, 34_500, 15, 15)).toBeCloseTo(34_500, 6);
    expect(straightLineValueUsd(130_000, 34_500, 15, 20)).toBeCloseTo(34_500, 6);
    // Iowa State University, Ag Decision Maker A3-29: after one year, 130,000 − 6,367 ≈ 123,633.
    expect(straightLineValueUsd(130_000, 34_500, 15, 1)).toBeCloseTo(123_633, 0);
  });

  it('when the life is zero or negative, then the calculation refuses it', () => {
    // common practice: a machine has a positive life.
    expect(() => straightLinePerYearUsd(1_000, 0, 0)).toThrow(RangeError);
  });
});

describe('remaining value (machinery curve)', () => {
  // ASABE D497 remaining-value table, row-crop planter C1 0.883, C2 0.078, C3 0
  // (memory, confirm before relying on them). Printed to 0.1 %: test within 0.05.
  it.each([
    [1, 64.8],
    [5, 50.2],
    [10, 40.5],
  ])('when a row-crop planter is %i years old, then it keeps %f %% of list', (ageYears, pct) => {
    expect(Math.abs(remainingValuePct(ageYears, 0, ROW_CROP_PLANTER_RV_COEFFICIENTS) - pct)).toBeLessThan(0.05);
  });

  it('when hours per year weigh in (C3 > 0), then the value is lower than with C3 = 0', () => {
    // ASABE D497 remaining-value formula, RV = 100 (C1 − C2 √age − C3 √h)² (memory, confirm before relying on them).
    const withHours = remainingValuePct(5, 100, { c1: 0.883, c2: 0.078, c3: 0.01 });
    expect(withHours).toBeCloseTo(100 * (0.883 - 0.078 * Math.sqrt(5) - 0.01 * 10) ** 2, 9);
    expect(withHours).toBeLessThan(remainingValuePct(5, 100, ROW_CROP_PLANTER_RV_COEFFICIENTS));
  });

  it('when the curve would pass its minimum, then the value is 0 % rather than rising again', () => {
    // common practice: remaining value never rises with age.
    expect(remainingValuePct(200, 0, ROW_CROP_PLANTER_RV_COEFFICIENTS)).toBe(0);
  });
});

describe('remaining value of a part at a season', () => {
  const part = { pricePaidUsd: 10_000, installedSeason: 2024, expectedLifeYears: 10 };

  it('when valued straight-line, then a part 4 of 10 years old keeps 60 % of what was paid', () => {
    // Iowa State University, Ag Decision Maker A3-29 straight-line method with no salvage: 10,000 − 4 × 1,000.
    expect(remainingValueUsd(part, 2028, 'straight-line')).toBeCloseTo(6_000, 6);
  });

  it('when valued by the remaining-value curve, then a 5-year-old part keeps 50.2 % of what was paid', () => {
    // ASABE D497 row-crop planter, age 5: 50.2 % (memory, confirm before relying on them).
    expect(remainingValueUsd(part, 2029, 'remaining-value')).toBeCloseTo(5_020, -1);
  });

  it('when a part has reached its expected life, then removing it wastes nothing under either method', () => {
    // common practice: a part at the end of its life has nothing left to waste.
    expect(remainingValueUsd(part, 2034, 'straight-line')).toBe(0);
    expect(remainingValueUsd(part, 2034, 'remaining-value')).toBe(0);
  });

  it('when the season is before the install, then it is refused', () => {
    // common practice: a part cannot be valued before it exists.
    expect(() => remainingValueUsd(part, 2023, 'straight-line')).toThrow(RangeError);
  });
});
