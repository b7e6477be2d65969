import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, RoadmapItem, User, Visit } from '../../server/db/models/index.js';
import { DEFAULT_TIME_ZONE, fromLocal } from '../../server/modules/visits/local-time.js';
import { SETTING_DEFAULTS } from '../../server/modules/settings/settings.service.js';
import { client, makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

type Client = Awaited<ReturnType<typeof signedIn>>;
let t: TestApp;
let territoryId: number;
let otherTerritoryId: number;
let specialistUser: User;
let specialist: Client;
let otherSpecialistUser: User;
let otherSpecialist: Client;
let colleagueUser: User;
let manager: Client;
let admin: Client;

// A February week in Kansas (Central Standard Time, no daylight-saving change inside it).
const MONDAY = '2027-02-08';
const TUESDAY = '2027-02-09';
const at = (date: string, hh: number, mm = 0) => fromLocal(date, hh * 60 + mm, DEFAULT_TIME_ZONE).toISOString();

beforeAll(async () => {
  t = await testApp();
  territoryId = (await makeTerritory()).id;
  otherTerritoryId = (await makeTerritory()).id;
  specialistUser = await makeUser('specialist', { territoryIds: [territoryId] });
  colleagueUser = await makeUser('specialist', { territoryIds: [territoryId] });
  otherSpecialistUser = await makeUser('specialist', { territoryIds: [otherTerritoryId] });
  specialist = await signedIn(t.app, specialistUser);
  otherSpecialist = await signedIn(t.app, otherSpecialistUser);
  manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
  admin = await signedIn(t.app, await makeUser('admin'));
});
afterAll(async () => t.close());

async function newVisit(c: Client, body: Record<string, unknown>) {
  const res = await c.post('/api/visits', body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.visit;
}

/** A specialist of the main territory with an empty diary, so tests never share busy times. */
async function freshSpecialist() {
  const user = await makeUser('specialist', { territoryIds: [territoryId] });
  return { user, c: await signedIn(t.app, user) };
}

async function stored(id: number) {
  const row = await Visit.findByPk(id);
  return { startsAt: row!.startsAt ? new Date(row!.startsAt).toISOString() : null, durationMin: row!.durationMin, version: row!.version, status: row!.status };
}

describe('visits: create and read', () => {
  it('when a specialist books a visit inside working hours, then it is planned, assigned to them and listed in the week', async () => {
    const account = await makeAccount(territoryId, { name: 'Brannigan Acres' });
    const visit = await newVisit(specialist, { accountId: account.id, purpose: 'pre-season-checkup', startsAt: at(MONDAY, 9), checklist: [{ label: 'Check seed meters' }] });
    expect(visit).toMatchObject({ status: 'planned', durationMin: 90, specialistId: specialistUser.id, accountName: 'Brannigan Acres', fixed: false, version: 0 });
    expect(visit.endsAt).toBe(at(MONDAY, 10, 30));
    expect(visit.checklist).toEqual([{ label: 'Check seed meters', done: false }]);
    const list = await specialist.get(`/api/visits?from=${MONDAY}&to=2027-02-13&accountId=${account.id}`);
    expect(list.status).toBe(200);
    expect(list.body.items.map((v: { id: number }) => v.id)).toEqual([visit.id]);
    expect(list.body.total).toBe(1);
    const outside = await specialist.get(`/api/visits?from=2027-02-15&to=2027-02-20&accountId=${account.id}`);
    expect(outside.body.items).toEqual([]);
    const requested = await newVisit(specialist, { accountId: account.id, purpose: 'troubleshooting', notes: 'Row 7 skips' });
    expect(requested).toMatchObject({ status: 'requested', startsAt: null, durationMin: 90 });
    const byStatus = await specialist.get(`/api/visits?accountId=${account.id}&status=requested`);
    expect(byStatus.body.items.map((v: { id: number }) => v.id)).toEqual([requested.id]);
    const trail = await AuditEvent.findAll({ where: { accountId: account.id, entity: 'visit' } });
    expect(trail).toHaveLength(2);
  });

  it('when inputs are impossible, then 400 names each field and nothing is written', async () => {
    const account = await makeAccount(territoryId);
    const other = await makeAccount(territoryId);
    const before = await Visit.count({ where: { accountId: account.id } });
    const long = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', durationMin: 2000 });
    expect(long.status).toBe(400);
    expect(long.body.error.details.fields.durationMin).toMatch(/longer than a day/);
    const window = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', windowStartMin: 600, windowEndMin: 540 });
    expect(window.body.error.details.fields.windowEndMin).toMatch(/closes before it opens/);
    const fixedNoTime = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', fixed: true });
    expect(fixedNoTime.body.error.details.fields.startsAt).toMatch(/fixed appointment needs a start time/);
    const plannedNoTime = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', status: 'planned' });
    expect(plannedNoTime.body.error.details.fields.startsAt).toMatch(/planned visit needs a start time/);
    const longerThanDay = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', durationMin: 700 });
    expect(longerThanDay.body.error.details.fields.durationMin).toMatch(/longer than a working day/);
    const badPurpose = await specialist.post('/api/visits', { accountId: account.id, purpose: 'picnic', startsAt: 'next tuesday' });
    expect(Object.keys(badPurpose.body.error.details.fields).sort()).toEqual(['purpose', 'startsAt']);
    const planter = await specialist.post(`/api/accounts/${other.id}/planters`, planterBody());
    const wrongPlanter = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', planterId: planter.body.planter.id });
    expect(wrongPlanter.body.error.details.fields.planterId).toMatch(/not in this operation/);
    const wrongSpecialist = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', specialistId: otherSpecialistUser.id });
    expect(wrongSpecialist.body.error.details.fields.specialistId).toMatch(/does not cover/);
    expect(await Visit.count({ where: { accountId: account.id } })).toBe(before);
  });

  it('when a new visit falls outside hours or on top of another, then it is refused with the reason', async () => {
    const { c: specialist } = await freshSpecialist();
    const account = await makeAccount(territoryId);
    const early = await specialist.post('/api/visits', { accountId: account.id, purpose: 'install', startsAt: at(MONDAY, 6, 30), durationMin: 60 });
    expect(early.status).toBe(400);
    expect(early.body.error.code).toBe('outside_hours');
    expect(early.body.error.message).toMatch(/07:00–18:00.*06:30–07:30/);
    const first = await newVisit(specialist, { accountId: account.id, purpose: 'install', startsAt: at(MONDAY, 13), durationMin: 120 });
    const clash = await specialist.post('/api/visits', { accountId: account.id, purpose: 'roadmap-review', startsAt: at(MONDAY, 14, 30) });
    expect(clash.status).toBe(409);
    expect(clash.body.error).toMatchObject({ code: 'overlap', details: { conflictingVisitId: first.id } });
    expect(clash.body.error.details.fields.startsAt).toMatch(/13:00–15:00/);
    // A colleague's diary is their own: the same time is free for them.
    const colleagues = await specialist.post('/api/visits', { accountId: account.id, purpose: 'roadmap-review', startsAt: at(MONDAY, 14, 30), specialistId: colleagueUser.id });
    expect(colleagues.status, JSON.stringify(colleagues.body)).toBe(201);
    // Back to back is not an overlap.
    expect((await specialist.post('/api/visits', { accountId: account.id, purpose: 'roadmap-review', startsAt: at(MONDAY, 15) })).status).toBe(201);
  });

  it('when several visits are sent in one batch and one clashes, then none is written and the field names its place', async () => {
    const { c: specialist } = await freshSpecialist();
    const account = await makeAccount(territoryId);
    const res = await specialist.post('/api/visits/batch', {
      visits: [
        { accountId: account.id, purpose: 'install', startsAt: at(TUESDAY, 8), durationMin: 120 },
        { accountId: account.id, purpose: 'roadmap-review', startsAt: at(TUESDAY, 9) },
      ],
    });
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields['visits.1.startsAt']).toMatch(/Overlaps/);
    expect(await Visit.count({ where: { accountId: account.id } })).toBe(0);
    const ok = await specialist.post('/api/visits/batch', { visits: [{ accountId: account.id, purpose: 'pre-season-checkup' }, { accountId: account.id, purpose: 'roadmap-review' }] });
    expect(ok.status).toBe(201);
    expect(ok.body.visits.map((v: { status: string }) => v.status)).toEqual(['requested', 'requested']);
  });
});

describe('visits: rescheduling', () => {
  it('when a visit is dragged outside working hours, then 400 gives the reason and the row is unchanged', async () => {
    const { c: specialist } = await freshSpecialist();
    const account = await makeAccount(territoryId);
    const visit = await newVisit(specialist, { accountId: account.id, purpose: 'pre-season-checkup', startsAt: at(MONDAY, 10) });
    const before = await stored(visit.id);
    const late = await specialist.patch(`/api/visits/${visit.id}`, { startsAt: at(MONDAY, 17), version: visit.version });
    expect(late.status).toBe(400);
    expect(late.body.error.code).toBe('outside_hours');
    expect(late.body.error.details.fields.startsAt).toMatch(/visits run 07:00–18:00, and this one would run 17:00–18:30/);
    const longer = await specialist.patch(`/api/visits/${visit.id}`, { durationMin: 500, version: visit.version });
    expect(longer.status).toBe(400);
    expect(longer.body.error.code).toBe('outside_hours');
    expect(await stored(visit.id)).toEqual(before);
  });

  it('when a visit is dragged onto another visit of the same specialist, then 409 names it and the row is unchanged', async () => {
    const { c: specialist } = await freshSpecialist();
    const a = await makeAccount(territoryId, { name: 'Oldfield Grain' });
    const b = await makeAccount(territoryId);
    const blocking = await newVisit(specialist, { accountId: a.id, purpose: 'install', startsAt: at(TUESDAY, 13), durationMin: 180 });
    const moving = await newVisit(specialist, { accountId: b.id, purpose: 'roadmap-review', startsAt: at(TUESDAY, 9) });
    const before = await stored(moving.id);
    const res = await specialist.patch(`/api/visits/${moving.id}`, { startsAt: at(TUESDAY, 15, 30), version: moving.version });
    expect(res.status).toBe(409);
    expect(res.body.error.code).toBe('overlap');
    expect(res.body.error.details.conflictingVisitId).toBe(blocking.id);
    expect(res.body.error.message).toMatch(/Oldfield Grain, 2027-02-09 13:00–16:00/);
    expect(await stored(moving.id)).toEqual(before);
    // Handing it to a colleague at that time is allowed: their diary is free.
    const handed = await specialist.patch(`/api/visits/${moving.id}`, { startsAt: at(TUESDAY, 15, 30), specialistId: colleagueUser.id, version: moving.version });
    expect(handed.status, JSON.stringify(handed.body)).toBe(200);
  });

  it("when a visit is moved outside the grower's window, then 400 says so; inside it saves and the old version is stale", async () => {
    const { c: specialist } = await freshSpecialist();
    const account = await makeAccount(territoryId);
    const visit = await newVisit(specialist, { accountId: account.id, purpose: 'roadmap-review', startsAt: at(MONDAY, 8), windowStartMin: 480, windowEndMin: 720 });
    const afternoon = await specialist.patch(`/api/visits/${visit.id}`, { startsAt: at(MONDAY, 14), version: 0 });
    expect(afternoon.status).toBe(400);
    expect(afternoon.body.error.code).toBe('outside_window');
    expect(afternoon.body.error.message).toMatch(/08:00–12:00/);
    const moved = await specialist.patch(`/api/visits/${visit.id}`, { startsAt: at(MONDAY, 11), version: 0 });
    expect(moved.status).toBe(200);
    expect(moved.body.visit).toMatchObject({ startsAt: at(MONDAY, 11), version: 1 });
    const stale = await specialist.patch(`/api/visits/${visit.id}`, { startsAt: at(MONDAY, 9), version: 0 });
    expect(stale.status).toBe(409);
    expect(stale.body.error.code).toBe('stale');
    const noVersion = await specialist.patch(`/api/visits/${visit.id}`, { notes: 'x' });
    expect(noVersion.status).toBe(400);
    const half = await specialist.patch(`/api/visits/${visit.id}`, { windowEndMin: 400, version: 1 });
    expect(half.body.error.details.fields.windowEndMin).toMatch(/closes before it opens/);
    expect((await stored(visit.id)).startsAt).toBe(at(MONDAY, 11));
  });

  it('when a visit is marked done or cancelled, then its time is not re-checked and the change saves', async () => {
    const { c: specialist } = await freshSpecialist();
    const account = await makeAccount(territoryId);
    const visit = await newVisit(specialist, { accountId: account.id, purpose: 'troubleshooting', startsAt: at(TUESDAY, 16) });
    const done = await specialist.patch(`/api/visits/${visit.id}`, { status: 'done', notes: 'Replaced seed tube sensor on row 7', version: 0 });
    expect(done.status).toBe(200);
    expect(done.body.visit.status).toBe('done');
  });
});

describe('visits: who may see and change them', () => {
  it('when people outside the territory ask, then they see nothing and changes are 404; growers read their own and may only request', async () => {
    const { c: specialist } = await freshSpecialist();
    const mine = await makeAccount(territoryId);
    const theirs = await makeAccount(territoryId);
    const visit = await newVisit(specialist, { accountId: mine.id, purpose: 'pre-season-checkup', startsAt: at('2027-02-10', 9), notes: 'Bring closing wheels' });
    const theirVisit = await newVisit(specialist, { accountId: theirs.id, purpose: 'install', startsAt: at('2027-02-10', 13) });

    expect((await otherSpecialist.get(`/api/visits/${visit.id}`)).status).toBe(404);
    expect((await otherSpecialist.patch(`/api/visits/${visit.id}`, { notes: 'x', version: 0 })).status).toBe(404);
    expect((await otherSpecialist.delete(`/api/visits/${visit.id}`)).status).toBe(404);
    expect((await otherSpecialist.post('/api/visits', { accountId: mine.id, purpose: 'install' })).status).toBe(404);
    const otherList = await otherSpecialist.get(`/api/visits?accountId=${mine.id}`);
    expect(otherList.body.items).toEqual([]);

    expect((await manager.get(`/api/visits/${visit.id}`)).status).toBe(200);
    expect((await admin.get(`/api/visits?accountId=${theirs.id}`)).body.items.map((v: { id: number }) => v.id)).toEqual([theirVisit.id]);

    const grower = await signedIn(t.app, await makeUser('grower', { accountId: mine.id }));
    const growerList = await grower.get('/api/visits?from=2027-02-08&to=2027-02-15');
    expect(growerList.body.items.map((v: { id: number }) => v.id)).toEqual([visit.id]);
    expect((await grower.get(`/api/visits/${theirVisit.id}`)).status).toBe(404);
    expect((await grower.patch(`/api/visits/${visit.id}`, { notes: 'x', version: 0 })).status).toBe(403);
    expect((await grower.delete(`/api/visits/${visit.id}`)).status).toBe(403);
    const request = await grower.post('/api/visits', { accountId: mine.id, purpose: 'pre-season-checkup', windowStartMin: 480, windowEndMin: 720, notes: 'Any morning next week' });
    expect(request.status, JSON.stringify(request.body)).toBe(201);
    expect(request.body.visit).toMatchObject({ status: 'requested', startsAt: null, windowStartMin: 480 });
    expect((await grower.post('/api/visits', { accountId: mine.id, purpose: 'install', startsAt: at('2027-02-11', 9) })).status).toBe(403);
    expect((await grower.post('/api/visits', { accountId: theirs.id, purpose: 'install' })).status).toBe(404);
    expect((await grower.get(`/api/visits/candidates?weekStart=${MONDAY}`)).status).toBe(403);

    const anonymous = client(t.app);
    expect((await anonymous.get('/api/visits')).status).toBe(401);
  });

  it('when staff delete a visit, then it is gone and the trail says so', async () => {
    const account = await makeAccount(territoryId);
    const visit = await newVisit(specialist, { accountId: account.id, purpose: 'post-season-review' });
    expect((await specialist.delete(`/api/visits/${visit.id}`)).status).toBe(204);
    expect((await specialist.get(`/api/visits/${visit.id}`)).status).toBe(404);
    expect((await specialist.delete(`/api/visits/${visit.id}`)).status).toBe(404);
    const trail = await AuditEvent.findAll({ where: { accountId: account.id, entity: 'visit', action: 'delete' } });
    expect(trail).toHaveLength(1);
  });

  it('when the list query is malformed, then 400 names the parameter', async () => {
    const res = await specialist.get('/api/visits?from=2027-13-01&status=planned,lost&pageSize=0');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['from', 'pageSize', 'status']);
    expect(res.body.error.details.fields.status).toMatch(/requested, planned, done, cancelled/);
    const backwards = await specialist.get('/api/visits?from=2027-02-10&to=2027-02-08');
    expect(backwards.body.error.details.fields.to).toMatch(/before its start/);
  });
});

describe('visit candidates for a week', () => {
  it('when accounts lack this season’s check-up or review, or have open requests, then each appears once with its reason', async () => {
    const territory = (await makeTerritory()).id;
    const user = await makeUser('specialist', { territoryIds: [territory] });
    const me = await signedIn(t.app, user);
    const checkedLastSpring = await makeAccount(territory, { name: 'Aardvark Spring Farms', specialistId: user.id });
    const checkedThisAutumn = await makeAccount(territory, { name: 'Bexley Autumn Farms', specialistId: user.id });
    const requestedOnly = await makeAccount(territory, { name: 'Cobb Request Farms', specialistId: user.id });
    const withRoadmap = await makeAccount(territory, { name: 'Dunmore Roadmap Farms', specialistId: user.id });
    const someoneElses = await makeAccount(territory, { name: 'Elsewhere Farms', specialistId: null });

    const done = (accountId: number, purpose: string, startsAt: Date) =>
      Visit.create({ accountId, specialistId: user.id, planterId: null, purpose: purpose as never, status: 'done', startsAt, durationMin: 90, windowStartMin: null, windowEndMin: null, notes: null, checklist: [], roadmapItemIds: [], requestedByContactId: null });
    await done(checkedLastSpring.id, 'pre-season-checkup', new Date('2026-03-20T15:00:00Z'));
    await done(checkedThisAutumn.id, 'pre-season-checkup', new Date('2026-10-05T15:00:00Z'));
    await done(withRoadmap.id, 'pre-season-checkup', new Date('2026-09-01T15:00:00Z'));
    const request = await newVisit(me, { accountId: requestedOnly.id, purpose: 'pre-season-checkup' });

    const planter = (await me.post(`/api/accounts/${withRoadmap.id}/planters`, planterBody())).body.planter;
    const part = await makeComponent();
    await RoadmapItem.create({ accountId: withRoadmap.id, planterId: planter.id, componentId: part.id, season: 2027, quantity: 16, partsUsd: 1600, labourHours: 8, labourUsd: 1000, stage: 'proposed', probabilityOverride: null, goalIds: [], explanation: null, specialistId: user.id, installWeek: null, stageChangedAt: null });

    const res = await me.get('/api/visits/candidates?weekStart=2026-12-07');
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ season: 2027, checkupsSince: '2026-07-01' });
    const summary = res.body.items.map((c: { kind: string; accountName: string; visitId: number | null }) => `${c.kind}:${c.accountName}`);
    expect(summary.sort()).toEqual(['checkup-due:Aardvark Spring Farms', 'requested:Cobb Request Farms', 'review-overdue:Dunmore Roadmap Farms'].sort());
    const due = res.body.items.find((c: { kind: string }) => c.kind === 'checkup-due');
    expect(due).toMatchObject({ visitId: null, purpose: 'pre-season-checkup', durationMin: 90, lastDoneAt: '2026-03-20T15:00:00.000Z', reason: 'No pre-season check-up since 2026-07-01' });
    expect(res.body.items.find((c: { kind: string }) => c.kind === 'requested')).toMatchObject({ visitId: request.id, version: 0 });
    expect(summary.join()).not.toContain(someoneElses.name);

    // A manager sees the account without a specialist too; a specialist of another territory sees none of them.
    const territoryManager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territory] }));
    const all = await territoryManager.get('/api/visits/candidates?weekStart=2026-12-07');
    expect(all.body.items.map((c: { accountName: string }) => c.accountName)).toContain('Elsewhere Farms');
    const outsider = await otherSpecialist.get('/api/visits/candidates?weekStart=2026-12-07');
    expect(outsider.body.items.filter((c: { accountId: number }) => [checkedLastSpring.id, withRoadmap.id, someoneElses.id].includes(c.accountId))).toEqual([]);
    expect((await me.get('/api/visits/candidates?weekStart=soon')).status).toBe(400);
  });
});

describe('settings the rules read', () => {
  it('when nothing is stored, then visits run 07:00–18:00 as the defaults say', () => {
    expect([SETTING_DEFAULTS.dayStartMin, SETTING_DEFAULTS.dayEndMin]).toEqual([420, 1080]);
  });
});
