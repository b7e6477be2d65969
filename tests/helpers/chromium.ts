import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';

export const CHROMIUM = '/usr/bin/chromium';

/** Installs Debian's chromium for the browser tests when it is missing and we are root. */
export function ensureChromium() {
  if (fs.existsSync(CHROMIUM)) return;
  if (process.getuid?.() !== 0) {
    console.warn('Chromium is missing: install it with "sudo apt-get install -y chromium" to run the browser tests.');
    return;
  }
  console.log("Installing Debian's chromium for the browser tests…");
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (spawnSync('apt-get', ['install', '-y', '--no-install-recommends', 'chromium'], { stdio: 'inherit', env }).status !== 0) {
    spawnSync('apt-get', ['update'], { stdio: 'inherit', env });
    spawnSync('apt-get', ['install', '-y', '--no-install-recommends', 'chromium'], { stdio: 'inherit', env });
  }
}

export async function launchChromium() {
  const { chromium } = await import('playwright-core');
  // launch() gives every run a fresh, throw-away profile of its own.
  const browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
  return browser;
}

export const SCREENSHOT_DIR = path.resolve('test-results/screenshots');
fs.mkdirSync(SCREENSHOT_DIR, { recursive: true });
