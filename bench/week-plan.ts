// Week-plan endpoint benchmark: POST /api/week-plans with 40 invented farm visits over 5 days,
// end to end (HTTP, session, database reads, planning). Its own MariaDB (port 3438, data in
// .data/bench-week-plan). Target: each plan ≤ 1000 ms.
//
//   npx tsx bench/week-plan.ts [runs]     (default 10 timed runs after 2 warm-ups)
import bcrypt from 'bcryptjs';
import request from 'supertest';
import { createRng } from '../shared/calc/route-optimizer.js';
import type { WeekPlanView } from '../shared/schemas/visits.js';
import { DEALERSHIP } from '../seeders/demo.js';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { startLocalMariaDb } from '../server/db/local-mariadb.js';
import { migrateUp } from '../server/db/migrate.js';
import { Account, initModels, Territory, User, UserTerritory, Visit } from '../server/db/models/index.js';
import { createSequelize } from '../server/db/sequelize.js';
import { prepareWeekPlan, runWeekPlan } from '../server/modules/routes/week-plans.service.js';

const DB_PORT = Number(process.env.BENCH_DB_PORT ?? 3438);
const BASE_DIR = '.data/bench-week-plan';
const RUNS = Number(process.argv[2] ?? 10);
const WARM_UPS = 2;
const TARGET_MS = 1000;
const PASSWORD = 'bench-week-plan-password';
const WEEK_START = '2027-02-08';

const db = await startLocalMariaDb({ baseDir: BASE_DIR, port: DB_PORT, database: 'rowpath_bench_week', log: () => undefined });
const sequelize = createSequelize(db.url);
initModels(sequelize);
try {
  await sequelize.getQueryInterface().dropAllTables();
  await migrateUp(sequelize);

  // 40 invented farms within about 50 km of the demo dealership; a fifth with a half-day window,
  // two fixed appointments (Tuesday 10:00, Thursday 14:00 local time, stored in UTC).
  const territory = await Territory.create({ name: 'Bench territory', region: 'Invented' });
  const specialist = await User.create({ email: 'bench-specialist@rowpath.test', name: 'Bench Specialist', role: 'specialist', passwordHash: await bcrypt.hash(PASSWORD, 10), accountId: null, lastSignInAt: null });
  await UserTerritory.create({ userId: specialist.id, territoryId: territory.id });
  const random = createRng(20261201);
  const accounts = await Account.bulkCreate(
    Array.from({ length: 40 }, (_, k) => ({
      name: `Bench Farms ${k + 1}`,
      territoryId: territory.id,
      specialistId: specialist.id,
      address: null,
      town: 'Benchville',
      state: 'KS',
      lat: Number((DEALERSHIP.lat + (random() - 0.5) * 0.9).toFixed(6)),
      lng: Number((DEALERSHIP.lng + (random() - 0.5) * 1.1).toFixed(6)),
      notes: null,
    })),
  );
  const visits = await Visit.bulkCreate(
    accounts.map((a, k) => ({
      accountId: a.id,
      specialistId: specialist.id,
      planterId: null,
      purpose: k % 4 === 0 ? ('roadmap-review' as const) : ('pre-season-checkup' as const),
      status: k === 7 || k === 23 ? ('planned' as const) : ('requested' as const),
      startsAt: k === 7 ? new Date('2027-02-09T16:00:00Z') : k === 23 ? new Date('2027-02-11T20:00:00Z') : null,
      durationMin: k % 3 === 0 ? 60 : 45,
      windowStartMin: k % 5 === 1 ? (k % 2 ? 480 : 780) : null,
      windowEndMin: k % 5 === 1 ? (k % 2 ? 720 : 1020) : null,
      fixed: k === 7 || k === 23,
      notes: null,
      checklist: [],
      roadmapItemIds: [],
      requestedByContactId: null,
    })),
  );
  const visitIds = visits.map((v) => v.id);

  const config = loadConfig({ ...process.env, NODE_ENV: 'development', ROWPATH_DATA_DIR: `${BASE_DIR}/app`, LOG_LEVEL: 'warn' });
  const app = createApp({ sequelize, config });
  const agent = request.agent(app);
  let csrf = (await agent.get('/api/auth/csrf')).body.token;
  const login = await agent.post('/api/auth/login').set('X-CSRF-Token', csrf).send({ email: specialist.email, password: PASSWORD });
  if (login.status !== 200) throw new Error(`sign-in failed: ${login.status} ${JSON.stringify(login.body)}`);
  csrf = (await agent.get('/api/auth/csrf')).body.token;

  const plan = async () => {
    const startedMs = performance.now();
    const res = await agent.post('/api/week-plans').set('X-CSRF-Token', csrf).send({ weekStart: WEEK_START, visitIds, days: 5 });
    const elapsedMs = performance.now() - startedMs;
    if (res.status !== 200) throw new Error(`plan failed: ${res.status} ${JSON.stringify(res.body)}`);
    return { elapsedMs, body: res.body as WeekPlanView };
  };

  for (let k = 0; k < WARM_UPS; k++) await plan();
  console.log(`POST /api/week-plans: 40 visits over 5 days (${WEEK_START}), ${RUNS} runs after ${WARM_UPS} warm-ups`);
  console.log(`${'run'.padStart(4)}${'ms'.padStart(8)}${'placed'.padStart(8)}${'unplaced'.padStart(10)}${'road km'.padStart(9)}${'drive h'.padStart(9)}`);
  const times: number[] = [];
  for (let k = 1; k <= RUNS; k++) {
    const { elapsedMs, body } = await plan();
    times.push(elapsedMs);
    const driveH = body.days.reduce((n, d) => n + d.driveMin, 0) / 60;
    console.log(
      `${String(k).padStart(4)}${elapsedMs.toFixed(0).padStart(8)}${String(body.totals.visits).padStart(8)}${String(body.unplaced.length).padStart(10)}${body.totals.distanceKm.toFixed(1).padStart(9)}${driveH.toFixed(1).padStart(9)}`,
    );
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  const max = times[times.length - 1];
  console.log(`median ${median.toFixed(0)} ms, min ${times[0].toFixed(0)} ms, max ${max.toFixed(0)} ms (target ≤ ${TARGET_MS} ms): ${max <= TARGET_MS ? 'PASS' : 'FAIL'}`);
  process.exitCode = max <= TARGET_MS ? 0 : 1;

  // Where the time goes, without HTTP: loading and checking (database) against planning (CPU).
  const sessionUser = { id: specialist.id, email: specialist.email, name: specialist.name, role: 'specialist' as const, territoryIds: [territory.id], accountId: null };
  const loadMs: number[] = [];
  const planMs: number[] = [];
  for (let k = 0; k < RUNS; k++) {
    const t0 = performance.now();
    const prepared = await prepareWeekPlan(sessionUser, { weekStart: WEEK_START, visitIds, days: 5 });
    const t1 = performance.now();
    runWeekPlan(prepared);
    loadMs.push(t1 - t0);
    planMs.push(performance.now() - t1);
  }
  const med = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  console.log(`in process: load and check median ${med(loadMs).toFixed(0)} ms, planning median ${med(planMs).toFixed(0)} ms`);
} finally {
  await sequelize.close();
  await db.stop();
}
