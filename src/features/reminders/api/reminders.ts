import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import type { ScheduledReminder } from '@shared/calc/season-calendar';
import type { CampaignStatus, OutboxStatus } from '@shared/schemas/reminders';
import { api } from '@/lib/api';

// ---------- types: the API's answers ----------

export interface PublishedWindow {
  windowStart: string;
  windowEnd: string;
  source: string;
  sourceText: string;
}

export interface CalendarEntry {
  regionKey: string;
  regionLabel: string;
  crop: string;
  windowStart: string;
  windowEnd: string;
  source: string | null;
  sourceText: string | null;
  /** true while the published default is in use. */
  isDefault: boolean;
  published: PublishedWindow | null;
  windowStartDate?: string;
  windowEndDate?: string;
  updatedAt: string | null;
}

export type OutboxCounts = Record<OutboxStatus, number>;

export interface Campaign {
  id: number;
  name: string;
  season: number;
  regionKey: string;
  crop: string;
  offsetsDays: number[];
  audience: { territoryIds: number[]; growsCrop: boolean; hasRoadmapItems: boolean; noCheckupSince: string | null };
  subject: string;
  body: string;
  status: CampaignStatus;
  version: number;
  createdBy: number | null;
  updatedBy: number | null;
  createdAt: string;
  updatedAt: string;
  window: {
    regionLabel: string;
    windowStart: string;
    windowEnd: string;
    windowStartDate: string | null;
    windowEndDate: string;
    source: string | null;
    sourceText: string | null;
    isDefault: boolean;
  } | null;
  schedule: ScheduledReminder[];
  outbox: OutboxCounts;
}

export interface AudienceContact {
  contactId: number;
  contactName: string;
  email: string;
  accountId: number;
  accountName: string;
  territoryId: number;
  specialistId: number | null;
}

export interface Preview {
  subject: string;
  text: string;
  html: string;
  to: string | null;
  contact: { id: number; name: string; email: string | null };
  account: { id: number; name: string };
  offsetDays: number;
  sendOn: string;
  inAudience: boolean;
  notInAudienceBecause: string[];
}

export interface RunResult {
  campaignId: number;
  campaignName: string;
  offsetDays: number | null;
  sendOn: string | null;
  windowStartDate: string | null;
  audience: number;
  enqueued: number;
  alreadyQueued: number;
  note: string | null;
}

export interface OutboxMessage {
  id: number;
  campaignId: number;
  campaignName: string;
  contactId: number;
  contactName: string;
  accountId: number;
  accountName: string;
  toEmail: string;
  offsetDays: number;
  sendOn: string;
  subject: string;
  status: OutboxStatus;
  attempts: number;
  nextAttemptAt: string | null;
  lastError: string | null;
  sentAt: string | null;
  messageId: string;
  createdAt: string;
  updatedAt: string;
  text?: string;
  html?: string;
}

export interface OutboxFilters {
  status?: OutboxStatus;
  campaignId?: number;
  page: number;
  pageSize: number;
}

// ---------- keys and queries ----------

export const reminderKeys = {
  all: ['reminders'] as const,
  calendar: (season: number) => [...reminderKeys.all, 'calendar', season] as const,
  campaigns: () => [...reminderKeys.all, 'campaigns'] as const,
  campaignList: (filters: { page: number; pageSize: number }) => [...reminderKeys.campaigns(), 'list', filters] as const,
  campaign: (id: number) => [...reminderKeys.campaigns(), 'detail', id] as const,
  audience: (id: number, page: number, pageSize: number) => [...reminderKeys.campaign(id), 'audience', page, pageSize] as const,
  outbox: () => [...reminderKeys.all, 'outbox'] as const,
  outboxList: (filters: OutboxFilters) => [...reminderKeys.outbox(), 'list', filters] as const,
  outboxMessage: (id: number) => [...reminderKeys.outbox(), 'message', id] as const,
};

/** GET /api/season-calendar?season= — staff read; the windows with their published sources. */
export const seasonCalendarQueryOptions = (season: number) =>
  queryOptions({
    queryKey: reminderKeys.calendar(season),
    queryFn: ({ signal }) => api.get<{ entries: CalendarEntry[] }>('/api/season-calendar', { season }, signal),
    select: (data) => data.entries,
    staleTime: 60_000,
  });

/** The campaign list the reminder screens show: one page holds a dealership's campaigns. */
export const CAMPAIGN_LIST = { page: 1, pageSize: 100 };

/** GET /api/campaigns — admin all; manager and specialist, campaigns touching their territories. */
export const campaignListQueryOptions = (filters: { page: number; pageSize: number } = { page: 1, pageSize: 50 }) =>
  queryOptions({
    queryKey: reminderKeys.campaignList(filters),
    queryFn: ({ signal }) => api.get<{ items: Campaign[]; total: number }>('/api/campaigns', filters, signal),
    placeholderData: keepPreviousData,
  });

/** GET /api/campaigns/:id — 404 outside the user's territories. */
export const campaignQueryOptions = (id: number) =>
  queryOptions({
    queryKey: reminderKeys.campaign(id),
    queryFn: ({ signal }) => api.get<{ campaign: Campaign }>(`/api/campaigns/${id}`, undefined, signal),
    select: (data) => data.campaign,
  });

/** GET /api/campaigns/:id/audience — who the campaign reaches today, limited to the user's territories. */
export const audienceQueryOptions = (id: number, page = 1, pageSize = 200) =>
  queryOptions({
    queryKey: reminderKeys.audience(id, page, pageSize),
    queryFn: ({ signal }) => api.get<{ items: AudienceContact[]; total: number }>(`/api/campaigns/${id}/audience`, { page, pageSize }, signal),
  });

/** GET /api/outbox — staff; rows newest first with counts per status. */
export const outboxQueryOptions = (filters: OutboxFilters) =>
  queryOptions({
    queryKey: reminderKeys.outboxList(filters),
    queryFn: ({ signal }) =>
      api.get<{ items: OutboxMessage[]; total: number; counts: OutboxCounts }>(
        '/api/outbox',
        { status: filters.status, campaignId: filters.campaignId, page: filters.page, pageSize: filters.pageSize },
        signal,
      ),
    placeholderData: keepPreviousData,
  });

/** GET /api/outbox/:id — one message with its text and HTML parts. */
export const outboxMessageQueryOptions = (id: number) =>
  queryOptions({
    queryKey: reminderKeys.outboxMessage(id),
    queryFn: ({ signal }) => api.get<{ message: OutboxMessage }>(`/api/outbox/${id}`, undefined, signal),
    select: (data) => data.message,
  });

/** Messages still moving: while any are, the screens poll for the sender's progress. */
export function messagesInFlight(counts: OutboxCounts | undefined): number {
  return counts ? counts.pending + counts.sending : 0;
}
