import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { haversineKm, roadKm, travelMinutes } from '@shared/calc/geo';
import { solveExact } from '@shared/calc/route-optimizer';
import {
  planWeek,
  validatePlanInput,
  PlanInputError,
  UNPLACED_REASONS,
  type PlanProgress,
  type PlanVisitInput,
  type PlanWeekInput,
  type WeekPlan,
} from '@shared/calc/week-planner';

const DEPOT = { lat: 39.4, lng: -98.1 };
const TOLERANCE_MIN = 1e-6;

const legMin = (input: PlanWeekInput, a: { lat: number; lng: number }, b: { lat: number; lng: number }) =>
  travelMinutes(roadKm(haversineKm(a, b), input.circuityFactor ?? 1.2), input.avgSpeedKmh);

/**
 * The test's own reading of the rules: leave the dealership at the day's start, drive, wait for
 * a window or appointment, do the visit inside its window, and be back by the day's end.
 * Returns the service start of each stop, or null when a rule is broken.
 */
function scheduleOrNull(input: PlanWeekInput, dayIndex: number, visits: PlanVisitInput[]): number[] | null {
  const day = input.days[dayIndex];
  let clockMin = day.startMin;
  let at = input.depot;
  const starts: number[] = [];
  for (const visit of visits) {
    const arriveMin = clockMin + legMin(input, at, visit);
    let startMin = Math.max(arriveMin, visit.window?.startMin ?? -Infinity);
    if (visit.fixed) {
      if (visit.fixed.dayIndex !== dayIndex || arriveMin > visit.fixed.startMin + TOLERANCE_MIN) return null;
      startMin = visit.fixed.startMin;
    }
    if (visit.window && startMin + visit.serviceMin > visit.window.endMin + TOLERANCE_MIN) return null;
    starts.push(startMin);
    clockMin = startMin + visit.serviceMin;
    at = visit;
  }
  return clockMin + legMin(input, at, input.depot) <= day.endMin + TOLERANCE_MIN ? starts : null;
}

/** Checks every published figure of a plan against the rules, recomputing each time from scratch. */
function expectPlanKeepsTheRules(input: PlanWeekInput, plan: WeekPlan) {
  const byId = new Map(input.visits.map((v) => [v.id, v]));
  const seen = [...plan.days.flatMap((d) => d.stops.map((s) => s.id)), ...plan.unplaced.map((u) => u.id)];
  expect([...seen].sort()).toEqual(input.visits.map((v) => v.id).sort());
  expect(plan.days).toHaveLength(input.days.length);

  plan.days.forEach((day, dayIndex) => {
    const dayInput = input.days[dayIndex];
    expect(day.date).toBe(dayInput.date);
    let clockMin = dayInput.startMin;
    let at = input.depot;
    let driveMin = 0;
    let serviceMin = 0;
    let distanceKm = 0;
    for (const stop of day.stops) {
      const visit = byId.get(stop.id)!;
      const leg = legMin(input, at, visit);
      expect(stop.arriveMin).toBeCloseTo(clockMin + leg, 6);
      expect(stop.waitMin).toBeGreaterThanOrEqual(-TOLERANCE_MIN);
      const startMin = stop.arriveMin + stop.waitMin;
      // No needless waiting: the visit starts as soon as the farm and its window allow, and an
      // appointment at its time (an arrival up to the tolerance late still counts as on time: a
      // seeded run had a farm 0.3 mm from the dealership with its appointment at the day's start).
      expect(startMin).toBeCloseTo(visit.fixed ? visit.fixed.startMin : Math.max(stop.arriveMin, visit.window?.startMin ?? -Infinity), 6);
      if (visit.fixed) expect(stop.arriveMin).toBeLessThanOrEqual(visit.fixed.startMin + TOLERANCE_MIN);
      expect(stop.departMin).toBeCloseTo(startMin + visit.serviceMin, 6);
      if (visit.window) {
        expect(startMin).toBeGreaterThanOrEqual(visit.window.startMin - TOLERANCE_MIN);
        expect(stop.departMin).toBeLessThanOrEqual(visit.window.endMin + TOLERANCE_MIN);
      }
      if (visit.fixed) {
        expect(visit.fixed.dayIndex).toBe(dayIndex);
        expect(startMin).toBeCloseTo(visit.fixed.startMin, 6);
      }
      driveMin += leg;
      serviceMin += visit.serviceMin;
      distanceKm += roadKm(haversineKm(at, visit), input.circuityFactor ?? 1.2);
      clockMin = stop.departMin;
      at = visit;
    }
    if (day.stops.length > 0) {
      driveMin += legMin(input, at, input.depot);
      distanceKm += roadKm(haversineKm(at, input.depot), input.circuityFactor ?? 1.2);
      expect(day.endMin).toBeCloseTo(clockMin + legMin(input, at, input.depot), 6);
    } else {
      expect(day.endMin).toBe(dayInput.startMin);
    }
    expect(day.endMin).toBeLessThanOrEqual(dayInput.endMin + TOLERANCE_MIN);
    expect(day.driveMin).toBeCloseTo(driveMin, 6);
    expect(day.workMin).toBeCloseTo(driveMin + serviceMin, 6);
    expect(day.distanceKm).toBeCloseTo(distanceKm, 6);
  });
}

/** No left-over visit fits anywhere in the final plan without moving anything else. */
function expectNoLeftOverFitsAnywhere(input: PlanWeekInput, plan: WeekPlan) {
  const byId = new Map(input.visits.map((v) => [v.id, v]));
  for (const { id } of plan.unplaced) {
    const visit = byId.get(id)!;
    plan.days.forEach((day, dayIndex) => {
      const route = day.stops.map((s) => byId.get(s.id)!);
      for (let position = 0; position <= route.length; position++) {
        const candidate = [...route.slice(0, position), visit, ...route.slice(position)];
        expect(scheduleOrNull(input, dayIndex, candidate), `${id} fits on day ${dayIndex} at ${position}`).toBeNull();
      }
    });
  }
}

/** Random valid weeks near the dealership: 1–5 days, up to 14 visits, some windows, some appointments. */
const weekArbitrary = fc
  .record({
    days: fc.array(fc.record({ startMin: fc.integer({ min: 360, max: 540 }), lengthMin: fc.integer({ min: 240, max: 720 }) }), { minLength: 1, maxLength: 5 }),
    visits: fc.array(
      fc.record({
        dLat: fc.double({ min: -1, max: 1, noNaN: true }),
        dLng: fc.double({ min: -1.3, max: 1.3, noNaN: true }),
        serviceMin: fc.integer({ min: 1, max: 12 }).map((q) => q * 15),
        kind: fc.constantFrom('free', 'free', 'window', 'fixed', 'fixed-in-window'),
        windowOpenMin: fc.integer({ min: 300, max: 960 }),
        windowSpareMin: fc.integer({ min: 0, max: 300 }),
        dayPick: fc.nat(),
        timeFraction: fc.double({ min: 0, max: 1, noNaN: true }),
        priority: fc.integer({ min: 0, max: 2 }),
      }),
      { maxLength: 14 },
    ),
    avgSpeedKmh: fc.integer({ min: 40, max: 100 }),
    circuityFactor: fc.constantFrom(undefined, 1, 1.2, 1.4),
  })
  .map(({ days, visits, avgSpeedKmh, circuityFactor }): PlanWeekInput => {
    const dayInputs = days.map((d, k) => ({ date: `2025-03-0${k + 3}`, startMin: d.startMin, endMin: Math.min(1440, d.startMin + d.lengthMin) }));
    return {
      depot: DEPOT,
      days: dayInputs,
      avgSpeedKmh,
      circuityFactor,
      visits: visits.map((v, k) => {
        const visit: PlanVisitInput = { id: `v${k}`, lat: DEPOT.lat + v.dLat, lng: DEPOT.lng + v.dLng, serviceMin: v.serviceMin, priority: v.priority };
        if (v.kind === 'window') visit.window = { startMin: v.windowOpenMin, endMin: Math.min(1440, v.windowOpenMin + v.serviceMin + v.windowSpareMin) };
        if (v.kind.startsWith('fixed')) {
          const dayIndex = v.dayPick % dayInputs.length;
          const day = dayInputs[dayIndex];
          const startMin = Math.round(day.startMin + v.timeFraction * Math.max(0, day.endMin - day.startMin - v.serviceMin));
          visit.fixed = { dayIndex, startMin };
          if (v.kind === 'fixed-in-window') visit.window = { startMin: startMin - v.windowSpareMin / 2, endMin: startMin + v.serviceMin + v.windowSpareMin / 2 };
        }
        return visit;
      }),
    };
  });

describe('planWeek rules (property)', () => {
  it('when any valid week is planned, then windows, day ends and appointments hold and no left-over visit would fit', () => {
    fc.assert(
      fc.property(weekArbitrary, (input) => {
        fc.pre(validatePlanInput(input).length === 0); // e.g. two appointments drawn at the same time
        const plan = planWeek(input);
        expectPlanKeepsTheRules(input, plan);
        expectNoLeftOverFitsAnywhere(input, plan);
        for (const { reason } of plan.unplaced) expect(Object.values(UNPLACED_REASONS)).toContain(reason);
      }),
      { numRuns: 120 },
    );
  });

  it('when a week of 40 visits over 5 days is planned, then every rule holds', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ dLat: fc.double({ min: -0.7, max: 0.7, noNaN: true }), dLng: fc.double({ min: -0.9, max: 0.9, noNaN: true }), serviceMin: fc.integer({ min: 2, max: 6 }).map((q) => q * 15) }), {
          minLength: 40,
          maxLength: 40,
        }),
        (visits) => {
          const input: PlanWeekInput = {
            depot: DEPOT,
            days: ['2025-03-03', '2025-03-04', '2025-03-05', '2025-03-06', '2025-03-07'].map((date) => ({ date, startMin: 420, endMin: 1080 })),
            visits: visits.map((v, k) => ({
              id: `farm-${k}`,
              lat: DEPOT.lat + v.dLat,
              lng: DEPOT.lng + v.dLng,
              serviceMin: v.serviceMin,
              ...(k % 8 === 0 ? { window: { startMin: 600, endMin: 600 + v.serviceMin + 120 } } : {}),
              ...(k % 13 === 5 ? { fixed: { dayIndex: k % 5, startMin: 780 } } : {}),
            })),
            avgSpeedKmh: 70,
          };
          const plan = planWeek(input);
          expectPlanKeepsTheRules(input, plan);
          expectNoLeftOverFitsAnywhere(input, plan);
        },
      ),
      { numRuns: 5 },
    );
  });
});

describe('planWeek worked examples', () => {
  const oneDay = [{ date: '2025-03-03', startMin: 480, endMin: 1020 }];

  it('when a single visit lies 0.5° due north, then drive, arrival and return follow haversine × 1.2 at the average speed', () => {
    // By hand: arc = 6,372.8 km × 0.5 × π/180 = 55.6132 km (Rosetta Code haversine radius);
    // road = × 1.2 (Wikibooks, Circuity) = 66.7358 km; at 80 km/h = 50.0519 min each way.
    const plan = planWeek({ depot: DEPOT, days: oneDay, avgSpeedKmh: 80, visits: [{ id: 'north', lat: 39.9, lng: -98.1, serviceMin: 60 }] });
    const [day] = plan.days;
    expect(day.stops).toHaveLength(1);
    expect(day.stops[0].arriveMin).toBeCloseTo(480 + 50.0519, 3);
    expect(day.stops[0].waitMin).toBe(0);
    expect(day.stops[0].departMin).toBeCloseTo(480 + 50.0519 + 60, 3);
    expect(day.endMin).toBeCloseTo(480 + 2 * 50.0519 + 60, 3);
    expect(day.distanceKm).toBeCloseTo(2 * 66.7358, 3);
    expect(day.driveMin).toBeCloseTo(2 * 50.0519, 3);
    expect(day.workMin).toBeCloseTo(2 * 50.0519 + 60, 3);
  });

  it('when a window opens after the specialist could arrive, then the stop shows the wait until it opens', () => {
    const plan = planWeek({
      depot: DEPOT,
      days: oneDay,
      avgSpeedKmh: 80,
      visits: [{ id: 'late-morning', lat: 39.9, lng: -98.1, serviceMin: 60, window: { startMin: 600, endMin: 720 } }],
    });
    const [stop] = plan.days[0].stops;
    expect(stop.waitMin).toBeCloseTo(600 - (480 + 50.0519), 3);
    expect(stop.departMin).toBeCloseTo(660, 6);
  });

  it('when a day holds up to 9 visits with time to spare, then its route is the shortest loop', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ dLat: fc.double({ min: -0.5, max: 0.5, noNaN: true }), dLng: fc.double({ min: -0.6, max: 0.6, noNaN: true }) }), { minLength: 1, maxLength: 9 }),
        (offsets) => {
          const visits = offsets.map((o, k) => ({ id: `farm-${k}`, lat: DEPOT.lat + o.dLat, lng: DEPOT.lng + o.dLng, serviceMin: 15 }));
          const input = { depot: DEPOT, days: [{ date: '2025-03-03', startMin: 0, endMin: 1440 }], avgSpeedKmh: 80, visits };
          const plan = planWeek(input);
          const points = [DEPOT, ...visits];
          const matrixKm = points.map((a) => points.map((b) => roadKm(haversineKm(a, b))));
          expect(plan.unplaced).toEqual([]);
          expect(plan.days[0].distanceKm).toBeCloseTo(solveExact(matrixKm).length, 6);
        },
      ),
      { numRuns: 40 },
    );
  });

  it('when visits would crowd one day, then they are spread over the days and each day keeps its hours', () => {
    const visits = Array.from({ length: 6 }, (_, k) => ({ id: `farm-${k}`, lat: 39.4 + 0.05 * k, lng: -98.1, serviceMin: 150 }));
    const input = { depot: DEPOT, days: ['2025-03-03', '2025-03-04'].map((date) => ({ date, startMin: 480, endMin: 1020 })), avgSpeedKmh: 80, visits };
    const plan = planWeek(input);
    expect(plan.unplaced).toEqual([]);
    expect(plan.days.map((d) => d.stops.length)).toEqual([3, 3]);
    expectPlanKeepsTheRules(input, plan);
  });

  it('when an appointment is fixed on a later day, then it stays on that day at its time even though day one is empty', () => {
    const input = {
      depot: DEPOT,
      days: ['2025-03-03', '2025-03-04'].map((date) => ({ date, startMin: 480, endMin: 1020 })),
      avgSpeedKmh: 80,
      visits: [{ id: 'calibration', lat: 39.5, lng: -98.2, serviceMin: 90, fixed: { dayIndex: 1, startMin: 840 } }],
    };
    const plan = planWeek(input);
    expect(plan.days[0].stops).toEqual([]);
    expect(plan.days[1].stops.map((s) => s.id)).toEqual(['calibration']);
    const [stop] = plan.days[1].stops;
    expect(stop.arriveMin + stop.waitMin).toBeCloseTo(840, 6);
    expect(stop.departMin).toBeCloseTo(930, 6);
  });

  it('when a farm a hair from the dealership has its appointment at the day’s start, then it is placed at that time and the rules hold', () => {
    // A property-run counterexample: arrival 5e-7 min after the appointment, inside the tolerance.
    const input: PlanWeekInput = {
      depot: { lat: 39.4, lng: -98.1 },
      days: [{ date: '2025-03-03', startMin: 360, endMin: 600 }],
      avgSpeedKmh: 40,
      visits: [{ id: 'v0', lat: 39.400000002497414, lng: -98.1, serviceMin: 15, priority: 0, fixed: { dayIndex: 0, startMin: 360 } }],
    };
    const plan = planWeek(input);
    expect(plan.days[0].stops.map((s) => s.id)).toEqual(['v0']);
    expectPlanKeepsTheRules(input, plan);
  });

  it('when two visits compete for the only free hours, then the higher priority one is placed', () => {
    const input = {
      depot: DEPOT,
      days: [{ date: '2025-03-03', startMin: 480, endMin: 720 }],
      avgSpeedKmh: 80,
      visits: [
        { id: 'routine-check', lat: 39.45, lng: -98.1, serviceMin: 180, priority: 0 },
        { id: 'meter-failure', lat: 39.35, lng: -98.1, serviceMin: 180, priority: 2 },
      ],
    };
    const plan = planWeek(input);
    expect(plan.days[0].stops.map((s) => s.id)).toEqual(['meter-failure']);
    expect(plan.unplaced.map((u) => u.id)).toEqual(['routine-check']);
  });

  it('when a placed visit blocks a left-over one, then it is moved to another day to make room', () => {
    // The higher-priority 90-minute visit first takes the long day (both days cost the same);
    // the 200-minute visit fits only the long day, so the first must move to the short one.
    const input = {
      depot: DEPOT,
      days: [
        { date: '2025-03-03', startMin: 480, endMin: 720 },
        { date: '2025-03-04', startMin: 480, endMin: 600 },
      ],
      avgSpeedKmh: 80,
      visits: [
        { id: 'seed-meter-check', lat: 39.401, lng: -98.1, serviceMin: 90, priority: 1 },
        { id: 'downforce-retrofit', lat: 39.399, lng: -98.1, serviceMin: 200, priority: 0 },
      ],
    };
    const plan = planWeek(input);
    expect(plan.unplaced).toEqual([]);
    expect(plan.days.map((d) => d.stops.map((s) => s.id))).toEqual([['downforce-retrofit'], ['seed-meter-check']]);
    expectPlanKeepsTheRules(input, plan);
  });

  it('when planning runs, then progress rises to 1 and ends with the done phase', () => {
    const seen: PlanProgress[] = [];
    planWeek(
      { depot: DEPOT, days: oneDay, avgSpeedKmh: 80, visits: [1, 2, 3].map((k) => ({ id: `farm-${k}`, lat: 39.4 + 0.1 * k, lng: -98.1, serviceMin: 30 })) },
      (p) => seen.push(p),
    );
    const fractions = seen.map((p) => p.fraction);
    expect(fractions).toEqual([...fractions].sort((a, b) => a - b));
    expect(seen.at(-1)).toEqual({ phase: 'done', fraction: 1 });
    expect(seen.some((p) => p.phase === 'placing')).toBe(true);
  });
});

describe('planWeek reasons for left-over visits', () => {
  const day = (startMin: number, endMin: number) => ({ date: '2025-03-03', startMin, endMin });
  const reasonFor = (input: PlanWeekInput, id: string) => planWeek(input).unplaced.find((u) => u.id === id)?.reason;

  it('when a window closes before the specialist can get there, then the reason says the window cannot be reached', () => {
    const input = { depot: DEPOT, days: [day(480, 1020)], avgSpeedKmh: 80, visits: [{ id: 'dawn', lat: 39.5, lng: -98.1, serviceMin: 30, window: { startMin: 300, endMin: 420 } }] };
    expect(reasonFor(input, 'dawn')).toBe('its time window cannot be reached from the dealership within the day');
  });

  it('when a farm is too far to reach and return within a day, then the reason says so', () => {
    const input = { depot: DEPOT, days: [day(480, 1020)], avgSpeedKmh: 80, visits: [{ id: 'far', lat: 45.4, lng: -98.1, serviceMin: 30 }] };
    expect(reasonFor(input, 'far')).toBe(UNPLACED_REASONS.tooFar);
  });

  it('when appointments split the day into gaps shorter than the visit, then the reason says it is longer than any free time', () => {
    // 08:00–17:00 with appointments 10:00–11:00 and 14:00–15:00 at the dealership's door: the
    // largest gap is 11:00–14:00 (180 min), shorter than the 250-minute visit.
    const input = {
      depot: DEPOT,
      days: [day(480, 1020)],
      avgSpeedKmh: 80,
      visits: [
        { id: 'meeting-1', ...DEPOT, serviceMin: 60, fixed: { dayIndex: 0, startMin: 600 } },
        { id: 'meeting-2', ...DEPOT, serviceMin: 60, fixed: { dayIndex: 0, startMin: 840 } },
        { id: 'toolbar-install', lat: 39.41, lng: -98.1, serviceMin: 250 },
      ],
    };
    expect(reasonFor(input, 'toolbar-install')).toBe('longer than any free time on the chosen days');
  });

  it('when the free time is long enough but not with the drive, then the reason says the days are full', () => {
    // 08:00–11:00, appointment 08:00–09:00 at the dealership: 120 min free, a 100-minute visit
    // about 20 km away needs 2 × 18 min of driving (20 × 1.2 / 80 × 60 ≈ 18).
    const input = {
      depot: DEPOT,
      days: [day(480, 660)],
      avgSpeedKmh: 80,
      visits: [
        { id: 'shop-meeting', ...DEPOT, serviceMin: 60, fixed: { dayIndex: 0, startMin: 480 } },
        { id: 'row-cleaner-fit', lat: 39.58, lng: -98.1, serviceMin: 100 },
      ],
    };
    expect(reasonFor(input, 'row-cleaner-fit')).toBe(UNPLACED_REASONS.daysFull);
  });

  it('when an appointment is at the start of the day far from the dealership, then the reason says its time cannot be reached', () => {
    const input = { depot: DEPOT, days: [day(480, 1020)], avgSpeedKmh: 80, visits: [{ id: 'early', lat: 39.9, lng: -98.1, serviceMin: 30, fixed: { dayIndex: 0, startMin: 480 } }] };
    expect(reasonFor(input, 'early')).toBe(UNPLACED_REASONS.fixedUnreachable);
  });

  it('when an appointment ends just before the day does, far away, then the reason says there is no time to drive back', () => {
    const input = { depot: DEPOT, days: [day(480, 1020)], avgSpeedKmh: 80, visits: [{ id: 'late', lat: 39.9, lng: -98.1, serviceMin: 30, fixed: { dayIndex: 0, startMin: 985 } }] };
    expect(reasonFor(input, 'late')).toBe(UNPLACED_REASONS.fixedNoReturn);
  });

  it('when two appointments are too close in time for the drive between them, then the later one is left out with that reason', () => {
    const input = {
      depot: DEPOT,
      days: [day(480, 1020)],
      avgSpeedKmh: 80,
      visits: [
        { id: 'first', lat: 39.45, lng: -98.1, serviceMin: 60, fixed: { dayIndex: 0, startMin: 540 } },
        { id: 'second', lat: 40.3, lng: -98.1, serviceMin: 60, fixed: { dayIndex: 0, startMin: 605 } },
      ],
    };
    const plan = planWeek(input);
    expect(plan.days[0].stops.map((s) => s.id)).toEqual(['first']);
    expect(plan.unplaced).toEqual([{ id: 'second', reason: UNPLACED_REASONS.fixedClash }]);
  });
});

describe('validatePlanInput', () => {
  const valid: PlanWeekInput = {
    depot: DEPOT,
    days: [{ date: '2025-03-03', startMin: 480, endMin: 1020 }],
    avgSpeedKmh: 80,
    visits: [{ id: 'a', lat: 39.5, lng: -98, serviceMin: 60 }],
  };
  const pathsOf = (input: PlanWeekInput) => validatePlanInput(input).map((i) => i.path.join('.'));

  it('when the input is sound, then there are no issues', () => {
    expect(validatePlanInput(valid)).toEqual([]);
  });

  it('when coordinates are out of range, then each bad field is named', () => {
    expect(pathsOf({ ...valid, depot: { lat: 91, lng: -98 }, visits: [{ ...valid.visits[0], lng: -181 }] })).toEqual(['depot.lat', 'visits.0.lng']);
  });

  it('when a visit is longer than a day, then its length is flagged', () => {
    expect(pathsOf({ ...valid, visits: [{ ...valid.visits[0], serviceMin: 541 }] })).toEqual(['visits.0.serviceMin']);
  });

  it('when a window closes before it opens or is shorter than the visit, then the window is flagged', () => {
    const issues = validatePlanInput({
      ...valid,
      visits: [
        { id: 'a', lat: 39.5, lng: -98, serviceMin: 30, window: { startMin: 700, endMin: 600 } },
        { id: 'b', lat: 39.5, lng: -98, serviceMin: 90, window: { startMin: 600, endMin: 660 } },
      ],
    });
    expect(issues).toEqual([
      { path: ['visits', 0, 'window', 'endMin'], message: 'the time window closes before it opens' },
      { path: ['visits', 1, 'window'], message: 'the time window is shorter than the visit' },
    ]);
  });

  it('when two visits share an id, then the second is flagged as a duplicate', () => {
    const issues = validatePlanInput({ ...valid, visits: [valid.visits[0], { ...valid.visits[0] }] });
    expect(issues.map((i) => i.path)).toEqual([['visits', 1, 'id']]);
    expect(issues[0].message).toContain('duplicate');
  });

  it('when a day ends before it starts or the speed is zero, then those fields are flagged', () => {
    expect(pathsOf({ ...valid, avgSpeedKmh: 0, days: [{ date: 'x', startMin: 600, endMin: 500 }], visits: [] })).toEqual(['avgSpeedKmh', 'days.0.endMin']);
  });

  it('when an appointment is on a missing day, outside the day, outside its window or overlapping another, then it is flagged', () => {
    const visit = valid.visits[0];
    expect(pathsOf({ ...valid, visits: [{ ...visit, fixed: { dayIndex: 1, startMin: 600 } }] })).toEqual(['visits.0.fixed.dayIndex']);
    expect(pathsOf({ ...valid, visits: [{ ...visit, fixed: { dayIndex: 0, startMin: 990 } }] })).toEqual(['visits.0.fixed.startMin']);
    expect(pathsOf({ ...valid, visits: [{ ...visit, window: { startMin: 480, endMin: 600 }, fixed: { dayIndex: 0, startMin: 570 } }] })).toEqual(['visits.0.fixed.startMin']);
    expect(
      pathsOf({ ...valid, visits: [{ ...visit, fixed: { dayIndex: 0, startMin: 600 } }, { ...visit, id: 'b', fixed: { dayIndex: 0, startMin: 630 } }] }),
    ).toEqual(['visits.1.fixed.startMin']);
  });

  it('when planWeek is given invalid input, then it throws a PlanInputError carrying the issues', () => {
    const bad = { ...valid, visits: [{ ...valid.visits[0], lat: 100 }] };
    expect(() => planWeek(bad)).toThrow(PlanInputError);
    try {
      planWeek(bad);
    } catch (error) {
      expect((error as PlanInputError).issues.map((i) => i.path.join('.'))).toEqual(['visits.0.lat']);
    }
  });
});
