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
