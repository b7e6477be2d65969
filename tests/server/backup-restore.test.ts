// npm run db:backup / db:restore: a database filled through the API (one record of every kind, plus
// text that is hard to carry: emoji, accents, quotes, backslashes, line breaks) is dumped, restored
// into an empty database, and compared table by table: the same tables, the same row counts and the
// same CHECKSUM TABLE values. Restoring over a changed database brings it back exactly.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import zlib from 'node:zlib';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { backupName, dumpDatabase, targetFromUrl } from '../../scripts/db-backup.js';
import { newestBackup, restoreDatabase } from '../../scripts/db-restore.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { makeOneOfEach } from '../../server/modules/openapi/fixtures.js';
import { makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

let t: TestApp;
let dir: string;
const created: string[] = [];
const url = () => inject('databaseUrl');

/** A fresh, empty database beside the tests' own (the app user may create rowpath_test_*). */
async function freshDatabase(): Promise<{ name: string; url: string; sequelize: Sequelize }> {
  const name = `${targetFromUrl(url()).database}_bk_${uid()}`;
  await t.sequelize.query(`CREATE DATABASE \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  created.push(name);
  const u = new URL(url());
  u.pathname = `/${name}`;
  return { name, url: u.toString(), sequelize: createSequelize(u.toString()) };
}

/** Every table with its row count and CHECKSUM TABLE value, by name. */
async function fingerprint(sequelize: Sequelize, database: string): Promise<Record<string, { rows: number; checksum: number }>> {
  const tables = await sequelize.query<{ name: string }>(
    "SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = :database AND TABLE_TYPE = 'BASE TABLE' ORDER BY TABLE_NAME",
    { replacements: { database }, type: QueryTypes.SELECT },
  );
  const out: Record<string, { rows: number; checksum: number }> = {};
  for (const { name } of tables) {
    const [count] = await sequelize.query<{ n: number }>(`SELECT COUNT(*) AS n FROM \`${database}\`.\`${name}\``, { type: QueryTypes.SELECT });
    const [sum] = await sequelize.query<{ Checksum: number }>(`CHECKSUM TABLE \`${database}\`.\`${name}\``, { type: QueryTypes.SELECT });
    out[name] = { rows: Number(count.n), checksum: Number(sum.Checksum) };
  }
  return out;
}

beforeAll(async () => {
  t = await testApp();
  dir = fs.mkdtempSync(path.join(os.tmpdir(), 'rowpath-backups-'));
  // Fill the tests' database through the API: every kind of record, and awkward text.
  const admin = await signedIn(t.app, await makeUser('admin'));
  const territory = await makeTerritory(`Territoire Ñandú ${uid()}`);
  const f = await makeOneOfEach(
    {
      get: (u) => admin.get(u),
      post: (u, body) => admin.post(u, body),
      put: (u, body) => admin.put(u, body),
      upload: (u, fields, file) => {
        let req = admin.agent.post(u).set('X-Forwarded-For', admin.ip).set('X-CSRF-Token', admin.csrf);
        for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
        return req.attach('file', file.bytes, file.name);
      },
    },
    territory.id,
    uid(),
  );
  expect(f.ids.account).toBeTruthy();
  const awkward = await admin.patch(`/api/accounts/${f.ids.account}`, {
    version: 0,
    notes: 'Row unit 7: "closing wheel" \\ worn; O\'Brien\'s field\nsecond line 🌽🚜 — café déjà vu 中文 \t tab',
  });
  expect(awkward.status, JSON.stringify(awkward.body)).toBe(200);
  await new Promise((r) => setTimeout(r, 200)); // the security log is written after the answers
});

afterAll(async () => {
  for (const name of created) await t.sequelize.query(`DROP DATABASE IF EXISTS \`${name}\``);
  fs.rmSync(dir, { recursive: true, force: true });
  await t?.close();
});

describe('backup and restore', () => {
  it('when the database is backed up and restored into an empty one, then every table has the same rows and checksum', async () => {
    const source = targetFromUrl(url());
    const before = await fingerprint(t.sequelize, source.database);
    const { file, bytes } = await dumpDatabase(source, path.join(dir, backupName()));
    expect(path.basename(file)).toMatch(/^rowpath-\d{8}T\d{6}Z\.sql\.gz$/);
    expect(bytes).toBeGreaterThan(1000);
    expect(fs.existsSync(`${file}.partial`)).toBe(false);
    const sql = zlib.gunzipSync(fs.readFileSync(file)).toString('utf8');
    expect(sql).toMatch(/CREATE TABLE `accounts`/);
    expect(sql).not.toMatch(/^USE /m); // restorable into any database
    const after = await fingerprint(t.sequelize, source.database);
    expect(after).toEqual(before); // nothing wrote while the dump ran

    const copy = await freshDatabase();
    try {
      await restoreDatabase(targetFromUrl(copy.url), file);
      const restored = await fingerprint(t.sequelize, copy.name);
      expect(Object.keys(restored)).toEqual(Object.keys(before));
      expect(Object.keys(before)).toEqual(expect.arrayContaining(['accounts', 'planters', 'installs', 'visits', 'security_events', 'schema_migrations']));
      expect(before.accounts.rows).toBeGreaterThan(0);
      expect(restored).toEqual(before);
      const [note] = await copy.sequelize.query<{ notes: string }>("SELECT notes FROM accounts WHERE notes LIKE '%closing wheel%' LIMIT 1", { type: QueryTypes.SELECT });
      expect(note.notes).toContain('🌽🚜 — café déjà vu 中文');
      expect(note.notes).toContain('" \\ worn');
    } finally {
      await copy.sequelize.close();
    }
  });

  it('when the database has changed since the backup, then restoring brings back exactly the backup', async () => {
    const copy = await freshDatabase();
    try {
      const { file } = await dumpDatabase(targetFromUrl(url()), path.join(dir, `rowpath-20000101T000000Z.sql.gz`));
      await restoreDatabase(targetFromUrl(copy.url), file);
      const backedUp = await fingerprint(t.sequelize, copy.name);
      // Change the copy: rows removed and edited, a table added by some later migration.
      await copy.sequelize.query('DELETE FROM installs');
      await copy.sequelize.query("UPDATE accounts SET name = CONCAT(name, ' (changed)')");
      await copy.sequelize.query('CREATE TABLE later_feature (id INT PRIMARY KEY)');
      expect(await fingerprint(t.sequelize, copy.name)).not.toEqual(backedUp);
      await restoreDatabase(targetFromUrl(copy.url), file);
      expect(await fingerprint(t.sequelize, copy.name)).toEqual(backedUp);
    } finally {
      await copy.sequelize.close();
    }
  });

  it('when the npm scripts run, then db:backup writes a dated file and db:restore loads the newest one', async () => {
    const source = await freshDatabase();
    const target = await freshDatabase();
    try {
      const copyFrom = await dumpDatabase(targetFromUrl(url()), path.join(dir, 'seed.sql.gz'));
      await restoreDatabase(targetFromUrl(source.url), copyFrom.file);
      const out = path.join(dir, 'cli');
      const env = { ...process.env, NODE_ENV: 'test', ROWPATH_DATA_DIR: '.data/test' };
      const backup = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db-backup.ts', '--out', out], { env: { ...env, DATABASE_URL: source.url }, encoding: 'utf8' });
      expect(backup.status, backup.stderr).toBe(0);
      expect(backup.stdout).toMatch(/Backed up .*rowpath-\d{8}T\d{6}Z\.sql\.gz/);
      const file = newestBackup(out)!;
      expect(file).toBeTruthy();
      const restore = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db-restore.ts', file, '--yes'], { env: { ...env, DATABASE_URL: target.url }, encoding: 'utf8' });
      expect(restore.status, restore.stderr).toBe(0);
      expect(await fingerprint(t.sequelize, target.name)).toEqual(await fingerprint(t.sequelize, source.name));
      // A file that is not there is refused with a message, and nothing is touched.
      const missing = spawnSync(process.execPath, ['--import', 'tsx', 'scripts/db-restore.ts', path.join(dir, 'nope.sql.gz'), '--yes'], { env: { ...env, DATABASE_URL: target.url }, encoding: 'utf8' });
      expect(missing.status).toBe(1);
      expect(missing.stderr).toMatch(/No backup at/);
    } finally {
      await source.sequelize.close();
      await target.sequelize.close();
    }
  });
});
