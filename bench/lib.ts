// Shared pieces of the HTTP benchmarks: a MariaDB of the benchmark's own, the app in a child
// process (so that the load generator and the server do not share one event loop), a signed-in
// session for autocannon, and a measurement that reports exact percentiles.
import { fork, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import autocannon from 'autocannon';
import bcrypt from 'bcryptjs';
import type { Sequelize } from 'sequelize';
import type { Role } from '../shared/schemas/auth.js';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { startLocalMariaDb, type LocalMariaDb } from '../server/db/local-mariadb.js';
import { migrateUp } from '../server/db/migrate.js';
import { initModels, User } from '../server/db/models/index.js';
import { createSequelize } from '../server/db/sequelize.js';

const here = fileURLToPath(import.meta.url);

export interface BenchDatabase {
  local: LocalMariaDb;
  sequelize: Sequelize;
  url: string;
  close(): Promise<void>;
}

/** Starts (or reuses) a MariaDB on `port` with its data under `baseDir`, and migrates it. */
export async function startBenchDatabase(opts: { port: number; baseDir: string; database?: string; log?: (line: string) => void }): Promise<BenchDatabase> {
  const local = await startLocalMariaDb({ baseDir: opts.baseDir, port: opts.port, database: opts.database ?? 'rowpath_bench', log: opts.log });
  const sequelize = createSequelize(local.url);
  initModels(sequelize);
  await migrateUp(sequelize);
  return {
    local,
    sequelize,
    url: local.url,
    async close() {
      await sequelize.close().catch(() => undefined);
      await local.stop();
    },
  };
}

/** A user for the benchmark, created if missing, with a fresh password each run. */
export async function ensureBenchUser(role: Role, email: string): Promise<{ email: string; password: string }> {
  const password = randomBytes(12).toString('base64url');
  const passwordHash = await bcrypt.hash(password, 10);
  const existing = await User.findOne({ where: { email } });
  if (existing) await existing.update({ passwordHash, role, disabled: false });
  else await User.create({ email, name: `Benchmark ${role}`, role, passwordHash, disabled: false, accountId: null, lastSignInAt: null });
  return { email, password };
}

export interface BenchApp {
  url: string;
  stop(): Promise<void>;
}

/** The app in a child process on an ephemeral 127.0.0.1 port, on the given database. */
export async function startBenchApp(opts: { databaseUrl: string; dataDir: string }): Promise<BenchApp> {
  const child: ChildProcess = fork(here, [], {
    // BENCH_NODE_ARGS adds flags to the app's node, e.g. "--cpu-prof --cpu-prof-dir=/tmp/prof" to profile it.
    execArgv: ['--import', 'tsx', ...(process.env.BENCH_NODE_ARGS?.split(/\s+/).filter(Boolean) ?? [])],
    env: { ...process.env, ROWPATH_BENCH_CHILD: '1', BENCH_DATABASE_URL: opts.databaseUrl, BENCH_DATA_DIR: opts.dataDir },
    stdio: ['ignore', 'inherit', 'inherit', 'ipc'],
  });
  const url = await new Promise<string>((resolve, reject) => {
    child.once('message', (m: { url?: string }) => (m.url ? resolve(m.url) : reject(new Error('The benchmark app did not start'))));
    child.once('exit', (code) => reject(new Error(`The benchmark app exited (${code}) before listening`)));
  });
  return {
    url,
    stop: () =>
      new Promise<void>((resolve) => {
        if (child.exitCode !== null) return resolve();
        child.once('exit', () => resolve());
        child.kill('SIGTERM');
      }),
  };
}

async function serveInChild() {
  const config = loadConfig({
    NODE_ENV: 'production',
    DATABASE_URL: process.env.BENCH_DATABASE_URL,
    ROWPATH_DATA_DIR: process.env.BENCH_DATA_DIR ?? '.data/bench',
    SESSION_SECRET: randomBytes(32).toString('hex'),
    LOG_LEVEL: 'warn',
  });
  const sequelize = createSequelize(config.DATABASE_URL!);
  initModels(sequelize);
  const app = createApp({ sequelize, config });
  const server = app.listen(0, '127.0.0.1', () => {
    const address = server.address();
    const port = typeof address === 'object' && address ? address.port : 0;
    process.send?.({ url: `http://127.0.0.1:${port}` });
  });
  // Requests the load generator left in flight still finish before the database goes.
  process.on('SIGTERM', () => {
    server.close();
    server.closeIdleConnections();
    const pool = (sequelize.connectionManager as unknown as { pool: { using: number; waiting: number } }).pool;
    const started = Date.now();
    const waitForIdle = () => {
      if ((pool.using === 0 && pool.waiting === 0) || Date.now() - started > 15_000) void sequelize.close().finally(() => process.exit(0));
      else setTimeout(waitForIdle, 100);
    };
    setTimeout(waitForIdle, 100);
  });
}

export interface Session {
  cookie: string;
  csrf: string;
  /** Headers for autocannon (the CSRF token matters only for writes). */
  headers: Record<string, string>;
}

function sessionCookie(res: Response, previous: string): string {
  const set = res.headers.getSetCookie().find((c) => c.startsWith('rowpath.sid='));
  return set ? set.split(';')[0] : previous;
}

/** Signs in through the API as a browser would: CSRF token, login, then the new session's token. */
export async function signIn(url: string, email: string, password: string): Promise<Session> {
  const first = await fetch(`${url}/api/auth/csrf`);
  let cookie = sessionCookie(first, '');
  const { token } = (await first.json()) as { token: string };
  const login = await fetch(`${url}/api/auth/login`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', cookie, 'x-csrf-token': token },
    body: JSON.stringify({ email, password }),
  });
  if (login.status !== 200) throw new Error(`Sign-in failed: ${login.status} ${await login.text()}`);
  cookie = sessionCookie(login, cookie);
  const again = await fetch(`${url}/api/auth/csrf`, { headers: { cookie } });
  cookie = sessionCookie(again, cookie);
  const csrf = ((await again.json()) as { token: string }).token;
  return { cookie, csrf, headers: { cookie, 'x-csrf-token': csrf } };
}

export interface Measurement {
  path: string;
  requests: number;
  reqPerSec: number;
  p50Ms: number;
  p95Ms: number;
  p99Ms: number;
  maxMs: number;
  non2xx: number;
  errors: number;
}

/** Nearest-rank percentile of sorted values: the smallest value with at least p % at or below it. */
export function percentile(sortedMs: number[], p: number): number {
  if (!sortedMs.length) return Number.NaN;
  return sortedMs[Math.min(sortedMs.length - 1, Math.max(0, Math.ceil((p / 100) * sortedMs.length) - 1))];
}

/**
 * Loads one route with autocannon. Autocannon's summary has no p95 (it prints p50, p90, p97.5,
 * p99), so every response time is recorded from its `response` events and the percentiles are
 * computed exactly over all 2xx responses.
 */
export async function measure(opts: { url: string; path: string; headers?: Record<string, string>; connections: number; durationSec: number }): Promise<Measurement> {
  const latenciesMs: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      { url: `${opts.url}${opts.path}`, connections: opts.connections, duration: opts.durationSec, headers: opts.headers },
      (err, res) => (err ? reject(err) : resolve(res)),
    );
    instance.on('response', (_client, statusCode, _bytes, responseTimeMs) => {
      if (statusCode >= 200 && statusCode < 300) latenciesMs.push(responseTimeMs);
    });
  });
  latenciesMs.sort((a, b) => a - b);
  return {
    path: opts.path,
    requests: result.requests.total,
    reqPerSec: result.requests.total / opts.durationSec,
    p50Ms: percentile(latenciesMs, 50),
    p95Ms: percentile(latenciesMs, 95),
    p99Ms: percentile(latenciesMs, 99),
    maxMs: latenciesMs[latenciesMs.length - 1] ?? Number.NaN,
    non2xx: result.non2xx,
    errors: result.errors + result.timeouts,
  };
}

if (process.env.ROWPATH_BENCH_CHILD === '1' && process.argv[1] && pathToFileURL(path.resolve(process.argv[1])).href === import.meta.url) {
  serveInChild().catch((err) => {
    console.error(err);
    process.exit(1);
  });
}
