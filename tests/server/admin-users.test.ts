import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { User } from '../../server/db/models/index.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(async () => t.close());

describe('user administration', () => {
  it('when an admin creates a specialist with a territory, then the new user can sign in and sees that territory', async () => {
    const territory = await makeTerritory();
    const admin = await signedIn(t.app, await makeUser('admin'));
    const email = `new-${uid()}@test.rowpath.test`;
    const res = await admin.post('/api/admin/users', { email, name: 'New Specialist', role: 'specialist', password: 'long-enough-pass', territoryIds: [territory.id] });
    expect(res.status).toBe(201);
    expect(res.body.user).toMatchObject({ email, role: 'specialist', territoryIds: [territory.id], disabled: false });
    const stored = await User.findOne({ where: { email } });
    expect(stored!.passwordHash).toMatch(/^\$2[aby]\$1\d\$/); // bcrypt, cost 10 or more
    const list = await admin.get('/api/admin/users');
    expect(list.body.items.some((u: { email: string }) => u.email === email)).toBe(true);
  });

  it('when fields are wrong, then 400 names each; nothing is written', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const before = await User.count();
    const res = await admin.post('/api/admin/users', { email: 'nope', name: '', role: 'wizard', password: 'short' });
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.details.fields).sort()).toEqual(['email', 'name', 'password', 'role']);
    const grower = await admin.post('/api/admin/users', { email: `g-${uid()}@test.rowpath.test`, name: 'G', role: 'grower', password: 'long-enough-pass' });
    expect(grower.body.error.details.fields.accountId).toBeTruthy();
    const ghostTerritory = await admin.post('/api/admin/users', { email: `s-${uid()}@test.rowpath.test`, name: 'S', role: 'specialist', password: 'long-enough-pass', territoryIds: [999999] });
    expect(ghostTerritory.status).toBe(400);
    expect(ghostTerritory.body.error.details.fields.territoryIds).toBeTruthy();
    expect(await User.count()).toBe(before);
  });

  it('when the e-mail is taken, then 409 on the e-mail field', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const existing = await makeUser('manager');
    const res = await admin.post('/api/admin/users', { email: existing.email, name: 'Dup', role: 'admin', password: 'long-enough-pass' });
    expect(res.status).toBe(409);
    expect(res.body.error.details.fields.email).toBeTruthy();
  });

  it('when an admin disables a user, then that user\'s open sessions end at once', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const territory = await makeTerritory();
    const victim = await makeUser('specialist', { territoryIds: [territory.id] });
    const session = await signedIn(t.app, victim);
    expect((await session.get('/api/auth/me')).status).toBe(200);
    const res = await admin.patch(`/api/admin/users/${victim.id}`, { disabled: true });
    expect(res.status).toBe(200);
    expect(res.body.user.disabled).toBe(true);
    expect((await session.get('/api/auth/me')).status).toBe(401);
  });

  it('when an admin changes a role and territories, then the user sees the new scope on the next request', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const a = await makeTerritory();
    const b = await makeTerritory();
    const account = await makeAccount(b.id);
    const user = await makeUser('specialist', { territoryIds: [a.id] });
    const session = await signedIn(t.app, user);
    expect((await session.get(`/api/accounts/${account.id}`)).status).toBe(404);
    const res = await admin.patch(`/api/admin/users/${user.id}`, { role: 'manager', territoryIds: [a.id, b.id] });
    expect(res.body.user).toMatchObject({ role: 'manager', territoryIds: [a.id, b.id].sort((x, y) => x - y) });
    expect((await session.get(`/api/accounts/${account.id}`)).status).toBe(200);
  });

  it('when an admin tries to disable themself or a field is unknown, then 400', async () => {
    const adminUser = await makeUser('admin');
    const admin = await signedIn(t.app, adminUser);
    expect((await admin.patch(`/api/admin/users/${adminUser.id}`, { disabled: true })).status).toBe(400);
    expect((await admin.patch(`/api/admin/users/${adminUser.id}`, { isRoot: true })).status).toBe(400);
    expect((await admin.patch('/api/admin/users/99999999', { name: 'x' })).status).toBe(404);
  });
});
