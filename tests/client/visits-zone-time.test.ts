// Daylight-saving dates and offsets: US federal law (15 U.S.C. §260a, as amended by the Energy
// Policy Act of 2005) starts daylight time on the second Sunday of March and ends it on the first
// Sunday of November, at 2:00 a.m. local; Central time is UTC−6 standard, UTC−5 daylight
// (15 U.S.C. §261; 49 CFR Part 71). In 2026 those Sundays are 8 March and 1 November.
import { describe, expect, it } from 'vitest';
import {
  addDaysIso,
  clockText,
  durationText,
  fromWallDate,
  fromZoneLocal,
  instantText,
  minutesFromClock,
  mondayOf,
  shortDateText,
  toWallDate,
  toZoneLocal,
  todayAtDealership,
  wallDateIso,
} from '@/features/visits/model/zone-time';

const ZONE = 'America/Chicago';

describe('dealership wall-clock time', () => {
  it('when a December date and minute are converted, then the instant is six hours ahead (CST, UTC−6; 15 U.S.C. §261)', () => {
    expect(fromZoneLocal('2026-12-07', 600, ZONE).toISOString()).toBe('2026-12-07T16:00:00.000Z');
  });

  it('when a July date and minute are converted, then the instant is five hours ahead (CDT, UTC−5; 15 U.S.C. §260a)', () => {
    expect(fromZoneLocal('2026-07-15', 480, ZONE).toISOString()).toBe('2026-07-15T13:00:00.000Z');
  });

  it('when the clocks change on 8 March and 1 November 2026 (15 U.S.C. §260a), then 09:00 local moves across the offset change', () => {
    expect(fromZoneLocal('2026-03-07', 540, ZONE).toISOString()).toBe('2026-03-07T15:00:00.000Z');
    expect(fromZoneLocal('2026-03-08', 540, ZONE).toISOString()).toBe('2026-03-08T14:00:00.000Z');
    expect(fromZoneLocal('2026-10-31', 540, ZONE).toISOString()).toBe('2026-10-31T14:00:00.000Z');
    expect(fromZoneLocal('2026-11-01', 540, ZONE).toISOString()).toBe('2026-11-01T15:00:00.000Z');
  });

  it('when a wall time is skipped by the spring change (02:30 on 8 March 2026), then it lands beside the gap, where the server puts it', () => {
    // The server's fromLocal (server/modules/visits/local-time.ts) gives 07:30Z, i.e. 01:30 CST.
    expect(fromZoneLocal('2026-03-08', 150, ZONE).toISOString()).toBe('2026-03-08T07:30:00.000Z');
  });

  it('when an instant is read back, then the date and minute are the ones it was made from, across a year of days', () => {
    for (let k = 0; k < 366; k += 1) {
      const date = addDaysIso('2026-01-01', k);
      for (const minute of [0, 420, 615, 1079, 1439]) {
        if (date === '2026-03-08' && minute >= 120 && minute < 180) continue; // the skipped hour
        expect(toZoneLocal(fromZoneLocal(date, minute, ZONE), ZONE)).toEqual({ date, minute });
      }
    }
  });

  it('when an instant late in the UTC day is read, then the local date is the day before (UTC 03:00 is 21:00 CST)', () => {
    expect(toZoneLocal(new Date('2026-12-08T03:00:00Z'), ZONE)).toEqual({ date: '2026-12-07', minute: 21 * 60 });
    expect(todayAtDealership(new Date('2026-12-02T04:30:00Z'), ZONE)).toBe('2026-12-01');
  });

  it('when an instant becomes a wall date and back, then the browser zone does not matter and the instant is unchanged', () => {
    const instant = new Date('2026-12-09T19:15:00Z'); // 13:15 CST
    const wall = toWallDate(instant, ZONE);
    expect([wall.getHours(), wall.getMinutes(), wallDateIso(wall)]).toEqual([13, 15, '2026-12-09']);
    expect(fromWallDate(wall, ZONE).toISOString()).toBe(instant.toISOString());
    // A drop one day later at the same wall time.
    const nextDay = new Date(wall.getFullYear(), wall.getMonth(), wall.getDate() + 1, 13, 15);
    expect(fromWallDate(nextDay, ZONE).toISOString()).toBe('2026-12-10T19:15:00.000Z');
  });
});

describe('dates and clocks as text', () => {
  it('when a date is given, then its Monday is the start of its week (Sunday belongs to the week before)', () => {
    expect(mondayOf('2026-12-01')).toBe('2026-11-30');
    expect(mondayOf('2026-12-07')).toBe('2026-12-07');
    expect(mondayOf('2026-12-13')).toBe('2026-12-07');
    expect(mondayOf('2027-01-01')).toBe('2026-12-28');
  });

  it('when days are added across a month and a leap day, then the calendar date is right', () => {
    expect(addDaysIso('2026-12-28', 7)).toBe('2027-01-04');
    expect(addDaysIso('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDaysIso('2026-03-01', -1)).toBe('2026-02-28');
  });

  it('when minutes are shown as a clock and read back, then they round-trip; nonsense reads as null', () => {
    expect(clockText(450)).toBe('07:30');
    expect(clockText(1079.6)).toBe('18:00');
    expect(minutesFromClock('07:30')).toBe(450);
    expect(minutesFromClock('7:05')).toBe(425);
    expect(minutesFromClock('24:00')).toBe(1440);
    expect(minutesFromClock('24:30')).toBeNull();
    expect(minutesFromClock('12:75')).toBeNull();
    expect(minutesFromClock('noon')).toBeNull();
  });

  it('when a date and a duration are shown, then they read in words', () => {
    expect(shortDateText('2026-12-07')).toBe('Mon 7 Dec');
    expect(durationText(90)).toBe('1 h 30 min');
    expect(durationText(45)).toBe('45 min');
    expect(durationText(240)).toBe('4 h');
  });

  it('when an instant is shown, then it reads on the dealership clock, with the year only outside the current one', () => {
    const now = new Date('2026-12-01T18:00:00Z');
    expect(instantText('2026-12-07T16:00:00Z', ZONE, now)).toBe('Mon 7 Dec, 10:00');
    expect(instantText('2026-03-02T14:00:00Z', ZONE, new Date('2027-01-05T18:00:00Z'))).toBe('Mon 2 Mar 2026, 08:00');
  });
});
