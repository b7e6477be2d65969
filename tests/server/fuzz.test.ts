// Property-based fuzzing of every POST, PATCH and PUT the app serves: the route list comes from the
// app itself (server/modules/openapi/discover.ts), the body shapes from the route registry, so a
// route mounted tomorrow is fuzzed tomorrow. As an admin (the role that reaches the most code),
// bodies that are almost right, plainly wrong, hostile (prototype-pollution keys, huge strings,
// deep nesting, lone surrogates, NUL, bidi controls) or not JSON at all must never get a 5xx.
// FUZZ_RUNS sets the runs per route (default 60) and FUZZ_BUDGET_MS the time for all of them (50 s);
// a failure prints the seed to replay it.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import fc from 'fast-check';
import type { Express } from 'express';
import { createApp } from '../../server/app.js';
import { createSequelize } from '../../server/db/sequelize.js';
import { startSmtpStandIn, type SmtpStandIn } from '../../server/mail/smtp-standin.js';
import { discoverApiRoutes, routeKey, type LiveRoute } from '../../server/modules/openapi/discover.js';
import { jsonSchemaOf } from '../../server/modules/openapi/json-schema.js';
import { bindIds, makeOneOfEach, TINY_PNG, type Fixtures } from '../../server/modules/openapi/fixtures.js';
import { ROUTES, type IdKind, type RouteDoc } from '../../server/modules/openapi/registry.js';
import { makeTerritory, makeUser, signedIn, testApp, uid, type TestApp } from '../helpers/app.js';

const RUNS = Number(process.env.FUZZ_RUNS ?? 60);
const TIME_LIMIT_PER_ROUTE_MS = Number(process.env.FUZZ_ROUTE_MS ?? 6000);
// The whole fuzz stays within this, however busy the machine: each route gets its share of what is left.
const BUDGET_MS = Number(process.env.FUZZ_BUDGET_MS ?? 50_000);

let t: TestApp;
let smtpDb: ReturnType<typeof createSequelize>;
let smtp: SmtpStandIn;
let app: Express;
let admin: Awaited<ReturnType<typeof signedIn>>;
let fixtures: Fixtures;
/** What the server logged for each 500 (the error handler logs every one). */
let serverLog: string[] = [];

beforeAll(async () => {
  // The local SMTP stand-in, so that test sends reach a mail server as they do under `npm start`.
  smtpDb = createSequelize(inject('databaseUrl'));
  smtp = await startSmtpStandIn({ sequelize: smtpDb, port: 0, log: () => undefined });
  t = await testApp({ LOCAL_SMTP_PORT: String(smtp.port) });
  app = createApp({ sequelize: t.sequelize, config: t.config, log: (msg, err) => serverLog.push(`${msg}: ${(err as Error)?.message ?? err}`) });
  admin = await signedIn(app, await makeUser('admin'));
  const territory = await makeTerritory();
  fixtures = await makeOneOfEach(
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
    territory.id,
    uid(),
  );
});
afterAll(async () => {
  await smtp?.close();
  await smtpDb?.close();
  await t?.close();
});

type Json = Record<string, any>;

// ---------- hostile values ----------
const HOSTILE_STRINGS = [
  '',
  ' ',
  '\u0000',
  'a\u0000b',
  '\u202e\u2066evil',
  '\ud800', // a lone surrogate: valid in a JS string, not in UTF-8
  '\udfff\ud800',
  '𝕽𝖔𝖜𝖕𝖆𝖙𝖍 👩‍🌾🌽',
  'Ünïcödé ñ 中文 العربية',
  'x'.repeat(70_000),
  '<script>alert(1)</script>',
  "' OR 1=1 -- ",
  '../../../../etc/passwd',
  '%00%2e%2e%2f',
  '{{account.name}} {{#each}}',
  '${jndi:ldap://x}',
  'NaN',
  'Infinity',
  '-0',
  '1e309',
  '2027-02-30',
  '9999-99-99',
  '0000-00-00',
  '24:61',
  '=HYPERLINK("x")',
];
const HOSTILE_NUMBERS = [0, -0, -1, 1.5, 0.1, 2 ** 31, 2 ** 31 - 1, -(2 ** 31) - 1, 2 ** 53 + 2, 1e308, -1e308, 5e-324, 99999999999];
const POLLUTION_KEYS = ['__proto__', 'constructor', 'prototype', 'toString', 'valueOf', 'hasOwnProperty', '__defineGetter__', 'then'];

/** An object with own properties, even for "__proto__" (JSON.parse makes the same on the server). */
function ownObject(entries: [string, unknown][]) {
  const o: Record<string, unknown> = {};
  for (const [k, v] of entries) Object.defineProperty(o, k, { value: v, enumerable: true, writable: true, configurable: true });
  return o;
}

const leaf: fc.Arbitrary<unknown> = fc.oneof(
  fc.string({ unit: 'grapheme', maxLength: 30 }),
  fc.string({ unit: 'binary', maxLength: 30 }),
  fc.constantFrom(...HOSTILE_STRINGS),
  fc.integer(),
  fc.constantFrom(...HOSTILE_NUMBERS),
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.boolean(),
  fc.constant(null),
);

const keyArb = (known: string[]) => fc.oneof(fc.constantFrom(...POLLUTION_KEYS), fc.string({ maxLength: 12 }), ...(known.length ? [fc.constantFrom(...known)] : []));

const junk = (known: string[]) =>
  fc.letrec<{ node: unknown }>((tie) => ({
    node: fc.oneof(
      { depthSize: 'small', withCrossShrink: true },
      leaf,
      fc.array(tie('node'), { maxLength: 4 }),
      fc.array(fc.tuple(keyArb(known), tie('node')), { maxLength: 5 }).map(ownObject),
    ),
  })).node;

function deepNest(depth: number, asObject: boolean): unknown {
  let v: unknown = 'bottom';
  for (let i = 0; i < depth; i++) v = asObject ? { a: v } : [v];
  return v;
}

const POLLUTION_BODIES = [
  ownObject([['__proto__', { polluted: 'yes', isAdmin: true }]]),
  ownObject([['constructor', { prototype: { polluted: 'yes' } }]]),
  ownObject([['__proto__', ownObject([['__proto__', { polluted: 'yes' }]])]]),
];

// ---------- from JSON Schema to values: mostly right, sometimes wrong ----------
const NAME_HINTS: [RegExp, string[]][] = [
  [/windowStart$/i, ['04-15', '02-29', '13-01']],
  [/windowEnd$/i, ['05-15', '00-00']],
  [/weekStart$|date$|^from$|since$/i, ['2027-03-01', '2027-03-02', '2027-02-29']],
  [/^to$|until$/i, ['2027-05-31']],
  [/email$/i, ['grower@example.test', 'a@b', 'x@y.z'.repeat(60)]],
  [/key$/i, ['plains-north', 'A']],
];

function arbFor(schema: Json, root: Json, depth: number, known: string[], name?: string): fc.Arbitrary<unknown> {
  const wrong = depth > 4 ? leaf : junk(known);
  return fc.oneof({ weight: 5, arbitrary: validish(schema, root, depth, known, name) }, { weight: 1, arbitrary: wrong });
}

function validish(raw: Json, root: Json, depth: number, known: string[], name?: string): fc.Arbitrary<unknown> {
  let s = raw;
  if (typeof s.$ref === 'string' && s.$ref.startsWith('#/')) {
    let node: any = root;
    for (const part of s.$ref.slice(2).split('/')) node = node?.[part];
    s = node ?? {};
  }
  if ('const' in s) return fc.constant(s.const);
  if (Array.isArray(s.enum)) return fc.constantFrom(...s.enum);
  for (const key of ['anyOf', 'oneOf'] as const) {
    if (Array.isArray(s[key]) && s[key].length) return fc.oneof(...s[key].map((o: Json) => validish(o, root, depth, known, name)));
  }
  if (Array.isArray(s.allOf)) {
    return fc.tuple(...s.allOf.map((o: Json) => validish(o, root, depth, known, name))).map((parts) => Object.assign({}, ...parts.filter((p) => p && typeof p === 'object' && !Array.isArray(p))));
  }
  const type = Array.isArray(s.type) ? s.type[0] : s.type;
  switch (type) {
    case 'string': {
      const options: fc.Arbitrary<unknown>[] = [];
      const hint = name && NAME_HINTS.find(([re]) => re.test(name));
      if (hint) options.push(fc.constantFrom(...hint[1]));
      if (s.format === 'date') options.push(fc.date({ min: new Date('2000-01-01'), max: new Date('2099-12-31'), noInvalidDate: true }).map((d) => d.toISOString().slice(0, 10)));
      if (s.format === 'date-time') options.push(fc.date({ min: new Date('2000-01-01'), max: new Date('2099-12-31'), noInvalidDate: true }).map((d) => d.toISOString()));
      if (s.format === 'email') options.push(fc.emailAddress());
      if (typeof s.pattern === 'string') {
        try {
          options.push(fc.stringMatching(new RegExp(s.pattern)));
        } catch {
          /* a pattern fast-check cannot generate from: plain strings below */
        }
      }
      const min = s.minLength ?? 0;
      const max = Math.min(s.maxLength ?? 60, 200);
      options.push(fc.string({ unit: 'grapheme', minLength: min, maxLength: Math.max(min, max) }));
      if (typeof s.maxLength === 'number') options.push(fc.constant('y'.repeat(s.maxLength + 1)));
      return fc.oneof(...options);
    }
    case 'integer':
    case 'number': {
      const min = typeof s.minimum === 'number' ? s.minimum : typeof s.exclusiveMinimum === 'number' ? s.exclusiveMinimum : -1e6;
      const max = typeof s.maximum === 'number' ? s.maximum : typeof s.exclusiveMaximum === 'number' ? s.exclusiveMaximum : 1e6;
      const edges = fc.constantFrom(min, max, min - 1, max + 1);
      const inRange =
        type === 'integer'
          ? fc.integer({ min: Math.max(Math.ceil(min), -(2 ** 31)), max: Math.min(Math.floor(max), 2 ** 31 - 1) })
          : fc.double({ min, max, noNaN: true, noDefaultInfinity: true });
      return fc.oneof({ weight: 4, arbitrary: inRange }, { weight: 1, arbitrary: edges });
    }
    case 'boolean':
      return fc.boolean();
    case 'null':
      return fc.constant(null);
    case 'array': {
      if (depth > 5) return fc.constant([]);
      const item = s.items ? arbFor(s.items, root, depth + 1, known) : leaf;
      return fc.array(item, { minLength: Math.min(s.minItems ?? 0, 3), maxLength: Math.min(s.maxItems ?? 4, 4) });
    }
    case 'object':
    default: {
      const props = Object.entries<Json>(s.properties ?? {});
      if (!props.length) return depth > 4 ? leaf : junk(known);
      const record = fc.record(Object.fromEntries(props.map(([k, v]) => [k, arbFor(v, root, depth + 1, known, k)])), { requiredKeys: (s.required ?? []).filter((k: string) => s.properties?.[k]) });
      // Now and then an extra key: unknown fields and prototype-pollution keys.
      return fc.tuple(record, fc.option(fc.tuple(keyArb(known), junk(known)), { freq: 4 })).map(([r, extra]) => (extra ? Object.assign(ownObject(Object.entries(r as object)), ownObject([extra])) : r));
    }
  }
}

// ---------- requests ----------
interface Case {
  params: Record<string, string>;
  query: Record<string, string>;
  body: { kind: 'json'; value: unknown } | { kind: 'raw'; text: string; type: string } | { kind: 'multipart'; fields: [string, string][]; file: boolean };
}

const KIND_BY_SEGMENT: Record<string, IdKind> = {
  accounts: 'account',
  contacts: 'contact',
  'farm-sites': 'farmSite',
  tractors: 'tractor',
  planters: 'planter',
  installs: 'install',
  components: 'component',
  goals: 'goal',
  replacements: 'replacement',
  'roadmap-items': 'roadmapItem',
  'roadmap-versions': 'roadmapVersion',
  quotes: 'quote',
  users: 'user',
  campaigns: 'campaign',
  outbox: 'outboxMessage',
  visits: 'visit',
  attachments: 'attachment',
};

function idKindOf(route: LiveRoute, doc?: RouteDoc): IdKind | undefined {
  if (doc?.idKind) return doc.idKind;
  const segment = route.path.split('/').find((_part, i, all) => all[i + 1] === ':id');
  return segment ? KIND_BY_SEGMENT[segment] : undefined;
}

function paramArb(name: string, kind: IdKind | undefined): fc.Arbitrary<string> {
  const real = kind && fixtures.ids[kind] ? [String(fixtures.ids[kind])] : [];
  const odd = fc.constantFrom('0', '-1', 'abc', '1.5', '1e3', '99999999999999999999', '%00', '..%2F..%2F', '١٢', ' 7', 'null', '__proto__');
  if (name === 'weekStart') return fc.oneof(fc.constantFrom('2027-03-01', '2027-03-02', '2027-02-30'), odd, fc.string().map(encodeURIComponent));
  if (name === 'id') {
    return fc.oneof(
      { weight: 4, arbitrary: real.length ? fc.constantFrom(...real) : fc.constant('1') },
      { weight: 2, arbitrary: fc.integer({ min: 100_000_000, max: 2 ** 31 - 1 }).map(String) },
      { weight: 2, arbitrary: odd },
      { weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 20 }).map(encodeURIComponent) },
    );
  }
  return fc.oneof(odd, fc.string({ unit: 'grapheme', maxLength: 20 }).map(encodeURIComponent));
}

function queryArb(doc?: RouteDoc): fc.Arbitrary<Record<string, string>> {
  if (!doc?.query) return fc.constant({});
  const schema = jsonSchemaOf(doc.query);
  const known = Object.keys(schema.properties ?? {});
  return fc.option(validish(schema, schema, 0, known), { freq: 3 }).map((q) => {
    if (!q || typeof q !== 'object' || Array.isArray(q)) return {};
    return Object.fromEntries(Object.entries(q).map(([k, v]) => [k, typeof v === 'string' ? v : JSON.stringify(v)]));
  });
}

function bodyArb(doc?: RouteDoc): fc.Arbitrary<Case['body']> {
  const schema = doc?.body ? jsonSchemaOf(doc.body) : undefined;
  const known = Object.keys(schema?.properties ?? {});
  const shaped = schema ? validish(schema, schema, 0, known).map((v) => bindIdsSometimes(v)) : junk(known);
  const json = fc.oneof(
    { weight: 6, arbitrary: shaped },
    { weight: 2, arbitrary: junk(known) },
    { weight: 1, arbitrary: fc.constantFrom<unknown>(...POLLUTION_BODIES, deepNest(3000, false), deepNest(3000, true), [], {}, null, 'text', 0) },
  );
  const raw = fc.oneof(
    fc.constantFrom('{"a":', '{]', '\u0000', '{"__proto__":{"polluted":"yes"}}', 'null', '"str"', '[' .repeat(5000), '{"a":1,"a":2}'),
    fc.string({ maxLength: 80 }),
  );
  const options: fc.Arbitrary<Case['body']>[] = [
    json.map((value) => ({ kind: 'json' as const, value })),
    raw.map((text) => ({ kind: 'raw' as const, text, type: 'application/json' })),
  ];
  if (doc?.bodyType === 'csv') {
    options.push(
      fc
        .array(fc.array(fc.oneof(fc.constantFrom('account_name', 'territory', '=1+1', '"', '\r\n', ',', 'Fixture'), fc.string({ maxLength: 15 })), { maxLength: 6 }), { maxLength: 6 })
        .map((rows) => ({ kind: 'raw' as const, text: rows.map((r) => r.join(',')).join('\n'), type: 'text/csv' })),
    );
  }
  if (doc?.bodyType === 'form') {
    options.push(json.map((value) => ({ kind: 'raw' as const, text: new URLSearchParams(flatStrings(value)).toString(), type: 'application/x-www-form-urlencoded' })));
  }
  if (doc?.bodyType === 'multipart') {
    options.push(
      fc
        .record({ fields: fc.array(fc.tuple(fc.constantFrom('ownerType', 'ownerId', 'file', 'x', '__proto__'), fc.oneof(fc.constantFrom('account', 'planter', 'install', String(fixtures.ids.account ?? 1)), fc.string({ maxLength: 20 }))), { maxLength: 5 }), file: fc.boolean() })
        .map((m) => ({ kind: 'multipart' as const, ...m })),
    );
  }
  return fc.oneof(...options);
}

function flatStrings(value: unknown): Record<string, string> {
  if (!value || typeof value !== 'object' || Array.isArray(value)) return { value: JSON.stringify(value) ?? '' };
  return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, typeof v === 'string' ? v : JSON.stringify(v) ?? '']));
}

// Half the shaped bodies name the fixture records, so that they get past "not found" into the services.
let bindToggle = 0;
function bindIdsSometimes(v: unknown) {
  bindToggle = (bindToggle + 1) % 2;
  return bindToggle ? bindIds(v, fixtures) : v;
}

async function send(route: LiveRoute, c: Case) {
  const url = route.path.replace(/:([A-Za-z0-9_]+)/g, (_m, name) => c.params[name] ?? '1');
  const qs = new URLSearchParams(c.query).toString();
  const full = qs ? `${url}?${qs}` : url;
  const method = route.method as 'post' | 'put' | 'patch';
  let req = admin.agent[method](full).set('X-Forwarded-For', admin.ip).set('X-CSRF-Token', admin.csrf);
  if (route.path === '/api/week-plans/stream') req = req.set('Accept', 'text/event-stream');
  if (c.body.kind === 'json') req = req.set('Content-Type', 'application/json').send(JSON.stringify(c.body.value) ?? 'null');
  else if (c.body.kind === 'raw') req = req.set('Content-Type', c.body.type).send(c.body.text);
  else {
    for (const [k, v] of c.body.fields) req = req.field(k, v);
    if (c.body.file) req = req.attach('file', TINY_PNG, 'x.png');
  }
  return req.timeout({ deadline: 20_000 });
}

function describeCase(c: Case) {
  const body = c.body.kind === 'json' ? JSON.stringify(c.body.value) : c.body.kind === 'raw' ? `${c.body.type}: ${JSON.stringify(c.body.text)}` : JSON.stringify(c.body);
  return `params ${JSON.stringify(c.params)} query ${JSON.stringify(c.query)} body ${String(body).slice(0, 600)}`;
}

describe('values the database refuses', () => {
  it('when a number is past what its column holds, then 400 names the field instead of a 500', async () => {
    const res = await admin.post('/api/components', { category: 'row-cleaner', name: 'Too long to fit', partNumber: `BIG-${uid()}`, priceUsd: 1, labourHours: 1_000_001, expectedLifeYears: 5, unit: 'row' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
    expect(Object.keys(res.body.error.details.fields)).toEqual(['labourHours']);
  });
});

// Bodies that once drew a 5xx, replayed every run so that a fix stays fixed (or a bug stays visible).
const FOUND: { method: 'post' | 'put' | 'patch'; path: string; body: (f: Fixtures) => object; found: string }[] = [
  {
    method: 'post',
    path: '/api/accounts/:account/tractors',
    body: () => ({ name: 'x', hydraulicFlowGpm: 5, hydraulicPressurePsi: 5, remoteValves: 0, ptoHp: 100_000 }),
    found: '500: pto_hp DECIMAL out of range (now 400 via server/http/errors.ts)',
  },
  {
    method: 'post',
    path: '/api/campaigns/:campaign/test-send',
    body: (f) => ({ contactId: f.ids.contact, to: "'+@A-.aAa" }),
    found: '502 smtp_unavailable: an address zod accepts but SMTP refuses (501) is reported as a mail-server failure',
  },
];

describe('bodies that found a 5xx before', () => {
  it('when each is sent again, then none draws a 5xx', async () => {
    const still: string[] = [];
    for (const c of FOUND) {
      const url = c.path.replace(':account', String(fixtures.ids.account)).replace(':campaign', String(fixtures.ids.campaign));
      const res = await admin[c.method](url, c.body(fixtures));
      if (res.status >= 500) still.push(`${c.method.toUpperCase()} ${c.path} ${JSON.stringify(c.body(fixtures))} → ${res.status} ${JSON.stringify(res.body)} (${c.found})`);
    }
    expect(still, still.join('\n')).toEqual([]);
  });
});

describe('fuzzing every write route', () => {
  it('when the fixtures are made, then every kind the fuzzer aims at exists (or the reason is printed)', () => {
    const made = Object.keys(fixtures.ids);
    expect(made).toEqual(expect.arrayContaining(['account', 'contact', 'farmSite', 'tractor', 'planter', 'install', 'component', 'goal', 'visit', 'user']));
    const missing = Object.entries(fixtures.missing);
    if (missing.length) console.warn(`Fixture kinds not made:\n  ${missing.map(([k, why]) => `${k}: ${why}`).join('\n  ')}`);
  });

  it(
    'when random, malformed and hostile bodies are sent to every POST, PATCH and PUT as an admin, then no answer is a 5xx and nothing is polluted',
    async () => {
      const docs = new Map(ROUTES.map((r) => [routeKey(r), r]));
      const routes = discoverApiRoutes(app).filter((r) => ['post', 'put', 'patch'].includes(r.method) && !docs.get(routeKey(r))?.noFuzz);
      expect(routes.length).toBeGreaterThan(30);
      const failures: string[] = [];
      // 400s that only MariaDB caught (server/http/errors.ts maps them): fields a shared schema should bound.
      const schemaGaps = new Set<string>();
      const started = Date.now();
      const perRoute: string[] = [];
      let sent = 0;
      for (const [index, route] of routes.entries()) {
        const doc = docs.get(routeKey(route));
        const share = Math.max(500, Math.min(TIME_LIMIT_PER_ROUTE_MS, (BUDGET_MS - (Date.now() - started)) / (routes.length - index)));
        const paramNames = [...route.path.matchAll(/:([A-Za-z0-9_]+)/g)].map((m) => m[1]);
        const caseArb: fc.Arbitrary<Case> = fc.record({
          params: fc.record(Object.fromEntries(paramNames.map((n) => [n, paramArb(n, idKindOf(route, doc))]))) as fc.Arbitrary<Record<string, string>>,
          query: queryArb(doc),
          body: bodyArb(doc),
        });
        let lastAnswer = '';
        serverLog = [];
        const t0 = Date.now();
        const result = await fc.check(
          fc.asyncProperty(caseArb, async (c) => {
            const res = await send(route, c);
            const polluted = ({} as Record<string, unknown>).polluted !== undefined || ({} as Record<string, unknown>).isAdmin !== undefined;
            if (res.status >= 500 || polluted) lastAnswer = `${res.status} ${JSON.stringify(res.body).slice(0, 300)}${polluted ? ' — Object.prototype polluted' : ''}\n    server: ${serverLog.at(-1)?.slice(0, 400)}`;
            if (res.status === 400 && res.body?.error?.details?.refusedBy === 'database') {
              for (const field of Object.keys(res.body.error.details.fields ?? {})) schemaGaps.add(`${routeKey(route)}: ${field}`);
            }
            return res.status < 500 && !polluted;
          }),
          { numRuns: RUNS, interruptAfterTimeLimit: share, markInterruptAsFailure: false },
        );
        sent += result.numRuns;
        perRoute.push(`${routeKey(route)}: ${result.numRuns} runs, ${Date.now() - t0} ms`);
        if (result.failed && result.counterexample) {
          failures.push(`${routeKey(route)} → ${lastAnswer}\n    ${describeCase(result.counterexample[0])}\n    replay: seed ${result.seed}, path ${result.counterexamplePath}`);
        }
        // The admin must still be signed in, or the remaining routes would only see 401s.
        const me = await admin.get('/api/auth/me');
        expect(me.status, `after ${routeKey(route)} the admin was signed out`).toBe(200);
      }
      if (schemaGaps.size) console.warn(`Values only MariaDB refused (the shared schema should bound them):\n  ${[...schemaGaps].sort().join('\n  ')}`);
      console.log(`Fuzzed ${routes.length} routes with ${sent} requests in ${((Date.now() - started) / 1000).toFixed(1)} s:\n  ${perRoute.join('\n  ')}`);
      expect(failures, failures.join('\n')).toEqual([]);
    },
    300_000,
  );
});
