// Builds the OpenAPI 3.1 document from the route registry and the shared zod schemas (zod 4's
// toJSONSchema gives JSON Schema 2020-12, the dialect OpenAPI 3.1 uses). Routes the app serves that
// the registry does not describe are listed too, marked `x-rowpath-undescribed`, so the document
// never hides a route.
import { jsonSchemaOf, type Json } from './json-schema.js';
import { routeKey, type LiveRoute } from './discover.js';
import { exampleFor } from './examples.js';
import { ROUTES, isWrite, type RouteDoc } from './registry.js';

export { jsonSchemaOf };

/** Express path to OpenAPI path: /api/accounts/:id → /api/accounts/{id}. */
export function openApiPath(expressPath: string): string {
  return expressPath.replace(/:([A-Za-z0-9_]+)/g, '{$1}');
}

export function pathParamNames(expressPath: string): string[] {
  return [...expressPath.matchAll(/:([A-Za-z0-9_]+)/g)].map((m) => m[1]);
}

const errorRef = { $ref: '#/components/schemas/Error' };
const errorResponse = (description: string) => ({ description, content: { 'application/json': { schema: errorRef } } });

function parameters(route: Pick<RouteDoc, 'path' | 'params' | 'query'>) {
  const list: Json[] = [];
  const paramProps = route.params ? ((jsonSchemaOf(route.params).properties ?? {}) as Record<string, Json>) : {};
  for (const name of pathParamNames(route.path)) {
    list.push({ name, in: 'path', required: true, schema: paramProps[name] ?? { type: 'string' } });
  }
  if (route.query) {
    const q = jsonSchemaOf(route.query);
    const required = new Set((q.required as string[] | undefined) ?? []);
    for (const [name, schema] of Object.entries((q.properties ?? {}) as Record<string, Json>)) {
      list.push({ name, in: 'query', required: required.has(name), schema });
    }
  }
  return list;
}

const BODY_MEDIA: Record<NonNullable<RouteDoc['bodyType']>, string> = {
  json: 'application/json',
  multipart: 'multipart/form-data',
  csv: 'text/csv',
  form: 'application/x-www-form-urlencoded',
};

function operation(route: RouteDoc): Json {
  const roles = route.access === 'public' || route.access === 'signed-in' ? route.access : route.access.join(', ');
  const op: Json = {
    operationId: operationId(route.method, route.path),
    tags: [route.tag],
    summary: route.summary,
    'x-rowpath-access': roles,
    parameters: parameters(route),
    responses: responses(route),
  };
  if (route.access !== 'public') op.security = isWrite(route.method) ? [{ session: [], csrf: [] }] : [{ session: [] }];
  else op.security = [];
  const media = BODY_MEDIA[route.bodyType ?? 'json'];
  if (route.body) {
    const schema = jsonSchemaOf(route.body);
    if (route.bodyType === 'multipart' && schema.properties) {
      (schema.properties as Json).file = { type: 'string', contentMediaType: 'application/octet-stream' };
      schema.required = [...((schema.required as string[]) ?? []), 'file'];
    }
    const example = route.bodyType === 'multipart' ? undefined : exampleFor(route.body);
    op.requestBody = { required: true, content: { [media]: example === undefined ? { schema } : { schema, example } } };
  } else if (route.bodyType === 'csv') {
    op.requestBody = { required: true, content: { [media]: { schema: { type: 'string' } } } };
  }
  return op;
}

function responses(route: RouteDoc): Json {
  const { status, description, contentType } = route.response;
  const success: Json = { description };
  if (status !== 204) success.content = { [contentType ?? 'application/json']: { schema: contentType && contentType !== 'application/json' ? { type: 'string' } : { type: 'object' } } };
  const out: Json = { [String(status)]: success };
  if (route.body || route.query || route.params) out['400'] = errorResponse('A field is wrong: details.fields names each one.');
  if (route.access !== 'public') out['401'] = errorResponse('Not signed in, or the session is over.');
  if (route.access !== 'public' || route.csrf !== false) out['403'] = errorResponse('The role may not do this, or the CSRF token is missing.');
  if (route.params) out['404'] = errorResponse('No such record in the caller’s scope.');
  if (isWrite(route.method) && route.method !== 'delete') out['409'] = errorResponse('The record changed since it was loaded, or it already exists.');
  out['503'] = errorResponse('The database is not reachable just now.');
  return out;
}

export function operationId(method: string, path: string): string {
  const words = path
    .replace(/^\/api\//, '')
    .split(/[^A-Za-z0-9]+/)
    .filter(Boolean);
  return `${method}${words.map((w) => w[0].toUpperCase() + w.slice(1)).join('')}`;
}

/** Registry entries with no matching live route (a typo, or a route that was removed). */
export function describedButMissing(live: LiveRoute[], routes: readonly RouteDoc[] = ROUTES): RouteDoc[] {
  const keys = new Set(live.map(routeKey));
  return routes.filter((r) => !keys.has(routeKey(r)));
}

/** Live routes the registry does not describe yet. */
export function undescribed(live: LiveRoute[], routes: readonly RouteDoc[] = ROUTES): LiveRoute[] {
  const keys = new Set(routes.map(routeKey));
  return live.filter((r) => !keys.has(routeKey(r)));
}

export function buildOpenApi(live: LiveRoute[], version = '0.1.0'): Json {
  const paths: Record<string, Json> = {};
  const liveKeys = new Set(live.map(routeKey));
  const put = (path: string, method: string, op: Json) => {
    const p = openApiPath(path);
    paths[p] ??= {};
    paths[p][method] = op;
  };
  for (const route of ROUTES) if (liveKeys.has(routeKey(route))) put(route.path, route.method, operation(route));
  for (const r of undescribed(live)) {
    put(r.path, r.method, {
      operationId: operationId(r.method, r.path),
      tags: ['Undescribed'],
      summary: 'Served by the app but not yet described in the route registry.',
      'x-rowpath-undescribed': true,
      parameters: pathParamNames(r.path).map((name) => ({ name, in: 'path', required: true, schema: { type: 'string' } })),
      responses: { default: { description: 'Not described yet.' } },
    });
  }
  return {
    openapi: '3.1.0',
    info: {
      title: 'Rowpath API',
      version,
      description:
        'Fleets, goals, roadmaps, sizing, visits, reminders and forecasts for planter technology specialists. ' +
        'Sign in with POST /api/auth/login; the session cookie carries the session, and every write sends the ' +
        'token from GET /api/auth/csrf as X-CSRF-Token. Errors share one shape: { error: { code, message, details? } }.',
    },
    jsonSchemaDialect: 'https://json-schema.org/draft/2020-12/schema',
    servers: [{ url: '/' }],
    tags: [...new Set(ROUTES.map((r) => r.tag))].map((name) => ({ name })),
    paths,
    components: {
      securitySchemes: {
        session: { type: 'apiKey', in: 'cookie', name: 'rowpath.sid' },
        csrf: { type: 'apiKey', in: 'header', name: 'X-CSRF-Token' },
      },
      schemas: {
        Error: {
          type: 'object',
          required: ['error'],
          properties: {
            error: {
              type: 'object',
              required: ['code', 'message'],
              properties: {
                code: { type: 'string' },
                message: { type: 'string' },
                details: { type: 'object', properties: { fields: { type: 'object', additionalProperties: { type: 'string' } } } },
              },
            },
          },
        },
      },
    },
  };
}
