import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { seedDemoVisits } from '../../seeders/demo-visits.js';
import { Contact, Visit } from '../../server/db/models/index.js';
import { SETTING_DEFAULTS } from '../../server/modules/settings/settings.service.js';
import { DEFAULT_TIME_ZONE, toLocal } from '../../server/modules/visits/local-time.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(async () => t.close());

describe('demo visits', () => {
  it('when seeded on 2026-12-01, then done check-ups lie last spring, requests have no time, two fixed appointments fall next week, and no time breaks the rules', async () => {
    const territoryId = (await makeTerritory()).id;
    const specialist = await makeUser('specialist', { territoryIds: [territoryId] });
    const accounts: Awaited<ReturnType<typeof makeAccount>>[] = [];
    for (let k = 0; k < 14; k++) accounts.push(await makeAccount(territoryId, { specialistId: specialist.id }));
    await Contact.create({ accountId: accounts[0].id, name: 'Demo Contact', roleOnFarm: null, email: null, phone: null, reminderOptIn: true });
    const now = new Date('2026-12-01T15:00:00Z');
    const { created } = await seedDemoVisits(t.sequelize, { now, specialistIds: [specialist.id] });
    const rows = await Visit.findAll({ where: { specialistId: specialist.id }, order: [['startsAt', 'ASC']] });
    expect(rows).toHaveLength(created);

    const local = (v: Visit) => toLocal(new Date(v.startsAt!), DEFAULT_TIME_ZONE);
    const checkups = rows.filter((v) => v.purpose === 'pre-season-checkup' && v.status === 'done');
    expect(checkups.length).toBeGreaterThanOrEqual(8);
    expect(checkups.some((v) => v.accountId === accounts[0].id)).toBe(true);
    for (const v of checkups) expect(local(v).date >= '2026-03-01' && local(v).date < '2026-05-01').toBe(true);
    const requested = rows.filter((v) => v.status === 'requested');
    expect(requested.filter((v) => v.purpose === 'pre-season-checkup')).toHaveLength(8);
    expect(requested.filter((v) => v.purpose === 'roadmap-review')).toHaveLength(3);
    expect(requested.every((v) => v.startsAt === null)).toBe(true);
    expect(requested.find((v) => v.accountId === accounts[0].id)!.requestedByContactId).not.toBeNull();
    const fixed = rows.filter((v) => v.fixed);
    expect(fixed.map((v) => [local(v).date, local(v).minute])).toEqual([
      ['2026-12-08', 600],
      ['2026-12-10', 840],
    ]);
    for (const v of rows.filter((r) => r.status === 'done')) expect(new Date(v.startsAt!).getTime()).toBeLessThan(now.getTime());

    const timed = rows.filter((v) => v.startsAt);
    for (const v of timed) {
      const { minute } = local(v);
      expect(minute).toBeGreaterThanOrEqual(SETTING_DEFAULTS.dayStartMin);
      expect(minute + v.durationMin).toBeLessThanOrEqual(SETTING_DEFAULTS.dayEndMin);
    }
    for (let k = 1; k < timed.length; k++) {
      expect(new Date(timed[k - 1].startsAt!).getTime() + timed[k - 1].durationMin * 60_000).toBeLessThanOrEqual(new Date(timed[k].startsAt!).getTime());
    }

    // The seeded requests are planning candidates as they stand.
    const c = await signedIn(t.app, specialist);
    const candidates = await c.get('/api/visits/candidates?weekStart=2026-12-07');
    expect(candidates.body.items.filter((i: { kind: string }) => i.kind === 'requested')).toHaveLength(11);
  });
});
