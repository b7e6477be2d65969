// The API's route registry: one entry per route, naming the shared zod schemas it validates and who
// may call it. The OpenAPI document is generated from it; the fuzz and access tests read it, and a
// test checks that every entry matches a route the app really serves. Routes the app serves but this
// list does not describe still appear in the document (see document.ts), marked undescribed.
import { z } from 'zod';
import type { Role } from '../../../shared/schemas/auth.js';
import { loginSchema } from '../../../shared/schemas/auth.js';
import { accountListQuerySchema, accountSchema, idParamSchema } from '../../../shared/schemas/accounts.js';
import { accountExportQuerySchema, contactExportQuerySchema, importQuerySchema } from '../../../shared/schemas/csv.js';
import {
  componentListQuerySchema,
  componentSchema,
  contactSchema,
  farmSiteSchema,
  installSchema,
  installUpdateSchema,
  planterListQuerySchema,
  planterSchema,
  planterUpdateSchema,
  tractorSchema,
  versionField,
} from '../../../shared/schemas/fleet.js';
import {
  forecastExportQuerySchema,
  forecastItemsQuerySchema,
  forecastQuerySchema,
  quotaListQuerySchema,
  quotaSchema,
  shopCapacityQuerySchema,
  shopWeekParamsSchema,
  shopWeekSchema,
} from '../../../shared/schemas/forecast.js';
import {
  audienceQuerySchema,
  bookingRequestSchema,
  campaignListQuerySchema,
  campaignSchema,
  campaignUpdateSchema,
  outboxQuerySchema,
  previewSchema,
  reminderPreferencesSchema,
  seasonCalendarPutSchema,
  seasonCalendarQuerySchema,
  sentMailQuerySchema,
  testSendSchema,
  tokenQuerySchema,
} from '../../../shared/schemas/reminders.js';
import {
  budgetSchema,
  evaluateMovesSchema,
  goalSchema,
  planRequestSchema,
  quoteCreateSchema,
  replacementSchema,
  roadmapItemPatchSchema,
  rulesPutSchema,
  versionCreateSchema,
} from '../../../shared/schemas/roadmap.js';
import { sizingAssumptionsQuerySchema } from '../../../shared/schemas/sizing-assumptions.js';
import { sizingInputSchema } from '../../../shared/schemas/sizing.js';
import { createUserSchema, updateUserSchema } from '../../../shared/schemas/users.js';
import {
  candidatesQuerySchema,
  mapQuerySchema,
  optimizeRouteSchema,
  visitBatchSchema,
  visitCreateSchema,
  visitListQuerySchema,
  visitUpdateSchema,
  weekPlanCommitSchema,
  weekPlanSchema,
  weekRoutesQuerySchema,
} from '../../../shared/schemas/visits.js';
import { attachmentFieldsSchema, attachmentListQuerySchema } from '../attachments/attachments.service.js';
import type { HttpMethod } from './discover.js';

/** Who passes the route's guard. Finer rules (a grower reads but does not change) live in services. */
export type Access = 'public' | 'signed-in' | readonly Role[];

/** What an `:id` in the path names, so access tests can make one in another territory. */
export type IdKind =
  | 'account'
  | 'contact'
  | 'farmSite'
  | 'tractor'
  | 'planter'
  | 'install'
  | 'component'
  | 'goal'
  | 'replacement'
  | 'roadmapItem'
  | 'roadmapVersion'
  | 'quote'
  | 'user'
  | 'campaign'
  | 'outboxMessage'
  | 'sentMail'
  | 'visit'
  | 'attachment';

/** Kinds that belong to one grower account (and so to one territory): the object-level checks. */
export const ACCOUNT_OWNED: readonly IdKind[] = [
  'account',
  'contact',
  'farmSite',
  'tractor',
  'planter',
  'install',
  'goal',
  'replacement',
  'roadmapItem',
  'roadmapVersion',
  'quote',
  'visit',
  'attachment',
];

export interface RouteDoc {
  method: HttpMethod;
  path: string;
  tag: string;
  summary: string;
  access: Access;
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
  /** How the body travels; JSON unless said. */
  bodyType?: 'json' | 'multipart' | 'csv' | 'form';
  /** Success answer: status and what it carries. */
  response: { status: number; description: string; contentType?: string };
  /** What `:id` names. */
  idKind?: IdKind;
  /** false: the app-wide CSRF check does not apply (signed e-mail links, sign-in is still checked). */
  csrf?: boolean;
  /** Left out of body fuzzing, with the reason. */
  noFuzz?: string;
}

const staff = ['admin', 'manager', 'specialist'] as const;
const managers = ['admin', 'manager'] as const;
const adminOnly = ['admin'] as const;

// Update shapes that the routers build inline from the shared schemas (kept in step by hand: the
// openapi test fails when a shared schema they extend changes shape incompatibly).
const accountUpdateSchema = accountSchema.partial().extend({ version: versionField });
const childUpdate = (schema: z.ZodObject) => schema.partial().extend({ version: versionField });
const componentUpdateSchema = componentSchema.partial().extend({ version: versionField });
const goalPatchSchema = goalSchema.partial().extend({ version: versionField });
const commitQuerySchema = z.object({ commit: z.enum(['true', 'false']).optional() });
const tokenBodySchema = z.object({ token: z.string().min(10).max(2000) });
const bookingBodySchema = z.object({ token: z.string().min(10).max(2000) }).and(bookingRequestSchema);
const calendarTokenParams = z.object({ token: z.string() });

const id = idParamSchema;
const ok = (description: string) => ({ status: 200, description });
const created = (description: string) => ({ status: 201, description });
const noContent = { status: 204, description: 'Done; no body.' };

const fleetChildren = (
  [
    ['contacts', 'contact', contactSchema, 'Contact'],
    ['farm-sites', 'farmSite', farmSiteSchema, 'Farm site'],
    ['tractors', 'tractor', tractorSchema, 'Tractor'],
  ] as const
).flatMap(([segment, kind, schema, label]): RouteDoc[] => [
  { method: 'post', path: `/api/accounts/:id/${segment}`, tag: 'Fleet', summary: `Add a ${label.toLowerCase()} to an account`, access: 'signed-in', params: id, idKind: 'account', body: schema, response: created(`{ ${kind} }`) },
  { method: 'patch', path: `/api/${segment}/:id`, tag: 'Fleet', summary: `Change a ${label.toLowerCase()} (send the version you loaded)`, access: 'signed-in', params: id, idKind: kind, body: childUpdate(schema), response: ok(`{ ${kind} }`) },
  { method: 'delete', path: `/api/${segment}/:id`, tag: 'Fleet', summary: `Remove a ${label.toLowerCase()}`, access: 'signed-in', params: id, idKind: kind, response: noContent },
]);

export const ROUTES: readonly RouteDoc[] = [
  // ---------- health, session ----------
  { method: 'get', path: '/api/health', tag: 'Service', summary: 'Liveness and the database state (503 when MariaDB is down)', access: 'public', response: ok('{ status, db }') },
  { method: 'get', path: '/api/auth/csrf', tag: 'Session', summary: "This session's CSRF token, to send as X-CSRF-Token on every write", access: 'public', response: ok('{ token }') },
  { method: 'post', path: '/api/auth/login', tag: 'Session', summary: 'Sign in; the session id and the CSRF token change', access: 'public', body: loginSchema, response: ok('{ user }') },
  { method: 'post', path: '/api/auth/logout', tag: 'Session', summary: 'Sign out; the session is destroyed', access: 'public', response: noContent, noFuzz: 'signing out ends the session the fuzzer works in' },
  { method: 'get', path: '/api/auth/me', tag: 'Session', summary: 'The signed-in user', access: 'signed-in', response: ok('{ user }') },
  { method: 'get', path: '/api/openapi.json', tag: 'Service', summary: 'This document', access: 'signed-in', response: ok('OpenAPI 3.1 document') },

  // ---------- accounts ----------
  { method: 'get', path: '/api/territories', tag: 'Accounts', summary: 'Territories with their account counts', access: staff, response: ok('{ items }') },
  { method: 'get', path: '/api/accounts', tag: 'Accounts', summary: 'Accounts in the caller’s scope, paged, sorted and searched', access: 'signed-in', query: accountListQuerySchema, response: ok('{ items, total }') },
  { method: 'post', path: '/api/accounts', tag: 'Accounts', summary: 'Create an account (staff of the territory)', access: 'signed-in', body: accountSchema, response: created('{ account }') },
  { method: 'get', path: '/api/accounts/:id', tag: 'Accounts', summary: 'One account with its fleet', access: 'signed-in', params: id, idKind: 'account', response: ok('{ account }') },
  { method: 'patch', path: '/api/accounts/:id', tag: 'Accounts', summary: 'Change an account (send the version you loaded)', access: 'signed-in', params: id, idKind: 'account', body: accountUpdateSchema, response: ok('{ account }') },
  { method: 'delete', path: '/api/accounts/:id', tag: 'Accounts', summary: 'Delete an account', access: 'signed-in', params: id, idKind: 'account', response: noContent },
  { method: 'get', path: '/api/accounts/:id/audit', tag: 'Accounts', summary: "The account's audit trail", access: 'signed-in', params: id, idKind: 'account', response: ok('{ items }') },
  { method: 'get', path: '/api/accounts/export.csv', tag: 'CSV', summary: 'Accounts in scope as CSV', access: 'signed-in', query: accountExportQuerySchema, response: { status: 200, description: 'CSV file', contentType: 'text/csv' } },
  { method: 'get', path: '/api/contacts/export.csv', tag: 'CSV', summary: 'Contacts in scope as CSV', access: 'signed-in', query: contactExportQuerySchema, response: { status: 200, description: 'CSV file', contentType: 'text/csv' } },
  { method: 'post', path: '/api/imports/accounts', tag: 'CSV', summary: 'Import accounts and contacts from CSV (?mode=preview or commit)', access: staff, query: importQuerySchema, bodyType: 'csv', response: ok('Import report (201 on commit)') },

  // ---------- fleet ----------
  ...fleetChildren,
  { method: 'get', path: '/api/planters', tag: 'Fleet', summary: 'Planters in scope, paged, sorted and filtered', access: 'signed-in', query: planterListQuerySchema, response: ok('{ items, total }') },
  { method: 'post', path: '/api/accounts/:id/planters', tag: 'Fleet', summary: 'Add a planter with its toolbars', access: 'signed-in', params: id, idKind: 'account', body: planterSchema, response: created('{ planter }') },
  { method: 'get', path: '/api/planters/:id', tag: 'Fleet', summary: 'One planter with toolbars and installs', access: 'signed-in', params: id, idKind: 'planter', response: ok('{ planter }') },
  { method: 'put', path: '/api/planters/:id', tag: 'Fleet', summary: 'Replace a planter (send the version you loaded)', access: 'signed-in', params: id, idKind: 'planter', body: planterUpdateSchema, response: ok('{ planter }') },
  { method: 'delete', path: '/api/planters/:id', tag: 'Fleet', summary: 'Delete a planter', access: 'signed-in', params: id, idKind: 'planter', response: noContent },
  { method: 'post', path: '/api/planters/:id/installs', tag: 'Fleet', summary: 'Record a component installed on a planter', access: 'signed-in', params: id, idKind: 'planter', body: installSchema, response: created('{ install }') },
  { method: 'put', path: '/api/installs/:id', tag: 'Fleet', summary: 'Replace an install (send the version you loaded)', access: 'signed-in', params: id, idKind: 'install', body: installUpdateSchema, response: ok('{ install }') },
  { method: 'delete', path: '/api/installs/:id', tag: 'Fleet', summary: 'Remove an install', access: 'signed-in', params: id, idKind: 'install', response: noContent },
  { method: 'get', path: '/api/components', tag: 'Catalog', summary: 'The component catalog, paged and searched', access: staff, query: componentListQuerySchema, response: ok('{ items, total }') },
  { method: 'get', path: '/api/components/:id', tag: 'Catalog', summary: 'One catalog component', access: staff, params: id, idKind: 'component', response: ok('{ component }') },
  { method: 'post', path: '/api/components', tag: 'Catalog', summary: 'Add a component to the catalog', access: managers, body: componentSchema, response: created('{ component }') },
  { method: 'patch', path: '/api/components/:id', tag: 'Catalog', summary: 'Change a catalog component (send the version you loaded)', access: managers, params: id, idKind: 'component', body: componentUpdateSchema, response: ok('{ component }') },
  { method: 'delete', path: '/api/components/:id', tag: 'Catalog', summary: 'Delete a component no planter carries', access: managers, params: id, idKind: 'component', response: noContent },

  // ---------- sizing ----------
  { method: 'post', path: '/api/sizing', tag: 'Sizing', summary: 'Size a planter from explicit inputs', access: 'signed-in', body: sizingInputSchema, response: ok('Sizing figures') },
  { method: 'get', path: '/api/planters/:id/sizing', tag: 'Sizing', summary: 'Size a stored planter under stated assumptions', access: 'signed-in', params: id, idKind: 'planter', query: sizingAssumptionsQuerySchema, response: ok('{ planterId, assumptions, input, … }') },

  // ---------- roadmap ----------
  { method: 'get', path: '/api/accounts/:id/roadmap', tag: 'Roadmap', summary: "The account's upgrade roadmap by season", access: 'signed-in', params: id, idKind: 'account', response: ok('Roadmap') },
  { method: 'post', path: '/api/accounts/:id/roadmap/plan', tag: 'Roadmap', summary: 'Plan the roadmap again over a horizon', access: 'signed-in', params: id, idKind: 'account', body: planRequestSchema, response: ok('Roadmap') },
  { method: 'post', path: '/api/accounts/:id/roadmap/evaluate', tag: 'Roadmap', summary: 'Preview moves of items between seasons, with warnings', access: 'signed-in', params: id, idKind: 'account', body: evaluateMovesSchema, response: ok('{ warnings, … }') },
  { method: 'patch', path: '/api/roadmap-items/:id', tag: 'Roadmap', summary: 'Change one roadmap item (season, stage, lock)', access: 'signed-in', params: id, idKind: 'roadmapItem', body: roadmapItemPatchSchema, response: ok('Roadmap item') },
  { method: 'get', path: '/api/accounts/:id/goals', tag: 'Roadmap', summary: "The grower's goals", access: 'signed-in', params: id, idKind: 'account', response: ok('{ items }') },
  { method: 'post', path: '/api/accounts/:id/goals', tag: 'Roadmap', summary: 'Record a goal', access: 'signed-in', params: id, idKind: 'account', body: goalSchema, response: created('{ goal }') },
  { method: 'patch', path: '/api/goals/:id', tag: 'Roadmap', summary: 'Change a goal (send the version you loaded)', access: 'signed-in', params: id, idKind: 'goal', body: goalPatchSchema, response: ok('{ goal }') },
  { method: 'delete', path: '/api/goals/:id', tag: 'Roadmap', summary: 'Delete a goal', access: 'signed-in', params: id, idKind: 'goal', response: noContent },
  { method: 'put', path: '/api/accounts/:id/budgets', tag: 'Roadmap', summary: "Set a season's budget", access: 'signed-in', params: id, idKind: 'account', body: budgetSchema, response: ok('{ budget }') },
  { method: 'post', path: '/api/accounts/:id/replacements', tag: 'Roadmap', summary: 'Plan a toolbar or planter replacement', access: 'signed-in', params: id, idKind: 'account', body: replacementSchema, response: created('{ replacement }') },
  { method: 'delete', path: '/api/replacements/:id', tag: 'Roadmap', summary: 'Drop a planned replacement', access: 'signed-in', params: id, idKind: 'replacement', response: noContent },
  { method: 'get', path: '/api/accounts/:id/roadmap/versions', tag: 'Roadmap', summary: 'Saved roadmap versions', access: 'signed-in', params: id, idKind: 'account', response: ok('{ items }') },
  { method: 'post', path: '/api/accounts/:id/roadmap/versions', tag: 'Roadmap', summary: 'Save the roadmap as a named version', access: 'signed-in', params: id, idKind: 'account', body: versionCreateSchema, response: created('{ version }') },
  { method: 'get', path: '/api/roadmap-versions/:id', tag: 'Roadmap', summary: 'One saved roadmap version', access: 'signed-in', params: id, idKind: 'roadmapVersion', response: ok('{ version }') },
  { method: 'get', path: '/api/accounts/:id/quotes', tag: 'Quotes', summary: "The account's quotes", access: 'signed-in', params: id, idKind: 'account', response: ok('{ items }') },
  { method: 'post', path: '/api/accounts/:id/quotes', tag: 'Quotes', summary: "Quote a season's roadmap items", access: 'signed-in', params: id, idKind: 'account', body: quoteCreateSchema, response: created('{ quote }') },
  { method: 'get', path: '/api/quotes/:id', tag: 'Quotes', summary: 'One quote', access: 'signed-in', params: id, idKind: 'quote', response: ok('{ quote }') },
  { method: 'get', path: '/api/quotes/:id/pdf', tag: 'Quotes', summary: 'One quote as PDF', access: 'signed-in', params: id, idKind: 'quote', response: { status: 200, description: 'PDF file', contentType: 'application/pdf' } },
  { method: 'post', path: '/api/quotes/:id/accept', tag: 'Quotes', summary: 'Accept a quote', access: 'signed-in', params: id, idKind: 'quote', response: ok('{ quote }') },
  { method: 'post', path: '/api/quotes/:id/decline', tag: 'Quotes', summary: 'Decline a quote', access: 'signed-in', params: id, idKind: 'quote', response: ok('{ quote }') },
  { method: 'get', path: '/api/component-rules', tag: 'Catalog', summary: 'Catalog rules (requires, conflicts, supersedes…)', access: staff, response: ok('{ items }') },
  { method: 'put', path: '/api/component-rules', tag: 'Catalog', summary: 'Replace the catalog rules', access: managers, body: rulesPutSchema, response: ok('Rules') },

  // ---------- forecast ----------
  { method: 'get', path: '/api/forecast', tag: 'Forecast', summary: 'Weighted revenue forecast, grouped', access: staff, query: forecastQuerySchema, response: ok('Forecast') },
  { method: 'get', path: '/api/forecast/items', tag: 'Forecast', summary: 'Forecast line items, paged', access: staff, query: forecastItemsQuerySchema, response: ok('{ items, total }') },
  { method: 'get', path: '/api/forecast/export.csv', tag: 'Forecast', summary: 'Forecast as CSV', access: staff, query: forecastExportQuerySchema, response: { status: 200, description: 'CSV file', contentType: 'text/csv' } },
  { method: 'get', path: '/api/quotas', tag: 'Forecast', summary: 'Quotas for a season', access: managers, query: quotaListQuerySchema, response: ok('Quotas') },
  { method: 'put', path: '/api/quotas', tag: 'Forecast', summary: 'Set a quota', access: managers, body: quotaSchema, response: ok('{ quota }') },
  { method: 'get', path: '/api/shop-capacity', tag: 'Forecast', summary: 'Shop hours booked against capacity by week', access: staff, query: shopCapacityQuerySchema, response: ok('Weeks') },
  { method: 'put', path: '/api/shop-capacity/weeks/:weekStart', tag: 'Forecast', summary: "Set a week's technician hours", access: managers, params: shopWeekParamsSchema, body: shopWeekSchema, response: ok('{ week }') },

  // ---------- users ----------
  { method: 'get', path: '/api/admin/users', tag: 'Users', summary: 'All users', access: adminOnly, response: ok('{ items }') },
  { method: 'post', path: '/api/admin/users', tag: 'Users', summary: 'Create a user', access: adminOnly, body: createUserSchema, response: created('{ user }') },
  { method: 'patch', path: '/api/admin/users/:id', tag: 'Users', summary: 'Change or disable a user', access: adminOnly, params: id, idKind: 'user', body: updateUserSchema, response: ok('{ user }') },

  // ---------- reminders ----------
  { method: 'get', path: '/api/reminders/unsubscribe', tag: 'Reminders', summary: 'Unsubscribe by signed e-mail link (HTML or JSON)', access: 'public', query: tokenQuerySchema, response: ok('Page or { unsubscribed }') },
  { method: 'post', path: '/api/reminders/unsubscribe', tag: 'Reminders', summary: 'Unsubscribe by signed e-mail link (form post)', access: 'public', csrf: false, bodyType: 'form', body: tokenBodySchema, response: ok('Page or { unsubscribed }') },
  { method: 'get', path: '/api/reminders/book', tag: 'Reminders', summary: 'The check-up booking page of a signed e-mail link', access: 'public', query: tokenQuerySchema, response: ok('Page or { booking }') },
  { method: 'post', path: '/api/reminders/book', tag: 'Reminders', summary: 'Book a check-up from a signed e-mail link', access: 'public', csrf: false, bodyType: 'form', body: bookingBodySchema, response: created('Page or { created, visit }') },
  { method: 'get', path: '/api/season-calendar', tag: 'Reminders', summary: 'Season windows (planting, harvest…)', access: staff, query: seasonCalendarQuerySchema, response: ok('{ entries }') },
  { method: 'put', path: '/api/season-calendar', tag: 'Reminders', summary: 'Replace the season windows', access: managers, query: seasonCalendarQuerySchema, body: seasonCalendarPutSchema, response: ok('{ entries }') },
  { method: 'get', path: '/api/campaigns', tag: 'Reminders', summary: 'Reminder campaigns', access: staff, query: campaignListQuerySchema, response: ok('{ items, total }') },
  { method: 'post', path: '/api/campaigns', tag: 'Reminders', summary: 'Create a reminder campaign', access: staff, body: campaignSchema, response: created('{ campaign }') },
  { method: 'get', path: '/api/campaigns/:id', tag: 'Reminders', summary: 'One campaign', access: staff, params: id, idKind: 'campaign', response: ok('{ campaign }') },
  { method: 'patch', path: '/api/campaigns/:id', tag: 'Reminders', summary: 'Change a campaign', access: staff, params: id, idKind: 'campaign', body: campaignUpdateSchema, response: ok('{ campaign }') },
  { method: 'get', path: '/api/campaigns/:id/audience', tag: 'Reminders', summary: "A campaign's recipients, paged", access: staff, params: id, idKind: 'campaign', query: audienceQuerySchema, response: ok('{ items, total }') },
  { method: 'post', path: '/api/campaigns/:id/preview', tag: 'Reminders', summary: 'Render the message for one recipient', access: staff, params: id, idKind: 'campaign', body: previewSchema, response: ok('{ preview }') },
  { method: 'post', path: '/api/campaigns/:id/test-send', tag: 'Reminders', summary: 'Send a test message', access: staff, params: id, idKind: 'campaign', body: testSendSchema, response: ok('Delivery result') },
  { method: 'post', path: '/api/campaigns/:id/run', tag: 'Reminders', summary: 'Queue the due reminders now', access: staff, params: id, idKind: 'campaign', response: ok('{ run }') },
  { method: 'get', path: '/api/outbox', tag: 'Reminders', summary: 'Queued and sent reminder messages', access: staff, query: outboxQuerySchema, response: ok('{ items, total }') },
  { method: 'get', path: '/api/outbox/:id', tag: 'Reminders', summary: 'One outbox message', access: staff, params: id, idKind: 'outboxMessage', response: ok('{ message }') },
  { method: 'post', path: '/api/outbox/:id/retry', tag: 'Reminders', summary: 'Send a failed message again', access: staff, params: id, idKind: 'outboxMessage', response: ok('{ message }') },
  { method: 'get', path: '/api/sent-mail', tag: 'Reminders', summary: 'Mail the local SMTP stand-in received', access: adminOnly, query: sentMailQuerySchema, response: ok('{ items, total }') },
  { method: 'get', path: '/api/sent-mail/:id', tag: 'Reminders', summary: 'One received message', access: adminOnly, params: id, idKind: 'sentMail', response: ok('{ message }') },
  { method: 'get', path: '/api/me/reminder-preferences', tag: 'Reminders', summary: "The grower's reminder choices", access: 'signed-in', response: ok('{ contacts }') },
  { method: 'put', path: '/api/me/reminder-preferences', tag: 'Reminders', summary: "Change the grower's reminder choices", access: 'signed-in', body: reminderPreferencesSchema, response: ok('{ contacts }') },

  // ---------- visits, routes, map, calendar ----------
  { method: 'get', path: '/api/visits', tag: 'Visits', summary: 'Visits in scope, filtered by dates, status, specialist', access: 'signed-in', query: visitListQuerySchema, response: ok('{ items, total }') },
  { method: 'get', path: '/api/visits/candidates', tag: 'Visits', summary: 'Accounts due a visit, for the week plan', access: staff, query: candidatesQuerySchema, response: ok('{ items }') },
  { method: 'post', path: '/api/visits/batch', tag: 'Visits', summary: 'Create several visits at once', access: staff, body: visitBatchSchema, response: created('{ visits }') },
  { method: 'get', path: '/api/visits/:id', tag: 'Visits', summary: 'One visit', access: 'signed-in', params: id, idKind: 'visit', response: ok('{ visit }') },
  { method: 'post', path: '/api/visits', tag: 'Visits', summary: 'Create a visit (a grower requests one on their own account)', access: 'signed-in', body: visitCreateSchema, response: created('{ visit }') },
  { method: 'patch', path: '/api/visits/:id', tag: 'Visits', summary: 'Change a visit (send the version you loaded)', access: staff, params: id, idKind: 'visit', body: visitUpdateSchema, response: ok('{ visit }') },
  { method: 'delete', path: '/api/visits/:id', tag: 'Visits', summary: 'Delete a visit', access: staff, params: id, idKind: 'visit', response: noContent },
  { method: 'post', path: '/api/routes/optimize', tag: 'Routes', summary: 'Order stops into the shortest day route', access: staff, body: optimizeRouteSchema, response: ok('Route') },
  { method: 'post', path: '/api/week-plans', tag: 'Routes', summary: "Plan a week's visits (?commit=true saves them)", access: staff, query: commitQuerySchema, body: weekPlanSchema, response: ok('Week plan') },
  { method: 'post', path: '/api/week-plans/commit', tag: 'Routes', summary: 'Save a week plan’s assignments as visits', access: staff, body: weekPlanCommitSchema, response: ok('{ visits }') },
  { method: 'get', path: '/api/week-plans/current', tag: 'Routes', summary: "The week's planned routes", access: staff, query: weekRoutesQuerySchema, response: ok('Week routes') },
  { method: 'post', path: '/api/week-plans/stream', tag: 'Routes', summary: 'Plan a week with progress events (Accept: text/event-stream)', access: staff, body: weekPlanSchema, response: { status: 200, description: 'Server-sent events: progress…, then result or error', contentType: 'text/event-stream' } },
  { method: 'get', path: '/api/map/accounts', tag: 'Visits', summary: 'Map markers for the accounts in scope', access: 'signed-in', query: mapQuerySchema, response: ok('{ items }') },
  { method: 'get', path: '/api/calendar/:token.ics', tag: 'Visits', summary: 'Visits as an iCalendar feed; the token in the path is the credential', access: 'public', params: calendarTokenParams, response: { status: 200, description: 'iCalendar feed', contentType: 'text/calendar' } },
  { method: 'get', path: '/api/me/calendar-links', tag: 'Visits', summary: "The caller's calendar feed links", access: 'signed-in', response: ok('{ feedUrl, webcalUrl, … }') },
  { method: 'post', path: '/api/me/calendar-links/rotate', tag: 'Visits', summary: 'Replace the calendar feed token (old links stop working)', access: 'signed-in', response: ok('{ feedUrl, webcalUrl, … }') },

  // ---------- attachments ----------
  { method: 'post', path: '/api/attachments', tag: 'Attachments', summary: 'Upload a photo or PDF (multipart: ownerType, ownerId, file; at most 10 MB)', access: staff, bodyType: 'multipart', body: attachmentFieldsSchema, response: created('{ attachment }') },
  { method: 'get', path: '/api/accounts/:id/attachments', tag: 'Attachments', summary: "The account's attachments", access: 'signed-in', params: id, idKind: 'account', query: attachmentListQuerySchema, response: ok('{ items }') },
  { method: 'get', path: '/api/attachments/:id', tag: 'Attachments', summary: "One attachment's details", access: 'signed-in', params: id, idKind: 'attachment', response: ok('{ attachment }') },
  { method: 'get', path: '/api/attachments/:id/file', tag: 'Attachments', summary: 'Download the file', access: 'signed-in', params: id, idKind: 'attachment', response: { status: 200, description: 'The stored bytes', contentType: 'application/octet-stream' } },
  { method: 'get', path: '/api/attachments/:id/thumb', tag: 'Attachments', summary: 'The image, for thumbnails (404 for documents)', access: 'signed-in', params: id, idKind: 'attachment', response: { status: 200, description: 'The image', contentType: 'image/*' } },
  { method: 'delete', path: '/api/attachments/:id', tag: 'Attachments', summary: 'Delete an attachment', access: staff, params: id, idKind: 'attachment', response: noContent },
];

export const isWrite = (method: HttpMethod) => method === 'post' || method === 'put' || method === 'patch' || method === 'delete';
