import { randomBytes } from 'node:crypto';
import bcrypt from 'bcryptjs';
import request from 'supertest';
import type { Express } from 'express';
import type { Sequelize } from 'sequelize';
import { inject } from 'vitest';
import type { Role } from '../../shared/schemas/auth.js';
import { createApp } from '../../server/app.js';
import { loadConfig, type Config } from '../../server/config.js';
import { Account, initModels, Territory, User, UserTerritory } from '../../server/db/models/index.js';
import { createSequelize } from '../../server/db/sequelize.js';

export interface TestApp {
  app: Express;
  sequelize: Sequelize;
  config: Config;
  close(): Promise<void>;
}

/** The real app on the tests' MariaDB. Each test file gets its own instance and its own rows.
 * Models are bound to one Sequelize per process: a second app with other settings passes
 * `reuse` (the first app's Sequelize) and does not close it. */
export async function testApp(env: Record<string, string> = {}, reuse?: Sequelize, databaseUrl = inject('databaseUrl')): Promise<TestApp> {
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    ROWPATH_DATA_DIR: '.data/test',
    TRUST_PROXY: 'loopback',
    ...env,
  });
  const sequelize = reuse ?? createSequelize(databaseUrl);
  if (!reuse) initModels(sequelize);
  const app = createApp({ sequelize, config, log: () => undefined });
  return { app, sequelize, config, close: async () => (reuse ? undefined : sequelize.close()) };
}

export const uid = () => randomBytes(5).toString('hex');
export const PASSWORD = 'correct-horse-battery';
let passwordHash: string | null = null;

export async function makeTerritory(name = `Territory ${uid()}`) {
  return Territory.create({ name, region: 'Test region' });
}

export async function makeAccount(territoryId: number, fields: Partial<{ name: string; specialistId: number | null; lat: number; lng: number }> = {}) {
  return Account.create({
    name: fields.name ?? `Test Farms ${uid()}`,
    territoryId,
    specialistId: fields.specialistId ?? null,
    address: null,
    town: 'Testville',
    state: 'KS',
    lat: fields.lat ?? 39.5,
    lng: fields.lng ?? -98.1,
    notes: null,
  });
}

export async function makeUser(role: Role, opts: { territoryIds?: number[]; accountId?: number | null; disabled?: boolean } = {}) {
  passwordHash ??= await bcrypt.hash(PASSWORD, 10);
  const user = await User.create({
    email: `${role}-${uid()}@test.rowpath.test`,
    name: `${role} ${uid()}`,
    role,
    passwordHash,
    disabled: opts.disabled ?? false,
    accountId: opts.accountId ?? null,
    lastSignInAt: null,
  });
  for (const territoryId of opts.territoryIds ?? []) await UserTerritory.create({ userId: user.id, territoryId });
  return user;
}

/** A Supertest agent that keeps cookies, with a fresh X-Forwarded-For address so that the
 * per-IP sign-in counter of one test never slows another. */
export function client(app: Express | string, ip = `10.${rand255()}.${rand255()}.${rand255()}`) {
  const agent = request.agent(app as Express);
  let csrf = '';
  const api = {
    agent,
    ip,
    get csrf() {
      return csrf;
    },
    async refreshCsrf() {
      csrf = (await agent.get('/api/auth/csrf').set('X-Forwarded-For', ip)).body.token;
      return csrf;
    },
    get: (url: string) => agent.get(url).set('X-Forwarded-For', ip),
    post: (url: string, body?: object) => agent.post(url).set('X-Forwarded-For', ip).set('X-CSRF-Token', csrf).send(body),
    patch: (url: string, body?: object) => agent.patch(url).set('X-Forwarded-For', ip).set('X-CSRF-Token', csrf).send(body),
    put: (url: string, body?: object) => agent.put(url).set('X-Forwarded-For', ip).set('X-CSRF-Token', csrf).send(body),
    delete: (url: string) => agent.delete(url).set('X-Forwarded-For', ip).set('X-CSRF-Token', csrf),
    async signIn(email: string, password = PASSWORD) {
      await api.refreshCsrf();
      const res = await api.post('/api/auth/login', { email, password });
      await api.refreshCsrf();
      return res;
    },
  };
  return api;
}

export async function signedIn(app: Express | string, user: { email: string }, password = PASSWORD) {
  const c = client(app);
  const res = await c.signIn(user.email, password);
  if (res.status !== 200) throw new Error(`sign-in failed for ${user.email}: ${res.status} ${JSON.stringify(res.body)}`);
  return c;
}

function rand255() {
  return Math.floor(Math.random() * 254) + 1;
}
