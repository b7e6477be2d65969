import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { Session } from '../../server/db/models/index.js';
import { client, makeAccount, makeTerritory, makeUser, PASSWORD, signedIn, testApp, type TestApp } from '../helpers/app.js';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(async () => t.close());

const cookieOf = (res: request.Response) => {
  const raw = res.headers['set-cookie'] as unknown as string[] | undefined;
  return (raw ?? []).find((c) => c.startsWith('rowpath.sid='));
};

describe('sign-in and sign-out', () => {
  it('when the password is right, then the user comes back and a new session cookie replaces the anonymous one', async () => {
    const user = await makeUser('admin');
    const c = client(t.app);
    const csrfRes = await c.get('/api/auth/csrf');
    const before = cookieOf(csrfRes)!;
    expect(before).toBeTruthy();
    c.agent.jar.setCookie(before.split(';')[0]);
    const login = await c.agent.post('/api/auth/login').set('X-Forwarded-For', c.ip).set('X-CSRF-Token', csrfRes.body.token).send({ email: user.email, password: PASSWORD });
    expect(login.status).toBe(200);
    expect(login.body.user).toEqual({ id: user.id, email: user.email, name: user.name, role: 'admin', territoryIds: [], accountId: null });
    const after = cookieOf(login)!;
    expect(after.split(';')[0]).not.toBe(before.split(';')[0]);
    expect(after).toMatch(/HttpOnly/i);
    expect(after).toMatch(/SameSite=Lax/i);
    expect(after).not.toMatch(/Secure/i);
    expect(login.body.user).not.toHaveProperty('passwordHash');
  });

  it('when the e-mail is unknown or the password wrong, then both get 401 with one message', async () => {
    const user = await makeUser('specialist');
    const c = client(t.app);
    await c.refreshCsrf();
    const wrong = await c.post('/api/auth/login', { email: user.email, password: 'not-the-password' });
    const unknown = await c.post('/api/auth/login', { email: 'nobody-here@test.rowpath.test', password: 'whatever-it-is' });
    expect(wrong.status).toBe(401);
    expect(unknown.status).toBe(401);
    expect(wrong.body.error.code).toBe('invalid_credentials');
    expect(unknown.body.error.message).toBe(wrong.body.error.message);
  });

  it('when a disabled user signs in, then it is refused like a wrong password', async () => {
    const user = await makeUser('specialist', { disabled: true });
    const res = await client(t.app).signIn(user.email);
    expect(res.status).toBe(401);
  });

  it('when signing out, then the old cookie no longer opens anything', async () => {
    const user = await makeUser('manager');
    const c = await signedIn(t.app, user);
    const oldCookie = c.agent.jar.getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false }).toValueString();
    expect(oldCookie).toContain('rowpath.sid=');
    // The same cookie, sent by a client that is not the agent, opens the session before sign-out…
    expect((await request(t.app).get('/api/auth/me').set('Cookie', oldCookie)).status).toBe(200);
    const out = await c.post('/api/auth/logout');
    expect(out.status).toBe(204);
    // …and nothing after it.
    const replay = await request(t.app).get('/api/auth/me').set('Cookie', oldCookie);
    expect(replay.status).toBe(401);
    const stillThere = await Session.count({ where: { userId: user.id } });
    expect(stillThere).toBe(0);
  });

  it('when nobody is signed in, then protected routes answer 401 in the error shape', async () => {
    for (const url of ['/api/auth/me', '/api/accounts', '/api/accounts/1', '/api/admin/users']) {
      const res = await request(t.app).get(url);
      expect(res.status, url).toBe(401);
      expect(res.body).toEqual({ error: { code: 'unauthenticated', message: expect.any(String) } });
    }
  });
});

describe('CSRF', () => {
  it('when a POST has no token or a wrong one, then it is refused with 403, sign-in included', async () => {
    const user = await makeUser('admin');
    const anon = await request(t.app).post('/api/auth/login').send({ email: user.email, password: PASSWORD });
    expect(anon.status).toBe(403);
    expect(anon.body.error.code).toBe('csrf');
    const c = await signedIn(t.app, user);
    const noToken = await c.agent.post('/api/admin/users').send({});
    expect(noToken.status).toBe(403);
    const wrong = await c.agent.post('/api/auth/logout').set('X-CSRF-Token', 'x'.repeat(c.csrf.length));
    expect(wrong.status).toBe(403);
    expect((await c.get('/api/auth/me')).status).toBe(200);
  });

  it('when signing in, then the CSRF token changes', async () => {
    const user = await makeUser('admin');
    const c = client(t.app);
    const before = await c.refreshCsrf();
    await c.post('/api/auth/login', { email: user.email, password: PASSWORD });
    const after = await c.refreshCsrf();
    expect(after).not.toBe(before);
  });
});

describe('bad bodies', () => {
  it('when the JSON is malformed, then 400 bad_json', async () => {
    const c = client(t.app);
    await c.refreshCsrf();
    const res = await c.agent.post('/api/auth/login').set('X-CSRF-Token', c.csrf).set('Content-Type', 'application/json').send('{"email":');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('bad_json');
  });

  it('when fields are missing or wrong, then 400 names each field', async () => {
    const c = client(t.app);
    await c.refreshCsrf();
    const res = await c.post('/api/auth/login', { email: 'not-an-email' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['email', 'password']);
    const arr = await c.post('/api/auth/login', [1, 2]);
    expect(arr.status).toBe(400);
  });

  it('when a route does not exist, then 404 in the error shape', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

describe('repeated failures are slowed', () => {
  it('when one account fails five times, then the sixth try is 429 even with the right password', async () => {
    const user = await makeUser('specialist');
    const c = client(t.app);
    await c.refreshCsrf();
    for (let i = 0; i < 5; i++) expect((await c.post('/api/auth/login', { email: user.email, password: 'wrong-one' })).status).toBe(401);
    const blocked = await c.post('/api/auth/login', { email: user.email, password: PASSWORD });
    expect(blocked.status).toBe(429);
    expect(blocked.body.error.code).toBe('too_many_attempts');
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    // Another address is slowed too: the counter is per account.
    const other = client(t.app);
    expect((await other.signIn(user.email)).status).toBe(429);
  });

  it('when one address fails across many accounts, then it is slowed per IP', async () => {
    const strict = await testApp({ LOGIN_MAX_FAILURES_PER_IP: '3' }, t.sequelize);
    try {
      const c = client(strict.app);
      await c.refreshCsrf();
      for (let i = 0; i < 3; i++) await c.post('/api/auth/login', { email: `ghost${i}-${c.ip}@test.rowpath.test`, password: 'wrong-one' });
      const user = await makeUser('admin');
      expect((await c.post('/api/auth/login', { email: user.email, password: PASSWORD })).status).toBe(429);
      expect((await client(strict.app).signIn(user.email)).status).toBe(200);
    } finally {
      await strict.close();
    }
  });
});

describe('session lifetimes', () => {
  async function ageSession(userId: number, field: 'lastSeenAt' | 'startedAt', msAgo: number) {
    const row = await Session.findOne({ where: { userId } });
    const data = JSON.parse(row!.data!);
    data[field] = Date.now() - msAgo;
    await row!.update({ data: JSON.stringify(data) });
  }

  it('when a session has been idle for more than 30 minutes, then it is over', async () => {
    const user = await makeUser('specialist');
    const c = await signedIn(t.app, user);
    await ageSession(user.id, 'lastSeenAt', 31 * 60_000);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('when a session is older than 12 hours, then it is over even if used a moment ago', async () => {
    const user = await makeUser('specialist');
    const c = await signedIn(t.app, user);
    await ageSession(user.id, 'startedAt', 12 * 3_600_000 + 60_000);
    expect((await c.get('/api/auth/me')).status).toBe(401);
  });

  it('when a session is used within the idle time, then it continues', async () => {
    const user = await makeUser('specialist');
    const c = await signedIn(t.app, user);
    await ageSession(user.id, 'lastSeenAt', 29 * 60_000);
    expect((await c.get('/api/auth/me')).status).toBe(200);
  });

  it('when HTTPS is configured, then the cookie is Secure', async () => {
    const secure = await testApp({ COOKIE_SECURE: 'true' }, t.sequelize);
    try {
      const res = await request(secure.app).get('/api/auth/csrf').set('X-Forwarded-Proto', 'https');
      expect(cookieOf(res)).toMatch(/; Secure/i);
    } finally {
      await secure.close();
    }
  });
});

describe('roles and object access', () => {
  it('when a specialist asks for the user list, then 403', async () => {
    const territory = await makeTerritory();
    const specialist = await makeUser('specialist', { territoryIds: [territory.id] });
    const c = await signedIn(t.app, specialist);
    const res = await c.get('/api/admin/users');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('forbidden');
    expect((await c.post('/api/admin/users', {})).status).toBe(403);
  });

  it('when a grower asks for another grower\'s account, then it is refused and their own is served', async () => {
    const territory = await makeTerritory();
    const mine = await makeAccount(territory.id);
    const theirs = await makeAccount(territory.id);
    const grower = await makeUser('grower', { accountId: mine.id });
    const c = await signedIn(t.app, grower);
    expect((await c.get(`/api/accounts/${mine.id}`)).status).toBe(200);
    const refused = await c.get(`/api/accounts/${theirs.id}`);
    expect(refused.status).toBe(404);
    const list = await c.get('/api/accounts?pageSize=200');
    expect(list.body.items.map((a: { id: number }) => a.id)).toEqual([mine.id]);
    expect((await c.get('/api/territories')).status).toBe(403);
  });

  it('when a specialist lists accounts, then only their territory\'s appear; a manager sees all of theirs', async () => {
    const north = await makeTerritory();
    const south = await makeTerritory();
    const a = await makeAccount(north.id);
    const b = await makeAccount(south.id);
    const specialist = await makeUser('specialist', { territoryIds: [north.id] });
    const manager = await makeUser('manager', { territoryIds: [north.id, south.id] });
    const s = await signedIn(t.app, specialist);
    expect((await s.get(`/api/accounts/${b.id}`)).status).toBe(404);
    const sIds = (await s.get('/api/accounts?pageSize=200')).body.items.map((x: { id: number }) => x.id);
    expect(sIds).toContain(a.id);
    expect(sIds).not.toContain(b.id);
    const m = await signedIn(t.app, manager);
    const mIds = (await m.get('/api/accounts?pageSize=200')).body.items.map((x: { id: number }) => x.id);
    expect(mIds).toEqual(expect.arrayContaining([a.id, b.id]));
    const terr = (await m.get('/api/territories')).body.items.map((x: { id: number }) => x.id);
    expect(terr.sort()).toEqual([north.id, south.id].sort());
  });

  it('when the account list is asked with a bad page size or sort, then 400 names the field', async () => {
    const admin = await makeUser('admin');
    const c = await signedIn(t.app, admin);
    const res = await c.get('/api/accounts?pageSize=5000&sort=shoe');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['pageSize', 'sort']);
    expect((await c.get('/api/accounts/abc')).status).toBe(400);
  });
});

describe('security headers', () => {
  it('when any page is served, then a strict CSP and the usual headers are set', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['content-security-policy']).toMatch(/script-src 'self'/);
    expect(res.headers['content-security-policy']).toMatch(/frame-ancestors 'none'/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
