// Security checks against OWASP ASVS level 2, beside what tests/server/auth.test.ts already shows
// (cookie HttpOnly/SameSite/Secure, idle and absolute lifetimes, per-account and per-IP slowing,
// sign-out replay, CSRF on sign-in) and tests/server/attachments.test.ts (upload attacks). The
// route-wide checks — 401 signed out, CSRF on every write, roles, and object-level access from
// another territory or account — are generated from the routes the app serves and the registry,
// so a route added later is checked by the same tests.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import request from 'supertest';
import { QueryTypes } from 'sequelize';
import { roles, type Role } from '../../shared/schemas/auth.js';
import { createApp } from '../../server/app.js';
import { Session } from '../../server/db/models/index.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.js';
import { discoverApiRoutes, routeKey, type LiveRoute } from '../../server/modules/openapi/discover.js';
import { exampleFor } from '../../server/modules/openapi/examples.js';
import { bindIds, makeOneOfEach, type Fixtures } from '../../server/modules/openapi/fixtures.js';
import { ACCOUNT_OWNED, ROUTES, type IdKind } from '../../server/modules/openapi/registry.js';
import { client, makeAccount, makeTerritory, makeUser, PASSWORD, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

type Client = Awaited<ReturnType<typeof signedIn>>;

let t: TestApp;
let smtpDb: ReturnType<typeof createSequelize>;
let smtp: SmtpStandIn;
let admin: Client;
let victim: Fixtures;
/** Users of the victim's territory and account (insiders) and of another territory (outsiders). */
const inside: Partial<Record<Role, Client>> = {};
const outside: Partial<Record<Role, Client>> = {};

beforeAll(async () => {
  smtpDb = createSequelize(inject('databaseUrl'));
  smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
  t = await testApp({ LOCAL_SMTP_PORT: String(smtp.port) });
  admin = await signedIn(t.app, await makeUser('admin'));
  const home = await makeTerritory();
  const away = await makeTerritory();
  victim = await makeOneOfEach(
    {
      get: (url) => admin.get(url),
      post: (url, body) => admin.post(url, body),
      put: (url, body) => admin.put(url, body),
      upload: (url, fields, file) => {
        let req = admin.agent.post(url).set('X-Forwarded-For', admin.ip).set('X-CSRF-Token', admin.csrf);
        for (const [k, v] of Object.entries(fields)) req = req.field(k, v);
        return req.attach('file', file.bytes, file.name);
      },
    },
    home.id,
    uid(),
  );
  const awayAccount = await makeAccount(away.id);
  inside.manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [home.id] }));
  inside.specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [home.id] }));
  inside.grower = await signedIn(t.app, await makeUser('grower', { accountId: victim.ids.account }));
  outside.manager = await signedIn(t.app, await makeUser('manager', { territoryIds: [away.id] }));
  outside.specialist = await signedIn(t.app, await makeUser('specialist', { territoryIds: [away.id] }));
  outside.grower = await signedIn(t.app, await makeUser('grower', { accountId: awayAccount.id }));
});

afterAll(async () => {
  await smtp?.close();
  await smtpDb?.close();
  await t?.close();
});

const cookieOf = (res: request.Response) => ((res.headers['set-cookie'] as unknown as string[] | undefined) ?? []).find((c) => c.startsWith('rowpath.sid='));

function cspDirectives(header: string | undefined): Map<string, string[]> {
  const map = new Map<string, string[]>();
  for (const part of (header ?? '').split(';')) {
    const [name, ...values] = part.trim().split(/\s+/);
    if (name) map.set(name, values);
  }
  return map;
}

/** Security events written for a user or an e-mail since `since`, with `at` read as UTC text. */
async function eventsFor(where: { userId?: number; email?: string }, since: Date) {
  const rows = await t.sequelize.query<{ event: string; at: string; detail: string | null; ip: string | null }>(
    `SELECT event, DATE_FORMAT(at, '%Y-%m-%dT%H:%i:%s.%fZ') AS at, detail, ip FROM security_events
      WHERE ${where.userId ? 'user_id = :userId' : 'email = :email'} AND at >= :since ORDER BY id`,
    { replacements: { userId: where.userId ?? null, email: where.email ?? null, since: new Date(since.getTime() - 2000) }, type: QueryTypes.SELECT },
  );
  return rows;
}

// The security log is written after the answer (it must never slow or fail a request).
const settle = () => new Promise((r) => setTimeout(r, 150));

describe('security headers', () => {
  it('when the API answers, then helmet sets a strict CSP without eval or inline script, and the other headers', async () => {
    for (const res of [await request(t.app).get('/api/health'), await request(t.app).get('/api/no-such-route'), await request(t.app).get('/api/auth/me')]) {
      const csp = cspDirectives(res.headers['content-security-policy']);
      expect(csp.get('script-src')).toEqual(["'self'"]);
      expect(csp.get('default-src')).toEqual(["'self'"]);
      expect(csp.get('object-src')).toEqual(["'none'"]);
      expect(csp.get('base-uri')).toEqual(["'self'"]);
      expect(csp.get('form-action')).toEqual(["'self'"]);
      expect(csp.get('frame-ancestors')).toEqual(["'none'"]);
      expect(csp.get('script-src-attr')).toEqual(["'none'"]);
      expect(res.headers['content-security-policy']).not.toMatch(/unsafe-eval/);
      for (const [name, values] of csp) if (name.startsWith('script')) expect(values, name).not.toContain("'unsafe-inline'");
      expect(res.headers['x-content-type-options']).toBe('nosniff');
      expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
      expect(res.headers['referrer-policy']).toBe('no-referrer');
      expect(res.headers['cross-origin-opener-policy']).toBe('same-origin');
      expect(res.headers['cross-origin-resource-policy']).toBe('same-origin');
      expect(res.headers['x-powered-by']).toBeUndefined();
      // Plain HTTP (the default): no HSTS and no upgrade, which would lock a local install out.
      expect(res.headers['strict-transport-security']).toBeUndefined();
      expect(csp.has('upgrade-insecure-requests')).toBe(false);
    }
  });

  it('when the client page itself is served, then it carries the same CSP', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'rowpath-page-'));
    fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><title>Rowpath</title><div id="root"></div>');
    try {
      const page = createApp({ sequelize: t.sequelize, config: t.config, clientDir: dir, log: () => undefined });
      const res = await request(page).get('/accounts/12');
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toMatch(/text\/html/);
      expect(cspDirectives(res.headers['content-security-policy']).get('script-src')).toEqual(["'self'"]);
      expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it('when HTTPS is configured, then HSTS and upgrade-insecure-requests are added', async () => {
    const secure = await testApp({ COOKIE_SECURE: 'true' }, t.sequelize);
    const res = await request(secure.app).get('/api/health');
    expect(res.headers['strict-transport-security']).toMatch(/max-age=\d{7,}/);
    expect(cspDirectives(res.headers['content-security-policy']).has('upgrade-insecure-requests')).toBe(true);
  });

  it('when signed-in data is answered, then it is marked not to be stored by caches', async () => {
    const res = await admin.get('/api/accounts');
    expect(res.headers['cache-control']).toBe('no-store');
  });
});

describe('session cookie and rotation', () => {
  it('when a session cookie is set, then it is host-wide, HttpOnly, SameSite and lives no longer than the idle time', async () => {
    const res = await client(t.app).get('/api/auth/csrf');
    const cookie = cookieOf(res)!;
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).not.toMatch(/; Domain=/i);
    const expires = Date.parse(/Expires=([^;]+)/.exec(cookie)![1]);
    expect(expires - Date.now()).toBeLessThanOrEqual(t.config.SESSION_IDLE_MINUTES * 60_000 + 5000);
    expect(expires - Date.now()).toBeGreaterThan(0);
  });

  it('when someone plants a session id before the victim signs in, then that id never becomes signed in', async () => {
    const user = await makeUser('specialist');
    const attacker = await request(t.app).get('/api/auth/csrf');
    const planted = cookieOf(attacker)!.split(';')[0];
    // The victim signs in carrying the planted cookie.
    const login = await request(t.app)
      .post('/api/auth/login')
      .set('Cookie', planted)
      .set('X-Forwarded-For', `10.9.${Math.floor(Math.random() * 250)}.1`)
      .set('X-CSRF-Token', attacker.body.token)
      .send({ email: user.email, password: PASSWORD });
    expect(login.status).toBe(200);
    const issued = cookieOf(login)!.split(';')[0];
    expect(issued).not.toBe(planted);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', issued)).status).toBe(200);
    expect((await request(t.app).get('/api/auth/me').set('Cookie', planted)).status).toBe(401);
  });

  it('when signing out, then the cookie is cleared in the browser and the old CSRF token opens nothing', async () => {
    const user = await makeUser('manager');
    const c = await signedIn(t.app, user);
    const oldToken = c.csrf;
    const out = await c.post('/api/auth/logout');
    expect(out.status).toBe(204);
    const cleared = cookieOf(out)!;
    expect(Date.parse(/Expires=([^;]+)/.exec(cleared)![1])).toBeLessThan(Date.now());
    const replay = await c.agent.post('/api/accounts').set('X-Forwarded-For', c.ip).set('X-CSRF-Token', oldToken).send({ name: 'After sign-out', territoryId: 1 });
    expect(replay.status).toBe(403);
    expect(replay.body.error.code).toBe('csrf');
  });
});

describe('the security log', () => {
  it('when a user signs in, fails, is refused and signs out, then each is written with a UTC timestamp', async () => {
    const since = new Date();
    const territory = await makeTerritory();
    const user = await makeUser('specialist', { territoryIds: [territory.id] });
    const failing = client(t.app);
    await failing.refreshCsrf();
    expect((await failing.post('/api/auth/login', { email: user.email, password: 'wrong-password' })).status).toBe(401);
    const c = await signedIn(t.app, user);
    expect((await c.get('/api/admin/users')).status).toBe(403); // role refusal
    expect((await c.agent.post('/api/accounts').set('X-Forwarded-For', c.ip).send({})).status).toBe(403); // no CSRF token
    expect((await c.post('/api/auth/logout')).status).toBe(204);
    await settle();
    const byUser = await eventsFor({ userId: user.id }, since);
    const byEmail = await eventsFor({ email: user.email }, since);
    const events = [...byEmail, ...byUser];
    expect(byEmail.map((e) => e.event)).toEqual(expect.arrayContaining(['sign_in_failed', 'sign_in']));
    expect(byUser.map((e) => e.event)).toEqual(expect.arrayContaining(['access_refused', 'csrf_refused', 'sign_out']));
    expect(byUser.find((e) => e.event === 'access_refused')!.detail).toMatch(/^GET \/api\/admin\/users forbidden/);
    expect(byUser.find((e) => e.event === 'csrf_refused')!.detail).toMatch(/POST/);
    for (const e of events) {
      // Read back as text and taken as UTC, each moment is within seconds of now: the column holds UTC.
      expect(Math.abs(Date.parse(e.at) - Date.now()), `${e.event} at ${e.at}`).toBeLessThan(60_000);
      expect(e.ip).toBeTruthy();
    }
  });

  it('when sign-ins are slowed, then the refusal is logged; when the window has passed, then the account may try again', async () => {
    const user = await makeUser('specialist');
    const since = new Date();
    const c = client(t.app);
    await c.refreshCsrf();
    for (let i = 0; i < t.config.LOGIN_MAX_FAILURES_PER_ACCOUNT; i++) await c.post('/api/auth/login', { email: user.email, password: 'wrong-password' });
    const blocked = await c.post('/api/auth/login', { email: user.email, password: PASSWORD });
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers['retry-after'])).toBeLessThanOrEqual(t.config.LOGIN_WINDOW_MINUTES * 60);
    await settle();
    expect((await eventsFor({ email: user.email }, since)).map((e) => e.event)).toContain('sign_in_throttled');
    // The window started longer ago than it lasts: the counter no longer holds.
    await t.sequelize.query('UPDATE login_failures SET window_started_at = UTC_TIMESTAMP() - INTERVAL :m MINUTE WHERE `key` = :key', {
      replacements: { m: t.config.LOGIN_WINDOW_MINUTES + 1, key: `acct:${user.email}` },
    });
    expect((await client(t.app).signIn(user.email)).status).toBe(200);
  });

  it('when a session runs past its idle time, then its end is logged', async () => {
    const user = await makeUser('specialist');
    const c = await signedIn(t.app, user);
    const row = await Session.findOne({ where: { userId: user.id } });
    const data = JSON.parse(row!.data!);
    data.lastSeenAt = Date.now() - (t.config.SESSION_IDLE_MINUTES + 1) * 60_000;
    await row!.update({ data: JSON.stringify(data) });
    const since = new Date();
    expect((await c.get('/api/auth/me')).status).toBe(401);
    await settle();
    expect((await eventsFor({ userId: user.id }, since)).map((e) => e.event)).toContain('session_expired');
  });
});

// ---------- route-wide checks generated from the app's routes and the registry ----------
const docs = new Map(ROUTES.map((r) => [routeKey(r), r]));
const KIND_BY_SEGMENT: Record<string, IdKind> = {
  accounts: 'account',
  contacts: 'contact',
  'farm-sites': 'farmSite',
  tractors: 'tractor',
  planters: 'planter',
  installs: 'install',
  goals: 'goal',
  replacements: 'replacement',
  'roadmap-items': 'roadmapItem',
  'roadmap-versions': 'roadmapVersion',
  quotes: 'quote',
  campaigns: 'campaign',
  visits: 'visit',
  attachments: 'attachment',
};
/** Records that belong to one account or one territory: the object-level checks aim at these. */
const SCOPED: IdKind[] = [...ACCOUNT_OWNED, 'campaign', 'outboxMessage'];

function kindOf(route: LiveRoute): IdKind | undefined {
  const doc = docs.get(routeKey(route));
  if (doc) return doc.idKind;
  const segment = route.path.split('/').find((_p, i, all) => all[i + 1] === ':id');
  return segment ? KIND_BY_SEGMENT[segment] : undefined;
}

function urlFor(route: LiveRoute, f: Fixtures): string {
  const kind = kindOf(route);
  return route.path.replace(/:([A-Za-z0-9_]+)(\.[a-z]+)?/g, (_m, name: string, ext = '') => {
    if (name === 'id') return String((kind && f.ids[kind]) ?? 999_999_999);
    if (name === 'weekStart') return '2027-03-01';
    return `not-a-${name}${ext}`;
  });
}

/** A body the route's own schema accepts, its ids pointing at `f` (so validation is not what refuses). */
function bodyFor(route: LiveRoute, f: Fixtures): object | undefined {
  const doc = docs.get(routeKey(route));
  if (!doc?.body || doc.bodyType === 'multipart' || doc.bodyType === 'csv') return doc?.bodyType === 'csv' ? undefined : {};
  return bindIds(exampleFor(doc.body), f) as object;
}

async function call(c: Client | ReturnType<typeof client>, route: LiveRoute, f: Fixtures) {
  const url = urlFor(route, f);
  const query = route.path === '/api/imports/accounts' ? '?mode=preview' : '';
  const body = bodyFor(route, f);
  switch (route.method) {
    case 'get':
      return c.get(url + query);
    case 'delete':
      return c.delete(url);
    default:
      return c[route.method](url + query, body);
  }
}

const isPublic = (route: LiveRoute) => docs.get(routeKey(route))?.access === 'public';

describe('every route, as the registry says', () => {
  it('when nobody is signed in, then every route that is not public answers 401', async () => {
    const anon = client(t.app);
    await anon.refreshCsrf(); // a valid token of an anonymous session, so that CSRF is not what refuses
    const wrong: string[] = [];
    const routes = discoverApiRoutes(t.app).filter((r) => !isPublic(r));
    expect(routes.length).toBeGreaterThan(80);
    for (const route of routes) {
      const res = await call(anon, route, victim);
      if (res.status !== 401) wrong.push(`${routeKey(route)} → ${res.status}`);
    }
    expect(wrong).toEqual([]);
  });

  it('when a signed-in user writes without the CSRF token, then every write route refuses with 403 csrf', async () => {
    const wrong: string[] = [];
    const writes = discoverApiRoutes(t.app).filter((r) => r.method !== 'get' && docs.get(routeKey(r))?.csrf !== false);
    for (const route of writes) {
      const url = urlFor(route, victim);
      const res = await admin.agent[route.method](url).set('X-Forwarded-For', admin.ip).send(bodyFor(route, victim) ?? {});
      if (res.status !== 403 || res.body?.error?.code !== 'csrf') wrong.push(`${routeKey(route)} → ${res.status} ${res.body?.error?.code}`);
    }
    expect(wrong).toEqual([]);
    // The links in reminder e-mails are the only writes without CSRF: their signed token is the permission.
    expect(ROUTES.filter((r) => r.csrf === false).map(routeKey).sort()).toEqual(['POST /api/reminders/book', 'POST /api/reminders/unsubscribe']);
  });

  it('when a role the registry does not list calls a route, then 403 (deny by default)', async () => {
    const wrong: string[] = [];
    let checked = 0;
    for (const doc of ROUTES) {
      if (!Array.isArray(doc.access)) continue;
      for (const role of roles) {
        if (role === 'admin' || (doc.access as readonly Role[]).includes(role)) continue;
        checked++;
        const res = await call(inside[role]!, doc, victim);
        if (res.status !== 403) wrong.push(`${routeKey(doc)} as ${role} → ${res.status}`);
      }
    }
    expect(checked).toBeGreaterThan(50);
    expect(wrong).toEqual([]);
  });
});

describe('object-level access', () => {
  const order = (r: LiveRoute) => (r.method === 'get' ? 0 : r.method !== 'delete' ? 1 : kindOf(r) === 'account' ? 4 : kindOf(r) === 'planter' ? 3 : 2);

  it('when a user of another territory or account aims at a record by id, then every such route refuses (404 or 403) while insiders get through', async () => {
    const routes = discoverApiRoutes(t.app)
      .filter((r) => r.path.includes(':id'))
      .sort((a, b) => order(a) - order(b));
    const leaks: string[] = [];
    /** Insiders refused too: then the outsiders' refusals would prove nothing. */
    const controls: string[] = [];
    const notCovered: string[] = [];
    let checked = 0;
    for (const route of routes) {
      const kind = kindOf(route);
      if (!kind || !SCOPED.includes(kind)) continue; // users, catalog components, sent mail: role checks above
      if (!victim.ids[kind]) {
        notCovered.push(`${routeKey(route)} (${kind}: ${victim.missing[kind] ?? 'no fixture'})`);
        continue;
      }
      for (const role of ['manager', 'specialist', 'grower'] as const) {
        const res = await call(outside[role]!, route, victim);
        checked++;
        if (res.status !== 404 && res.status !== 403) leaks.push(`${routeKey(route)} as ${role} of another ${role === 'grower' ? 'account' : 'territory'} → ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`);
        else expect(Object.keys(res.body)).toEqual(['error']);
      }
      // Controls: the same request is not refused for those who may see the record, so the
      // refusals above come from the scope check, not from a wrong id or body.
      if (route.method === 'get') {
        // Readers: the territory's specialist always; the account's grower for the account's own records.
        for (const role of ACCOUNT_OWNED.includes(kind) ? (['specialist', 'grower'] as const) : (['specialist'] as const)) {
          const res = await call(inside[role]!, route, victim);
          if ([401, 403, 404].includes(res.status) || res.status >= 500) controls.push(`${routeKey(route)} as ${role} inside → ${res.status} ${JSON.stringify(res.body).slice(0, 160)}`);
        }
      } else {
        // Writers: someone entitled gets through (an admin, or the grower for the grower's own decisions).
        const answers: string[] = [];
        for (const c of [admin, inside.specialist!, inside.grower!]) {
          const res = await call(c, route, victim);
          answers.push(`${res.status} ${JSON.stringify(res.body).slice(0, 120)}`);
          if (![401, 403, 404].includes(res.status) && res.status < 500) break;
          if (answers.length === 3) controls.push(`${routeKey(route)}: nobody inside gets through → ${answers.join(' | ')}`);
        }
      }
    }
    console.log(`Object-level checks: ${checked} refusals checked over ${routes.length} routes with an id.`);
    if (notCovered.length) console.warn(`Routes with an id not checked (no record of that kind could be made):\n  ${notCovered.join('\n  ')}`);
    expect(checked).toBeGreaterThan(120);
    expect(leaks).toEqual([]);
    expect(controls).toEqual([]);
    expect(notCovered).toEqual([]);
  });
});
