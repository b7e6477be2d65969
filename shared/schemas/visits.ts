import { z } from 'zod';
import { latitude, longitude, versionField } from './fleet.js';

// Farm visits, route optimisation, week plans, the territory map and calendar feeds. These schemas
// are the API contract; the response types below are what the server sends back.

export const visitPurposes = ['pre-season-checkup', 'install', 'troubleshooting', 'roadmap-review', 'post-season-review'] as const;
export type VisitPurpose = (typeof visitPurposes)[number];
export const visitStatuses = ['requested', 'planned', 'done', 'cancelled'] as const;
export type VisitStatus = (typeof visitStatuses)[number];

export const VISIT_PURPOSE_LABELS: Record<VisitPurpose, string> = {
  'pre-season-checkup': 'Pre-season check-up',
  install: 'Install',
  troubleshooting: 'Troubleshooting',
  'roadmap-review': 'Roadmap review',
  'post-season-review': 'Post-season review',
};

/** Planned length of a visit when none is given (Rowpath's defaults; common practice). */
export const DEFAULT_DURATION_MIN: Record<VisitPurpose, number> = {
  'pre-season-checkup': 90,
  install: 240,
  troubleshooting: 90,
  'roadmap-review': 60,
  'post-season-review': 60,
};

const MINUTES_PER_DAY = 1440;
export const isoDate = z.iso.date({ error: 'Use a date like 2026-12-07' });
const id = (what: string) => z.number({ error: `${what} must be an id` }).int(`${what} must be an id`).positive(`${what} must be an id`);
const queryId = (what: string) => z.coerce.number({ error: `${what} must be an id` }).int(`${what} must be an id`).positive(`${what} must be an id`);
const minuteOfDay = (what: string) =>
  z
    .number({ error: `${what} must be minutes after midnight` })
    .int(`${what} must be whole minutes after midnight`)
    .min(0, `${what} must be from 0 to 1440 minutes after midnight`)
    .max(MINUTES_PER_DAY, `${what} must be from 0 to 1440 minutes after midnight`);
const instant = z.iso.datetime({ offset: true, error: 'Use a date and time like 2026-12-07T15:00:00Z' });

const visitFields = {
  accountId: id('Account'),
  specialistId: id('Specialist').nullable(),
  planterId: id('Planter').nullable(),
  purpose: z.enum(visitPurposes, { error: `Purpose is one of ${visitPurposes.join(', ')}` }),
  status: z.enum(visitStatuses, { error: `Status is one of ${visitStatuses.join(', ')}` }),
  /** UTC instant the visit starts; null while it is only requested. */
  startsAt: instant.nullable(),
  durationMin: z
    .number({ error: 'Duration must be a number of minutes' })
    .int('Duration must be whole minutes')
    .min(5, 'A visit takes at least 5 minutes')
    .max(MINUTES_PER_DAY, 'A visit cannot be longer than a day (1,440 minutes)'),
  /** The grower's window, minutes after local midnight; the whole visit must fall inside it. */
  windowStartMin: minuteOfDay('The window start').nullable(),
  windowEndMin: minuteOfDay('The window end').nullable(),
  /** An appointment: planning never moves it. */
  fixed: z.boolean({ error: 'Fixed is true or false' }),
  notes: z.string().trim().max(5000, 'At most 5000 characters').nullable(),
  checklist: z
    .array(z.object({ label: z.string({ error: 'Name the checklist item' }).trim().min(1, 'Name the checklist item').max(200, 'At most 200 characters'), done: z.boolean().default(false) }))
    .max(50, 'At most 50 checklist items'),
  roadmapItemIds: z.array(id('Roadmap item')).max(50, 'At most 50 roadmap items'),
  requestedByContactId: id('Contact').nullable(),
};

type WindowShape = { windowStartMin?: number | null; windowEndMin?: number | null; fixed?: boolean; startsAt?: string | null; durationMin?: number };

/** Checks that need two fields at once; on a change only fields sent together are compared. */
function checkTogether(v: WindowShape, ctx: z.RefinementCtx) {
  const hasStart = v.windowStartMin !== undefined && v.windowStartMin !== null;
  const hasEnd = v.windowEndMin !== undefined && v.windowEndMin !== null;
  if (hasStart !== hasEnd && v.windowStartMin !== undefined && v.windowEndMin !== undefined) {
    ctx.addIssue({ code: 'custom', path: [hasStart ? 'windowEndMin' : 'windowStartMin'], message: 'Give both ends of the time window, or neither' });
  }
  if (hasStart && hasEnd) {
    if (v.windowEndMin! <= v.windowStartMin!) ctx.addIssue({ code: 'custom', path: ['windowEndMin'], message: 'The time window closes before it opens' });
    else if (v.durationMin !== undefined && v.windowEndMin! - v.windowStartMin! < v.durationMin) {
      ctx.addIssue({ code: 'custom', path: ['durationMin'], message: 'The visit is longer than its time window' });
    }
  }
  if (v.fixed === true && v.startsAt === null) ctx.addIssue({ code: 'custom', path: ['startsAt'], message: 'A fixed appointment needs a start time' });
}

const visitBase = z.object(visitFields);

/** POST /api/visits. Omitted fields take defaults (duration from the purpose; status planned when a time is given). */
export const visitCreateSchema = visitBase
  .partial()
  .required({ accountId: true, purpose: true })
  .transform((v) => ({
    accountId: v.accountId,
    purpose: v.purpose,
    specialistId: v.specialistId ?? null,
    planterId: v.planterId ?? null,
    status: v.status ?? (v.startsAt ? 'planned' : 'requested'),
    startsAt: v.startsAt ?? null,
    durationMin: v.durationMin ?? DEFAULT_DURATION_MIN[v.purpose],
    windowStartMin: v.windowStartMin ?? null,
    windowEndMin: v.windowEndMin ?? null,
    fixed: v.fixed ?? false,
    notes: v.notes || null,
    checklist: v.checklist ?? [],
    roadmapItemIds: v.roadmapItemIds ?? [],
    requestedByContactId: v.requestedByContactId ?? null,
  }))
  .superRefine(checkTogether);
export type VisitCreateInput = z.infer<typeof visitCreateSchema>;

/** PATCH /api/visits/:id: any fields plus the version the client loaded. accountId cannot change. */
export const visitUpdateSchema = visitBase
  .omit({ accountId: true })
  .partial()
  .extend({ version: versionField })
  .superRefine(checkTogether);
export type VisitUpdateInput = z.infer<typeof visitUpdateSchema>;

/** POST /api/visits/batch: several visits at once (e.g. the due check-ups chosen for a week). */
export const visitBatchSchema = z.object({
  visits: z.array(visitCreateSchema, { error: 'Send a list of visits' }).min(1, 'Send at least one visit').max(100, 'At most 100 visits at once'),
});

const statusList = z.string().transform((s, ctx) => {
  const list = s.split(',').map((x) => x.trim()).filter(Boolean);
  if (list.some((x) => !(visitStatuses as readonly string[]).includes(x))) {
    ctx.addIssue({ code: 'custom', message: `Status is one or more of ${visitStatuses.join(', ')}, separated by commas` });
    return z.NEVER;
  }
  return list as VisitStatus[];
});
const dateOrInstant = z.union([isoDate, instant], { error: 'Use a date like 2026-12-07 or a date and time like 2026-12-07T15:00:00Z' });

/** GET /api/visits. from/to: visits starting in [from, to); dates mean the dealership's local midnight. */
export const visitListQuerySchema = z
  .object({
    from: dateOrInstant.optional(),
    to: dateOrInstant.optional(),
    specialistId: queryId('Specialist').optional(),
    accountId: queryId('Account').optional(),
    status: statusList.optional(),
    page: z.coerce.number().int().min(1, 'Page starts at 1').default(1),
    pageSize: z.coerce.number().int().min(1).max(2000, 'At most 2000 visits a page').default(500),
  })
  .superRefine((q, ctx) => {
    if (q.from && q.to && q.to.length === q.from.length && q.to <= q.from) ctx.addIssue({ code: 'custom', path: ['to'], message: 'The end of the range comes before its start' });
  });
export type VisitListQuery = z.infer<typeof visitListQuerySchema>;

export const candidatesQuerySchema = z.object({
  weekStart: isoDate,
  specialistId: queryId('Specialist').optional(),
});
export type CandidatesQuery = z.infer<typeof candidatesQuerySchema>;

// ---------- routes and week plans ----------

/** POST /api/routes/optimize. */
export const optimizeRouteSchema = z
  .object({
    start: z.object({ lat: latitude, lng: longitude }, { error: 'Give the start as { lat, lng }' }),
    stops: z
      .array(
        z.object({
          id: z.union([z.string().trim().min(1, 'Give each stop an id').max(64, 'At most 64 characters'), z.number().int('Stop ids are text or whole numbers')], {
            error: 'Give each stop an id (text or a whole number)',
          }),
          lat: latitude,
          lng: longitude,
          serviceMin: z.number({ error: 'Service time must be minutes' }).min(0, 'Service time cannot be negative').max(MINUTES_PER_DAY, 'A stop cannot take longer than a day').optional(),
        }),
        { error: 'Send the stops as a list' },
      )
      .min(1, 'Send at least one stop')
      .max(100, 'At most 100 stops'),
    returnToStart: z.boolean({ error: 'returnToStart is true or false' }).default(true),
  })
  .superRefine((v, ctx) => {
    const seen = new Map<string, number>();
    v.stops.forEach((s, k) => {
      const key = String(s.id);
      if (seen.has(key)) ctx.addIssue({ code: 'custom', path: ['stops', k, 'id'], message: `Stop id "${key}" is used twice (also stop ${seen.get(key)})` });
      else seen.set(key, k);
    });
  });
export type OptimizeRouteInput = z.infer<typeof optimizeRouteSchema>;

const uniqueIds = (path: string, what: string) => (ids: number[], ctx: z.RefinementCtx) => {
  const seen = new Set<number>();
  ids.forEach((v, k) => {
    if (seen.has(v)) ctx.addIssue({ code: 'custom', path: [path, k], message: `${what} ${v} is listed twice` });
    seen.add(v);
  });
};

/** POST /api/week-plans and /api/week-plans/stream. Days are consecutive dates from weekStart. */
export const weekPlanSchema = z
  .object({
    weekStart: isoDate,
    specialistId: id('Specialist').optional(),
    visitIds: z.array(id('Visit'), { error: 'Choose the visits to plan' }).min(1, 'Choose at least one visit').max(200, 'At most 200 visits in a week plan'),
    days: z.number({ error: 'Days must be a number' }).int('Days must be a whole number').min(1, 'Plan at least 1 day').max(7, 'Plan at most 7 days').default(5),
  })
  .superRefine((v, ctx) => uniqueIds('visitIds', 'Visit')(v.visitIds, ctx));
export type WeekPlanInput = z.infer<typeof weekPlanSchema>;

/** POST /api/week-plans/commit: the times to write (usually the stops of a plan, sent back). */
export const weekPlanCommitSchema = z
  .object({
    specialistId: id('Specialist').optional(),
    assignments: z
      .array(
        z.object({
          visitId: id('Visit'),
          date: isoDate,
          /** Local minutes after midnight the visit starts (a plan stop's startMin; whole minutes as a rule). */
          startMin: z
            .number({ error: 'The start must be minutes after midnight' })
            .min(0, 'The start must be from 0 to 1440 minutes after midnight')
            .max(MINUTES_PER_DAY, 'The start must be from 0 to 1440 minutes after midnight'),
          version: versionField,
        }),
        { error: 'Send the assignments as a list' },
      )
      .min(1, 'Send at least one assignment')
      .max(200, 'At most 200 assignments'),
  })
  .superRefine((v, ctx) =>
    uniqueIds('assignments', 'Visit')(
      v.assignments.map((a) => a.visitId),
      ctx,
    ),
  );
export type WeekPlanCommitInput = z.infer<typeof weekPlanCommitSchema>;

export const weekRoutesQuerySchema = z.object({
  weekStart: isoDate,
  specialistId: queryId('Specialist').optional(),
  days: z.coerce.number().int().min(1, 'At least 1 day').max(7, 'At most 7 days').default(5),
});
export type WeekRoutesQuery = z.infer<typeof weekRoutesQuerySchema>;

export const mapQuerySchema = z.object({
  territoryId: queryId('Territory').optional(),
  specialistId: queryId('Specialist').optional(),
  /** Planting season for roadmapDueThisSeasonUsd; defaults to the coming one (July rolls it over). */
  season: z.coerce.number().int().min(2000, 'Season is a year').max(2100, 'Season is a year').optional(),
});
export type MapQuery = z.infer<typeof mapQuerySchema>;

// ---------- response shapes ----------

export interface VisitView {
  id: number;
  accountId: number;
  accountName: string;
  town: string | null;
  lat: number | null;
  lng: number | null;
  specialistId: number | null;
  specialistName: string | null;
  planterId: number | null;
  purpose: VisitPurpose;
  status: VisitStatus;
  startsAt: string | null;
  endsAt: string | null;
  durationMin: number;
  windowStartMin: number | null;
  windowEndMin: number | null;
  fixed: boolean;
  notes: string | null;
  checklist: { label: string; done: boolean }[];
  roadmapItemIds: number[];
  requestedByContactId: number | null;
  version: number;
  updatedAt: string;
}

export type CandidateKind = 'requested' | 'checkup-due' | 'review-overdue';
export interface VisitCandidate {
  kind: CandidateKind;
  /** The visit to plan; null for a due check-up or review with no visit yet (create one first). */
  visitId: number | null;
  version: number | null;
  accountId: number;
  accountName: string;
  town: string | null;
  lat: number | null;
  lng: number | null;
  specialistId: number | null;
  purpose: VisitPurpose;
  durationMin: number;
  windowStartMin: number | null;
  windowEndMin: number | null;
  fixed: boolean;
  startsAt: string | null;
  /** Plain-English reason it is a candidate. */
  reason: string;
  /** Last done visit of this purpose, ISO, or null. */
  lastDoneAt: string | null;
}

export interface PlanStopView {
  visitId: number;
  accountId: number;
  accountName: string;
  purpose: VisitPurpose;
  lat: number;
  lng: number;
  /** Local minutes after midnight. arriveMin + waitMin = startMin. */
  arriveMin: number;
  waitMin: number;
  startMin: number;
  departMin: number;
  fixed: boolean;
  /** An already planned visit of the specialist that this plan routes around but does not move. */
  kept: boolean;
  version: number;
}

export interface PlanDayView {
  date: string;
  startMin: number;
  endMin: number;
  stops: PlanStopView[];
  distanceKm: number;
  driveMin: number;
  workMin: number;
  /** Back at the dealership. */
  returnMin: number;
}

export interface WeekPlanView {
  weekStart: string;
  specialistId: number;
  depot: { name: string; lat: number; lng: number };
  days: PlanDayView[];
  unplaced: { visitId: number; accountName: string; reason: string }[];
  totals: { visits: number; distanceKm: number; driveMin: number };
}

export interface MapMarker {
  id: number;
  name: string;
  lat: number;
  lng: number;
  town: string | null;
  status: 'active' | 'prospect' | 'inactive';
  territoryId: number;
  specialistId: number | null;
  daysSinceLastVisit: number | null;
  roadmapDueThisSeasonUsd: number;
  openRequests: number;
  nextVisitAt: string | null;
  /** Rowpath's marker scheme: request (open request), overdue (no visit in a year), due-soon (none in 180 days), ok. */
  visitState: 'request' | 'overdue' | 'due-soon' | 'ok';
}
