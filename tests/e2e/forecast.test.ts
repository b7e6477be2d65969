// The forecast in Chromium: the demo manager opens it, sees the 2027 and 2028 seasons by category
// and by specialist, drills into a bar, is refused a quota below zero, sees a week over shop
// capacity (the demo shop has room every week at its default hours, so the test first sets one
// busy week's technician hours low through the page's own form), exports the CSV and prints.
// A specialist sees only their own figures and no quotas.
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3560', dbPort: '3561', smtpPort: true });
const MANAGER = 'manager@rowpath.test';
const SPECIALIST = 'specialist@rowpath.test';
const THIS_SEASON = 2027;
const NEXT_SEASON = 2028;

interface Row {
  key: string;
  label: string;
  pipelineUsd: number;
  weightedUsd: number;
  actualUsd: number;
  itemCount: number;
}
interface Week {
  weekStart: string;
  bookedHours: number;
  technicianHours: number;
  over: boolean;
}

const app = useDemoApp(env);
const { apiAs } = app;

async function rowsOf(email: string, query: string): Promise<Row[]> {
  const res = await (await apiAs(email)).get(`/api/forecast?${query}`);
  expect(res.status).toBe(200);
  return res.body.rows as Row[];
}

async function signIn(page: Page, email: string) {
  await page.goto(`${app.server.url}/sign-in`);
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  await page.locator('main#main-content').waitFor();
}

async function withPage<T>(email: string, run: (page: Page) => Promise<T>, viewport = { width: 1280, height: 900 }): Promise<T> {
  const context = await app.browser.newContext({ viewport, acceptDownloads: true });
  const page = await context.newPage();
  try {
    await signIn(page, email);
    return await run(page);
  } finally {
    await context.close();
  }
}

const shot = (page: Page, name: string, fullPage = true) => page.screenshot({ path: path.join(SCREENSHOT_DIR, `forecast-${name}.png`), fullPage });

/** Opens the forecast from the navigation, as a user would. */
async function openForecast(page: Page) {
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Forecast' }).click();
  await page.waitForURL((url) => url.pathname === '/forecast');
  await page.getByRole('heading', { level: 1, name: 'Forecast' }).waitFor();
}

describe('the manager’s forecast', () => {
  it('when the demo manager opens the forecast, then this season and next show by category and by specialist, with the server’s figures', async () => {
    const categories = [await rowsOf(MANAGER, `groupBy=category&season=${THIS_SEASON}`), await rowsOf(MANAGER, `groupBy=category&season=${NEXT_SEASON}`)];
    const specialists = [await rowsOf(MANAGER, `groupBy=specialist&season=${THIS_SEASON}`), await rowsOf(MANAGER, `groupBy=specialist&season=${NEXT_SEASON}`)];
    expect(categories[0].length, 'the demo has 2027 items').toBeGreaterThan(0);
    expect(categories[1].length, 'the demo has 2028 items').toBeGreaterThan(0);

    await withPage(MANAGER, async (page) => {
      await openForecast(page);
      for (const [groupBy, perSeason] of [
        ['category', categories],
        ['specialist', specialists],
      ] as const) {
        const panel = page.locator(`[data-season-panel="${groupBy}"]`);
        await expect.poll(() => panel.locator('tbody th[scope="row"]').count()).toBeGreaterThan(0);
        await expect.poll(() => panel.getByRole('columnheader', { name: `${THIS_SEASON} expected` }).count()).toBe(1);
        await expect.poll(() => panel.getByRole('columnheader', { name: `${NEXT_SEASON} expected` }).count()).toBe(1);
        // One line per group seen in either season.
        const keys = new Set([...perSeason[0], ...perSeason[1]].map((r) => r.key));
        expect(await panel.locator('tbody th[scope="row"]').count()).toBe(keys.size);
        // The largest 2027 group's figure is on the page as the server computed it.
        const top = [...perSeason[0]].sort((a, b) => b.weightedUsd - a.weightedUsd)[0];
        const expected = `${top.label}, ${THIS_SEASON} season: $${Math.round(top.weightedUsd).toLocaleString('en-US')} expected`;
        const labels = await panel.locator('tbody button').evaluateAll((buttons) => buttons.map((b) => b.getAttribute('aria-label') ?? ''));
        expect(labels.filter((l) => l.startsWith(expected)), `${expected} among ${labels.join(' | ')}`).toHaveLength(1);
      }
      await page.locator('[data-forecast-chart] .recharts-bar-rectangle').first().waitFor();
      await shot(page, 'overview');
    });
  });

  it('when the manager clicks a bar, then the items behind it are listed, as many as the server counts', async () => {
    const seasons = await rowsOf(MANAGER, 'groupBy=season');
    const first = seasons[0];
    expect(first.itemCount).toBeGreaterThan(0);

    await withPage(MANAGER, async (page) => {
      await openForecast(page);
      // The first "Weighted" bar is the earliest season's.
      const bars = page.locator('[data-forecast-chart] .recharts-bar').nth(1).locator('.recharts-bar-rectangle path');
      await bars.first().waitFor();
      await bars.first().click();
      const dialog = page.getByRole('dialog', { name: `Items behind ${first.label}` });
      await dialog.waitFor();
      await dialog.locator('[data-drill-down] tbody tr').first().waitFor();
      await expect.poll(() => dialog.getByText(`${first.itemCount} ${first.itemCount === 1 ? 'item' : 'items'}`, { exact: true }).count()).toBe(1);
      expect(await dialog.locator('tbody tr').count()).toBe(Math.min(25, first.itemCount));
      await shot(page, 'drill-down', false);
      await dialog.getByRole('button', { name: 'Close' }).click();

      // A table row drills down too, with the page's filters (here: grouped by category, 2028).
      const [topCategory] = await rowsOf(MANAGER, `groupBy=category&season=${NEXT_SEASON}`);
      await page.getByLabel('Group by').selectOption('category');
      await page.getByLabel('Season', { exact: true }).selectOption(String(NEXT_SEASON));
      await expect.poll(() => new URL(page.url()).search).toBe(`?groupBy=category&season=${NEXT_SEASON}`);
      await page.locator(`[data-drill-row="${topCategory.key}"]`).click();
      const rowDialog = page.getByRole('dialog', { name: `Items behind ${topCategory.label}` });
      await rowDialog.waitFor();
      await expect.poll(() => rowDialog.getByText(`${topCategory.itemCount} ${topCategory.itemCount === 1 ? 'item' : 'items'}`, { exact: true }).count()).toBe(1);
    });
  });

  it('when the manager types a quota below zero, then it is refused with the field’s message; a real quota saves', async () => {
    const quotas = await (await apiAs(MANAGER)).get(`/api/quotas?season=${THIS_SEASON}`);
    const territory = (quotas.body.territories as { territoryId: number; territoryName: string }[])[0];

    await withPage(MANAGER, async (page) => {
      await openForecast(page);
      const form = page.locator(`[data-quota-form="${territory.territoryId}-${THIS_SEASON}"]`);
      const input = form.getByLabel(`Quota for ${territory.territoryName}, ${THIS_SEASON} season, in US dollars`);
      await input.fill('-5');
      await form.getByRole('button', { name: /Save/ }).click();
      await form.getByText('A quota cannot be below zero').waitFor();
      expect(await input.getAttribute('aria-invalid')).toBe('true');
      await form.scrollIntoViewIfNeeded();
      await shot(page, 'quota-refused', false);

      await input.fill('450,000');
      await form.getByRole('button', { name: /Save/ }).click();
      await form.getByText('Saved').waitFor();
    });
    const after = await (await apiAs(MANAGER)).get(`/api/quotas?season=${THIS_SEASON}`);
    const saved = (after.body.territories as { territoryId: number; quotaUsd: number }[]).find((t) => t.territoryId === territory.territoryId);
    expect(saved?.quotaUsd).toBe(450_000);
  });

  it('when a week has more install hours booked than technician hours, then it is flagged over with a word and a shape', async () => {
    const manager = await apiAs(MANAGER);
    const capacity = await manager.get('/api/shop-capacity?from=2026-10-01&to=2027-05-31');
    expect(capacity.status).toBe(200);
    const weeks = capacity.body.weeks as Week[];
    const busiest = [...weeks].sort((a, b) => b.bookedHours - a.bookedHours)[0];
    expect(busiest.bookedHours, 'the demo books install hours before the 2027 season').toBeGreaterThan(1);
    const alreadyOver = weeks.some((w) => w.over);

    await withPage(MANAGER, async (page) => {
      await openForecast(page);
      const section = page.locator('[data-shop-capacity]');
      await section.locator('tbody tr').first().waitFor();
      let overWeek = busiest.weekStart;
      if (!alreadyOver) {
        // The demo shop has room every week: set the busiest week's technician hours below its bookings.
        const low = Math.max(0, Math.floor(busiest.bookedHours / 2));
        const form = section.locator(`[data-week-hours-form="${busiest.weekStart}"]`);
        await form.locator('input').fill(String(low));
        await form.getByRole('button', { name: /Set/ }).click();
      } else {
        overWeek = weeks.find((w) => w.over)!.weekStart;
      }
      const row = section.locator(`tr[data-shop-week="${overWeek}"]`);
      await expect.poll(() => row.getAttribute('data-over')).toBe('true');
      await row.getByText(/^Over by [\d.,]+ h$/).waitFor();
      expect(await row.locator('svg path[d="M6 1 11 11H1L6 1Z"]').count(), 'a triangle beside the word').toBe(1);
      await section.locator(`[data-movable-for="${overWeek}"]`).waitFor();
      await section.getByText(/week(s)? over capacity/).waitFor();
      await row.scrollIntoViewIfNeeded();
      await page.mouse.wheel(0, 200);
      await shot(page, 'shop-capacity', false);
    });
    const checked = await manager.get(`/api/shop-capacity?from=${busiest.weekStart}&to=${busiest.weekStart}`);
    expect((checked.body.weeks as Week[])[0].over).toBe(true);
  });

  it('when the manager exports the CSV, then the download starts with the header line for the chosen grouping', async () => {
    await withPage(MANAGER, async (page) => {
      await page.goto(`${app.server.url}/forecast?groupBy=specialist&season=${THIS_SEASON}`);
      await page.getByRole('heading', { level: 1, name: 'Forecast' }).waitFor();
      const link = page.getByRole('link', { name: 'Export CSV' });
      expect(await link.getAttribute('href')).toBe(`/api/forecast/export.csv?groupBy=specialist&season=${THIS_SEASON}`);
      const [download] = await Promise.all([page.waitForEvent('download'), link.click()]);
      const file = await download.path();
      const text = fs.readFileSync(file, 'utf8');
      expect(text.split('\r\n')[0]).toBe('specialist,label,pipeline_usd,weighted_usd,actual_usd,item_count');
      const specialists = await rowsOf(MANAGER, `groupBy=specialist&season=${THIS_SEASON}`);
      expect(text).toContain(specialists[0].label);

      // The print view: no navigation, no filters or buttons, the chart fitted to the sheet.
      await page.locator('[data-forecast-chart] .recharts-bar-rectangle').first().waitFor();
      await page.emulateMedia({ media: 'print' });
      expect(await page.locator('header').first().isVisible()).toBe(false);
      expect(await page.getByRole('search', { name: 'Forecast filters' }).isVisible()).toBe(false);
      await shot(page, 'print');
    });
  });
});

describe('a specialist’s forecast', () => {
  it('when a specialist opens the forecast, then only their own figures show and quotas are not offered', async () => {
    // The server limits a specialist to their own items: at most their own name in either season.
    const own = [...(await rowsOf(SPECIALIST, `groupBy=specialist&season=${THIS_SEASON}`)), ...(await rowsOf(SPECIALIST, `groupBy=specialist&season=${NEXT_SEASON}`))];
    const ownNames = [...new Set(own.map((r) => r.label))];
    expect(ownNames.length).toBeLessThanOrEqual(1);
    console.log(`specialist sees: ${JSON.stringify(ownNames)}`);
    await withPage(SPECIALIST, async (page) => {
      await openForecast(page);
      const panel = page.locator('[data-season-panel="specialist"]');
      await expect.poll(() => panel.locator('tbody td, tbody th').count()).toBeGreaterThan(0);
      await expect.poll(() => panel.locator('.animate-pulse').count()).toBe(0);
      await expect.poll(() => panel.locator('tbody th[scope="row"]').allTextContents()).toEqual(ownNames);
      expect(await page.locator('[data-quota-panel]').count()).toBe(0);
      expect(await page.getByLabel('Specialist', { exact: true }).count()).toBe(0);
      expect(await page.locator('[data-week-hours-form]').count()).toBe(0);
      await shot(page, 'specialist');
    });
  });
});
