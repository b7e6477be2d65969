// Reads the routes an Express app really serves by walking its router stack, so that the OpenAPI
// document, the fuzzer and the access tests see a route the moment someone mounts it — even before
// anyone describes it in the registry.
import type { Application } from 'express';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';
export const HTTP_METHODS: readonly HttpMethod[] = ['get', 'post', 'put', 'patch', 'delete'];

export interface LiveRoute {
  method: HttpMethod;
  /** Express syntax, mount prefixes included: /api/accounts/:id */
  path: string;
}

interface LayerLike {
  route?: { path: unknown; methods: Record<string, boolean> };
  handle?: { stack?: LayerLike[] };
  rawPath?: unknown;
}

function join(prefix: string, part: string) {
  const joined = `${prefix.replace(/\/+$/, '')}/${part.replace(/^\/+/, '')}`;
  return joined.length > 1 ? joined.replace(/\/+$/, '') : joined;
}

/** Every method + path under the app's router, in mount order, without duplicates. */
export function discoverRoutes(app: Application): LiveRoute[] {
  const seen = new Set<string>();
  const found: LiveRoute[] = [];
  const walk = (stack: LayerLike[], prefix: string) => {
    for (const layer of stack) {
      if (layer.route) {
        const paths = Array.isArray(layer.route.path) ? layer.route.path : [layer.route.path];
        for (const p of paths) {
          if (typeof p !== 'string') continue; // regular-expression routes cannot be documented by path
          for (const method of HTTP_METHODS) {
            if (!layer.route.methods[method]) continue;
            const full = join(prefix, p);
            const key = `${method} ${full}`;
            if (seen.has(key)) continue;
            seen.add(key);
            found.push({ method, path: full });
          }
        }
      } else if (layer.handle?.stack && Array.isArray(layer.handle.stack)) {
        const raw = Array.isArray(layer.rawPath) ? layer.rawPath : [layer.rawPath ?? '/'];
        for (const p of raw) if (typeof p === 'string') walk(layer.handle.stack, join(prefix, p));
      }
    }
  };
  walk((app as unknown as { router: { stack: LayerLike[] } }).router.stack, '');
  return found;
}

/** The API routes only (the client's catch-all page route is not part of the API). */
export function discoverApiRoutes(app: Application): LiveRoute[] {
  return discoverRoutes(app).filter((r) => r.path === '/api' || r.path.startsWith('/api/'));
}

export const routeKey = (r: { method: string; path: string }) => `${r.method.toUpperCase()} ${r.path}`;
