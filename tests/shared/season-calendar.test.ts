import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  daysBetween,
  defaultPlantingWindow,
  dueReminder,
  parseMonthDay,
  PLANTING_WINDOW_DEFAULTS,
  reminderSchedule,
  reminderSendDate,
  windowStartIso,
} from '@shared/calc/season-calendar';

describe('planting-window defaults', () => {
  it('when the Kansas defaults are read, then corn opens Apr 15 and closes May 15, soybean May 15 – Jun 20', () => {
    // USDA-NASS, Agricultural Handbook 628 (2010), as summarised by K-State Extension:
    // corn most active Apr 15 – May 15; soybean May 15 – Jun 20 (Kansas).
    const corn = defaultPlantingWindow('ks-north-central', 'corn')!;
    expect([corn.windowStart, corn.windowEnd]).toEqual(['04-15', '05-15']);
    expect(corn.source).toMatch(/Agricultural Handbook 628/);
    expect(corn.source).toMatch(/K-State/);
    const soybean = defaultPlantingWindow('ks-north-central', 'soybean')!;
    expect([soybean.windowStart, soybean.windowEnd]).toEqual(['05-15', '06-20']);
  });

  it('when the Iowa defaults are read, then north-east corn is Apr 12 – May 2 and north-west/central Apr 15 – May 18', () => {
    // Iowa State University Integrated Crop Management, Abendroth & Elmore (2010): 95 % of maximum yield.
    const ne = defaultPlantingWindow('ia-northeast', 'corn')!;
    expect([ne.windowStart, ne.windowEnd]).toEqual(['04-12', '05-02']);
    expect(ne.source).toMatch(/Abendroth & Elmore \(2010\)/);
    const nwc = defaultPlantingWindow('ia-northwest-central', 'corn')!;
    expect([nwc.windowStart, nwc.windowEnd]).toEqual(['04-15', '05-18']);
  });

  it('when any default is read, then it has a source, the text of what the source says, and a valid window', () => {
    for (const w of PLANTING_WINDOW_DEFAULTS) {
      expect(w.source.length).toBeGreaterThan(10);
      expect(w.sourceText.length).toBeGreaterThan(10);
      expect(parseMonthDay(w.windowStart)).not.toBeNull();
      expect(daysBetween(windowStartIso(2027, w.windowStart), windowStartIso(2027, w.windowEnd))).toBeGreaterThan(0);
    }
  });

  it('when a region or crop has no published window, then no default is given', () => {
    expect(defaultPlantingWindow('ks-north-central', 'cotton')).toBeNull();
    expect(defaultPlantingWindow('nowhere', 'corn')).toBeNull();
  });
});

describe('reminder send dates', () => {
  it('when Kansas corn 2027 opens Apr 15, then reminders 60, 30 and 10 days ahead go on Feb 14, Mar 16 and Apr 5', () => {
    // Window start from USDA-NASS Agricultural Handbook 628 via K-State (Apr 15); REFERENCES.md:
    // "reminders lead the window start by the chosen offsets". Day counts: common calendar arithmetic.
    const start = windowStartIso(2027, '04-15');
    expect(start).toBe('2027-04-15');
    expect(reminderSendDate(start, 60)).toBe('2027-02-14');
    expect(reminderSendDate(start, 30)).toBe('2027-03-16');
    expect(reminderSendDate(start, 10)).toBe('2027-04-05');
    expect(reminderSendDate(start, 0)).toBe('2027-04-15');
  });

  it('when the season is a leap year, then the 60-day reminder lands one day later (Feb 29 counts)', () => {
    // Same Kansas window (USDA-NASS AH 628 via K-State); 2028 has Feb 29.
    expect(reminderSendDate(windowStartIso(2028, '04-15'), 60)).toBe('2028-02-15');
  });

  it('when north-east Iowa corn opens Apr 12, 2027, then the 30-day reminder goes on Mar 13', () => {
    // Iowa State ICM, Abendroth & Elmore (2010): north-east Iowa about Apr 12 – May 2.
    expect(reminderSendDate(windowStartIso(2027, '04-12'), 30)).toBe('2027-03-13');
  });

  it('when an offset is negative or fractional, or a date impossible, then it is refused', () => {
    expect(() => reminderSendDate('2027-04-15', -1)).toThrow(RangeError);
    expect(() => reminderSendDate('2027-04-15', 1.5)).toThrow(RangeError);
    expect(() => reminderSendDate('2027-02-30', 1)).toThrow(RangeError);
    expect(parseMonthDay('02-29')).toBeNull();
    expect(parseMonthDay('13-01')).toBeNull();
    expect(parseMonthDay('4-15')).toBeNull();
    expect(() => windowStartIso(2027, '02-30')).toThrow(RangeError);
  });

  it('when any send date is computed, then it lies exactly the offset before the window start (property)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2000, max: 2099 }), fc.integer({ min: 0, max: 364 }), fc.integer({ min: 0, max: 365 }), (season, dayOfYear, offsetDays) => {
        const start = new Date(Date.UTC(2027, 0, 1 + dayOfYear)).toISOString().slice(5, 10);
        const windowStart = windowStartIso(season, start);
        const sendOn = reminderSendDate(windowStart, offsetDays);
        return daysBetween(sendOn, windowStart) === offsetDays && sendOn <= windowStart;
      }),
    );
  });
});

describe('which reminder is due', () => {
  const start = '2027-04-15'; // Kansas corn 2027 (USDA-NASS AH 628 via K-State)

  it('when it is Dec 1, 2026, then nothing of 60/30/10 is due but a 140-day early-order reminder is', () => {
    expect(dueReminder(start, [60, 30, 10], '2026-12-01')).toBeNull();
    // Apr 15 minus 140 days = Nov 26, 2026: already passed on Dec 1, and no later one is due yet.
    expect(dueReminder(start, [140, 60, 30, 10], '2026-12-01')).toEqual({ offsetDays: 140, sendOn: '2026-11-26', state: 'due' });
  });

  it('when a campaign starts late, then only the latest missed reminder is due and the earlier ones are superseded', () => {
    const rows = reminderSchedule(start, [10, 60, 30], '2027-03-20');
    expect(rows.map((r) => [r.offsetDays, r.sendOn, r.state])).toEqual([
      [60, '2027-02-14', 'superseded'],
      [30, '2027-03-16', 'due'],
      [10, '2027-04-05', 'upcoming'],
    ]);
  });

  it('when the window has opened, then nothing is due any more; on the opening day a 0-day reminder still is', () => {
    expect(dueReminder(start, [60, 30, 10], '2027-04-16')).toBeNull();
    expect(reminderSchedule(start, [60], '2027-04-16')[0].state).toBe('closed');
    expect(dueReminder(start, [10, 0], '2027-04-15')?.offsetDays).toBe(0);
    expect(dueReminder(start, [10], '2027-04-15')?.offsetDays).toBe(10);
  });

  it('when it is the send day itself, then that reminder is due', () => {
    expect(dueReminder(start, [60, 30, 10], '2027-02-14')?.offsetDays).toBe(60);
    expect(dueReminder(start, [60, 30, 10], '2027-02-13')).toBeNull();
  });
});
