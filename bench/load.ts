// Load and fault runs on the large data set (the database and app of bench/api-latency.ts):
//   1. steady: 50 connections for 60 s, mixed reads and writes (autocannon) — zero errors and no
//      steady memory growth: the server process reports its heap after a full GC every 5 s;
//   2. fault: MariaDB is shut down in the middle of a run and started again — the API answers 503
//      during the gap, recovers by itself, and no write is left half done (each planter written in
//      the run has all its toolbars and its audit line, and none exists without its 201… or the
//      difference is shown).
//   npx tsx bench/load.ts                   both
//   npx tsx bench/load.ts --steady | --fault
//   BENCH_LOAD_SECONDS=60 BENCH_LOAD_CONNECTIONS=50 …
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import autocannon from 'autocannon';
import { Op, QueryTypes } from 'sequelize';
import { Account, Component, Planter } from '../server/db/models/index.js';
import { benchUsers, prepareLargeDatabase, startProofServer, type ProofServer } from './api-latency.js';
import { percentile, signIn, type BenchDatabase, type Session } from './lib.js';

const SECONDS = Number(process.env.BENCH_LOAD_SECONDS ?? 60);
const CONNECTIONS = Number(process.env.BENCH_LOAD_CONNECTIONS ?? 50);
const MEMORY_EVERY_MS = 5000;
// Heap after GC may move with caches filling early on; growth is judged after the first 15 s.
const WARM_MS = 15_000;
const GROWTH_LIMIT_PCT = 10;

const FAULT_SECONDS = 30;
const FAULT_CONNECTIONS = 20;
const STOP_AT_MS = 8_000;
const DOWN_FOR_MS = 8_000;

interface Fixture {
  accountIds: number[];
  planterIds: number[];
  componentId: number;
  session: Session;
}

async function fixture(db: BenchDatabase, server: ProofServer): Promise<Fixture> {
  const { admin } = await benchUsers();
  const accounts = await Account.findAll({ where: { name: { [Op.like]: 'Bench%' } }, attributes: ['id'], order: [['id', 'ASC']], limit: 400 });
  const planters = await Planter.findAll({ where: { accountId: accounts.map((a) => a.id) }, attributes: ['id'], limit: 400 });
  const component = await Component.findOne({ attributes: ['id'] });
  void db;
  return { accountIds: accounts.map((a) => a.id), planterIds: planters.map((p) => p.id), componentId: component!.id, session: await signIn(server.url, admin.email, admin.password) };
}

const pick = <T>(xs: T[]) => xs[Math.floor(Math.random() * xs.length)];

/** Removes what earlier load runs wrote, so that the large data set stays the same size run after run. */
async function removeLoadRows(db: BenchDatabase) {
  await db.sequelize.query("DELETE t FROM toolbars t JOIN planters p ON p.id = t.planter_id WHERE p.name LIKE 'fault-%'");
  await db.sequelize.query("DELETE e FROM audit_events e JOIN planters p ON p.id = e.entity_id AND e.entity = 'planter' WHERE p.name LIKE 'fault-%'");
  await db.sequelize.query("DELETE FROM planters WHERE name LIKE 'fault-%'");
  await db.sequelize.query("DELETE e FROM audit_events e JOIN contacts c ON c.id = e.entity_id AND e.entity = 'contact' WHERE c.name LIKE 'Load steady-%'");
  await db.sequelize.query("DELETE FROM contacts WHERE name LIKE 'Load steady-%'");
}

/** Eight reads and two writes per cycle of each connection. */
function mixedRequests(f: Fixture, tag: string): autocannon.Request[] {
  const json = { ...f.session.headers, 'content-type': 'application/json' };
  const read = (make: () => string): autocannon.Request => ({ method: 'GET', headers: f.session.headers, setupRequest: (req) => ({ ...req, path: make() }) });
  let n = 0;
  return [
    read(() => `/api/accounts?page=${1 + Math.floor(Math.random() * 20)}&pageSize=25&sort=name`),
    read(() => `/api/accounts/${pick(f.accountIds)}`),
    read(() => `/api/planters/${pick(f.planterIds)}`),
    { method: 'POST', headers: json, setupRequest: (req) => ({ ...req, path: `/api/accounts/${pick(f.accountIds)}/contacts`, body: JSON.stringify({ name: `Load ${tag} ${++n}`, reminderOptIn: false }) }) },
    read(() => '/api/components?pageSize=25'),
    read(() => '/api/auth/me'),
    read(() => `/api/accounts/${pick(f.accountIds)}/goals`),
    { method: 'PUT', headers: json, setupRequest: (req) => ({ ...req, path: `/api/accounts/${pick(f.accountIds)}/budgets`, body: JSON.stringify({ season: 2028, budgetUsd: Math.round(Math.random() * 50_000) }) }) },
    read(() => '/api/territories'),
    read(() => `/api/accounts?q=Bench1${Math.floor(Math.random() * 10)}&pageSize=25`),
  ];
}

function run(opts: autocannon.Options, onResponse?: (status: number, atMs: number) => void): Promise<autocannon.Result> {
  const started = Date.now();
  return new Promise((resolve, reject) => {
    const instance = autocannon(opts, (err, res) => (err ? reject(err) : resolve(res)));
    instance.on('response', (_c, status) => onResponse?.(status, Date.now() - started));
  });
}

/** Least-squares slope of y over x, per minute of x in ms. */
function slopePerMinute(points: { x: number; y: number }[]) {
  const n = points.length;
  const mx = points.reduce((s, p) => s + p.x, 0) / n;
  const my = points.reduce((s, p) => s + p.y, 0) / n;
  const num = points.reduce((s, p) => s + (p.x - mx) * (p.y - my), 0);
  const den = points.reduce((s, p) => s + (p.x - mx) ** 2, 0);
  return den ? (num / den) * 60_000 : 0;
}

export async function runSteady(log: (line: string) => void = console.log) {
  const db = await prepareLargeDatabase(log);
  await removeLoadRows(db);
  const server = await startProofServer(db.url, { memoryEveryMs: MEMORY_EVERY_MS });
  try {
    const f = await fixture(db, server);
    const statuses = new Map<number, number>();
    const latencies: number[] = [];
    const t0 = Date.now();
    const result = await new Promise<autocannon.Result>((resolve, reject) => {
      const instance = autocannon(
        { url: server.url, connections: CONNECTIONS, duration: SECONDS, requests: mixedRequests(f, `steady-${t0}`), timeout: 30 },
        (err, res) => (err ? reject(err) : resolve(res)),
      );
      instance.on('response', (_c, status, _bytes, ms) => {
        statuses.set(status, (statuses.get(status) ?? 0) + 1);
        latencies.push(ms);
      });
    });
    await new Promise((r) => setTimeout(r, MEMORY_EVERY_MS + 500)); // one sample after the load
    latencies.sort((a, b) => a - b);
    const loadStartMs = t0 - server.startedAt;
    const samples = server.memory.filter((m) => m.atMs >= loadStartMs - MEMORY_EVERY_MS);
    const during = samples.filter((s) => s.atMs >= loadStartMs + WARM_MS);
    const first = during.slice(0, 3).map((s) => s.heapUsedMb);
    const last = during.slice(-3).map((s) => s.heapUsedMb);
    const avg = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / Math.max(1, xs.length);
    const growthPct = ((avg(last) - avg(first)) / avg(first)) * 100;
    const slope = slopePerMinute(during.map((s) => ({ x: s.atMs, y: s.heapUsedMb })));
    const errors = result.errors + result.timeouts;
    const non2xx = result.non2xx;
    log(`\nSteady load: ${CONNECTIONS} connections, ${SECONDS} s, 8 reads : 2 writes (contact created, season budget set) per cycle, as an admin`);
    log(`requests ${result.requests.total} (${(result.requests.total / SECONDS).toFixed(0)} req/s), p50 ${percentile(latencies, 50).toFixed(0)} ms, p95 ${percentile(latencies, 95).toFixed(0)} ms, p99 ${percentile(latencies, 99).toFixed(0)} ms`);
    log(`status counts ${JSON.stringify(Object.fromEntries(statuses))}; non-2xx ${non2xx}; socket errors ${result.errors}; timeouts ${result.timeouts}`);
    log(`server heap after GC, MB, every ${MEMORY_EVERY_MS / 1000} s: ${samples.map((s) => s.heapUsedMb.toFixed(1)).join(' ')}`);
    log(`server RSS, MB: ${samples.map((s) => s.rssMb.toFixed(0)).join(' ')}`);
    log(`heap growth after warm-up: ${growthPct.toFixed(1)} % (first 3 samples after ${WARM_MS / 1000} s vs last 3), slope ${slope.toFixed(2)} MB/min`);
    const zeroErrors = errors === 0 && non2xx === 0;
    const noGrowth = growthPct <= GROWTH_LIMIT_PCT;
    log(`zero errors: ${zeroErrors ? 'met' : 'MISSED'}; no steady memory growth (≤ ${GROWTH_LIMIT_PCT} %): ${noGrowth ? 'met' : 'MISSED'}`);
    return { requests: result.requests.total, reqPerSec: result.requests.total / SECONDS, p50Ms: percentile(latencies, 50), p95Ms: percentile(latencies, 95), non2xx, errors, statuses: Object.fromEntries(statuses), heapMb: samples.map((s) => +s.heapUsedMb.toFixed(1)), growthPct, slopeMbPerMin: slope, zeroErrors, noGrowth };
  } finally {
    await server.stop();
    await db.close();
  }
}

export async function runFault(log: (line: string) => void = console.log) {
  const db = await prepareLargeDatabase(log);
  await removeLoadRows(db);
  const server = await startProofServer(db.url);
  try {
    const f = await fixture(db, server);
    const tag = `fault-${Date.now()}`;
    let created = 0;
    const timeline: { atMs: number; status: number }[] = [];
    const json = { ...f.session.headers, 'content-type': 'application/json' };
    let n = 0;
    // Reads, and a write that is several rows in one transaction: a planter, its two toolbars and an audit line.
    const requests: autocannon.Request[] = [
      { method: 'GET', headers: f.session.headers, setupRequest: (req) => ({ ...req, path: `/api/accounts/${pick(f.accountIds)}` }) },
      {
        method: 'POST',
        headers: json,
        setupRequest: (req) => ({
          ...req,
          path: `/api/accounts/${pick(f.accountIds)}/planters`,
          body: JSON.stringify({ name: `${tag} ${++n}`, rows: 12, rowSpacingIn: 30, frameType: 'rigid', foldType: 'none', seedSupplyType: 'row-hoppers', toolbars: [{ name: 'Left', sizeFt: 15, firstRow: 1, lastRow: 6 }, { name: 'Right', sizeFt: 15, firstRow: 7, lastRow: 12 }] }),
        }),
        onResponse: (status) => void (status === 201 && created++),
      },
      { method: 'GET', headers: f.session.headers, setupRequest: (req) => ({ ...req, path: '/api/auth/me' }) },
    ];
    let stoppedAt = 0;
    let restartedAt = 0;
    const t0 = Date.now();
    const fault = (async () => {
      await new Promise((r) => setTimeout(r, STOP_AT_MS));
      stoppedAt = Date.now() - t0;
      await db.local.shutdown();
      await new Promise((r) => setTimeout(r, DOWN_FOR_MS));
      await db.local.restart();
      restartedAt = Date.now() - t0;
    })();
    const result = await run({ url: server.url, connections: FAULT_CONNECTIONS, duration: FAULT_SECONDS, requests, timeout: 20 }, (status, atMs) => timeline.push({ status, atMs }));
    await fault;
    const phase = (from: number, to: number) => {
      const counts: Record<string, number> = {};
      for (const e of timeline) if (e.atMs >= from && e.atMs < to) counts[e.status] = (counts[e.status] ?? 0) + 1;
      return counts;
    };
    const before = phase(0, stoppedAt);
    const gap = phase(stoppedAt, restartedAt);
    const firstOk = timeline.find((e) => e.atMs >= restartedAt && e.status < 400);
    const recovered = firstOk ? firstOk.atMs - restartedAt : Number.NaN;
    const tail = phase(restartedAt + 5000, FAULT_SECONDS * 1000 + 60_000);
    const rows = await db.sequelize.query<{ planters: number; complete: number; audited: number }>(
      `SELECT COUNT(*) AS planters,
              SUM((SELECT COUNT(*) FROM toolbars t WHERE t.planter_id = p.id) = 2) AS complete,
              SUM((SELECT COUNT(*) FROM audit_events e WHERE e.entity = 'planter' AND e.entity_id = p.id AND e.action = 'create') = 1) AS audited
         FROM planters p WHERE p.name LIKE :tag`,
      { replacements: { tag: `${tag} %` }, type: QueryTypes.SELECT },
    );
    const r = rows[0];
    const planters = Number(r.planters);
    const partial = planters - Number(r.complete) + (planters - Number(r.audited));
    const tailErrors = Object.entries(tail).filter(([s]) => Number(s) >= 400).reduce((a, [, c]) => a + c, 0);
    const fiveHundreds = timeline.filter((e) => e.status >= 500 && e.status !== 503).length;
    log(`\nFault run: ${FAULT_CONNECTIONS} connections, ${FAULT_SECONDS} s; MariaDB shut down at ${(stoppedAt / 1000).toFixed(1)} s, started again at ${(restartedAt / 1000).toFixed(1)} s`);
    log(`before the stop: ${JSON.stringify(before)}`);
    log(`during the gap:  ${JSON.stringify(gap)}`);
    log(`from 5 s after the restart: ${JSON.stringify(tail)}`);
    log(`first success ${Number.isNaN(recovered) ? 'never' : `${(recovered / 1000).toFixed(1)} s`} after MariaDB was back; other 5xx than 503: ${fiveHundreds}; socket errors ${result.errors}, timeouts ${result.timeouts}`);
    log(`writes: ${created} answered 201; ${planters} planters in the database, ${r.complete} with both toolbars, ${r.audited} with their audit line; partial writes: ${partial}` + (planters > created ? ` (${planters - created} committed whose answer was lost to the outage)` : ''));
    const ok = (gap['503'] ?? 0) > 0 && !Number.isNaN(recovered) && tailErrors === 0 && partial === 0 && fiveHundreds === 0 && planters >= created;
    log(`503s during the gap, full recovery, no partial writes: ${ok ? 'met' : 'MISSED'}`);
    await removeLoadRows(db);
    return { stoppedAtS: stoppedAt / 1000, restartedAtS: restartedAt / 1000, before, gap, tail, recoveredS: recovered / 1000, created, planters, partial, fiveHundreds, ok };
  } finally {
    await server.stop();
    await db.close();
  }
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const only = process.argv.find((a) => a === '--steady' || a === '--fault');
  const summary: Record<string, unknown> = { script: 'load' };
  if (only !== '--fault') summary.steady = await runSteady();
  if (only !== '--steady') summary.fault = await runFault();
  console.log(`BENCH-SUMMARY ${JSON.stringify(summary)}`);
  process.exit(0);
}
