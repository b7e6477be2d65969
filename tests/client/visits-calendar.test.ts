// The calendar's conversions. Offsets: Central Standard Time is UTC−6 in December
// (15 U.S.C. §261; 49 CFR Part 71).
import { describe, expect, it } from 'vitest';
import type { VisitView } from '@shared/schemas/visits';
import { canMove, dropToStart, isIsoDate, parseCalendarView, rangeOfView, routesWeekOf, stepDate, viewTitle, visitsToEvents } from '@/features/calendar/model/events';

const visit = (id: number, over: Partial<VisitView> = {}): VisitView => ({
  id,
  accountId: 1,
  accountName: `Account ${id}`,
  town: null,
  lat: 39.8,
  lng: -98.2,
  specialistId: 5,
  specialistName: 'Specialist',
  planterId: null,
  purpose: 'pre-season-checkup',
  status: 'planned',
  startsAt: '2026-12-08T16:00:00.000Z',
  endsAt: '2026-12-08T17:30:00.000Z',
  durationMin: 90,
  windowStartMin: null,
  windowEndMin: null,
  fixed: false,
  notes: null,
  checklist: [],
  roadmapItemIds: [],
  requestedByContactId: null,
  version: 1,
  updatedAt: '2026-12-01T00:00:00.000Z',
  ...over,
});

describe('visits as calendar events', () => {
  it('when a visit starts at 16:00 UTC in December, then the event shows 10:00–11:30 on the dealership clock (CST, UTC−6)', () => {
    const [event] = visitsToEvents([visit(1)], 'America/Chicago');
    expect([event.start.getDate(), event.start.getHours(), event.start.getMinutes()]).toEqual([8, 10, 0]);
    expect([event.end.getHours(), event.end.getMinutes()]).toEqual([11, 30]);
    expect(event.draggable).toBe(true);
  });

  it('when visits are unscheduled or cancelled, then they are not events; done ones show but cannot move', () => {
    const events = visitsToEvents([visit(1, { startsAt: null, status: 'requested' }), visit(2, { status: 'cancelled' }), visit(3, { status: 'done' })]);
    expect(events.map((e) => [e.id, e.draggable])).toEqual([[3, false]]);
    expect(canMove({ status: 'requested', startsAt: '2026-12-08T16:00:00Z' })).toBe(true);
  });

  it('when an event is dropped a day later at the same time, then the new start is the same clock time on that day, in UTC', () => {
    const [event] = visitsToEvents([visit(1)], 'America/Chicago');
    const dropped = new Date(event.start.getFullYear(), event.start.getMonth(), event.start.getDate() + 1, 10, 0);
    expect(dropToStart(event, dropped, false, 'America/Chicago')).toEqual({ ok: true, startsAt: '2026-12-09T16:00:00.000Z', moved: true });
    expect(dropToStart(event, event.start, false, 'America/Chicago')).toEqual({ ok: true, startsAt: '2026-12-08T16:00:00.000Z', moved: false });
  });

  it('when an event is dropped on the all-day row or is already done, then the drop is refused with a reason', () => {
    const [event] = visitsToEvents([visit(1)], 'America/Chicago');
    expect(dropToStart(event, event.start, true)).toMatchObject({ ok: false, reason: expect.stringMatching(/time of day/) });
    expect(dropToStart({ visit: visit(2, { status: 'done' }), start: event.start }, event.start, false)).toMatchObject({ ok: false, reason: expect.stringMatching(/done/) });
  });

  it('when a visit off the 15-minute grid is dragged across to another day, then it keeps its exact time; a drop a full step away takes the new time', () => {
    // 13:32 CST on 8 December is 19:32 UTC.
    const [event] = visitsToEvents([visit(1, { startsAt: '2026-12-08T19:32:00.000Z' })], 'America/Chicago');
    const snapped = new Date(event.start.getFullYear(), event.start.getMonth(), event.start.getDate() + 2, 13, 30);
    expect(dropToStart(event, snapped, false, 'America/Chicago')).toMatchObject({ ok: true, startsAt: '2026-12-10T19:32:00.000Z' });
    const earlier = new Date(event.start.getFullYear(), event.start.getMonth(), event.start.getDate() + 2, 13, 15);
    expect(dropToStart(event, earlier, false, 'America/Chicago')).toMatchObject({ ok: true, startsAt: '2026-12-10T19:15:00.000Z' });
  });
});

describe('what each view fetches', () => {
  it('when the view is a day, a week or a month, then the range covers what it shows', () => {
    expect(rangeOfView('day', '2026-12-09')).toEqual({ from: '2026-12-09', to: '2026-12-10' });
    expect(rangeOfView('week', '2026-12-09')).toEqual({ from: '2026-12-07', to: '2026-12-14' });
    expect(rangeOfView('work_week', '2026-12-13')).toEqual({ from: '2026-12-07', to: '2026-12-14' });
    // December 2026 starts on a Tuesday: the grid starts Monday 30 November, six weeks long.
    expect(rangeOfView('month', '2026-12-20')).toEqual({ from: '2026-11-30', to: '2027-01-11' });
    expect(routesWeekOf('2026-12-10')).toBe('2026-12-07');
  });

  it('when the address holds an unknown view or an impossible date, then the week view and no date are used', () => {
    expect(parseCalendarView('agenda')).toBe('week');
    expect(parseCalendarView('month')).toBe('month');
    expect(isIsoDate('2026-12-07')).toBe(true);
    expect(isIsoDate('2026-02-30')).toBe(false);
    expect(isIsoDate('12/07/2026')).toBe(false);
  });
});

describe('moving through the calendar', () => {
  it('when stepping a day, a week or a month, then the date moves by that much; a month step keeps inside the shorter month', () => {
    expect(stepDate('day', '2026-12-31', 1)).toBe('2027-01-01');
    expect(stepDate('week', '2026-12-07', -1)).toBe('2026-11-30');
    expect(stepDate('work_week', '2026-12-07', 1)).toBe('2026-12-14');
    expect(stepDate('month', '2027-01-31', 1)).toBe('2027-02-28');
    expect(stepDate('month', '2026-12-15', 1)).toBe('2027-01-15');
    expect(stepDate('month', '2026-01-10', -1)).toBe('2025-12-10');
  });

  it('when the view is titled, then the range reads in words, across a month or a year where it spans one', () => {
    expect(viewTitle('day', '2026-12-08')).toBe('Tue 8 Dec 2026');
    expect(viewTitle('work_week', '2026-12-09')).toBe('7–11 Dec 2026');
    expect(viewTitle('week', '2026-12-09')).toBe('7–13 Dec 2026');
    expect(viewTitle('week', '2026-11-30')).toBe('30 Nov – 6 Dec 2026');
    expect(viewTitle('week', '2026-12-30')).toBe('28 Dec 2026 – 3 Jan 2027');
    expect(viewTitle('month', '2026-12-09')).toBe('December 2026');
  });
});
