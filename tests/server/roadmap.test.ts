import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { AuditEvent, ComponentRule, Install, RoadmapItem, SeasonBudget } from '../../server/db/models/index.js';
import { currentPlanningSeason } from '../../server/modules/roadmap/planner-input.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

let t: TestApp;
let territoryId: number;
let specialist: Awaited<ReturnType<typeof signedIn>>;
const first = currentPlanningSeason();

beforeAll(async () => {
  t = await testApp();
  territoryId = (await makeTerritory()).id;
  specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territoryId] }));
});
afterAll(async () => t.close());

/**
 * A small catalog of the kind the planner exists for: a cheap hydraulic rate drive that electric
 * row drives later supersede. Capabilities are unique to this test (suffix) so other rows never match.
 */
async function scenario() {
  const tag = Math.random().toString(36).slice(2, 7);
  const rate = `rate-${tag}`;
  const electric = `electric-${tag}`;
  const speed = `speed-${tag}`;
  const hydraulicDrive = await makeComponent({ category: 'meter-drive', unit: 'toolbar', priceUsd: 2900, labourHours: 6, expectedLifeYears: 12, movesToNewToolbar: false, name: `Hydraulic drive ${tag}` });
  const electricDrive = await makeComponent({ category: 'meter-drive', unit: 'row', priceUsd: 640, labourHours: 1, expectedLifeYears: 10, name: `Electric drive ${tag}` });
  const delivery = await makeComponent({ category: 'seed-delivery', unit: 'row', priceUsd: 890, labourHours: 1, expectedLifeYears: 10, name: `Fast delivery ${tag}` });
  await ComponentRule.bulkCreate([
    { componentId: hydraulicDrive.id, kind: 'provides', targetComponentId: null, capability: rate, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null },
    { componentId: electricDrive.id, kind: 'provides', targetComponentId: null, capability: rate, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null },
    { componentId: electricDrive.id, kind: 'provides', targetComponentId: null, capability: electric, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null },
    { componentId: electricDrive.id, kind: 'supersedes', targetComponentId: hydraulicDrive.id, capability: null, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null },
    { componentId: delivery.id, kind: 'provides', targetComponentId: null, capability: speed, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null },
    { componentId: delivery.id, kind: 'requires', targetComponentId: null, capability: electric, labourHoursSavedPerUnit: null, partsUsdSavedPerUnit: null },
  ]);
  const account = await makeAccount(territoryId);
  const planter = (await specialist.post(`/api/accounts/${account.id}/planters`, planterBody({ rows: 8, toolbars: [{ name: 'Bar', sizeFt: 20, firstRow: 1, lastRow: 8 }] }))).body.planter;
  const g1 = await specialist.post(`/api/accounts/${account.id}/goals`, { kind: 'rates-by-zone', label: 'Rates by zone', planterId: planter.id, capabilities: [rate], targetSeason: first, priority: 2 });
  expect(g1.status, JSON.stringify(g1.body)).toBe(201);
  await specialist.post(`/api/accounts/${account.id}/goals`, { kind: 'planting-speed', label: 'Plant faster', planterId: planter.id, capabilities: [speed], targetSeason: first + 2, priority: 3 });
  // The first season's budget covers one goal, not both: a naive buyer takes the cheap drive now.
  for (const [k, budget] of [7000, 12000, 15000, 10000].entries()) {
    expect((await specialist.put(`/api/accounts/${account.id}/budgets`, { season: first + k, budgetUsd: budget })).status).toBe(200);
  }
  return { account, planter, hydraulicDrive, electricDrive, delivery };
}

describe('planning a roadmap', () => {
  it('when the grower will need electric drives later, then the plan buys them now and the naive order wastes money', async () => {
    const s = await scenario();
    const res = await specialist.post(`/api/accounts/${s.account.id}/roadmap/plan`, { horizonSeasons: 4 });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    const items = res.body.seasons.flatMap((x: { items: { componentId: number; season: number }[] }) => x.items);
    expect(items.find((i: { componentId: number }) => i.componentId === s.electricDrive.id)?.season).toBe(first);
    expect(items.some((i: { componentId: number }) => i.componentId === s.hydraulicDrive.id)).toBe(false);
    expect(res.body.wasteUsd).toBe(0);
    expect(res.body.unmetGoals).toEqual([]);
    // The cheapest-first order buys the $2,900 hydraulic drive now and throws most of it away when
    // the electric drives arrive: straight-line over 12 years.
    expect(res.body.naive.wasteUsd).toBeGreaterThan(2000);
    const cheapest = res.body.compare.find((c: { strategy: string }) => c.strategy === 'cheapest-first');
    expect(cheapest.wasteItems[0].explanation).toMatch(/\d{4}/);
    expect(items.every((i: { explanation: string }) => /\d{4}/.test(i.explanation))).toBe(true);
    const byRoute = await specialist.get(`/api/accounts/${s.account.id}/roadmap`);
    expect(byRoute.body.wasteUsd).toBe(0);
  });

  it('when an item moves to a season that breaks the order, then the answer warns; moving it back clears it', async () => {
    const s = await scenario();
    const plan = (await specialist.post(`/api/accounts/${s.account.id}/roadmap/plan`, { horizonSeasons: 4 })).body;
    const delivery = plan.seasons.flatMap((x: { items: unknown[] }) => x.items).find((i: { componentId: number }) => i.componentId === s.delivery.id);
    const drive = plan.seasons.flatMap((x: { items: unknown[] }) => x.items).find((i: { componentId: number }) => i.componentId === s.electricDrive.id);
    // Put the electric drives after the delivery that needs them.
    const preview = await specialist.post(`/api/accounts/${s.account.id}/roadmap/evaluate`, { moves: [{ itemId: drive.id, season: first + 3 }] });
    expect(preview.status).toBe(200);
    expect(preview.body.warnings.length).toBeGreaterThan(0);
    expect(await RoadmapItem.count({ where: { id: drive.id, season: first + 3 } })).toBe(0);
    const moved = await specialist.patch(`/api/roadmap-items/${drive.id}`, { season: first + 3, version: drive.version });
    expect(moved.status, JSON.stringify(moved.body)).toBe(200);
    expect(moved.body.warnings.join(' ')).toMatch(/no longer|late|throws away/);
    const again = moved.body.roadmap.seasons.flatMap((x: { items: unknown[] }) => x.items).find((i: { id: number }) => i.id === drive.id);
    const back = await specialist.patch(`/api/roadmap-items/${drive.id}`, { season: first, version: again.version });
    expect(back.status).toBe(200);
    expect(back.body.warnings).toEqual([]);
    expect(back.body.roadmap.wasteUsd).toBe(0);
    expect(delivery.season).toBeGreaterThanOrEqual(first);
    const trail = await AuditEvent.findAll({ where: { accountId: s.account.id, entity: 'roadmapItem' } });
    expect(trail.map((a) => a.summary).join(' ')).toMatch(new RegExp(`moved from ${first} to ${first + 3}`));
  });

  it('when a goal asks for a capability no part provides, then the plan still comes back and says why', async () => {
    const account = await makeAccount(territoryId);
    const planter = (await specialist.post(`/api/accounts/${account.id}/planters`, planterBody())).body.planter;
    await specialist.post(`/api/accounts/${account.id}/goals`, { kind: 'other', label: 'Something no part does', planterId: planter.id, capabilities: ['nothing-provides-this'], targetSeason: first + 1 });
    const res = await specialist.post(`/api/accounts/${account.id}/roadmap/plan`, {});
    expect(res.status).toBe(200);
    expect(res.body.unmetGoals).toHaveLength(1);
    expect(res.body.unmetGoals[0].reason.length).toBeGreaterThan(10);
  });

  it('when goals, budgets or moves are impossible, then 400 names the field', async () => {
    const s = await scenario();
    const past = await specialist.post(`/api/accounts/${s.account.id}/goals`, { kind: 'rates-by-zone', label: 'Too late', targetSeason: first - 1 });
    expect(past.status).toBe(400);
    expect(past.body.error.details.fields.targetSeason).toMatch(/passed/);
    const negative = await specialist.put(`/api/accounts/${s.account.id}/budgets`, { season: first, budgetUsd: -5 });
    expect(negative.body.error.details.fields.budgetUsd).toMatch(/negative/);
    const otherPlanter = await specialist.post(`/api/accounts/${s.account.id}/goals`, { kind: 'rates-by-zone', label: 'x', planterId: 99999999, targetSeason: first });
    expect(otherPlanter.body.error.details.fields.planterId).toBeTruthy();
    expect(await SeasonBudget.count({ where: { accountId: s.account.id, budgetUsd: -5 } })).toBe(0);
    const plan = (await specialist.post(`/api/accounts/${s.account.id}/roadmap/plan`, { horizonSeasons: 4 })).body;
    const item = plan.seasons[0].items[0];
    const far = await specialist.patch(`/api/roadmap-items/${item.id}`, { season: first + 15, version: item.version });
    expect(far.status).toBe(400);
  });

  it('when a rule set has a cycle, then it is refused with the parts named and nothing changes', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const a = await makeComponent({ name: 'Cycle part A' });
    const b = await makeComponent({ name: 'Cycle part B' });
    const before = await ComponentRule.count();
    const current = (await admin.get('/api/component-rules')).body.items;
    const res = await admin.put('/api/component-rules', {
      rules: [...current, { componentId: a.id, kind: 'requires', targetComponentId: b.id }, { componentId: b.id, kind: 'requires', targetComponentId: a.id }],
    });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error.details.problems)).toMatch(/Cycle part A/);
    expect(JSON.stringify(res.body.error.details.problems)).toMatch(/Cycle part B/);
    expect(await ComponentRule.count()).toBe(before);
    expect((await specialist.put('/api/component-rules', { rules: current })).status).toBe(403);
  });
});

describe('quotes', () => {
  it('when a grower accepts a season\'s quote in the portal, then the specialist sees the items accepted and locked', async () => {
    const s = await scenario();
    await specialist.post(`/api/accounts/${s.account.id}/roadmap/plan`, { horizonSeasons: 4 });
    const quote = await specialist.post(`/api/accounts/${s.account.id}/quotes`, { season: first });
    expect(quote.status, JSON.stringify(quote.body)).toBe(201);
    expect(quote.body.quote.totalUsd).toBeCloseTo(quote.body.quote.partsUsd + quote.body.quote.labourUsd, 2);
    const pdf = await specialist.agent.get(`/api/quotes/${quote.body.quote.id}/pdf`).buffer(true).parse((res, cb) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => cb(null, Buffer.concat(chunks)));
    });
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect((pdf.body as Buffer).subarray(0, 5).toString()).toBe('%PDF-');

    expect((await specialist.post(`/api/quotes/${quote.body.quote.id}/accept`)).status).toBe(403);
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: s.account.id }));
    const stranger = await signedIn(t.app, await makeUser('grower', { accountId: (await makeAccount(territoryId)).id }));
    expect((await stranger.post(`/api/quotes/${quote.body.quote.id}/accept`)).status).toBe(404);
    const accepted = await grower.post(`/api/quotes/${quote.body.quote.id}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.body.quote.status).toBe('accepted');
    expect((await grower.post(`/api/quotes/${quote.body.quote.id}/decline`)).status).toBe(409);
    const seen = (await specialist.get(`/api/accounts/${s.account.id}/roadmap`)).body.seasons[0].items;
    expect(seen.every((i: { stage: string; locked: boolean }) => i.stage === 'accepted' && i.locked)).toBe(true);
    const locked = seen[0];
    const move = await specialist.patch(`/api/roadmap-items/${locked.id}`, { season: first + 1, version: locked.version });
    expect(move.status).toBe(409);
    const trail = (await specialist.get(`/api/accounts/${s.account.id}/audit`)).body.items;
    expect(trail[0].summary).toMatch(/accepted the \d{4} quote/);
    // Re-planning keeps what the grower committed to.
    const replanned = await specialist.post(`/api/accounts/${s.account.id}/roadmap/plan`, { horizonSeasons: 4 });
    expect(replanned.body.seasons[0].items.map((i: { id: number }) => i.id).sort()).toEqual(seen.map((i: { id: number }) => i.id).sort());
    expect(await Install.count({ where: { planterId: s.planter.id } })).toBe(0);
  });

  it('when a grower reads the roadmap, then it is theirs only and they cannot re-plan it', async () => {
    const s = await scenario();
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: s.account.id }));
    expect((await grower.get(`/api/accounts/${s.account.id}/roadmap`)).status).toBe(200);
    expect((await grower.post(`/api/accounts/${s.account.id}/roadmap/plan`, {})).status).toBe(403);
    expect((await grower.post(`/api/accounts/${s.account.id}/goals`, { kind: 'other', label: 'x', targetSeason: first })).status).toBe(403);
    const other = await makeAccount(territoryId);
    expect((await grower.get(`/api/accounts/${other.id}/roadmap`)).status).toBe(404);
  });
});
