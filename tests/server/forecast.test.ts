// Forecast API: a worked example computed by hand, drill-down, CSV, access and bad input.
// Arithmetic is ordinary weighted-pipeline bookkeeping (common practice): expected revenue =
// (parts + labour) × the probability of the item's stage.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Planter, RoadmapItem, Setting } from '../../server/db/models/index.js';
import { SETTING_DEFAULTS } from '../../server/modules/settings/settings.service.js';
import { forecastReference, type ForecastItemInput } from '../../shared/calc/forecast-reference.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent } from '../helpers/fleet.js';

type Client = Awaited<ReturnType<typeof signedIn>>;
type Row = { key: string; label: string; pipelineUsd: number; weightedUsd: number; actualUsd: number; itemCount: number };

let t: TestApp;
let territoryId: number;
let otherTerritoryId: number;
let s1Id: number;
let s2Id: number;
let a1Id: number;
let a2Id: number;
let meterCategory: string;
let downforceCategory: string;
const ids: Record<number, number> = {}; // worked-example item number → roadmap item id
let manager: Client;
let admin: Client;
let specialist1: Client;
let otherManager: Client;
let grower: Client;
const examples: ForecastItemInput[] = [];

async function planterFor(accountId: number) {
  return Planter.create({
    accountId,
    tractorId: null,
    farmSiteId: null,
    name: '16-row test planter',
    maker: 'Test Implement',
    modelYear: 2018,
    rows: 16,
    rowSpacingIn: 30,
    frameType: 'three-section-flex',
    foldType: 'stack',
    seedSupplyType: 'central-fill',
    seedCapacityUnits: 60,
    liquidTankCount: 0,
    liquidTankGallons: 0,
    dryCapacityLb: 0,
    markers: false,
    acresPerYear: 2000,
  });
}

beforeAll(async () => {
  t = await testApp();
  // The worked example uses the settings' default stage probabilities: idea 0.1, proposed 0.25,
  // quoted 0.5, accepted 0.9, ordered 0.95, installed 1, declined 0.
  await Setting.upsert({ key: 'stageProbabilities', value: SETTING_DEFAULTS.stageProbabilities });
  territoryId = (await makeTerritory()).id;
  otherTerritoryId = (await makeTerritory()).id;
  const s1 = await makeUser('specialist', { territoryIds: [territoryId] });
  const s2 = await makeUser('specialist', { territoryIds: [territoryId] });
  s1Id = s1.id;
  s2Id = s2.id;
  const a1 = await makeAccount(territoryId, { name: 'Aldercreek Farms', specialistId: s1Id });
  const a2 = await makeAccount(territoryId, { name: 'Birchmoor Acres', specialistId: s2Id });
  a1Id = a1.id;
  a2Id = a2.id;
  const p1 = await planterFor(a1Id);
  const p2 = await planterFor(a2Id);
  // The manager sees only this territory, so other tests' items never mix in.
  meterCategory = 'seed-meter';
  downforceCategory = 'downforce';
  const meter = await makeComponent({ category: 'seed-meter', unit: 'row' });
  const downforce = await makeComponent({ category: 'downforce', unit: 'row' });

  // The worked example: seven items of one territory.
  const rows: [number, { accountId: number; planterId: number; componentId: number; category: string; season: number; stage: ForecastItemInput['stage']; partsUsd: number; labourUsd: number; labourHours: number; installWeek: string | null; specialistId: number | null; probabilityOverride: number | null }][] = [
    [1, { accountId: a1Id, planterId: p1.id, componentId: meter.id, category: meterCategory, season: 2027, stage: 'quoted', partsUsd: 1000, labourUsd: 200, labourHours: 1.6, installWeek: '2026-11-02', specialistId: s1Id, probabilityOverride: null }],
    [2, { accountId: a1Id, planterId: p1.id, componentId: downforce.id, category: downforceCategory, season: 2027, stage: 'accepted', partsUsd: 2000, labourUsd: 500, labourHours: 4, installWeek: '2027-01-04', specialistId: s1Id, probabilityOverride: null }],
    [3, { accountId: a2Id, planterId: p2.id, componentId: meter.id, category: meterCategory, season: 2027, stage: 'installed', partsUsd: 800, labourUsd: 100, labourHours: 0.8, installWeek: '2027-02-01', specialistId: s2Id, probabilityOverride: null }],
    [4, { accountId: a2Id, planterId: p2.id, componentId: downforce.id, category: downforceCategory, season: 2027, stage: 'declined', partsUsd: 5000, labourUsd: 0, labourHours: 0, installWeek: '2027-03-01', specialistId: s2Id, probabilityOverride: null }],
    [5, { accountId: a2Id, planterId: p2.id, componentId: meter.id, category: meterCategory, season: 2028, stage: 'idea', partsUsd: 400, labourUsd: 100, labourHours: 0.8, installWeek: null, specialistId: s2Id, probabilityOverride: null }],
    [6, { accountId: a1Id, planterId: p1.id, componentId: meter.id, category: meterCategory, season: 2027, stage: 'proposed', partsUsd: 300, labourUsd: 50, labourHours: 0.4, installWeek: '2027-04-05', specialistId: null, probabilityOverride: 0.4 }],
    [7, { accountId: a1Id, planterId: p1.id, componentId: downforce.id, category: downforceCategory, season: 2028, stage: 'ordered', partsUsd: 1500, labourUsd: 250, labourHours: 2, installWeek: '2027-12-06', specialistId: s1Id, probabilityOverride: null }],
  ];
  for (const [n, r] of rows) {
    const item = await RoadmapItem.create({
      accountId: r.accountId,
      planterId: r.planterId,
      componentId: r.componentId,
      season: r.season,
      quantity: 1,
      partsUsd: r.partsUsd,
      labourHours: r.labourHours,
      labourUsd: r.labourUsd,
      stage: r.stage,
      probabilityOverride: r.probabilityOverride,
      goalIds: [],
      explanation: null,
      specialistId: r.specialistId,
      installWeek: r.installWeek,
      stageChangedAt: null,
    });
    ids[n] = item.id;
    examples.push({ ...r, territoryId });
  }

  manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
  admin = await signedIn(t.app, await makeUser('admin'));
  specialist1 = await signedIn(t.app, s1);
  otherManager = await signedIn(t.app, await makeUser('manager', { territoryIds: [otherTerritoryId] }));
  grower = await signedIn(t.app, await makeUser('grower', { accountId: a1Id }));
});
afterAll(async () => t.close());

const byKey = (rows: Row[]) => Object.fromEntries(rows.map((r) => [r.key, r]));

describe('forecast: worked example', () => {
  it('when a manager groups by season, then each season equals the hand arithmetic', async () => {
    const res = await manager.get('/api/forecast?groupBy=season');
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    // 2027: items 1, 2, 3, 4, 6
    //   pipeline = 1200 + 2500 + 900 + 0 (declined) + 350 = 4950
    //   weighted = 1200×0.5 + 2500×0.9 + 900×1 + 5000×0 + 350×0.4 (override) = 600 + 2250 + 900 + 0 + 140 = 3890
    //   actual   = 900 (item 3, installed)
    // 2028: items 5, 7
    //   pipeline = 500 + 1750 = 2250; weighted = 500×0.1 + 1750×0.95 = 50 + 1662.5 = 1712.5; actual 0
    expect(res.body.rows).toEqual([
      { key: '2027', label: '2027 season', pipelineUsd: 4950, weightedUsd: 3890, actualUsd: 900, itemCount: 5 },
      { key: '2028', label: '2028 season', pipelineUsd: 2250, weightedUsd: 1712.5, actualUsd: 0, itemCount: 2 },
    ]);
    // totals: 4950 + 2250 = 7200; 3890 + 1712.5 = 5602.5; 900; 7 items
    expect(res.body.totals).toEqual({ pipelineUsd: 7200, weightedUsd: 5602.5, actualUsd: 900, itemCount: 7 });
  });

  it('when a manager groups by category, then the largest weighted category comes first and the sums match', async () => {
    const res = await manager.get('/api/forecast?groupBy=category');
    // downforce: items 2, 4, 7 → pipeline 2500 + 0 + 1750 = 4250; weighted 2250 + 0 + 1662.5 = 3912.5
    // seed meter: items 1, 3, 5, 6 → pipeline 1200 + 900 + 500 + 350 = 2950; weighted 600 + 900 + 50 + 140 = 1690; actual 900
    expect(res.body.rows.map((r: Row) => r.key)).toEqual([downforceCategory, meterCategory]);
    expect(byKey(res.body.rows)[downforceCategory]).toMatchObject({ pipelineUsd: 4250, weightedUsd: 3912.5, actualUsd: 0, itemCount: 3 });
    expect(byKey(res.body.rows)[meterCategory]).toMatchObject({ pipelineUsd: 2950, weightedUsd: 1690, actualUsd: 900, itemCount: 4 });
  });

  it('when a manager groups by month, then an item without an install week counts in April of its season', async () => {
    const res = await manager.get('/api/forecast?groupBy=month');
    const rows = byKey(res.body.rows);
    expect(res.body.rows.map((r: Row) => r.key)).toEqual(['2026-11', '2027-01', '2027-02', '2027-03', '2027-04', '2027-12', '2028-04']);
    expect(rows['2026-11']).toMatchObject({ label: 'Nov 2026', pipelineUsd: 1200, weightedUsd: 600 }); // item 1: 1200 × 0.5
    expect(rows['2027-03']).toMatchObject({ pipelineUsd: 0, weightedUsd: 0, itemCount: 1 }); // item 4, declined
    expect(rows['2027-12']).toMatchObject({ pipelineUsd: 1750, weightedUsd: 1662.5 }); // item 7 (season 2028, installed Dec 2027): 1750 × 0.95
    expect(rows['2028-04']).toMatchObject({ pipelineUsd: 500, weightedUsd: 50, itemCount: 1 }); // item 5: no week → April 2028; 500 × 0.1
  });

  it('when a month range is given, then only the items whose month lies inside count', async () => {
    const res = await manager.get('/api/forecast?groupBy=season&from=2027-01&to=2027-04');
    // items 2, 3, 4, 6 (Jan, Feb, Mar, Apr 2027): pipeline 2500 + 900 + 0 + 350 = 3750; weighted 2250 + 900 + 0 + 140 = 3290
    expect(res.body.rows).toEqual([{ key: '2027', label: '2027 season', pipelineUsd: 3750, weightedUsd: 3290, actualUsd: 900, itemCount: 4 }]);
    // April 2028 alone: only item 5, which has no install week
    const april = await manager.get('/api/forecast?groupBy=month&from=2028-04&to=2028-04');
    expect(april.body.totals).toEqual({ pipelineUsd: 500, weightedUsd: 50, actualUsd: 0, itemCount: 1 });
  });

  it('when a manager groups by quarter, specialist, account and stage, then each equals the hand arithmetic', async () => {
    const quarter = byKey((await manager.get('/api/forecast?groupBy=quarter')).body.rows);
    // 2027-Q1: items 2, 3, 4 → pipeline 2500 + 900 + 0 = 3400; weighted 2250 + 900 + 0 = 3150; actual 900
    expect(quarter['2027-Q1']).toEqual({ key: '2027-Q1', label: 'Q1 2027', pipelineUsd: 3400, weightedUsd: 3150, actualUsd: 900, itemCount: 3 });
    expect(quarter['2026-Q4']).toMatchObject({ pipelineUsd: 1200, weightedUsd: 600 });
    expect(quarter['2028-Q2']).toMatchObject({ pipelineUsd: 500, weightedUsd: 50 }); // item 5, April rule

    const specialist = byKey((await manager.get('/api/forecast?groupBy=specialist')).body.rows);
    // specialist 1: items 1, 2, 7 → 1200 + 2500 + 1750 = 5450; 600 + 2250 + 1662.5 = 4512.5
    expect(specialist[String(s1Id)]).toMatchObject({ pipelineUsd: 5450, weightedUsd: 4512.5, actualUsd: 0, itemCount: 3 });
    // specialist 2: items 3, 4, 5 → 900 + 0 + 500 = 1400; 900 + 0 + 50 = 950; actual 900
    expect(specialist[String(s2Id)]).toMatchObject({ pipelineUsd: 1400, weightedUsd: 950, actualUsd: 900, itemCount: 3 });
    // item 6 has no specialist: 350 × 0.4 = 140
    expect(specialist.none).toMatchObject({ label: 'No specialist', pipelineUsd: 350, weightedUsd: 140, itemCount: 1 });

    const account = (await manager.get('/api/forecast?groupBy=account')).body.rows;
    // account 1: items 1, 2, 6, 7 → 1200 + 2500 + 350 + 1750 = 5800; 600 + 2250 + 140 + 1662.5 = 4652.5
    // account 2: items 3, 4, 5 → 1400; 950 — so account 1 (larger weighted) comes first
    expect(account).toEqual([
      { key: String(a1Id), label: 'Aldercreek Farms', pipelineUsd: 5800, weightedUsd: 4652.5, actualUsd: 0, itemCount: 4 },
      { key: String(a2Id), label: 'Birchmoor Acres', pipelineUsd: 1400, weightedUsd: 950, actualUsd: 900, itemCount: 3 },
    ]);

    const stage = (await manager.get('/api/forecast?groupBy=stage')).body.rows;
    expect(stage.map((r: Row) => r.key)).toEqual(['idea', 'proposed', 'quoted', 'accepted', 'ordered', 'installed', 'declined']);
    expect(byKey(stage).declined).toMatchObject({ pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 1 });
  });

  it('when the plain-JavaScript reference runs over the same items, then it gives the same hand-computed figures', () => {
    const ref = forecastReference(examples, 'season', SETTING_DEFAULTS.stageProbabilities);
    expect(ref.rows).toEqual([
      { key: '2027', pipelineUsd: 4950, weightedUsd: 3890, actualUsd: 900, itemCount: 5 },
      { key: '2028', pipelineUsd: 2250, weightedUsd: 1712.5, actualUsd: 0, itemCount: 2 },
    ]);
    expect(ref.totals).toEqual({ pipelineUsd: 7200, weightedUsd: 5602.5, actualUsd: 900, itemCount: 7 });
  });

  it('when the settings change a stage probability, then the weighted figure follows', async () => {
    try {
      await Setting.upsert({ key: 'stageProbabilities', value: { ...SETTING_DEFAULTS.stageProbabilities, quoted: 0.6 } });
      const res = await manager.get('/api/forecast?groupBy=season&season=2027');
      // item 1 is quoted: 1200 × 0.6 = 720 instead of 600 → 3890 − 600 + 720 = 4010
      expect(res.body.totals.weightedUsd).toBe(4010);
    } finally {
      await Setting.upsert({ key: 'stageProbabilities', value: SETTING_DEFAULTS.stageProbabilities });
    }
  });
});

describe('forecast: cached aggregates stay fresh', () => {
  it('when items change, are added or are removed after a forecast was read, then the next read shows it', async () => {
    // Let the last write settle (the cache keeps results only once the latest change is over 2 s old).
    await new Promise((r) => setTimeout(r, 2600));
    const before = (await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals;
    expect((await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals).toEqual(before); // served from the cache
    // 2028 had items 5 (idea, 500) and 7 (ordered, 1750): pipeline 2250, weighted 1712.5
    expect(before).toEqual({ pipelineUsd: 2250, weightedUsd: 1712.5, actualUsd: 0, itemCount: 2 });
    const idea = await RoadmapItem.findByPk(ids[5]);
    try {
      await idea!.update({ stage: 'quoted' }); // 500 × 0.5 = 250 instead of 50 → 1912.5
      expect((await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals.weightedUsd).toBe(1912.5);
      const extra = await RoadmapItem.create({ ...idea!.get({ plain: true }), id: undefined, version: undefined, stage: 'installed', partsUsd: 100, labourUsd: 0 } as never);
      // + 100 installed: pipeline 2350, weighted 2012.5, actual 100
      expect((await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals).toEqual({ pipelineUsd: 2350, weightedUsd: 2012.5, actualUsd: 100, itemCount: 3 });
      await extra.destroy();
      expect((await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals.itemCount).toBe(2);
    } finally {
      await idea!.update({ stage: 'idea' });
    }
    expect((await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals).toEqual(before);
  });
});

describe('forecast: a change made by another instance', () => {
  it('when an item changes without passing through this instance (plain SQL, as another instance would), then the figures show it within half a second', async () => {
    await new Promise((r) => setTimeout(r, 2600));
    const read = async () => (await manager.get('/api/forecast?groupBy=season&season=2028')).body.totals;
    expect(await read()).toEqual({ pipelineUsd: 2250, weightedUsd: 1712.5, actualUsd: 0, itemCount: 2 });
    expect((await read()).weightedUsd).toBe(1712.5); // cached, with its table stamp remembered for a moment
    const raw = (stage: string) => t.sequelize.query('UPDATE roadmap_items SET stage = ?, updated_at = NOW() + INTERVAL 1 SECOND WHERE id = ?', { replacements: [stage, ids[5]] });
    try {
      await raw('quoted'); // item 5: 500 × 0.5 = 250 instead of 50 → 1912.5
      await new Promise((r) => setTimeout(r, 400));
      expect((await read()).weightedUsd).toBe(1912.5);
    } finally {
      await raw('idea');
    }
    await new Promise((r) => setTimeout(r, 400));
    expect((await read()).weightedUsd).toBe(1712.5);
  });
});

describe('forecast: drill-down and CSV', () => {
  it('when a manager drills into a category bar, then the items behind it come a page at a time, largest weighted first', async () => {
    const first = await manager.get(`/api/forecast/items?groupBy=category&key=${downforceCategory}&pageSize=2`);
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.total).toBe(3);
    // weighted: item 2 = 2250, item 7 = 1662.5, item 4 = 0
    expect(first.body.items.map((i: { id: number }) => i.id)).toEqual([ids[2], ids[7]]);
    expect(first.body.items[0]).toMatchObject({
      accountId: a1Id,
      accountName: 'Aldercreek Farms',
      territoryId,
      category: downforceCategory,
      season: 2027,
      month: '2027-01',
      installWeek: '2027-01-04',
      stage: 'accepted',
      probability: 0.9,
      partsUsd: 2000,
      labourUsd: 500,
      labourHours: 4,
      totalUsd: 2500,
      weightedUsd: 2250,
      specialistId: s1Id,
      locked: false,
    });
    const second = await manager.get(`/api/forecast/items?groupBy=category&key=${downforceCategory}&pageSize=2&page=2`);
    expect(second.body.items.map((i: { id: number }) => i.id)).toEqual([ids[4]]);
  });

  it('when a manager drills into a month, a quarter or the unassigned specialist, then the right items come back', async () => {
    const april = await manager.get('/api/forecast/items?groupBy=month&key=2028-04');
    expect(april.body.items.map((i: { id: number }) => i.id)).toEqual([ids[5]]);
    expect(april.body.items[0]).toMatchObject({ installWeek: null, month: '2028-04' });
    const q1 = await manager.get('/api/forecast/items?groupBy=quarter&key=2027-Q1&sort=month');
    expect(q1.body.items.map((i: { id: number }) => i.id)).toEqual([ids[2], ids[3], ids[4]]);
    const none = await manager.get('/api/forecast/items?groupBy=specialist&key=none');
    expect(none.body.items.map((i: { id: number }) => i.id)).toEqual([ids[6]]);
    expect(none.body.items[0].probability).toBe(0.4);
  });

  it('when a manager sorts the drill-down by each column and pages through it two at a time, then the pages join into one list in that order', async () => {
    type Item = { id: number; weightedUsd: number; totalUsd: number; month: string; accountName: string; stage: string; labourHours: number };
    const stageRank = (st: string) => ['idea', 'proposed', 'quoted', 'accepted', 'ordered', 'installed', 'declined'].indexOf(st);
    const keyOf: Record<string, (i: Item) => number | string> = {
      '-weightedUsd': (i) => -i.weightedUsd,
      weightedUsd: (i) => i.weightedUsd,
      '-totalUsd': (i) => -i.totalUsd,
      totalUsd: (i) => i.totalUsd,
      month: (i) => i.month,
      '-month': (i) => i.month,
      account: (i) => i.accountName.toLowerCase(),
      stage: (i) => stageRank(i.stage),
      '-labourHours': (i) => -i.labourHours,
      labourHours: (i) => i.labourHours,
    };
    for (const [sort, key] of Object.entries(keyOf)) {
      const all = (await manager.get(`/api/forecast/items?pageSize=200&sort=${sort}`)).body as { items: Item[]; total: number };
      expect(all.items.length, sort).toBe(all.total);
      const keys = all.items.map(key);
      const descending = sort === '-month';
      for (let k = 1; k < keys.length; k++) expect(descending ? keys[k - 1] >= keys[k] : keys[k - 1] <= keys[k], `${sort} at ${k}`).toBe(true);
      const paged: number[] = [];
      for (let page = 1; paged.length < all.total; page++) paged.push(...(await manager.get(`/api/forecast/items?pageSize=2&page=${page}&sort=${sort}`)).body.items.map((i: Item) => i.id));
      expect(paged, sort).toEqual(all.items.map((i) => i.id));
    }
  });

  it('when a manager exports CSV, then the grouped rows and a total line arrive as a spreadsheet file', async () => {
    const res = await manager.get('/api/forecast/export.csv?groupBy=category');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment; filename="forecast-category\.csv"/);
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toBe('category,label,pipeline_usd,weighted_usd,actual_usd,item_count');
    expect(lines[1]).toBe('downforce,Downforce,4250.00,3912.50,0.00,3');
    expect(lines[2]).toBe('seed-meter,Seed meter,2950.00,1690.00,900.00,4');
    expect(lines[lines.length - 1]).toBe('total,Total,7200.00,5602.50,900.00,7');
    const items = await manager.get(`/api/forecast/export.csv?groupBy=account&key=${a2Id}`);
    const itemLines = items.text.trim().split('\r\n');
    expect(itemLines).toHaveLength(4); // header + items 3, 4, 5
    expect(itemLines[0].split(',')[0]).toBe('item_id');
    expect(itemLines.slice(1).every((l) => l.includes('Birchmoor Acres'))).toBe(true);
  });
});

describe('forecast: who sees what', () => {
  it('when a manager of another territory asks, then none of these items are in the figures', async () => {
    const res = await otherManager.get('/api/forecast?groupBy=season');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ groupBy: 'season', rows: [], totals: { pipelineUsd: 0, weightedUsd: 0, actualUsd: 0, itemCount: 0 } });
    const items = await otherManager.get(`/api/forecast/items?groupBy=account&key=${a1Id}`);
    expect(items.body.total).toBe(0);
  });

  it('when a manager asks for a territory that is not theirs, then 403', async () => {
    const res = await otherManager.get(`/api/forecast?groupBy=season&territoryId=${territoryId}`);
    expect(res.status).toBe(403);
    expect((await otherManager.get(`/api/forecast/items?territoryId=${territoryId}`)).status).toBe(403);
  });

  it('when a specialist asks, then only their own items count, whatever the grouping', async () => {
    const res = await specialist1.get('/api/forecast?groupBy=season');
    // items 1, 2, 7: 2027 → 1200 + 2500 = 3700, 600 + 2250 = 2850; 2028 → 1750, 1662.5
    expect(res.body.rows).toEqual([
      { key: '2027', label: '2027 season', pipelineUsd: 3700, weightedUsd: 2850, actualUsd: 0, itemCount: 2 },
      { key: '2028', label: '2028 season', pipelineUsd: 1750, weightedUsd: 1662.5, actualUsd: 0, itemCount: 1 },
    ]);
    const bySpecialist = await specialist1.get('/api/forecast?groupBy=specialist');
    expect(bySpecialist.body.rows.map((r: Row) => r.key)).toEqual([String(s1Id)]);
    // drilling into a colleague's bar shows nothing of theirs
    const colleague = await specialist1.get(`/api/forecast/items?groupBy=specialist&key=${s2Id}`);
    expect(colleague.body.total).toBe(0);
  });

  it("when a specialist asks for a colleague's figures, then 403", async () => {
    expect((await specialist1.get(`/api/forecast?specialistId=${s2Id}`)).status).toBe(403);
    expect((await specialist1.get(`/api/forecast?specialistId=${s1Id}`)).status).toBe(200);
  });

  it('when an admin filters by territory and specialist, then the figures narrow to them', async () => {
    const res = await admin.get(`/api/forecast?groupBy=season&territoryId=${territoryId}&specialistId=${s2Id}`);
    // items 3, 4, 5: 2027 → 900 + 0 = 900 (weighted 900, actual 900); 2028 → 500 (weighted 50)
    expect(res.body.totals).toEqual({ pipelineUsd: 1400, weightedUsd: 950, actualUsd: 900, itemCount: 3 });
    const category = await admin.get(`/api/forecast?groupBy=season&territoryId=${territoryId}&category=${meterCategory}`);
    expect(category.body.totals).toEqual({ pipelineUsd: 2950, weightedUsd: 1690, actualUsd: 900, itemCount: 4 });
  });

  it('when a grower asks for any forecast figure, then 403; when nobody is signed in, then 401', async () => {
    for (const url of ['/api/forecast', '/api/forecast/items', '/api/forecast/export.csv']) {
      expect((await grower.get(url)).status, url).toBe(403);
    }
    const { client } = await import('../helpers/app.js');
    expect((await client(t.app).get('/api/forecast')).status).toBe(401);
  });
});

describe('forecast: bad input', () => {
  it('when groupBy is unknown, then 400 names the field', async () => {
    const res = await manager.get('/api/forecast?groupBy=planet');
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.groupBy).toMatch(/Group by one of season, month/);
  });

  it('when the month range is inverted or malformed, then 400 names the field', async () => {
    const inverted = await manager.get('/api/forecast?from=2027-05&to=2027-01');
    expect(inverted.status).toBe(400);
    expect(inverted.body.error.details.fields.to).toMatch(/not be before the first month/);
    const malformed = await manager.get('/api/forecast?from=2027-13&season=abc');
    expect(malformed.status).toBe(400);
    expect(Object.keys(malformed.body.error.details.fields).sort()).toEqual(['from', 'season']);
    const items = await manager.get('/api/forecast/items?from=2028-01&to=2027-12');
    expect(items.body.error.details.fields.to).toBeTruthy();
  });

  it('when a drill-down key does not fit its grouping, then 400 on the key', async () => {
    const res = await manager.get('/api/forecast/items?groupBy=month&key=2027');
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.key).toMatch(/a month such as 2027-03/);
    expect((await manager.get('/api/forecast/items?groupBy=stage&key=maybe')).status).toBe(400);
    expect((await manager.get('/api/forecast/items?pageSize=500')).body.error.details.fields.pageSize).toBeTruthy();
  });
});
