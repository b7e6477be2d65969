import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, Planter } from '../../server/db/models/index.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

let t: TestApp;
let territoryId: number;
let specialist: Awaited<ReturnType<typeof signedIn>>;
beforeAll(async () => {
  t = await testApp();
  territoryId = (await makeTerritory()).id;
  specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territoryId] }));
});
afterAll(async () => t.close());

async function newPlanter(accountId: number, over = {}) {
  const res = await specialist.post(`/api/accounts/${accountId}/planters`, planterBody(over));
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.planter;
}

describe('fleet records', () => {
  it('when a specialist records a tractor, site and planter with installs, then the planter reads back whole', async () => {
    const account = await makeAccount(territoryId);
    const site = await specialist.post(`/api/accounts/${account.id}/farm-sites`, { name: 'Home yard', lat: 39.6, lng: -98.2 });
    expect(site.status).toBe(201);
    const tractor = await specialist.post(`/api/accounts/${account.id}/tractors`, { name: 'Big tractor', modelYear: 2019, hydraulicFlowGpm: 58, hydraulicPressurePsi: 3000, remoteValves: 5, ptoHp: 310 });
    expect(tractor.status).toBe(201);
    const planter = await newPlanter(account.id, { tractorId: tractor.body.tractor.id, farmSiteId: site.body.farmSite.id });
    const meter = await makeComponent({ category: 'seed-meter', unit: 'row' });
    const cleaner = await makeComponent({ category: 'row-cleaner', unit: 'row' });
    const harness = await makeComponent({ category: 'harness-controller', unit: 'toolbar', movesToNewToolbar: false });
    const all = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: meter.id, scope: 'all-rows', installDate: '2024-03-01', pricePaidUsd: 6160 });
    expect(all.status, JSON.stringify(all.body)).toBe(201);
    expect(all.body.install.quantity).toBe(16);
    const half = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: cleaner.id, scope: 'rows', rowFrom: 1, rowTo: 8, serialNumbers: ['RC-1', 'RC-2'] });
    expect(half.body.install.quantity).toBe(8);
    const bar = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: harness.id, scope: 'toolbar', toolbarId: planter.toolbars[0].id, workOrder: 'WO-1' });
    expect(bar.status).toBe(201);
    const read = await specialist.get(`/api/planters/${planter.id}`);
    expect(read.body.planter).toMatchObject({ rows: 16, rowSpacingIn: 30, liquidTankGallons: 200, tractor: { hydraulicFlowGpm: 58 } });
    expect(read.body.planter.installs.map((i: { scope: string }) => i.scope).sort()).toEqual(['all-rows', 'rows', 'toolbar']);
    expect(read.body.planter.installs.find((i: { scope: string }) => i.scope === 'rows').serialNumbers).toEqual(['RC-1', 'RC-2']);
    const detail = await specialist.get(`/api/accounts/${account.id}`);
    expect(detail.body.account.planters[0]).toMatchObject({ id: planter.id, installCount: 3 });
    expect(detail.body.account.tractors[0].hydraulicFlowGpm).toBe(58);
    const trail = await specialist.get(`/api/accounts/${account.id}/audit`);
    expect(trail.body.items.length).toBeGreaterThanOrEqual(6);
    expect(trail.body.items[0].userName).toBeTruthy();
  });

  it('when inputs are impossible, then 400 names the fields and nothing is written', async () => {
    const account = await makeAccount(territoryId);
    const before = await Planter.count({ where: { accountId: account.id } });
    const bad = await specialist.post(`/api/accounts/${account.id}/planters`, planterBody({ rows: 0, rowSpacingIn: -30, toolbars: [{ name: 'Bar', sizeFt: 40, firstRow: 1, lastRow: 24 }] }));
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields).toHaveProperty('rows');
    expect(bad.body.error.details.fields).toHaveProperty('rowSpacingIn');
    expect(await Planter.count({ where: { accountId: account.id } })).toBe(before);

    const planter = await newPlanter(account.id);
    const part = await makeComponent();
    const outside = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: part.id, scope: 'rows', rowFrom: 9, rowTo: 20 });
    expect(outside.status).toBe(400);
    expect(outside.body.error.details.fields.rowTo).toMatch(/only 16 rows/);
    const unknown = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: 99999999, scope: 'all-rows' });
    expect(unknown.body.error.details.fields.componentId).toBeTruthy();
    const dates = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: part.id, scope: 'all-rows', installDate: '2025-04-01', status: 'removed', removedDate: '2024-01-01' });
    expect(dates.body.error.details.fields.removedDate).toMatch(/before it was installed/);
    const wrongPlace = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: part.id, scope: 'planter' });
    expect(wrongPlace.body.error.details.fields.scope).toMatch(/row units/);
    const badSite = await specialist.post(`/api/accounts/${account.id}/farm-sites`, { name: 'X', lat: 95, lng: -200 });
    expect(Object.keys(badSite.body.error.details.fields).sort()).toEqual(['lat', 'lng']);
  });

  it('when two people edit the same planter, then the second save gets 409 and nothing is overwritten', async () => {
    const account = await makeAccount(territoryId);
    const planter = await newPlanter(account.id);
    const first = await specialist.put(`/api/planters/${planter.id}`, { ...planterBody({ name: 'First edit' }), toolbars: planter.toolbars, version: planter.version });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    const second = await specialist.put(`/api/planters/${planter.id}`, { ...planterBody({ name: 'Second edit' }), toolbars: planter.toolbars, version: planter.version });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('stale');
    expect((await Planter.findByPk(planter.id))!.name).toBe('First edit');
    const contact = await specialist.post(`/api/accounts/${account.id}/contacts`, { name: 'Ada Farmer', email: 'ada@example.test' });
    const c1 = await specialist.patch(`/api/contacts/${contact.body.contact.id}`, { phone: '785-555-0101', version: 0 });
    expect(c1.status).toBe(200);
    const c2 = await specialist.patch(`/api/contacts/${contact.body.contact.id}`, { phone: '785-555-0102', version: 0 });
    expect(c2.status).toBe(409);
  });

  it('when a planter shrinks below its installed rows, then it is refused', async () => {
    const account = await makeAccount(territoryId);
    const planter = await newPlanter(account.id);
    const part = await makeComponent();
    await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: part.id, scope: 'rows', rowFrom: 9, rowTo: 16 });
    const res = await specialist.put(`/api/planters/${planter.id}`, { ...planterBody({ rows: 12 }), toolbars: [{ ...planter.toolbars[0], lastRow: 12 }], version: planter.version });
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.rows).toMatch(/row 16/);
  });
});

describe('who may read and change a fleet', () => {
  it('when a grower reads their own fleet, then it is served; changing it is 403; another grower\'s is 404', async () => {
    const mine = await makeAccount(territoryId);
    const theirs = await makeAccount(territoryId);
    const planter = await newPlanter(mine.id);
    const otherPlanter = await newPlanter(theirs.id);
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: mine.id }));
    expect((await grower.get(`/api/planters/${planter.id}`)).status).toBe(200);
    expect((await grower.get(`/api/accounts/${mine.id}`)).body.account.planters).toHaveLength(1);
    const change = await grower.put(`/api/planters/${planter.id}`, { ...planterBody(), toolbars: planter.toolbars, version: planter.version });
    expect(change.status).toBe(403);
    expect((await grower.post(`/api/accounts/${mine.id}/contacts`, { name: 'Sneaky' })).status).toBe(403);
    expect((await grower.get(`/api/planters/${otherPlanter.id}`)).status).toBe(404);
    expect((await grower.get(`/api/accounts/${theirs.id}/audit`)).status).toBe(404);
    expect((await grower.get('/api/components')).status).toBe(403);
    const list = await grower.get('/api/planters?pageSize=200');
    expect(list.body.items.map((p: { id: number }) => p.id)).toEqual([planter.id]);
  });

  it('when a specialist of another territory asks for a planter, then 404', async () => {
    const elsewhere = await makeTerritory();
    const account = await makeAccount(elsewhere.id);
    const outsider = await signedIn(t.app, await makeUser('specialist', { territoryIds: [elsewhere.id] }));
    const planter = (await outsider.post(`/api/accounts/${account.id}/planters`, planterBody())).body.planter;
    expect((await specialist.get(`/api/planters/${planter.id}`)).status).toBe(404);
    expect((await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: 1, scope: 'all-rows' })).status).toBe(404);
  });

  it('when a specialist edits the catalog, then 403; a manager may', async () => {
    const manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
    const body = { category: 'display', name: 'Cab display', partNumber: `D-${Date.now()}`, priceUsd: 2000, labourHours: 2, expectedLifeYears: 8, unit: 'planter' };
    expect((await specialist.post('/api/components', body)).status).toBe(403);
    const created = await manager.post('/api/components', body);
    expect(created.status).toBe(201);
    expect(created.body.component.priceUsd).toBe(2000);
    expect((await manager.post('/api/components', body)).status).toBe(409);
  });
});

describe('account detail cost', () => {
  it('when an account has more planters and installs, then its detail still takes the same number of SQL queries', async () => {
    const small = await makeAccount(territoryId);
    const big = await makeAccount(territoryId);
    const part = await makeComponent();
    await newPlanter(small.id);
    for (let i = 0; i < 5; i++) {
      const p = await newPlanter(big.id, { name: `Planter ${i}` });
      for (let k = 0; k < 3; k++) await specialist.post(`/api/planters/${p.id}/installs`, { componentId: part.id, scope: 'all-rows' });
    }
    const count = async (id: number) => {
      let n = 0;
      const options = (t.sequelize as unknown as { options: { logging: unknown } }).options;
      const original = options.logging;
      options.logging = (sql: string) => {
        if (!/sessions|security_events/.test(sql)) n++;
      };
      try {
        expect((await specialist.get(`/api/accounts/${id}`)).status).toBe(200);
      } finally {
        options.logging = original;
      }
      return n;
    };
    const smallQueries = await count(small.id);
    const bigQueries = await count(big.id);
    expect(smallQueries).toBeGreaterThanOrEqual(4); // the hook sees the queries: account, contacts, sites, tractors, planters
    expect(bigQueries).toBe(smallQueries);
    expect(bigQueries).toBeLessThanOrEqual(8);
    expect(await AuditEvent.count({ where: { accountId: big.id } })).toBe(20);
  });
});
