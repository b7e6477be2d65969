// Visit planning in a real browser: a specialist opens the territory map, chooses the visits for
// next week, gets day routes (with progress while they compute) and saves them, then drags one
// visit to another day in the calendar and sees that week's routes follow; a refused drag snaps
// back with the server's reason; the map and calendar code never loads on sign-in or home; a
// grower's calendar address serves an iCalendar feed of their own visits only.
import path from 'node:path';
import type { Page, Response } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { checkCalendar } from '../../shared/calc/ical.js';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3540', dbPort: '3541' });
const shot = (name: string) => path.join(SCREENSHOT_DIR, `visits-${name}.png`);

const app = useDemoApp(env);

// The dealership's dates (America/Chicago), worked out here the way the app does.
function chicagoToday(): string {
  const parts = Object.fromEntries(new Intl.DateTimeFormat('en-US', { timeZone: 'America/Chicago', year: 'numeric', month: '2-digit', day: '2-digit' }).formatToParts(new Date()).map((p) => [p.type, p.value]));
  return `${parts.year}-${parts.month}-${parts.day}`;
}
function addDays(iso: string, days: number): string {
  const d = new Date(`${iso}T12:00:00Z`);
  d.setUTCDate(d.getUTCDate() + days);
  return d.toISOString().slice(0, 10);
}
const today = chicagoToday();
const thisMonday = addDays(today, -((new Date(`${today}T12:00:00Z`).getUTCDay() + 6) % 7));
const nextMonday = addDays(thisMonday, 7);

interface RouteStop {
  visitId: number;
  accountName: string;
  startMin: number;
  departMin: number;
  fixed: boolean;
  version: number;
}
interface RouteDay {
  date: string;
  stops: RouteStop[];
  warnings: string[];
}

async function signIn(role: string, viewport = { width: 1280, height: 900 }, onResponse?: (r: Response) => void): Promise<Page> {
  const context = await app.browser.newContext({ viewport, timezoneId: 'UTC' });
  const page = await context.newPage();
  if (onResponse) page.on('response', onResponse);
  await page.goto(`${app.server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(`${role}@rowpath.test`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  return page;
}

async function currentRoutes(page: Page, weekStart: string): Promise<RouteDay[]> {
  const response = await page.request.get(`${app.server.url}/api/week-plans/current?weekStart=${weekStart}&days=5`);
  expect(response.status()).toBe(200);
  return ((await response.json()) as { days: RouteDay[] }).days;
}

async function visitOf(page: Page, id: number): Promise<{ startsAt: string; version: number; accountName: string }> {
  const response = await page.request.get(`${app.server.url}/api/visits/${id}`);
  expect(response.status()).toBe(200);
  return ((await response.json()) as { visit: { startsAt: string; version: number; accountName: string } }).visit;
}

const eventOf = (page: Page, visitId: number) => page.locator(`.rbc-event:has([data-visit-id="${visitId}"])`);
const dayColumn = (page: Page, index: number) => page.locator('.rbc-time-content .rbc-day-slot').nth(index);

/** A real mouse drag: press on the event, move past the library's click tolerance, glide, release. */
async function drag(page: Page, from: { x: number; y: number }, to: { x: number; y: number }) {
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(from.x + 8, from.y + 2, { steps: 2 });
  await page.mouse.move(to.x, to.y, { steps: 12 });
  await page.mouse.up();
}

describe('a specialist plans next week and reschedules in the calendar', () => {
  it('when the specialist signs in, then the sign-in and home pages load no map or calendar code; the map page does', async () => {
    const loaded: Promise<{ url: string; body: string }>[] = [];
    const record = (r: Response) => {
      if (/\.(js|css)(\?|$)/.test(r.url()) && r.status() === 200) loaded.push(r.text().then((body) => ({ url: r.url(), body })));
    };
    const page = await signIn('specialist', undefined, record);
    try {
      await page.waitForLoadState('networkidle');
      const early = await Promise.all(loaded);
      expect(early.length).toBeGreaterThan(3);
      const heavy = (body: string) => /leaflet-container|_leaflet_pos|rbc-calendar|rbc-time-view/.test(body);
      expect(early.filter((f) => heavy(f.body)).map((f) => f.url)).toEqual([]);

      const nav = (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts()).map((s) => s.trim());
      expect(nav).toEqual(expect.arrayContaining(['Map', 'Week plan', 'Calendar']));

      loaded.length = 0;
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Map' }).click();
      await page.locator('.rp-marker, .rp-cluster').first().waitFor();
      const onMap = await Promise.all(loaded);
      expect(onMap.some((f) => /leaflet-container/.test(f.body))).toBe(true);
      expect(onMap.some((f) => /rbc-calendar/.test(f.body))).toBe(false);
    } finally {
      await page.context().close();
    }
  }, 240_000);

  it('when the specialist opens the map, then accounts show in the status scheme with a legend, filters narrow them and a marker opens the account summary', async () => {
    const page = await signIn('specialist');
    try {
      await page.goto(`${app.server.url}/map`);
      await page.getByRole('heading', { level: 1, name: 'Territory map' }).waitFor();
      await page.locator('.rp-marker, .rp-cluster').first().waitFor();
      await page.waitForLoadState('networkidle');
      const legend = page.getByRole('region', { name: 'Legend' }).or(page.locator('section[aria-labelledby="map-legend-title"]'));
      for (const word of ['Open request', 'Overdue', 'Due soon', 'Visited recently', 'Roadmap items due this season', 'Dealership']) await legend.getByText(word, { exact: false }).first().waitFor();
      await page.locator('.rp-depot').waitFor();
      // The base layer is the shipped county outlines (SVG paths), not tiles.
      await expect(page.locator('.leaflet-rp-basemap-pane path').count()).resolves.toBeGreaterThan(100);
      await expect(page.locator('.leaflet-tile').count()).resolves.toBe(0);

      const status = page.getByRole('status').filter({ hasText: /^Showing / });
      const totals = async () => (await status.innerText()).match(/Showing ([\d,]+) of ([\d,]+)/)!.slice(1).map((n) => Number(n.replace(/,/g, '')));
      const [shownAll, all] = await totals();
      expect(shownAll).toBe(all);
      await page.getByLabel('Only roadmap due this season').check();
      await expect.poll(async () => (await totals())[0]).toBeLessThan(all);
      await page.getByLabel('Only roadmap due this season').uncheck();
      await page.getByRole('checkbox', { name: /Due soon/ }).uncheck();
      await expect.poll(async () => (await totals())[0]).toBeLessThan(all);
      await expect.poll(() => page.url()).toMatch(/state=request%2Coverdue%2Cok/);
      await page.getByRole('checkbox', { name: /Due soon/ }).check();
      await expect.poll(async () => (await totals())[0]).toBe(all);

      // Every marker and group is placed inside the fitted view (a group drawn at a stale zoom would land far off).
      const mapBox = (await page.getByRole('region', { name: 'Territory map of accounts' }).boundingBox())!;
      const icons = await page.locator('.leaflet-marker-icon:has(.rp-marker), .leaflet-marker-icon:has(.rp-cluster)').evaluateAll((els) => els.map((e) => e.getBoundingClientRect().toJSON() as DOMRect));
      expect(icons.length).toBeGreaterThan(0);
      for (const r of icons) {
        expect(r.x + r.width / 2).toBeGreaterThanOrEqual(mapBox.x);
        expect(r.x + r.width / 2).toBeLessThanOrEqual(mapBox.x + mapBox.width);
        expect(r.y + r.height / 2).toBeGreaterThanOrEqual(mapBox.y);
        expect(r.y + r.height / 2).toBeLessThanOrEqual(mapBox.y + mapBox.height);
      }

      // Zoomed out, the town's accounts cluster; a single marker opens its card.
      const single = page.locator('.leaflet-marker-icon:has(.rp-marker)').first();
      if ((await single.count()) === 0) {
        await page.locator('.leaflet-marker-icon:has(.rp-cluster)').first().click();
        await page.waitForTimeout(600);
      }
      const marker = page.locator('.leaflet-marker-icon:has(.rp-marker)').first();
      const label = (await marker.locator('.rp-sr-only').innerText()).split(':')[0];
      await marker.click();
      const card = page.locator('section[aria-labelledby="map-account-title"]');
      await card.getByRole('heading', { name: label }).waitFor();
      await card.getByRole('link', { name: 'Open the account' }).waitFor();
      expect(page.url()).toMatch(/account=\d+/);
      await page.screenshot({ path: shot('map'), fullPage: true });
    } finally {
      await page.context().close();
    }
  }, 120_000);

  let planned: RouteDay[] = [];

  it('when the specialist chooses visits for next week and plans it, then progress shows, day routes come back, and saving writes them to the calendar', async () => {
    const page = await signIn('specialist', { width: 1280, height: 1000 });
    try {
      await page.goto(`${app.server.url}/week-plan`);
      await page.getByRole('heading', { level: 1, name: 'Week plan' }).waitFor();
      await expect(page.getByLabel('Week starting').inputValue()).resolves.toBe(nextMonday);
      await page.getByRole('heading', { name: /Visits to plan/ }).waitFor();

      const requested = page.getByRole('group', { name: 'Requested' });
      const requestedBoxes = requested.getByRole('checkbox');
      const requestedCount = await requestedBoxes.count();
      expect(requestedCount).toBeGreaterThanOrEqual(8);
      for (let k = 0; k < requestedCount; k++) await requestedBoxes.nth(k).check();
      // Two due check-ups that have no visit yet: planning creates them first.
      const due = page.getByRole('group', { name: 'Check-up due' }).getByRole('checkbox');
      await expect(due.count()).resolves.toBeGreaterThanOrEqual(2);
      await due.nth(0).check();
      await due.nth(1).check();
      await page.getByText(`${requestedCount + 2} chosen`).waitFor();
      await page.getByText('2 without a visit yet').waitFor();

      await page.getByRole('button', { name: 'Plan the week' }).click();
      await page.getByRole('progressbar').waitFor();
      await page.getByRole('heading', { name: /^Day routes for the week of / }).waitFor({ timeout: 30_000 });
      await expect(page.getByRole('progressbar').getAttribute('aria-valuenow')).resolves.toBe('100');

      const days = page.getByRole('list', { name: 'Days of the plan' }).locator(':scope > li');
      await expect(days.count()).resolves.toBe(5);
      const stopRows = page.getByRole('list', { name: 'Days of the plan' }).locator('tbody tr');
      await expect(stopRows.count()).resolves.toBeGreaterThan(requestedCount);
      await page.locator('.rp-stop').first().waitFor();
      const planMap = page.getByRole('region', { name: 'Day routes of the plan' });
      await expect.poll(() => planMap.locator('.leaflet-rp-basemap-pane path').count()).toBeGreaterThan(100);
      // One dashed or solid line per day with visits, each drawn over a white casing.
      await expect(planMap.locator('.leaflet-overlay-pane path.leaflet-interactive').count()).resolves.toBeGreaterThan(0);
      const totals = page.getByRole('definition').filter({ hasText: /km$/ }).first();
      await expect(totals.innerText()).resolves.toMatch(/\d km/);
      await page.waitForLoadState('networkidle');
      await page.getByRole('heading', { name: /^Day routes for the week of / }).evaluate((el) => el.scrollIntoView({ block: 'start' }));
      await page.evaluate(() => window.scrollBy(0, -16));
      await page.screenshot({ path: shot('week-plan') });
      await page.screenshot({ path: shot('week-plan-full'), fullPage: true });

      await page.getByRole('button', { name: 'Save to calendar' }).click();
      await page.getByText(/Saved \d+ visits to the calendar for the week of/).waitFor();
      await expect(page.getByRole('button', { name: 'Save to calendar' }).isDisabled()).resolves.toBe(true);

      planned = await currentRoutes(page, nextMonday);
      const stops = planned.flatMap((d) => d.stops);
      expect(stops.length).toBeGreaterThanOrEqual(requestedCount);
      expect(planned.flatMap((d) => d.warnings)).toEqual([]);
    } finally {
      await page.context().close();
    }
  }, 180_000);

  it('when the specialist drags a visit to another day in the calendar, then it moves there and the week’s routes follow', async () => {
    const page = await signIn('specialist', { width: 1280, height: 1500 });
    try {
      // A movable stop, and a day where the same time (±15 min for the grid) is free.
      const overlaps = (day: RouteDay, from: number, to: number) => day.stops.some((s) => s.startMin < to && s.departMin > from);
      let choice: { stop: RouteStop; fromDay: number; toDay: number } | null = null;
      for (let a = 0; a < planned.length && !choice; a++) {
        for (const stop of planned[a].stops) {
          if (stop.fixed) continue;
          const b = planned.findIndex((d, k) => k !== a && !overlaps(d, stop.startMin - 20, stop.departMin + 20));
          if (b >= 0) {
            choice = { stop, fromDay: a, toDay: b };
            break;
          }
        }
      }
      expect(choice).not.toBeNull();
      const { stop, fromDay, toDay } = choice!;

      await page.goto(`${app.server.url}/calendar?view=work_week&date=${nextMonday}`);
      await page.getByRole('heading', { level: 1, name: 'Calendar' }).waitFor();
      const event = eventOf(page, stop.visitId);
      await event.waitFor();
      await page.locator(`[data-route-day="${planned[fromDay].date}"]`).getByText(stop.accountName).waitFor();
      await page.waitForLoadState('networkidle');
      await page.screenshot({ path: shot('calendar-before'), fullPage: true });

      await event.scrollIntoViewIfNeeded();
      const box = (await event.boundingBox())!;
      const target = (await dayColumn(page, toDay).boundingBox())!;
      const grab = { x: box.x + box.width / 2, y: box.y + Math.min(12, box.height / 2) };
      await drag(page, grab, { x: target.x + target.width / 2, y: grab.y });

      await page.getByText(new RegExp(`Moved ${stop.accountName.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')} to `)).waitFor();
      // The server holds the new day; the time stays within the grid's 15 minutes.
      const moved = await visitOf(page, stop.visitId);
      const fmt = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/Chicago', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' });
      const parts = Object.fromEntries(fmt.formatToParts(new Date(moved.startsAt)).map((p) => [p.type, p.value]));
      expect(`${parts.year}-${parts.month}-${parts.day}`).toBe(planned[toDay].date);
      expect(Math.abs(Number(parts.hour) * 60 + Number(parts.minute) - stop.startMin)).toBeLessThanOrEqual(15);

      // The routes below the calendar follow: the account leaves its old day and joins the new one.
      const newDay = page.locator(`[data-route-day="${planned[toDay].date}"]`);
      await newDay.getByText(stop.accountName).waitFor();
      await expect.poll(() => page.locator(`[data-route-day="${planned[fromDay].date}"]`).getByText(stop.accountName, { exact: true }).count()).toBe(0);
      const after = await currentRoutes(page, nextMonday);
      expect(after[toDay].stops.map((s) => s.visitId)).toContain(stop.visitId);
      expect(after[fromDay].stops.map((s) => s.visitId)).not.toContain(stop.visitId);
      // The event itself now sits in the new day's column.
      const movedBox = (await eventOf(page, stop.visitId).boundingBox())!;
      expect(movedBox.x).toBeGreaterThanOrEqual(target.x - 1);
      expect(movedBox.x).toBeLessThan(target.x + target.width);
      await page.waitForLoadState('networkidle');
      await page.screenshot({ path: shot('calendar-routes'), fullPage: true });
      planned = after;
    } finally {
      await page.context().close();
    }
  }, 120_000);

  it('when a drag lands on another visit, then the server refuses, the reason shows and the event snaps back unchanged', async () => {
    const page = await signIn('specialist', { width: 1280, height: 1500 });
    try {
      const dayIndex = planned.findIndex((d) => d.stops.filter((s) => !s.fixed).length >= 1 && d.stops.length >= 2);
      expect(dayIndex).toBeGreaterThanOrEqual(0);
      const day = planned[dayIndex];
      const mover = day.stops.find((s) => !s.fixed)!;
      const blocker = day.stops.find((s) => s.visitId !== mover.visitId)!;
      const before = await visitOf(page, mover.visitId);

      await page.goto(`${app.server.url}/calendar?view=work_week&date=${nextMonday}`);
      const event = eventOf(page, mover.visitId);
      await event.waitFor();
      await page.waitForLoadState('networkidle');
      await event.scrollIntoViewIfNeeded();
      const box = (await event.boundingBox())!;
      const blockerBox = (await eventOf(page, blocker.visitId).boundingBox())!;
      // Where the event sits in its day column (messages above the calendar may shift the page).
      const offsetInColumn = async () => (await event.boundingBox())!.y - (await dayColumn(page, dayIndex).boundingBox())!.y;
      const offsetBefore = await offsetInColumn();
      const grab = { x: box.x + box.width / 2, y: box.y + Math.min(12, box.height / 2) };
      // Same column, moved so its top meets the other visit's top.
      await drag(page, grab, { x: grab.x, y: grab.y + (blockerBox.y - box.y) });

      const alert = page.getByRole('alert').filter({ hasText: 'was not moved' });
      await alert.waitFor();
      await expect(alert.innerText()).resolves.toMatch(/Overlaps another visit|Outside the grower's window|Outside working hours/);
      await expect(alert.innerText()).resolves.toMatch(/keeps its time/);
      await expect.poll(async () => Math.round(await offsetInColumn())).toBe(Math.round(offsetBefore));
      const after = await visitOf(page, mover.visitId);
      expect(after.startsAt).toBe(before.startsAt);
      expect(after.version).toBe(before.version);
      await page.screenshot({ path: shot('calendar-refused') });

      // The keyboard way: open the visit with Enter and use "Move to…"; a time before the day starts is refused too.
      await event.focus();
      await page.keyboard.press('Enter');
      const panel = page.getByRole('dialog');
      await panel.getByRole('heading', { name: 'Move to…' }).waitFor();
      await panel.getByLabel('New start time').fill('05:00');
      await panel.getByRole('button', { name: 'Move visit' }).click();
      await panel.getByRole('alert').getByText(/Outside working hours/).waitFor();
      expect((await visitOf(page, mover.visitId)).startsAt).toBe(before.startsAt);
      // The checklist toggles from the same panel.
      const firstItem = panel.getByRole('checkbox').first();
      if ((await firstItem.count()) > 0) {
        await firstItem.check();
        await panel.getByText(/marked done/).waitFor();
      }
      await page.screenshot({ path: shot('visit-panel') });
    } finally {
      await page.context().close();
    }
  }, 120_000);

  it('when the specialist cancels a visit from its panel, then a second step asks first, the visit is kept as cancelled and leaves the calendar', async () => {
    const page = await signIn('specialist', { width: 1280, height: 1500 });
    try {
      const day = planned.find((d) => d.stops.some((s) => !s.fixed))!;
      const victim = day.stops.filter((s) => !s.fixed).at(-1)!;
      await page.goto(`${app.server.url}/calendar?view=work_week&date=${nextMonday}`);
      const event = eventOf(page, victim.visitId);
      await event.waitFor();
      await event.focus();
      await page.keyboard.press('Enter');
      const panel = page.getByRole('dialog');
      await panel.getByRole('button', { name: 'Cancel visit…' }).click();
      // The second step holds the focus on the safe answer: keeping it changes nothing.
      await expect.poll(() => page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Keep the visit');
      await page.keyboard.press('Enter');
      await panel.getByRole('button', { name: 'Cancel visit…' }).waitFor();
      expect((await page.request.get(`${app.server.url}/api/visits/${victim.visitId}`).then((r) => r.json())).visit.status).toBe('planned');

      await panel.getByRole('button', { name: 'Cancel visit…' }).click();
      await page.screenshot({ path: shot('visit-cancel-ask') });
      await panel.getByRole('button', { name: 'Yes, cancel it' }).click();
      await panel.getByRole('status').getByText('Visit cancelled').waitFor();
      await panel.getByText('Cancelled', { exact: true }).waitFor();
      expect((await page.request.get(`${app.server.url}/api/visits/${victim.visitId}`).then((r) => r.json())).visit.status).toBe('cancelled');
      await page.keyboard.press('Escape');
      await expect.poll(() => event.count()).toBe(0);
    } finally {
      await page.context().close();
    }
  }, 120_000);
});

describe('a grower’s visits and calendar feed', () => {
  it('when the grower requests a visit and fetches their calendar address, then the feed validates as iCalendar and lists only their own visits', async () => {
    const page = await signIn('grower');
    try {
      const nav = (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts()).map((s) => s.trim());
      expect(nav).toContain('Visits');
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Visits' }).click();
      await page.getByRole('heading', { level: 1, name: 'Visits' }).waitFor();
      await page.getByRole('heading', { name: 'Coming up' }).waitFor();
      // Last spring's check-ups (demo data) are listed apart from what is coming.
      await page.getByRole('region', { name: 'Earlier visits' }).getByText('Pre-season check-up').first().waitFor();

      await page.getByLabel('What do you need?').selectOption({ label: 'Troubleshooting' });
      await page.getByLabel('When suits you?').selectOption({ label: 'Afternoons (13:00–17:00)' });
      await page.getByLabel(/Notes for your specialist/).fill('Left wing seed sensors drop out on hills.');
      await page.getByRole('button', { name: 'Send the request' }).click();
      await page.getByText('Your troubleshooting request is sent.', { exact: false }).waitFor();
      await page.locator('section[aria-labelledby="coming-title"]').getByText('Troubleshooting').first().waitFor();

      const feedUrl = await page.getByLabel('Calendar feed address').inputValue();
      expect(feedUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\/api\/calendar\/[A-Za-z0-9_-]{43}\.ics$/);
      await page.screenshot({ path: shot('grower'), fullPage: true });

      // The feed needs no session: a calendar program fetches it with the address alone.
      const response = await fetch(feedUrl);
      expect(response.status).toBe(200);
      expect(response.headers.get('content-type')).toMatch(/^text\/calendar/);
      const text = await response.text();
      const { problems, calendar } = checkCalendar(text);
      expect(problems).toEqual([]);
      const uids = calendar!.children.filter((c) => c.name === 'VEVENT').map((e) => Number(/^visit-(\d+)@/.exec(e.properties.find((p) => p.name === 'UID')!.value)![1]));
      expect(uids.length).toBeGreaterThan(0);

      // Every event is one of the grower's own visits …
      const own = (await (await page.request.get(`${app.server.url}/api/visits`)).json()) as { items: { id: number; accountId: number }[] };
      const ownIds = new Set(own.items.map((v) => v.id));
      expect(new Set(own.items.map((v) => v.accountId)).size).toBe(1);
      for (const id of uids) expect(ownIds.has(id)).toBe(true);
      // Replacing the address (after a confirmation) cuts off the old one at once.
      await page.getByRole('button', { name: 'Replace the address…' }).click();
      await page.getByRole('dialog', { name: 'Replace your calendar address?' }).getByRole('button', { name: 'Replace the address' }).click();
      await page.getByText('A new address is ready. The old one no longer works.').waitFor();
      const newUrl = await page.getByLabel('Calendar feed address').inputValue();
      expect(newUrl).not.toBe(feedUrl);
      expect((await fetch(feedUrl)).status).toBe(404);
      expect((await fetch(newUrl)).status).toBe(200);

      // … and the specialist's other visits next week are not in it.
      const staff = await signIn('specialist');
      try {
        const theirs = (await (await staff.request.get(`${app.server.url}/api/visits?from=${nextMonday}&to=${addDays(nextMonday, 7)}`)).json()) as { items: { id: number; accountId: number }[] };
        const others = theirs.items.filter((v) => !ownIds.has(v.id));
        expect(others.length).toBeGreaterThan(0);
        for (const v of others) expect(uids).not.toContain(v.id);
      } finally {
        await staff.context().close();
      }
    } finally {
      await page.context().close();
    }
  }, 120_000);
});
