import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import {
  contactSchema,
  farmSiteSchema,
  installSchema,
  installUpdateSchema,
  planterListQuerySchema,
  planterSchema,
  planterUpdateSchema,
  tractorSchema,
  type InstallInput,
  type PlanterInput,
  type PlanterListQuery,
} from '../../../shared/schemas/fleet.js';
import { requireAuth } from '../../auth/guards.js';
import { Contact, FarmSite, Tractor } from '../../db/models/index.js';
import { parsed, validate } from '../../http/validate.js';
import { accountChildRouter } from './account-children.js';
import { createInstall, createPlanter, deleteInstall, deletePlanter, getPlanter, listPlanters, TRACTOR_NUMBERS, updateInstall, updatePlanter } from './planters.service.js';

type Id = { id: number };

/** Fleet records under /api. Reading follows the account's scope; changing needs staff of that territory. */
export function fleetRouter(sequelize: Sequelize) {
  const router = Router();
  router.use(accountChildRouter(sequelize, { segment: 'contacts', entity: 'contact', model: Contact as never, schema: contactSchema, label: (r) => String(r.name) }));
  router.use(accountChildRouter(sequelize, { segment: 'farm-sites', entity: 'farmSite', model: FarmSite as never, schema: farmSiteSchema, numberFields: ['lat', 'lng'], label: (r) => String(r.name) }));
  router.use(accountChildRouter(sequelize, { segment: 'tractors', entity: 'tractor', model: Tractor as never, schema: tractorSchema, numberFields: TRACTOR_NUMBERS, label: (r) => String(r.name) }));

  router.get('/planters', requireAuth, validate('query', planterListQuerySchema), async (req, res) => {
    res.json(await listPlanters(req.user!, parsed<PlanterListQuery>(res, 'query')));
  });
  router.post('/accounts/:id/planters', requireAuth, validate('params', idParamSchema), validate('body', planterSchema), async (req, res) => {
    res.status(201).json({ planter: await createPlanter(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<PlanterInput>(res, 'body')) });
  });
  router.get('/planters/:id', requireAuth, validate('params', idParamSchema), async (req, res) => {
    res.json({ planter: await getPlanter(req.user!, parsed<Id>(res, 'params').id) });
  });
  router.put('/planters/:id', requireAuth, validate('params', idParamSchema), validate('body', planterUpdateSchema), async (req, res) => {
    res.json({ planter: await updatePlanter(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<PlanterInput & { version: number }>(res, 'body')) });
  });
  router.delete('/planters/:id', requireAuth, validate('params', idParamSchema), async (req, res) => {
    await deletePlanter(sequelize, req.user!, parsed<Id>(res, 'params').id);
    res.status(204).end();
  });
  router.post('/planters/:id/installs', requireAuth, validate('params', idParamSchema), validate('body', installSchema), async (req, res) => {
    res.status(201).json({ install: await createInstall(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<InstallInput>(res, 'body')) });
  });
  router.put('/installs/:id', requireAuth, validate('params', idParamSchema), validate('body', installUpdateSchema), async (req, res) => {
    res.json({ install: await updateInstall(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<InstallInput & { version: number }>(res, 'body')) });
  });
  router.delete('/installs/:id', requireAuth, validate('params', idParamSchema), async (req, res) => {
    await deleteInstall(sequelize, req.user!, parsed<Id>(res, 'params').id);
    res.status(204).end();
  });
  return router;
}
