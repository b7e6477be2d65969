// Pre-season reminders through the API, on the real MariaDB and a real SMTP stand-in listening on
// an ephemeral port: calendar, campaigns, previews, test sends, runs, the outbox, sent mail, the
// grower's links and preferences — and the 400/401/403/404/409 answers.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { inject } from 'vitest';
import request from 'supertest';
import type { Sequelize } from 'sequelize';
import { Account, AuditEvent, Contact, ReceivedMail, ReminderCampaign, ReminderOutbox, RoadmapItem, SeasonWindow, Visit } from '../../server/db/models/index.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { drainOutbox } from '../../server/jobs/sender.js';
import { startSmtpStandIn, storeReceivedMessage, type SmtpStandIn } from '../../server/mail/smtp-standin.js';
import { createMailTransport } from '../../server/mail/transport.js';
import { signReminderToken } from '../../server/modules/reminders/tokens.js';
import { seedDemoReminders } from '../../seeders/demo-reminders.js';
import { templateProblems } from '../../shared/calc/merge-template.js';
import { client, makeAccount, makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';
import { makeComponent, planterBody } from '../helpers/fleet.js';

type Client = Awaited<ReturnType<typeof signedIn>>;
let t: TestApp;
let smtpDb: Sequelize;
let smtp: SmtpStandIn;
let territoryId: number;
let otherTerritoryId: number;
let admin: Client;
let specialist: Client;
let otherSpecialist: Client;
let specialistEmail: string;

const DAY_MS = 86_400_000;
const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/** A calendar region whose corn window opens in 5 days, so a 10-day reminder is due today. */
async function dueRegion() {
  let start = Date.now() + 5 * DAY_MS;
  if (isoDay(start).endsWith('12-31')) start -= DAY_MS;
  const regionKey = `t-${uid()}`;
  await SeasonWindow.create({ regionKey, regionLabel: 'Test region', crop: 'corn', windowStart: isoDay(start).slice(5), windowEnd: isoDay(start + DAY_MS).slice(5), source: 'test', sourceText: null, updatedBy: null });
  return { regionKey, season: Number(isoDay(start).slice(0, 4)), windowStartDate: isoDay(start) };
}

async function grower(territory: number, opts: { cornAcres?: number; contacts?: { name?: string; optIn?: boolean; email?: string | null }[]; specialistId?: number } = {}) {
  const account = await makeAccount(territory, { specialistId: opts.specialistId ?? null });
  await Account.update({ acresByCrop: { corn: opts.cornAcres ?? 600, soybean: 300 } }, { where: { id: account.id } });
  const contacts = [];
  for (const c of opts.contacts ?? [{}]) {
    contacts.push(
      await Contact.create({
        accountId: account.id,
        name: c.name ?? `Pat ${uid()}`,
        roleOnFarm: null,
        email: c.email === undefined ? `grower-${uid()}@growers.rowpath.test` : c.email,
        phone: null,
        reminderOptIn: c.optIn ?? true,
      }),
    );
  }
  return { account, contacts };
}

const campaignBody = (regionKey: string, season: number, over: Record<string, unknown> = {}) => ({
  name: `Check-up ${uid()}`,
  season,
  regionKey,
  crop: 'corn',
  offsetsDays: [10, 30],
  audience: { territoryIds: [territoryId] },
  subject: 'Check-up time, {{grower.firstName}}',
  body: 'Hello {{grower.name}} of {{account.name}},\n\nYour planters:\n\n{{planters}}\n\n{{checklist}}\n\n{{bookingLink}}',
  status: 'active',
  ...over,
});

async function newCampaign(c: Client, body: Record<string, unknown>) {
  const res = await c.post('/api/campaigns', body);
  expect(res.status, JSON.stringify(res.body)).toBe(201);
  return res.body.campaign;
}

function sender() {
  return { sequelize: t.sequelize, transport: createMailTransport({ localPort: smtp.port }), from: 'Rowpath test <reminders@rowpath.test>', backoffBaseMs: 100 };
}

beforeAll(async () => {
  smtpDb = createSequelize(inject('databaseUrl'));
  smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
  t = await testApp({ LOCAL_SMTP_PORT: String(smtp.port), PUBLIC_URL: 'http://127.0.0.1:4999' });
  territoryId = (await makeTerritory()).id;
  otherTerritoryId = (await makeTerritory()).id;
  admin = await signedIn(t.app, await makeUser('admin'));
  const spec = await makeUser('specialist', { territoryIds: [territoryId] });
  specialistEmail = spec.email;
  specialist = await signedIn(t.app, spec);
  otherSpecialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [otherTerritoryId] }));
});

afterAll(async () => {
  await smtp?.close();
  await smtpDb?.close();
  await t?.close();
});

describe('season calendar', () => {
  it('when staff read the calendar, then the published Kansas and Iowa defaults show with their sources', async () => {
    const res = await specialist.get('/api/season-calendar?season=2027');
    expect(res.status).toBe(200);
    const ksCorn = res.body.entries.find((e: { regionKey: string; crop: string }) => e.regionKey === 'ks-north-central' && e.crop === 'corn');
    // USDA-NASS Agricultural Handbook 628 (2010) via K-State: Kansas corn Apr 15 – May 15.
    expect(ksCorn).toMatchObject({ windowStart: '04-15', windowEnd: '05-15', windowStartDate: '2027-04-15', isDefault: true });
    expect(ksCorn.source).toMatch(/Handbook 628/);
    expect(ksCorn.sourceText).toMatch(/April 15 to May 15/);
    const iaNe = res.body.entries.find((e: { regionKey: string }) => e.regionKey === 'ia-northeast');
    // Iowa State ICM, Abendroth & Elmore (2010): north-east Iowa Apr 12 – May 2.
    expect(iaNe).toMatchObject({ windowStart: '04-12', windowEnd: '05-02' });
  });

  it('when a manager sets a region’s own dates, then they replace the default until reset, and the published source stays visible', async () => {
    const manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
    const regionKey = `ks-${uid()}`;
    const set = await manager.put('/api/season-calendar', { entries: [{ regionKey, regionLabel: 'Our valley', crop: 'soybean', windowStart: '05-10', windowEnd: '06-15', source: 'Dealer agronomist, 2026' }] });
    expect(set.status, JSON.stringify(set.body)).toBe(200);
    expect(set.body.entries.find((e: { regionKey: string }) => e.regionKey === regionKey)).toMatchObject({ windowStart: '05-10', isDefault: false, source: 'Dealer agronomist, 2026', published: null });
    const reset = await admin.put('/api/season-calendar', { entries: [{ regionKey, crop: 'soybean', reset: true }] });
    expect(reset.body.entries.find((e: { regionKey: string }) => e.regionKey === regionKey)).toBeUndefined();
  });

  it('when the calendar is changed badly or by the wrong role, then 400 names the field and 403 refuses specialists and growers', async () => {
    const bad = await admin.put('/api/season-calendar', { entries: [{ regionKey: 'ks-north-central', crop: 'corn', windowStart: '02-30', windowEnd: '01-01' }] });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields['entries.0.windowStart']).toMatch(/month and day/);
    const backwards = await admin.put('/api/season-calendar', { entries: [{ regionKey: 'ks-north-central', crop: 'corn', windowStart: '05-01', windowEnd: '04-01' }] });
    expect(backwards.body.error.details.fields['entries.0.windowEnd']).toMatch(/close after it opens/);
    const newRegion = await admin.put('/api/season-calendar', { entries: [{ regionKey: `new-${uid()}`, crop: 'corn', windowStart: '04-20', windowEnd: '05-20' }] });
    expect(newRegion.body.error.details.fields['entries.0.regionLabel']).toMatch(/Name the new region/);
    expect((await specialist.put('/api/season-calendar', { entries: [{ regionKey: 'x1', crop: 'corn', reset: true }] })).status).toBe(403);
    const account = await makeAccount(territoryId);
    const growerClient = await signedIn(t.app, await makeUser('grower', { accountId: account.id }));
    expect((await growerClient.get('/api/season-calendar')).status).toBe(403);
    expect((await client(t.app).get('/api/season-calendar')).status).toBe(401);
  });
});

describe('campaigns', () => {
  it('when a specialist creates a campaign, then it reads back with its window, each reminder’s date and empty outbox counts', async () => {
    const { regionKey, season, windowStartDate } = await dueRegion();
    const c = await newCampaign(specialist, campaignBody(regionKey, season, { offsetsDays: [10, 60, 30] }));
    expect(c).toMatchObject({ season, regionKey, offsetsDays: [60, 30, 10], status: 'active', version: 0, audience: { territoryIds: [territoryId], growsCrop: true, hasRoadmapItems: false, noCheckupSince: null } });
    expect(c.window.windowStartDate).toBe(windowStartDate);
    expect(c.schedule.find((s: { offsetDays: number }) => s.offsetDays === 10).state).toBe('due');
    expect(c.schedule.find((s: { offsetDays: number }) => s.offsetDays === 60).state).toBe('superseded');
    expect(c.outbox).toEqual({ pending: 0, sending: 0, sent: 0, failed: 0, cancelled: 0, held: 0 });
    const list = await specialist.get(`/api/campaigns?season=${season}`);
    expect(list.body.items.map((i: { id: number }) => i.id)).toContain(c.id);
    expect((await specialist.get(`/api/campaigns/${c.id}`)).body.campaign.name).toBe(c.name);
  });

  it('when a template names an unknown merge field, then saving is refused with 400 naming the field, and nothing is stored', async () => {
    const { regionKey, season } = await dueRegion();
    const before = await ReminderCampaign.count();
    const res = await specialist.post('/api/campaigns', campaignBody(regionKey, season, { body: 'Hello {{grower.nmae}},\n\n{{checklist}}' }));
    expect(res.status).toBe(400);
    expect(res.body.error.details.fields.body).toMatch(/Unknown merge field \{\{grower\.nmae\}\}/);
    const subj = await specialist.post('/api/campaigns', campaignBody(regionKey, season, { subject: 'For {{farm.name}}' }));
    expect(subj.body.error.details.fields.subject).toMatch(/\{\{farm\.name\}\}/);
    expect(await ReminderCampaign.count()).toBe(before);

    const c = await newCampaign(specialist, campaignBody(regionKey, season));
    const patch = await specialist.patch(`/api/campaigns/${c.id}`, { body: 'Bye {{unsubscribe_link}}', version: c.version });
    expect(patch.status).toBe(400);
    expect(patch.body.error.details.fields.body).toMatch(/\{\{unsubscribe_link\}\}/);
    expect((await ReminderCampaign.findByPk(c.id))!.body).toBe(c.body);
  });

  it('when inputs are impossible, then 400 names each field', async () => {
    const res = await specialist.post('/api/campaigns', { name: '', season: 1999, regionKey: 'Bad Key', crop: 'rice', offsetsDays: [10, 10, -1], audience: { territoryIds: [] }, subject: '', body: '' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields)).toEqual(expect.arrayContaining(['name', 'season', 'regionKey', 'crop', 'audience.territoryIds', 'subject', 'body']));
    expect(res.body.error.details.fields['offsetsDays.2'] ?? res.body.error.details.fields.offsetsDays).toBeTruthy();
    const noWindow = await specialist.post('/api/campaigns', campaignBody('no-such-region', 2027));
    expect(noWindow.status).toBe(400);
    expect(noWindow.body.error.details.fields.regionKey).toMatch(/no corn planting window/);
    const ghostTerritory = await admin.post('/api/campaigns', campaignBody('ks-north-central', 2027, { audience: { territoryIds: [99999999] } }));
    expect(ghostTerritory.body.error.details.fields['audience.territoryIds']).toMatch(/does not exist/);
  });

  it('when staff reach beyond their territories, then 403 on create and change, 404 on reading another’s campaign, 403 for growers', async () => {
    const mine = await newCampaign(specialist, campaignBody('ks-north-central', 2027));
    expect((await specialist.post('/api/campaigns', campaignBody('ks-north-central', 2027, { audience: { territoryIds: [otherTerritoryId] } }))).status).toBe(403);
    expect((await otherSpecialist.get(`/api/campaigns/${mine.id}`)).status).toBe(404);
    expect((await otherSpecialist.get('/api/campaigns')).body.items.map((i: { id: number }) => i.id)).not.toContain(mine.id);
    // A campaign over two territories: a manager of only one may read it but not change or run it.
    const both = await newCampaign(admin, campaignBody('ks-north-central', 2027, { audience: { territoryIds: [territoryId, otherTerritoryId] } }));
    const halfManager = await signedIn(t.app, await makeUser('manager', { territoryIds: [otherTerritoryId] }));
    expect((await halfManager.get(`/api/campaigns/${both.id}`)).status).toBe(200);
    expect((await halfManager.patch(`/api/campaigns/${both.id}`, { name: 'Mine now', version: both.version })).status).toBe(403);
    expect((await halfManager.post(`/api/campaigns/${both.id}/run`)).status).toBe(403);
    const account = await makeAccount(territoryId);
    const growerClient = await signedIn(t.app, await makeUser('grower', { accountId: account.id }));
    expect((await growerClient.get('/api/campaigns')).status).toBe(403);
    expect((await growerClient.get(`/api/campaigns/${mine.id}`)).status).toBe(403);
    expect((await client(t.app).get('/api/campaigns')).status).toBe(401);
    expect((await specialist.get('/api/campaigns/99999999')).status).toBe(404);
    expect((await specialist.get('/api/campaigns/abc')).status).toBe(400);
  });

  it('when two people edit the same campaign, then the second save gets 409 and the first one stands; changes are audited', async () => {
    const c = await newCampaign(specialist, campaignBody('ks-north-central', 2027));
    const first = await specialist.patch(`/api/campaigns/${c.id}`, { name: 'First edit', offsetsDays: [45, 15], version: c.version });
    expect(first.status, JSON.stringify(first.body)).toBe(200);
    expect(first.body.campaign).toMatchObject({ name: 'First edit', offsetsDays: [45, 15], version: c.version + 1 });
    const second = await specialist.patch(`/api/campaigns/${c.id}`, { name: 'Second edit', version: c.version });
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('stale');
    expect((await ReminderCampaign.findByPk(c.id))!.name).toBe('First edit');
    const trail = await AuditEvent.findAll({ where: { entity: 'reminderCampaign', entityId: c.id } });
    expect(trail.map((e) => e.action).sort()).toEqual(['create', 'update']);
    expect((await specialist.patch(`/api/campaigns/${c.id}`, { name: 'No version' })).status).toBe(400);
  });
});

describe('preview and test send', () => {
  it('when previews are asked for several growers, then each reads with that grower’s name, farm and planters, and says who is outside the audience', async () => {
    const { regionKey, season } = await dueRegion();
    const a = await grower(territoryId, { contacts: [{ name: 'Corinne Haldane' }] });
    const planter = await specialist.post(`/api/accounts/${a.account.id}/planters`, planterBody({ name: 'Home 24-row', rows: 24, toolbars: [{ name: 'Main bar', sizeFt: 60, firstRow: 1, lastRow: 24 }] }));
    expect(planter.status, JSON.stringify(planter.body)).toBe(201);
    const b = await grower(territoryId, { cornAcres: 0, contacts: [{ name: 'Emrys Vantongeren', optIn: false }] });
    const c = await newCampaign(specialist, campaignBody(regionKey, season));

    const pa = await specialist.post(`/api/campaigns/${c.id}/preview`, { contactId: a.contacts[0].id });
    expect(pa.status, JSON.stringify(pa.body)).toBe(200);
    expect(pa.body.preview).toMatchObject({ subject: 'Check-up time, Corinne', inAudience: true, offsetDays: 10, to: a.contacts[0].email, account: { id: a.account.id } });
    expect(pa.body.preview.text).toContain(`Hello Corinne Haldane of ${a.account.name},`);
    expect(pa.body.preview.text).toContain('Home 24-row — 24 rows at 30 in');
    expect(pa.body.preview.text).toMatch(/14\.5 in/);
    expect(pa.body.preview.html).toContain('<li>Home 24-row — 24 rows at 30 in</li>');
    expect(pa.body.preview.html).not.toMatch(/<img/i);

    const pb = await specialist.post(`/api/campaigns/${c.id}/preview`, { contactId: b.contacts[0].id });
    expect(pb.body.preview.subject).toBe('Check-up time, Emrys');
    expect(pb.body.preview.inAudience).toBe(false);
    expect(pb.body.preview.notInAudienceBecause.join(' ')).toMatch(/not opted in/);
    expect(pb.body.preview.notInAudienceBecause.join(' ')).toMatch(/no corn acres/);

    const draft = await specialist.post(`/api/campaigns/${c.id}/preview`, { contactId: a.contacts[0].id, body: 'Draft for {{grower.firstName}}' });
    expect(draft.body.preview.text).toContain('Draft for Corinne');
    expect((await specialist.post(`/api/campaigns/${c.id}/preview`, { contactId: a.contacts[0].id, body: '{{nope}}' })).body.error.details.fields.body).toMatch(/nope/);
    // Preview links are test links: following the unsubscribe link changes nothing.
    const link = /unsubscribe\?token=([^"\s&]+)/.exec(pa.body.preview.text)![1];
    const follow = await request(t.app).get(`/api/reminders/unsubscribe?token=${link}`).set('Accept', 'application/json');
    expect(follow.body).toMatchObject({ test: true, unsubscribed: false });
    expect((await Contact.findByPk(a.contacts[0].id))!.reminderOptIn).toBe(true);
  });

  it('when a preview names a contact outside the user’s scope or the campaign, then 404 or 400', async () => {
    const c = await newCampaign(specialist, campaignBody('ks-north-central', 2027));
    const foreign = await grower(otherTerritoryId);
    expect((await specialist.post(`/api/campaigns/${c.id}/preview`, { contactId: foreign.contacts[0].id })).status).toBe(404);
    expect((await admin.post(`/api/campaigns/${c.id}/preview`, { contactId: foreign.contacts[0].id })).status).toBe(400);
    expect((await specialist.post(`/api/campaigns/${c.id}/preview`, { contactId: 99999999 })).status).toBe(404);
    expect((await specialist.post(`/api/campaigns/${c.id}/preview`, {})).status).toBe(400);
  });

  it('when a test is sent, then the stand-in receives it at the user’s own address, marked as a test, and the outbox is untouched', async () => {
    const a = await grower(territoryId, { contacts: [{ name: 'Lorcan Ibsworth' }] });
    const c = await newCampaign(specialist, campaignBody('ks-north-central', 2027));
    const before = await ReminderOutbox.count();
    const res = await specialist.post(`/api/campaigns/${c.id}/test-send`, { contactId: a.contacts[0].id });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    expect(res.body).toMatchObject({ sent: true, to: specialistEmail });
    const got = await ReceivedMail.findOne({ where: { messageId: res.body.messageId } });
    expect(got?.subject).toBe('[Test] Check-up time, Lorcan');
    expect(got?.envelopeTo).toEqual([specialistEmail]);
    expect(got?.text).toContain('Hello Lorcan Ibsworth');
    expect(got?.html).toContain('<li>');
    expect(await ReminderOutbox.count()).toBe(before);
  });

  it('when the SMTP server is down, then a test send answers 502 with the reason', async () => {
    const down = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
    const port = down.port;
    await down.close();
    const t2 = await testApp({ LOCAL_SMTP_PORT: String(port) }, t.sequelize);
    const spec2 = await signedIn(t2.app, await makeUser('specialist', { territoryIds: [territoryId] }));
    const a = await grower(territoryId);
    const c = await newCampaign(spec2, campaignBody('ks-north-central', 2027));
    const res = await spec2.post(`/api/campaigns/${c.id}/test-send`, { contactId: a.contacts[0].id, to: 'someone@rowpath.test' });
    expect(res.status).toBe(502);
    expect(res.body.error.code).toBe('smtp_unavailable');
    expect(res.body.error.message).toMatch(/ECONNREFUSED|connect/i);
  });
});

describe('running a campaign, the outbox and sent mail', () => {
  it('when a due campaign is run twice, then each opted-in grower is enqueued once, and sending delivers HTML and text with a one-click unsubscribe', async () => {
    const { regionKey, season } = await dueRegion();
    // A territory of its own, so that growers made by other tests stay out of the audience.
    const tid = (await makeTerritory()).id;
    const spec = await signedIn(t.app, await makeUser('specialist', { territoryIds: [tid] }));
    const a = await grower(tid, { contacts: [{ name: 'Ines Marchetti' }, { name: 'Tobias Oyelaran' }] });
    const optedOut = await grower(tid, { contacts: [{ optIn: false }] });
    const noEmail = await grower(tid, { contacts: [{ email: null }] });
    const noCorn = await grower(tid, { cornAcres: 0 });
    const elsewhere = await grower(otherTerritoryId);
    const c = await newCampaign(spec, campaignBody(regionKey, season, { audience: { territoryIds: [tid] } }));

    const run = await spec.post(`/api/campaigns/${c.id}/run`);
    expect(run.status, JSON.stringify(run.body)).toBe(200);
    expect(run.body.run).toMatchObject({ campaignId: c.id, offsetDays: 10, enqueued: 2, alreadyQueued: 0, audience: 2 });
    const again = await spec.post(`/api/campaigns/${c.id}/run`);
    expect(again.body.run).toMatchObject({ enqueued: 0, alreadyQueued: 2 });
    const rows = await ReminderOutbox.findAll({ where: { campaignId: c.id } });
    expect(rows.map((r) => r.contactId).sort()).toEqual(a.contacts.map((x) => x.id).sort());
    for (const g of [optedOut, noEmail, noCorn, elsewhere]) expect(rows.some((r) => r.accountId === g.account.id)).toBe(false);

    const pending = await spec.get(`/api/outbox?campaignId=${c.id}&status=pending`);
    expect(pending.body.total).toBe(2);
    expect(pending.body.items[0]).toMatchObject({ campaignName: c.name, accountName: a.account.name, offsetDays: 10, status: 'pending', attempts: 0 });

    await drainOutbox(sender());
    const sent = await spec.get(`/api/outbox?campaignId=${c.id}`);
    expect(sent.body.counts).toMatchObject({ sent: 2, pending: 0 });
    expect(sent.body.items.every((i: { sentAt: string | null }) => i.sentAt)).toBe(true);

    const list = await admin.get('/api/sent-mail?pageSize=200');
    expect(list.status).toBe(200);
    const mine = list.body.items.filter((m: { messageId: string }) => m.messageId.startsWith(`<reminder.${c.id}.`));
    expect(mine).toHaveLength(2);
    const detail = await admin.get(`/api/sent-mail/${mine[0].id}`);
    const m = detail.body.message;
    expect(m.subject).toMatch(/^Check-up time, (Ines|Tobias)$/);
    expect(m.text).toContain('Opener disc wear');
    expect(m.html).toContain('<ul');
    expect(m.html).not.toMatch(/<img|src=/i);
    expect(m.headers['list-unsubscribe']).toMatch(/^<http:\/\/127\.0\.0\.1:4999\/api\/reminders\/unsubscribe\?token=/);
    expect(m.headers['list-unsubscribe-post']).toBe('List-Unsubscribe=One-Click');
    expect(m.repeatCount).toBe(0);
  });

  it('when the audience asks for this season’s roadmap items and no recent check-up, then only growers who fit are enqueued, with their items listed', async () => {
    const { regionKey, season } = await dueRegion();
    const tid = (await makeTerritory()).id;
    const spec = await signedIn(t.app, await makeUser('specialist', { territoryIds: [tid] }));
    const part = await makeComponent({ name: `Electric drive ${uid()}` });
    const withItems = await grower(tid, { contacts: [{ name: 'Hollis Grange' }] });
    const checkedUp = await grower(tid);
    const declinedOnly = await grower(tid);
    const inactive = await grower(tid);
    await Account.update({ status: 'inactive' }, { where: { id: inactive.account.id } });
    for (const [g, stage] of [[withItems, 'accepted'], [checkedUp, 'proposed'], [declinedOnly, 'declined'], [inactive, 'accepted']] as const) {
      const p = await spec.post(`/api/accounts/${g.account.id}/planters`, planterBody());
      await RoadmapItem.create({ accountId: g.account.id, planterId: p.body.planter.id, componentId: part.id, season, quantity: 16, partsUsd: 100, labourHours: 1, labourUsd: 125, stage, probabilityOverride: null, goalIds: [], explanation: null, specialistId: null, installWeek: null, stageChangedAt: null });
    }
    await Visit.create({ accountId: checkedUp.account.id, specialistId: null, planterId: null, purpose: 'pre-season-checkup', status: 'done', startsAt: new Date(), durationMin: 60, windowStartMin: null, windowEndMin: null, notes: null, checklist: [], roadmapItemIds: [], requestedByContactId: null });
    const c = await newCampaign(spec, campaignBody(regionKey, season, { audience: { territoryIds: [tid], hasRoadmapItems: true, noCheckupSince: `${season - 1}-06-01` }, body: 'Planned: {{roadmapItems}}' }));
    const audience = await spec.get(`/api/campaigns/${c.id}/audience`);
    expect(audience.body.items.map((i: { accountId: number }) => i.accountId)).toEqual([withItems.account.id]);
    const run = await spec.post(`/api/campaigns/${c.id}/run`);
    expect(run.body.run).toMatchObject({ enqueued: 1, audience: 1 });
    const row = (await ReminderOutbox.findOne({ where: { campaignId: c.id } }))!;
    expect(row.text).toContain(`Planned: ${part.name} × 16 on the 16-row test planter`);
    const why = await spec.post(`/api/campaigns/${c.id}/preview`, { contactId: checkedUp.contacts[0].id });
    expect(why.body.preview.notInAudienceBecause.join(' ')).toMatch(/check-up was done/);
    const why2 = await spec.post(`/api/campaigns/${c.id}/preview`, { contactId: declinedOnly.contacts[0].id });
    expect(why2.body.preview.notInAudienceBecause.join(' ')).toMatch(/no roadmap items/);
  });

  it('when the outbox is read, then a specialist sees only their territories’ growers, a grower nobody’s, and bad filters get 400', async () => {
    const { regionKey, season } = await dueRegion();
    await grower(otherTerritoryId);
    const c = await newCampaign(admin, campaignBody(regionKey, season, { audience: { territoryIds: [territoryId, otherTerritoryId] } }));
    await grower(territoryId);
    expect((await admin.post(`/api/campaigns/${c.id}/run`)).body.run.enqueued).toBeGreaterThanOrEqual(2);
    const spec = await specialist.get(`/api/outbox?campaignId=${c.id}&pageSize=200`);
    const other = await otherSpecialist.get(`/api/outbox?campaignId=${c.id}&pageSize=200`);
    const all = await admin.get(`/api/outbox?campaignId=${c.id}&pageSize=200`);
    expect(spec.body.total + other.body.total).toBe(all.body.total);
    const territoryOf = async (accountId: number) => (await Account.findByPk(accountId))!.territoryId;
    for (const i of spec.body.items) expect(await territoryOf(i.accountId)).toBe(territoryId);
    const foreignRow = other.body.items[0];
    expect((await specialist.get(`/api/outbox/${foreignRow.id}`)).status).toBe(404);
    expect((await otherSpecialist.get(`/api/outbox/${foreignRow.id}`)).body.message.html).toContain('<!doctype html>');
    const account = await makeAccount(territoryId);
    const growerClient = await signedIn(t.app, await makeUser('grower', { accountId: account.id }));
    expect((await growerClient.get('/api/outbox')).status).toBe(403);
    expect((await specialist.get('/api/outbox?status=lost')).status).toBe(400);
    expect((await specialist.get('/api/outbox?pageSize=1000')).status).toBe(400);
    expect((await specialist.post(`/api/outbox/${spec.body.items[0].id}/retry`)).status).toBe(409);
  });

  it('when a campaign is paused, then its queued messages are held and running it is refused; resuming releases them', async () => {
    const { regionKey, season } = await dueRegion();
    await grower(territoryId);
    const c = await newCampaign(specialist, campaignBody(regionKey, season));
    await specialist.post(`/api/campaigns/${c.id}/run`);
    const paused = await specialist.patch(`/api/campaigns/${c.id}`, { status: 'paused', version: c.version });
    expect(paused.body.campaign.outbox.held).toBeGreaterThan(0);
    expect(paused.body.campaign.outbox.pending).toBe(0);
    const run = await specialist.post(`/api/campaigns/${c.id}/run`);
    expect(run.status).toBe(409);
    expect(run.body.error.code).toBe('paused');
    const resumed = await specialist.patch(`/api/campaigns/${c.id}`, { status: 'active', version: paused.body.campaign.version });
    expect(resumed.body.campaign.outbox.held).toBe(0);
    expect(resumed.body.campaign.outbox.pending).toBeGreaterThan(0);
  });

  it('when the admin searches sent mail for text holding % or _, then those characters match only themselves', async () => {
    const tag = `pct${Date.now()}`;
    const message = (subject: string, n: number) =>
      Buffer.from(`Message-ID: <${tag}.${n}@rowpath.test>\r\nFrom: a@rowpath.test\r\nTo: b@rowpath.test\r\nSubject: ${subject}\r\n\r\nBody\r\n`);
    const envelope = { envelope: { mailFrom: { address: 'a@rowpath.test', args: false }, rcptTo: [{ address: 'b@rowpath.test', args: false }] } } as never;
    await storeReceivedMessage(t.sequelize, message(`${tag} germination 100% tested`, 1), envelope);
    await storeReceivedMessage(t.sequelize, message(`${tag} germination 1000 seeds`, 2), envelope);
    await storeReceivedMessage(t.sequelize, message(`${tag} row_unit check`, 3), envelope);
    await storeReceivedMessage(t.sequelize, message(`${tag} rowXunit check`, 4), envelope);
    const subjects = async (q: string) => (await admin.get(`/api/sent-mail?q=${encodeURIComponent(`${tag} ${q}`)}`)).body.items.map((m: { subject: string }) => m.subject);
    expect(await subjects('germination 100%')).toEqual([`${tag} germination 100% tested`]);
    expect(await subjects('row_unit')).toEqual([`${tag} row_unit check`]);
  });

  it('when anyone but an admin asks for sent mail, then 403; a missing message is 404', async () => {
    expect((await specialist.get('/api/sent-mail')).status).toBe(403);
    const manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [territoryId] }));
    expect((await manager.get('/api/sent-mail/1')).status).toBe(403);
    expect((await client(t.app).get('/api/sent-mail')).status).toBe(401);
    expect((await admin.get('/api/sent-mail/99999999')).status).toBe(404);
  });
});

describe('the grower’s links', () => {
  async function sentMessageFor(contactName: string) {
    const { regionKey, season } = await dueRegion();
    const specUser = await makeUser('specialist', { territoryIds: [territoryId] });
    const g = await grower(territoryId, { contacts: [{ name: contactName }], specialistId: specUser.id });
    const c = await newCampaign(specialist, campaignBody(regionKey, season));
    await specialist.post(`/api/campaigns/${c.id}/run`);
    await drainOutbox(sender());
    const row = (await ReminderOutbox.findOne({ where: { campaignId: c.id, contactId: g.contacts[0].id } }))!;
    const mail = (await ReceivedMail.findOne({ where: { messageId: row.messageId } }))!;
    const unsubscribeToken = /unsubscribe\?token=([A-Za-z0-9._-]+)/.exec(mail.text!)![1];
    const bookingToken = /book\?token=([A-Za-z0-9._-]+)/.exec(mail.text!)![1];
    return { g, c, specUser, unsubscribeToken, bookingToken };
  }

  it('when a grower clicks the unsubscribe link, then one click without sign-in unsubscribes them and a page says so; a second click is harmless', async () => {
    const { g, unsubscribeToken } = await sentMessageFor('Maren Oakhollow');
    const page = await request(t.app).get(`/api/reminders/unsubscribe?token=${unsubscribeToken}`);
    expect(page.status).toBe(200);
    expect(page.headers['content-type']).toMatch(/html/);
    expect(page.text).toContain('You are unsubscribed');
    expect(page.text).toContain(g.contacts[0].email!);
    const contact = (await Contact.findByPk(g.contacts[0].id))!;
    expect(contact.reminderOptIn).toBe(false);
    expect(contact.unsubscribedAt).toBeInstanceOf(Date);
    // RFC 8058 one-click: the mail client posts form data to the List-Unsubscribe address, no CSRF token.
    const post = await request(t.app).post(`/api/reminders/unsubscribe?token=${unsubscribeToken}`).type('form').send('List-Unsubscribe=One-Click').set('Accept', 'application/json');
    expect(post.status).toBe(200);
    expect(post.body).toMatchObject({ unsubscribed: true, changed: false });
    expect(await AuditEvent.count({ where: { entity: 'contact', entityId: g.contacts[0].id } })).toBe(1);
  });

  it('when a token is forged, tampered with, cut short, used for the wrong purpose or expired, then it is refused and nothing changes', async () => {
    const { g, unsubscribeToken, bookingToken, c } = await sentMessageFor('Quinlan Farrowby');
    const victim = await grower(territoryId);
    const [v, body, sig] = unsubscribeToken.split('.');
    const payload = JSON.parse(Buffer.from(body, 'base64url').toString());
    const tamperedBody = Buffer.from(JSON.stringify({ ...payload, c: victim.contacts[0].id })).toString('base64url');
    const attempts = [
      `${v}.${tamperedBody}.${sig}`, // another contact's id under the old signature
      `${v}.${body}.${sig.slice(0, -2)}${sig.endsWith('AA') ? 'BB' : 'AA'}`, // signature changed
      signReminderToken('a-different-secret-of-the-right-length-0000', { purpose: 'unsubscribe', contactId: victim.contacts[0].id, campaignId: c.id }), // forged
      bookingToken, // a booking link is not an unsubscribe link
      unsubscribeToken.slice(0, 20),
    ];
    for (const token of attempts) {
      const res = await request(t.app).get(`/api/reminders/unsubscribe?token=${encodeURIComponent(token)}`).set('Accept', 'application/json');
      expect(res.status, token).toBe(400);
      expect(res.body.error.code).toBe('invalid_token');
    }
    const html = await request(t.app).post(`/api/reminders/unsubscribe?token=${attempts[0]}`);
    expect(html.status).toBe(400);
    expect(html.text).toContain('This link cannot be used');
    expect((await request(t.app).get('/api/reminders/unsubscribe')).status).toBe(400);
    for (const id of [victim.contacts[0].id, g.contacts[0].id]) expect((await Contact.findByPk(id))!.reminderOptIn).toBe(true);

    const expired = signReminderToken(t.config.sessionSecret, { purpose: 'book', contactId: g.contacts[0].id, campaignId: c.id, expiresAt: Math.floor(Date.now() / 1000) - 60 });
    const late = await request(t.app).post(`/api/reminders/book?token=${expired}`).set('Accept', 'application/json').send({});
    expect(late.status).toBe(410);
    const ghost = signReminderToken(t.config.sessionSecret, { purpose: 'unsubscribe', contactId: 99999999, campaignId: c.id });
    expect((await request(t.app).get(`/api/reminders/unsubscribe?token=${ghost}`).set('Accept', 'application/json')).status).toBe(404);
    expect(await Visit.count({ where: { accountId: g.account.id } })).toBe(0);
  });

  it('when a grower follows the booking link and confirms, then a requested check-up visit is made for their specialist, once', async () => {
    const { g, specUser, bookingToken } = await sentMessageFor('Odalys Brenneman');
    const page = await request(t.app).get(`/api/reminders/book?token=${bookingToken}`);
    expect(page.status).toBe(200);
    expect(page.text).toContain('Request a pre-season check-up');
    expect(page.text).toContain(`action="/api/reminders/book?token=`);
    expect(await Visit.count({ where: { accountId: g.account.id } })).toBe(0); // reading the page books nothing

    const booked = await request(t.app).post(`/api/reminders/book?token=${bookingToken}`).type('form').send('preferredDate=2027-03-02&notes=Mornings+suit+us');
    expect(booked.status).toBe(201);
    expect(booked.text).toContain('Check-up requested');
    const visits = await Visit.findAll({ where: { accountId: g.account.id } });
    expect(visits).toHaveLength(1);
    expect(visits[0]).toMatchObject({ status: 'requested', purpose: 'pre-season-checkup', requestedByContactId: g.contacts[0].id, specialistId: specUser.id });
    expect(visits[0].notes).toMatch(/Preferred date: 2027-03-02/);
    expect(visits[0].notes).toMatch(/Mornings suit us/);
    expect(visits[0].checklist.map((i) => i.label).join(' ')).toMatch(/Opener disc wear/);

    const again = await request(t.app).post(`/api/reminders/book?token=${bookingToken}`).set('Accept', 'application/json').send({});
    expect(again.status).toBe(200);
    expect(again.body).toMatchObject({ created: false, visit: { id: visits[0].id } });
    expect(await Visit.count({ where: { accountId: g.account.id } })).toBe(1);
    const bad = await request(t.app).post(`/api/reminders/book?token=${bookingToken}`).set('Accept', 'application/json').send({ preferredDate: 'next week' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.details.fields.preferredDate).toBeTruthy();
  });
});

describe('grower reminder preferences', () => {
  it('when a grower reads and changes their contacts’ reminders, then only their own account changes; opting in again clears an unsubscribe', async () => {
    const g = await grower(territoryId, { contacts: [{ name: 'Anneliese Rourke' }, { name: 'Bram Rourke' }] });
    await Contact.update({ reminderOptIn: false, unsubscribedAt: new Date() }, { where: { id: g.contacts[1].id } });
    const other = await grower(territoryId);
    const growerClient = await signedIn(t.app, await makeUser('grower', { accountId: g.account.id }));
    const read = await growerClient.get('/api/me/reminder-preferences');
    expect(read.status).toBe(200);
    expect(read.body.account.id).toBe(g.account.id);
    expect(read.body.contacts.map((c: { receivesReminders: boolean }) => c.receivesReminders)).toEqual([true, false]);

    const put = await growerClient.put('/api/me/reminder-preferences', { contacts: [{ id: g.contacts[0].id, reminderOptIn: false }, { id: g.contacts[1].id, reminderOptIn: true }] });
    expect(put.status, JSON.stringify(put.body)).toBe(200);
    expect(put.body.contacts.map((c: { reminderOptIn: boolean; unsubscribedAt: string | null }) => [c.reminderOptIn, c.unsubscribedAt])).toEqual([
      [false, null],
      [true, null],
    ]);
    const foreign = await growerClient.put('/api/me/reminder-preferences', { contacts: [{ id: other.contacts[0].id, reminderOptIn: false }] });
    expect(foreign.status).toBe(404);
    expect((await Contact.findByPk(other.contacts[0].id))!.reminderOptIn).toBe(true);
    expect((await growerClient.put('/api/me/reminder-preferences', { contacts: [{ id: g.contacts[0].id }] })).status).toBe(400);
    expect((await specialist.get('/api/me/reminder-preferences')).status).toBe(403);
    expect((await client(t.app).get('/api/me/reminder-preferences')).status).toBe(401);
  });
});

describe('demo campaigns', () => {
  it('when the demo reminders are seeded, then the 2027 campaigns follow the Kansas windows, their templates are valid, and previews read for several growers', async () => {
    await seedDemoReminders(t.sequelize);
    await seedDemoReminders(t.sequelize); // a second run adds nothing
    const demo = await ReminderCampaign.findAll({ where: { season: 2027, regionKey: 'ks-north-central' } });
    const names = demo.map((c) => c.name).filter((n) => /2027/.test(n));
    expect(new Set(names).size).toBe(names.length);
    expect(names).toHaveLength(3);
    for (const c of demo) expect(templateProblems({ subject: c.subject, body: c.body })).toEqual({});
    const list = (await admin.get('/api/campaigns?season=2027&pageSize=200')).body.items;
    const dates = (name: RegExp) => list.find((c: { name: string }) => name.test(c.name)).schedule.map((s: { sendOn: string }) => s.sendOn);
    // Kansas corn opens Apr 15 and soybean May 15 (USDA-NASS Agricultural Handbook 628, via K-State).
    expect(dates(/Early-order/)).toEqual(['2026-11-26']);
    expect(dates(/check-up — corn/)).toEqual(['2027-02-14', '2027-03-16', '2027-04-05']);
    expect(dates(/Soybean/)).toEqual(['2027-03-31', '2027-04-30']);
    const early = list.find((c: { name: string }) => /Early-order/.test(c.name));
    expect(early.status).toBe('draft');
    for (const name of ['Wilhelmina Achterberg', 'Ruben Stroud-Ellery']) {
      const g = await grower(territoryId, { contacts: [{ name }] });
      const p = await admin.post(`/api/campaigns/${early.id}/preview`, { contactId: g.contacts[0].id });
      expect(p.status, JSON.stringify(p.body)).toBe(200);
      expect(p.body.preview.subject).toBe(`Early orders for 2027 are open, ${name.split(' ')[0]}`);
      expect(p.body.preview.text).toContain(`What we have planned for ${g.account.name} this season:`);
      expect(p.body.preview.text).toContain('April 15, 2027');
    }
  });
});
