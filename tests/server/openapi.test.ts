// The API reference: generated from the route registry and the shared zod schemas, served to
// signed-in users only, every registry entry matching a route the app serves, and routes nobody
// described yet still listed.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createApp } from '../../server/app.js';
import { discoverApiRoutes, routeKey } from '../../server/modules/openapi/discover.js';
import { buildOpenApi, describedButMissing, openApiPath, pathParamNames, undescribed } from '../../server/modules/openapi/document.js';
import { exampleFor } from '../../server/modules/openapi/examples.js';
import { ROUTES, type RouteDoc } from '../../server/modules/openapi/registry.js';
import { makeAccount, makeTerritory, makeUser, signedIn, testApp, type TestApp } from '../helpers/app.js';

let t: TestApp;
beforeAll(async () => {
  t = await testApp();
});
afterAll(async () => t.close());

type Json = Record<string, any>;
const METHODS = ['get', 'put', 'post', 'delete', 'options', 'head', 'patch', 'trace'];

/** Structural checks of an OpenAPI 3.1 document; returns every problem found (empty = valid). */
function openApiProblems(doc: Json): string[] {
  const problems: string[] = [];
  if (!/^3\.1\.\d+$/.test(String(doc.openapi))) problems.push(`openapi is ${doc.openapi}, not 3.1.x`);
  if (typeof doc.info?.title !== 'string' || typeof doc.info?.version !== 'string') problems.push('info.title and info.version are required strings');
  if (!doc.paths || typeof doc.paths !== 'object') problems.push('paths is missing');
  const operationIds = new Set<string>();
  const declaredTags = new Set((doc.tags ?? []).map((x: Json) => x.name));
  const schemes = Object.keys(doc.components?.securitySchemes ?? {});
  const refs: string[] = [];
  const collectRefs = (node: unknown) => {
    if (!node || typeof node !== 'object') return;
    for (const [k, v] of Object.entries(node)) {
      if (k === '$ref' && typeof v === 'string') refs.push(v);
      else collectRefs(v);
    }
  };
  collectRefs(doc);
  for (const ref of refs) {
    if (!ref.startsWith('#/')) continue; // nested JSON Schema $defs refs are local to their schema
    let node: unknown = doc;
    for (const part of ref.slice(2).split('/')) node = (node as Json)?.[part];
    if (node === undefined && !ref.startsWith('#/$defs')) problems.push(`$ref ${ref} does not resolve`);
  }
  for (const [path, item] of Object.entries<Json>(doc.paths ?? {})) {
    if (!path.startsWith('/')) problems.push(`path ${path} does not start with /`);
    const templated = [...path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
    for (const [method, op] of Object.entries<Json>(item)) {
      if (!METHODS.includes(method)) {
        problems.push(`${path}: unknown key ${method}`);
        continue;
      }
      const where = `${method.toUpperCase()} ${path}`;
      if (!op.responses || !Object.keys(op.responses).length) problems.push(`${where}: no responses`);
      for (const [code, response] of Object.entries<Json>(op.responses ?? {})) {
        if (!/^([1-5]\d\d|[1-5]XX|default)$/.test(code)) problems.push(`${where}: response code ${code}`);
        if (typeof response.description !== 'string') problems.push(`${where} ${code}: description is required`);
      }
      if (!op.operationId) problems.push(`${where}: no operationId`);
      else if (operationIds.has(op.operationId)) problems.push(`${where}: operationId ${op.operationId} repeats`);
      operationIds.add(op.operationId);
      for (const tag of op.tags ?? []) if (tag !== 'Undescribed' && !declaredTags.has(tag)) problems.push(`${where}: tag ${tag} not declared`);
      const inPath = (op.parameters ?? []).filter((p: Json) => p.in === 'path').map((p: Json) => p.name);
      for (const name of templated) if (!inPath.includes(name)) problems.push(`${where}: path parameter ${name} not declared`);
      for (const p of op.parameters ?? []) {
        if (!['path', 'query', 'header', 'cookie'].includes(p.in)) problems.push(`${where}: parameter ${p.name} in ${p.in}`);
        if (p.in === 'path' && p.required !== true) problems.push(`${where}: path parameter ${p.name} must be required`);
        if (!p.schema && !p.content) problems.push(`${where}: parameter ${p.name} has no schema`);
      }
      if (op.requestBody && !Object.keys(op.requestBody.content ?? {}).length) problems.push(`${where}: request body without content`);
      for (const media of Object.values<Json>(op.requestBody?.content ?? {})) {
        if (!media.schema || typeof media.schema !== 'object') problems.push(`${where}: request body without a schema`);
      }
      for (const req of op.security ?? []) for (const name of Object.keys(req)) if (!schemes.includes(name)) problems.push(`${where}: security scheme ${name} not declared`);
    }
  }
  return problems;
}

describe('GET /api/openapi.json', () => {
  it('when nobody is signed in, then 401; when any role is signed in, then the document', async () => {
    const anon = await request(t.app).get('/api/openapi.json');
    expect(anon.status).toBe(401);
    expect(anon.body.error.code).toBe('unauthenticated');
    const territory = await makeTerritory();
    const account = await makeAccount(territory.id);
    const grower = await signedIn(t.app, await makeUser('grower', { accountId: account.id }));
    const res = await grower.get('/api/openapi.json');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/application\/json/);
    expect(res.body.openapi).toBe('3.1.0');
    expect(res.body.paths['/api/accounts/{id}'].get.summary).toBeTruthy();
  });

  it('when the document is built, then it is a structurally valid OpenAPI 3.1 document', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const doc = (await admin.get('/api/openapi.json')).body;
    expect(openApiProblems(doc)).toEqual([]);
    // The checker itself finds a broken document (so the empty list above means something).
    const broken = structuredClone(doc);
    broken.openapi = '3.0.0';
    broken.paths['/api/accounts/{id}'].get.parameters = [];
    broken.paths['/api/accounts'].get.operationId = broken.paths['/api/accounts/{id}'].get.operationId;
    expect(openApiProblems(broken)).toEqual(
      expect.arrayContaining([expect.stringMatching(/not 3\.1/), expect.stringMatching(/parameter id not declared/), expect.stringMatching(/repeats/)]),
    );
  });

  it('when a route takes a body, then its schema comes from the shared zod schema, with field limits and an example the schema accepts', async () => {
    const doc = buildOpenApi(discoverApiRoutes(t.app));
    const planterPost = doc.paths as Json;
    const schema = planterPost['/api/accounts/{id}/planters'].post.requestBody.content['application/json'].schema;
    expect(schema.type).toBe('object');
    expect(schema.required).toEqual(expect.arrayContaining(['name', 'rows', 'rowSpacingIn', 'toolbars']));
    expect(schema.properties.rows).toMatchObject({ type: 'integer', minimum: 1 });
    const login = planterPost['/api/auth/login'].post;
    expect(login.security).toEqual([]);
    expect(login.requestBody.content['application/json'].schema.properties.email.format).toBe('email');
    const accounts = planterPost['/api/accounts'].get;
    expect(accounts.parameters.map((p: Json) => p.name)).toEqual(expect.arrayContaining(['page', 'pageSize', 'sort', 'q']));
    expect(accounts.parameters.find((p: Json) => p.name === 'sort').schema.enum).toContain('-name');
    // Every body in the registry has an example its own zod schema accepts.
    const without: string[] = [];
    for (const route of ROUTES) if (route.body && exampleFor(route.body) === undefined) without.push(routeKey(route));
    expect(without).toEqual([]);
    for (const route of ROUTES.filter((r) => r.body && r.bodyType !== 'multipart')) {
      const example = (doc.paths as Json)[openApiPath(route.path)][route.method].requestBody.content[route.bodyType === 'form' ? 'application/x-www-form-urlencoded' : route.bodyType === 'csv' ? 'text/csv' : 'application/json'].example;
      expect(route.body!.safeParse(example).success, routeKey(route)).toBe(true);
    }
  });
});

describe('the route registry', () => {
  it('when the registry is read, then every entry is a route the app really serves', () => {
    const live = discoverApiRoutes(t.app);
    expect(describedButMissing(live)).toEqual([]);
    // Routes served but not described are no failure while features land in parallel (they are in
    // the document, marked undescribed); they are printed so that the registry can catch up.
    const notDescribed = undescribed(live).map(routeKey);
    if (notDescribed.length) console.warn(`Served but not in server/modules/openapi/registry.ts:\n  ${notDescribed.join('\n  ')}`);
    // An entry for a route that does not exist is caught.
    const ghost: RouteDoc = { method: 'get', path: '/api/no-such-route/:id', tag: 'Accounts', summary: 'ghost', access: 'signed-in', response: { status: 200, description: 'x' } };
    expect(describedButMissing(live, [...ROUTES, ghost]).map(routeKey)).toEqual(['GET /api/no-such-route/:id']);
  });

  it('when an entry is probed over HTTP, then the app answers it with something other than "no such route"', async () => {
    const admin = await signedIn(t.app, await makeUser('admin'));
    const unknown: string[] = [];
    for (const route of ROUTES) {
      const url = route.path.replace(/:([A-Za-z_]+)/g, (_m, name) => (name === 'weekStart' ? '2027-03-01' : name === 'token' ? 'not-a-token' : '999999999'));
      if (route.method === 'post' && route.path === '/api/auth/logout') continue;
      const res = await admin[route.method === 'delete' ? 'delete' : route.method](url);
      if (res.status === 404 && /^No API route/.test(res.body?.error?.message ?? '')) unknown.push(routeKey(route));
    }
    expect(unknown).toEqual([]);
  });

  it('when every entry names its path parameters, then the parameter schemas match the path', () => {
    for (const route of ROUTES) {
      const names = pathParamNames(route.path);
      if (!names.length) continue;
      expect(route.params, routeKey(route)).toBeDefined();
      const shape = (route.params as unknown as { shape?: Record<string, unknown> }).shape ?? {};
      for (const name of names) expect(Object.keys(shape), routeKey(route)).toContain(name);
    }
  });

  it('when a route is mounted that nobody described, then it still appears in the document, marked undescribed', () => {
    const extra = createApp({ sequelize: t.sequelize, config: t.config, log: () => undefined });
    extra.post('/api/probe-things/:id/poke', (_req, res) => res.json({ ok: true }));
    const live = discoverApiRoutes(extra);
    expect(undescribed(live).map(routeKey)).toEqual(['POST /api/probe-things/:id/poke']);
    const op = (buildOpenApi(live).paths as Json)['/api/probe-things/{id}/poke'].post;
    expect(op['x-rowpath-undescribed']).toBe(true);
    expect(op.parameters).toEqual([{ name: 'id', in: 'path', required: true, schema: { type: 'string' } }]);
  });
});
