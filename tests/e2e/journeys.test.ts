// The four user stories of issue #9 as complete journeys through the real UI, in Chromium, on the
// demo dealership that `npm start` seeds into a fresh data directory. Each step asserts what the
// user sees (headings, labels, roles, words and figures), checks the figures against the API
// where the screen shows the server's numbers, and saves a picture:
// test-results/screenshots/journey-<story>-<step>.png.
//  1. week-plan: the specialist finds a farm with an open request on the map, plans next week's
//     visits into day routes, reads the ordered stops and drives, saves, and finds them on the
//     calendar and back on the map.
//  2. roadmap: the specialist records a grower's goals and season budgets on an account that has
//     none, plans the roadmap, moves an item to another season and finds it there after a reload.
//  3. forecast: the manager regroups the forecast, drills into a row, sees a shop week over
//     capacity and exports the CSV.
//  4. booking: the admin runs the early-order reminder, the demo grower's message arrives at the
//     local SMTP stand-in, its booking link (opened signed out) books a check-up, and the
//     specialist and the grower find the request in the app.
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3640', dbPort: '3641', smtpPort: true });
const SPECIALIST = 'specialist@rowpath.test';
const MANAGER = 'manager@rowpath.test';
const ADMIN = 'admin@rowpath.test';
const GROWER = 'grower@rowpath.test';
const EARLY_ORDER = 'Early-order reminder — 2027 season';
const VIEWPORT = { width: 1280, height: 900 };

const app = useDemoApp(env);
const { apiAs } = app;

// The page a failing step leaves behind is saved too (journey-failed-<step>.png), to see why.
let lastPage: Page | null = null;
beforeEach(({ task, onTestFailed }) => {
  onTestFailed(async () => {
    if (!lastPage || lastPage.isClosed()) return;
    const name = task.name.replace(/^when /, '').slice(0, 48).replace(/[^a-z0-9]+/gi, '-');
    await lastPage.screenshot({ path: path.join(SCREENSHOT_DIR, `journey-failed-${name}.png`) }).catch(() => undefined);
  });
});

const shot = (page: Page, story: string, step: string, fullPage = false) => page.screenshot({ path: path.join(SCREENSHOT_DIR, `journey-${story}-${step}.png`), fullPage });
const escapeRe = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** A fresh browser context, signed in through the sign-in page as a person would (null: signed out). */
async function openAs(email: string | null, viewport = VIEWPORT): Promise<Page> {
  const context = await app.browser.newContext({ viewport, acceptDownloads: true, timezoneId: 'America/Chicago' });
  const page = await context.newPage();
  lastPage = page;
  if (email) {
    await page.goto(`${app.server.url}/sign-in`);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password').fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
  }
  return page;
}

const nav = (page: Page, label: string) => page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: label, exact: true }).click();

/** Polls until `check` gives a value, or fails after `ms` naming `what`. */
async function waitFor<T>(what: string, check: () => Promise<T | null | undefined | false>, ms = 60_000, everyMs = 1000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await check();
    if (value) return value;
    if (Date.now() > until) throw new Error(`Timed out after ${ms} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

// The dealership's calendar (America/Chicago), worked out here the way the app does.
function chicagoToday(): string {
  const parts = Object.fromEntries(new Intl.DateTimeFormat('en-US', { timeZone: 'America/Chicago', year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(new Date()).map((p) => [p.type, p.value]));
  return `${parts.year}-${parts.month}-${parts.day}`;
}
function addDays(iso: string, days: number): string {
  const d = new Date(`${iso}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}
const weekdayOf = (iso: string) => new Date(`${iso}T12:00:00Z`).getUTCDay();
const today = chicagoToday();
const nextMonday = addDays(addDays(today, -((weekdayOf(today) + 6) % 7)), 7);
/** "123 km" / "8.5 km", as the week plan prints a distance. */
const kmText = (km: number) => (km >= 10 ? `${Math.round(km).toLocaleString('en-US')} km` : `${(Math.round(km * 10) / 10).toLocaleString('en-US')} km`);

interface RouteDay {
  date: string;
  distanceKm: number;
  stops: { visitId: number; accountName: string }[];
}

// ---------------------------------------------------------------------------------------------
describe('story 1: the specialist plans the week’s farm visits on the map', () => {
  let page: Page;
  let farm = '';
  let savedCount = 0;

  beforeAll(async () => {
    page = await openAs(SPECIALIST, { width: 1280, height: 1000 });
  });
  afterAll(async () => {
    await page?.context().close();
  });

  it('when the specialist shows only open requests on the map and selects a farm, then its summary shows the open request', async () => {
    await nav(page, 'Map');
    await page.getByRole('heading', { level: 1, name: 'Territory map' }).waitFor();
    await page.locator('.rp-marker, .rp-cluster').first().waitFor();
    const status = page.getByRole('status').filter({ hasText: /^Showing / });
    const totals = async () => (await status.innerText()).match(/Showing ([\d,]+) of ([\d,]+)/)!.slice(1).map((n) => Number(n.replace(/,/g, '')));
    const [, all] = await totals();
    expect(all, 'the specialist’s territory has accounts on the map').toBeGreaterThan(5);

    // Only the farms whose growers asked for a visit.
    for (const other of [/^Overdue/, /^Due soon/, /^Visited recently/]) await page.getByRole('checkbox', { name: other }).uncheck();
    await expect.poll(async () => (await totals())[0]).toBeLessThan(all);
    const [requests] = await totals();
    expect(requests).toBeGreaterThan(0);
    await page.waitForTimeout(400);

    // Zoomed out, nearby farms share a group marker: opening a group zooms in on it.
    if ((await page.locator('.leaflet-marker-icon:has(.rp-marker)').count()) === 0) {
      await page.locator('.leaflet-marker-icon:has(.rp-cluster)').first().click();
      await page.waitForTimeout(600);
    }
    const marker = page.locator('.leaflet-marker-icon:has(.rp-marker)').first();
    const spoken = await marker.locator('.rp-sr-only').innerText();
    expect(spoken).toMatch(/: open request/);
    farm = spoken.split(':')[0];
    await marker.click();

    const card = page.getByRole('region', { name: farm });
    await card.getByRole('heading', { name: farm }).waitFor();
    // The state in a word beside its shape (the dt below says "Open requests").
    await card.getByText(/Open request$/).waitFor();
    const openRequests = Number(await card.getByRole('term').filter({ hasText: 'Open requests' }).locator('xpath=following-sibling::dd[1]').innerText());
    expect(openRequests).toBeGreaterThanOrEqual(1);
    await card.getByRole('link', { name: 'Open the account' }).waitFor();
    await shot(page, 'week-plan', '1-map');
  });

  it('when the specialist chooses that farm and the other requested visits for next week and plans, then day routes come back with ordered stops and drive figures', async () => {
    await nav(page, 'Week plan');
    await page.getByRole('heading', { level: 1, name: 'Week plan' }).waitFor();
    await expect(page.getByLabel('Week starting').inputValue()).resolves.toBe(nextMonday);
    const requested = page.getByRole('group', { name: 'Requested' });
    await requested.getByRole('checkbox').first().waitFor();

    // The farm from the map is waiting among the requests; it goes in first, then the rest.
    const fromMap = requested.getByRole('checkbox', { name: new RegExp(`^${escapeRe(farm)} · `) }).first();
    await fromMap.check();
    await page.getByRole('status').filter({ hasText: /^1 chosen/ }).waitFor();
    const boxes = requested.getByRole('checkbox');
    const count = await boxes.count();
    for (let k = 0; k < count; k++) await boxes.nth(k).check();
    await page.getByRole('status').filter({ hasText: new RegExp(`^${count} chosen`) }).waitFor();
    await shot(page, 'week-plan', '2-chosen');

    await page.getByRole('button', { name: 'Plan the week' }).click();
    await page.getByRole('heading', { name: /^Day routes for the week of / }).waitFor({ timeout: 30_000 });
    await expect(page.getByRole('progressbar').getAttribute('aria-valuenow')).resolves.toBe('100');

    // The week's totals: every chosen visit placed, a distance and a driving time.
    const totals = page.locator('dl[aria-label="Week totals"]');
    const figure = async (term: string) => (await totals.getByRole('term').filter({ hasText: term }).locator('xpath=following-sibling::dd[1]').innerText()).trim();
    expect(Number(await figure('Visits placed'))).toBeGreaterThanOrEqual(count);
    expect(await figure('Distance')).toMatch(/^\d[\d,.]* km$/);
    expect(await figure('Driving')).toMatch(/^\d+\.\d h$/);
    expect(await figure('Not placed')).toBe('0');

    // The farm's day: stops numbered 1, 2, 3… in order, each with the drive before it, then back to the dealership.
    const days = page.getByRole('list', { name: 'Days of the plan' });
    await expect(days.locator(':scope > li').count()).resolves.toBe(5);
    const day = days.locator(':scope > li').filter({ hasText: farm });
    await expect(day.count()).resolves.toBe(1);
    await expect(day.getByRole('heading').innerText()).resolves.toMatch(/\d+ stops? · \d[\d,.]* km · .* driving · out \d\d:\d\d–\d\d:\d\d/);
    const rows = await day.locator('tbody tr').evaluateAll((trs) => trs.map((tr) => Array.from(tr.querySelectorAll('td')).map((td) => (td.textContent ?? '').trim())));
    const stops = rows.slice(0, -1);
    expect(stops.map((r) => r[0])).toEqual(stops.map((_, k) => String(k + 1)));
    for (const r of stops) expect(r[2]).toMatch(/^\d[\d,.]* km, \d+ (min|h)/);
    expect(stops.some((r) => r[1].startsWith(farm))).toBe(true);
    expect(rows.at(-1)![1]).toMatch(/^Back to /);
    await page.locator('.rp-stop').first().waitFor();
    await page.getByRole('heading', { name: /^Day routes for the week of / }).evaluate((el) => el.scrollIntoView({ block: 'start' }));
    await page.waitForTimeout(300);
    await shot(page, 'week-plan', '3-routes');
    await shot(page, 'week-plan', '3-routes-full', true);
  }, 90_000);

  it('when the specialist saves the plan and opens the calendar for that week, then every saved visit is there with the day routes the server holds', async () => {
    await page.getByRole('button', { name: 'Save to calendar' }).click();
    const saved = page.getByRole('status').getByText(/Saved (\d+) visits to the calendar for the week of /);
    await saved.waitFor();
    savedCount = Number(/Saved (\d+)/.exec(await saved.innerText())![1]);
    expect(savedCount).toBeGreaterThan(0);
    await expect(page.getByRole('button', { name: 'Save to calendar' }).isDisabled()).resolves.toBe(true);

    await page.getByRole('link', { name: 'Open the calendar for that week' }).click();
    await page.getByRole('heading', { level: 1, name: 'Calendar' }).waitFor();
    const api = await apiAs(SPECIALIST);
    const current = (await api.get(`/api/week-plans/current?weekStart=${nextMonday}&days=5`)).body as { days: RouteDay[] };
    const planned = current.days.flatMap((d) => d.stops);
    expect(planned.length).toBeGreaterThanOrEqual(savedCount);

    // Each visit of the week is an event in the grid, named for its farm.
    const calendar = page.locator('.rbc-calendar');
    await calendar.getByText(farm, { exact: true }).first().waitFor();
    for (const name of new Set(planned.map((s) => s.accountName))) await expect(calendar.getByText(name, { exact: true }).count()).resolves.toBeGreaterThan(0);

    // Below the grid, each day's route with the server's stop count and distance.
    const routes = page.getByRole('region', { name: /^Routes for the week of / });
    for (const d of current.days.filter((x) => x.stops.length)) {
      const dayRoute = routes.locator(`[data-route-day="${d.date}"]`);
      await expect(dayRoute.getByRole('heading').innerText()).resolves.toContain(`${d.stops.length} ${d.stops.length === 1 ? 'stop' : 'stops'} · ${kmText(d.distanceKm)}`);
    }
    await routes.getByText(farm, { exact: true }).first().waitFor();
    await page.waitForLoadState('networkidle');
    await shot(page, 'week-plan', '4-calendar', true);
  }, 60_000);

  it('when the specialist goes back to the map and shows next week’s routes, then each planned day is listed beside the map', async () => {
    await nav(page, 'Map');
    await page.getByRole('heading', { level: 1, name: 'Territory map' }).waitFor();
    await page.getByRole('combobox', { name: 'Day routes' }).selectOption('next');
    const panel = page.getByRole('region', { name: 'Day routes' });
    const list = panel.getByRole('list', { name: 'Day routes' });
    await list.waitFor();
    const headings = await list.getByRole('heading').allInnerTexts();
    const stopCount = headings.reduce((n, h) => n + Number(/(\d+) stops?/.exec(h)?.[1] ?? 0), 0);
    expect(stopCount).toBeGreaterThanOrEqual(savedCount);
    await page.locator('.leaflet-overlay-pane path.leaflet-interactive').first().waitFor();
    await shot(page, 'week-plan', '5-map-routes');
  });
});

// ---------------------------------------------------------------------------------------------
interface RoadmapItemRow {
  id: number;
  partName: string;
  season: number;
  locked: boolean;
  stage: string;
  goalIds: number[];
}
interface RoadmapBody {
  firstSeason: number;
  goals: { id: number; label: string }[];
  planters: { id: number; name: string; rows: number }[];
  seasons: { season: number; budgetUsd: number | null; items: RoadmapItemRow[] }[];
  feasible: boolean;
}

describe('story 2: the specialist records a grower’s long-term goals and builds the roadmap', () => {
  let page: Page;
  let account: { id: number; name: string };
  const GOALS = [
    { kind: 'Starter in-furrow', words: 'Put starter in-furrow on the corn', season: '2028', priority: 'Normal', target: '5', notes: 'About 5 gal/ac of 6-24-6 on 1,200 ac of corn.' },
    { kind: 'Plant faster', words: 'Plant at 10 mph with the same planter', season: '2029', priority: 'High', target: '10', notes: 'Wants to cover the corn acres before the May rains.' },
  ];
  const BUDGETS: [number, number][] = [
    [2027, 15_000],
    [2028, 25_000],
    [2029, 45_000],
  ];
  let moved: { id: number; partName: string; from: number; to: number };

  beforeAll(async () => {
    // A demo account in the specialist's territory with a planter and no goals or roadmap yet.
    const api = await apiAs(SPECIALIST);
    const list = (await api.get('/api/accounts?pageSize=200')).body.items as { id: number; name: string; status: string }[];
    for (const a of list.filter((x) => x.status === 'active')) {
      const roadmap = (await api.get(`/api/accounts/${a.id}/roadmap`)).body as RoadmapBody;
      if (roadmap.goals.length === 0 && roadmap.planters.length > 0 && roadmap.seasons.every((s) => s.items.length === 0)) {
        account = { id: a.id, name: a.name };
        break;
      }
    }
    expect(account, 'an active demo account without goals').toBeDefined();
    page = await openAs(SPECIALIST, { width: 1280, height: 1300 });
  });
  afterAll(async () => {
    await page?.context().close();
  });

  it('when the specialist finds the account and opens its upgrade roadmap, then it says no goals are recorded yet', async () => {
    await nav(page, 'Accounts');
    await page.getByLabel('Search accounts').fill(account.name);
    await page.getByRole('link', { name: account.name, exact: true }).click();
    await page.getByRole('heading', { level: 1, name: account.name }).waitFor();
    await page.getByRole('link', { name: 'Upgrade roadmap' }).click();
    await page.getByRole('heading', { level: 1, name: `Upgrade roadmap · ${account.name}` }).waitFor();
    const goals = page.getByRole('region', { name: 'The grower’s goals' });
    await goals.getByText('No goals recorded yet. Add one to plan a roadmap.').waitFor();
    await shot(page, 'roadmap', '1-empty');
  });

  it('when the specialist records two goals and three season budgets, then each shows with its season, priority and target, and each budget is confirmed', async () => {
    const goals = page.getByRole('region', { name: 'The grower’s goals' });
    for (const g of GOALS) {
      await goals.getByRole('button', { name: 'Add a goal' }).click();
      const dialog = page.getByRole('dialog', { name: 'Add a goal' });
      await dialog.getByLabel('Kind of goal').selectOption({ label: g.kind });
      await dialog.getByLabel(/In the grower.s words/).fill(g.words);
      await dialog.getByLabel('Wanted by season').fill(g.season);
      await dialog.getByLabel('Priority').selectOption({ label: g.priority });
      // The account's first planter is offered first.
      await expect(dialog.getByLabel('Planter').locator('option:checked').innerText()).resolves.toMatch(/\(\d+ rows\)$/);
      await dialog.getByLabel('Target figure (optional)').fill(g.target);
      await dialog.getByLabel('Notes (optional)').fill(g.notes);
      if (g === GOALS[1]) await shot(page, 'roadmap', '2-goal-form');
      await dialog.getByRole('button', { name: 'Add the goal' }).click();
      await page.getByText(`Added the goal “${g.words}”. Plan again to fit the roadmap to it.`).waitFor();
      const row = goals.getByRole('listitem').filter({ hasText: g.words });
      await row.getByText(`By ${g.season}`).waitFor();
      await row.getByText(`${g.priority} priority`).waitFor();
      await row.getByText(`Target ${g.target}`).waitFor();
      await row.getByText(g.kind, { exact: true }).waitFor();
    }

    for (const [season, usd] of BUDGETS) {
      const input = page.getByLabel(`Budget for ${season}, US dollars`);
      await input.fill(String(usd));
      await page.locator('form', { has: input }).getByRole('button', { name: 'Save' }).click();
      await page.getByText(`The ${season} budget is now $${usd.toLocaleString('en-US')}. Plan again to fit the roadmap to it.`).waitFor();
    }
    const stored = (await (await apiAs(SPECIALIST)).get(`/api/accounts/${account.id}/roadmap`)).body as RoadmapBody;
    expect(stored.goals.map((g) => g.label).sort()).toEqual(GOALS.map((g) => g.words).sort());
    for (const [season, usd] of BUDGETS) expect(stored.seasons.find((s) => s.season === season)?.budgetUsd).toBe(usd);
    await goals.scrollIntoViewIfNeeded();
    await shot(page, 'roadmap', '3-goals-budgets');
  });

  it('when the specialist plans the roadmap, then items fill the seasons, each naming the goal it serves, and every goal shows when it is met', async () => {
    await page.getByRole('button', { name: 'Plan the roadmap' }).click();
    const dialog = page.getByRole('dialog', { name: 'Plan the roadmap again?' });
    await expect(dialog.getByLabel('Seasons to plan').inputValue()).resolves.toBe('5');
    await dialog.getByRole('button', { name: 'Plan again' }).click();
    const done = page.getByRole('status').getByText(/Planned again: (\d+) items over 5 seasons\./);
    await done.waitFor({ timeout: 30_000 });
    const itemCount = Number(/(\d+) items/.exec(await done.innerText())![1]);
    expect(itemCount).toBeGreaterThan(0);

    const board = page.getByRole('region', { name: 'Seasons of the roadmap' });
    // One column per season, each a region named by its year.
    await expect(board.getByRole('region').count()).resolves.toBe(5);
    await board.getByRole('region', { name: '2027', exact: true }).waitFor();
    await expect(board.getByRole('article').count()).resolves.toBe(itemCount);
    // Each card names the goals the server says it serves; the plan serves at least one of the new goals.
    const api = (await (await apiAs(SPECIALIST)).get(`/api/accounts/${account.id}/roadmap`)).body as RoadmapBody;
    const items = api.seasons.flatMap((s) => s.items);
    expect(items).toHaveLength(itemCount);
    expect(api.feasible).toBe(true);
    const labelOf = new Map(api.goals.map((g) => [g.id, g.label]));
    expect(items.some((i) => i.goalIds.length > 0)).toBe(true);
    // Cards are found by item id: two planters can carry the same part under the same name.
    for (const item of items) {
      const served = board.locator(`article[data-item-id="${item.id}"]`).getByRole('list', { name: 'Goals it serves' });
      if (item.goalIds.length === 0) await expect(served.count()).resolves.toBe(0);
      for (const id of item.goalIds) await served.getByText(labelOf.get(id)!).waitFor();
    }
    // Each goal says in words when the plan meets it.
    const goals = page.getByRole('region', { name: 'The grower’s goals' });
    for (const g of GOALS) await goals.getByRole('listitem').filter({ hasText: g.words }).getByText(/(Met in \d{4}|Late: met in \d{4}|Not met)$/).waitFor();
    await page.evaluate(() => window.scrollTo(0, 0));
    await shot(page, 'roadmap', '4-planned');
  }, 60_000);

  it('when the specialist moves an item to another season and confirms, then after a reload it is in that season', async () => {
    // The move to try: one the server's what-if says keeps the order working (a specialist reads the same verdict in the dialog).
    const api = await apiAs(SPECIALIST);
    const roadmap = (await api.get(`/api/accounts/${account.id}/roadmap`)).body as RoadmapBody;
    const seasons = roadmap.seasons.map((s) => s.season);
    const items = roadmap.seasons.flatMap((s) => s.items).filter((i) => !i.locked);
    search: for (const item of items) {
      for (const to of [...seasons.filter((s) => s > item.season), ...seasons.filter((s) => s < item.season).reverse()]) {
        const evaluation = (await api.post(`/api/accounts/${account.id}/roadmap/evaluate`, { moves: [{ itemId: item.id, season: to }] })).body as { feasible: boolean };
        if (evaluation.feasible) {
          moved = { id: item.id, partName: item.partName, from: item.season, to };
          break search;
        }
      }
    }
    expect(moved, 'a move that keeps the order working').toBeDefined();

    const card = page.locator(`article[data-item-id="${moved.id}"]`);
    await card.getByRole('heading', { name: new RegExp(`${escapeRe(moved.partName)}$`) }).waitFor();
    await card.getByRole('button', { name: 'Move to season…' }).click();
    const dialog = page.getByRole('dialog', { name: `Move ${moved.partName}` });
    await dialog.getByLabel('Move to season').selectOption(String(moved.to));
    await dialog.getByRole('button', { name: 'Check this move' }).click();
    const verdict = dialog.getByRole('alert');
    await expect(verdict.innerText()).resolves.toMatch(new RegExp(`^Moving ${escapeRe(moved.partName)} to ${moved.to} `));
    await expect(verdict.innerText()).resolves.not.toMatch(/breaks the order/);
    await dialog.getByText(`${moved.to} after the move`).waitFor();
    await shot(page, 'roadmap', '5-move-check');
    await dialog.getByRole('button', { name: `Move it to ${moved.to}` }).click();
    await page.getByText(`Moved ${moved.partName} from ${moved.from} to ${moved.to}.`).waitFor();

    // A reload reads the roadmap from the server again.
    await page.reload();
    await page.getByRole('heading', { level: 1, name: `Upgrade roadmap · ${account.name}` }).waitFor();
    const column = page.getByRole('region', { name: String(moved.to), exact: true });
    await column.locator(`article[data-item-id="${moved.id}"]`).waitFor();
    await expect(page.getByRole('region', { name: String(moved.from), exact: true }).locator(`article[data-item-id="${moved.id}"]`).count()).resolves.toBe(0);
    // The goals and budgets are still there too.
    const goals = page.getByRole('region', { name: 'The grower’s goals' });
    for (const g of GOALS) await goals.getByText(g.words).waitFor();
    for (const [season, usd] of BUDGETS) await expect(page.getByLabel(`Budget for ${season}, US dollars`).inputValue()).resolves.toBe(String(usd));
    await column.locator(`article[data-item-id="${moved.id}"]`).scrollIntoViewIfNeeded();
    await shot(page, 'roadmap', '6-after-reload');
    const after = (await api.get(`/api/accounts/${account.id}/roadmap`)).body as RoadmapBody;
    expect(after.seasons.flatMap((s) => s.items).find((i) => i.id === moved.id)?.season).toBe(moved.to);
  }, 90_000);
});

// ---------------------------------------------------------------------------------------------
interface ForecastRow {
  key: string;
  label: string;
  itemCount: number;
}

describe('story 3: the manager reviews the territory revenue forecast', () => {
  let page: Page;
  const rowsOf = async (query: string) => {
    const res = await (await apiAs(MANAGER)).get(`/api/forecast?${query}`);
    expect(res.status).toBe(200);
    return res.body.rows as ForecastRow[];
  };
  /** The group labels of the table the page shows for a grouping. */
  const tableLabels = (grouping: string) =>
    page
      .getByRole('table', { name: `Forecast by ${grouping}` })
      .locator('tbody')
      .getByRole('button')
      .evaluateAll((buttons) => buttons.map((b) => (b.firstChild?.textContent ?? '').trim()));

  beforeAll(async () => {
    page = await openAs(MANAGER, { width: 1280, height: 1000 });
  });
  afterAll(async () => {
    await page?.context().close();
  });

  it('when the manager opens the forecast, then the seasons show with the server’s figures', async () => {
    await nav(page, 'Forecast');
    await page.getByRole('heading', { level: 1, name: 'Forecast' }).waitFor();
    await expect(page.getByLabel('Group by').inputValue()).resolves.toBe('season');
    await page.getByRole('heading', { name: 'By season' }).waitFor();
    const seasons = await rowsOf('groupBy=season');
    expect(seasons.length).toBeGreaterThan(1);
    await expect.poll(() => tableLabels('season')).toEqual(seasons.map((r) => r.label));
    await page.getByRole('figure', { name: /^Forecast by season/ }).locator('.recharts-bar-rectangle').first().waitFor();
    await shot(page, 'forecast', '1-by-season');
  });

  it('when the manager groups by category and then by specialist, then the table and address follow each choice', async () => {
    await page.getByLabel('Group by').selectOption({ label: 'Category' });
    await expect.poll(() => new URL(page.url()).searchParams.get('groupBy')).toBe('category');
    await page.getByRole('heading', { name: 'By category' }).waitFor();
    const categories = await rowsOf('groupBy=category');
    await expect.poll(() => tableLabels('category')).toEqual(categories.map((r) => r.label));
    await shot(page, 'forecast', '2-by-category');

    await page.getByLabel('Group by').selectOption({ label: 'Specialist' });
    await expect.poll(() => new URL(page.url()).searchParams.get('groupBy')).toBe('specialist');
    await page.getByRole('heading', { name: 'By specialist' }).waitFor();
    const specialists = await rowsOf('groupBy=specialist');
    await expect.poll(() => tableLabels('specialist')).toEqual(specialists.map((r) => r.label));
    // The manager covers both demo territories, so both specialists are there.
    expect(specialists.map((r) => r.label)).toEqual(expect.arrayContaining(['Jonah Peltier-Rusk', 'Wren Okafor-Hale']));
  });

  it('when the manager drills into a specialist’s row, then the items behind it are listed, as many as the server counts', async () => {
    const [top] = await rowsOf('groupBy=specialist');
    await page.getByRole('table', { name: 'Forecast by specialist' }).getByRole('button', { name: new RegExp(`^${escapeRe(top.label)}\\W*show the items$`) }).click();
    const dialog = page.getByRole('dialog', { name: `Items behind ${top.label}` });
    await dialog.getByText(`${top.itemCount} ${top.itemCount === 1 ? 'item' : 'items'}`, { exact: true }).waitFor();
    const rows = dialog.getByRole('table', { name: `Items behind ${top.label}` }).locator('tbody tr');
    await expect.poll(() => rows.count()).toBe(Math.min(25, top.itemCount));
    // Each item names its account (a link to its roadmap), its season and this specialist.
    const first = rows.first();
    await first.getByRole('link').first().waitFor();
    await expect(first.innerText()).resolves.toMatch(new RegExp(`\\d{4} season · ${escapeRe(top.label)}`));
    await shot(page, 'forecast', '3-drill-down');
    await dialog.getByRole('button', { name: 'Close' }).click();
    await dialog.waitFor({ state: 'hidden' });
  });

  it('when one shop week has more install hours booked than technicians, then it is flagged over capacity with the items that could move', async () => {
    const shop = page.getByRole('region', { name: /^Shop capacity, harvest to planting / });
    const weeks = shop.getByRole('region', { name: 'Shop weeks' });
    await weeks.locator('tbody tr').first().waitFor();
    const capacity = (await (await apiAs(MANAGER)).get('/api/shop-capacity?from=2026-10-01&to=2027-05-31')).body.weeks as { weekStart: string; bookedHours: number; over: boolean }[];
    const busiest = [...capacity].sort((a, b) => b.bookedHours - a.bookedHours)[0];
    expect(busiest.bookedHours, 'the demo books install hours before the 2027 season').toBeGreaterThan(1);
    const over = capacity.find((w) => w.over);
    const overWeek = over?.weekStart ?? busiest.weekStart;
    // The week as the page names it: "Technician hours, week of Jan 18, 2027".
    const weekName = new Intl.DateTimeFormat('en-US', { month: 'short', day: 'numeric', year: 'numeric', timeZone: 'UTC' }).format(new Date(`${overWeek}T00:00:00Z`));
    const hoursLabel = `Technician hours, week of ${weekName} (empty for the default)`;
    const hours = weeks.getByLabel(hoursLabel);
    if (!over) {
      // The demo shop has room every week at its default hours: the manager cuts the busiest week's hours below its bookings.
      await hours.fill(String(Math.floor(busiest.bookedHours / 2)));
      await weeks.getByRole('button', { name: `Set technician hours for the week of ${weekName}` }).click();
    }
    const row = weeks.getByRole('row').filter({ has: page.getByLabel(hoursLabel) });
    await row.getByText(/^Over by [\d.,]+ h$/).waitFor();
    await shop.getByRole('status').getByText(/^\d+ weeks? over capacity$/).waitFor();
    // Under the week: what could move to another week, or why nothing can.
    await shop.getByText(/^(Items that could move to another week \(\d+|No item you can see could move)/).first().waitFor();
    await row.evaluate((el) => el.scrollIntoView({ block: 'center' }));
    await shot(page, 'forecast', '4-shop-over');
  });

  it('when the manager exports the CSV, then the download has the grouping’s header line and one line per group', async () => {
    const link = page.getByRole('link', { name: 'Export CSV' });
    await page.evaluate(() => window.scrollTo(0, 0));
    const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
    const text = fs.readFileSync((await download.path())!, 'utf8');
    const lines = text.split(/\r?\n/).filter((l) => l.length > 0);
    expect(lines[0]).toBe('specialist,label,pipeline_usd,weighted_usd,actual_usd,item_count');
    const specialists = await rowsOf('groupBy=specialist');
    // One line per specialist, then the total line.
    expect(lines).toHaveLength(specialists.length + 2);
    for (const r of specialists) expect(lines.some((l) => l.includes(`,${r.label},`))).toBe(true);
    const total = lines.at(-1)!.split(',');
    expect(total.slice(0, 2)).toEqual(['total', 'Total']);
    expect(Number(total[5])).toBe(specialists.reduce((n, r) => n + r.itemCount, 0));
    expect(download.suggestedFilename()).toMatch(/\.csv$/);
  });
});

// ---------------------------------------------------------------------------------------------
interface SentMail {
  id: number;
  subject: string;
  envelopeTo: string[];
}

describe('story 4: the grower receives a pre-season reminder, opens the link and books a check-up', () => {
  let contact: { id: number; name: string; email: string };
  let accountId = 0;
  let bookingUrl = '';
  const preferredDay = (() => {
    // Three weeks out, on a weekday.
    let d = addDays(today, 21);
    while (weekdayOf(d) === 0 || weekdayOf(d) === 6) d = addDays(d, 1);
    return d;
  })();
  const NOTE = 'Row 9 skips on the hills; please look at the seed tube sensor too.';
  const pages: Page[] = [];
  const open = async (email: string | null, viewport = VIEWPORT) => {
    const p = await openAs(email, viewport);
    pages.push(p);
    return p;
  };

  afterAll(async () => {
    await Promise.all(pages.map((p) => p.context().close().catch(() => undefined)));
  });

  beforeAll(async () => {
    const grower = await apiAs(GROWER);
    const prefs = (await grower.get('/api/me/reminder-preferences')).body as { account: { id: number; name: string }; contacts: { id: number; name: string; email: string | null }[] };
    expect(prefs.account.name).toBe('Hesketh Farms');
    accountId = prefs.account.id;
    const withMail = prefs.contacts.find((c) => c.email);
    expect(withMail, 'the demo grower has a contact with an e-mail address').toBeDefined();
    contact = { id: withMail!.id, name: withMail!.name, email: withMail!.email! };
    // The demo leaves the grower's own farm without an open check-up, so that the booking link in
    // the reminder can book one (with one open it only says "already requested").
    const specialist = await apiAs(SPECIALIST);
    const openOnes = (await specialist.get(`/api/visits?accountId=${accountId}&status=requested,planned`)).body.items as { id: number; purpose: string; version: number }[];
    expect(openOnes.filter((x) => x.purpose === 'pre-season-checkup')).toEqual([]);
  });

  it('when the grower checks their reminder settings, then their contact receives reminders at the address on record', async () => {
    const page = await open(GROWER);
    await nav(page, 'Reminders');
    await page.waitForURL(/\/reminder-preferences$/);
    const toggle = page.getByRole('switch', { name: `Reminders for ${contact.name}` });
    await toggle.waitFor({ state: 'attached' });
    const row = page.getByRole('listitem').filter({ has: toggle });
    await row.getByText(contact.email, { exact: true }).waitFor();
    if (!(await toggle.isChecked())) await toggle.check({ force: true });
    await row.getByText('Receives reminders').waitFor();
    await shot(page, 'booking', '1-grower-preferences');
    await page.context().close();
  });

  it('when the admin runs the early-order reminder, then the dialog says how many messages go out and the run confirms them', async () => {
    const page = await open(ADMIN);
    await nav(page, 'Reminders');
    await page.getByRole('link', { name: EARLY_ORDER }).click();
    await page.getByRole('button', { name: 'Run now…' }).click();
    const dialog = page.getByRole('dialog', { name: `Run “${EARLY_ORDER}” now?` });
    const estimate = dialog.getByText(/^\d+ messages? would be put in the outbox/);
    await estimate.waitFor({ timeout: 30_000 });
    const promised = Number(/^(\d+)/.exec(await estimate.innerText())![1]);
    // The grower's contact is in the audience.
    const audience = (await (await apiAs(ADMIN)).get(`/api/campaigns?pageSize=100`)).body.items as { id: number; name: string }[];
    const campaignId = audience.find((c) => c.name === EARLY_ORDER)!.id;
    const members = (await (await apiAs(ADMIN)).get(`/api/campaigns/${campaignId}/audience?pageSize=200`)).body.items as { contactId: number }[];
    expect(members.map((m) => m.contactId)).toContain(contact.id);
    expect(promised).toBe(members.length);
    await shot(page, 'booking', '2-run-confirm');
    await dialog.getByRole('button', { name: /^Enqueue \d+ messages?$/ }).click();
    await page.getByRole('status').getByText(new RegExp(`${promised} messages? put in the outbox`)).waitFor({ timeout: 30_000 });
    await shot(page, 'booking', '3-run-done');
    await page.context().close();
  }, 90_000);

  it('when the message reaches the local SMTP stand-in, then the grower’s copy greets them and carries the booking link', async () => {
    // The sender job delivers it; the stand-in's inbox is the Sent mail page (and its API).
    const admin = await apiAs(ADMIN);
    const mail = await waitFor('the grower’s message at the local SMTP stand-in', async () => {
      const res = await admin.get(`/api/sent-mail?pageSize=20&q=${encodeURIComponent(contact.email)}`);
      return (res.body.items as SentMail[]).find((m) => m.envelopeTo.includes(contact.email) && /^Early orders for 2027 are open, /.test(m.subject));
    });
    const first = contact.name.split(' ')[0];
    expect(mail.subject).toBe(`Early orders for 2027 are open, ${first}`);

    const page = await open(ADMIN);
    await nav(page, 'Sent mail');
    await page.getByLabel('Search').fill(contact.email);
    await expect.poll(() => new URL(page.url()).searchParams.get('q')).toBe(contact.email);
    // Other growers share the first name in the subject: the grower's row is the one to their address.
    const row = page.getByRole('row').filter({ hasText: contact.email });
    await expect.poll(() => row.count()).toBe(1);
    await row.getByRole('link', { name: mail.subject }).click();
    await page.getByRole('heading', { level: 1, name: mail.subject }).waitFor();
    await page.locator('[data-mail-to]').getByText(contact.email, { exact: false }).waitFor();
    const frame = page.frameLocator('iframe[data-mail-html]');
    await frame.getByText(`Hello ${first},`).waitFor();
    await frame.getByText('Hesketh Farms').first().waitFor();
    const link = frame.getByRole('link', { name: 'Request a pre-season check-up' });
    bookingUrl = (await link.getAttribute('href'))!;
    expect(bookingUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/api\/reminders\/book\?token=/);
    await page.waitForTimeout(300);
    await shot(page, 'booking', '4-message');
    // The plain-text part carries the same link.
    await page.getByRole('tab', { name: 'Plain text' }).click();
    await expect(page.locator('[data-mail-text]').innerText()).resolves.toContain(`Request a pre-season check-up: ${bookingUrl}`);
    await page.context().close();
  }, 90_000);

  it('when the grower opens the link signed out and books a check-up for a day, then the page confirms the request', async () => {
    // A fresh browser with no session, as from the grower's mail program.
    const page = await open(null, { width: 800, height: 760 });
    await page.goto(bookingUrl);
    await page.getByRole('heading', { level: 1, name: 'Request a pre-season check-up' }).waitFor();
    await page.getByText(`asked by ${contact.name}`, { exact: false }).waitFor();
    await expect(page.locator('main').innerText()).resolves.toContain('For Hesketh Farms');
    await page.getByLabel('Preferred day (optional)').fill(preferredDay);
    await page.getByLabel('Anything we should know? (optional)').fill(NOTE);
    await shot(page, 'booking', '5-booking-form');
    await page.getByRole('button', { name: 'Request the check-up' }).click();
    await page.getByRole('heading', { level: 1, name: 'Check-up requested' }).waitFor();
    await expect(page.locator('main').innerText()).resolves.toMatch(/Status: requested\./);
    await expect(page.locator('main').innerText()).resolves.toContain('Hesketh Farms');
    await shot(page, 'booking', '6-booked');
    await page.context().close();
  });

  it('when the specialist opens the week plan and the grower opens Visits, then both find the new check-up request with the grower’s day and note', async () => {
    const specialist = await apiAs(SPECIALIST);
    const requests = (await specialist.get(`/api/visits?accountId=${accountId}&status=requested`)).body.items as { id: number; purpose: string; durationMin: number; requestedByContactId: number | null; notes: string }[];
    const booked = requests.filter((v) => v.purpose === 'pre-season-checkup');
    expect(booked).toHaveLength(1);
    expect(booked[0].requestedByContactId).toBe(contact.id);
    expect(booked[0].notes).toContain(`Preferred date: ${preferredDay}.`);
    expect(booked[0].notes).toContain(NOTE);
    // As long as any other check-up, so the week plan leaves it the time it needs.
    expect(booked[0].durationMin).toBe(90);

    const staff = await open(SPECIALIST);
    await nav(staff, 'Week plan');
    const request = staff
      .getByRole('group', { name: 'Requested' })
      .getByRole('listitem')
      .filter({ hasText: /^Hesketh Farms · Check-up/ });
    await request.getByText('Requested by the grower').waitFor();
    await expect(request.innerText()).resolves.toMatch(/^Hesketh Farms · Check-up · 1 h 30 min · Mankato/);
    await request.scrollIntoViewIfNeeded();
    await shot(staff, 'booking', '7-specialist-week-plan');

    const grower = await open(GROWER);
    await nav(grower, 'Visits');
    const coming = grower.getByRole('region', { name: 'Coming up' });
    await coming.getByRole('button', { name: /Pre-season check-up.*Time to be set by your specialist.*Requested/ }).click();
    const panel = grower.getByRole('dialog', { name: 'Pre-season check-up: Hesketh Farms' });
    await panel.getByText(`Preferred date: ${preferredDay}.`, { exact: false }).waitFor();
    await panel.getByText(NOTE, { exact: false }).waitFor();
    await shot(grower, 'booking', '8-grower-visits');
  }, 60_000);
});

