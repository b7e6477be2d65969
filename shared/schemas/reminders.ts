import { z } from 'zod';
import { templateProblems } from '../calc/merge-template.js';
import { parseMonthDay } from '../calc/season-calendar.js';
import { crops } from './accounts.js';

// Pre-season reminders: the season calendar, campaigns, the outbox, the sent-mail viewer and the
// grower's own preferences. These schemas are the API contract and the forms' validation.

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-02-14');
const monthDay = z.string({ error: 'Use a month and day like 04-15' }).refine((v) => parseMonthDay(v) !== null, 'Use a month and day like 04-15 (Feb 29 is not allowed)');
const regionKey = z
  .string({ error: 'Choose a region' })
  .trim()
  .regex(/^[a-z0-9][a-z0-9-]{1,39}$/, 'A region key is 2–40 lower-case letters, digits and dashes');
const positiveId = (what: string) => z.number({ error: `Choose ${what}` }).int(`Choose ${what}`).positive(`Choose ${what}`);
const page = z.coerce.number().int().min(1, 'Page starts at 1').default(1);
const pageSize = z.coerce.number().int().min(1).max(200, 'At most 200 rows a page').default(25);

// ---------- season calendar ----------
export const seasonCalendarQuerySchema = z.object({
  season: z.coerce.number().int().min(2000, 'Season must be from 2000 to 2100').max(2100, 'Season must be from 2000 to 2100').optional(),
});

export const seasonWindowInputSchema = z
  .object({
    regionKey,
    regionLabel: z.string().trim().min(1, 'Name the region').max(120).optional(),
    crop: z.enum(crops, { error: `Crop is one of ${crops.join(', ')}` }),
    windowStart: monthDay.optional(),
    windowEnd: monthDay.optional(),
    source: z.string().trim().max(255).nullish(),
    sourceText: z.string().trim().max(2000).nullish(),
    /** true: forget the dealership's dates and use the published default again. */
    reset: z.boolean().default(false),
  })
  .superRefine((w, ctx) => {
    if (w.reset) return;
    if (!w.windowStart) ctx.addIssue({ code: 'custom', path: ['windowStart'], message: 'Enter the day the window opens, like 04-15' });
    if (!w.windowEnd) ctx.addIssue({ code: 'custom', path: ['windowEnd'], message: 'Enter the day the window closes, like 05-15' });
    const start = w.windowStart && parseMonthDay(w.windowStart);
    const end = w.windowEnd && parseMonthDay(w.windowEnd);
    if (start && end && end.month * 100 + end.day <= start.month * 100 + start.day) {
      ctx.addIssue({ code: 'custom', path: ['windowEnd'], message: 'The window must close after it opens' });
    }
  });
export type SeasonWindowInput = z.infer<typeof seasonWindowInputSchema>;

export const seasonCalendarPutSchema = z.object({
  entries: z.array(seasonWindowInputSchema, { error: 'Send the calendar entries to change' }).min(1, 'Send at least one entry').max(200),
});
export type SeasonCalendarPut = z.infer<typeof seasonCalendarPutSchema>;

// ---------- campaigns ----------
export const campaignStatuses = ['draft', 'active', 'paused'] as const;
export type CampaignStatus = (typeof campaignStatuses)[number];

export const offsetsDaysSchema = z
  .array(z.number({ error: 'Each offset is a number of days' }).int('Each offset is a whole number of days').min(0, 'Offsets cannot be negative').max(365, 'At most 365 days before the window'), {
    error: 'List the days before the window, e.g. [60, 30, 10]',
  })
  .min(1, 'Give at least one offset, e.g. [60, 30, 10]')
  .max(8, 'At most 8 reminders a campaign')
  .refine((a) => new Set(a).size === a.length, 'Each offset may appear once')
  .transform((a) => [...a].sort((x, y) => y - x));

export const campaignAudienceSchema = z.object({
  territoryIds: z.array(positiveId('a territory'), { error: 'Choose at least one territory' }).min(1, 'Choose at least one territory').max(100),
  /** Only accounts with acres of the campaign's crop. */
  growsCrop: z.boolean().default(true),
  /** Only accounts with roadmap items planned for the campaign's season (not declined or installed). */
  hasRoadmapItems: z.boolean().default(false),
  /** Only accounts with no pre-season check-up done on or after this date. */
  noCheckupSince: isoDate.nullish().transform((v) => v ?? null),
});
export type CampaignAudience = z.infer<typeof campaignAudienceSchema>;

const subject = z.string({ error: 'Enter a subject line' }).trim().min(1, 'Enter a subject line').max(200, 'At most 200 characters');
const body = z.string({ error: 'Write the message' }).trim().min(1, 'Write the message').max(20_000, 'At most 20,000 characters');

/** Unknown merge fields are refused here, when the template is saved, with the field named. */
function refuseUnknownFields(v: { subject?: string; body?: string }, ctx: z.RefinementCtx) {
  const problems = templateProblems(v);
  for (const [part, message] of Object.entries(problems)) ctx.addIssue({ code: 'custom', path: [part], message });
}

const campaignFields = {
  name: z.string({ error: 'Name the campaign' }).trim().min(1, 'Name the campaign').max(160),
  season: z.number({ error: 'Season must be a year' }).int('Season must be a year').min(2000, 'Season must be from 2000 to 2100').max(2100, 'Season must be from 2000 to 2100'),
  regionKey,
  crop: z.enum(crops, { error: `Crop is one of ${crops.join(', ')}` }),
  offsetsDays: offsetsDaysSchema,
  audience: campaignAudienceSchema,
  subject,
  body,
  status: z.enum(campaignStatuses, { error: 'Status is draft, active or paused' }).default('draft'),
};

export const campaignSchema = z.object(campaignFields).superRefine(refuseUnknownFields);
export type CampaignInput = z.infer<typeof campaignSchema>;

export const campaignUpdateSchema = z
  .object({
    name: campaignFields.name.optional(),
    season: campaignFields.season.optional(),
    regionKey: regionKey.optional(),
    crop: campaignFields.crop.optional(),
    offsetsDays: offsetsDaysSchema.optional(),
    audience: campaignAudienceSchema.optional(),
    subject: subject.optional(),
    body: body.optional(),
    status: z.enum(campaignStatuses, { error: 'Status is draft, active or paused' }).optional(),
    version: z.number({ error: 'The record version is missing: reload and try again' }).int().min(0),
  })
  .superRefine(refuseUnknownFields);
export type CampaignUpdate = z.infer<typeof campaignUpdateSchema>;

export const campaignListQuerySchema = z.object({
  season: z.coerce.number().int().min(2000).max(2100).optional(),
  status: z.enum(campaignStatuses).optional(),
  page,
  pageSize,
});
export type CampaignListQuery = z.infer<typeof campaignListQuerySchema>;

export const previewSchema = z
  .object({
    contactId: positiveId('a contact'),
    /** Preview an edited template before saving it; the stored one is used when absent. */
    subject: subject.optional(),
    body: body.optional(),
  })
  .superRefine(refuseUnknownFields);
export type PreviewInput = z.infer<typeof previewSchema>;

export const testSendSchema = z.object({
  contactId: positiveId('a contact'),
  /** Where the test goes; the signed-in user's own address when absent. */
  to: z.string().trim().toLowerCase().email('Enter a valid e-mail address').max(191).optional(),
});
export type TestSendInput = z.infer<typeof testSendSchema>;

export const audienceQuerySchema = z.object({ page, pageSize });

// ---------- outbox ----------
export const outboxStatuses = ['pending', 'sending', 'sent', 'failed', 'cancelled', 'held'] as const;
export type OutboxStatus = (typeof outboxStatuses)[number];

export const outboxQuerySchema = z.object({
  status: z.enum(outboxStatuses, { error: `Status is one of ${outboxStatuses.join(', ')}` }).optional(),
  campaignId: z.coerce.number().int().positive().optional(),
  accountId: z.coerce.number().int().positive().optional(),
  page,
  pageSize,
});
export type OutboxQuery = z.infer<typeof outboxQuerySchema>;

// ---------- sent mail (the local SMTP stand-in's mailbox) ----------
export const sentMailQuerySchema = z.object({
  q: z.string().trim().max(100).optional(),
  page,
  pageSize,
});
export type SentMailQuery = z.infer<typeof sentMailQuerySchema>;

// ---------- grower links and preferences ----------
export const tokenQuerySchema = z.object({ token: z.string({ error: 'The link is missing its token' }).min(10, 'The link is not complete').max(2000) });

export const bookingRequestSchema = z.object({
  preferredDate: isoDate.nullish().or(z.literal('')).transform((v) => v || null),
  notes: z.string().trim().max(1000, 'At most 1,000 characters').nullish().transform((v) => v || null),
});
export type BookingRequest = z.infer<typeof bookingRequestSchema>;

export const reminderPreferencesSchema = z.object({
  contacts: z
    .array(z.object({ id: positiveId('a contact'), reminderOptIn: z.boolean({ error: 'Choose yes or no' }) }), { error: 'Send the contacts to change' })
    .min(1, 'Send at least one contact')
    .max(50),
});
export type ReminderPreferencesInput = z.infer<typeof reminderPreferencesSchema>;
