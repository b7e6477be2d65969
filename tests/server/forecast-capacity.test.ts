// Quotas with attainment, and shop install capacity by week.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Planter, RoadmapItem, Setting } from '../../server/db/models/index.js';
import { SETTING_DEFAULTS } from '../../server/modules/settings/settings.service.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent } from '../helpers/fleet.js';

type Client = Awaited<ReturnType<typeof signedIn>>;

let t: TestApp;
let territoryId: number;
let otherTerritoryId: number;
let manager: Client;
let otherManager: Client;
let admin: Client;
let specialist: Client;
let grower: Client;
let accountId: number;
let otherAccountId: number;
let planterId: number;
let otherPlanterId: number;
let componentId: number;

async function planterFor(account: number) {
  const p = await Planter.create({
    accountId: account,
    tractorId: null,
    farmSiteId: null,
    name: '12-row test planter',
    maker: 'Test Implement',
    modelYear: 2016,
    rows: 12,
    rowSpacingIn: 30,
    frameType: 'rigid',
    foldType: 'none',
    seedSupplyType: 'row-hoppers',
    seedCapacityUnits: 20,
    liquidTankCount: 0,
    liquidTankGallons: 0,
    dryCapacityLb: 0,
    markers: false,
    acresPerYear: 1200,
  });
  return p.id;
}

async function item(fields: { account?: 'mine' | 'other'; season: number; stage: RoadmapItem['stage']; partsUsd: number; labourUsd: number; labourHours: number; installWeek: string | null; locked?: boolean; specialistId?: number | null }) {
  const other = fields.account === 'other';
  const created = await RoadmapItem.create({
    accountId: other ? otherAccountId : accountId,
    planterId: other ? otherPlanterId : planterId,
    componentId,
    season: fields.season,
    quantity: 1,
    partsUsd: fields.partsUsd,
    labourHours: fields.labourHours,
    labourUsd: fields.labourUsd,
    stage: fields.stage,
    probabilityOverride: null,
    locked: fields.locked ?? false,
    goalIds: [],
    explanation: null,
    specialistId: fields.specialistId ?? null,
    installWeek: fields.installWeek,
    stageChangedAt: null,
  });
  return created.id;
}

let specialistId: number;
beforeAll(async () => {
  t = await testApp();
  await Setting.upsert({ key: 'stageProbabilities', value: SETTING_DEFAULTS.stageProbabilities });
  await Setting.upsert({ key: 'technicianHoursPerWeek', value: 80 });
  territoryId = (await makeTerritory('Capacity Test North ' + Date.now())).id;
  otherTerritoryId = (await makeTerritory('Capacity Test South ' + Date.now())).id;
  accountId = (await makeAccount(territoryId, { name: 'Cottonwood Bend Farms' })).id;
  otherAccountId = (await makeAccount(otherTerritoryId, { name: 'Dunlin Flats Grain' })).id;
  planterId = await planterFor(accountId);
  otherPlanterId = await planterFor(otherAccountId);
  componentId = (await makeComponent({ category: 'downforce' })).id;
  const s = await makeUser('specialist', { territoryIds: [territoryId] });
  specialistId = s.id;
  manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
  otherManager = await signedIn(t.app, await makeUser('manager', { territoryIds: [otherTerritoryId] }));
  admin = await signedIn(t.app, await makeUser('admin'));
  specialist = await signedIn(t.app, s);
  grower = await signedIn(t.app, await makeUser('grower', { accountId }));
});
afterAll(async () => t.close());

describe('quotas', () => {
  it('when a manager sets a quota, then attainment is installed ÷ quota and weighted ÷ quota', async () => {
    // Season 2031 in this territory: installed 3,000 + 600; accepted 5,000 + 1,000; declined 9,000.
    await item({ season: 2031, stage: 'installed', partsUsd: 3000, labourUsd: 600, labourHours: 4.8, installWeek: '2030-12-02' });
    await item({ season: 2031, stage: 'accepted', partsUsd: 5000, labourUsd: 1000, labourHours: 8, installWeek: '2031-02-03' });
    await item({ season: 2031, stage: 'declined', partsUsd: 9000, labourUsd: 0, labourHours: 0, installWeek: null });
    const put = await manager.put('/api/quotas', { territoryId, season: 2031, quotaUsd: 12000 });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    // actual = 3600; weighted = 3600 × 1 + 6000 × 0.9 + 9000 × 0 = 3600 + 5400 = 9000; pipeline = 3600 + 6000 = 9600
    // attainment = 3600 / 12000 = 0.3; weighted attainment = 9000 / 12000 = 0.75
    expect(put.body.quota).toMatchObject({ territoryId, season: 2031, quotaUsd: 12000, actualUsd: 3600, weightedUsd: 9000, pipelineUsd: 9600, itemCount: 3, attainment: 0.3, weightedAttainment: 0.75 });

    const list = await manager.get('/api/quotas?season=2031');
    expect(list.status).toBe(200);
    expect(list.body.territories).toHaveLength(1); // only the manager's own territory
    expect(list.body.territories[0]).toMatchObject({ territoryId, quotaUsd: 12000, attainment: 0.3, weightedAttainment: 0.75 });
    expect(list.body.totals).toMatchObject({ quotaUsd: 12000, actualUsd: 3600, attainment: 0.3 });

    // Changing it overwrites the same row: 3600 / 4500 = 0.8
    const again = await manager.put('/api/quotas', { territoryId, season: 2031, quotaUsd: 4500 });
    expect(again.body.quota.attainment).toBe(0.8);
    expect(again.body.quota.weightedAttainment).toBe(2); // 9000 / 4500
  });

  it('when a territory has no quota, then it is listed with a null quota and null attainment', async () => {
    const list = await admin.get('/api/quotas?season=2032');
    const mine = list.body.territories.find((r: { territoryId: number }) => r.territoryId === territoryId);
    expect(mine).toMatchObject({ quotaUsd: null, attainment: null, weightedAttainment: null, actualUsd: 0 });
    const other = list.body.territories.find((r: { territoryId: number }) => r.territoryId === otherTerritoryId);
    expect(other).toBeTruthy(); // the admin sees every territory
  });

  it('when a manager sets a quota for a territory not theirs, then 403 and nothing changes', async () => {
    const res = await otherManager.put('/api/quotas', { territoryId, season: 2031, quotaUsd: 1 });
    expect(res.status).toBe(403);
    const list = await admin.get('/api/quotas?season=2031');
    expect(list.body.territories.find((r: { territoryId: number }) => r.territoryId === territoryId).quotaUsd).toBe(4500);
  });

  it('when a quota is below zero or the season is missing, then 400 names the field', async () => {
    const res = await manager.put('/api/quotas', { territoryId, season: 2031, quotaUsd: -1 });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.quotaUsd).toBe('A quota cannot be below zero');
    const missing = await manager.put('/api/quotas', { territoryId, quotaUsd: 100 });
    expect(missing.body.error.details.fields.season).toBeTruthy();
    expect((await manager.get('/api/quotas')).body.error.details.fields.season).toBeTruthy();
  });

  it('when an admin sets a quota for a territory that does not exist, then 404', async () => {
    expect((await admin.put('/api/quotas', { territoryId: 99999999, season: 2031, quotaUsd: 100 })).status).toBe(404);
  });

  it('when a specialist or a grower asks for quotas, then 403', async () => {
    expect((await specialist.get('/api/quotas?season=2031')).status).toBe(403);
    expect((await specialist.put('/api/quotas', { territoryId, season: 2031, quotaUsd: 1 })).status).toBe(403);
    expect((await grower.get('/api/quotas?season=2031')).status).toBe(403);
    expect((await grower.put('/api/quotas', { territoryId, season: 2031, quotaUsd: 1 })).status).toBe(403);
  });
});

describe('shop capacity', () => {
  // Week of Monday 2091-01-01, far from any other test's data.
  const week = '2091-01-01';
  let small: number;
  let large: number;

  beforeAll(async () => {
    large = await item({ season: 2091, stage: 'accepted', partsUsd: 1000, labourUsd: 750, labourHours: 6, installWeek: week, specialistId });
    await item({ season: 2091, stage: 'ordered', partsUsd: 500, labourUsd: 375, labourHours: 3, installWeek: week, locked: true });
    // booked on the Wednesday: still the week of Monday 1 January
    small = await item({ season: 2091, stage: 'ordered', partsUsd: 200, labourUsd: 250, labourHours: 2, installWeek: '2091-01-03' });
    await item({ season: 2091, stage: 'idea', partsUsd: 100, labourUsd: 6250, labourHours: 50, installWeek: week }); // not booked
    await item({ season: 2091, stage: 'installed', partsUsd: 100, labourUsd: 6250, labourHours: 50, installWeek: week }); // done, not booked
    await item({ account: 'other', season: 2091, stage: 'accepted', partsUsd: 300, labourUsd: 500, labourHours: 4, installWeek: week });
    await item({ season: 2091, stage: 'accepted', partsUsd: 300, labourUsd: 125, labourHours: 1, installWeek: '2091-01-08' });
  });

  it('when booked hours pass the hours set for a week, then the week is flagged with the unlocked items smallest first', async () => {
    const set = await manager.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: 10 });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    const res = await manager.get('/api/shop-capacity?from=2091-01-02&to=2091-01-10');
    expect(res.status).toBe(200);
    expect(res.body.weeks.map((w: { weekStart: string }) => w.weekStart)).toEqual(['2091-01-01', '2091-01-08']);
    const [first, second] = res.body.weeks;
    // whole shop: 6 + 3 + 2 (this territory) + 4 (the other territory) = 15 h against 10 h → 5 h over
    // in the manager's scope: 6 + 3 + 2 = 11 h
    expect(first).toMatchObject({ weekStart: week, weekEnd: '2091-01-07', technicianHours: 10, technicianHoursSet: true, bookedHours: 15, bookedHoursInScope: 11, itemCountInScope: 3, over: true, hoursOver: 5, movableCount: 2 });
    // the locked 3-hour item cannot move; the other territory's item is not shown
    expect(first.movableItems.map((i: { id: number }) => i.id)).toEqual([small, large]);
    expect(first.movableItems[0]).toMatchObject({ labourHours: 2, installWeek: '2091-01-03', accountName: 'Cottonwood Bend Farms', stage: 'ordered', totalUsd: 450 });
    // the next week keeps the default of 80 h from the settings
    expect(second).toMatchObject({ technicianHours: 80, technicianHoursSet: false, bookedHours: 1, over: false, hoursOver: 0, movableItems: [] });
    expect(res.body.totals).toMatchObject({ technicianHours: 90, bookedHours: 16, overWeeks: 1 });
  });

  it('when the week is given back its default hours, then it is no longer over', async () => {
    await manager.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: 10 });
    const reset = await manager.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: null });
    expect(reset.body.week).toMatchObject({ technicianHours: 80, technicianHoursSet: false, over: false });
  });

  it('when a specialist reads capacity, then only their own items are in scope; setting hours is refused', async () => {
    await admin.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: 12 });
    const res = await specialist.get(`/api/shop-capacity?from=${week}&to=${week}`);
    expect(res.status).toBe(200);
    // whole shop 15 h > 12 h; the specialist owns only the 6-hour item
    expect(res.body.weeks[0]).toMatchObject({ bookedHours: 15, bookedHoursInScope: 6, over: true });
    expect(res.body.weeks[0].movableItems.map((i: { id: number }) => i.id)).toEqual([large]);
    expect((await specialist.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: 99 })).status).toBe(403);
  });

  it('when a grower asks, then 403', async () => {
    expect((await grower.get(`/api/shop-capacity?from=${week}&to=${week}`)).status).toBe(403);
    expect((await grower.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: 1 })).status).toBe(403);
  });

  it('when dates are inverted, impossible or too far apart, or the week does not start on Monday, then 400 names the field', async () => {
    const inverted = await manager.get('/api/shop-capacity?from=2091-02-01&to=2091-01-01');
    expect(inverted.status).toBe(400);
    expect(inverted.body.error.details.fields.to).toMatch(/not be before the first date/);
    const impossible = await manager.get('/api/shop-capacity?from=2091-02-30&to=2091-03-01');
    expect(impossible.body.error.details.fields.from).toBeTruthy();
    expect((await manager.get('/api/shop-capacity?from=2091-01-01&to=2093-01-01')).body.error.details.fields.to).toMatch(/53 weeks/);
    expect((await manager.get('/api/shop-capacity')).status).toBe(400);
    const tuesday = await manager.put('/api/shop-capacity/weeks/2091-01-02', { technicianHours: 10 });
    expect(tuesday.status).toBe(400);
    expect(tuesday.body.error.details.fields.weekStart).toBe('A week starts on a Monday');
    const negative = await manager.put(`/api/shop-capacity/weeks/${week}`, { technicianHours: -5 });
    expect(negative.body.error.details.fields.technicianHours).toBeTruthy();
  });
});
