// API latency on the large data set: p50/p95 of the API's GET routes beside a bare JSON route
// (no session, no database), measured in one run so that the ratio means something on a shared
// machine. The routes come from the running app (server/modules/openapi/discover.ts) and their
// queries from the route registry's examples, so a GET route added later is measured too.
// Its own MariaDB (127.0.0.1:3629, data in .data/bench-proof) holding seeders/large.ts (2,000
// accounts, 6,000 planters, 60,000 installs) and 10,000 roadmap items; the app runs in a child
// process so that autocannon and the server do not share one event loop.
//   npx tsx bench/api-latency.ts              every GET route, 2 s each after a 0.5 s warm-up
//   npx tsx bench/api-latency.ts --main       the main routes only, 5 s each
//   BENCH_CONNECTIONS=10 BENCH_SECONDS=3 …    other load or duration
import { fork, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import express from 'express';
import { Op, QueryTypes } from 'sequelize';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { Account, initModels, Planter, Territory, User, UserTerritory } from '../server/db/models/index.js';
import { createSequelize } from '../server/db/sequelize.js';
import { discoverApiRoutes, routeKey } from '../server/modules/openapi/discover.js';
import { exampleFor } from '../server/modules/openapi/examples.js';
import { ROUTES } from '../server/modules/openapi/registry.js';
import { LARGE, seedLarge } from '../seeders/large.js';
import { seedLargeRoadmap } from '../seeders/large-roadmap.js';
import { ensureBenchUser, measure, signIn, startBenchDatabase, type BenchDatabase, type Measurement, type Session } from './lib.js';

export const PROOF_DB_PORT = Number(process.env.BENCH_PROOF_DB_PORT ?? 3629);
export const PROOF_BASE_DIR = '.data/bench-proof';
const ROADMAP_ITEMS = 10_000;
export const ADMIN_EMAIL = 'bench-proof-admin@rowpath.test';
export const MANAGER_EMAIL = 'bench-proof-manager@rowpath.test';
const self = fileURLToPath(import.meta.url);

/** The benchmark database with the large data set (made once, reused afterwards). */
export async function prepareLargeDatabase(log: (line: string) => void = console.log): Promise<BenchDatabase> {
  const db = await startBenchDatabase({ port: PROOF_DB_PORT, baseDir: PROOF_BASE_DIR, database: 'rowpath_proof', log });
  const seeded = await Account.count({ where: { name: { [Op.like]: 'Bench%' } } });
  if (seeded < LARGE.accounts) {
    log('Seeding the large data set (about a minute, once)…');
    if ((await Territory.count()) === 0) await Territory.bulkCreate([{ name: 'Benchmark north', region: 'Synthetic' }, { name: 'Benchmark south', region: 'Synthetic' }]);
    await seedLarge(db.sequelize, log);
  }
  const [{ items }] = await db.sequelize.query<{ items: number }>('SELECT COUNT(*) AS items FROM roadmap_items', { type: QueryTypes.SELECT });
  if (Number(items) < ROADMAP_ITEMS) await seedLargeRoadmap(db.sequelize, ROADMAP_ITEMS - Number(items), log);
  return db;
}

/** A manager of every territory (sees everything, as the forecast's main reader) and an admin. */
export async function benchUsers() {
  const admin = await ensureBenchUser('admin', ADMIN_EMAIL);
  const manager = await ensureBenchUser('manager', MANAGER_EMAIL);
  const user = await User.findOne({ where: { email: MANAGER_EMAIL } });
  for (const t of await Territory.findAll({ attributes: ['id'] })) await UserTerritory.findOrCreate({ where: { userId: user!.id, territoryId: t.id } });
  return { admin, manager };
}

export async function dataCounts(db: BenchDatabase) {
  const [c] = await db.sequelize.query<{ accounts: number; planters: number; installs: number; items: number }>(
    'SELECT (SELECT COUNT(*) FROM accounts) AS accounts, (SELECT COUNT(*) FROM planters) AS planters, (SELECT COUNT(*) FROM installs) AS installs, (SELECT COUNT(*) FROM roadmap_items) AS items',
    { type: QueryTypes.SELECT },
  );
  return `${c.accounts} accounts, ${c.planters} planters, ${c.installs} installs, ${c.items} roadmap items`;
}

export interface ProofServer {
  url: string;
  pid: number;
  child: ChildProcess;
  /** Memory samples the child sends (every `memoryEveryMs`, after a full GC). */
  memory: { atMs: number; rssMb: number; heapUsedMb: number }[];
  /** Date.now() when the child was started (memory atMs counts from here). */
  startedAt: number;
  stop(): Promise<void>;
}

/** The real app plus GET /bench/bare in a child process on an ephemeral loopback port. */
export async function startProofServer(databaseUrl: string, opts: { memoryEveryMs?: number; clientDir?: string } = {}): Promise<ProofServer> {
  const child = fork(self, ['--serve'], {
    execArgv: ['--import', 'tsx', '--expose-gc'],
    env: { ...process.env, BENCH_DATABASE_URL: databaseUrl, BENCH_SESSION_SECRET: randomBytes(32).toString('hex'), BENCH_MEMORY_EVERY_MS: String(opts.memoryEveryMs ?? 0), BENCH_CLIENT_DIR: opts.clientDir ?? '' },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  const memory: ProofServer['memory'] = [];
  const started = Date.now();
  const url = await new Promise<string>((resolve, reject) => {
    child.on('message', (m: { url?: string; rssMb?: number; heapUsedMb?: number }) => {
      if (m.url) resolve(m.url);
      if (m.rssMb !== undefined) memory.push({ atMs: Date.now() - started, rssMb: m.rssMb, heapUsedMb: m.heapUsedMb! });
    });
    child.once('exit', (code) => reject(new Error(`The benchmark app exited (${code}) before listening`)));
  });
  return {
    url,
    pid: child.pid!,
    child,
    memory,
    startedAt: started,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}

async function serve() {
  const config = loadConfig({
    NODE_ENV: 'production',
    DATABASE_URL: process.env.BENCH_DATABASE_URL,
    ROWPATH_DATA_DIR: `${PROOF_BASE_DIR}/app`,
    SESSION_SECRET: process.env.BENCH_SESSION_SECRET,
    LOG_LEVEL: 'warn',
    // The load run signs in from one address many times over its life.
    LOGIN_MAX_FAILURES_PER_IP: '1000',
  });
  const sequelize = createSequelize(config.DATABASE_URL!);
  initModels(sequelize);
  const outer = express();
  outer.disable('x-powered-by');
  outer.get('/bench/bare', (_req, res) => res.json({ ok: true }));
  // Errors are counted by the load generator; one line each here would flood the output.
  let logged = 0;
  outer.use(createApp({ sequelize, config, clientDir: process.env.BENCH_CLIENT_DIR || undefined, log: (msg, err) => void (logged++ < 5 && console.error(`[app] ${msg}: ${(err as Error)?.message ?? err}`)) }));
  const server = outer.listen(0, '127.0.0.1', () => {
    const address = server.address();
    process.send?.({ url: `http://127.0.0.1:${typeof address === 'object' && address ? address.port : 0}` });
  });
  const every = Number(process.env.BENCH_MEMORY_EVERY_MS ?? 0);
  if (every > 0) {
    const sample = () => {
      (globalThis as { gc?: () => void }).gc?.();
      const m = process.memoryUsage();
      process.send?.({ rssMb: m.rss / 1048576, heapUsedMb: m.heapUsed / 1048576 });
    };
    sample();
    setInterval(sample, every).unref();
  }
  process.on('SIGTERM', () => {
    server.close();
    server.closeAllConnections();
    void sequelize.close().finally(() => process.exit(0));
  });
}

export interface LatencyRow extends Measurement {
  label: string;
  ratioP95: number;
}

const MAIN = [
  'GET /api/auth/me',
  'GET /api/accounts',
  'GET /api/accounts/:id',
  'GET /api/planters',
  'GET /api/planters/:id',
  'GET /api/components',
  'GET /api/accounts/:id/roadmap',
  'GET /api/forecast',
  'GET /api/visits',
  'GET /api/map/accounts',
];

/** The GET routes to measure, with a concrete URL each (ids from the large data set). */
async function routesToMeasure(db: BenchDatabase, onlyMain: boolean): Promise<{ label: string; path: string }[]> {
  // An app built only to read its route list (never listening).
  const probe = createApp({ sequelize: db.sequelize, config: loadConfig({ NODE_ENV: 'test', DATABASE_URL: db.url, ROWPATH_DATA_DIR: `${PROOF_BASE_DIR}/app` }) });
  const docs = new Map(ROUTES.map((r) => [routeKey(r), r]));
  const account = await Account.findOne({ where: { name: { [Op.like]: 'Bench%' } }, order: [['id', 'ASC']], offset: 17 });
  const planter = await Planter.findOne({ where: { accountId: account!.id } });
  const ids: Record<string, number> = { account: account!.id, planter: planter!.id };
  const out: { label: string; path: string }[] = [];
  for (const route of discoverApiRoutes(probe)) {
    if (route.method !== 'get') continue;
    const doc = docs.get(routeKey(route));
    if (onlyMain && !MAIN.includes(routeKey(route))) continue;
    if (doc?.access === 'public' && route.path !== '/api/health') continue; // signed e-mail links and feeds
    const params = [...route.path.matchAll(/:([A-Za-z_]+)/g)].map((m) => m[1]);
    if (params.some((p) => p !== 'id') || (params.length && !(doc?.idKind && ids[doc.idKind]))) continue;
    if (/\/(file|thumb|pdf)$/.test(route.path)) continue;
    const url = route.path.replace(':id', String(doc?.idKind ? ids[doc.idKind] : ''));
    const query = doc?.query ? (exampleFor(doc.query) as Record<string, unknown> | undefined) : undefined;
    if (doc?.query && query === undefined) continue;
    const qs = new URLSearchParams(Object.entries(query ?? {}).map(([k, v]) => [k, String(v)])).toString();
    out.push({ label: routeKey(route), path: qs ? `${url}?${qs}` : url });
  }
  return out;
}

/** Waits until requests left in flight by the last run are done: the bare route answers fast again. */
async function drain(url: string) {
  const until = Date.now() + 30_000;
  let fast = 0;
  while (fast < 3 && Date.now() < until) {
    const t0 = performance.now();
    await (await fetch(`${url}/bench/bare`)).arrayBuffer();
    fast = performance.now() - t0 < 10 ? fast + 1 : 0;
    if (fast < 3) await new Promise((r) => setTimeout(r, 100));
  }
}

/** Measures every route; the bare route first and last (its mean is the baseline). */
export async function runLatency(opts: { onlyMain?: boolean; connections?: number; seconds?: number; log?: (line: string) => void } = {}): Promise<{ rows: LatencyRow[]; bare: Measurement; data: string }> {
  const log = opts.log ?? console.log;
  const connections = opts.connections ?? Number(process.env.BENCH_CONNECTIONS ?? 10);
  const seconds = opts.seconds ?? Number(process.env.BENCH_SECONDS ?? (opts.onlyMain ? 5 : 2));
  const db = await prepareLargeDatabase(log);
  let server: ProofServer | null = null;
  try {
    const { admin } = await benchUsers();
    const data = await dataCounts(db);
    log(`Data: ${data}.`);
    const routes = await routesToMeasure(db, Boolean(opts.onlyMain));
    server = await startProofServer(db.url);
    const session: Session = await signIn(server.url, admin.email, admin.password);
    const measureOne = async (path: string, headers?: Record<string, string>) => {
      await measure({ url: server!.url, path, headers, connections, durationSec: 0.5 });
      return measure({ url: server!.url, path, headers, connections, durationSec: seconds });
    };
    const bareFirst = await measureOne('/bench/bare');
    const rows: LatencyRow[] = [];
    log(`\nautocannon: ${connections} connections, ${seconds} s per route after a warm-up, signed in as an admin (sees every account)`);
    log(`${'route'.padEnd(40)}${'req/s'.padStart(8)}${'p50 ms'.padStart(9)}${'p95 ms'.padStart(9)}${'p99 ms'.padStart(9)}${'non-2xx'.padStart(9)}${'p95 ÷ bare'.padStart(12)}`);
    const line = (r: Measurement & { label: string }, ratio: string) =>
      log(`${r.label.padEnd(40)}${r.reqPerSec.toFixed(0).padStart(8)}${r.p50Ms.toFixed(1).padStart(9)}${r.p95Ms.toFixed(1).padStart(9)}${r.p99Ms.toFixed(1).padStart(9)}${String(r.non2xx + r.errors).padStart(9)}${ratio.padStart(12)}`);
    line({ ...bareFirst, label: 'bare route (first)' }, '1.0');
    const skipped: string[] = [];
    for (const route of routes) {
      // A route this user may not call as asked (a grower's own page, a query that needs more) is
      // reported, not timed.
      const probe = await fetch(`${server.url}${route.path}`, { headers: session.headers });
      await probe.arrayBuffer();
      if (probe.status >= 300) {
        skipped.push(`${route.label} (answers ${probe.status} to ${route.path})`);
        continue;
      }
      await drain(server.url);
      const m = await measureOne(route.path, session.headers);
      const row = { ...m, label: route.label, ratioP95: m.p95Ms / bareFirst.p95Ms };
      rows.push(row);
      line(row, row.ratioP95.toFixed(1));
    }
    await drain(server.url);
    const bareLast = await measureOne('/bench/bare');
    line({ ...bareLast, label: 'bare route (last)' }, (bareLast.p95Ms / bareFirst.p95Ms).toFixed(1));
    const bare: Measurement = { ...bareFirst, p50Ms: (bareFirst.p50Ms + bareLast.p50Ms) / 2, p95Ms: (bareFirst.p95Ms + bareLast.p95Ms) / 2, reqPerSec: (bareFirst.reqPerSec + bareLast.reqPerSec) / 2 };
    for (const r of rows) r.ratioP95 = r.p95Ms / bare.p95Ms;
    for (const line of skipped) log(`not timed: ${line}`);
    const failing = rows.filter((r) => r.non2xx + r.errors > 0);
    for (const r of failing) log(`warning: ${r.label} answered ${r.non2xx} non-2xx and had ${r.errors} errors`);
    log('p50/p95/p99: exact percentiles over every 2xx response of the run (bench/lib.ts measure()).');
    return { rows, bare, data };
  } finally {
    await server?.stop();
    await db.close();
  }
}

if (process.argv.includes('--serve')) {
  serve().catch((err) => {
    console.error(err);
    process.exit(1);
  });
} else if (process.argv[1] && path.resolve(process.argv[1]) === self) {
  const { rows, bare } = await runLatency({ onlyMain: process.argv.includes('--main') });
  const worst = [...rows].sort((a, b) => b.p95Ms - a.p95Ms)[0];
  const summary = {
    script: 'api-latency',
    bareP50Ms: bare.p50Ms,
    bareP95Ms: bare.p95Ms,
    routes: rows.length,
    main: rows.filter((r) => MAIN.includes(r.label)).map((r) => ({ route: r.label, p50Ms: r.p50Ms, p95Ms: r.p95Ms, ratioP95: r.ratioP95 })),
    worst: worst && { route: worst.label, p95Ms: worst.p95Ms, ratioP95: worst.ratioP95 },
    failingRoutes: rows.filter((r) => r.non2xx + r.errors > 0).map((r) => r.label),
  };
  console.log(`BENCH-SUMMARY ${JSON.stringify(summary)}`);
  process.exit(0); // the route-list app keeps a session-sweep timer
}
