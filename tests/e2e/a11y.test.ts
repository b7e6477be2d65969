// Accessibility of every main page, for every demo role, in Debian's Chromium on the real app:
//   - axe-core finds no serious or critical violation (needs the axe-core package; without it
//     this part is skipped with a note);
//   - every visible control on each page can be reached with Tab alone, and the sign-in form
//     works with the keyboard alone.
// The pages come from each role's navigation (src/app/layout/nav-items.tsx) plus the account,
// roadmap, planter and sizing pages of the first record, so a page added to the menu is checked
// too; then the pages behind the menus (a campaign, the outbox, a received message, the calendar's
// other views, the 404 page), the pages a grower opens from a reminder's links (server-rendered,
// no sign-in), and two open dialogs. A manager adds an account with the keyboard alone (the form
// in its dialog, its field messages, the territory and specialist lists) and deletes it again
// through the confirmation dialog. Screenshots: test-results/screenshots/a11y-<role>-<page>.png.
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import type { Locator, Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { navItemsByRole } from '../../src/app/layout/nav-items.js';
import { signedIn } from '../helpers/app.js';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3620', dbPort: '3621', smtpPort: true });
const ROLES = ['admin', 'manager', 'specialist', 'grower'] as const;

function axeSource(): string | null {
  try {
    return fs.readFileSync(createRequire(import.meta.url).resolve('axe-core/axe.min.js'), 'utf8');
  } catch {
    return null;
  }
}
const AXE = axeSource();

const app = useDemoApp(env, { fresh: false });

async function signInByKeyboard(page: Page, email: string) {
  await page.goto(`${app.server.url}/sign-in`);
  await page.getByLabel(/e-?mail/i).waitFor();
  // From the top of the page, Tab to each field: no clicks.
  await page.keyboard.press('Tab');
  for (let i = 0; i < 15 && !(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.type === 'email')); i++) await page.keyboard.press('Tab');
  await page.keyboard.type(email);
  await page.keyboard.press('Tab');
  expect(await page.evaluate(() => (document.activeElement as HTMLInputElement | null)?.type)).toBe('password');
  await page.keyboard.type(DEMO_PASSWORD);
  await page.keyboard.press('Enter');
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
}

/** The pages a role reaches: its menu, and the detail pages of the first account and planter it sees. */
async function pagesFor(page: Page, role: (typeof ROLES)[number]): Promise<{ name: string; url: string }[]> {
  const pages = navItemsByRole[role].map((item) => ({ name: item.label, url: item.to }));
  if (role !== 'grower') {
    const account = (await (await page.request.get(`${app.server.url}/api/accounts?pageSize=1`)).json()).items?.[0];
    const planter = (await (await page.request.get(`${app.server.url}/api/planters?pageSize=1`)).json()).items?.[0];
    if (account) pages.push({ name: 'Account', url: `/accounts/${account.id}` }, { name: 'Account roadmap', url: `/accounts/${account.id}/roadmap` });
    if (planter) pages.push({ name: 'Planter', url: `/planters/${planter.id}` }, { name: 'Planter sizing', url: `/planters/${planter.id}/sizing` });
  }
  return pages;
}

async function settle(page: Page, url: string) {
  await page.goto(`${app.server.url}${url}`);
  await page.getByRole('navigation', { name: 'Main' }).waitFor();
  await page.waitForLoadState('networkidle');
  // Loading states give way to content (or to an empty or error state).
  await page.waitForFunction(() => !document.querySelector('[aria-busy="true"]'), undefined, { timeout: 15_000 }).catch(() => undefined);
}

/**
 * Visible, enabled controls that Tab never reaches (radios count once per group). `scope` is a
 * selector for an open modal dialog: the rest of the page is out of reach then, as it should be.
 */
async function unreachableByTab(page: Page, scope = 'body'): Promise<string[]> {
  // Start from the top of the document (or dialog), whatever the page focused on arrival (a heading, a field).
  await page.evaluate((scope) => {
    document.querySelectorAll('[data-a11y-focused]').forEach((el) => el.removeAttribute('data-a11y-focused'));
    const start = document.createElement('span');
    start.tabIndex = -1;
    start.id = 'a11y-tab-start';
    document.querySelector(scope)!.prepend(start);
    start.focus();
  }, scope);
  // Tab until focus comes back round to a control visited before. Date inputs keep focus across
  // their parts (month, day, year), so the same control twice running is not a wrap-around.
  let last = '';
  let repeats = 0;
  for (let i = 0; i < 1500; i++) {
    await page.keyboard.press('Tab');
    const { token, fresh } = await page.evaluate(() => {
      const el = document.activeElement as HTMLElement | null;
      if (!el || el === document.body) return { token: 'body', fresh: true };
      const had = el.getAttribute('data-a11y-focused');
      if (had) return { token: had, fresh: false };
      const made = `f${Math.random().toString(36).slice(2)}`;
      el.setAttribute('data-a11y-focused', made);
      return { token: made, fresh: true };
    });
    if (!fresh && token !== last) break;
    repeats = token === last ? repeats + 1 : 0;
    last = token;
    if (repeats > 8) break; // a focus trap: the same control again and again
  }
  await page.evaluate(() => document.getElementById('a11y-tab-start')?.remove());
  return page.evaluate((scope) => {
    const visible = (el: Element) => {
      const r = (el as HTMLElement).getBoundingClientRect();
      const style = getComputedStyle(el);
      return r.width > 0 && r.height > 0 && style.visibility !== 'hidden' && style.display !== 'none' && !el.closest('[inert], [aria-hidden="true"]');
    };
    const candidates = [...document.querySelector(scope)!.querySelectorAll('a[href], button, input:not([type="hidden"]), select, textarea, [tabindex]:not([tabindex="-1"]), summary')].filter(
      (el) => visible(el) && !(el as HTMLButtonElement).disabled && el.getAttribute('tabindex') !== '-1',
    );
    const focusedRadioGroups = new Set([...document.querySelectorAll('input[type="radio"][data-a11y-focused]')].map((r) => (r as HTMLInputElement).name));
    return candidates
      .filter((el) => !el.hasAttribute('data-a11y-focused'))
      .filter((el) => !((el as HTMLInputElement).type === 'radio' && focusedRadioGroups.has((el as HTMLInputElement).name)))
      .map((el) => `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''} "${((el as HTMLElement).innerText || el.getAttribute('aria-label') || (el as HTMLInputElement).name || '').trim().slice(0, 40)}"`);
  }, scope);
}

/** Serious and critical axe-core violations on the page as it is now (none when axe-core is missing). */
async function axeProblems(page: Page): Promise<string[]> {
  if (!AXE) return [];
  await page.evaluate(AXE); // through the DevTools protocol: the page's CSP does not apply
  return page.evaluate(async () => {
    const result = await (window as unknown as { axe: { run: (ctx: Document, opts: object) => Promise<{ violations: { id: string; impact: string; help: string; nodes: { target: string[] }[] }[] }> } }).axe.run(document, {
      resultTypes: ['violations'],
    });
    return result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.impact} ${v.id}: ${v.help} — ${v.nodes.slice(0, 3).map((n) => n.target.join(' ')).join(', ')}`);
  });
}

describe('keyboard alone', () => {
  it(`when a grower signs in with the keyboard only, then the home page opens${AXE ? '; the sign-in page has no serious or critical axe finding' : ''}`, async () => {
    const context = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
    const page = await context.newPage();
    try {
      await page.goto(`${app.server.url}/sign-in`);
      await page.getByLabel(/e-?mail/i).waitFor();
      expect(await axeProblems(page)).toEqual([]);
      expect(await unreachableByTab(page)).toEqual([]);
      await signInByKeyboard(page, 'grower@rowpath.test');
      expect(new URL(page.url()).pathname).toBe('/');
      await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'a11y-keyboard-sign-in.png') });
    } finally {
      await context.close();
    }
  });
});

for (const role of ROLES) {
  describe(`every main page of the ${role}`, () => {
    it(`when the ${role} tabs through each page, then every visible control is reached${AXE ? ', and axe finds nothing serious or critical' : ''}`, { timeout: 600_000 }, async () => {
      const context = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      const problems: string[] = [];
      try {
        await signInByKeyboard(page, `${role}@rowpath.test`);
        const pages = await pagesFor(page, role);
        expect(pages.length).toBeGreaterThan(2);
        for (const p of pages) {
          await settle(page, p.url);
          const slug = p.name.toLowerCase().replace(/[^a-z0-9]+/g, '-');
          await page.screenshot({ path: path.join(SCREENSHOT_DIR, `a11y-${role}-${slug}.png`), fullPage: true });
          for (const v of await axeProblems(page)) problems.push(`${p.url} (${p.name}): ${v}`);
          for (const missed of await unreachableByTab(page)) problems.push(`${p.url} (${p.name}): not reachable by Tab: ${missed}`);
        }
      } finally {
        await context.close();
      }
      expect(problems, problems.join('\n')).toEqual([]);
    });
  });
}

/** A page the API serves itself (a reminder's link): no app frame to wait for. */
async function settleServed(page: Page, url: string) {
  await page.goto(url.startsWith('http') ? url : `${app.server.url}${url}`);
  await page.locator('main').waitFor();
}

const slugOf = (text: string) => text.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '');

/** A screenshot, then axe and the Tab walk of the page (or of the open dialog) as it is now; findings go to `problems`. */
async function check(page: Page, where: string, shot: string, problems: string[], scope?: string) {
  await page.screenshot({ path: path.join(SCREENSHOT_DIR, `a11y-${slugOf(shot)}.png`), fullPage: !scope });
  for (const v of await axeProblems(page)) problems.push(`${where}: ${v}`);
  for (const missed of await unreachableByTab(page, scope)) problems.push(`${where}: not reachable by Tab: ${missed}`);
}

const hasFocus = (target: Locator) => target.evaluate((el) => el === document.activeElement);
const selectedText = (select: Locator) => select.evaluate((el) => (el as HTMLSelectElement).selectedOptions[0]?.text ?? '');

/** Presses Tab (nothing else) until `target` has the focus; fails after `max` presses. */
async function tabTo(page: Page, target: Locator, max = 80) {
  await target.waitFor();
  for (let i = 0; i < max; i++) {
    await page.keyboard.press('Tab');
    if (await hasFocus(target)) return;
  }
  throw new Error(`Tab did not reach ${target.toString()} in ${max} presses`);
}

/** Polls until `check` gives a value; fails after `ms` with `what`. */
async function poll<T>(what: string, check: () => Promise<T | null | undefined>, ms = 30_000): Promise<T> {
  const until = Date.now() + ms;
  for (;;) {
    const value = await check();
    if (value !== null && value !== undefined) return value;
    if (Date.now() > until) throw new Error(`gave up waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 500));
  }
}

// The demo's check-up reminder: its message carries both links, to book and to unsubscribe.
const CHECKUP = 'Pre-season check-up — corn 2027';

describe('pages behind the menus', () => {
  it(
    'when the admin opens a campaign, the outbox, a received reminder and its links, the other calendar views and a missing page, then every control is reached by Tab and axe finds nothing serious or critical',
    { timeout: 300_000 },
    async () => {
      const api = await signedIn(app.server.url, { email: 'admin@rowpath.test' }, DEMO_PASSWORD);
      const campaigns = (await api.get('/api/campaigns?pageSize=100')).body.items as { id: number; name: string }[];
      const campaign = campaigns.find((c) => c.name === CHECKUP);
      expect(campaign, `the demo campaign "${CHECKUP}"`).toBeDefined();
      // A grower of its audience whose booking link still shows the form (no check-up already on record).
      const audience = (await api.get(`/api/campaigns/${campaign!.id}/audience?pageSize=25`)).body.items as { contactId: number }[];
      expect(audience.length, 'the campaign has an audience').toBeGreaterThan(0);
      let contactId: number | undefined;
      for (const { contactId: candidate } of audience.slice(0, 8)) {
        const preview = (await api.post(`/api/campaigns/${campaign!.id}/preview`, { contactId: candidate })).body.preview as { text: string } | undefined;
        const link = preview?.text.match(/\/api\/reminders\/book\?token=[\w.-]+/)?.[0];
        if (link && (await api.get(link)).text.includes('<form')) {
          contactId = candidate;
          break;
        }
      }
      expect(contactId, 'a grower of the audience with no check-up on record, so that the booking link shows its form').toBeDefined();
      // A test message to the admin's own address, through the SMTP stand-in (it starts just after the web server).
      const sent = await poll('the test message to be handed to the SMTP stand-in', async () => {
        const res = await api.post(`/api/campaigns/${campaign!.id}/test-send`, { contactId });
        return res.status === 200 ? (res.body as { messageId: string }) : null;
      });
      const bare = (id: string) => id.replace(/[<>]/g, '');
      const mail = await poll('the test message on Sent mail', async () =>
        ((await api.get('/api/sent-mail?pageSize=50&q=%5BTest%5D')).body.items as { id: number; messageId: string }[]).find((m) => bare(m.messageId) === bare(sent.messageId)),
      );

      const context = await app.browser.newContext({ viewport: { width: 1280, height: 800 }, locale: 'en-US' });
      const page = await context.newPage();
      const problems: string[] = [];
      try {
        await signInByKeyboard(page, 'admin@rowpath.test');
        for (const p of [
          { name: 'Campaign', url: `/reminders/campaigns/${campaign!.id}` },
          { name: 'Outbox', url: '/reminders/outbox' },
          { name: 'Calendar day', url: '/calendar?view=day' },
          { name: 'Calendar month', url: '/calendar?view=month' },
          { name: 'Page not found', url: '/no-such-page' },
          { name: 'Sent mail with a message', url: '/sent-mail' },
          { name: 'Sent message', url: `/sent-mail/${mail.id}` },
        ]) {
          await settle(page, p.url);
          if (p.name === 'Page not found') await page.getByRole('heading', { name: 'Page not found', level: 1 }).waitFor();
          await check(page, `${p.url} (${p.name})`, `admin-${p.name}`, problems);
        }

        // The links as the grower gets them: from the received message itself.
        const message = page.frameLocator('iframe[data-mail-html]');
        const bookingUrl = await message.getByRole('link', { name: 'Request a pre-season check-up' }).getAttribute('href');
        const unsubscribeUrl = await message.getByRole('link', { name: 'Unsubscribe from these reminders' }).getAttribute('href');
        expect(bookingUrl).toMatch(/\/api\/reminders\/book\?token=/);
        expect(unsubscribeUrl).toMatch(/\/api\/reminders\/unsubscribe\?token=/);

        await settleServed(page, bookingUrl!);
        await check(page, 'Booking page (reminder link)', 'link-booking', problems);
        // The grower's form, by keyboard alone, on the page as it opens: a day, a note, Enter on the
        // button. A test link changes nothing, and says so.
        await settleServed(page, bookingUrl!);
        await tabTo(page, page.getByLabel('Preferred day (optional)'));
        await page.keyboard.type('03152027');
        await expect.poll(() => page.getByLabel('Preferred day (optional)').inputValue()).toBe('2027-03-15');
        await tabTo(page, page.getByLabel('Anything we should know? (optional)'));
        await page.keyboard.type('The gate code is 4417.');
        await tabTo(page, page.getByRole('button', { name: 'Request the check-up' }));
        await page.keyboard.press('Enter');
        await page.getByRole('heading', { name: 'This was a test message' }).waitFor();
        await check(page, 'Booking sent (reminder link)', 'link-booked', problems);

        await settleServed(page, unsubscribeUrl!);
        await page.getByRole('heading', { name: 'This was a test message' }).waitFor();
        await check(page, 'Unsubscribe page (reminder link)', 'link-unsubscribe', problems);

        await settleServed(page, '/api/reminders/book?token=r1.not-a-real-token.x');
        await page.getByRole('heading', { name: 'This link cannot be used' }).waitFor();
        await check(page, 'Refused link page', 'link-refused', problems);
      } finally {
        await context.close();
      }
      expect(problems, problems.join('\n')).toEqual([]);
    },
  );
});

describe('a form by keyboard alone', () => {
  it(
    'when a manager adds an account with the keyboard only, then it is saved as typed; the form dialog, its field messages and the delete confirmation pass axe and keep Tab inside',
    { timeout: 180_000 },
    async () => {
      const api = await signedIn(app.server.url, { email: 'manager@rowpath.test' }, DEMO_PASSWORD);
      const name = `Keyboard Acres ${Date.now().toString(36)}`;
      const context = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      const problems: string[] = [];
      try {
        await signInByKeyboard(page, 'manager@rowpath.test');
        await settle(page, '/accounts');
        await tabTo(page, page.getByRole('button', { name: 'Add an account' }));
        await page.keyboard.press('Enter');
        const dialog = page.getByRole('dialog', { name: 'Add an account' });
        await dialog.waitFor();
        const nameField = dialog.getByLabel('Operation name');
        await expect.poll(() => hasFocus(nameField), { message: 'the dialog opens on its first field' }).toBe(true);
        await check(page, 'Add an account (dialog)', 'manager-add-account', problems, 'dialog[open]');

        // Sent empty: the messages show, and the first field with one gets the focus.
        await tabTo(page, dialog.getByRole('button', { name: 'Add account' }));
        await page.keyboard.press('Enter');
        await dialog.getByText('Enter the operation name').waitFor();
        await expect.poll(() => hasFocus(nameField), { message: 'the first field with a message gets the focus' }).toBe(true);
        await check(page, 'Add an account (dialog, with field messages)', 'manager-add-account-errors', problems, 'dialog[open]');

        await tabTo(page, nameField);
        await page.keyboard.type(name);
        // Lists are chosen by typing the start of an entry, as a keyboard user does.
        const territory = dialog.getByLabel('Territory', { exact: true });
        await tabTo(page, territory);
        await page.keyboard.type('Republican');
        await expect.poll(() => selectedText(territory)).toBe('Republican Bend');
        const specialist = dialog.getByLabel('Planting specialist');
        await expect.poll(() => specialist.locator('option').count(), { message: 'the territory’s specialists are listed' }).toBeGreaterThan(1);
        await tabTo(page, specialist);
        await page.keyboard.type('Jonah');
        await expect.poll(() => selectedText(specialist)).toBe('Jonah Peltier-Rusk');
        await tabTo(page, dialog.getByLabel('Town'));
        await page.keyboard.type('Keyboard Flats');
        await tabTo(page, dialog.getByLabel('State', { exact: true }));
        await page.keyboard.type('ks');
        await tabTo(page, dialog.getByLabel('Corn (ac)'));
        await page.keyboard.type('640');
        await tabTo(page, dialog.getByRole('button', { name: 'Add account' }));
        await page.keyboard.press('Space');

        await page.waitForURL(/\/accounts\/\d+$/);
        const id = Number(new URL(page.url()).pathname.split('/').pop());
        const saved = (await api.get(`/api/accounts/${id}`)).body.account;
        expect(saved).toMatchObject({ name, territoryName: 'Republican Bend', specialistName: 'Jonah Peltier-Rusk', town: 'Keyboard Flats', state: 'KS' });
        expect(saved.acresByCrop).toMatchObject({ corn: 640 });
        await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'a11y-manager-account-added.png') });

        // And away again, through the confirmation, by keyboard: the safe choice has the focus first.
        await page.getByRole('heading', { name, level: 1 }).waitFor();
        await tabTo(page, page.getByRole('button', { name: 'Delete account' }), 200);
        await page.keyboard.press('Enter');
        const confirm = page.getByRole('dialog', { name: `Delete ${name}?` });
        await confirm.waitFor();
        await expect.poll(() => hasFocus(confirm.getByRole('button', { name: 'Keep it' }))).toBe(true);
        await check(page, 'Delete an account (confirmation dialog)', 'manager-delete-account', problems, 'dialog[open]');
        await tabTo(page, confirm.getByRole('button', { name: 'Delete the account and its fleet' }));
        await page.keyboard.press('Enter');
        await page.waitForURL((url) => url.pathname === '/accounts');
        expect((await api.get(`/api/accounts/${id}`)).status).toBe(404);
      } finally {
        await context.close();
      }
      expect(problems, problems.join('\n')).toEqual([]);
    },
  );
});

describe('axe-core', () => {
  it.skipIf(AXE !== null)('when the axe-core package is missing, then the axe scans above are skipped (install axe-core to run them)', () => {
    console.warn('axe-core is not installed: the accessibility scans ran keyboard checks only.');
    expect(AXE).toBeNull();
  });
});
