// Property: on random roadmap items stored in MariaDB, the forecast's SQL aggregates equal the
// plain-JavaScript reference (shared/calc/forecast-reference.ts) within a cent, for every grouping
// and random filters.
import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Planter, RoadmapItem, Setting } from '../../server/db/models/index.js';
import { forecastReference, type ForecastFilters, type ForecastItemInput, type StageProbabilities } from '../../shared/calc/forecast-reference.js';
import { forecastGroupBys, forecastStages, type ForecastGroupBy } from '../../shared/schemas/forecast.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent } from '../helpers/fleet.js';

// Odd probabilities, so that a wrong stage mapping cannot pass by chance. A declined probability
// above zero in the settings must still count as zero.
const PROBABILITIES: StageProbabilities = { idea: 0.07, proposed: 0.23, quoted: 0.51, accepted: 0.88, ordered: 0.97, installed: 1, declined: 0 };
const STORED = { ...PROBABILITIES, declined: 0.3 };

let t: TestApp;
let manager: Awaited<ReturnType<typeof signedIn>>;
let previousSetting: unknown;
const territoryIds: number[] = [];
const accounts: { id: number; territoryId: number; planterId: number }[] = [];
const specialistIds: number[] = [];
const parts: { id: number; category: string }[] = [];

beforeAll(async () => {
  t = await testApp();
  previousSetting = (await Setting.findByPk('stageProbabilities'))?.value;
  await Setting.upsert({ key: 'stageProbabilities', value: STORED });
  for (let i = 0; i < 2; i++) territoryIds.push((await makeTerritory()).id);
  for (let i = 0; i < 2; i++) specialistIds.push((await makeUser('specialist', { territoryIds })).id);
  for (let i = 0; i < 3; i++) {
    const territoryId = territoryIds[i % 2];
    const account = await makeAccount(territoryId);
    const planter = await Planter.create({
      accountId: account.id,
      tractorId: null,
      farmSiteId: null,
      name: 'Test planter',
      maker: null,
      modelYear: null,
      rows: 8,
      rowSpacingIn: 30,
      frameType: 'rigid',
      foldType: 'none',
      seedSupplyType: 'row-hoppers',
      seedCapacityUnits: null,
      liquidTankCount: 0,
      liquidTankGallons: 0,
      dryCapacityLb: 0,
      markers: false,
      acresPerYear: null,
    });
    accounts.push({ id: account.id, territoryId, planterId: planter.id });
  }
  // The manager below sees only these two territories, so other tests' items never mix in.
  for (const category of ['seed-meter', 'row-cleaner', 'in-furrow-liquid'] as const) {
    parts.push({ id: (await makeComponent({ category })).id, category });
  }
  manager = await signedIn(t.app, await makeUser('manager', { territoryIds }));
});

afterAll(async () => {
  await RoadmapItem.destroy({ where: { accountId: accounts.map((a) => a.id) } });
  if (previousSetting === undefined) await Setting.destroy({ where: { key: 'stageProbabilities' } });
  else await Setting.upsert({ key: 'stageProbabilities', value: previousSetting });
  await t.close();
});

const pad = (n: number) => String(n).padStart(2, '0');
const money = fc.integer({ min: 0, max: 5_000_000 }).map((c) => c / 100); // up to $50,000.00 in cents

const itemArb = fc.record({
  account: fc.nat({ max: 2 }),
  part: fc.nat({ max: 2 }),
  season: fc.integer({ min: 2026, max: 2029 }),
  stage: fc.constantFrom(...forecastStages),
  partsUsd: money,
  labourUsd: money,
  override: fc.option(fc.integer({ min: 0, max: 1000 }).map((p) => p / 1000), { freq: 4 }),
  specialist: fc.option(fc.nat({ max: 1 }), { freq: 4 }),
  // install week: none, or a day from November before the season to April of it
  week: fc.option(
    fc.record({ monthIndex: fc.nat({ max: 5 }), day: fc.integer({ min: 1, max: 28 }) }),
    { freq: 5 },
  ),
});

const monthArb = fc.record({ year: fc.integer({ min: 2025, max: 2029 }), month: fc.integer({ min: 1, max: 12 }) }).map(({ year, month }) => `${year}-${pad(month)}`);

const filtersArb = fc.record({
  range: fc.option(fc.tuple(fc.option(monthArb), fc.option(monthArb)), { freq: 2 }),
  season: fc.option(fc.integer({ min: 2026, max: 2029 }), { freq: 3 }),
  territory: fc.option(fc.nat({ max: 1 }), { freq: 3 }),
  specialist: fc.option(fc.nat({ max: 1 }), { freq: 3 }),
  part: fc.option(fc.nat({ max: 2 }), { freq: 3 }),
});

function installWeek(season: number, week: { monthIndex: number; day: number } | null): string | null {
  if (!week) return null;
  const [year, month] = week.monthIndex < 2 ? [season - 1, 11 + week.monthIndex] : [season, week.monthIndex - 1];
  return `${year}-${pad(month)}-${pad(week.day)}`;
}

describe('forecast: SQL against the reference', () => {
  it('when random items are stored, then every grouping and filter gives the reference figures within a cent', async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.array(itemArb, { minLength: 0, maxLength: 30 }),
        fc.constantFrom<ForecastGroupBy>(...forecastGroupBys),
        filtersArb,
        async (generated, groupBy, f) => {
          await RoadmapItem.destroy({ where: { accountId: accounts.map((a) => a.id) } });
          const items: ForecastItemInput[] = generated.map((g) => {
            const account = accounts[g.account];
            return {
              season: g.season,
              installWeek: installWeek(g.season, g.week),
              stage: g.stage,
              partsUsd: g.partsUsd,
              labourUsd: g.labourUsd,
              probabilityOverride: g.override,
              accountId: account.id,
              territoryId: account.territoryId,
              specialistId: g.specialist === null ? null : specialistIds[g.specialist],
              category: parts[g.part].category,
            };
          });
          await RoadmapItem.bulkCreate(
            generated.map((g, i) => ({
              accountId: items[i].accountId,
              planterId: accounts[g.account].planterId,
              componentId: parts[g.part].id,
              season: g.season,
              quantity: 1,
              partsUsd: g.partsUsd,
              labourHours: 1,
              labourUsd: g.labourUsd,
              stage: g.stage,
              probabilityOverride: g.override,
              goalIds: [],
              explanation: null,
              specialistId: items[i].specialistId,
              installWeek: items[i].installWeek,
              stageChangedAt: null,
            })),
          );

          let [from, to] = f.range ?? [null, null];
          if (from && to && from > to) [from, to] = [to, from];
          const query = new URLSearchParams({ groupBy });
          const filters: ForecastFilters = { territoryIds };
          const set = (name: string, value: string | number) => query.set(name, String(value));
          if (from) {
            set('from', from);
            filters.fromMonth = from;
          }
          if (to) {
            set('to', to);
            filters.toMonth = to;
          }
          if (f.season !== null) {
            set('season', f.season);
            filters.season = f.season;
          }
          if (f.territory !== null) {
            set('territoryId', territoryIds[f.territory]);
            filters.territoryIds = [territoryIds[f.territory]];
          }
          if (f.specialist !== null) {
            set('specialistId', specialistIds[f.specialist]);
            filters.specialistId = specialistIds[f.specialist];
          }
          if (f.part !== null) {
            set('category', parts[f.part].category);
            filters.category = parts[f.part].category;
          }

          const res = await manager.get(`/api/forecast?${query}`);
          expect(res.status, JSON.stringify(res.body)).toBe(200);
          const expected = forecastReference(items, groupBy, PROBABILITIES, filters);

          const got = new Map<string, { pipelineUsd: number; weightedUsd: number; actualUsd: number; itemCount: number }>(res.body.rows.map((r: { key: string }) => [r.key, r]));
          expect([...got.keys()].sort()).toEqual(expected.rows.map((r) => r.key).sort());
          for (const want of [...expected.rows, { key: 'totals', ...expected.totals }]) {
            const have = want.key === 'totals' ? res.body.totals : got.get(want.key)!;
            expect(have.itemCount, `${groupBy} ${want.key}`).toBe(want.itemCount);
            for (const field of ['pipelineUsd', 'weightedUsd', 'actualUsd'] as const) {
              expect(Math.abs(have[field] - want[field]), `${groupBy} ${want.key} ${field}: ${have[field]} vs ${want[field]}`).toBeLessThanOrEqual(0.010001);
            }
          }
        },
      ),
      { numRuns: 60 },
    );
  });
});
