import { keepPreviousData, queryOptions } from '@tanstack/react-query';
import { api } from '@/lib/api';

export interface SentMailSummary {
  id: number;
  messageId: string;
  from: string | null;
  to: string | null;
  envelopeTo: string[];
  subject: string | null;
  sizeBytes: number;
  /** How many times the same Message-ID arrived (a resend after a crash shows here, not as a second row). */
  repeatCount: number;
  receivedAt: string;
}

export interface SentMailMessage extends SentMailSummary {
  envelopeFrom: string | null;
  text: string | null;
  html: string | null;
  headers: Record<string, string>;
}

export interface SentMailFilters {
  q?: string;
  page: number;
  pageSize: number;
}

export const sentMailKeys = {
  all: ['sent-mail'] as const,
  lists: () => [...sentMailKeys.all, 'list'] as const,
  list: (filters: SentMailFilters) => [...sentMailKeys.lists(), filters] as const,
  detail: (id: number) => [...sentMailKeys.all, 'detail', id] as const,
};

/** GET /api/sent-mail (admin): what the local SMTP stand-in received, newest first. */
export const sentMailListQueryOptions = (filters: SentMailFilters) =>
  queryOptions({
    queryKey: sentMailKeys.list(filters),
    queryFn: ({ signal }) => api.get<{ items: SentMailSummary[]; total: number }>('/api/sent-mail', { q: filters.q, page: filters.page, pageSize: filters.pageSize }, signal),
    placeholderData: keepPreviousData,
  });

/** GET /api/sent-mail/:id (admin): one received message with its parts. */
export const sentMailQueryOptions = (id: number) =>
  queryOptions({
    queryKey: sentMailKeys.detail(id),
    queryFn: ({ signal }) => api.get<{ message: SentMailMessage }>(`/api/sent-mail/${id}`, undefined, signal),
    select: (data) => data.message,
    staleTime: Infinity,
  });

function positiveInt(value: string | null): number | undefined {
  if (value === null || !/^\d{1,9}$/.test(value)) return undefined;
  const n = Number(value);
  return n >= 1 ? n : undefined;
}

export const SENT_MAIL_PAGE_SIZE = 50;

/** The list's search and page live in the URL. */
export function parseSentMailParams(params: URLSearchParams): SentMailFilters {
  const q = params.get('q')?.trim().slice(0, 100);
  return { q: q || undefined, page: positiveInt(params.get('page')) ?? 1, pageSize: SENT_MAIL_PAGE_SIZE };
}

export function toSentMailParams(filters: Partial<SentMailFilters>): URLSearchParams {
  const params = new URLSearchParams();
  if (filters.q) params.set('q', filters.q);
  if (filters.page && filters.page > 1) params.set('page', String(filters.page));
  return params;
}
