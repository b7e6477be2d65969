// Depreciation and remaining value of planter parts: what a part is still worth when a roadmap
// removes it (superseded) or strands it (left on a replaced toolbar). Pure: numbers in, numbers out.

/** How the roadmap values a part that leaves the planter before the end of its life. */
export type ValuationMethod = 'straight-line' | 'remaining-value';

/** Coefficients of the remaining-value curve RV % = 100 × (C1 − C2 √age − C3 √hoursPerYear)². */
export interface RemainingValueCoefficients {
  c1: number;
  c2: number;
  c3: number;
}

/**
 * Row-crop planter coefficients of the ASABE D497 remaining-value table.
 * (memory, confirm before relying on them)
 */
export const ROW_CROP_PLANTER_RV_COEFFICIENTS: Readonly<RemainingValueCoefficients> = Object.freeze({
  c1: 0.883,
  c2: 0.078,
  c3: 0,
});

function assertFiniteNonNegative(name: string, value: number): void {
  if (!Number.isFinite(value) || value < 0) throw new RangeError(`${name} must be a finite number ≥ 0 (got ${value})`);
}

/** Straight-line depreciation per year: (cost − salvage) / life. */
export function straightLinePerYearUsd(costUsd: number, salvageUsd: number, lifeYears: number): number {
  assertFiniteNonNegative('costUsd', costUsd);
  assertFiniteNonNegative('salvageUsd', salvageUsd);
  if (!Number.isFinite(lifeYears) || lifeYears <= 0) throw new RangeError(`lifeYears must be > 0 (got ${lifeYears})`);
  return (costUsd - salvageUsd) / lifeYears;
}

/** Book value after ageYears of straight-line depreciation; never below salvage. */
export function straightLineValueUsd(costUsd: number, salvageUsd: number, lifeYears: number, ageYears: number): number {
  assertFiniteNonNegative('ageYears', ageYears);
  const perYearUsd = straightLinePerYearUsd(costUsd, salvageUsd, lifeYears);
  return Math.max(salvageUsd, costUsd - perYearUsd * ageYears);
}

/**
 * Remaining value as a percentage of list price: 100 × (C1 − C2 √age − C3 √hoursPerYear)².
 * Clamped to 0–100 %: past the curve's minimum the square would rise again, which means nothing.
 */
export function remainingValuePct(ageYears: number, hoursPerYear: number, coefficients: RemainingValueCoefficients): number {
  assertFiniteNonNegative('ageYears', ageYears);
  assertFiniteNonNegative('hoursPerYear', hoursPerYear);
  const root = coefficients.c1 - coefficients.c2 * Math.sqrt(ageYears) - coefficients.c3 * Math.sqrt(hoursPerYear);
  if (root <= 0) return 0;
  return Math.min(100, 100 * root * root);
}

/** A part as bought: what was paid, when, and how long it is expected to last. */
export interface PartValueBasis {
  pricePaidUsd: number;
  installedSeason: number;
  expectedLifeYears: number;
}

export interface RemainingValueOptions {
  coefficients?: RemainingValueCoefficients;
  hoursPerYear?: number;
}

/**
 * What a part is still worth at `atSeason` (a planting year). A part at or past its expected life
 * is worth nothing to the roadmap: removing it then wastes nothing.
 * - 'straight-line': price paid less (price / life) per year, no salvage (retrofit parts are not resold).
 * - 'remaining-value': price paid × the remaining-value curve at the part's age (planter coefficients unless given).
 */
export function remainingValueUsd(
  part: PartValueBasis,
  atSeason: number,
  method: ValuationMethod,
  options: RemainingValueOptions = {},
): number {
  assertFiniteNonNegative('pricePaidUsd', part.pricePaidUsd);
  const ageYears = atSeason - part.installedSeason;
  if (ageYears < 0) throw new RangeError(`atSeason ${atSeason} is before the install season ${part.installedSeason}`);
  if (ageYears >= part.expectedLifeYears) return 0;
  if (method === 'straight-line') {
    return straightLineValueUsd(part.pricePaidUsd, 0, part.expectedLifeYears, ageYears);
  }
  const pct = remainingValuePct(ageYears, options.hoursPerYear ?? 0, options.coefficients ?? ROW_CROP_PLANTER_RV_COEFFICIENTS);
  return (part.pricePaidUsd * pct) / 100;
}
