import { z } from 'zod';

export const accountStatuses = ['active', 'prospect', 'inactive'] as const;
export type AccountStatus = (typeof accountStatuses)[number];
export const crops = ['corn', 'soybean', 'sorghum', 'wheat', 'sunflower', 'cotton'] as const;
export type Crop = (typeof crops)[number];
export type AcresByCrop = Partial<Record<Crop, number>>;

export const accountSortKeys = ['name', '-name', 'town', '-town', 'status', '-status', 'updatedAt', '-updatedAt'] as const;

export const accountListQuerySchema = z.object({
  page: z.coerce.number().int().min(1, 'Page starts at 1').default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 rows a page').default(25),
  sort: z.enum(accountSortKeys, { error: `Sort by one of ${accountSortKeys.join(', ')}` }).default('name'),
  q: z.string().trim().max(100).optional(),
  territoryId: z.coerce.number().int().positive().optional(),
  status: z.enum(accountStatuses).optional(),
});
export type AccountListQuery = z.infer<typeof accountListQuerySchema>;

export const idParamSchema = z.object({ id: z.coerce.number({ error: 'Not a valid id' }).int('Not a valid id').positive('Not a valid id') });

const acres = z.number({ error: 'Acres must be a number' }).min(0, 'Acres cannot be negative').max(1_000_000, 'That is more acres than a territory holds').finite();

export const accountSchema = z.object({
  name: z.string({ error: 'Enter the operation name' }).trim().min(1, 'Enter the operation name').max(160),
  status: z.enum(accountStatuses, { error: 'Status is active, prospect or inactive' }).default('active'),
  territoryId: z.number({ error: 'Choose a territory' }).int().positive('Choose a territory'),
  specialistId: z.number().int().positive().nullish().transform((v) => v ?? null),
  address: z.string().trim().max(255).nullish().transform((v) => v || null),
  town: z.string().trim().max(120).nullish().transform((v) => v || null),
  state: z
    .string()
    .trim()
    .toUpperCase()
    .regex(/^[A-Z]{2}$/, 'Use the two-letter state code')
    .nullish()
    .or(z.literal(''))
    .transform((v) => v || null),
  lat: z.number({ error: 'Latitude must be a number' }).min(-90, 'Latitude must be from -90 to 90').max(90, 'Latitude must be from -90 to 90').nullish().transform((v) => v ?? null),
  lng: z.number({ error: 'Longitude must be a number' }).min(-180, 'Longitude must be from -180 to 180').max(180, 'Longitude must be from -180 to 180').nullish().transform((v) => v ?? null),
  acresByCrop: z.partialRecord(z.enum(crops, { error: `Crops are ${crops.join(', ')}` }), acres).default({}),
  notes: z.string().trim().max(5000).nullish().transform((v) => v || null),
});
export type AccountInput = z.infer<typeof accountSchema>;
