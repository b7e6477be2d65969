import { keepPreviousData, queryOptions, useMutation, useQueryClient } from '@tanstack/react-query';
import type { MovableItem, ShopWeek } from '@shared/schemas/forecast';
import { api } from '@/lib/api';

export type { MovableItem, ShopWeek };

export interface ShopCapacityResponse {
  from: string;
  to: string;
  defaultTechnicianHours: number;
  weeks: ShopWeek[];
  totals: { technicianHours: number; bookedHours: number; bookedHoursInScope: number; overWeeks: number };
}

export interface ShopWindow {
  from: string;
  to: string;
}

/**
 * The shop's install window before a planting season: from the first of October (harvest under
 * way) to the end of May (planting done) — common practice for row-crop planter work.
 */
export function installWindow(season: number): ShopWindow {
  return { from: `${season - 1}-10-01`, to: `${season}-05-31` };
}

/** How full a week is, as a share of its technician hours (a week with no hours and work booked is "full"). */
export function loadShare(week: Pick<ShopWeek, 'bookedHours' | 'technicianHours'>): number {
  if (week.technicianHours <= 0) return week.bookedHours > 0 ? Number.POSITIVE_INFINITY : 0;
  return week.bookedHours / week.technicianHours;
}

/** A week worth a line by default: work booked, or hours a manager set. */
export function isBusy(week: Pick<ShopWeek, 'bookedHours' | 'technicianHoursSet' | 'over'>): boolean {
  return week.bookedHours > 0 || week.technicianHoursSet || week.over;
}

export type WeekStatus = 'over' | 'near' | 'within';

/** Over: more booked than available; near: 90 % or more used; within: room left. */
export function weekStatus(week: Pick<ShopWeek, 'bookedHours' | 'technicianHours' | 'over'>): WeekStatus {
  if (week.over) return 'over';
  return loadShare(week) >= 0.9 ? 'near' : 'within';
}

export const shopCapacityKeys = {
  all: ['shop-capacity'] as const,
  windows: () => [...shopCapacityKeys.all, 'window'] as const,
  window: (w: ShopWindow) => [...shopCapacityKeys.windows(), w.from, w.to] as const,
};

/** GET /api/shop-capacity — admin, manager, specialist (items listed only within their scope). */
export const shopCapacityQueryOptions = (w: ShopWindow) =>
  queryOptions({
    queryKey: shopCapacityKeys.window(w),
    queryFn: ({ signal }) => api.get<ShopCapacityResponse>('/api/shop-capacity', { from: w.from, to: w.to }, signal),
    placeholderData: keepPreviousData,
  });

/** PUT /api/shop-capacity/weeks/:weekStart — admin and managers; null returns the week to the default. */
export function usePutShopWeekMutation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ weekStart, technicianHours }: { weekStart: string; technicianHours: number | null }) =>
      api.put<{ week: ShopWeek }>(`/api/shop-capacity/weeks/${weekStart}`, { technicianHours }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: shopCapacityKeys.all }),
  });
}
