// The fleet records in a real browser: a specialist opens a grower account, records a farm site, a
// tractor and a 16-row 30-inch planter, places parts on every row, on rows 1–8 and on the toolbar,
// sees them drawn, attaches a photo, reloads and finds it all; a stale save is refused, not
// overwritten; a grower reads their own fleet without any way to change it.
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { describe, expect, it } from 'vitest';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { signedIn, uid } from '../helpers/app.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3510', dbPort: '3511' });
const shot = (name: string) => path.join(SCREENSHOT_DIR, `fleet-${name}.png`);

const app = useDemoApp(env);

async function signIn(role: string, viewport = { width: 1280, height: 900 }): Promise<Page> {
  const context = await app.browser.newContext({ viewport });
  const page = await context.newPage();
  await page.goto(`${app.server.url}/sign-in`);
  await page.getByLabel('E-mail').fill(`${role}@rowpath.test`);
  await page.getByLabel('Password').fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  // On a tablet the menu is folded away behind "Menu": wait for the signed-in page itself.
  await page.locator('#main-content h1').first().waitFor();
  return page;
}

const dialog = (page: Page) => page.getByRole('dialog');
const rowButton = (page: Page, row: number) => page.getByRole('button', { name: new RegExp(`^Row ${row}: `) });
const nameOf = async (page: Page, row: number) => (await rowButton(page, row).getAttribute('aria-label')) ?? '';

describe('a specialist records a grower fleet', () => {
  const accountName = `Prairie Bend Test Farms ${uid()}`;
  let accountUrl = '';
  let planterUrl = '';

  it('when the specialist opens an account and adds a farm site, a tractor and a 16-row 30-inch planter, then the account page shows them', async () => {
    const page = await signIn('specialist');
    try {
      const nav = (await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allInnerTexts()).map((s) => s.trim());
      expect(nav).toEqual(expect.arrayContaining(['Planters', 'Catalog']));

      await page.goto(`${app.server.url}/accounts`);
      await page.getByRole('button', { name: 'Add an account' }).click();
      const form = dialog(page);
      await form.getByLabel('Operation name').fill(accountName);
      await form.getByLabel('Planting specialist').selectOption({ label: 'Jonah Peltier-Rusk (you)' });
      await form.getByLabel('Town').fill('Mankato');
      await form.getByLabel('State').fill('KS');
      await form.getByLabel('Corn (ac)').fill('1,200');
      await form.getByLabel('Soybeans (ac)').fill('800');
      await form.getByRole('button', { name: 'Add account' }).click();
      await page.waitForURL(/\/accounts\/\d+$/);
      accountUrl = page.url();
      await page.getByRole('heading', { level: 1, name: accountName }).waitFor();
      await page.getByText('2,000 ac').waitFor();

      // Farm site.
      await page.getByRole('button', { name: 'Add a farm site' }).click();
      await dialog(page).getByLabel('Name').fill('Home yard');
      await dialog(page).getByLabel('Latitude (°)').fill('39.7871');
      await dialog(page).getByLabel('Longitude (°)').fill('-98.2104');
      await dialog(page).getByRole('button', { name: 'Add farm site' }).click();
      // (The form's hint also says "Home yard": wait for the saved coordinates instead.)
      await page.locator('#farm-sites').getByText('39.7871° N, 98.2104° W').waitFor();
      await expect(page.locator('#farm-sites li').filter({ hasText: 'Home yard' }).count()).resolves.toBe(1);

      // Tractor: an empty flow is refused in the browser with the schema's own words.
      await page.getByRole('button', { name: 'Add a tractor' }).click();
      await dialog(page).getByLabel('Name').fill('Planting tractor');
      await dialog(page).getByLabel('Hydraulic pressure (psi)').fill('3000');
      await dialog(page).getByLabel('Remote valves').fill('4');
      await dialog(page).getByRole('button', { name: 'Add tractor' }).click();
      await dialog(page).getByText('Hydraulic flow must be a number').waitFor();
      await dialog(page).getByLabel('Hydraulic flow (gpm)').fill('55');
      await dialog(page).getByLabel('PTO power (hp)').fill('310');
      await dialog(page).getByRole('button', { name: 'Add tractor' }).click();
      await page.locator('#tractors').getByText('55 gpm').waitFor();

      // Planter: the single toolbar follows the rows and spacing (16 × 30 in = 40 ft).
      await page.getByRole('button', { name: 'Add a planter' }).click();
      const planterForm = dialog(page);
      await planterForm.getByLabel('Name', { exact: true }).first().fill('16-row planter');
      await planterForm.getByLabel('Maker').fill('Harrowgate Implement');
      await planterForm.getByLabel('Rows').fill('16');
      await planterForm.getByLabel('Row spacing (in)').fill('30');
      await planterForm.getByLabel('Frame').selectOption('three-section-flex');
      await planterForm.getByLabel('Pulled by').selectOption({ label: 'Planting tractor' });
      await planterForm.getByLabel('Kept at').selectOption({ label: 'Home yard' });
      await expect(planterForm.getByLabel('Size (ft)').inputValue()).resolves.toBe('40');
      await expect(planterForm.getByLabel('Last row').inputValue()).resolves.toBe('16');
      await planterForm.getByRole('button', { name: 'Add planter' }).click();
      const card = page.locator('#planters').getByRole('link', { name: /16-row planter/ });
      await card.waitFor();
      await expect(card.innerText()).resolves.toMatch(/16 rows × 30 in/);
      await page.waitForLoadState('networkidle');
      await page.screenshot({ path: shot('account'), fullPage: true });

      await card.click();
      await page.waitForURL(/\/planters\/\d+$/);
      planterUrl = page.url();
    } finally {
      await page.context().close();
    }
  }, 180_000);

  it('when parts go on every row, on rows 1–8 and on the toolbar, then the drawing shows each where it is, and a photo can be attached', async () => {
    const page = await signIn('specialist');
    try {
      await page.goto(planterUrl);
      await page.getByRole('heading', { level: 1, name: '16-row planter' }).waitFor();
      await expect(page.getByRole('button', { name: /^Row \d+: / }).count()).resolves.toBe(16);
      await expect(nameOf(page, 1)).resolves.toBe('Row 1: nothing installed');
      await expect(page.locator('#main-content').getByRole('link', { name: 'Sizing' }).getAttribute('href')).resolves.toMatch(/\/planters\/\d+\/sizing$/);

      // Every row: from the header's "Add a component".
      await page.getByRole('button', { name: 'Add a component' }).click();
      let form = dialog(page);
      await form.getByLabel('Find a part').fill('vacuum seed meter');
      await form.getByLabel('Part from the catalog').selectOption({ label: 'KR-SM-110 · Vacuum seed meter, standard disc (per row)' });
      await form.getByLabel('Every row').check();
      await form.getByLabel('Price paid (USD, in all)').fill('6160');
      await form.getByLabel('Work order').fill('WO-2026-0412');
      await form.getByLabel('Serial numbers').fill('VM-0001\nVM-0002');
      await form.getByRole('button', { name: 'Add to the planter' }).click();
      await page.waitForFunction(() => document.querySelector('[data-row="16"]')?.getAttribute('aria-label')?.includes('Vacuum seed meter'));

      // Rows 1–8: from row 3's panel, as a range.
      await rowButton(page, 3).click();
      form = dialog(page);
      await form.getByRole('heading', { name: 'Row 3', exact: true }).waitFor();
      await form.getByRole('button', { name: 'Add a component to row 3' }).click();
      await form.getByLabel('Part from the catalog').selectOption({ label: 'KR-RC-120 · Floating row cleaner (per row)' });
      await expect(form.getByLabel('A range of rows').isChecked()).resolves.toBe(true);
      await form.getByLabel('First row').fill('1');
      // Past the last row: only the server knows the planter's size, and its message lands on the field.
      await form.getByLabel('Last row').fill('20');
      await form.getByRole('button', { name: 'Add to the planter' }).click();
      await form.getByText('The planter has only 16 rows').waitFor();
      await expect(form.getByLabel('Last row').getAttribute('aria-invalid')).resolves.toBe('true');
      await form.getByLabel('Last row').fill('8');
      await form.getByRole('button', { name: 'Add to the planter' }).click();
      await form.getByText('Floating row cleaner was added to rows 1–8.').waitFor();
      await form.getByRole('button', { name: 'Close' }).click();

      // The toolbar: from the bar itself.
      await page.getByRole('button', { name: /^Main bar, 40 ft, rows 1–16: no toolbar parts$/ }).click();
      form = dialog(page);
      await form.getByRole('button', { name: 'Add a component to this toolbar' }).click();
      await form.getByLabel('Part from the catalog').selectOption({ label: 'KR-HC-100 · Row-drive controller module (per toolbar)' });
      await expect(form.getByLabel('One toolbar').isChecked()).resolves.toBe(true);
      await form.getByRole('button', { name: 'Add to the planter' }).click();
      await form.getByText(/Row-drive controller module was added to Main bar/).waitFor();
      await form.getByRole('button', { name: 'Close' }).click();

      await expect(nameOf(page, 5)).resolves.toBe('Row 5: Floating row cleaner; Vacuum seed meter, standard disc');
      await expect(nameOf(page, 8)).resolves.toContain('Floating row cleaner');
      await expect(nameOf(page, 9)).resolves.toBe('Row 9: Vacuum seed meter, standard disc');
      await expect(nameOf(page, 12)).resolves.not.toContain('Floating row cleaner');
      await page.getByRole('button', { name: 'Main bar, 40 ft, rows 1–16: Row-drive controller module' }).waitFor();
      // Mixed rows read as two set-ups.
      await expect(page.locator('section[aria-labelledby="row-setups"]').innerText()).resolves.toMatch(/Rows 1–8[\s\S]*Rows 9–16/);
      await page.screenshot({ path: shot('planter-drawing'), fullPage: true });

      // Keyboard: arrow to the next row, Enter opens its panel.
      await rowButton(page, 5).focus();
      await page.keyboard.press('ArrowRight');
      await expect(page.evaluate(() => document.activeElement?.getAttribute('data-row'))).resolves.toBe('6');
      await page.keyboard.press('Enter');
      form = dialog(page);
      await form.getByRole('heading', { name: 'Row 6', exact: true }).waitFor();
      await form.getByText('KR-RC-120 · Row cleaner').waitFor();
      await form.getByText('KR-SM-110 · Seed meter').waitFor();
      await page.screenshot({ path: shot('side-panel') });
      await page.keyboard.press('Escape');
      await expect(dialog(page).count()).resolves.toBe(0);

      // A photo of the planter: a real PNG (a crop of this very page).
      const photo = await page.screenshot({ clip: { x: 300, y: 200, width: 320, height: 240 } });
      await page.getByLabel('Attach a photo or document to 16-row planter').setInputFiles({ name: 'planter-in-the-yard.png', mimeType: 'image/png', buffer: photo });
      await page.getByRole('img', { name: 'Photo: planter-in-the-yard.png' }).waitFor();
      await expect(page.getByRole('img', { name: 'Photo: planter-in-the-yard.png' }).getAttribute('width')).resolves.toBe('144');
    } finally {
      await page.context().close();
    }
  }, 180_000);

  it('when the page is reloaded, then the parts, the drawing, the history, the photo and the record of changes are all still there', async () => {
    const page = await signIn('specialist');
    try {
      await page.goto(planterUrl);
      await page.reload();
      await page.getByRole('heading', { level: 1, name: '16-row planter' }).waitFor();
      await expect(nameOf(page, 1)).resolves.toBe('Row 1: Floating row cleaner; Vacuum seed meter, standard disc');
      await expect(nameOf(page, 16)).resolves.toBe('Row 16: Vacuum seed meter, standard disc');
      await page.getByRole('button', { name: 'Main bar, 40 ft, rows 1–16: Row-drive controller module' }).waitFor();
      const history = page.locator('#history');
      await expect(history.getByText(/^Installed$/).count()).resolves.toBe(3);
      await expect(history.innerText()).resolves.toMatch(/Floating row cleaner on rows 1–8/);
      await expect(history.innerText()).resolves.toMatch(/WO-2026-0412/);
      await page.getByRole('img', { name: 'Photo: planter-in-the-yard.png' }).waitFor();
      // The thumbnail really loads (served to someone allowed to see the planter).
      await page.waitForFunction(() => {
        const img = document.querySelector<HTMLImageElement>('img[alt="Photo: planter-in-the-yard.png"]');
        return Boolean(img && img.complete && img.naturalWidth > 0);
      });

      await page.goto(accountUrl);
      await page.getByRole('heading', { level: 1, name: accountName }).waitFor();
      await expect(page.locator('#planters').innerText()).resolves.toMatch(/3\s+components installed/);
      await expect(page.locator('#tractors').innerText()).resolves.toMatch(/Planting tractor[\s\S]*55 gpm[\s\S]*3,000 psi[\s\S]*310 hp/);
      const changes = page.locator('#changes');
      await changes.getByText(/Added planter 16-row planter \(16 × 30 in\)/).waitFor();
      await changes.getByText(/Installed Floating row cleaner \(KR-RC-120\) on rows 1–8/).waitFor();
      await changes.getByText(/Attached planter-in-the-yard\.png/).waitFor();
      await expect(changes.innerText()).resolves.toMatch(/Jonah Peltier-Rusk/);
      await page.screenshot({ path: shot('account-after'), fullPage: true });
    } finally {
      await page.context().close();
    }
  }, 120_000);

  it('when someone else saves the tractor first, then saving the old version is refused with a reload offer and nothing is overwritten', async () => {
    const page = await signIn('specialist');
    try {
      await page.goto(accountUrl);
      await page.getByRole('button', { name: 'Edit Planting tractor' }).click();
      await dialog(page).getByLabel('Remote valves').fill('6');

      // Meanwhile, on another device, the manager changes the same tractor.
      const other = await signedIn(app.server.url, { email: 'manager@rowpath.test' }, DEMO_PASSWORD);
      const accountId = Number(accountUrl.split('/').pop());
      const tractor = (await other.get(`/api/accounts/${accountId}`)).body.account.tractors[0];
      expect((await other.patch(`/api/tractors/${tractor.id}`, { remoteValves: 5, version: tractor.version })).status).toBe(200);

      await dialog(page).getByRole('button', { name: 'Save tractor' }).click();
      await dialog(page).getByText(/Someone else changed this record since you opened it/).waitFor();
      await page.screenshot({ path: shot('stale-save') });
      expect((await other.get(`/api/accounts/${accountId}`)).body.account.tractors[0].remoteValves).toBe(5);

      await dialog(page).getByRole('button', { name: 'Reload the latest version' }).click();
      await expect.poll(() => dialog(page).getByLabel('Remote valves').inputValue()).toBe('5');
    } finally {
      await page.context().close();
    }
  }, 120_000);

  it('when planters of 4, 31 (split-row, two bars) and 48 rows are opened, then every row unit is drawn and reachable, at 1280 px and on a tablet', async () => {
    const api = await signedIn(app.server.url, { email: 'specialist@rowpath.test' }, DEMO_PASSWORD);
    const accountId = Number(accountUrl.split('/').pop());
    const meter = (await api.get('/api/components?q=KR-SM-110')).body.items[0];
    const body = (name: string, rows: number, spacing: number, toolbars: object[]) => ({
      name, maker: null, modelYear: 2020, rows, rowSpacingIn: spacing, frameType: 'rigid', foldType: 'none', seedSupplyType: 'central-fill',
      seedCapacityUnits: null, liquidTankCount: 0, liquidTankGallons: 0, dryCapacityLb: 0, markers: false, acresPerYear: null, tractorId: null, farmSiteId: null, toolbars,
    });
    const made: Record<string, number> = {};
    for (const [name, rows, spacing, toolbars] of [
      ['4-row garden planter', 4, 30, [{ name: 'Bar', sizeFt: 10, firstRow: 1, lastRow: 4 }]],
      ['31-row split-row planter', 31, 15, [{ name: 'Front bar', sizeFt: 39, firstRow: 1, lastRow: 16 }, { name: 'Rear bar', sizeFt: 39, firstRow: 17, lastRow: 31 }]],
      ['48-row planter', 48, 30, [{ name: 'Main bar', sizeFt: 120, firstRow: 1, lastRow: 48 }]],
    ] as const) {
      const res = await api.post(`/api/accounts/${accountId}/planters`, body(name, rows, spacing, [...toolbars]));
      expect(res.status).toBe(201);
      made[name] = res.body.planter.id;
      expect((await api.post(`/api/planters/${made[name]}/installs`, { componentId: meter.id, scope: 'all-rows' })).status).toBe(201);
    }

    const page = await signIn('specialist');
    try {
      for (const [name, rows] of [['4-row garden planter', 4], ['31-row split-row planter', 31], ['48-row planter', 48]] as const) {
        await page.goto(`${app.server.url}/planters/${made[name]}`);
        await page.getByRole('heading', { level: 1, name }).waitFor();
        await expect(page.getByRole('button', { name: /^Row \d+: Vacuum seed meter/ }).count()).resolves.toBe(rows);
        // The last row can be reached and opened from the keyboard, even when the drawing scrolls.
        await rowButton(page, 1).focus();
        await page.keyboard.press('End');
        await expect(page.evaluate(() => document.activeElement?.getAttribute('data-row'))).resolves.toBe(String(rows));
        await page.keyboard.press('Enter');
        await dialog(page).getByRole('heading', { name: `Row ${rows}`, exact: true }).waitFor();
        await page.keyboard.press('Escape');
      }
      await page.goto(`${app.server.url}/planters/${made['31-row split-row planter']}`);
      await rowButton(page, 31).waitFor();
      await expect(page.getByRole('button', { name: /^(Front|Rear) bar, 39 ft/ }).count()).resolves.toBe(2);
      await page.screenshot({ path: shot('planter-split-row'), fullPage: true });
      await page.goto(`${app.server.url}/planters/${made['48-row planter']}`);
      await rowButton(page, 48).waitFor();
      await page.screenshot({ path: shot('planter-48-rows'), fullPage: true });
      await page.goto(`${app.server.url}/planters/${made['4-row garden planter']}`);
      await rowButton(page, 4).waitFor();
      await page.screenshot({ path: shot('planter-4-rows') });
    } finally {
      await page.context().close();
    }

    const tablet = await signIn('specialist', { width: 820, height: 1180 });
    try {
      await tablet.goto(planterUrl);
      await rowButton(tablet, 16).waitFor();
      await tablet.screenshot({ path: shot('planter-tablet'), fullPage: true });
      await rowButton(tablet, 2).click();
      await dialog(tablet).getByRole('heading', { name: 'Row 2', exact: true }).waitFor();
      await tablet.screenshot({ path: shot('side-panel-tablet') });
    } finally {
      await tablet.context().close();
    }
  }, 180_000);

  it('when staff open the planter list and the catalog, then they find the planter; specialists read the catalog and managers can edit it', async () => {
    const specialist = await signIn('specialist');
    try {
      await specialist.goto(`${app.server.url}/planters`);
      await specialist.getByLabel('Search planters').fill(accountName);
      await specialist.waitForURL(/q=/);
      await specialist.getByRole('link', { name: accountName }).first().waitFor();
      // The search reaches the server after a pause; until then the unfiltered page stays on screen.
      await expect.poll(() => specialist.getByRole('link', { name: '16-row planter' }).count(), { timeout: 15_000 }).toBe(1);

      await specialist.goto(`${app.server.url}/catalog`);
      await specialist.getByRole('heading', { level: 1, name: 'Component catalog' }).waitFor();
      await specialist.getByRole('cell', { name: 'KR-SM-110', exact: true }).waitFor();
      await expect(specialist.getByRole('button', { name: 'Add a component' }).count()).resolves.toBe(0);
      await expect(specialist.getByRole('button', { name: /^Edit KR-/ }).count()).resolves.toBe(0);
      await specialist.getByLabel('Category').selectOption('row-cleaner');
      await specialist.waitForURL(/category=row-cleaner/);
      await specialist.getByRole('cell', { name: 'KR-RC-120', exact: true }).waitFor();
      await expect.poll(() => specialist.getByRole('cell', { name: 'KR-SM-110', exact: true }).count()).toBe(0);
    } finally {
      await specialist.context().close();
    }

    const manager = await signIn('manager');
    try {
      await manager.goto(`${app.server.url}/catalog`);
      await manager.getByRole('cell', { name: 'KR-SM-110', exact: true }).waitFor();
      await manager.waitForLoadState('networkidle');
      await manager.screenshot({ path: shot('catalog'), fullPage: true });
      await manager.getByRole('button', { name: 'Edit KR-SM-110' }).click();
      await dialog(manager).getByLabel('Price (USD)').fill('');
      await dialog(manager).getByRole('button', { name: 'Save component' }).click();
      await dialog(manager).getByText('Price must be a number').waitFor();
      await dialog(manager).getByLabel('Price (USD)').fill('395');
      await dialog(manager).getByRole('button', { name: 'Save component' }).click();
      await manager.getByText('KR-SM-110 Vacuum seed meter, standard disc was saved.').waitFor();
      await expect(manager.getByRole('row', { name: /KR-SM-110/ }).innerText()).resolves.toMatch(/\$395\.00/);
    } finally {
      await manager.context().close();
    }
  }, 150_000);
});

describe('CSV import and export of accounts', () => {
  it('when a file with a bad line is previewed, then every bad line is listed and nothing is imported; a corrected file imports whole; the export downloads', async () => {
    const page = await signIn('specialist');
    const name = `Imported Test Farms ${uid()}`;
    try {
      await page.goto(`${app.server.url}/accounts`);
      await page.getByRole('button', { name: 'Import CSV' }).click();
      const panel = dialog(page);
      const bad = [
        'account_name,territory,town,state,acres_corn,contact_name,contact_email',
        `${name},Republican Bend,Mankato,KS,900,Ada Test,ada@growers.rowpath.test`,
        `Second ${name},No Such Territory,Jewell,KS,lots,,`,
      ].join('\r\n');
      await panel.getByLabel('CSV file').setInputFiles({ name: 'accounts-bad.csv', mimeType: 'text/csv', buffer: Buffer.from(bad) });
      await panel.getByText('1 line has problems').waitFor();
      const problems = panel.getByRole('table', { name: /Problems to fix/ });
      await expect(problems.innerText()).resolves.toMatch(/3\s+territory\s+No territory is named "No Such Territory"/);
      await expect(problems.innerText()).resolves.toMatch(/3\s+acres_corn/);
      await expect(panel.getByRole('button', { name: /^Import \d/ }).count()).resolves.toBe(0);
      await page.screenshot({ path: shot('csv-import-errors') });

      const good = [bad.split('\r\n')[0], bad.split('\r\n')[1]].join('\r\n');
      await panel.getByLabel('CSV file').setInputFiles({ name: 'accounts-good.csv', mimeType: 'text/csv', buffer: Buffer.from(good) });
      await panel.getByText('Ready to import').waitFor();
      await panel.getByRole('button', { name: 'Import 1 account and 1 contact' }).click();
      await page.getByText('1 account was imported with 1 contact.').waitFor();

      await page.getByLabel('Search accounts').fill(name);
      await page.getByRole('link', { name }).click();
      await page.getByRole('heading', { level: 1, name }).waitFor();
      await page.locator('#contacts').getByText('ada@growers.rowpath.test').waitFor();

      await page.goto(`${app.server.url}/accounts?q=${encodeURIComponent(name)}`);
      const [download] = await Promise.all([page.waitForEvent('download'), page.getByRole('link', { name: 'Export CSV' }).click()]);
      const text = fs.readFileSync((await download.path())!, 'utf8');
      expect(text.split(/\r?\n/)[0]).toMatch(/account_name/);
      expect(text).toContain(name);
      expect(text).toContain('ada@growers.rowpath.test');
    } finally {
      await page.context().close();
    }
  }, 120_000);
});

describe('a grower reads their own fleet', () => {
  it('when the demo grower opens their account and a planter, then everything shows and nothing can be changed', async () => {
    const page = await signIn('grower', { width: 1024, height: 1366 });
    try {
      await page.getByRole('link', { name: 'See your account details' }).click();
      await page.waitForURL(/\/accounts\/\d+$/);
      await page.locator('#planters').getByRole('link').first().waitFor();
      for (const name of ['Edit account details', 'Add a planter', 'Add a tractor', 'Add a farm site', 'Add a contact']) {
        await expect(page.getByRole('button', { name }).count()).resolves.toBe(0);
      }
      await expect(page.getByRole('button', { name: /^(Edit|Delete) / }).count()).resolves.toBe(0);
      await expect(page.getByText('Attach a file').count()).resolves.toBe(0);
      await page.locator('#changes').waitFor();

      await page.locator('#planters').getByRole('link').first().click();
      await page.waitForURL(/\/planters\/\d+$/);
      await rowButton(page, 1).waitFor();
      await expect(page.getByRole('button', { name: 'Add a component' }).count()).resolves.toBe(0);
      await expect(page.getByRole('button', { name: 'Edit planter' }).count()).resolves.toBe(0);
      await rowButton(page, 1).click();
      const panel = dialog(page);
      await panel.getByRole('heading', { name: 'On row 1 now' }).waitFor();
      await panel.locator('li').first().waitFor();
      await expect(panel.getByRole('button', { name: /^(Add a component|Edit|Mark removed|Erase record)/ }).count()).resolves.toBe(0);
      await page.screenshot({ path: shot('grower-planter') });
    } finally {
      await page.context().close();
    }
  }, 120_000);
});
