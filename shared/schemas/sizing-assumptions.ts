import { z } from 'zod';
import { DEFAULT_ASSUMPTIONS } from '../calc/planter-sizing.js';

const positive = (message: string) => z.coerce.number({ error: message }).gt(0, message).finite(message);

/** Query string of GET /api/planters/:id/sizing: the assumptions, each with its default. */
export const sizingAssumptionsQuerySchema = z.object({
  speedMph: positive('Speed must be a number of miles per hour above 0').max(20, 'Speed must be at most 20 mph').default(DEFAULT_ASSUMPTIONS.speedMph),
  populationPerAcre: positive('Population must be a number of seeds per acre above 0').max(400_000).default(DEFAULT_ASSUMPTIONS.populationPerAcre),
  fieldEfficiency: positive('Field efficiency must be a fraction above 0 and at most 1').max(1, 'Field efficiency must be a fraction above 0 and at most 1').default(DEFAULT_ASSUMPTIONS.fieldEfficiency),
  fieldHoursPerDay: positive('Field hours must be above 0').max(24, 'Field hours must be at most 24').default(DEFAULT_ASSUMPTIONS.fieldHoursPerDay),
  liquidGpa: positive('Liquid rate must be above 0').default(DEFAULT_ASSUMPTIONS.liquidGpa),
  dryLbPerAcre: positive('Dry rate must be above 0').default(DEFAULT_ASSUMPTIONS.dryLbPerAcre),
  seedStopMinutes: positive('Seed refill time must be above 0').default(DEFAULT_ASSUMPTIONS.seedStopMinutes),
  liquidStopMinutes: positive('Liquid refill time must be above 0').default(DEFAULT_ASSUMPTIONS.liquidStopMinutes),
  dryStopMinutes: positive('Dry refill time must be above 0').default(DEFAULT_ASSUMPTIONS.dryStopMinutes),
  sectionRows: z.coerce.number().int('Rows per section must be a whole number').min(1).max(96).optional(),
});
