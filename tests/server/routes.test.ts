import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { haversineKm, roadKm, travelMinutes } from '../../shared/calc/geo.js';
import { createRng, optimizeRoute } from '../../shared/calc/route-optimizer.js';
import { UNPLACED_REASONS } from '../../shared/calc/week-planner.js';
import type { PlanDayView, WeekPlanView } from '../../shared/schemas/visits.js';
import { DEALERSHIP } from '../../seeders/demo.js';
import { Account, Visit } from '../../server/db/models/index.js';
import { OPTIMIZE_OPTIONS } from '../../server/modules/routes/optimize.service.js';
import { SETTING_DEFAULTS } from '../../server/modules/settings/settings.service.js';
import { DEFAULT_TIME_ZONE, fromLocal, toLocal } from '../../server/modules/visits/local-time.js';
import { client, makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';

type Client = Awaited<ReturnType<typeof signedIn>>;
let t: TestApp;
let territoryId: number;
let admin: Client;

// The settings the server reads when none are stored (server/modules/settings/settings.service.ts).
const { circuityFactor, avgSpeedKmh, dayStartMin, dayEndMin } = SETTING_DEFAULTS;
const MONDAY = '2027-02-08';
const WEEK = ['2027-02-08', '2027-02-09', '2027-02-10', '2027-02-11', '2027-02-12'];
const at = (date: string, minute: number) => fromLocal(date, minute, DEFAULT_TIME_ZONE);
const EPS = 1e-6;

beforeAll(async () => {
  t = await testApp();
  territoryId = (await makeTerritory()).id;
  admin = await signedIn(t.app, await makeUser('admin'));
});
afterAll(async () => t.close());

async function freshSpecialist() {
  const user = await makeUser('specialist', { territoryIds: [territoryId] });
  return { user, c: await signedIn(t.app, user) };
}

interface VisitFields {
  lat: number;
  lng: number;
  durationMin: number;
  window?: [number, number];
  fixedAt?: Date;
  status?: 'requested' | 'planned' | 'done';
  specialistId?: number | null;
}

/** Accounts at the given points with one visit each (written directly: only the plan is under test). */
async function makeVisits(specialistId: number | null, fields: VisitFields[]) {
  const accounts = await Account.bulkCreate(
    fields.map((f, k) => ({ name: `Plan Farms ${k + 1} ${Math.random().toString(36).slice(2, 7)}`, territoryId, specialistId, address: null, town: 'Testville', state: 'KS', lat: f.lat, lng: f.lng, notes: null })),
  );
  const visits = await Visit.bulkCreate(
    fields.map((f, k) => ({
      accountId: accounts[k].id,
      specialistId: f.specialistId === undefined ? specialistId : f.specialistId,
      planterId: null,
      purpose: 'pre-season-checkup' as const,
      status: f.status ?? (f.fixedAt ? 'planned' : 'requested'),
      startsAt: f.fixedAt ?? null,
      durationMin: f.durationMin,
      windowStartMin: f.window?.[0] ?? null,
      windowEndMin: f.window?.[1] ?? null,
      fixed: Boolean(f.fixedAt),
      notes: null,
      checklist: [],
      roadmapItemIds: [],
      requestedByContactId: null,
    })),
  );
  return visits.map((v) => v.id);
}

const driveMin = (a: { lat: number; lng: number }, b: { lat: number; lng: number }) => travelMinutes(roadKm(haversineKm(a, b), circuityFactor), avgSpeedKmh);

/** Checks one day against the rules from first principles, using the stored visits. */
async function checkDay(day: PlanDayView) {
  let clock = dayStartMin;
  let here: { lat: number; lng: number } = DEALERSHIP;
  let km = 0;
  for (const stop of day.stops) {
    const row = (await Visit.findByPk(stop.visitId))!;
    const drive = driveMin(here, stop);
    km += roadKm(haversineKm(here, stop), circuityFactor);
    expect(stop.startMin).toBeGreaterThanOrEqual(clock + drive - EPS);
    expect(stop.startMin).toBeGreaterThanOrEqual(dayStartMin);
    expect(stop.departMin).toBe(stop.startMin + row.durationMin);
    if (row.windowStartMin !== null) {
      expect(stop.startMin).toBeGreaterThanOrEqual(row.windowStartMin);
      expect(stop.departMin).toBeLessThanOrEqual(row.windowEndMin! + EPS);
    }
    if (row.fixed) {
      const local = toLocal(new Date(row.startsAt!), DEFAULT_TIME_ZONE);
      expect(local.date).toBe(day.date);
      expect(stop.startMin).toBeCloseTo(local.minute, 6);
    }
    clock = stop.departMin;
    here = stop;
  }
  if (day.stops.length) {
    km += roadKm(haversineKm(here, DEALERSHIP), circuityFactor);
    expect(clock + driveMin(here, DEALERSHIP)).toBeLessThanOrEqual(dayEndMin + EPS);
  }
  expect(day.distanceKm).toBeCloseTo(km, 1);
}

function placedIds(plan: WeekPlanView) {
  return plan.days.flatMap((d) => d.stops.filter((s) => !s.kept).map((s) => s.visitId));
}

describe('POST /api/routes/optimize', () => {
  it('when stops are sent, then the order and distance equal the pure optimiser’s with the settings’ circuity', async () => {
    const { c } = await freshSpecialist();
    const random = createRng(7);
    for (const count of [9, 20]) {
      const stops = Array.from({ length: count }, (_, k) => ({ id: `farm-${k}`, lat: DEALERSHIP.lat + (random() - 0.5) * 1.2, lng: DEALERSHIP.lng + (random() - 0.5) * 1.5, serviceMin: 60 }));
      const res = await c.post('/api/routes/optimize', { start: { lat: DEALERSHIP.lat, lng: DEALERSHIP.lng }, stops, returnToStart: true });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      const pure = optimizeRoute({ start: DEALERSHIP, stops, returnToStart: true, circuityFactor, ...OPTIMIZE_OPTIONS });
      expect(res.body.order).toEqual(pure.order);
      expect(res.body.distanceKm).toBeCloseTo(pure.distanceKm, 3);
    }
  });

  it('when ids are numbers or the route is open, then ids come back as sent and the distance has no return leg', async () => {
    const { c } = await freshSpecialist();
    const stops = [
      { id: 3, lat: 39.6, lng: -98.1 },
      { id: 1, lat: 39.5, lng: -98.1 },
      { id: 2, lat: 39.7, lng: -98.1 },
    ];
    const open = await c.post('/api/routes/optimize', { start: { lat: 39.4, lng: -98.1 }, stops, returnToStart: false });
    expect(open.body.order).toEqual([1, 3, 2]);
    // Straight north along one meridian: 0.3° of latitude × 1.2 circuity.
    expect(open.body.distanceKm).toBeCloseTo(roadKm(haversineKm({ lat: 39.4, lng: -98.1 }, { lat: 39.7, lng: -98.1 }), circuityFactor), 3);
  });

  it('when coordinates are out of range or ids repeat, then 400 names each field; growers 403; strangers 401', async () => {
    const { c } = await freshSpecialist();
    const bad = await c.post('/api/routes/optimize', { start: { lat: 91, lng: 0 }, stops: [{ id: 'a', lat: 39, lng: -181 }, { id: 'b', lat: 39, lng: -98 }, { id: 'a', lat: 40, lng: -98 }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields).toMatchObject({
      'start.lat': 'Latitude must be from -90 to 90',
      'stops.0.lng': 'Longitude must be from -180 to 180',
      'stops.2.id': 'Stop id "a" is used twice (also stop 0)',
    });
    const empty = await c.post('/api/routes/optimize', { start: { lat: 39, lng: -98 }, stops: [] });
    expect(empty.body.error.details.fields.stops).toMatch(/at least one stop/);
    const account = await makeAccount(territoryId);
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: account.id }));
    expect((await grower.post('/api/routes/optimize', { start: { lat: 39, lng: -98 }, stops: [{ id: 'a', lat: 39, lng: -98 }] })).status).toBe(403);
    const anonymous = client(t.app);
    await anonymous.refreshCsrf();
    expect((await anonymous.post('/api/routes/optimize', { start: { lat: 39, lng: -98 }, stops: [{ id: 'a', lat: 39, lng: -98 }] })).status).toBe(401);
  });
});

/** 40 invented farms within about 50 km of the dealership: windows on some, two appointments. */
function fortyVisits(): VisitFields[] {
  const random = createRng(20261201);
  return Array.from({ length: 40 }, (_, k) => {
    const f: VisitFields = { lat: DEALERSHIP.lat + (random() - 0.5) * 0.9, lng: DEALERSHIP.lng + (random() - 0.5) * 1.1, durationMin: k % 3 === 0 ? 60 : 45 };
    if (k % 5 === 1) f.window = k % 2 ? [480, 720] : [780, 1020];
    if (k === 7) f.fixedAt = at(WEEK[1], 600);
    if (k === 23) f.fixedAt = at(WEEK[3], 840);
    return f;
  });
}

describe('POST /api/week-plans', () => {
  it('when 40 visits are planned over 5 days, then every visit is placed once or listed with a reason, and every day keeps hours, windows, appointments and drive times', async () => {
    const { user, c } = await freshSpecialist();
    const visitIds = await makeVisits(user.id, fortyVisits());
    const res = await c.post('/api/week-plans', { weekStart: MONDAY, visitIds, days: 5 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const plan = res.body as WeekPlanView;
    expect(plan.days.map((d) => d.date)).toEqual(WEEK);
    expect(plan.depot).toMatchObject({ lat: DEALERSHIP.lat, lng: DEALERSHIP.lng });
    const placed = placedIds(plan);
    const unplaced = plan.unplaced.map((u) => u.visitId);
    expect([...placed, ...unplaced].sort((a, b) => a - b)).toEqual([...visitIds].sort((a, b) => a - b));
    expect(placed.length).toBeGreaterThanOrEqual(35);
    for (const u of plan.unplaced) expect(Object.values(UNPLACED_REASONS)).toContain(u.reason);
    for (const day of plan.days) {
      await checkDay(day);
      for (const stop of day.stops) expect(Number.isInteger(stop.startMin)).toBe(true);
    }
    expect(plan.days[1].stops.find((s) => s.visitId === visitIds[7])).toMatchObject({ startMin: 600, fixed: true });
    expect(plan.days[3].stops.find((s) => s.visitId === visitIds[23])).toMatchObject({ startMin: 840, fixed: true });
    expect(plan.totals.visits).toBe(placed.length);
    // Planning writes nothing until it is committed.
    expect(await Visit.count({ where: { id: visitIds, status: 'planned' } })).toBe(2);
  });

  it('when the plan is committed, then each visit holds its planned time and the week’s routes read back without warnings', async () => {
    const { user, c } = await freshSpecialist();
    const visitIds = await makeVisits(null, fortyVisits().slice(0, 12));
    const res = await c.post('/api/week-plans?commit=true', { weekStart: MONDAY, visitIds, days: 3 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const plan = res.body as WeekPlanView & { committed: { id: number; status: string; startsAt: string; specialistId: number }[] };
    expect(plan.committed).toHaveLength(placedIds(plan).length);
    for (const day of plan.days) {
      for (const stop of day.stops) {
        const row = (await Visit.findByPk(stop.visitId))!;
        expect(row.status).toBe('planned');
        expect(row.specialistId).toBe(user.id);
        expect(new Date(row.startsAt!).toISOString()).toBe(at(day.date, stop.startMin).toISOString());
      }
    }
    const current = await c.get(`/api/week-plans/current?weekStart=${MONDAY}&days=3`);
    expect(current.status).toBe(200);
    current.body.days.forEach((day: { stops: { visitId: number }[]; warnings: string[]; distanceKm: number }, k: number) => {
      expect(day.stops.map((s) => s.visitId)).toEqual(plan.days[k].stops.map((s) => s.visitId));
      expect(day.warnings).toEqual([]);
      expect(day.distanceKm).toBeCloseTo(plan.days[k].distanceKm, 1);
    });
  });

  it('when a planned visit is dragged to another day, then the week’s routes follow it', async () => {
    const { c } = await freshSpecialist();
    const visitIds = await makeVisits(null, [
      { lat: 39.6, lng: -98.2, durationMin: 60 },
      { lat: 39.3, lng: -98.0, durationMin: 60 },
      { lat: 39.5, lng: -97.9, durationMin: 60 },
    ]);
    const plan = (await c.post('/api/week-plans?commit=true', { weekStart: MONDAY, visitIds, days: 2 })).body as WeekPlanView;
    const moving = plan.days.flatMap((d) => d.stops)[0];
    const from = plan.days.find((d) => d.stops.some((s) => s.visitId === moving.visitId))!.date;
    const to = WEEK.find((d) => d !== from && plan.days.some((p) => p.date === d))!;
    const row = (await Visit.findByPk(moving.visitId))!;
    const drag = await c.patch(`/api/visits/${moving.visitId}`, { startsAt: at(to, 16 * 60).toISOString(), version: row.version });
    expect(drag.status, JSON.stringify(drag.body)).toBe(200);
    const current = await c.get(`/api/week-plans/current?weekStart=${MONDAY}&days=2`);
    const day = (date: string) => current.body.days.find((d: { date: string }) => d.date === date);
    expect(day(to).stops.map((s: { visitId: number }) => s.visitId)).toContain(moving.visitId);
    expect(day(from).stops.map((s: { visitId: number }) => s.visitId)).not.toContain(moving.visitId);
    expect(day(to).stops.at(-1)).toMatchObject({ visitId: moving.visitId, startMin: 960 });
  });

  it('when the specialist already has a visit planned that week, then the plan routes around it and does not move it', async () => {
    const { user, c } = await freshSpecialist();
    const [keptId] = await makeVisits(user.id, [{ lat: 39.45, lng: -98.3, durationMin: 180, fixedAt: at(WEEK[0], 540), status: 'planned' }]);
    await Visit.update({ fixed: false }, { where: { id: keptId } });
    const visitIds = await makeVisits(user.id, Array.from({ length: 6 }, (_, k) => ({ lat: 39.4 + k * 0.03, lng: -98.25, durationMin: 90 })));
    const res = await c.post('/api/week-plans?commit=true', { weekStart: MONDAY, visitIds, days: 1 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const monday = res.body.days[0] as PlanDayView;
    expect(monday.stops.find((s) => s.visitId === keptId)).toMatchObject({ kept: true, startMin: 540, departMin: 720 });
    await checkDay(monday);
    expect(res.body.committed.map((v: { id: number }) => v.id)).not.toContain(keptId);
    expect((await Visit.findByPk(keptId))!.version).toBe(0);
  });

  it('when visits cannot be planned, then 400 names them; outside the scope 404; another specialist’s week 403', async () => {
    const { user, c } = await freshSpecialist();
    const [ok, doneId, noPlace, longId, earlyFixed] = await makeVisits(user.id, [
      { lat: 39.5, lng: -98.1, durationMin: 60 },
      { lat: 39.5, lng: -98.1, durationMin: 60, status: 'done' },
      { lat: 39.5, lng: -98.1, durationMin: 60 },
      { lat: 39.5, lng: -98.1, durationMin: 700 },
      { lat: 39.5, lng: -98.1, durationMin: 60, fixedAt: at('2027-01-15', 600) },
    ]);
    await Account.update({ lat: null, lng: null }, { where: { id: (await Visit.findByPk(noPlace))!.accountId } });
    const res = await c.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok, doneId, noPlace, earlyFixed] });
    expect(res.status).toBe(400);
    const fields = res.body.error.details.fields;
    expect(Object.keys(fields).sort()).toEqual(['visitIds.1', 'visitIds.2', 'visitIds.3']);
    expect(fields['visitIds.1']).toMatch(/already done/);
    expect(fields['visitIds.2']).toMatch(/no map location/);
    expect(fields['visitIds.3']).toMatch(/appointment is on 2027-01-15/);
    const long = await c.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok, longId] });
    expect(long.status).toBe(400);
    expect(long.body.error.details.fields['visitIds.1']).toMatch(/longer than a day \(660 min\)/);
    const malformed = await c.post('/api/week-plans', { weekStart: 'Monday', visitIds: [ok], days: 9 });
    expect(Object.keys(malformed.body.error.details.fields).sort()).toEqual(['days', 'weekStart']);
    const twice = await c.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok, ok] });
    expect(twice.body.error.details.fields['visitIds.1']).toMatch(/listed twice/);

    const otherTerritory = (await makeTerritory()).id;
    const stranger = await makeUser('specialist', { territoryIds: [otherTerritory] });
    const strangers = await signedIn(t.app, stranger);
    expect((await strangers.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok] })).status).toBe(404);
    expect((await c.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok], specialistId: stranger.id })).status).toBe(403);
    const manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
    const noOne = await manager.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok] });
    expect(noOne.body.error.details.fields.specialistId).toMatch(/Choose whose/);
    const forUser = await manager.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok], specialistId: user.id });
    expect(forUser.status).toBe(200);
    expect((await manager.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok], specialistId: stranger.id })).status).toBe(403);
    expect((await admin.post('/api/week-plans', { weekStart: MONDAY, visitIds: [ok], specialistId: stranger.id })).body.error.details.fields['visitIds.0']).toMatch(/assigned to another specialist/);
    const [unassigned] = await makeVisits(null, [{ lat: 39.5, lng: -98.1, durationMin: 60 }]);
    const notTheirs = await admin.post('/api/week-plans', { weekStart: MONDAY, visitIds: [unassigned], specialistId: stranger.id });
    expect(notTheirs.status).toBe(400);
    expect(notTheirs.body.error.details.fields['visitIds.0']).toMatch(/does not cover this account's territory/);
    const notTheirsCommit = await admin.post('/api/week-plans/commit', { specialistId: stranger.id, assignments: [{ visitId: unassigned, date: MONDAY, startMin: 600, version: 0 }] });
    expect(notTheirsCommit.body.error.details.fields['assignments.0.visitId']).toMatch(/does not cover/);
  });
});

describe('POST /api/week-plans/commit', () => {
  it('when a visit changed after the plan was made, then the commit is 409 stale and no visit is written', async () => {
    const { c } = await freshSpecialist();
    const visitIds = await makeVisits(null, fortyVisits().slice(0, 5));
    const plan = (await c.post('/api/week-plans', { weekStart: MONDAY, visitIds, days: 2 })).body as WeekPlanView;
    const assignments = plan.days.flatMap((d) => d.stops.map((s) => ({ visitId: s.visitId, date: d.date, startMin: s.startMin, version: s.version })));
    const touched = assignments[assignments.length - 1].visitId;
    expect((await c.patch(`/api/visits/${touched}`, { notes: 'Grower called: bring a spare seed disc', version: 0 })).status).toBe(200);
    const res = await c.post('/api/week-plans/commit', { assignments });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('stale');
    expect(await Visit.count({ where: { id: visitIds, status: 'planned' } })).toBe(0);
  });

  it('when assignments overlap or fall outside hours, then 409 or 400 names the assignment and nothing is written', async () => {
    const { user, c } = await freshSpecialist();
    const [a, b] = await makeVisits(user.id, [
      { lat: 39.5, lng: -98.1, durationMin: 60 },
      { lat: 39.6, lng: -98.1, durationMin: 60, window: [480, 720] },
    ]);
    const clash = await c.post('/api/week-plans/commit', { assignments: [{ visitId: a, date: MONDAY, startMin: 600, version: 0 }, { visitId: b, date: MONDAY, startMin: 630, version: 0 }] });
    expect(clash.status).toBe(409);
    expect(clash.body.error.code).toBe('overlap');
    expect(clash.body.error.details.fields['assignments.1.startMin']).toMatch(/Overlaps/);
    const late = await c.post('/api/week-plans/commit', { assignments: [{ visitId: a, date: MONDAY, startMin: 1050, version: 0 }] });
    expect(late.status).toBe(400);
    expect(late.body.error.details.fields['assignments.0.startMin']).toMatch(/Outside working hours/);
    const window = await c.post('/api/week-plans/commit', { assignments: [{ visitId: b, date: MONDAY, startMin: 800, version: 0 }] });
    expect(window.body.error.code).toBe('outside_window');
    expect(await Visit.count({ where: { id: [a, b], status: 'planned' } })).toBe(0);
    const ok = await c.post('/api/week-plans/commit', { assignments: [{ visitId: a, date: MONDAY, startMin: 600, version: 0 }, { visitId: b, date: MONDAY, startMin: 660, version: 0 }] });
    expect(ok.status).toBe(200);
    expect(ok.body.visits.map((v: { status: string; version: number }) => [v.status, v.version])).toEqual([
      ['planned', 1],
      ['planned', 1],
    ]);
  });
});

describe('POST /api/week-plans/stream', () => {
  it('when the page asks for an event stream, then progress events rise to 1 and the plan arrives last', async () => {
    const { user, c } = await freshSpecialist();
    const visitIds = await makeVisits(user.id, fortyVisits().slice(0, 15));
    const res = await c.agent.post('/api/week-plans/stream').set('X-Forwarded-For', c.ip).set('X-CSRF-Token', c.csrf).set('Accept', 'text/event-stream').send({ weekStart: MONDAY, visitIds, days: 3 });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/event-stream/);
    const events = res.text
      .split('\n\n')
      .filter(Boolean)
      .map((block) => ({ event: /^event: (.*)$/m.exec(block)![1], data: JSON.parse(/^data: (.*)$/m.exec(block)![1]) }));
    const progress = events.filter((e) => e.event === 'progress').map((e) => e.data.fraction as number);
    expect(progress.length).toBeGreaterThan(3);
    expect(progress).toEqual([...progress].sort((a, b) => a - b));
    expect(progress.at(-1)).toBe(1);
    expect(events.at(-1)!.event).toBe('result');
    const plan = events.at(-1)!.data as WeekPlanView;
    expect([...placedIds(plan), ...plan.unplaced.map((u) => u.visitId)].sort((a, b) => a - b)).toEqual([...visitIds].sort((a, b) => a - b));
    for (const day of plan.days) await checkDay(day);
  });

  it('when the client does not accept an event stream or sends bad input, then 406 or 400 comes as JSON', async () => {
    const { user, c } = await freshSpecialist();
    const visitIds = await makeVisits(user.id, fortyVisits().slice(0, 2));
    const plain = await c.post('/api/week-plans/stream', { weekStart: MONDAY, visitIds });
    expect(plain.status).toBe(406);
    const bad = await c.agent.post('/api/week-plans/stream').set('X-Forwarded-For', c.ip).set('X-CSRF-Token', c.csrf).set('Accept', 'text/event-stream').send({ weekStart: MONDAY, visitIds: [] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields.visitIds).toMatch(/at least one/);
  });
});

describe('GET /api/week-plans/current', () => {
  it('when two planned visits leave too little time to drive between them, then the day carries a warning', async () => {
    const { user, c } = await freshSpecialist();
    await makeVisits(user.id, [
      { lat: 39.9, lng: -98.1, durationMin: 60, fixedAt: at(MONDAY, 540), status: 'planned' },
      { lat: 39.0, lng: -98.1, durationMin: 60, fixedAt: at(MONDAY, 605), status: 'planned' },
    ]);
    const res = await c.get(`/api/week-plans/current?weekStart=${MONDAY}&days=1`);
    expect(res.status).toBe(200);
    expect(res.body.days[0].warnings.join(' ')).toMatch(/Not enough time to drive from .* to .*: \d+ min needed, 5 min free/);
    expect(res.body.days[0].stops).toHaveLength(2);
  });
});
