import { z } from 'zod';

/**
 * The request body of the planter-sizing calculator. Every field is optional: the calculator
 * answers only the figures whose inputs are present. Numbers must be finite and above zero.
 */

/** A finite number above zero; one English message for every way it can be wrong. */
function positiveNumber(message: string) {
  return z.number({ error: message }).gt(0, { error: message });
}

/** A whole number from `min` to `max`. */
function wholeNumber(message: string, min = 1, max = Number.MAX_SAFE_INTEGER) {
  return z
    .number({ error: message })
    .int({ error: message })
    .min(min, { error: message })
    .max(max, { error: message });
}

/** Most planters built today stay at or below 96 rows; the same bound caps a section. */
const MAX_ROWS = 96;

export const hydraulicLoadSchema = z.object({
  name: z
    .string({ error: 'Each hydraulic load needs a name' })
    .trim()
    .min(1, { error: 'Each hydraulic load needs a name' })
    .max(80, { error: 'A hydraulic load name must be 80 characters or fewer' }),
  flowGpm: positiveNumber('Load flow must be a number of gallons per minute above 0'),
  pressurePsi: positiveNumber('Load pressure must be a number of psi above 0').optional(),
  circuit: z
    .string({ error: 'Circuit must be text naming the remote valve the load shares' })
    .trim()
    .min(1, { error: 'Circuit must be text naming the remote valve the load shares' })
    .max(80, { error: 'A circuit name must be 80 characters or fewer' })
    .optional(),
});

export const sizingInputSchema = z
  .object({
    rows: wholeNumber(`Rows must be a whole number from 1 to ${MAX_ROWS}`, 1, MAX_ROWS).optional(),
    rowSpacingIn: positiveNumber('Row spacing must be a number of inches above 0').optional(),
    speedMph: positiveNumber('Speed must be a number of miles per hour above 0').optional(),
    fieldEfficiency: z
      .number({ error: 'Field efficiency must be a fraction above 0 and at most 1 (0.65 = 65 %)' })
      .gt(0, { error: 'Field efficiency must be a fraction above 0 and at most 1 (0.65 = 65 %)' })
      .lte(1, { error: 'Field efficiency must be a fraction above 0 and at most 1 (0.65 = 65 %)' })
      .optional(),
    populationPerAcre: positiveNumber('Population must be a number of seeds per acre above 0').optional(),
    cellsPerDisc: wholeNumber('Cells per disc must be a whole number of 1 or more').optional(),
    meterMaxSeedsPerSecond: positiveNumber(
      'Meter limit must be a number of seeds per second above 0',
    ).optional(),
    liquidGpa: positiveNumber('Liquid rate must be a number of gallons per acre above 0').optional(),
    tankGallons: positiveNumber('Tank size must be a number of gallons above 0').optional(),
    liquidStopMinutes: positiveNumber('Liquid refill time must be a number of minutes above 0').optional(),
    dryCapacityLb: positiveNumber('Dry box capacity must be a number of pounds above 0').optional(),
    dryLbPerAcre: positiveNumber('Dry rate must be a number of pounds per acre above 0').optional(),
    dryStopMinutes: positiveNumber('Dry refill time must be a number of minutes above 0').optional(),
    seedCapacityUnits: positiveNumber('Seed capacity must be a number of seed units above 0').optional(),
    seedsPerUnit: wholeNumber('Seeds per unit must be a whole number of 1 or more').optional(),
    seedStopMinutes: positiveNumber('Seed refill time must be a number of minutes above 0').optional(),
    fieldHoursPerDay: z
      .number({ error: 'Field hours per day must be a number above 0 and at most 24' })
      .gt(0, { error: 'Field hours per day must be a number above 0 and at most 24' })
      .lte(24, { error: 'Field hours per day must be a number above 0 and at most 24' })
      .optional(),
    sectionRows: wholeNumber(
      `Rows per section must be a whole number from 1 to ${MAX_ROWS}`,
      1,
      MAX_ROWS,
    ).optional(),
    hydraulicLoads: z
      .array(hydraulicLoadSchema, { error: 'Hydraulic loads must be a list' })
      .max(32, { error: 'List at most 32 hydraulic loads' })
      .optional(),
    tractorFlowGpm: positiveNumber('Tractor flow must be a number of gallons per minute above 0').optional(),
    tractorPressurePsi: positiveNumber('Tractor pressure must be a number of psi above 0').optional(),
    tractorRemoteValves: wholeNumber('Remote valves must be a whole number of 1 or more').optional(),
  })
  .superRefine((body, ctx) => {
    // A section cannot hold more rows than the planter has.
    if (body.rows !== undefined && body.sectionRows !== undefined && body.sectionRows > body.rows) {
      ctx.addIssue({
        code: 'custom',
        path: ['sectionRows'],
        message: 'Rows per section cannot be more than the planter’s rows',
      });
    }
  });

export type SizingInput = z.infer<typeof sizingInputSchema>;
export type HydraulicLoadInput = z.infer<typeof hydraulicLoadSchema>;
