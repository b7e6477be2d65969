// MariaDB stopped under a running app: the API answers 503 in the error shape, writes nothing, and
// recovers by itself when the database returns. Uses a MariaDB of its own so other tests go on.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { startLocalMariaDb, type LocalMariaDb } from '../../server/db/local-mariadb.js';
import { migrateUp } from '../../server/db/migrate.js';
import { User } from '../../server/db/models/index.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

let db: LocalMariaDb;
let t: TestApp;

beforeAll(async () => {
  db = await startLocalMariaDb({ baseDir: `.data/test-mariadb-outage-${process.env.TEST_OUTAGE_DB_PORT ?? 3327}`, port: Number(process.env.TEST_OUTAGE_DB_PORT ?? 3327), database: 'rowpath_outage', log: () => undefined });
  const s = createSequelize(db.url);
  await s.getQueryInterface().dropAllTables();
  await migrateUp(s);
  await s.close();
  t = await testApp({}, undefined, db.url);
});

afterAll(async () => {
  await t?.close();
  await db?.shutdown();
});

async function waitFor(check: () => Promise<boolean>, ms: number) {
  const until = Date.now() + ms;
  while (Date.now() < until) {
    if (await check()) return true;
    await new Promise((r) => setTimeout(r, 250));
  }
  return false;
}

describe('database outage', () => {
  it('when MariaDB stops, then the API answers 503 and writes nothing; when it returns, the API recovers by itself', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    expect((await request(t.app).get('/api/health')).body).toEqual({ status: 'ok', db: 'up' });
    expect((await admin.get('/api/accounts')).status).toBe(200);

    await db.shutdown();
    const health = await request(t.app).get('/api/health');
    expect(health.status).toBe(503);
    expect(health.body).toEqual({ status: 'unavailable', db: 'down' });
    const list = await admin.get('/api/accounts');
    expect(list.status).toBe(503);
    expect(list.body.error.code).toBe('db_unavailable');
    const email = `during-outage-${uid()}@test.rowpath.test`;
    const write = await admin.post('/api/admin/users', { email, name: 'Outage', role: 'admin', password: 'long-enough-pass' });
    expect(write.status).toBe(503);

    await db.restart();
    expect(await waitFor(async () => (await request(t.app).get('/api/health')).status === 200, 20_000)).toBe(true);
    // The session lives in MariaDB, so the same sign-in carries on after the outage.
    expect((await admin.get('/api/accounts')).status).toBe(200);
    expect(await User.count({ where: { email } })).toBe(0);
  });
});
