// Pre-season reminders in Chromium, against the real start command (its SMTP stand-in and sender
// job included): the demo's 2027 campaigns and season calendar; previews for several growers that
// read as the grower will read them; a template with an unknown field refused while typing; the
// early-order campaign run and delivered to the local SMTP server, shown on Sent mail; a grower
// unsubscribing by the link in a received message and not being sent the next campaign; a grower
// booking a check-up from a reminder and the specialist seeing the request; the grower's own
// preferences page.
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { PRE_SEASON_CHECKLIST } from '../../shared/calc/merge-template.js';
import { daysBetween, windowStartIso } from '../../shared/calc/season-calendar.js';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3550', dbPort: '3551', smtpPort: true });
const EARLY_ORDER = 'Early-order reminder — 2027 season';
const CHECKUP = 'Pre-season check-up — corn 2027';
const SOY = 'Soybean set-up check — 2027';
const NEXT_CAMPAIGN = 'Meter calibration week — corn 2027';
const SPECIALISTS = ['specialist@rowpath.test', 'specialist2@rowpath.test'];

const app = useDemoApp(env);
const { apiAs } = app;

const shot = (name: string) => path.join(SCREENSHOT_DIR, `reminders-${name}.png`);

async function signIn(page: Page, email: string) {
  await page.goto(`${app.server.url}/sign-in`);
  await page.getByLabel(/e-?mail/i).fill(email);
  await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: /sign in/i }).click();
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'));
  await page.locator('main#main-content').waitFor();
}

async function withPage<T>(email: string | null, run: (page: Page) => Promise<T>, viewport = { width: 1280, height: 900 }): Promise<T> {
  const context = await app.browser.newContext({ viewport });
  const page = await context.newPage();
  try {
    if (email) await signIn(page, email);
    return await run(page);
  } finally {
    await context.close();
  }
}

/** Polls until `check` gives a value, or fails after `ms` with `what`. */
async function waitFor<T>(what: string, check: () => Promise<T | null | undefined | false>, ms = 90_000, everyMs = 1000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await check();
    if (value) return value;
    if (Date.now() > until) throw new Error(`Timed out after ${ms} ms waiting for ${what}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

interface CampaignRow {
  id: number;
  name: string;
  season: number;
  status: string;
  schedule: { offsetDays: number; sendOn: string; state: string }[];
  outbox: Record<string, number>;
}

async function campaignByName(name: string): Promise<CampaignRow> {
  const res = await (await apiAs('admin@rowpath.test')).get('/api/campaigns?pageSize=100');
  expect(res.status).toBe(200);
  const found = (res.body.items as CampaignRow[]).find((c) => c.name === name);
  expect(found, `campaign "${name}"`).toBeDefined();
  return found!;
}

interface SentMail {
  id: number;
  to: string;
  subject: string;
  envelopeTo: string[];
}

async function sentMail(q: string): Promise<{ items: SentMail[]; total: number }> {
  const res = await (await apiAs('admin@rowpath.test')).get(`/api/sent-mail?pageSize=200&q=${encodeURIComponent(q)}`);
  expect(res.status).toBe(200);
  return res.body;
}

async function sentMessage(id: number): Promise<{ text: string; html: string; to: string; subject: string }> {
  const res = await (await apiAs('admin@rowpath.test')).get(`/api/sent-mail/${id}`);
  expect(res.status).toBe(200);
  return res.body.message;
}

interface OutboxRow {
  id: number;
  contactId: number;
  contactName: string;
  accountId: number;
  toEmail: string;
  status: string;
}

async function outboxOf(campaignId: number): Promise<{ items: OutboxRow[]; total: number; counts: Record<string, number> }> {
  const res = await (await apiAs('admin@rowpath.test')).get(`/api/outbox?campaignId=${campaignId}&pageSize=200`);
  expect(res.status).toBe(200);
  return res.body;
}

/** Runs a campaign through the editor's "Run now" dialog; returns the number the dialog promised. */
async function runInBrowser(page: Page, screenshotName: string): Promise<number> {
  await page.getByRole('button', { name: 'Run now…' }).click();
  const dialog = page.locator('[data-run-dialog]');
  await dialog.locator('[data-run-estimate]').waitFor({ timeout: 30_000 });
  const promised = Number(await dialog.locator('[data-run-estimate]').getAttribute('data-run-estimate'));
  await expect(dialog.textContent()).resolves.toMatch(new RegExp(`${promised} messages? would be put in the outbox`));
  await page.screenshot({ path: shot(screenshotName) });
  await dialog.getByRole('button', { name: /^Enqueue \d+ messages?$/ }).click();
  await page.locator('[data-run-result]').waitFor({ timeout: 30_000 });
  return promised;
}

/** The contact behind a received message, from the outbox row it was sent from. */
async function contactOfMessage(campaignId: number, toEmail: string): Promise<OutboxRow> {
  const row = (await outboxOf(campaignId)).items.find((r) => r.toEmail === toEmail);
  expect(row, `outbox row for ${toEmail}`).toBeDefined();
  return row!;
}

const linkIn = (text: string, label: string) => new RegExp(`${label}: (\\S+)`).exec(text)?.[1] ?? null;

// Shared between the steps of the story, which run in order.
let earlyOrderId = 0;
let earlyOrderRecipients = 0;
let unsubscribed: OutboxRow | null = null;
let nextCampaignId = 0;

describe('the demo’s campaigns for the coming season', () => {
  it('when a specialist opens Reminders, then the three 2027 campaigns show with their send dates, and the season calendar shows each window with its published source', async () => {
    await withPage('specialist@rowpath.test', async (page) => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reminders' }).click();
      await page.waitForURL(/\/reminders$/);
      const table = page.getByRole('region', { name: 'Reminder campaigns' });
      await table.getByRole('link', { name: EARLY_ORDER }).waitFor();
      for (const name of [EARLY_ORDER, CHECKUP, SOY]) await expect(table.getByRole('link', { name }).isVisible()).resolves.toBe(true);

      // The early-order reminder (140 days before Apr 15, 2027) is due since Nov 26, 2026; the
      // corn check-ups follow at 60, 30 and 10 days (Kansas corn window: USDA-NASS via K-State).
      const earlyRow = table.locator('tr', { has: page.getByRole('link', { name: EARLY_ORDER }) });
      await expect(earlyRow.textContent()).resolves.toMatch(/Nov 26, 2026.*140 days before/);
      await expect(earlyRow.textContent()).resolves.toMatch(/Draft/);
      const checkupRow = table.locator('tr', { has: page.getByRole('link', { name: CHECKUP }) });
      const checkupText = await checkupRow.textContent();
      expect(checkupText).toMatch(/Feb 14, 2027.*Mar 16, 2027.*Apr 5, 2027/);
      expect(checkupText).toMatch(/Active/);

      const calendar = page.locator('[data-season-calendar]');
      const corn = calendar.locator('[data-calendar-row="ks-north-central|corn"]');
      await expect(corn.textContent()).resolves.toMatch(/Opens Apr 15, 2027.*Closes May 15, 2027/);
      await expect(corn.textContent()).resolves.toMatch(/USDA-NASS/);
      const soy = calendar.locator('[data-calendar-row="ks-north-central|soybean"]');
      await expect(soy.textContent()).resolves.toMatch(/Opens May 15, 2027/);
      // Specialists read the calendar; only admins and managers change it.
      await expect(calendar.getByRole('button', { name: /Change/ }).count()).resolves.toBe(0);
      await page.screenshot({ path: shot('campaigns'), fullPage: true });
    });
  }, 120_000);

  it('when a manager opens the season calendar, then each window can be changed and the published dates show beside the dealership’s own', async () => {
    await withPage('manager@rowpath.test', async (page) => {
      await page.goto(`${app.server.url}/reminders`);
      const row = page.locator('[data-calendar-row="ia-northeast|corn"]');
      await row.getByRole('button', { name: /Change/ }).click();
      const dialog = page.getByRole('dialog');
      await dialog.getByLabel('Window opens').fill('2027-04-20');
      await dialog.getByLabel('Window closes').fill('2027-04-10');
      await dialog.getByRole('button', { name: 'Save the dates' }).click();
      // The shared schema refuses a window that closes before it opens, in the app.browser.
      await dialog.getByText('The window must close after it opens').waitFor();
      await dialog.getByLabel('Window closes').fill('2027-05-08');
      await dialog.getByLabel('Why these dates (optional)').fill('Cold soils on our north-east accounts');
      await dialog.getByRole('button', { name: 'Save the dates' }).click();
      await page.getByText('Iowa, north-east: the corn window now opens Apr 20; campaign send dates follow.').waitFor();
      await expect(row.locator('[data-source]').getAttribute('data-source')).resolves.toBe('dealership');
      await expect(row.textContent()).resolves.toMatch(/Opens Apr 20, 2027.*Published: Apr 12 to May 2/);
      await page.screenshot({ path: shot('calendar-changed'), fullPage: true });
      // Back to the published dates.
      await row.getByRole('button', { name: /Change/ }).click();
      await page.getByRole('dialog').getByRole('button', { name: 'Use the published dates' }).click();
      await page.getByText(/back to the published dates/).waitFor();
      await expect(row.locator('[data-source]').getAttribute('data-source')).resolves.toBe('published');
    });
  }, 120_000);
});

describe('previews', () => {
  it('when the specialist previews the corn check-up for several growers, then each reads with that grower’s name, their planters and the checklist, with no merge field left unfilled', async () => {
    const specialist = await apiAs('specialist@rowpath.test');
    const checkup = await campaignByName(CHECKUP);
    const audience = (await specialist.get(`/api/campaigns/${checkup.id}/audience?pageSize=200`)).body.items as { contactId: number; contactName: string; accountId: number; accountName: string }[];
    expect(audience.length).toBeGreaterThanOrEqual(3);
    const picks = [audience[0], audience[Math.floor(audience.length / 2)], audience[audience.length - 1]];

    await withPage('specialist@rowpath.test', async (page) => {
      await page.goto(`${app.server.url}/reminders`);
      await page.setViewportSize({ width: 1280, height: 1200 });
      await page.getByRole('link', { name: CHECKUP }).click();
      await page.waitForURL(new RegExp(`/reminders/campaigns/${checkup.id}$`));
      await page.locator('[data-preview]').waitFor();
      // The campaign reaches both territories: this specialist previews and tests it, but neither changes nor runs it.
      await page.getByText('This campaign also reaches territories that are not yours.').waitFor();
      await expect(page.getByRole('button', { name: 'Run now…' }).isDisabled()).resolves.toBe(true);
      await expect(page.getByRole('button', { name: 'Save changes' }).count()).resolves.toBe(0);
      await expect(page.locator('[data-template-body]').isDisabled()).resolves.toBe(true);
      for (const [i, pick] of picks.entries()) {
        const first = pick.contactName.split(' ')[0];
        await page.locator('[data-preview-contact]').selectOption(String(pick.contactId));
        await expect.poll(() => page.locator('[data-preview-to]').textContent(), { timeout: 15_000 }).toContain(pick.contactName);
        await expect.poll(() => page.locator('[data-preview]').getAttribute('aria-busy'), { timeout: 15_000 }).toBe('false');
        await expect(page.locator('[data-preview-subject]').textContent()).resolves.toBe(`${first}, time to book your planter check-up`);

        // The HTML part, inside the sandboxed frame, as the grower's mail program shows it.
        const frame = page.locator('[data-preview] iframe[data-mail-html]');
        await expect(frame.getAttribute('sandbox')).resolves.not.toContain('allow-scripts');
        const html = (await frame.getAttribute('srcdoc'))!;
        const shown = await page.frameLocator('[data-preview] iframe[data-mail-html]').locator('body').innerText();
        expect(shown).toContain(`Hello ${first},`);
        expect(shown).toContain(pick.accountName);
        const planters = (await specialist.get(`/api/accounts/${pick.accountId}`)).body.account.planters as { name: string }[];
        expect(planters.length).toBeGreaterThan(0);
        for (const p of planters) expect(shown).toContain(p.name);
        for (const item of PRE_SEASON_CHECKLIST) expect(shown).toContain(item);
        expect(shown).toContain('Request a pre-season check-up');
        expect(html).not.toMatch(/\{\{|\}\}/);
        expect(html).not.toMatch(/<img|<script/i);
        // Chromium paints a sandboxed frame only while it is on screen: the picture is of the preview panel in view.
        await page.locator('[data-preview-panel]').evaluate((el) => el.scrollIntoView({ block: 'start' }));
        await page.frameLocator('[data-preview] iframe[data-mail-html]').getByText(`Hello ${first},`).waitFor();
        await page.waitForTimeout(300);
        await page.screenshot({ path: shot(`preview-${i + 1}`) });

        // The plain-text part says the same.
        await page.locator('[data-preview]').getByRole('tab', { name: 'Plain text' }).click();
        const text = (await page.locator('[data-preview] [data-mail-text]').textContent())!;
        expect(text).toContain(`Hello ${first},`);
        for (const p of planters) expect(text).toContain(p.name);
        for (const item of PRE_SEASON_CHECKLIST) expect(text).toContain(`- ${item}`);
        expect(text).toMatch(/Request a pre-season check-up: http:\/\/127\.0\.0\.1:\d+\/api\/reminders\/book\?token=/);
        expect(text).not.toMatch(/\{\{|\}\}/);
        await page.locator('[data-preview]').getByRole('tab', { name: 'As e-mail' }).click();
      }

      // A test of the last grower's message to the specialist's own address: marked, and outside the outbox.
      const last = picks[picks.length - 1];
      await expect(page.getByLabel('Send the test to').inputValue()).resolves.toBe('specialist@rowpath.test');
      await page.getByRole('button', { name: 'Send a test' }).click();
      await page.getByText('Test sent to specialist@rowpath.test, marked [Test].').waitFor();
      const test = await waitFor('the test message at the local SMTP server', async () => (await sentMail('[Test]')).items.find((m) => m.envelopeTo.includes('specialist@rowpath.test')));
      expect(test.subject).toBe(`[Test] ${last.contactName.split(' ')[0]}, time to book your planter check-up`);
      expect((await outboxOf(checkup.id)).total).toBe(0);
      await page.screenshot({ path: shot('test-sent') });
    });

    // On a tablet held upright the list still reads.
    await withPage('specialist@rowpath.test', async (page) => {
      await page.goto(`${app.server.url}/reminders`);
      await page.getByRole('link', { name: CHECKUP }).waitFor();
      await page.screenshot({ path: shot('campaigns-tablet'), fullPage: false });
    }, { width: 820, height: 1180 });
  }, 180_000);

  it('when the manager types an unknown merge field, then the editor says so at once and will not save; the picker inserts a known field', async () => {
    const checkup = await campaignByName(CHECKUP);
    await withPage('manager@rowpath.test', async (page) => {
      await page.goto(`${app.server.url}/reminders/campaigns/${checkup.id}`);
      const body = page.locator('[data-template-body]');
      await body.waitFor();
      await body.click();
      await body.press('Control+End');
      await body.pressSequentially('\n\nSee you soon, {{grower.nickname}}');
      await page.getByText(/Unknown merge field \{\{grower\.nickname\}\}/).first().waitFor();
      await expect(page.locator('[data-template-check]').getAttribute('data-template-check')).resolves.toBe('problem');
      await page.getByRole('button', { name: 'Save changes' }).click();
      // Refused in the browser: the stored template is unchanged.
      await expect(body.evaluate((el) => el === document.activeElement)).resolves.toBe(true);
      const stored = (await (await apiAs('manager@rowpath.test')).get(`/api/campaigns/${checkup.id}`)).body.campaign;
      expect(stored.body).not.toContain('nickname');
      await page.screenshot({ path: shot('template-error'), fullPage: false });

      // Replace the unknown field with a known one from the picker.
      const value = await body.inputValue();
      const at = value.indexOf('{{grower.nickname}}');
      await body.evaluate((el, [start, end]) => (el as HTMLTextAreaElement).setSelectionRange(start, end), [at, at + '{{grower.nickname}}'.length]);
      await page.locator('[data-merge-field="grower.firstName"]').click();
      await expect(body.inputValue()).resolves.toMatch(/See you soon, \{\{grower\.firstName\}\}$/);
      await expect(page.locator('[data-template-check]').getAttribute('data-template-check')).resolves.toBe('ok');
      await page.getByRole('button', { name: 'Undo changes' }).click();
    });
  }, 120_000);
});

describe('running the early-order campaign', () => {
  it('when the admin runs it, then the confirmation says how many messages, they are delivered to the local SMTP server and they show on the Sent mail page', async () => {
    const admin = await apiAs('admin@rowpath.test');
    const early = await campaignByName(EARLY_ORDER);
    earlyOrderId = early.id;
    expect(early.season).toBe(2027);
    const audienceTotal = (await admin.get(`/api/campaigns/${early.id}/audience?pageSize=1`)).body.total as number;
    expect(audienceTotal).toBeGreaterThan(10);

    await withPage('admin@rowpath.test', async (page) => {
      await page.goto(`${app.server.url}/reminders`);
      await page.getByRole('link', { name: EARLY_ORDER }).click();
      await page.locator('[data-preview]').waitFor();
      const promised = await runInBrowser(page, 'run-confirm');
      // The dialog promised what the server then did: one message per contact in the audience.
      expect(promised).toBe(audienceTotal);
      await expect(page.locator('[data-run-result]').getAttribute('data-run-result')).resolves.toBe(String(promised));
      earlyOrderRecipients = promised;

      // The sender job (croner, woken by the run) delivers them; wait, bounded, for all of them.
      await waitFor('every early-order message to be sent', async () => (await outboxOf(early.id)).counts.sent === promised);
      const received = await waitFor('the local SMTP server to hold every message', async () => {
        const mail = await sentMail('Early orders for 2027');
        return mail.total === promised ? mail : null;
      });
      // Each contact once: one outbox row and one received message per contact.
      const rows = (await outboxOf(early.id)).items;
      expect(new Set(rows.map((r) => r.contactId)).size).toBe(promised);
      expect(new Set(received.items.map((m) => m.id)).size).toBe(promised);

      await page.goto(`${app.server.url}/reminders/outbox?campaignId=${early.id}`);
      await expect.poll(() => page.locator('[data-status-chip="sent"]').textContent(), { timeout: 15_000 }).toBe(`Sent${promised}`);
      await expect(page.locator('[data-outbox-status="sent"]').count()).resolves.toBe(Math.min(promised, 50));
      await page.screenshot({ path: shot('outbox') });
      // A message as it left, from the outbox.
      await page.getByRole('button', { name: /^Read the message to / }).first().click();
      const reading = page.getByRole('dialog');
      await reading.locator('iframe[data-mail-html]').waitFor();
      await page.frameLocator('dialog iframe[data-mail-html]').getByText(/^Hello /).first().waitFor();
      await page.screenshot({ path: shot('outbox-message') });
      await reading.getByRole('button', { name: 'Close' }).click();

      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sent mail' }).click();
      await page.waitForURL(/\/sent-mail$/);
      const table = page.getByRole('region', { name: 'Messages received by the local mail server' });
      await expect.poll(() => table.getByRole('link', { name: /^Early orders for 2027 are open, / }).count(), { timeout: 30_000 }).toBe(Math.min(promised, 50));
      await page.screenshot({ path: shot('sent-mail'), fullPage: false });

      // One message as the grower reads it.
      const first = received.items[0];
      await page.goto(`${app.server.url}/sent-mail/${first.id}`);
      await page.locator('[data-sent-message]').waitFor();
      await expect(page.locator('h1').textContent()).resolves.toBe(first.subject);
      await expect(page.locator('[data-mail-to]').textContent()).resolves.toContain(first.envelopeTo[0]);
      const shown = await page.frameLocator('iframe[data-mail-html]').locator('body').innerText();
      expect(shown).toMatch(/^Hello \S+,/);
      expect(shown).toContain('Unsubscribe from these reminders');
      await page.screenshot({ path: shot('sent-message'), fullPage: true });
    });

    // Running it again enqueues nobody twice.
    const again = await admin.post(`/api/campaigns/${early.id}/run`);
    expect(again.status).toBe(200);
    expect(again.body.run).toMatchObject({ enqueued: 0, alreadyQueued: earlyOrderRecipients });
  }, 240_000);
});

describe('unsubscribing by the link', () => {
  it('when a grower follows the unsubscribe link from a received message, then one click without signing in unsubscribes them, and the next campaign sends them nothing', async () => {
    expect(earlyOrderId).toBeGreaterThan(0);
    const admin = await apiAs('admin@rowpath.test');
    const demoGrowerAccount = (await (await apiAs('grower@rowpath.test')).get('/api/me/reminder-preferences')).body.account.id as number;

    // A received message (not the demo grower's own farm, whose page is shown below).
    const mail = await sentMail('Early orders for 2027');
    let chosen: { mail: SentMail; row: OutboxRow; url: string } | null = null;
    for (const m of mail.items) {
      const row = await contactOfMessage(earlyOrderId, m.envelopeTo[0]);
      if (row.accountId === demoGrowerAccount) continue;
      const url = linkIn((await sentMessage(m.id)).text, 'Unsubscribe from these reminders');
      expect(url, 'the unsubscribe link in the plain text').toMatch(/^http:\/\/127\.0\.0\.1:\d+\/api\/reminders\/unsubscribe\?token=/);
      chosen = { mail: m, row, url: url! };
      break;
    }
    expect(chosen).not.toBeNull();
    unsubscribed = chosen!.row;

    await withPage(null, async (page) => {
      await page.goto(chosen!.url);
      await expect(page.locator('h1').textContent()).resolves.toBe('You are unsubscribed');
      await expect(page.locator('body').textContent()).resolves.toContain(chosen!.row.toEmail);
      await expect(page.locator('body').textContent()).resolves.toMatch(/Status: done/);
      await page.screenshot({ path: shot('unsubscribed') });
    }, { width: 800, height: 600 });

    // The next reminder: a new campaign, made in the editor, due today, reaching the same farms.
    const today = new Date().toISOString().slice(0, 10);
    const offsetDays = daysBetween(today, windowStartIso(2027, '04-15'));
    expect(offsetDays).toBeGreaterThan(0);
    await withPage('admin@rowpath.test', async (page) => {
      await page.goto(`${app.server.url}/reminders`);
      await page.getByRole('link', { name: 'New campaign' }).click();
      await page.waitForURL(/\/reminders\/campaigns\/new$/);
      await page.getByLabel('Name', { exact: true }).fill(NEXT_CAMPAIGN);
      // A new campaign starts in the dealership's usual region (north-central Kansas).
      await expect(page.getByLabel('Region', { exact: true }).inputValue()).resolves.toBe('ks-north-central');
      await page.getByLabel('Days before the window opens').fill(String(offsetDays));
      await expect(page.locator('[data-editor-schedule]').textContent()).resolves.toMatch(/Due now/);
      await page.screenshot({ path: shot('new-campaign'), fullPage: true });
      await page.getByRole('button', { name: 'Create the campaign' }).click();
      await page.waitForURL(/\/reminders\/campaigns\/\d+$/);
      nextCampaignId = Number(new URL(page.url()).pathname.split('/').pop());
      await page.getByText(`Campaign “${NEXT_CAMPAIGN}” saved as draft.`).waitFor();

      // The unsubscribed grower fits the campaign in every way but one.
      const preview = await admin.post(`/api/campaigns/${nextCampaignId}/preview`, { contactId: unsubscribed!.contactId });
      expect(preview.status).toBe(200);
      expect(preview.body.preview.inAudience).toBe(false);
      const reasons = preview.body.preview.notInAudienceBecause as string[];
      expect(reasons).toContainEqual(expect.stringMatching(/^The contact unsubscribed on \d{4}-\d{2}-\d{2}\.$/));
      // Unsubscribing also turns the opt-in off; nothing else keeps them out.
      expect(reasons.every((r) => /unsubscribed|not opted in/.test(r))).toBe(true);

      await page.locator('[data-preview]').waitFor();
      const promised = await runInBrowser(page, 'run-next');
      expect(promised).toBeGreaterThan(0);
      await waitFor('the new campaign to be sent', async () => (await outboxOf(nextCampaignId)).counts.sent === promised);
    });

    const outbox = await outboxOf(nextCampaignId);
    expect(outbox.items.length).toBeGreaterThan(0);
    expect(outbox.items.some((r) => r.contactId === unsubscribed!.contactId)).toBe(false);
    expect(outbox.items.some((r) => r.toEmail === unsubscribed!.toEmail)).toBe(false);
    // Their mailbox holds the early-order reminder only.
    const theirs = await sentMail(unsubscribed!.toEmail);
    expect(theirs.items.map((m) => m.subject)).toEqual([chosen!.mail.subject]);
  }, 240_000);
});

describe('booking a check-up from a reminder', () => {
  it('when a grower opens the booking link from a pre-season reminder and books, then the specialist sees the check-up request', async () => {
    expect(nextCampaignId).toBeGreaterThan(0);
    const subjects = await sentMail('time to get the planters ready for 2027');
    expect(subjects.total).toBeGreaterThan(0);

    // A recipient whose farm has no check-up request open yet.
    let pick: { url: string; row: OutboxRow } | null = null;
    for (const m of subjects.items) {
      const url = linkIn((await sentMessage(m.id)).text, 'Request a pre-season check-up');
      expect(url).toMatch(/\/api\/reminders\/book\?token=/);
      const context = await fetch(url!, { headers: { Accept: 'application/json' } }).then((r) => r.json());
      if (context.booking.existingVisitId === null && context.booking.test === false) {
        pick = { url: url!, row: await contactOfMessage(nextCampaignId, m.envelopeTo[0]) };
        break;
      }
    }
    expect(pick, 'a recipient without an open check-up request').not.toBeNull();

    await withPage(null, async (page) => {
      await page.goto(pick!.url);
      await expect(page.locator('h1').textContent()).resolves.toBe('Request a pre-season check-up');
      await page.getByLabel('Preferred day (optional)').fill('2027-02-09');
      await page.getByLabel('Anything we should know? (optional)').fill('The 16-row needs new opener discs before we plant.');
      await page.screenshot({ path: shot('booking') });
      await page.getByRole('button', { name: 'Request the check-up' }).click();
      await expect(page.locator('h1').textContent()).resolves.toBe('Check-up requested');
      await expect(page.locator('body').textContent()).resolves.toMatch(/Status: requested/);
      await page.screenshot({ path: shot('booked') });
    }, { width: 800, height: 700 });

    // The account's specialist finds the request among their requested visits.
    type VisitRow = { id: number; purpose: string; status: string; requestedByContactId: number | null; notes: string };
    let seen: VisitRow | null = null;
    for (const email of SPECIALISTS) {
      const res = await (await apiAs(email)).get(`/api/visits?status=requested&accountId=${pick!.row.accountId}`);
      if (res.status !== 200) continue;
      const items = res.body.items as VisitRow[];
      seen = items.find((v) => v.requestedByContactId === pick!.row.contactId && v.purpose === 'pre-season-checkup') ?? null;
      if (seen) break;
    }
    expect(seen, 'the check-up request in the specialist’s requested visits').not.toBeNull();
    expect(seen!.notes).toMatch(/Preferred date: 2027-02-09/);
    expect(seen!.notes).toMatch(/opener discs/);
  }, 180_000);
});

describe('the grower’s own reminder settings', () => {
  it('when the demo grower opens Reminders, then each contact shows with a switch, and turning one off and on again saves each time', async () => {
    const grower = await apiAs('grower@rowpath.test');
    const before = (await grower.get('/api/me/reminder-preferences')).body as { contacts: { id: number; name: string; reminderOptIn: boolean; email: string | null }[] };
    const contact = before.contacts.find((c) => c.email)!;
    await withPage('grower@rowpath.test', async (page) => {
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reminders' }).click();
      await page.waitForURL(/\/reminder-preferences$/);
      const toggle = page.getByRole('switch', { name: `Reminders for ${contact.name}` });
      await toggle.waitFor({ state: 'attached' });
      const row = page.locator(`[data-preference-contact="${contact.id}"]`);
      if (!(await toggle.isChecked())) {
        await toggle.check({ force: true });
        await row.getByText('Receives reminders').waitFor();
      }
      await page.screenshot({ path: shot('preferences'), fullPage: true });
      await toggle.uncheck({ force: true });
      await row.getByText('Reminders off').waitFor();
      await page.getByText(`${contact.name} will get no more pre-season reminders.`).waitFor();
      expect((await grower.get('/api/me/reminder-preferences')).body.contacts.find((c: { id: number }) => c.id === contact.id).reminderOptIn).toBe(false);
      await page.screenshot({ path: shot('preferences-off'), fullPage: true });
      await toggle.check({ force: true });
      await row.getByText('Receives reminders').waitFor();
      expect((await grower.get('/api/me/reminder-preferences')).body.contacts.find((c: { id: number }) => c.id === contact.id).reminderOptIn).toBe(true);
    });
  }, 120_000);
});
