// From an empty data directory, the real start command brings up Rowpath with its demo data; each
// demo role signs in in Chromium and sees its own navigation; data survives a restart; and
// `npm run db:reset` rebuilds the demo.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { SCREENSHOT_DIR } from '../helpers/chromium.js';
import { client, signedIn, uid } from '../helpers/app.js';
import { startServer } from '../helpers/server-process.js';
import { navItemsByRole } from '../../src/app/layout/nav-items.js';
import { DEMO_PASSWORD, e2eEnv, useDemoApp } from '../helpers/demo-app.js';

const env = e2eEnv({ port: '3390', dbPort: '3391', smtpPort: process.env.E2E_SMTP_PORT ?? '3392' });
const app = useDemoApp(env);

// Each role must see exactly its own menu, and the differences that matter are pinned here too.
const expectedNav = Object.fromEntries(Object.entries(navItemsByRole).map(([role, items]) => [role, items.map((i) => i.label)]));
const mustSee: Record<string, string[]> = { admin: ['Users', 'Accounts'], manager: ['Accounts'], specialist: ['Accounts'], grower: ['My operation'] };
const mustNotSee: Record<string, string[]> = { admin: [], manager: ['Users'], specialist: ['Users'], grower: ['Accounts', 'Users', 'Catalog', 'Planters'] };

describe('first start and sign-in for every role', () => {
  it('when the start command runs on an empty data directory, then it creates the database and loads the demo', () => {
    expect(app.server.output()).toMatch(/Creating a MariaDB data directory/);
    expect(app.server.output()).toMatch(/loading the demo dealership/);
    expect(app.server.output()).toContain(DEMO_PASSWORD);
  });

  for (const role of ['admin', 'manager', 'specialist', 'grower'] as const) {
    it(`when the demo ${role} signs in, then the ${role}'s own navigation and home page show`, async () => {
      const context = await app.browser.newContext({ viewport: { width: 1280, height: 800 } });
      const page = await context.newPage();
      try {
        await page.goto(`${app.server.url}/`);
        await page.waitForURL(/\/sign-in/);
        await page.getByLabel(/e-?mail/i).fill(`${role}@rowpath.test`);
        await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
        await page.getByRole('button', { name: /sign in/i }).click();
        const nav = page.getByRole('navigation', { name: 'Main' });
        await nav.waitFor();
        await page.waitForLoadState('networkidle');
        const links = (await nav.getByRole('link').allInnerTexts()).map((s) => s.trim()).filter(Boolean);
        expect(links).toEqual(expectedNav[role]);
        for (const label of mustSee[role]) expect(links).toContain(label);
        for (const label of mustNotSee[role]) expect(links).not.toContain(label);
        await page.screenshot({ path: path.join(SCREENSHOT_DIR, `foundation-home-${role}.png`), fullPage: true });
      } finally {
        await context.close();
      }
    });
  }

  it('when a signed-in user opens a page that does not exist, then the 404 page shows inside the app', async () => {
    const page = await app.browser.newPage();
    await page.goto(`${app.server.url}/sign-in`);
    await page.getByLabel(/e-?mail/i).fill('specialist@rowpath.test');
    await page.getByLabel(/password/i).fill(DEMO_PASSWORD);
    await page.getByRole('button', { name: /sign in/i }).click();
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await page.goto(`${app.server.url}/no-such-page`);
    await page.getByRole('navigation', { name: 'Main' }).waitFor();
    await expect(page.getByText(/not found|no page|doesn.t exist/i).first().isVisible()).resolves.toBe(true);
    await page.screenshot({ path: path.join(SCREENSHOT_DIR, 'foundation-404.png') });
    await page.close();
  });
});

describe('restart and reset', () => {
  it('when the app is stopped and started again, then data entered before is still there', async () => {
    const admin = await signedIn(app.server.url, { email: 'admin@rowpath.test' }, DEMO_PASSWORD);
    const email = `kept-${uid()}@rowpath.test`;
    const created = await admin.post('/api/admin/users', { email, name: 'Kept Across Restart', role: 'admin', password: 'long-enough-pass' });
    expect(created.status).toBe(201);

    const stopped = await app.server.stop();
    expect(stopped.code).toBe(0);
    expect(stopped.output).toMatch(/stopped cleanly/);
    app.server = await startServer(env);
    expect(app.server.output()).not.toMatch(/loading the demo dealership/);
    expect((await client(app.server.url).signIn(email, 'long-enough-pass')).status).toBe(200);

    await app.server.stop();
    const reset = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db-reset.ts'], { env: { ...process.env, ...env }, encoding: 'utf8' });
    expect(reset.status, reset.stdout + reset.stderr).toBe(0);
    app.server = await startServer(env);
    expect((await client(app.server.url).signIn(email, 'long-enough-pass')).status).toBe(401);
    expect((await client(app.server.url).signIn('admin@rowpath.test', DEMO_PASSWORD)).status).toBe(200);
  });
});
