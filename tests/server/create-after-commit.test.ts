// A create must not answer an error for a record it has in fact saved: the client would retry and
// save it twice. The load run with the database stopped found planter creates doing exactly that
// (the answer was read after the commit, and that read failed). Here the database "goes away" the
// moment a transaction commits: every later query fails as if the connection were refused.
import { ConnectionRefusedError, Sequelize, Transaction } from 'sequelize';
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { Account, Planter } from '../../server/db/models/index.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { planterBody } from '../helpers/fleet.js';

let t: TestApp;
let down = false;
const realCommit = Transaction.prototype.commit;
const realQuery = Sequelize.prototype.query;

beforeAll(async () => {
  t = await testApp();
  const sequelize = t.sequelize as unknown as { query: (...args: unknown[]) => Promise<unknown> };
  sequelize.query = function (this: unknown, ...args: unknown[]) {
    if (down) return Promise.reject(new ConnectionRefusedError(new Error('the database went away (test)')));
    return realQuery.apply(this, args as Parameters<typeof realQuery>);
  };
});
afterEach(() => {
  down = false;
  Transaction.prototype.commit = realCommit;
});
afterAll(async () => {
  delete (t.sequelize as unknown as { query?: unknown }).query;
  await t.close();
});

describe('a create whose commit succeeded', () => {
  it('when the database goes away right after the planter is committed, then the answer is still 201 with the planter, and it is saved once', async () => {
    const territory = await makeTerritory();
    const account = await makeAccount(territory.id);
    const specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory.id] }));
    Transaction.prototype.commit = async function (this: Transaction) {
      await realCommit.call(this);
      down = true;
    };
    const res = await specialist.post(`/api/accounts/${account.id}/planters`, planterBody({ name: 'Committed planter' }));
    down = false;
    Transaction.prototype.commit = realCommit;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.planter).toMatchObject({ name: 'Committed planter', accountId: account.id, rows: 16 });
    expect(res.body.planter.toolbars.length).toBeGreaterThan(0);
    expect(await Planter.count({ where: { accountId: account.id } })).toBe(1);
  });

  it('when the database goes away right after a new account is committed, then the answer is still 201 with the account', async () => {
    const territory = await makeTerritory();
    const specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory.id] }));
    Transaction.prototype.commit = async function (this: Transaction) {
      await realCommit.call(this);
      down = true;
    };
    const res = await specialist.post('/api/accounts', { name: `Committed Acres ${territory.id}`, territoryId: territory.id });
    down = false;
    Transaction.prototype.commit = realCommit;
    expect(res.status, JSON.stringify(res.body)).toBe(201);
    expect(res.body.account).toMatchObject({ name: `Committed Acres ${territory.id}`, territoryId: territory.id, contacts: [], planters: [] });
    expect(await Account.count({ where: { territoryId: territory.id } })).toBe(1);
  });

  it('when the database is gone before the commit, then the answer is 503 and nothing is saved', async () => {
    const territory = await makeTerritory();
    const account = await makeAccount(territory.id);
    const specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory.id] }));
    // The connection drops before the commit reaches the server, which rolls the work back.
    Transaction.prototype.commit = async function (this: Transaction) {
      await this.rollback();
      throw new ConnectionRefusedError(new Error('the database went away before the commit (test)'));
    };
    const res = await specialist.post(`/api/accounts/${account.id}/planters`, planterBody());
    Transaction.prototype.commit = realCommit;
    expect(res.status).toBe(503);
    expect(await Planter.count({ where: { accountId: account.id } })).toBe(0);
  });
});
