// The browser tests' shared set-up: the real `npm start` entry point with the demo data, on this
// file's own ports and data folder (so that e2e files can run side by side), plus one Chromium.
import fs from 'node:fs';
import type { Browser } from 'playwright-core';
import { afterAll, beforeAll } from 'vitest';
import { signedIn } from './app.js';
import { launchChromium } from './chromium.js';
import { startServer, type RunningServer } from './server-process.js';

export const DEMO_PASSWORD = 'rowpath-demo';
export type ApiClient = Awaited<ReturnType<typeof signedIn>>;

/**
 * The server's environment. E2E_PORT / E2E_DB_PORT override the file's default ports; `smtpPort`
 * gives the app its own SMTP stand-in (true: LOCAL_SMTP_PORT, or the HTTP port + 3).
 */
export function e2eEnv(defaults: { port: string; dbPort: string; smtpPort?: true | string }): Record<string, string> {
  const port = process.env.E2E_PORT ?? defaults.port;
  const env: Record<string, string> = {
    PORT: port,
    DB_PORT: process.env.E2E_DB_PORT ?? defaults.dbPort,
    ROWPATH_DATA_DIR: `.data/e2e-${port}`,
    CLIENT_DIST_DIR: `.data/dist-${port}`,
  };
  if (defaults.smtpPort === true) env.LOCAL_SMTP_PORT = process.env.LOCAL_SMTP_PORT ?? String(Number(port) + 3);
  else if (defaults.smtpPort) env.LOCAL_SMTP_PORT = defaults.smtpPort;
  return env;
}

export interface DemoApp {
  readonly env: Record<string, string>;
  /** Set in beforeAll; a test that restarts the app assigns the new one. */
  server: RunningServer;
  browser: Browser;
  /** A signed-in API client per demo user, for arranging and for checking the screen against the server. */
  apiAs(email: string): Promise<ApiClient>;
}

/** Starts the app (from an empty data folder unless `fresh` is false) and Chromium for this file. */
export function useDemoApp(env: Record<string, string>, options: { fresh?: boolean } = {}): DemoApp {
  const clients = new Map<string, ApiClient>();
  const app: DemoApp = {
    env,
    server: undefined as unknown as RunningServer,
    browser: undefined as unknown as Browser,
    async apiAs(email) {
      if (!clients.has(email)) clients.set(email, await signedIn(app.server.url, { email }, DEMO_PASSWORD));
      return clients.get(email)!;
    },
  };
  beforeAll(async () => {
    if (options.fresh !== false) fs.rmSync(env.ROWPATH_DATA_DIR, { recursive: true, force: true });
    app.server = await startServer(env);
    app.browser = await launchChromium();
  });
  afterAll(async () => {
    await app.browser?.close();
    await app.server?.stop();
  });
  return app;
}
