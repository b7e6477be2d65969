import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { mapQuerySchema, type MapQuery } from '../../../shared/schemas/visits.js';
import { requireAuth } from '../../auth/guards.js';
import { parsed, validate } from '../../http/validate.js';
import { mapAccounts } from './map.service.js';

/** GET /api/map/accounts: anyone signed in, markers for the accounts in their scope. */
export function mapRouter(sequelize: Sequelize) {
  const router = Router();
  router.get('/map/accounts', requireAuth, validate('query', mapQuerySchema), async (req, res) => {
    res.json(await mapAccounts(sequelize, req.user!, parsed<MapQuery>(res, 'query')));
  });
  return router;
}
