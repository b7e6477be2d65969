// Shop capacity helpers: the harvest-to-planting window and how full a week reads.
import { describe, expect, it } from 'vitest';
import { SHOP_CAPACITY_MAX_DAYS, shopCapacityQuerySchema } from '@shared/schemas/forecast';
import { installWindow, isBusy, loadShare, weekStatus } from '@/features/shop-capacity/api/shop-capacity';

describe('the install window before a season', () => {
  it('when the 2027 season is chosen, then the shop weeks run from October 2026 to the end of May 2027 (common practice)', () => {
    expect(installWindow(2027)).toEqual({ from: '2026-10-01', to: '2027-05-31' });
  });

  it('when any season’s window is asked of the server, then it fits the server’s limit of 53 weeks', () => {
    for (const season of [2000, 2027, 2028, 2100]) {
      const w = installWindow(season);
      expect(shopCapacityQuerySchema.safeParse(w).success).toBe(true);
      expect((Date.parse(w.to) - Date.parse(w.from)) / 86_400_000).toBeLessThanOrEqual(SHOP_CAPACITY_MAX_DAYS);
    }
  });
});

describe('how full a week is', () => {
  it('when 72 of 80 technician hours are booked, then the week is 90 % full and reads as nearly full', () => {
    expect(loadShare({ bookedHours: 72, technicianHours: 80 })).toBeCloseTo(0.9, 10);
    expect(weekStatus({ bookedHours: 72, technicianHours: 80, over: false })).toBe('near');
  });

  it('when fewer hours are booked than 90 % of those available, then the week has room', () => {
    expect(weekStatus({ bookedHours: 71.9, technicianHours: 80, over: false })).toBe('within');
    expect(weekStatus({ bookedHours: 0, technicianHours: 0, over: false })).toBe('within');
  });

  it('when the server flags a week over, then it reads as over whatever the ratio', () => {
    expect(weekStatus({ bookedHours: 12, technicianHours: 4, over: true })).toBe('over');
  });

  it('when a week has no technician hours but work is booked, then it is full beyond measure rather than a division by zero', () => {
    expect(loadShare({ bookedHours: 5, technicianHours: 0 })).toBe(Number.POSITIVE_INFINITY);
    expect(loadShare({ bookedHours: 0, technicianHours: 0 })).toBe(0);
  });
});

describe('which weeks show by default', () => {
  it('when a week has nothing booked and the default hours, then it folds away; bookings or set hours keep it on show', () => {
    expect(isBusy({ bookedHours: 0, technicianHoursSet: false, over: false })).toBe(false);
    expect(isBusy({ bookedHours: 0.5, technicianHoursSet: false, over: false })).toBe(true);
    expect(isBusy({ bookedHours: 0, technicianHoursSet: true, over: false })).toBe(true);
  });
});
