// Web vitals of the built client, in Debian's Chromium (playwright-core) with the CPU slowed 4×
// through the DevTools protocol (Emulation.setCPUThrottlingRate), a cold cache on every load:
//   - the JavaScript the sign-in page and the home page load, recorded from the network and
//     gzipped here (level 9; the app serves files as built) — budget ≤ 200 kB for sign-in;
//   - Largest Contentful Paint of both pages (PerformanceObserver, the last candidate once the
//     page is quiet) — budget ≤ 2.5 s, the Core Web Vitals "good" threshold.
// The home page is the bench manager's, on the large data set (bench/api-latency.ts prepares it).
//   npx tsx bench/web-vitals.ts [runs]     (default 5 loads per page; the median is reported)
import path from 'node:path';
import zlib from 'node:zlib';
import { fileURLToPath } from 'node:url';
import type { Browser, Page } from 'playwright-core';
import { benchUsers, prepareLargeDatabase, startProofServer, type ProofServer } from './api-latency.js';
import type { BenchDatabase } from './lib.js';

const RUNS = Number(process.argv[2] ?? 5);
const CPU_SLOWDOWN = 4;
const LCP_BUDGET_MS = 2500;
const SIGN_IN_JS_BUDGET_KB = 200;
// The client is built into a folder of its own, so that other builds running at the same time
// cannot replace it half-way through.
process.env.CLIENT_DIST_DIR ??= '.data/dist-3620';

export interface PageVitals {
  page: string;
  lcpMs: number[];
  medianLcpMs: number;
  jsFiles: number;
  jsRawKb: number;
  jsGzipKb: number;
  lcpElement: string;
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/** One cold load of `url` at 4× CPU slowdown: LCP and every script the page fetched. */
async function loadOnce(browser: Browser, url: string, signIn?: { base: string; email: string; password: string }) {
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  try {
    if (signIn) {
      // The session cookie, taken as the browser would take it, before the measured load.
      const csrf = (await (await context.request.get(`${signIn.base}/api/auth/csrf`)).json()).token as string;
      const login = await context.request.post(`${signIn.base}/api/auth/login`, { data: { email: signIn.email, password: signIn.password }, headers: { 'x-csrf-token': csrf } });
      if (login.status() !== 200) throw new Error(`Sign-in for the home page failed: ${login.status()}`);
    }
    const page: Page = await context.newPage();
    const cdp = await context.newCDPSession(page);
    await cdp.send('Network.enable');
    await cdp.send('Network.setCacheDisabled', { cacheDisabled: true });
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN });
    const scripts = new Map<string, Buffer>();
    const pending: Promise<void>[] = [];
    page.on('response', (res) => {
      if (res.request().resourceType() !== 'script') return;
      pending.push(
        res
          .body()
          .then((b) => void scripts.set(res.url(), b))
          .catch(() => undefined),
      );
    });
    await page.goto(url, { waitUntil: 'load' });
    await page.waitForLoadState('networkidle');
    await page.waitForTimeout(1000); // late candidates (data that arrives after load) count too
    const lcp = await page.evaluate(
      () =>
        new Promise<{ startTime: number; element: string }>((resolve) => {
          new PerformanceObserver((list) => {
            const entries = list.getEntries() as (PerformanceEntry & { element?: Element | null })[];
            const last = entries[entries.length - 1];
            const el = last.element;
            resolve({ startTime: last.startTime, element: el ? `${el.tagName.toLowerCase()}${el.id ? `#${el.id}` : ''} "${(el.textContent ?? '').trim().slice(0, 40)}"` : '(gone)' });
          }).observe({ type: 'largest-contentful-paint', buffered: true });
          setTimeout(() => resolve({ startTime: Number.NaN, element: '(no LCP entry)' }), 3000);
        }),
    );
    await Promise.all(pending);
    const raw = [...scripts.values()].reduce((n, b) => n + b.length, 0);
    const gzip = [...scripts.values()].reduce((n, b) => n + zlib.gzipSync(b, { level: 9 }).length, 0);
    return { lcpMs: lcp.startTime, element: lcp.element, finalUrl: page.url(), jsFiles: scripts.size, jsRawKb: raw / 1024, jsGzipKb: gzip / 1024 };
  } finally {
    await context.close();
  }
}

export async function runWebVitals(opts: { runs?: number; log?: (line: string) => void } = {}): Promise<{ signIn: PageVitals; home: PageVitals; budgets: Record<string, boolean> }> {
  const log = opts.log ?? console.log;
  const runs = opts.runs ?? RUNS;
  const { ensureClientBuilt, clientDir } = await import('../server/boot.js');
  ensureClientBuilt(log);
  const { ensureChromium, launchChromium } = await import('../tests/helpers/chromium.js');
  ensureChromium();
  let db: BenchDatabase | null = null;
  let server: ProofServer | null = null;
  let browser: Browser | null = null;
  try {
    db = await prepareLargeDatabase(log);
    const { manager } = await benchUsers();
    server = await startProofServer(db.url, { clientDir: path.resolve(clientDir) });
    browser = await launchChromium();
    const pages: PageVitals[] = [];
    for (const [name, url, signIn] of [
      ['sign-in', `${server.url}/sign-in`, undefined],
      ['home', `${server.url}/`, { base: server.url, email: manager.email, password: manager.password }],
    ] as const) {
      await loadOnce(browser, url, signIn); // warm-up: the server's first answers, Chromium's start
      const loads = [];
      for (let i = 0; i < runs; i++) loads.push(await loadOnce(browser, url, signIn));
      if (name === 'home' && /sign-in/.test(loads[0].finalUrl)) throw new Error('The home page redirected to sign-in: the session did not hold.');
      pages.push({
        page: name,
        lcpMs: loads.map((l) => l.lcpMs),
        medianLcpMs: median(loads.map((l) => l.lcpMs)),
        jsFiles: loads[0].jsFiles,
        jsRawKb: loads[0].jsRawKb,
        jsGzipKb: loads[0].jsGzipKb,
        lcpElement: loads[loads.length - 1].element,
      });
    }
    const [signInPage, home] = pages;
    const budgets = {
      [`sign-in JS ≤ ${SIGN_IN_JS_BUDGET_KB} kB gzip`]: signInPage.jsGzipKb <= SIGN_IN_JS_BUDGET_KB,
      [`sign-in LCP ≤ ${LCP_BUDGET_MS} ms`]: signInPage.medianLcpMs <= LCP_BUDGET_MS,
      [`home LCP ≤ ${LCP_BUDGET_MS} ms`]: home.medianLcpMs <= LCP_BUDGET_MS,
    };
    log(`\nChromium, CPU slowed ${CPU_SLOWDOWN}× (CDP Emulation.setCPUThrottlingRate), cache disabled, ${runs} loads per page after a warm-up; median LCP`);
    log(`${'page'.padEnd(10)}${'JS files'.padStart(10)}${'JS raw kB'.padStart(11)}${'JS gzip kB'.padStart(12)}${'LCP ms (median)'.padStart(17)}   LCP of each load, ms; LCP element`);
    for (const p of pages) {
      log(`${p.page.padEnd(10)}${String(p.jsFiles).padStart(10)}${p.jsRawKb.toFixed(1).padStart(11)}${p.jsGzipKb.toFixed(1).padStart(12)}${p.medianLcpMs.toFixed(0).padStart(17)}   ${p.lcpMs.map((x) => x.toFixed(0)).join(', ')}; ${p.lcpElement}`);
    }
    for (const [budget, met] of Object.entries(budgets)) log(`${budget}: ${met ? 'met' : 'MISSED'}`);
    return { signIn: signInPage, home, budgets };
  } finally {
    await browser?.close();
    await server?.stop();
    await db?.close();
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const { signIn, home, budgets } = await runWebVitals();
  console.log(
    `BENCH-SUMMARY ${JSON.stringify({
      script: 'web-vitals',
      signInJsGzipKb: signIn.jsGzipKb,
      homeJsGzipKb: home.jsGzipKb,
      signInLcpMs: signIn.medianLcpMs,
      homeLcpMs: home.medianLcpMs,
      budgets,
    })}`,
  );
  process.exit(0);
}
