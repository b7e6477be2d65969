// Two app instances on one database, as behind a load balancer: two `npm start` processes (each its
// own createApp on its own Sequelize pool, on its own loopback port) against the tests' MariaDB.
// Separate processes matter: module-level state (caches, the Passport strategy, model bindings)
// is shared by two apps in one process and would hide what does not survive a second instance.
// Sessions, CSRF tokens, sign-in counters and the security log live in MariaDB, so a user signed
// in on one keeps working on the other; both run the reminder jobs, which still send a message once.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { Sequelize } from 'sequelize';
import { ReceivedMail, ReminderOutbox } from '../../server/db/models/index.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.js';
import { makeOneOfEach } from '../../server/modules/openapi/fixtures.js';
import { makeTerritory, makeUser, PASSWORD, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';
import { startServer, type RunningServer } from '../helpers/server-process.js';

let t: TestApp;
let smtpDb: Sequelize;
let smtp: SmtpStandIn;
const instances: RunningServer[] = [];
let urlA = '';
let urlB = '';

beforeAll(async () => {
  smtpDb = createSequelize(inject('databaseUrl'));
  smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
  t = await testApp();
  const env = {
    NODE_ENV: 'test',
    DATABASE_URL: inject('databaseUrl'),
    HOST: '127.0.0.1',
    PORT: '0',
    SEED_DEMO: 'false',
    ROWPATH_SKIP_CLIENT_BUILD: '1',
    ROWPATH_DATA_DIR: '.data/test', // the same session secret as every instance of one deployment
    TRUST_PROXY: 'loopback',
    SMTP_URL: `smtp://127.0.0.1:${smtp.port}`, // both send to one mail server; neither starts its own
  };
  const [a, b] = await Promise.all([startServer(env), startServer(env)]);
  instances.push(a, b);
  urlA = a.url;
  urlB = b.url;
});

afterAll(async () => {
  for (const i of instances) await i.stop();
  await smtp?.close();
  await smtpDb?.close();
  await t?.close();
});

/** A browser-like client: one cookie jar, any instance per request. */
function browser(ip = `10.77.${Math.floor(Math.random() * 250)}.${Math.floor(Math.random() * 250) + 1}`) {
  let cookie = '';
  let csrf = '';
  const send = async (base: string, method: string, path: string, body?: unknown) => {
    const res = await fetch(`${base}${path}`, {
      method,
      headers: { cookie, 'x-csrf-token': csrf, 'x-forwarded-for': ip, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const set = res.headers.getSetCookie().find((c) => c.startsWith('rowpath.sid='));
    if (set) cookie = set.split(';')[0];
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  };
  return {
    send,
    get cookie() {
      return cookie;
    },
    async token(base: string) {
      csrf = (await send(base, 'GET', '/api/auth/csrf')).body.token;
      return csrf;
    },
    async signIn(base: string, email: string, password = PASSWORD) {
      await this.token(base);
      const res = await send(base, 'POST', '/api/auth/login', { email, password });
      await this.token(base);
      return res;
    },
  };
}

describe('two instances, one database', () => {
  it('when a user signs in on one instance, then the same cookie and CSRF token keep working on the other, both ways', async () => {
    const territory = await makeTerritory();
    const user = await makeUser('specialist', { territoryIds: [territory.id] });
    expect(new URL(urlA).port).not.toBe(new URL(urlB).port);
    const b = browser();
    expect((await b.signIn(urlA, user.email)).status).toBe(200);
    const me = await b.send(urlB, 'GET', '/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user.id).toBe(user.id);
    // A write on B with the token A issued: the token lives in the shared session.
    const created = await b.send(urlB, 'POST', '/api/accounts', { name: `Scale-out Farms ${uid()}`, territoryId: territory.id });
    expect(created.status, JSON.stringify(created.body)).toBe(201);
    const onA = await b.send(urlA, 'GET', `/api/accounts/${created.body.account.id}`);
    expect(onA.status).toBe(200);
    expect(onA.body.account.name).toBe(created.body.account.name);
    // Alternating instances request by request changes nothing.
    for (const base of [urlA, urlB, urlA, urlB]) expect((await b.send(base, 'GET', '/api/accounts?pageSize=5')).status).toBe(200);
  });

  it('when the user signs out on one instance, then the other no longer knows the session', async () => {
    const user = await makeUser('manager');
    const b = browser();
    await b.signIn(urlB, user.email);
    const cookie = b.cookie;
    expect((await b.send(urlA, 'POST', '/api/auth/logout')).status).toBe(204);
    const replay = await fetch(`${urlB}/api/auth/me`, { headers: { cookie } });
    expect(replay.status).toBe(401);
  });

  it('when sign-ins fail on one instance, then the other slows the account too', async () => {
    const user = await makeUser('specialist');
    const b = browser();
    await b.token(urlA);
    for (let i = 0; i < t.config.LOGIN_MAX_FAILURES_PER_ACCOUNT; i++) {
      expect((await b.send(urlA, 'POST', '/api/auth/login', { email: user.email, password: 'wrong-password' })).status).toBe(401);
    }
    const other = browser();
    expect((await other.signIn(urlB, user.email)).status).toBe(429);
  });

  it('when the reminder jobs run on both instances, then a due message is sent once', { timeout: 120_000 }, async () => {
    const territory = await makeTerritory();
    const admin = await signedIn(t.app, await makeUser('admin'));
    const tag = uid();
    const f = await makeOneOfEach({ get: (u) => admin.get(u), post: (u, body) => admin.post(u, body), put: (u, body) => admin.put(u, body) }, territory.id, tag);
    expect(f.ids.campaign && f.ids.contact, JSON.stringify(f.missing)).toBeTruthy();
    const messageId = `<scale-out-${tag}@rowpath.test>`;
    const due = await ReminderOutbox.create({
      campaignId: f.ids.campaign!,
      contactId: f.ids.contact!,
      accountId: f.ids.account!,
      offsetDays: 45, // the fixture's own failed message holds offset 30
      sendOn: new Date().toISOString().slice(0, 10),
      toEmail: `grower-${tag}@example.test`,
      subject: 'Pre-season check-up',
      text: 'Time to book the planter check-up.',
      html: '<p>Time to book the planter check-up.</p>',
      messageId,
      unsubscribeUrl: 'http://127.0.0.1/unsubscribe',
      nextAttemptAt: new Date(Date.now() - 1000),
      claimedBy: null,
      lastError: null,
      smtpResponse: null,
      sentAt: null,
    });
    // Both instances run the send job every 15 s; wait for the send, then for both to tick again.
    const until = Date.now() + 40_000;
    while (Date.now() < until && (await ReminderOutbox.findByPk(due.id))!.status !== 'sent') await new Promise((r) => setTimeout(r, 250));
    await new Promise((r) => setTimeout(r, 16_000));
    const row = (await ReminderOutbox.findByPk(due.id))!;
    expect(row.status).toBe('sent');
    expect(row.attempts).toBe(1);
    const received = await ReceivedMail.findAll({ where: { messageId: messageId.replace(/^<|>$/g, '') } });
    const receivedBracketed = await ReceivedMail.findAll({ where: { messageId } });
    const all = [...received, ...receivedBracketed];
    expect(all).toHaveLength(1);
    expect(all[0].repeatCount).toBe(0);
  });
});
