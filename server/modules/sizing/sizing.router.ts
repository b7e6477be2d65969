import { Router } from 'express';
import { computeSizing } from '../../../shared/calc/sizing.js';
import { planterSizingInput, type SizingAssumptions } from '../../../shared/calc/planter-sizing.js';
import { idParamSchema } from '../../../shared/schemas/accounts.js';
import { sizingInputSchema, type SizingInput } from '../../../shared/schemas/sizing.js';
import { sizingAssumptionsQuerySchema } from '../../../shared/schemas/sizing-assumptions.js';
import { requireAuth } from '../../auth/guards.js';
import { parsed, validate } from '../../http/validate.js';
import { getPlanter } from '../fleet/planters.service.js';

/** Planter sizing: any signed-in user for explicit inputs; a stored planter under its account's scope. */
export function sizingRouter() {
  const router = Router();
  router.post('/sizing', requireAuth, validate('body', sizingInputSchema), (_req, res) => {
    res.json(computeSizing(parsed<SizingInput>(res, 'body')));
  });
  router.get('/planters/:id/sizing', requireAuth, validate('params', idParamSchema), validate('query', sizingAssumptionsQuerySchema), async (req, res) => {
    const { id } = parsed<{ id: number }>(res, 'params');
    const planter = await getPlanter(req.user!, id);
    const assumptions = parsed<SizingAssumptions>(res, 'query');
    const input = planterSizingInput(planter as never, assumptions);
    res.json({ planterId: id, assumptions, input, ...computeSizing(input) });
  });
  return router;
}
