import { z } from 'zod';

export const goalKinds = [
  'planting-speed',
  'acres-per-day',
  'add-crop',
  'in-furrow-starter',
  'rates-by-zone',
  'fertilizer-capacity',
  'replace-toolbar',
  'less-labour',
  'other',
] as const;
export type GoalKindName = (typeof goalKinds)[number];

/** What each kind of goal asks of the planter, as capabilities parts provide (Rowpath's own words). */
export const GOAL_CAPABILITIES: Record<GoalKindName, string[]> = {
  'planting-speed': ['electric-drive', 'high-speed-delivery', 'high-speed-metering'],
  'acres-per-day': ['high-speed-delivery'],
  'add-crop': ['high-speed-metering'],
  'in-furrow-starter': ['in-furrow-liquid'],
  'rates-by-zone': ['rate-control'],
  'fertilizer-capacity': ['fertilizer-capacity'],
  'replace-toolbar': [],
  'less-labour': ['row-shutoff'],
  other: [],
};

export const GOAL_LABELS: Record<GoalKindName, string> = {
  'planting-speed': 'Plant faster',
  'acres-per-day': 'Cover more acres a day',
  'add-crop': 'Add a crop',
  'in-furrow-starter': 'Starter in-furrow',
  'rates-by-zone': 'Rates by zone',
  'fertilizer-capacity': 'Carry more fertilizer',
  'replace-toolbar': 'Replace the toolbar',
  'less-labour': 'Less labour at planting',
  other: 'Other',
};

export const MIN_SEASON = 2000;
export const MAX_SEASON = 2100;
const season = z
  .number({ error: 'Give the season as a year, e.g. 2028' })
  .int('Give the season as a year, e.g. 2028')
  .min(MIN_SEASON, 'Give the season as a year, e.g. 2028')
  .max(MAX_SEASON, 'Give the season as a year, e.g. 2028');

export const goalSchema = z.object({
  kind: z.enum(goalKinds, { error: 'Choose the kind of goal' }),
  label: z.string({ error: 'Describe the goal' }).trim().min(1, 'Describe the goal').max(160),
  planterId: z.number().int().positive().nullish().transform((v) => v ?? null),
  capabilities: z.array(z.string().trim().min(1).max(40)).max(12).optional(),
  targetSeason: season,
  priority: z.number({ error: 'Priority is 1 (low) to 3 (high)' }).int().min(1, 'Priority is 1 (low) to 3 (high)').max(3, 'Priority is 1 (low) to 3 (high)').default(2),
  targetValue: z.number().positive('The target must be above 0').nullish().transform((v) => v ?? null),
  notes: z.string().trim().max(2000).nullish().transform((v) => v || null),
});
export type GoalInput = z.infer<typeof goalSchema>;

export const budgetSchema = z.object({
  season,
  budgetUsd: z.number({ error: 'The budget must be a number of dollars' }).min(0, 'A budget cannot be negative').max(10_000_000),
});
export type BudgetInput = z.infer<typeof budgetSchema>;

export const replacementSchema = z.object({
  planterId: z.number({ error: 'Choose the planter' }).int().positive('Choose the planter'),
  season,
  kind: z.enum(['toolbar', 'planter'], { error: 'Replace the toolbar or the whole planter' }),
  notes: z.string().trim().max(255).nullish().transform((v) => v || null),
});
export type ReplacementInput = z.infer<typeof replacementSchema>;

export const roadmapStages = ['idea', 'proposed', 'quoted', 'accepted', 'ordered', 'installed', 'declined'] as const;
export type RoadmapStageName = (typeof roadmapStages)[number];
/** Stages the grower has committed to: the planner never moves these. */
export const COMMITTED_STAGES: RoadmapStageName[] = ['accepted', 'ordered', 'installed'];

export const planRequestSchema = z.object({
  horizonSeasons: z.number().int().min(1, 'Plan 1 to 10 seasons').max(10, 'Plan 1 to 10 seasons').default(5),
});

export const roadmapItemPatchSchema = z.object({
  version: z.number({ error: 'The record version is missing: reload and try again' }).int().min(0),
  season: season.optional(),
  stage: z.enum(roadmapStages, { error: `Stage is one of ${roadmapStages.join(', ')}` }).optional(),
  locked: z.boolean().optional(),
  probabilityOverride: z.number().min(0, 'Probability is 0 to 1').max(1, 'Probability is 0 to 1').nullable().optional(),
  installWeek: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2027-02-08').nullable().optional(),
});
export type RoadmapItemPatch = z.infer<typeof roadmapItemPatchSchema>;

export const evaluateMovesSchema = z.object({
  moves: z.array(z.object({ itemId: z.number().int().positive(), season })).max(200),
});

export const versionCreateSchema = z.object({ name: z.string({ error: 'Name the version' }).trim().min(1, 'Name the version').max(120) });
export const quoteCreateSchema = z.object({ season });

export const ruleKinds = ['requires', 'conflicts-with', 'supersedes', 'provides', 'prepares-for'] as const;
export const ruleSchema = z
  .object({
    componentId: z.number({ error: 'Choose the part' }).int().positive(),
    kind: z.enum(ruleKinds, { error: `Rule is one of ${ruleKinds.join(', ')}` }),
    targetComponentId: z.number().int().positive().nullish().transform((v) => v ?? null),
    capability: z.string().trim().min(1).max(40).regex(/^[a-z0-9-]+$/, 'Capabilities are lower-case words joined by hyphens').nullish().transform((v) => v ?? null),
    labourHoursSavedPerUnit: z.number().min(0).nullish().transform((v) => v ?? null),
    partsUsdSavedPerUnit: z.number().min(0).nullish().transform((v) => v ?? null),
  })
  .superRefine((r, ctx) => {
    const needsTarget = r.kind === 'conflicts-with' || r.kind === 'supersedes' || r.kind === 'prepares-for';
    if (needsTarget && !r.targetComponentId) ctx.addIssue({ code: 'custom', path: ['targetComponentId'], message: 'Choose the other part' });
    if (r.kind === 'provides' && !r.capability) ctx.addIssue({ code: 'custom', path: ['capability'], message: 'Name the capability' });
    if (r.kind === 'requires' && !r.targetComponentId === !r.capability)
      ctx.addIssue({ code: 'custom', path: ['targetComponentId'], message: 'A requirement names one part or one capability' });
  });
export const rulesPutSchema = z.object({ rules: z.array(ruleSchema).max(2000) });
export type RuleInput = z.infer<typeof ruleSchema>;
