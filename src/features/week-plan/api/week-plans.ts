import { queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { VisitPurpose, VisitStatus, VisitView, WeekPlanCommitInput, WeekPlanInput, WeekPlanView } from '@shared/schemas/visits';
import { api, ApiError } from '@/lib/api';
import { VISIT_DEPENDENT_KEYS } from '@/features/visits/api/update-visit';
import { createSseReader } from '../model/sse';

export type { WeekPlanView };

/** One stop of GET /api/week-plans/current: a planned (or done) visit in time order. */
export interface CurrentRouteStop {
  visitId: number;
  accountId: number;
  accountName: string;
  purpose: VisitPurpose;
  status: VisitStatus;
  lat: number;
  lng: number;
  startMin: number;
  departMin: number;
  legKm: number;
  legDriveMin: number;
  fixed: boolean;
  version: number;
}

export interface CurrentRouteDay {
  date: string;
  startMin: number;
  endMin: number;
  stops: CurrentRouteStop[];
  distanceKm: number;
  driveMin: number;
  workMin: number;
  returnMin: number | null;
  /** Where the times leave too little room to drive, or run past the day. */
  warnings: string[];
}

export interface CurrentWeekRoutes {
  weekStart: string;
  specialistId: number;
  depot: { name: string; lat: number; lng: number };
  days: CurrentRouteDay[];
}

export interface WeekRoutesFilters {
  weekStart: string;
  specialistId?: number;
  days?: number;
}

export const weekPlanKeys = {
  all: ['week-plans'] as const,
  currents: () => [...weekPlanKeys.all, 'current'] as const,
  current: (filters: WeekRoutesFilters) => [...weekPlanKeys.currents(), filters] as const,
};

/** GET /api/week-plans/current (staff): the specialist's planned visits of a week as day routes. */
export const currentWeekRoutesQueryOptions = (filters: WeekRoutesFilters) =>
  queryOptions({
    queryKey: weekPlanKeys.current(filters),
    queryFn: ({ signal }) =>
      api.get<CurrentWeekRoutes>('/api/week-plans/current', { weekStart: filters.weekStart, specialistId: filters.specialistId, days: filters.days ?? 5 }, signal),
  });

export interface PlanProgressEvent {
  phase: 'placing' | 'improving' | 'done';
  fraction: number;
}

async function csrfToken(): Promise<string> {
  return (await api.get<{ token: string }>('/api/auth/csrf')).token;
}

async function errorOf(response: Response): Promise<ApiError> {
  let body: { error?: { code?: string; message?: string; details?: { fields?: Record<string, unknown> } } } = {};
  try {
    body = await response.json();
  } catch {
    // Not JSON: the fallback message below.
  }
  return new ApiError({
    status: response.status,
    code: body.error?.code ?? `http_${response.status}`,
    message: body.error?.message ?? 'The week could not be planned. Try again.',
    fields: Object.fromEntries(Object.entries(body.error?.details?.fields ?? {}).map(([k, v]) => [k, String(v)])),
  });
}

/**
 * POST /api/week-plans/stream: plans the week and reports progress as the server works. Input
 * problems come back before the stream opens (400 with field messages, as ApiError); the plan is
 * the stream's final `result` event.
 */
export async function streamWeekPlan(body: WeekPlanInput, onProgress: (progress: PlanProgressEvent) => void, signal?: AbortSignal): Promise<WeekPlanView> {
  let response: Response;
  try {
    response = await fetch('/api/week-plans/stream', {
      method: 'POST',
      credentials: 'include',
      headers: { Accept: 'text/event-stream', 'Content-Type': 'application/json', 'X-CSRF-Token': await csrfToken() },
      body: JSON.stringify(body),
      signal,
    });
  } catch (cause) {
    if (cause instanceof DOMException && cause.name === 'AbortError') throw cause;
    throw new ApiError({ status: 0, code: 'network', message: 'Rowpath could not reach the server. Check the connection and try again.' });
  }
  if (!response.ok || !response.body) throw await errorOf(response);

  // Filled from inside the reader's callback.
  const outcome: { result?: WeekPlanView; failure?: ApiError } = {};
  const reader = createSseReader(({ event, data }) => {
    const payload = JSON.parse(data) as unknown;
    if (event === 'progress') onProgress(payload as PlanProgressEvent);
    else if (event === 'result') outcome.result = payload as WeekPlanView;
    else if (event === 'error') {
      const error = (payload as { error?: { code?: string; message?: string } }).error;
      outcome.failure = new ApiError({ status: 500, code: error?.code ?? 'internal', message: error?.message ?? 'The week could not be planned.' });
    }
  });
  const stream = response.body.pipeThrough(new TextDecoderStream()).getReader();
  for (;;) {
    const { value, done } = await stream.read();
    if (done) break;
    reader.push(value);
  }
  reader.end();
  if (outcome.failure) throw outcome.failure;
  if (!outcome.result) throw new ApiError({ status: 0, code: 'network', message: 'The connection closed before the plan arrived. Try again.' });
  return outcome.result;
}

/** POST /api/week-plans/commit (staff): writes the plan's times onto the visits, all or nothing. */
export function useCommitWeekPlanMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: WeekPlanCommitInput) => api.post<{ visits: VisitView[] }>('/api/week-plans/commit', body),
    onSuccess: () => {
      for (const key of VISIT_DEPENDENT_KEYS) void queryClient.invalidateQueries({ queryKey: key });
    },
  });
}
