// Fleet list benchmark: the accounts and planters lists (paging, sorting, a filter) on the large
// data set, beside a bare route measured in the same run. Target: p95 ≤ 50 ms at 20 connections.
//   npx tsx bench/fleet-lists.ts                 the lists as the schema is now
//   npx tsx bench/fleet-lists.ts --before-after  also without the fleet-list indexes, same run
// The first run seeds 2,000 accounts / 6,000 planters / 60,000 installs into .data/bench (about a
// minute); later runs reuse them.
import os from 'node:os';
import { Op } from 'sequelize';
import * as fleetIndexes from '../server/db/migrations/2026.12.01T04.00.00.fleet-indexes.js';
import { Account, Install, Planter } from '../server/db/models/index.js';
import { LARGE, seedLarge } from '../seeders/large.js';
import { ensureBenchUser, measure, signIn, startBenchApp, startBenchDatabase, type Measurement, type Session } from './lib.js';

const DB_PORT = 3429;
const BASE_DIR = '.data/bench';
const CONNECTIONS = 20;
const DURATION_SEC = 10;
const WARMUP_SEC = 2;
const TARGET_P95_MS = 50;

const routes = [
  { label: 'bare route', path: '/api/health' },
  { label: 'accounts list', path: '/api/accounts?page=3&pageSize=25&sort=-name&q=Bench1' },
  { label: 'planters list', path: '/api/planters?page=2&pageSize=25&sort=-rows&minRows=16' },
];

type Row = Measurement & { label: string };
const pad = (v: string | number, w: number) => String(v).padStart(w);
const ms = (v: number) => v.toFixed(1);

async function runAll(url: string, session: Session): Promise<Row[]> {
  const results: Row[] = [];
  for (const route of routes) {
    await measure({ url, path: route.path, headers: session.headers, connections: CONNECTIONS, durationSec: WARMUP_SEC });
    results.push({ label: route.label, ...(await measure({ url, path: route.path, headers: session.headers, connections: CONNECTIONS, durationSec: DURATION_SEC })) });
  }
  return results;
}

function print(title: string, results: Row[]) {
  const bare = results[0];
  // Other work on the machine moves absolute figures a lot; the ratios to the bare route less so.
  console.log(`\n${title}  (load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')} on ${os.cpus().length} cores)`);
  console.log(`${'route'.padEnd(15)}${pad('req/s', 9)}${pad('p50 ms', 9)}${pad('p95 ms', 9)}${pad('p99 ms', 9)}${pad('max ms', 9)}${pad('non-2xx', 9)}${pad('req/s ÷ bare', 14)}${pad('p95 × bare', 12)}  target`);
  for (const r of results) {
    const verdict = r === bare ? '' : r.p95Ms <= TARGET_P95_MS ? `p95 ≤ ${TARGET_P95_MS} ms: met` : `p95 ≤ ${TARGET_P95_MS} ms: MISSED`;
    console.log(
      `${r.label.padEnd(15)}${pad(r.reqPerSec.toFixed(0), 9)}${pad(ms(r.p50Ms), 9)}${pad(ms(r.p95Ms), 9)}${pad(ms(r.p99Ms), 9)}${pad(ms(r.maxMs), 9)}${pad(r.non2xx + r.errors, 9)}${pad((r.reqPerSec / bare.reqPerSec).toFixed(2), 14)}${pad((r.p95Ms / bare.p95Ms).toFixed(1), 12)}  ${verdict}`,
    );
  }
  for (const r of results) if (r.non2xx + r.errors > 0) console.log(`warning: ${r.label} had ${r.non2xx} non-2xx answers and ${r.errors} errors`);
}

const beforeAfter = process.argv.includes('--before-after');
const db = await startBenchDatabase({ port: DB_PORT, baseDir: BASE_DIR, log: (line) => console.log(line) });
let app: Awaited<ReturnType<typeof startBenchApp>> | null = null;
let indexesDropped = false;
try {
  const seeded = await Account.count({ where: { name: { [Op.like]: 'Bench%' } } });
  if (seeded >= LARGE.accounts) console.log(`Large data set already present (${seeded} benchmark accounts): not seeding.`);
  else {
    console.log('Seeding the large data set…');
    await seedLarge(db.sequelize);
  }
  const [accounts, planters, installs] = await Promise.all([Account.count(), Planter.count(), Install.count()]);
  console.log(`Data: ${accounts} accounts, ${planters} planters, ${installs} installs.`);
  const admin = await ensureBenchUser('admin', 'bench-admin@rowpath.test');

  app = await startBenchApp({ databaseUrl: db.url, dataDir: BASE_DIR });
  const session = await signIn(app.url, admin.email, admin.password);
  for (const route of routes.slice(1)) {
    const res = await fetch(`${app.url}${route.path}`, { headers: session.headers });
    const body = (await res.json()) as { items?: unknown[]; total?: number };
    console.log(`${route.label}: ${res.status}, ${body.items?.length ?? 0} items of ${body.total ?? 0}`);
    if (res.status !== 200) throw new Error(`${route.path} answered ${res.status}`);
  }
  console.log(`\nautocannon: ${CONNECTIONS} connections, ${DURATION_SEC} s per route after a ${WARMUP_SEC} s warm-up; p50/p95/p99 are exact (nearest rank) over every 2xx response time`);

  const context = { queryInterface: db.sequelize.getQueryInterface(), sequelize: db.sequelize };
  if (beforeAfter) {
    await fleetIndexes.down(context);
    indexesDropped = true;
    print('Before: without the fleet-list indexes (migration 2026.12.01T04.00.00 reverted for this run)', await runAll(app.url, session));
    await fleetIndexes.up(context);
    indexesDropped = false;
  }
  print(beforeAfter ? 'After: with the fleet-list indexes' : 'Fleet lists', await runAll(app.url, session));
} finally {
  if (indexesDropped) await fleetIndexes.up({ queryInterface: db.sequelize.getQueryInterface(), sequelize: db.sequelize });
  await app?.stop();
  await db.close();
}
