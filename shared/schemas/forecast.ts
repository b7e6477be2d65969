// The forecast, quota and shop-capacity API contract (query and body schemas, response types).
import { z } from 'zod';

export const forecastGroupBys = ['season', 'month', 'quarter', 'territory', 'specialist', 'category', 'account', 'stage'] as const;
export type ForecastGroupBy = (typeof forecastGroupBys)[number];

export const forecastStages = ['idea', 'proposed', 'quoted', 'accepted', 'ordered', 'installed', 'declined'] as const;
export type ForecastStage = (typeof forecastStages)[number];

const MONTH = /^(\d{4})-(0[1-9]|1[0-2])$/;
const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A real calendar day written YYYY-MM-DD (rejects 2027-02-30). */
export function isIsoDay(value: string): boolean {
  if (!DAY.test(value)) return false;
  const d = new Date(`${value}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === value;
}

const month = (what: string) => z.string({ error: `Give the ${what} month as YYYY-MM` }).trim().regex(MONTH, `Give the ${what} month as YYYY-MM`);
const season = z.coerce
  .number({ error: 'The season is a year such as 2027' })
  .int('The season is a year such as 2027')
  .min(2000, 'The season is a year from 2000 to 2100')
  .max(2100, 'The season is a year from 2000 to 2100');
const positiveId = (what: string) => z.coerce.number({ error: `Not a valid ${what} id` }).int(`Not a valid ${what} id`).positive(`Not a valid ${what} id`);

/** Filters shared by the forecast, its drill-down and its CSV export. */
const filterShape = {
  groupBy: z.enum(forecastGroupBys, { error: `Group by one of ${forecastGroupBys.join(', ')}` }).default('season'),
  from: month('first').optional(),
  to: month('last').optional(),
  season: season.optional(),
  territoryId: positiveId('territory').optional(),
  specialistId: positiveId('specialist').optional(),
  category: z.string().trim().min(1, 'Choose a category').max(40, 'A category has at most 40 characters').optional(),
};

function rangeInOrder(value: { from?: string; to?: string }, ctx: z.RefinementCtx) {
  if (value.from && value.to && value.from > value.to) {
    ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last month must not be before the first month' });
  }
}

/** What a key of each grouping looks like (the drill-down checks the key it is sent). */
export const forecastKeyPatterns: Record<ForecastGroupBy, RegExp> = {
  season: /^\d{4}$/,
  month: MONTH,
  quarter: /^\d{4}-Q[1-4]$/,
  territory: /^[1-9]\d{0,9}$/,
  specialist: /^([1-9]\d{0,9}|none)$/,
  category: /^.{1,40}$/,
  account: /^[1-9]\d{0,9}$/,
  stage: new RegExp(`^(${forecastStages.join('|')})$`),
};

const keyHints: Record<ForecastGroupBy, string> = {
  season: 'a season such as 2027',
  month: 'a month such as 2027-03',
  quarter: 'a quarter such as 2027-Q1',
  territory: 'a territory id',
  specialist: 'a specialist id or "none"',
  category: 'a category',
  account: 'an account id',
  stage: `one of ${forecastStages.join(', ')}`,
};

function keyFitsGroup(value: { groupBy: ForecastGroupBy; key?: string }, ctx: z.RefinementCtx) {
  if (value.key !== undefined && !forecastKeyPatterns[value.groupBy].test(value.key)) {
    ctx.addIssue({ code: 'custom', path: ['key'], message: `When grouping by ${value.groupBy}, the key is ${keyHints[value.groupBy]}` });
  }
}

export const forecastQuerySchema = z.object(filterShape).superRefine(rangeInOrder);
export type ForecastQuery = z.infer<typeof forecastQuerySchema>;

export const forecastItemSorts = ['-weightedUsd', 'weightedUsd', '-totalUsd', 'totalUsd', 'month', '-month', 'account', 'stage', '-labourHours', 'labourHours'] as const;

export const forecastItemsQuerySchema = z
  .object({
    ...filterShape,
    key: z.string().trim().min(1, 'The key is empty').max(40).optional(),
    page: z.coerce.number({ error: 'Page is a number' }).int().min(1, 'Page starts at 1').default(1),
    pageSize: z.coerce.number({ error: 'Page size is a number' }).int().min(1, 'At least 1 row a page').max(200, 'At most 200 rows a page').default(50),
    sort: z.enum(forecastItemSorts, { error: `Sort by one of ${forecastItemSorts.join(', ')}` }).default('-weightedUsd'),
  })
  .superRefine(rangeInOrder)
  .superRefine(keyFitsGroup);
export type ForecastItemsQuery = z.infer<typeof forecastItemsQuerySchema>;

export const forecastExportQuerySchema = z
  .object({ ...filterShape, key: z.string().trim().min(1, 'The key is empty').max(40).optional() })
  .superRefine(rangeInOrder)
  .superRefine(keyFitsGroup);
export type ForecastExportQuery = z.infer<typeof forecastExportQuerySchema>;

export interface ForecastFigures {
  pipelineUsd: number;
  weightedUsd: number;
  actualUsd: number;
  itemCount: number;
}
export interface ForecastRow extends ForecastFigures {
  key: string;
  label: string;
}
export interface ForecastResult {
  groupBy: ForecastGroupBy;
  rows: ForecastRow[];
  totals: ForecastFigures;
}

export interface ForecastItem {
  id: number;
  accountId: number;
  accountName: string;
  territoryId: number;
  territoryName: string | null;
  planterId: number;
  planterName: string | null;
  componentId: number;
  componentName: string;
  category: string;
  season: number;
  month: string;
  installWeek: string | null;
  stage: ForecastStage;
  probability: number;
  quantity: number;
  partsUsd: number;
  labourUsd: number;
  labourHours: number;
  totalUsd: number;
  weightedUsd: number;
  specialistId: number | null;
  specialistName: string | null;
  locked: boolean;
}

// ---- quotas ----

export const quotaListQuerySchema = z.object({ season });
export type QuotaListQuery = z.infer<typeof quotaListQuerySchema>;

export const quotaSchema = z.object({
  territoryId: z.number({ error: 'Choose a territory' }).int('Choose a territory').positive('Choose a territory'),
  season: z.number({ error: 'The season is a year such as 2027' }).int('The season is a year such as 2027').min(2000, 'The season is a year from 2000 to 2100').max(2100, 'The season is a year from 2000 to 2100'),
  quotaUsd: z
    .number({ error: 'The quota is an amount in dollars' })
    .finite('The quota is an amount in dollars')
    .min(0, 'A quota cannot be below zero')
    .max(9_999_999_999.99, 'A quota must be below ten billion dollars')
    .transform((v) => Math.round(v * 100) / 100),
});
export type QuotaInput = z.infer<typeof quotaSchema>;

export interface QuotaRow {
  territoryId: number;
  territoryName: string;
  season: number;
  quotaUsd: number | null;
  pipelineUsd: number;
  weightedUsd: number;
  actualUsd: number;
  itemCount: number;
  /** actualUsd ÷ quotaUsd (installed revenue against the quota); null without a quota above zero. */
  attainment: number | null;
  /** weightedUsd ÷ quotaUsd (expected revenue against the quota); null without a quota above zero. */
  weightedAttainment: number | null;
  updatedAt: string | null;
}

// ---- shop capacity ----

const day = (what: string) =>
  z
    .string({ error: `Give the ${what} date as YYYY-MM-DD` })
    .trim()
    .refine(isIsoDay, `Give the ${what} date as YYYY-MM-DD`);

export const SHOP_CAPACITY_MAX_DAYS = 371; // 53 weeks: one harvest-to-planting span with room on both sides

export const shopCapacityQuerySchema = z
  .object({ from: day('first'), to: day('last') })
  .superRefine((value, ctx) => {
    if (!isIsoDay(value.from) || !isIsoDay(value.to)) return;
    if (value.from > value.to) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The last date must not be before the first date' });
    else if ((Date.parse(value.to) - Date.parse(value.from)) / 86_400_000 > SHOP_CAPACITY_MAX_DAYS) {
      ctx.addIssue({ code: 'custom', path: ['to'], message: 'Show at most 53 weeks at a time' });
    }
  });
export type ShopCapacityQuery = z.infer<typeof shopCapacityQuerySchema>;

export const shopWeekParamsSchema = z.object({
  weekStart: day('week start').refine((v) => !isIsoDay(v) || new Date(`${v}T00:00:00Z`).getUTCDay() === 1, 'A week starts on a Monday'),
});

export const shopWeekSchema = z.object({
  technicianHours: z
    .number({ error: 'Technician hours are a number, or null for the default' })
    .finite()
    .min(0, 'Technician hours cannot be below zero')
    .max(2000, 'At most 2,000 technician hours a week')
    .nullable(),
});
export type ShopWeekInput = z.infer<typeof shopWeekSchema>;

export interface MovableItem {
  id: number;
  accountId: number;
  accountName: string;
  componentName: string;
  category: string;
  stage: ForecastStage;
  installWeek: string;
  labourHours: number;
  totalUsd: number;
  specialistId: number | null;
  specialistName: string | null;
}

export interface ShopWeek {
  weekStart: string;
  weekEnd: string;
  technicianHours: number;
  /** true when a manager set this week's hours; false when the settings default applies. */
  technicianHoursSet: boolean;
  bookedHours: number;
  bookedHoursInScope: number;
  itemCountInScope: number;
  over: boolean;
  hoursOver: number;
  /** Unlocked items in scope that could move out of an over-capacity week, smallest labour first (at most 100). */
  movableItems: MovableItem[];
  /** How many such items there are in all (movableItems stops at 100). */
  movableCount: number;
}
