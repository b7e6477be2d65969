// The upgrade roadmap in Chromium: for the three demo accounts whose goals make a naive order
// waste money, the compare view shows Rowpath's order wasting less; a specialist drags an item to
// an earlier season, sees the warning, and moves it back with the keyboard (the warning clears);
// the grower accepts the open 2027 quote in the portal and the specialist sees the items accepted.
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3530', dbPort: '3531' });
const SPECIALISTS = ['specialist@rowpath.test', 'specialist2@rowpath.test'];
const WASTE_ACCOUNTS = ['Hesketh Farms', 'Brannigan Acres', 'Oldfield Family Farms'];

const app = useDemoApp(env);
const { apiAs } = app;

interface DemoAccount {
  id: number;
  name: string;
  territoryName: string;
  /** The demo specialist whose territory holds the account. */
  specialist: string;
}

/** Finds a demo account by name (as the manager, who sees both territories) and the specialist who covers it. */
async function demoAccount(name: string): Promise<DemoAccount> {
  const manager = await apiAs('manager@rowpath.test');
  const list = await manager.get(`/api/accounts?q=${encodeURIComponent(name)}&pageSize=5`);
  expect(list.status).toBe(200);
  const account = (list.body.items as { id: number; name: string; territoryName: string }[]).find((a) => a.name === name);
  expect(account, `${name} is in the demo`).toBeDefined();
  for (const email of SPECIALISTS) {
    const seen = await (await apiAs(email)).get(`/api/accounts/${account!.id}`);
    if (seen.status === 200) return { id: account!.id, name, territoryName: account!.territoryName, specialist: email };
  }
  throw new Error(`No demo specialist covers ${name} (${account!.territoryName})`);
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

const slug = (name: string) => name.toLowerCase().replace(/[^a-z0-9]+/g, '-');
const card = (page: Page, partNumber: string) => page.locator(`article[data-part-number="${partNumber}"]`);

/** Drags a card by its grip to a season column with mouse moves (pointer events, as a hand would). */
async function dragCard(page: Page, partNumber: string, toSeason: number) {
  const handle = card(page, partNumber).locator('[data-drag-handle]');
  await handle.scrollIntoViewIfNeeded();
  const from = (await handle.boundingBox())!;
  const column = page.locator(`[data-season-drop="${toSeason}"]`);
  const to = (await column.boundingBox())!;
  await page.mouse.move(from.x + from.width / 2, from.y + from.height / 2);
  await page.mouse.down();
  await page.mouse.move(from.x + from.width / 2 - 30, from.y + 40, { steps: 4 });
  await page.mouse.move(to.x + to.width / 2, to.y + Math.min(to.height - 20, 260), { steps: 12 });
  await page.mouse.up();
}

describe('Rowpath’s order against a naive one', () => {
  for (const name of WASTE_ACCOUNTS) {
    it(`when the specialist opens the compare view of ${name}, then Rowpath’s order throws away less than a naive order`, async () => {
      const account = await demoAccount(name);
      const roadmap = (await (await apiAs(account.specialist)).get(`/api/accounts/${account.id}/roadmap`)).body as {
        compare: { strategy: string; wasteUsd: number }[];
      };
      const apiPlanner = roadmap.compare.find((c) => c.strategy === 'planner')!;
      const apiNaive = roadmap.compare.find((c) => c.strategy === 'cheapest-first')!;
      expect(apiPlanner.wasteUsd).toBeLessThan(apiNaive.wasteUsd);

      await withPage(account.specialist, async (page) => {
        await page.goto(`${app.server.url}/accounts/${account.id}/roadmap`);
        await page.getByRole('tab', { name: 'Against a naive order' }).click();
        await page.locator('[data-compare-view]').waitFor();
        expect(new URL(page.url()).searchParams.get('view')).toBe('compare');
        const wasteOf = async (strategy: string) => Number(await page.locator(`[data-strategy-waste="${strategy}"]`).getAttribute('data-waste-usd'));
        const planner = await wasteOf('planner');
        const cheapest = await wasteOf('cheapest-first');
        const asked = await wasteOf('as-asked');
        // The screen shows the API's figures, and Rowpath's order wastes less than the naive one.
        expect(planner).toBeCloseTo(apiPlanner.wasteUsd, 2);
        expect(cheapest).toBeCloseTo(apiNaive.wasteUsd, 2);
        expect(planner).toBeLessThan(cheapest);
        expect(planner).toBeLessThanOrEqual(asked);
        // The waste is explained in words, with the season it happens.
        await expect(page.locator('[data-waste-items="cheapest-first"] li').first().textContent()).resolves.toMatch(/(Removed|Stranded) .*\d{4}/);
        await expect(page.locator('[data-compare-headline]').textContent()).resolves.toMatch(/Rowpath’s order throws away \$[\d,]+\./);
        await expect(page.locator('[data-strategy-waste="planner"]').textContent()).resolves.toContain('least');
        await page.screenshot({ path: path.join(SCREENSHOT_DIR, `roadmap-compare-${slug(name)}.png`), fullPage: true });
      });
    });
  }
});

describe('moving an item on the roadmap', () => {
  it('when the specialist drags the belt delivery before the meters it needs, then the warning shows; moving it back with the keyboard clears it', async () => {
    const account = await demoAccount('Hesketh Farms');
    const api = await apiAs(account.specialist);
    await withPage(account.specialist, async (page) => {
      await page.goto(`${app.server.url}/accounts/${account.id}/roadmap`);
      const belt = card(page, 'KR-SD-500');
      await belt.waitFor();
      await expect(belt.getAttribute('data-season')).resolves.toBe('2029');
      await expect(page.locator('[data-roadmap-problem]').count()).resolves.toBe(0);
      const wasteBefore = await page.locator('[data-roadmap-verdict] [data-waste-usd]').getAttribute('data-waste-usd');

      // A version to compare with afterwards.
      await page.getByRole('tab', { name: 'Saved versions' }).click();
      await page.getByLabel('Version name').fill('Before moving the belt delivery');
      await page.getByRole('button', { name: 'Save this version' }).click();
      await page.getByText('Saved “Before moving the belt delivery”.').waitFor();
      await page.getByRole('tab', { name: 'Seasons' }).click();

      // Drag it to 2027: the what-if runs first and the dialog says the order breaks, and why.
      await dragCard(page, 'KR-SD-500', 2027);
      const verdict = page.locator('[data-move-verdict]');
      await verdict.waitFor();
      await expect(verdict.getAttribute('data-move-verdict')).resolves.toBe('breaks');
      await expect(page.locator('[data-move-headline]').textContent()).resolves.toBe('Moving Belt seed delivery, high-speed to 2027 breaks the order:');
      await expect(verdict.textContent()).resolves.toMatch(/needs High-speed singulating meter/);
      await expect(page.locator('[data-move-dialog]').getByText('Over by').isVisible()).resolves.toBe(true);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-move-warning.png') });
      // Nothing is saved until the specialist confirms.
      const stillThere = (await api.get(`/api/accounts/${account.id}/roadmap`)).body.seasons.flatMap((s: { items: { partNumber: string; season: number }[] }) => s.items);
      expect(stillThere.find((i: { partNumber: string }) => i.partNumber === 'KR-SD-500').season).toBe(2029);

      await page.getByRole('button', { name: 'Move it to 2027' }).click();
      await page.locator('[data-roadmap-problem]').waitFor();
      await expect(page.locator('[data-roadmap-problem]').textContent()).resolves.toMatch(/does not work as it stands.*Belt seed delivery, high-speed \(2027\) would not work/);
      await expect(belt.getAttribute('data-season')).resolves.toBe('2027');
      await expect(page.locator('[data-outcome-warnings]').textContent()).resolves.toMatch(/no longer works/);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-moved-broken.png'), fullPage: true });

      // The saved version against the roadmap now: the move shows, 2029 → 2027.
      await page.getByRole('tab', { name: 'Saved versions' }).click();
      await page.locator('[data-diff-moved]').waitFor();
      await expect(page.locator('[data-diff-moved]').textContent()).resolves.toMatch(/Belt seed delivery, high-speed.*2029 → 2027/);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-versions.png'), fullPage: true });
      await page.getByRole('tab', { name: 'Seasons' }).click();

      // Back to 2029 with the keyboard only: "Move to season…", choose, check, confirm.
      await belt.getByRole('button', { name: 'Move to season…' }).focus();
      await page.keyboard.press('Enter');
      const season = page.getByLabel('Move to season');
      await expect(season.evaluate((el) => el === document.activeElement)).resolves.toBe(true);
      await season.selectOption('2029');
      await page.keyboard.press('Tab');
      await page.keyboard.press('Enter');
      await verdict.waitFor();
      await expect(verdict.getAttribute('data-move-verdict')).resolves.toBe('repairs');
      await expect(page.locator('[data-move-headline]').textContent()).resolves.toMatch(/^Moving Belt seed delivery, high-speed to 2029 makes the order work again\./);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-move-back.png') });
      await page.getByRole('button', { name: 'Move it to 2029' }).focus();
      await page.keyboard.press('Enter');
      await expect.poll(() => belt.getAttribute('data-season')).toBe('2029');
      await expect.poll(() => page.locator('[data-roadmap-problem]').count()).toBe(0);
      await expect(page.locator('[data-outcome-warnings]').count()).resolves.toBe(0);
      await expect(page.locator('[data-roadmap-verdict] [data-waste-usd]').getAttribute('data-waste-usd')).resolves.toBe(wasteBefore);
      await page.evaluate(() => window.scrollTo(0, 0));
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-moved-back.png') });
    });
    const after = (await api.get(`/api/accounts/${account.id}/roadmap`)).body;
    expect(after.feasible).toBe(true);
    expect(after.seasons.flatMap((s: { items: { partNumber: string; season: number }[] }) => s.items).find((i: { partNumber: string }) => i.partNumber === 'KR-SD-500').season).toBe(2029);
  });
});

describe('a quote accepted in the grower portal', () => {
  it('when the grower accepts the open 2027 quote, then the specialist sees those items accepted and locked', async () => {
    const account = await demoAccount('Hesketh Farms');
    const grower = await apiAs('grower@rowpath.test');
    const open = (await grower.get(`/api/accounts/${account.id}/quotes`)).body.items.find((q: { season: number; status: string }) => q.season === 2027 && q.status === 'open');
    expect(open, 'the demo grower has an open 2027 quote').toBeDefined();
    const quotedIds: number[] = open.items.map((i: { id: number }) => i.id);

    await withPage('grower@rowpath.test', async (page) => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Roadmap' }).click();
      const quote = page.locator(`article[data-quote-id="${open.id}"]`);
      await quote.waitFor();
      await expect(quote.locator('[data-quote-status]').getAttribute('data-quote-status')).resolves.toBe('open');
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-grower-portal.png'), fullPage: true });
      await quote.getByRole('button', { name: `Accept quote ${open.id}…` }).click();
      const dialog = page.getByRole('dialog', { name: 'Accept the 2027 quote?' });
      await dialog.waitFor();
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-grower-confirm.png') });
      await dialog.getByRole('button', { name: 'Yes, accept the quote' }).click();
      await expect.poll(() => page.locator('[data-decision-result]').textContent()).toMatch(new RegExp(`You accepted quote ${open.id} for 2027`));
      await expect.poll(() => page.locator(`article[data-quote-id="${open.id}"] [data-quote-status]`).getAttribute('data-quote-status')).toBe('accepted');
      // The grower's own roadmap shows the items accepted too; the grower has no controls to move them.
      for (const id of quotedIds) await expect.poll(() => page.locator(`article[data-item-id="${id}"]`).getAttribute('data-stage')).toBe('accepted');
      await expect(page.getByRole('button', { name: 'Move to season…' }).count()).resolves.toBe(0);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-grower-accepted.png'), fullPage: true });
    });

    await withPage(account.specialist, async (page) => {
      await page.goto(`${app.server.url}/accounts/${account.id}/roadmap`);
      await page.locator(`article[data-item-id="${quotedIds[0]}"]`).waitFor();
      for (const id of quotedIds) {
        const item = page.locator(`article[data-item-id="${id}"]`);
        await expect(item.getAttribute('data-stage')).resolves.toBe('accepted');
        await expect(item.locator('[data-stage="accepted"]').first().textContent()).resolves.toContain('Accepted');
        await expect(item.getByText('Locked', { exact: true }).isVisible()).resolves.toBe(true);
      }
      await expect(page.locator(`article[data-quote-id="${open.id}"] [data-quote-status]`).getAttribute('data-quote-status')).resolves.toBe('accepted');
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-specialist-sees-accepted.png'), fullPage: true });

      // A committed item refuses to move, and says why.
      const partNumber = await page.locator(`article[data-item-id="${quotedIds[0]}"]`).getAttribute('data-part-number');
      await dragCard(page, partNumber!, 2028);
      await page.locator('[data-move-refused]').waitFor();
      await expect(page.locator('[data-move-refused]').textContent()).resolves.toMatch(/locked in 2027: the grower committed to it/);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-locked-refused.png') });
      await page.getByRole('button', { name: 'Keep it in 2027' }).click();

      // The next season's quote, from the board, and its PDF.
      await page.getByRole('button', { name: 'Quote 2028…' }).click();
      await page.getByRole('dialog', { name: 'Quote 2028 to the grower?' }).getByRole('button', { name: 'Create the quote' }).click();
      const newQuote = page.locator('article[data-quote-season="2028"]');
      await newQuote.waitFor();
      await expect(newQuote.locator('[data-quote-status]').getAttribute('data-quote-status')).resolves.toBe('open');
      const [download] = await Promise.all([page.waitForEvent('download'), newQuote.getByRole('link', { name: 'Download the PDF' }).click()]);
      const file = await download.path();
      expect(fs.readFileSync(file!).subarray(0, 5).toString()).toBe('%PDF-');
      await newQuote.scrollIntoViewIfNeeded();
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-quote-created.png') });
    });
  });
});

describe('the part rules page', () => {
  it('when the manager saves rules that require each other in a circle, then the set is refused with both parts named', async () => {
    await withPage('manager@rowpath.test', async (page) => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Part rules' }).click();
      await page.locator('[data-rule-part="KR-ED-300"]').waitFor();
      const status = await page.locator('[data-rules-status]').textContent();
      const form = page.getByRole('form', { name: 'Add a rule' });
      await form.getByLabel('Part', { exact: true }).selectOption({ label: 'KR-HC-100 Row-drive controller module' });
      await form.getByLabel('Rule').selectOption('requires');
      await form.getByLabel('Other part').selectOption({ label: 'KR-ED-300 Electric row drive' });
      await form.getByRole('button', { name: 'Add to the draft' }).click();
      await expect(page.locator('[data-rules-status]').textContent()).resolves.toMatch(/Not saved: 1 added, 0 removed/);
      await page.getByRole('button', { name: 'Save the rule set' }).click();
      const problems = page.locator('[data-rule-problems]');
      await problems.waitFor();
      await expect(problems.textContent()).resolves.toMatch(/KR-HC-100 Row-drive controller module/);
      await expect(problems.textContent()).resolves.toMatch(/KR-ED-300 Electric row drive/);
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'roadmap-rules-refused.png'), fullPage: true });
      await page.getByRole('button', { name: 'Discard changes' }).click();
      await expect(page.locator('[data-rules-status]').textContent()).resolves.toBe(status);
    });
  });
});
