// The accounts and planters lists are written in plain SQL for speed (see bench/fleet-lists.ts).
// These tests hold them to a reference built the slow, obvious way with Sequelize models and the
// model-level scope (accountScope): same rows, same order, same total, for every role, on random
// paging, sorting, search and filters, including duplicate names (ties) and LIKE wildcards typed
// as text.
import fc from 'fast-check';
import { Op, type Order, type WhereOptions } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { accountScope, accountScopeSql } from '../../server/auth/access.js';
import { Account, Install, Planter, Territory, User } from '../../server/db/models/index.js';
import { listAccounts } from '../../server/modules/accounts/accounts.repository.js';
import { listPlanters } from '../../server/modules/fleet/planters.service.js';
import { accountSortKeys, accountStatuses, type AccountListQuery } from '../../shared/schemas/accounts.js';
import type { SessionUser } from '../../shared/schemas/auth.js';
import type { PlanterListQuery } from '../../shared/schemas/fleet.js';
import { makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';
import { planterBody } from '../helpers/fleet.js';

let t: TestApp;
const users: SessionUser[] = [];
const tag = uid();
const NAMES = ['Ridge Farms', 'Creek Acres', 'Ridge Farms', 'Oak 100% Seed', 'Under_score Ag', 'creek acres'];
const TOWNS = ['Millbrook', 'Ridgeville', null, 'Creekside'];
const SEARCHES = [undefined, 'ridge', 'Creek', 'ville', '100%', '_', 'zzz', tag];

const sessionUser = (u: User, territoryIds: number[]): SessionUser => ({ id: u.id, email: u.email, name: u.name, role: u.role, territoryIds, accountId: u.accountId });

beforeAll(async () => {
  t = await testApp();
  const [t1, t2] = [await makeTerritory(), await makeTerritory()];
  const specialist = await makeUser('specialist', { territoryIds: [t1.id] });
  const accounts: Account[] = [];
  for (let i = 0; i < 24; i++) {
    accounts.push(
      await Account.create({
        name: `${NAMES[i % NAMES.length]} ${i % 5 === 0 ? tag : ''}`.trim(),
        territoryId: i % 3 === 0 ? t2.id : t1.id,
        specialistId: i % 2 ? specialist.id : null,
        status: accountStatuses[i % accountStatuses.length],
        address: null,
        town: TOWNS[i % TOWNS.length],
        state: 'KS',
        lat: 39 + i / 100,
        lng: -98,
        notes: null,
      }),
    );
  }
  for (const [i, account] of accounts.entries()) {
    for (let j = 0; j < (i % 3) + 1; j++) {
      await Planter.create({ ...planterBody({ name: `${j % 2 ? 'Split' : 'Main'} planter ${tag}`, maker: j ? 'Prairie_Works' : 'Hillcrest 50%', rows: [8, 12, 16, 24][(i + j) % 4] }), accountId: account.id });
    }
  }
  const grower = await makeUser('grower', { accountId: accounts[4].id });
  users.push(
    sessionUser(await makeUser('admin'), []),
    sessionUser(await makeUser('manager', { territoryIds: [t1.id, t2.id] }), [t1.id, t2.id].sort((a, b) => a - b)),
    sessionUser(specialist, [t1.id]),
    sessionUser(await makeUser('specialist'), []),
    sessionUser(grower, []),
  );
});
afterAll(async () => t.close());

const like = (q: string) => ({ [Op.like]: `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%` });

/** The accounts list the obvious way: every matching row through the models, then a slice. */
async function referenceAccounts(user: SessionUser, query: AccountListQuery) {
  const where: WhereOptions[] = [accountScope(user)];
  if (query.q) where.push({ [Op.or]: [{ name: like(query.q) }, { town: like(query.q) }] });
  if (query.territoryId) where.push({ territoryId: query.territoryId });
  if (query.status) where.push({ status: query.status });
  const dir = query.sort.startsWith('-') ? 'DESC' : 'ASC';
  const columns: Record<string, string[]> = { name: ['name', 'town'], town: ['town', 'name'], status: ['status', 'name'], updatedAt: ['updatedAt'] };
  const order = [...columns[query.sort.replace(/^-/, '')], 'id'].map((c) => [c, dir]) as Order;
  const rows = await Account.findAll({ where: { [Op.and]: where }, order, include: [{ model: Territory, as: 'territory' }, { model: User, as: 'specialist' }] });
  const start = (query.page - 1) * query.pageSize;
  return {
    total: rows.length,
    items: rows.slice(start, start + query.pageSize).map((a) => {
      const loaded = a as Account & { territory: Territory | null; specialist: User | null };
      return { id: a.id, name: a.name, status: a.status, town: a.town, state: a.state, territoryId: a.territoryId, territoryName: loaded.territory?.name ?? null, specialistId: a.specialistId, specialistName: loaded.specialist?.name ?? null, lat: a.lat === null ? null : Number(a.lat), lng: a.lng === null ? null : Number(a.lng) };
    }),
  };
}

async function referencePlanters(user: SessionUser, query: PlanterListQuery) {
  const where: WhereOptions[] = [];
  if (query.accountId) where.push({ accountId: query.accountId });
  if (query.minRows) where.push({ rows: { [Op.gte]: query.minRows } });
  if (query.q) where.push({ [Op.or]: [{ name: like(query.q) }, { maker: like(query.q) }, { '$account.name$': like(query.q) }] });
  const dir = query.sort.startsWith('-') ? 'DESC' : 'ASC';
  const key = query.sort.replace(/^-/, '');
  const order = (key === 'account' ? [[{ model: Account, as: 'account' }, 'name', dir]] : [[key, dir]]).concat([['id', 'ASC']]) as Order;
  const rows = await Planter.findAll({ where: { [Op.and]: where }, order, include: [{ model: Account, as: 'account', where: accountScope(user), required: true }] });
  const start = (query.page - 1) * query.pageSize;
  const page = rows.slice(start, start + query.pageSize);
  const counts = await Promise.all(page.map((p) => Install.count({ where: { planterId: p.id, status: 'installed' } })));
  return {
    total: rows.length,
    items: page.map((p, i) => {
      const account = (p as Planter & { account: Account }).account;
      return { id: p.id, name: p.name, maker: p.maker, modelYear: p.modelYear, rows: p.rows, rowSpacingIn: Number(p.rowSpacingIn), frameType: p.frameType, accountId: account.id, accountName: account.name, installCount: counts[i] };
    }),
  };
}

const paging = { page: fc.integer({ min: 1, max: 4 }), pageSize: fc.integer({ min: 1, max: 9 }), q: fc.constantFrom(...SEARCHES) };

describe('fleet lists in plain SQL', () => {
  it('when any role lists accounts with random paging, sorting, search and filters, then rows, order and total equal the model-level reference', async () => {
    const territoryIds = [...new Set(users.flatMap((u) => u.territoryIds))];
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...users),
        fc.record({ ...paging, sort: fc.constantFrom(...accountSortKeys), status: fc.option(fc.constantFrom(...accountStatuses), { nil: undefined }), territoryId: fc.option(fc.constantFrom(...territoryIds), { nil: undefined }) }),
        async (user, query) => {
          const q = query as AccountListQuery;
          expect(await listAccounts(user, q)).toEqual(await referenceAccounts(user, q));
        },
      ),
      { numRuns: 120 },
    );
  });

  it('when any role lists planters with random paging, sorting, search and a row filter, then rows, order, install counts and total equal the model-level reference', async () => {
    const accountIds = (await Account.findAll({ where: { name: { [Op.like]: `%${tag}%` } }, attributes: ['id'] })).map((a) => a.id);
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...users),
        fc.record({
          ...paging,
          sort: fc.constantFrom('name', '-name', 'rows', '-rows', 'modelYear', '-modelYear', 'account', '-account'),
          minRows: fc.option(fc.constantFrom(8, 12, 16, 24), { nil: undefined }),
          accountId: fc.option(fc.constantFrom(...accountIds), { nil: undefined }),
        }),
        async (user, query) => {
          const q = query as PlanterListQuery;
          expect(await listPlanters(user, q)).toEqual(await referencePlanters(user, q));
        },
      ),
      { numRuns: 120 },
    );
  });

  it('when the SQL scope and the model scope are asked about every account for every role, then they admit the same accounts', async () => {
    for (const user of [...users, { ...users[0], role: 'visitor' as SessionUser['role'] }]) {
      const sql = accountScopeSql(user, 'a');
      const viaSql = await t.sequelize.query<{ id: number }>(`SELECT a.id FROM accounts a WHERE ${sql.sql} ORDER BY a.id`, { replacements: sql.replacements, type: 'SELECT' as never });
      const viaModel = await Account.findAll({ where: accountScope(user), attributes: ['id'], order: [['id', 'ASC']] });
      expect(viaSql.map((r) => r.id)).toEqual(viaModel.map((a) => a.id));
    }
  });

  it('when a specialist pages through the accounts list over HTTP, then the pages are disjoint and add up to the total', async () => {
    const user = await makeUser('specialist', { territoryIds: users[2].territoryIds });
    const agent = await signedIn(t.app, user);
    const seen = new Set<number>();
    let total = 0;
    for (let page = 1; page <= 10; page++) {
      const res = await agent.get(`/api/accounts?page=${page}&pageSize=3&sort=-name&q=${tag}`);
      expect(res.status).toBe(200);
      total = res.body.total;
      for (const item of res.body.items) seen.add(item.id);
    }
    expect(total).toBeGreaterThan(0);
    expect(seen.size).toBe(total);
  });

  it('when the list totals are cached and accounts are added through this instance or behind its back, then the next totals count them (at once, or within half a second)', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const territory = await makeTerritory();
    const path = `/api/accounts?q=${tag}-cached&territoryId=${territory.id}`;
    const total = async () => (await admin.get(path)).body.total;
    await new Promise((r) => setTimeout(r, 2600)); // past the settling time, so that totals are cached
    expect(await total()).toBe(0);
    expect(await total()).toBe(0);
    const made = await admin.post('/api/accounts', { name: `Cached ${tag}-cached`, territoryId: territory.id });
    expect(made.status).toBe(201);
    expect(await total()).toBe(1); // a write through this instance's models drops the stamp on commit
    await new Promise((r) => setTimeout(r, 2600));
    expect(await total()).toBe(1);
    // Another instance (plain SQL: no hooks here) adds one and removes the first.
    await t.sequelize.query("INSERT INTO accounts (name, status, territory_id, state, acres_by_crop, version, created_at, updated_at) VALUES (?, 'active', ?, 'KS', '{}', 0, UTC_TIMESTAMP(), UTC_TIMESTAMP())", { replacements: [`Behind ${tag}-cached`, territory.id] });
    await new Promise((r) => setTimeout(r, 400));
    expect(await total()).toBe(2);
    await t.sequelize.query('DELETE FROM accounts WHERE id = ?', { replacements: [made.body.account.id] });
    await new Promise((r) => setTimeout(r, 400));
    expect(await total()).toBe(1);
  });
});
