// The planters list reads each planter's installed-parts count from planters.installed_count,
// kept by triggers on installs (migration 2026.12.02T01). Whoever writes installs, the API, the
// models in bulk or raw SQL, the stored count must equal a fresh COUNT(*).
import { QueryTypes } from 'sequelize';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Install } from '../../server/db/models/index.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(async () => t.close());

async function counts(planterId: number) {
  const [row] = await t.sequelize.query<{ stored: number; fresh: number }>(
    "SELECT p.installed_count AS stored, (SELECT COUNT(*) FROM installs i WHERE i.planter_id = p.id AND i.status = 'installed') AS fresh FROM planters p WHERE p.id = ?",
    { replacements: [planterId], type: QueryTypes.SELECT },
  );
  return { stored: Number(row.stored), fresh: Number(row.fresh) };
}

async function setUp() {
  const territory = await makeTerritory();
  const account = await makeAccount(territory.id);
  const specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory.id] }));
  const made = await specialist.post(`/api/accounts/${account.id}/planters`, planterBody());
  expect(made.status, JSON.stringify(made.body)).toBe(201);
  return { specialist, planter: made.body.planter as { id: number; toolbars: { id: number }[] }, account };
}

describe('installed-parts count kept on the planter', () => {
  it('when installs are added, removed, put back, moved and deleted through the API, then the stored count follows and the list shows it', async () => {
    const { specialist, planter } = await setUp();
    const { planter: other, specialist: otherSpecialist, account: otherAccount } = await setUp();
    const part = await makeComponent();
    const harness = await makeComponent({ unit: 'toolbar', category: 'harness-controller' });
    expect(await counts(planter.id)).toEqual({ stored: 0, fresh: 0 });

    const a = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: part.id, scope: 'all-rows' });
    const b = await specialist.post(`/api/planters/${planter.id}/installs`, { componentId: harness.id, scope: 'toolbar', toolbarId: planter.toolbars[0].id });
    expect([a.status, b.status]).toEqual([201, 201]);
    expect(await counts(planter.id)).toEqual({ stored: 2, fresh: 2 });

    const removed = await specialist.put(`/api/installs/${a.body.install.id}`, { componentId: part.id, scope: 'all-rows', status: 'removed', removedDate: '2026-11-01', removedReason: 'worn', version: a.body.install.version });
    expect(removed.status, JSON.stringify(removed.body)).toBe(200);
    expect(await counts(planter.id)).toEqual({ stored: 1, fresh: 1 });

    const back = await specialist.put(`/api/installs/${a.body.install.id}`, { componentId: part.id, scope: 'all-rows', status: 'installed', version: removed.body.install.version });
    expect(back.status, JSON.stringify(back.body)).toBe(200);
    expect(await counts(planter.id)).toEqual({ stored: 2, fresh: 2 });

    // A record moved to another planter (not an API operation, but the trigger covers it).
    await Install.update({ planterId: other.id }, { where: { id: a.body.install.id } });
    expect(await counts(planter.id)).toEqual({ stored: 1, fresh: 1 });
    expect(await counts(other.id)).toEqual({ stored: 1, fresh: 1 });

    expect((await specialist.delete(`/api/installs/${b.body.install.id}`)).status).toBe(204);
    expect(await counts(planter.id)).toEqual({ stored: 0, fresh: 0 });

    const list = await otherSpecialist.get(`/api/planters?accountId=${otherAccount.id}`);
    expect(list.body.items.find((p: { id: number }) => p.id === other.id).installCount).toBe(1);
  });

  it('when installs are written in bulk through the models or in raw SQL, then the stored count still equals a fresh count', async () => {
    const { planter } = await setUp();
    const part = await makeComponent();
    const base = { planterId: planter.id, componentId: part.id, scope: 'all-rows', quantity: 16, serialNumbers: [] };
    await Install.bulkCreate([{ ...base }, { ...base }, { ...base, status: 'removed', removedDate: '2025-01-01' }] as never);
    expect(await counts(planter.id)).toEqual({ stored: 2, fresh: 2 });
    const now = new Date();
    await t.sequelize.query(
      "INSERT INTO installs (planter_id, component_id, scope, quantity, serial_numbers, status, version, created_at, updated_at) VALUES (?, ?, 'all-rows', 16, '[]', 'installed', 0, ?, ?)",
      { replacements: [planter.id, part.id, now, now] },
    );
    expect(await counts(planter.id)).toEqual({ stored: 3, fresh: 3 });
    await t.sequelize.query("UPDATE installs SET status = 'removed' WHERE planter_id = ?", { replacements: [planter.id] });
    expect(await counts(planter.id)).toEqual({ stored: 0, fresh: 0 });
  });

  it('when ten parts are installed on one planter at the same moment, then every one is saved and counted, without a deadlock', async () => {
    const { specialist, planter } = await setUp();
    const parts = await Promise.all(Array.from({ length: 10 }, () => makeComponent()));
    const answers = await Promise.all(parts.map((p) => specialist.post(`/api/planters/${planter.id}/installs`, { componentId: p.id, scope: 'rows', rowFrom: 1, rowTo: 4 })));
    expect(answers.map((r) => r.status)).toEqual(parts.map(() => 201));
    expect(await counts(planter.id)).toEqual({ stored: 10, fresh: 10 });
  });
});
