import { Router } from 'express';
import type { Sequelize } from 'sequelize';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import {
  candidatesQuerySchema,
  visitBatchSchema,
  visitCreateSchema,
  visitListQuerySchema,
  visitUpdateSchema,
  type CandidatesQuery,
  type VisitCreateInput,
  type VisitListQuery,
  type VisitUpdateInput,
} from '../../../shared/schemas/visits.js';
import { requireAuth, requireRole } from '../../auth/guards.js';
import { parsed, validate } from '../../http/validate.js';
import { listCandidates } from './candidates.service.js';
import { createVisits, deleteVisit, getVisit, listVisits, updateVisit } from './visits.service.js';

type Id = { id: number };
const staff = requireRole('admin', 'manager', 'specialist');

/**
 * /api/visits. Reading: anyone, within their account scope. Creating: staff of the territory, or
 * a grower requesting a visit on their own account. Changing and deleting: staff only.
 */
export function visitsRouter(sequelize: Sequelize) {
  const router = Router();
  router.get('/visits', requireAuth, validate('query', visitListQuerySchema), async (req, res) => {
    res.json(await listVisits(req.user!, parsed<VisitListQuery>(res, 'query')));
  });
  // Before /visits/:id so that "candidates" is not read as an id.
  router.get('/visits/candidates', staff, validate('query', candidatesQuerySchema), async (req, res) => {
    res.json(await listCandidates(sequelize, req.user!, parsed<CandidatesQuery>(res, 'query')));
  });
  router.post('/visits/batch', staff, validate('body', visitBatchSchema), async (req, res) => {
    res.status(201).json({ visits: await createVisits(sequelize, req.user!, parsed<{ visits: VisitCreateInput[] }>(res, 'body').visits, true) });
  });
  router.get('/visits/:id', requireAuth, validate('params', idParamSchema), async (req, res) => {
    res.json({ visit: await getVisit(req.user!, parsed<Id>(res, 'params').id) });
  });
  router.post('/visits', requireAuth, validate('body', visitCreateSchema), async (req, res) => {
    const [visit] = await createVisits(sequelize, req.user!, [parsed<VisitCreateInput>(res, 'body')]);
    res.status(201).json({ visit });
  });
  router.patch('/visits/:id', staff, validate('params', idParamSchema), validate('body', visitUpdateSchema), async (req, res) => {
    res.json({ visit: await updateVisit(sequelize, req.user!, parsed<Id>(res, 'params').id, parsed<VisitUpdateInput>(res, 'body')) });
  });
  router.delete('/visits/:id', staff, validate('params', idParamSchema), async (req, res) => {
    await deleteVisit(sequelize, req.user!, parsed<Id>(res, 'params').id);
    res.status(204).end();
  });
  return router;
}
