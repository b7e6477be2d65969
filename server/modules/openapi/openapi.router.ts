import { Router, type Application } from 'express';
import { requireAuth } from '../../auth/guards.js';
import { discoverApiRoutes } from './discover.js';
import { buildOpenApi } from './document.js';

// One document per app: the routes do not change once the app is built.
const cache = new WeakMap<Application, unknown>();

/** GET /api/openapi.json — the API reference, for signed-in users of any role. */
export function openapiRouter() {
  const router = Router();
  router.get('/openapi.json', requireAuth, (req, res) => {
    let doc = cache.get(req.app);
    if (!doc) {
      doc = buildOpenApi(discoverApiRoutes(req.app));
      cache.set(req.app, doc);
    }
    res.json(doc);
  });
  return router;
}
