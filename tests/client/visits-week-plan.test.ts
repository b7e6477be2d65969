// The week-plan screen's own arithmetic: reading the progress stream (the WHATWG HTML standard,
// "Server-sent events", §9.2.6 interpreting an event stream) and splitting a day route into legs.
import { describe, expect, it } from 'vitest';
import { dayHours, dayLegs, dayLook, hoursText, kmText } from '@/features/week-plan/model/routes';
import { createSseReader, type SseEvent } from '@/features/week-plan/model/sse';

function read(chunks: string[]): SseEvent[] {
  const events: SseEvent[] = [];
  const reader = createSseReader((e) => events.push(e));
  for (const c of chunks) reader.push(c);
  reader.end();
  return events;
}

describe('reading the plan progress stream (WHATWG HTML, server-sent events)', () => {
  it('when the server sends progress then a result, then each event arrives with its name and data', () => {
    const text = 'event: progress\ndata: {"phase":"placing","fraction":0.5}\n\nevent: result\ndata: {"weekStart":"2026-12-07"}\n\n';
    expect(read([text])).toEqual([
      { event: 'progress', data: '{"phase":"placing","fraction":0.5}' },
      { event: 'result', data: '{"weekStart":"2026-12-07"}' },
    ]);
  });

  it('when chunks split lines, field names and a CRLF pair, then the events are the same', () => {
    const text = 'event: progress\r\ndata: {"fraction":1}\r\n\r\n';
    const events = read([text.slice(0, 3), text.slice(3, 17), text.slice(17, 31), text.slice(31, 32), text.slice(32)]);
    expect(events).toEqual([{ event: 'progress', data: '{"fraction":1}' }]);
  });

  it('when an event has several data lines, comments and no name, then data lines join with a line break and the name is "message"', () => {
    expect(read([': keep-alive\ndata: first\ndata:second\n\n'])).toEqual([{ event: 'message', data: 'first\nsecond' }]);
  });

  it('when the stream closes in the middle of an event, then that event is dropped (the standard discards it)', () => {
    expect(read(['event: result\ndata: {"partial":'])).toEqual([]);
  });
});

describe('day routes as legs', () => {
  // Rosetta Code, "Haversine formula": (36.12, −86.67) → (33.94, −118.40) is 2,887.26 km (R = 6,372.8 km).
  const depot = { lat: 36.12, lng: -86.67 };
  const farm = { lat: 33.94, lng: -118.4, startMin: 600, departMin: 660 };

  it('when a day goes out to one stop and back with circuity 1.2, then each leg is the published great-circle distance × 1.2', () => {
    const distanceKm = 2 * 2887.26 * 1.2;
    const legs = dayLegs({ startMin: 420, stops: [farm], distanceKm, driveMin: 1000, returnMin: 1500 }, depot);
    expect(legs).toHaveLength(2);
    expect(legs[0].km).toBeCloseTo(2887.26 * 1.2, 1);
    expect(legs[1].km).toBeCloseTo(2887.26 * 1.2, 1);
    expect(legs[0].driveMin + legs[1].driveMin).toBeCloseTo(1000, 6);
  });

  it('when a day has several stops, then the legs add up to the day total and split driving in proportion to distance', () => {
    const stops = [
      { lat: 39.8, lng: -98.2, startMin: 480, departMin: 570 },
      { lat: 39.9, lng: -98.0, startMin: 600, departMin: 690 },
      { lat: 39.7, lng: -97.9, startMin: 720, departMin: 810 },
    ];
    const day = { startMin: 420, stops, distanceKm: 88, driveMin: 66, returnMin: 860 };
    const legs = dayLegs(day, { lat: 39.75, lng: -98.1 });
    expect(legs.map((l) => l.toIndex)).toEqual([0, 1, 2, 3]);
    expect(legs.reduce((s, l) => s + l.km, 0)).toBeCloseTo(88, 9);
    expect(legs.reduce((s, l) => s + l.driveMin, 0)).toBeCloseTo(66, 9);
    for (const l of legs) expect(l.driveMin / l.km).toBeCloseTo(66 / 88, 9);
  });

  it('when a day has no stops, then it has no legs and no hours', () => {
    expect(dayLegs({ startMin: 420, stops: [], distanceKm: 0, driveMin: 0, returnMin: null }, depot)).toEqual([]);
    expect(dayHours({ startMin: 420, stops: [], returnMin: null })).toBe(0);
  });

  it('when a day leaves at 07:00 and is back at 16:30, then it is 9.5 hours', () => {
    expect(dayHours({ startMin: 420, stops: [farm], returnMin: 990 })).toBe(9.5);
    expect(hoursText(9.5)).toBe('9.5 h');
    expect(kmText(123.4)).toBe('123 km');
    expect(kmText(8.46)).toBe('8.5 km');
  });

  it('when the five weekdays are drawn, then each has its own colour and its own dash pattern', () => {
    const looks = [0, 1, 2, 3, 4].map(dayLook);
    expect(new Set(looks.map((l) => l.color)).size).toBe(5);
    expect(new Set(looks.map((l) => l.pattern)).size).toBe(5);
    expect(dayLook(7)).toEqual(dayLook(0));
  });
});
