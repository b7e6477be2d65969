import { z } from 'zod';

// Fleet records: contacts, farm sites, tractors, planters with toolbars, the component catalog and
// what is installed where. These schemas are the API contract and the forms' validation.

const trimmed = (max: number, message: string) => z.string({ error: message }).trim().min(1, message).max(max, `At most ${max} characters`);
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `At most ${max} characters`)
    .nullish()
    .transform((v) => (v ? v : null));
const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-15');
// Upper bounds below are far above any row-crop tractor, planter or part (common practice) and
// inside the database columns, so an absurd value gets a field message rather than a column error.
const positive = (what: string) => z.number({ error: `${what} must be a number` }).positive(`${what} must be more than 0`).finite();
const nonNegative = (what: string) => z.number({ error: `${what} must be a number` }).min(0, `${what} cannot be negative`).finite();
const intIn = (what: string, min: number, max: number) =>
  z.number({ error: `${what} must be a whole number` }).int(`${what} must be a whole number`).min(min, `${what} must be from ${min} to ${max}`).max(max, `${what} must be from ${min} to ${max}`);
const modelYear = intIn('Model year', 1950, 2100).nullish().transform((v) => v ?? null);
export const versionField = z.number({ error: 'The record version is missing: reload and try again' }).int().min(0);

// ---------- contacts and farm sites ----------
export const contactSchema = z.object({
  name: trimmed(120, 'Enter a name'),
  roleOnFarm: optionalText(80),
  email: z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(191).nullish().or(z.literal('')).transform((v) => (v ? v : null)),
  phone: optionalText(40),
  reminderOptIn: z.boolean().default(true),
});
export type ContactInput = z.infer<typeof contactSchema>;

export const latitude = z.number({ error: 'Latitude must be a number' }).min(-90, 'Latitude must be from -90 to 90').max(90, 'Latitude must be from -90 to 90');
export const longitude = z.number({ error: 'Longitude must be a number' }).min(-180, 'Longitude must be from -180 to 180').max(180, 'Longitude must be from -180 to 180');

export const farmSiteSchema = z.object({
  name: trimmed(120, 'Name the site (e.g. Home yard)'),
  lat: latitude,
  lng: longitude,
  notes: optionalText(2000),
});
export type FarmSiteInput = z.infer<typeof farmSiteSchema>;

// ---------- tractors ----------
export const tractorSchema = z.object({
  name: trimmed(120, 'Name the tractor'),
  modelYear,
  hydraulicFlowGpm: positive('Hydraulic flow').max(250, 'Hydraulic flow must be at most 250 gpm'),
  hydraulicPressurePsi: positive('Hydraulic pressure').max(6000, 'Hydraulic pressure must be at most 6,000 psi'),
  remoteValves: intIn('Remote valves', 0, 12),
  ptoHp: positive('PTO horsepower').max(1000, 'PTO horsepower must be at most 1,000 hp').nullish().transform((v) => v ?? null),
});
export type TractorInput = z.infer<typeof tractorSchema>;

// ---------- planters and toolbars ----------
export const frameTypes = ['rigid', 'three-section-flex', 'five-section-flex', 'split-row', 'twin-row'] as const;
export const foldTypes = ['none', 'stack', 'front', 'vertical', 'rear-pivot'] as const;
export const seedSupplyTypes = ['row-hoppers', 'central-fill'] as const;

export const toolbarSchema = z.object({
  /** Present when changing a toolbar that exists; absent for a new one. */
  id: z.number().int().positive().optional(),
  name: trimmed(80, 'Name the toolbar (e.g. Main bar)'),
  sizeFt: positive('Toolbar size').max(200, 'Toolbar size must be at most 200 ft'),
  firstRow: intIn('First row', 1, 96),
  lastRow: intIn('Last row', 1, 96),
});
export type ToolbarInput = z.infer<typeof toolbarSchema>;

export const planterSchema = z
  .object({
    name: trimmed(120, 'Name the planter'),
    maker: optionalText(80),
    modelYear,
    rows: intIn('Rows', 1, 96),
    rowSpacingIn: positive('Row spacing').max(60, 'Row spacing must be at most 60 in'),
    frameType: z.enum(frameTypes, { error: `Frame type is one of ${frameTypes.join(', ')}` }),
    foldType: z.enum(foldTypes, { error: `Fold type is one of ${foldTypes.join(', ')}` }),
    seedSupplyType: z.enum(seedSupplyTypes, { error: 'Seed supply is row hoppers or central fill' }),
    seedCapacityUnits: positive('Seed capacity').max(10_000, 'Seed capacity must be at most 10,000').nullish().transform((v) => v ?? null),
    liquidTankCount: intIn('Liquid tanks', 0, 8).default(0),
    liquidTankGallons: nonNegative('Tank size').max(10_000, 'Tank size must be at most 10,000 gal').default(0),
    dryCapacityLb: nonNegative('Dry fertilizer capacity').max(100_000, 'Dry fertilizer capacity must be at most 100,000 lb').default(0),
    markers: z.boolean().default(false),
    acresPerYear: nonNegative('Acres per year').max(1_000_000, 'Acres per year must be at most 1,000,000').nullish().transform((v) => v ?? null),
    tractorId: z.number().int().positive().nullish().transform((v) => v ?? null),
    farmSiteId: z.number().int().positive().nullish().transform((v) => v ?? null),
    toolbars: z.array(toolbarSchema).min(1, 'A planter has at least one toolbar').max(4, 'At most 4 toolbars'),
  })
  .superRefine((p, ctx) => {
    if (p.liquidTankCount > 0 && p.liquidTankGallons <= 0) ctx.addIssue({ code: 'custom', path: ['liquidTankGallons'], message: 'Give the size of each tank' });
    p.toolbars.forEach((t, i) => {
      if (t.lastRow < t.firstRow) ctx.addIssue({ code: 'custom', path: ['toolbars', i, 'lastRow'], message: 'The last row comes before the first row' });
      if (t.lastRow > p.rows) ctx.addIssue({ code: 'custom', path: ['toolbars', i, 'lastRow'], message: `The planter has only ${p.rows} rows` });
    });
  });
export type PlanterInput = z.infer<typeof planterSchema>;
export const planterUpdateSchema = z.intersection(planterSchema, z.object({ version: versionField }));
export type PlanterUpdateInput = z.infer<typeof planterUpdateSchema>;

// ---------- catalog ----------
export const componentCategories = [
  'seed-meter',
  'meter-drive',
  'downforce',
  'seed-delivery',
  'row-cleaner',
  'closing-system',
  'in-furrow-liquid',
  'liquid-monitoring',
  'section-control',
  'dry-fertilizer',
  'hydraulic-supply',
  'display',
  'harness-controller',
  'other',
] as const;
export type ComponentCategory = (typeof componentCategories)[number];
export const componentUnits = ['row', 'toolbar', 'planter'] as const;
export const cropsHandled = ['corn', 'soybean', 'sorghum', 'wheat', 'sunflower', 'cotton'] as const;

export const componentSchema = z.object({
  category: z.enum(componentCategories, { error: 'Choose a category from the list' }),
  name: trimmed(160, 'Name the component'),
  maker: optionalText(80),
  partNumber: trimmed(40, 'Enter the dealer part number'),
  priceUsd: nonNegative('Price').max(1_000_000, 'Price must be at most $1,000,000'),
  labourHours: nonNegative('Install labour').max(500, 'Install labour must be at most 500 h'),
  expectedLifeYears: positive('Expected life').max(40, 'Expected life must be at most 40 years'),
  unit: z.enum(componentUnits, { error: 'Unit is per row, per toolbar or per planter' }),
  hydraulicGpm: nonNegative('Hydraulic demand').max(100, 'Hydraulic demand must be at most 100 gpm').nullish().transform((v) => v ?? null),
  ratedMaxSpeedMph: positive('Rated maximum speed').max(20, 'Rated speed must be at most 20 mph').nullish().transform((v) => v ?? null),
  maxSeedsPerSecond: positive('Rated seeds per second').max(1000, 'Rated seeds per second must be at most 1,000').nullish().transform((v) => v ?? null),
  crops: z.array(z.enum(cropsHandled)).default([]),
  movesToNewToolbar: z.boolean().default(true),
  active: z.boolean().default(true),
});
export type ComponentInput = z.infer<typeof componentSchema>;

// ---------- installed components ----------
export const installScopes = ['planter', 'toolbar', 'rows', 'all-rows'] as const;
export type InstallScope = (typeof installScopes)[number];

export const installSchema = z
  .object({
    componentId: z.number({ error: 'Choose a component' }).int().positive('Choose a component'),
    scope: z.enum(installScopes, { error: 'Place it on the planter, a toolbar, a range of rows or every row' }),
    toolbarId: z.number().int().positive().nullish().transform((v) => v ?? null),
    rowFrom: z.number().int().min(1, 'Rows start at 1').nullish().transform((v) => v ?? null),
    rowTo: z.number().int().min(1, 'Rows start at 1').nullish().transform((v) => v ?? null),
    quantity: z.number().int().min(1, 'Quantity must be at least 1').max(500).nullish().transform((v) => v ?? null),
    installDate: isoDate.nullish().transform((v) => v ?? null),
    pricePaidUsd: nonNegative('Price paid').max(1_000_000, 'Price paid must be at most $1,000,000').nullish().transform((v) => v ?? null),
    serialNumbers: z.array(z.string().trim().min(1).max(60)).max(200).default([]),
    workOrder: optionalText(40),
    status: z.enum(['installed', 'removed']).default('installed'),
    removedDate: isoDate.nullish().transform((v) => v ?? null),
    removedReason: optionalText(255),
  })
  .superRefine((i, ctx) => {
    if (i.scope === 'toolbar' && !i.toolbarId) ctx.addIssue({ code: 'custom', path: ['toolbarId'], message: 'Choose the toolbar' });
    if (i.scope === 'rows') {
      if (!i.rowFrom) ctx.addIssue({ code: 'custom', path: ['rowFrom'], message: 'Give the first row' });
      if (!i.rowTo) ctx.addIssue({ code: 'custom', path: ['rowTo'], message: 'Give the last row' });
      if (i.rowFrom && i.rowTo && i.rowTo < i.rowFrom) ctx.addIssue({ code: 'custom', path: ['rowTo'], message: 'The last row comes before the first row' });
    }
    if (i.status === 'removed' && !i.removedDate) ctx.addIssue({ code: 'custom', path: ['removedDate'], message: 'Give the date it was removed' });
    if (i.removedDate && i.installDate && i.removedDate < i.installDate)
      ctx.addIssue({ code: 'custom', path: ['removedDate'], message: 'Removed before it was installed: check the dates' });
  });
export type InstallInput = z.infer<typeof installSchema>;
export const installUpdateSchema = z.intersection(installSchema, z.object({ version: versionField }));
export type InstallUpdateInput = z.infer<typeof installUpdateSchema>;

export const planterListQuerySchema = z.object({
  page: z.coerce.number().int().min(1, 'Page starts at 1').default(1),
  pageSize: z.coerce.number().int().min(1).max(200, 'At most 200 rows a page').default(25),
  sort: z.enum(['name', '-name', 'rows', '-rows', 'modelYear', '-modelYear', 'account', '-account'], { error: 'Sort by name, rows, modelYear or account' }).default('name'),
  q: z.string().trim().max(100).optional(),
  minRows: z.coerce.number().int().min(1).max(96).optional(),
  accountId: z.coerce.number().int().positive().optional(),
});
export type PlanterListQuery = z.infer<typeof planterListQuerySchema>;

export const componentListQuerySchema = z.object({
  page: z.coerce.number().int().min(1, 'Page starts at 1').default(1),
  pageSize: z.coerce.number().int().min(1).max(500, 'At most 500 rows a page').default(50),
  sort: z.enum(['name', '-name', 'category', '-category', 'priceUsd', '-priceUsd', 'partNumber', '-partNumber'], { error: 'Sort by name, category, priceUsd or partNumber' }).default('category'),
  q: z.string().trim().max(100).optional(),
  category: z.enum(componentCategories).optional(),
  active: z.enum(['true', 'false']).optional(),
});
export type ComponentListQuery = z.infer<typeof componentListQuerySchema>;
