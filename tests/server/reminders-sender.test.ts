// The reminder sender under faults, on the real MariaDB and real SMTP servers on ephemeral ports:
// a sender killed mid-batch, two senders at once, SMTP down and back, a permanent refusal, and
// contacts who unsubscribe between reminders.
import { spawn } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import request from 'supertest';
import { QueryTypes, type Sequelize } from 'sequelize';
import { SMTPServer } from 'smtp-server';
import { Account, Contact, ReminderCampaign, ReminderCampaignTerritory, ReminderOutbox, SeasonWindow } from '../../server/db/models/index.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { enqueueCampaign } from '../../server/jobs/enqueue.js';
import { backoffDelayMs, drainOutbox, type SenderOptions } from '../../server/jobs/sender.js';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.js';
import { createMailTransport } from '../../server/mail/transport.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

let t: TestApp;
let url: string;
let smtpDb: Sequelize;
const FROM = 'Rowpath test <reminders@rowpath.test>';
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

beforeAll(async () => {
  url = inject('databaseUrl');
  t = await testApp();
  smtpDb = createSequelize(url);
});
afterAll(async () => {
  await smtpDb?.close();
  await t?.close();
});

const links = () => ({ publicUrl: 'http://127.0.0.1:4999', secret: t.config.sessionSecret, mailFrom: FROM });

/** A territory with `count` opted-in corn growers (4 contacts an account) and an active campaign over it. */
async function campaignWith(count: number, opts: { windowStart?: string; season?: number; offsetsDays?: number[] } = {}) {
  const territory = await makeTerritory();
  const regionKey = `t-${uid()}`;
  // Unless told otherwise the window opens in 5 days, so the 10-day reminder is due today.
  const start = new Date(Date.now() + 5 * 86_400_000).toISOString().slice(0, 10);
  const windowStart = opts.windowStart ?? (start.endsWith('12-31') ? '12-30' : start.slice(5));
  await SeasonWindow.create({ regionKey, regionLabel: 'Test', crop: 'corn', windowStart, windowEnd: '12-31', source: 'test', sourceText: null, updatedBy: null });
  const contacts: Contact[] = [];
  for (let i = 0; i < count; i += 4) {
    const account = await makeAccount(territory.id);
    await Account.update({ acresByCrop: { corn: 500 } }, { where: { id: account.id } });
    const batch = Array.from({ length: Math.min(4, count - i) }, (_, k) => ({
      accountId: account.id,
      name: `Grower ${i + k} ${uid()}`,
      roleOnFarm: null,
      email: `g${i + k}-${uid()}@growers.rowpath.test`,
      phone: null,
      reminderOptIn: true,
    }));
    contacts.push(...(await Contact.bulkCreate(batch)));
  }
  const campaign = await ReminderCampaign.create({
    name: `Fault test ${uid()}`,
    season: opts.season ?? Number(start.slice(0, 4)),
    regionKey,
    crop: 'corn',
    offsetsDays: opts.offsetsDays ?? [10],
    audience: { growsCrop: true, hasRoadmapItems: false, noCheckupSince: null },
    subject: 'Check-up time, {{grower.firstName}}',
    body: 'Hello {{grower.name}},\n\n{{checklist}}\n\n{{bookingLink}}',
    status: 'active',
    createdBy: null,
    updatedBy: null,
  });
  await ReminderCampaignTerritory.create({ campaignId: campaign.id, territoryId: territory.id });
  return { territory, campaign, contacts };
}

async function received(campaignId: number) {
  const [row] = await smtpDb.query<{ n: number; repeats: number | null }>("SELECT COUNT(*) AS n, SUM(repeat_count) AS repeats FROM received_mail WHERE message_id LIKE ?", {
    type: QueryTypes.SELECT,
    replacements: [`<reminder.${campaignId}.%`],
  });
  return { count: Number(row.n), repeats: Number(row.repeats ?? 0) };
}

async function statuses(campaignId: number) {
  const rows = await ReminderOutbox.findAll({ where: { campaignId }, attributes: ['status'] });
  const out: Record<string, number> = {};
  for (const r of rows) out[r.status] = (out[r.status] ?? 0) + 1;
  return out;
}

function sender(port: number, over: Partial<SenderOptions> = {}): SenderOptions {
  return { sequelize: t.sequelize, transport: createMailTransport({ localPort: port }), from: FROM, backoffBaseMs: 300, ...over };
}

function runSenderProcess(env: Record<string, string>) {
  const childEnv: Record<string, string> = { ...(process.env as Record<string, string>), NODE_ENV: 'test', ROWPATH_DATA_DIR: '.data/test', DATABASE_URL: url, ...env };
  delete childEnv.SMTP_URL;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/jobs/sender-cli.ts'], { env: childEnv });
  let output = '';
  child.stdout.on('data', (d) => (output += d));
  child.stderr.on('data', (d) => (output += d));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null; output: string }>((resolve) => child.on('exit', (code, signal) => resolve({ code, signal, output })));
  return { child, exited };
}

describe('backoff', () => {
  it('when attempts fail in a row, then the wait doubles from the base and stops at the cap', () => {
    expect([1, 2, 3, 4, 5].map((n) => backoffDelayMs(n, 60_000, 600_000))).toEqual([60_000, 120_000, 240_000, 480_000, 600_000]);
  });
});

describe('sender faults', () => {
  it('when the sender is killed mid-batch and started again, then every due message is delivered exactly once', async () => {
    const { campaign } = await campaignWith(120);
    expect((await enqueueCampaign(t.sequelize, campaign, links(), new Date().toISOString().slice(0, 10))).enqueued).toBe(120);
    let stored = 0;
    // A slow receiver, so that the kill lands while a batch is being handed over.
    const smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, delayMs: 15, log: () => undefined, onStored: (s) => s.messageId.startsWith(`<reminder.${campaign.id}.`) && stored++ });
    try {
      const env = { LOCAL_SMTP_PORT: String(smtp.port), REMINDER_LEASE_MS: '1500', REMINDER_BATCH: '20', REMINDER_CONCURRENCY: '4' };
      const first = runSenderProcess(env);
      const until = Date.now() + 45_000;
      while (stored < 30 && Date.now() < until) await sleep(5);
      first.child.kill('SIGKILL');
      const killed = await first.exited;
      expect(killed.signal, killed.output).toBe('SIGKILL');
      const midway = await statuses(campaign.id);
      // Killed mid-batch: some sent, some claimed by the dead sender and not yet recorded, some never claimed.
      expect(midway.sent ?? 0).toBeLessThan(120);
      expect(midway.sending ?? 0).toBeGreaterThan(0);
      expect(midway.pending ?? 0).toBeGreaterThan(0);

      await sleep(1_600); // the dead sender's lease runs out
      const second = await runSenderProcess(env).exited;
      expect(second.code, second.output).toBe(0);
      expect(await statuses(campaign.id)).toEqual({ sent: 120 });
      const got = await received(campaign.id);
      expect(got.count).toBe(120);
      // Only messages in flight at the kill can be handed over twice; the stand-in keeps them once.
      expect(got.repeats).toBeLessThanOrEqual(20);
      const ids = (await ReminderOutbox.findAll({ where: { campaignId: campaign.id }, attributes: ['messageId'] })).map((r) => r.messageId);
      expect(new Set(ids).size).toBe(120);
    } finally {
      await smtp.close();
    }
  });

  it('when two senders work one database at once, then each message is claimed once and received once', async () => {
    const { campaign } = await campaignWith(300);
    expect((await enqueueCampaign(t.sequelize, campaign, links(), new Date().toISOString().slice(0, 10))).enqueued).toBe(300);
    const smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
    const dbA = createSequelize(url);
    const dbB = createSequelize(url);
    try {
      const a = { ...sender(smtp.port), sequelize: dbA, workerId: 'sender-a', batchSize: 10, concurrency: 3 };
      const b = { ...sender(smtp.port), sequelize: dbB, workerId: 'sender-b', batchSize: 10, concurrency: 3 };
      await Promise.all([drainOutbox(a), drainOutbox(b)]);
      a.transport.close();
      b.transport.close();
      const rows = await ReminderOutbox.findAll({ where: { campaignId: campaign.id } });
      expect(rows.every((r) => r.status === 'sent' && r.attempts === 1)).toBe(true);
      const bySender = new Set(rows.map((r) => r.claimedBy));
      expect(bySender).toEqual(new Set(['sender-a', 'sender-b']));
      expect(await received(campaign.id)).toEqual({ count: 300, repeats: 0 });
    } finally {
      await smtp.close();
      await dbA.close();
      await dbB.close();
    }
  });

  it('when two instances enqueue the same campaign at once, then each message is in the outbox once', async () => {
    const { campaign } = await campaignWith(80);
    const other = createSequelize(url);
    try {
      const today = new Date().toISOString().slice(0, 10);
      const [a, b] = await Promise.all([enqueueCampaign(t.sequelize, campaign, links(), today), enqueueCampaign(other, campaign, links(), today)]);
      expect(a.enqueued + b.enqueued).toBe(80);
      expect(await ReminderOutbox.count({ where: { campaignId: campaign.id } })).toBe(80);
      expect((await enqueueCampaign(t.sequelize, campaign, links(), today)).alreadyQueued).toBe(80);
    } finally {
      await other.close();
    }
  });

  it('when SMTP is down, then messages stay pending with the error shown to the specialist; when it returns they go out after the backoff', async () => {
    const { campaign, territory } = await campaignWith(6);
    await enqueueCampaign(t.sequelize, campaign, links(), new Date().toISOString().slice(0, 10));
    const probe = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
    const port = probe.port;
    await probe.close(); // nothing listens there now

    const down = sender(port, { backoffBaseMs: 1_500 });
    await drainOutbox(down);
    down.transport.close();
    const rows = await ReminderOutbox.findAll({ where: { campaignId: campaign.id } });
    expect(rows.map((r) => [r.status, r.attempts])).toEqual(rows.map(() => ['pending', 1]));
    expect(rows[0].lastError).toMatch(/Attempt 1 failed: .*(ECONNREFUSED|connect)/i);
    expect(rows[0].nextAttemptAt.getTime()).toBeGreaterThan(Date.now());

    const specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [territory.id] }));
    const shown = await specialist.get(`/api/outbox?campaignId=${campaign.id}&status=pending`);
    expect(shown.body.total).toBe(6);
    expect(shown.body.items[0].lastError).toMatch(/ECONNREFUSED|connect/i);
    expect(shown.body.items[0].nextAttemptAt).toBeTruthy();

    let smtp: SmtpStandIn | null = null;
    try {
      smtp = await startSmtpStandIn({ sequelize: smtpDb, port, log: () => undefined });
      const back = sender(port);
      await drainOutbox(back); // still inside the backoff: nothing is tried yet
      expect(await statuses(campaign.id)).toEqual({ pending: 6 });
      await sleep(1_600);
      await drainOutbox(back);
      back.transport.close();
      expect(await statuses(campaign.id)).toEqual({ sent: 6 });
      expect(await received(campaign.id)).toEqual({ count: 6, repeats: 0 });
      const after = await ReminderOutbox.findOne({ where: { campaignId: campaign.id } });
      expect(after!.lastError).toBeNull();
      expect(after!.attempts).toBe(2);
    } finally {
      await smtp?.close();
    }
  });

  it('when SMTP refuses a message for good, or stays down past the last attempt, then it fails and the specialist sees why and can retry it', async () => {
    const refused = await campaignWith(2);
    await enqueueCampaign(t.sequelize, refused.campaign, links(), new Date().toISOString().slice(0, 10));
    const strict = new SMTPServer({
      disabledCommands: ['STARTTLS', 'AUTH'],
      logger: false,
      onRcptTo: (_addr, _session, cb) => cb(Object.assign(new Error('Mailbox unavailable'), { responseCode: 550 })),
    });
    await new Promise<void>((r) => strict.listen(0, '127.0.0.1', () => r()));
    const strictPort = (strict.server.address() as { port: number }).port;
    try {
      const s = sender(strictPort);
      await drainOutbox(s);
      s.transport.close();
    } finally {
      await new Promise<void>((r) => strict.close(() => r()));
    }
    expect(await statuses(refused.campaign.id)).toEqual({ failed: 2 });
    const specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [refused.territory.id] }));
    const failed = await specialist.get(`/api/outbox?campaignId=${refused.campaign.id}&status=failed`);
    expect(failed.body.items[0].lastError).toMatch(/^Refused: .*550/);

    const giveUp = await campaignWith(1);
    await enqueueCampaign(t.sequelize, giveUp.campaign, links(), new Date().toISOString().slice(0, 10));
    const probe = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
    const port = probe.port;
    await probe.close();
    const down = sender(port, { maxAttempts: 2, backoffBaseMs: 50 });
    await drainOutbox(down);
    await sleep(80);
    await drainOutbox(down);
    down.transport.close();
    const row = (await ReminderOutbox.findOne({ where: { campaignId: giveUp.campaign.id } }))!;
    expect(row.status).toBe('failed');
    expect(row.lastError).toMatch(/^Gave up after 2 attempts/);

    // The specialist fixes the cause and sends the refused ones again.
    const retried = await specialist.post(`/api/outbox/${failed.body.items[0].id}/retry`);
    expect(retried.status).toBe(200);
    expect(retried.body.message).toMatchObject({ status: 'pending', attempts: 0 });
    const smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
    try {
      const s = sender(smtp.port);
      await drainOutbox(s);
      s.transport.close();
    } finally {
      await smtp.close();
    }
    expect(await statuses(refused.campaign.id)).toEqual({ failed: 1, sent: 1 });
  });

  it('when contacts unsubscribe between reminders, then they are never sent another one', async () => {
    // A window of Apr 15, 2031 with reminders 30 and 10 days ahead: due Mar 16 and Apr 5.
    const { campaign, contacts } = await campaignWith(4, { windowStart: '04-15', season: 2031, offsetsDays: [30, 10] });
    const [a, b, c, d] = contacts;
    const smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
    const messagesTo = async (contactId: number) =>
      Number(
        (
          await smtpDb.query<{ n: number }>('SELECT COUNT(*) AS n FROM received_mail WHERE message_id LIKE ?', {
            type: QueryTypes.SELECT,
            replacements: [`<reminder.${campaign.id}.${contactId}.%`],
          })
        )[0].n,
      );
    try {
      const s = sender(smtp.port);
      expect((await enqueueCampaign(t.sequelize, campaign, links(), '2031-03-16')).enqueued).toBe(4);
      await drainOutbox(s);
      expect(await received(campaign.id)).toEqual({ count: 4, repeats: 0 });

      // A unsubscribes from the first reminder's own link.
      const firstToA = (await ReminderOutbox.findOne({ where: { campaignId: campaign.id, contactId: a.id } }))!;
      const page = await request(t.app).get(new URL(firstToA.unsubscribeUrl).pathname + new URL(firstToA.unsubscribeUrl).search);
      expect(page.status).toBe(200);

      const second = await enqueueCampaign(t.sequelize, campaign, links(), '2031-04-05');
      expect(second).toMatchObject({ offsetDays: 10, enqueued: 3 });
      // C unsubscribes after the second reminder was queued: it is cancelled at once.
      const queuedForC = (await ReminderOutbox.findOne({ where: { campaignId: campaign.id, contactId: c.id, offsetDays: 10 } }))!;
      const viaPost = await request(t.app).post(new URL(queuedForC.unsubscribeUrl).pathname + new URL(queuedForC.unsubscribeUrl).search).type('form').send('List-Unsubscribe=One-Click');
      expect(viaPost.status).toBe(200);
      expect((await queuedForC.reload()).status).toBe('cancelled');
      // D opts out some other way while the message waits: the sender checks again when it claims.
      await Contact.update({ reminderOptIn: false }, { where: { id: d.id } });

      await drainOutbox(s);
      s.transport.close();
      expect([await messagesTo(a.id), await messagesTo(b.id), await messagesTo(c.id), await messagesTo(d.id)]).toEqual([1, 2, 1, 1]);
      const forD = (await ReminderOutbox.findOne({ where: { campaignId: campaign.id, contactId: d.id, offsetDays: 10 } }))!;
      expect(forD.status).toBe('cancelled');
      expect(forD.lastError).toMatch(/unsubscribed/);
      expect(await ReminderOutbox.count({ where: { campaignId: campaign.id, contactId: a.id, offsetDays: 10 } })).toBe(0);
    } finally {
      await smtp.close();
    }
  });
});
