// Day routes as map lines (Rowpath's own drawing rules; dates checked against the calendar:
// 7 December 2026 is a Monday).
import { describe, expect, it } from 'vitest';
import { dayTagOf, toMapRoutes } from '@/features/map/model/map-route';
import { dayLook } from '@/features/week-plan/model/routes';
import { clockText, shortDateText } from '@/features/visits/model/zone-time';

describe('day routes on the map', () => {
  it('when a week starts on Monday 7 December 2026, then the stop badges name the weekday in two letters', () => {
    expect(['2026-12-07', '2026-12-08', '2026-12-10', '2026-12-13'].map(dayTagOf)).toEqual(['Mo', 'Tu', 'Th', 'Su']);
  });

  it('when days with stops become map routes, then stops keep their order, count from 1 and say when and where', () => {
    const routes = toMapRoutes(
      [
        { date: '2026-12-07', stops: [] },
        {
          date: '2026-12-08',
          stops: [
            { visitId: 5, lat: 39.8, lng: -98.2, accountName: 'Hesketh Farms', startMin: 452, departMin: 542 },
            { visitId: 9, lat: 39.7, lng: -98.0, accountName: 'Vanterpool Grain', startMin: 600, departMin: 660 },
          ],
        },
      ],
      dayLook,
      shortDateText,
      clockText,
    );
    expect(routes.map((r) => [r.key, r.label, r.dayTag, r.stops.length])).toEqual([
      ['2026-12-07', 'Mon 7 Dec', 'Mo', 0],
      ['2026-12-08', 'Tue 8 Dec', 'Tu', 2],
    ]);
    expect(routes[1].stops.map((s) => [s.visitId, s.order])).toEqual([
      [5, 1],
      [9, 2],
    ]);
    expect(routes[1].stops[0].title).toBe('Tue 8 Dec, stop 1: Hesketh Farms, 07:32–09:02');
    expect(routes[1].look).toEqual(dayLook(1));
    expect(routes[0].look).not.toEqual(routes[1].look);
  });
});
