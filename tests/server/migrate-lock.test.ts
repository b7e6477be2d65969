// Two instances started together on an empty database must not both run the migrations: one
// migrates while the other waits on a named lock, then finds nothing left to do.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { migrator, migrateUp } from '../../server/db/migrate.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { testApp, uid, type TestApp } from '../helpers/app.js';

let t: TestApp;
const name = `rowpath_test_mig_${uid()}`;
const instances: Sequelize[] = [];

beforeAll(async () => {
  t = await testApp();
  await t.sequelize.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
});
afterAll(async () => {
  await Promise.all(instances.map((s) => s.close()));
  await t.sequelize.query(`DROP DATABASE IF EXISTS \`${name}\``);
  await t.close();
});

describe('migrations at start-up', () => {
  it('when two instances migrate an empty database at the same moment, then every migration runs once and both start', async () => {
    const u = new URL(inject('databaseUrl'));
    u.pathname = `/${name}`;
    for (let i = 0; i < 2; i++) instances.push(createSequelize(u.toString()));
    const applied = await Promise.all(instances.map((s) => migrateUp(s)));
    const expected = (await migrator(instances[0]).pending()).length + (await migrator(instances[0]).executed()).length;
    // One instance applied them all; the other found none pending.
    expect(applied.map((a) => a.length).sort((a, b) => a - b)).toEqual([0, expected]);
    const rows = await instances[0].query<{ n: number }>('SELECT COUNT(*) AS n FROM schema_migrations', { type: QueryTypes.SELECT });
    expect(Number(rows[0].n)).toBe(expected);
    expect(await migrator(instances[1]).pending()).toEqual([]);
  });
});
