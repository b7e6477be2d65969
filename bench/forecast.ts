// Forecast endpoint benchmark. Its own MariaDB (port 3449, data in .data/bench-forecast) holding the
// large data set (seeders/large.ts) plus 30,000 roadmap items (seeders/large-roadmap.ts); the app
// runs in a child process and autocannon drives it from this one, 10 s at 10 connections per
// route, signed in as the manager of the benchmark territory (who sees every item), beside a bare
// JSON route that touches neither session nor database and a signed-in GET /api/auth/me (the floor
// every signed-in request pays: session row and user). Target: forecast p95 ≤ 150 ms.
// Each forecast route runs twice: as the app ships (aggregate cache on, see
// server/modules/forecast/forecast-cache.ts) and with the cache off (every request runs the SQL).
//
//   npx tsx bench/forecast.ts           reuse the data when it is already there
//   npx tsx bench/forecast.ts --fresh   rebuild the database first (about a minute)
//
// p50/p95/p99 are exact percentiles of every response time autocannon recorded during the run (its
// 'response' event); autocannon's own summary has no p95, so its p97.5 is printed beside it.
import { spawn, type ChildProcess } from 'node:child_process';
import os from 'node:os';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import bcrypt from 'bcryptjs';
import express from 'express';
import { QueryTypes, type Sequelize } from 'sequelize';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { startLocalMariaDb } from '../server/db/local-mariadb.js';
import { migrateUp } from '../server/db/migrate.js';
import { initModels, Territory, User, UserTerritory } from '../server/db/models/index.js';
import { createSequelize } from '../server/db/sequelize.js';
import { configureForecastCache } from '../server/modules/forecast/forecast-cache.js';
import { seedLarge } from '../seeders/large.js';
import { seedLargeRoadmap } from '../seeders/large-roadmap.js';

const DB_PORT = 3449;
const BASE_DIR = '.data/bench-forecast';
const ROADMAP_ITEMS = 30_000;
const DURATION_S = 10;
const CONNECTIONS = 10;
const TARGET_P95_MS = 150;
const PASSWORD = 'bench-forecast-password';
const MANAGER_EMAIL = 'bench-manager@rowpath.test';
const SPECIALISTS = 6;

const self = fileURLToPath(import.meta.url);

if (process.argv.includes('--serve')) await serve();
else await main();

/** Child process: the real app plus one bare route, on an ephemeral loopback port. */
async function serve() {
  const sequelize = createSequelize(process.env.BENCH_DATABASE_URL!);
  initModels(sequelize);
  if (process.argv.includes('--no-cache')) configureForecastCache({ ttlMs: 0 });
  const config = loadConfig({ ...process.env, NODE_ENV: 'development', ROWPATH_DATA_DIR: `${BASE_DIR}/app`, LOG_LEVEL: 'warn' });
  const outer = express();
  outer.get('/bench/bare', (_req, res) => res.json({ ok: true }));
  outer.use(createApp({ sequelize, config }));
  const server = outer.listen(0, '127.0.0.1', () => {
    const address = server.address();
    console.log(`BENCH_READY ${typeof address === 'object' && address ? address.port : 0}`);
  });
  process.on('SIGTERM', () => server.close(() => sequelize.close().then(() => process.exit(0))));
}

async function main() {
  const db = await startLocalMariaDb({ baseDir: BASE_DIR, port: DB_PORT, database: 'rowpath_bench', log: (l) => console.log(l) });
  const sequelize = createSequelize(db.url);
  initModels(sequelize);
  let child: ChildProcess | null = null;
  try {
    await prepareData(sequelize, process.argv.includes('--fresh'));
    const counts = await sequelize.query<{ accounts: number; planters: number; installs: number; items: number }>(
      'SELECT (SELECT COUNT(*) FROM accounts) AS accounts, (SELECT COUNT(*) FROM planters) AS planters, (SELECT COUNT(*) FROM installs) AS installs, (SELECT COUNT(*) FROM roadmap_items) AS items',
      { type: QueryTypes.SELECT },
    );
    console.log(`Data: ${counts[0].accounts} accounts, ${counts[0].planters} planters, ${counts[0].installs} installs, ${counts[0].items} roadmap items.`);

    // Others' work on the same machine skews every figure: the load average is printed beside them.
    const loadAverage = () => os.loadavg().map((l) => l.toFixed(2)).join(' ');
    console.log(`\nautocannon: ${DURATION_S} s, ${CONNECTIONS} connections per route, server in a child process on the same ${os.cpus().length}-core machine; load average at start ${loadAverage()}`);
    console.log(`${'route'.padEnd(52)}${'req/s'.padStart(8)}${'p50 ms'.padStart(9)}${'p95 ms'.padStart(9)}${'p97.5 ms'.padStart(10)}${'p99 ms'.padStart(9)}${'non-2xx'.padStart(9)}`);
    const results: { name: string; p95: number }[] = [];
    for (const mode of ['cache on', 'cache off'] as const) {
      const started = await startChild(db.url, mode === 'cache off');
      child = started.child;
      const base = `http://127.0.0.1:${started.port}`;
      const cookie = await signIn(base, MANAGER_EMAIL);
      const routes = [
        ...(mode === 'cache on'
          ? [
              { name: 'bare JSON route (no session, no database)', path: '/bench/bare', auth: false },
              { name: 'signed-in GET /api/auth/me (session + user)', path: '/api/auth/me', auth: true, baseline: true },
            ]
          : []),
        { name: `forecast groupBy=category&season=2027, ${mode}`, path: '/api/forecast?groupBy=category&season=2027', auth: true },
        { name: `forecast groupBy=month, ${mode}`, path: '/api/forecast?groupBy=month', auth: true },
      ];
      for (const r of routes) {
        const probe = await fetch(base + r.path, { headers: r.auth ? { cookie } : {} });
        const body = (await probe.json()) as { rows?: unknown[]; totals?: { itemCount: number } };
        if (probe.status !== 200) throw new Error(`${r.path} answered ${probe.status}: ${JSON.stringify(body)}`);
        await load(base + r.path, r.auth ? cookie : undefined, 2); // warm-up: pools, caches, JIT
        const run = await load(base + r.path, r.auth ? cookie : undefined, DURATION_S);
        if (r.auth && !('baseline' in r)) results.push({ name: r.name, p95: run.p95 });
        console.log(
          `${r.name.padEnd(52)}${run.rps.toFixed(0).padStart(8)}${run.p50.toFixed(1).padStart(9)}${run.p95.toFixed(1).padStart(9)}${run.p975.toFixed(1).padStart(10)}${run.p99.toFixed(1).padStart(9)}${String(run.non2xx).padStart(9)}` +
            (body.rows ? `   (${body.rows.length} rows over ${body.totals!.itemCount} items)` : ''),
        );
      }
      await stopChild(child);
      child = null;
    }
    console.log(`load average at end ${loadAverage()}`);
    console.log('\np95: exact 95th percentile (nearest rank) of every response time recorded in the run (autocannon "response" events).');
    for (const r of results) {
      console.log(`${r.name}: p95 ${r.p95.toFixed(1)} ms — ${r.p95 <= TARGET_P95_MS ? 'meets' : 'MISSES'} the target of ≤ ${TARGET_P95_MS} ms`);
    }
  } finally {
    if (child) await stopChild(child);
    await sequelize.close();
    await db.stop();
  }
}

/** Builds the data set once; later runs reuse it unless --fresh is given. */
async function prepareData(sequelize: Sequelize, fresh: boolean) {
  if (fresh) {
    console.log('Dropping every table (--fresh)…');
    await sequelize.getQueryInterface().dropAllTables();
  }
  await migrateUp(sequelize);
  const [{ bench, items }] = await sequelize.query<{ bench: number; items: number }>(
    "SELECT (SELECT COUNT(*) FROM accounts WHERE name LIKE 'Bench%') AS bench, (SELECT COUNT(*) FROM roadmap_items) AS items",
    { type: QueryTypes.SELECT },
  );
  if (Number(bench) > 0 && Number(items) >= ROADMAP_ITEMS) {
    console.log('Reusing the benchmark data already in the database (pass --fresh to rebuild).');
    return;
  }
  if (Number(bench) > 0 || Number(items) > 0) {
    console.log('Partial data found: rebuilding.');
    await sequelize.getQueryInterface().dropAllTables();
    await migrateUp(sequelize);
  }
  const passwordHash = await bcrypt.hash(PASSWORD, 10);
  const territory = await Territory.create({ name: 'Benchmark territory', region: 'Synthetic' });
  const manager = await User.create({ email: MANAGER_EMAIL, name: 'Bench Manager', role: 'manager', passwordHash, accountId: null, lastSignInAt: null });
  await UserTerritory.create({ userId: manager.id, territoryId: territory.id });
  for (let i = 1; i <= SPECIALISTS; i++) {
    const s = await User.create({ email: `bench-specialist-${i}@rowpath.test`, name: `Bench Specialist ${i}`, role: 'specialist', passwordHash, accountId: null, lastSignInAt: null });
    await UserTerritory.create({ userId: s.id, territoryId: territory.id });
  }
  console.log('Adding the large data set…');
  await seedLarge(sequelize, () => undefined);
  console.log(`Adding ${ROADMAP_ITEMS} roadmap items…`);
  await seedLargeRoadmap(sequelize, ROADMAP_ITEMS);
  await sequelize.query('ANALYZE TABLE roadmap_items, accounts, components');
}

async function stopChild(child: ChildProcess) {
  if (child.exitCode !== null) return;
  const exited = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGTERM');
  await exited;
}

function startChild(databaseUrl: string, noCache: boolean): Promise<{ child: ChildProcess; port: number }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['--import', 'tsx', self, '--serve', ...(noCache ? ['--no-cache'] : [])], { env: { ...process.env, BENCH_DATABASE_URL: databaseUrl }, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    const onData = (d: Buffer) => {
      output += d.toString();
      const m = output.match(/BENCH_READY (\d+)/);
      if (m) resolve({ child, port: Number(m[1]) });
    };
    child.stdout!.on('data', onData);
    child.stderr!.on('data', (d: Buffer) => (output += d.toString()));
    child.on('exit', (code) => {
      if (!/BENCH_READY/.test(output)) reject(new Error(`bench server exited (${code}):\n${output}`));
    });
  });
}

/** Signs in through the real endpoints and returns the session cookie. */
async function signIn(base: string, email: string): Promise<string> {
  const csrfRes = await fetch(`${base}/api/auth/csrf`);
  const { token } = (await csrfRes.json()) as { token: string };
  const first = (csrfRes.headers.get('set-cookie') ?? '').split(';')[0];
  const login = await fetch(`${base}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', 'x-csrf-token': token, cookie: first },
    body: JSON.stringify({ email, password: PASSWORD }),
  });
  if (login.status !== 200) throw new Error(`bench sign-in failed: ${login.status} ${await login.text()}`);
  return (login.headers.get('set-cookie') ?? first).split(';')[0];
}

function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const rank = Math.ceil((p / 100) * sorted.length) - 1; // nearest-rank method
  return sorted[Math.min(sorted.length - 1, Math.max(0, rank))];
}

async function load(url: string, cookie: string | undefined, durationS: number) {
  const times: number[] = [];
  let non2xx = 0;
  // Without a callback autocannon returns its run instance, which is also a promise of the summary.
  const instance = autocannon({ url, connections: CONNECTIONS, duration: durationS, headers: cookie ? { cookie } : {} }) as unknown as autocannon.Instance & PromiseLike<autocannon.Result>;
  instance.on('response', (_client: unknown, statusCode: number, _bytes: number, responseTimeMs: number) => {
    times.push(responseTimeMs);
    if (statusCode < 200 || statusCode >= 300) non2xx += 1;
  });
  const result = await instance;
  times.sort((a, b) => a - b);
  return {
    rps: times.length / durationS,
    p50: percentile(times, 50),
    p95: percentile(times, 95),
    p99: percentile(times, 99),
    p975: result.latency.p97_5,
    non2xx,
  };
}
