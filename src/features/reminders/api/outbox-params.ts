import { outboxStatuses, type OutboxStatus } from '@shared/schemas/reminders';
import type { OutboxFilters } from './reminders';

/*
 * The outbox's filters live in the URL (?status=failed&campaignId=3&page=2), so a link from a
 * campaign's counts opens the right rows. Anything odd in the address falls back to the default.
 */

export const OUTBOX_PAGE_SIZE = 50;

function positiveInt(value: string | null): number | undefined {
  if (value === null || !/^\d{1,9}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 ? n : undefined;
}

export function parseOutboxParams(params: URLSearchParams): OutboxFilters {
  const status = params.get('status');
  return {
    status: status && (outboxStatuses as readonly string[]).includes(status) ? (status as OutboxStatus) : undefined,
    campaignId: positiveInt(params.get('campaignId')),
    page: positiveInt(params.get('page')) ?? 1,
    pageSize: OUTBOX_PAGE_SIZE,
  };
}

export function toOutboxParams(filters: Partial<OutboxFilters>): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.status) params.set('status', filters.status);
  if (filters.campaignId) params.set('campaignId', String(filters.campaignId));
  if (filters.page && filters.page > 1) params.set('page', String(filters.page));
  return params;
}

/** A link to the outbox showing one campaign's messages, optionally of one status. */
export function outboxHref(filters: Partial<OutboxFilters>): string {
  const query = toOutboxParams(filters).toString();
  return `/reminders/outbox${query ? `?${query}` : ''}`;
}
