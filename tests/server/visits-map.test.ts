import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { RoadmapItem, Visit } from '../../server/db/models/index.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

type Client = Awaited<ReturnType<typeof signedIn>>;
let t: TestApp;
let territoryId: number;
let specialist: Client;

beforeAll(async () => {
  t = await testApp();
  territoryId = (await makeTerritory()).id;
  specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territoryId] }));
});
afterAll(async () => t.close());

const daysAgo = (days: number) => new Date(Date.now() - days * 86_400_000);

async function visit(accountId: number, status: 'requested' | 'planned' | 'done' | 'cancelled', startsAt: Date | null) {
  await Visit.create({ accountId, specialistId: null, planterId: null, purpose: 'pre-season-checkup', status, startsAt, durationMin: 60, windowStartMin: null, windowEndMin: null, notes: null, checklist: [], roadmapItemIds: [], requestedByContactId: null });
}

async function roadmapItem(accountId: number, planterId: number, componentId: number, season: number, stage: string, partsUsd: number, labourUsd: number) {
  await RoadmapItem.create({ accountId, planterId, componentId, season, quantity: 1, partsUsd, labourHours: 1, labourUsd, stage: stage as never, probabilityOverride: null, goalIds: [], explanation: null, specialistId: null, installWeek: null, stageChangedAt: null });
}

describe('GET /api/map/accounts', () => {
  it('when accounts have visits, requests and roadmap items, then each marker carries its own figures', async () => {
    const visited = await makeAccount(territoryId, { name: 'Marker Visited', lat: 39.7, lng: -98.2 });
    const never = await makeAccount(territoryId, { name: 'Marker Never', lat: 39.6, lng: -98.0 });
    const noPlace = await makeAccount(territoryId, { name: 'Marker Nowhere' });
    await noPlace.update({ lat: null, lng: null });
    await visit(visited.id, 'done', daysAgo(400));
    await visit(visited.id, 'done', daysAgo(10));
    await visit(visited.id, 'planned', daysAgo(-5));
    await visit(visited.id, 'requested', null);
    await visit(visited.id, 'requested', null);
    await visit(visited.id, 'cancelled', daysAgo(2));
    await visit(never.id, 'done', null);

    const planter = (await specialist.post(`/api/accounts/${visited.id}/planters`, planterBody())).body.planter;
    const part = await makeComponent();
    // Counted: season 2027, not declined. Left out: declined, and another season.
    await roadmapItem(visited.id, planter.id, part.id, 2027, 'proposed', 1200.5, 300.25);
    await roadmapItem(visited.id, planter.id, part.id, 2027, 'accepted', 800, 200);
    await roadmapItem(visited.id, planter.id, part.id, 2027, 'declined', 5000, 500);
    await roadmapItem(visited.id, planter.id, part.id, 2028, 'proposed', 9000, 900);

    const res = await specialist.get(`/api/map/accounts?territoryId=${territoryId}&season=2027`);
    expect(res.status).toBe(200);
    expect(res.body.season).toBe(2027);
    const byName = new Map(res.body.items.map((m: { name: string }) => [m.name, m]));
    expect(byName.get('Marker Visited')).toMatchObject({
      lat: 39.7,
      lng: -98.2,
      town: 'Testville',
      status: 'active',
      daysSinceLastVisit: 10,
      openRequests: 2,
      // 1200.50 + 300.25 + 800 + 200
      roadmapDueThisSeasonUsd: 2500.75,
      visitState: 'request',
    });
    expect((byName.get('Marker Visited') as { nextVisitAt: string }).nextVisitAt).toBeTruthy();
    expect(byName.get('Marker Never')).toMatchObject({ daysSinceLastVisit: null, openRequests: 0, roadmapDueThisSeasonUsd: 0, nextVisitAt: null, visitState: 'overdue' });
    expect(byName.has('Marker Nowhere')).toBe(false);
    expect(res.body.withoutLocation).toBeGreaterThanOrEqual(1);
    const later = await specialist.get(`/api/map/accounts?territoryId=${territoryId}&season=2028`);
    expect(later.body.items.find((m: { name: string }) => m.name === 'Marker Visited').roadmapDueThisSeasonUsd).toBe(9900);
  });

  it('when more accounts are added, then the number of database queries stays the same (no query per account)', async () => {
    const territory = (await makeTerritory()).id;
    const c = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory] }));
    let queries = 0;
    const count = () => {
      queries++;
    };
    const measure = async () => {
      queries = 0;
      t.sequelize.addHook('beforeQuery', 'count-map', count);
      const res = await c.get('/api/map/accounts');
      t.sequelize.removeHook('beforeQuery', 'count-map');
      expect(res.status).toBe(200);
      return { queries, markers: res.body.items.length };
    };
    for (let k = 0; k < 2; k++) await visit((await makeAccount(territory)).id, 'done', daysAgo(30));
    const few = await measure();
    for (let k = 0; k < 10; k++) await visit((await makeAccount(territory)).id, 'done', daysAgo(30));
    const many = await measure();
    expect([few.markers, many.markers]).toEqual([2, 12]);
    expect(few.queries).toBeGreaterThan(0);
    expect(many.queries).toBe(few.queries);
  });

  it('when people of other territories or growers ask, then they see only their own markers', async () => {
    const mine = await makeAccount(territoryId, { name: 'Marker Grower Own' });
    const other = (await makeTerritory()).id;
    const outsider = await signedIn(t.app, await makeUser('specialist', { territoryIds: [other] }));
    const outsiderView = await outsider.get('/api/map/accounts');
    expect(outsiderView.body.items).toEqual([]);
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: mine.id }));
    const own = await grower.get('/api/map/accounts');
    expect(own.body.items.map((m: { id: number }) => m.id)).toEqual([mine.id]);
    expect((await specialist.get('/api/map/accounts?season=nineteen')).status).toBe(400);
  });
});
